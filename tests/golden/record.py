"""Record the answers of a fixed sample of requests to every entry point (tests/golden/answers.json.gz).

Run once before a change that must not change behaviour (``python -m tests.golden.record``);
``tests/test_golden.py`` then compares the engine's answers with the recorded ones. The sample is
generated from the dataset's own ids in a fixed order, so it covers every record kind, and it
includes refused requests (their error field and message are recorded too).
"""

import gzip
import itertools
import json
import os

HERE = os.path.dirname(os.path.abspath(__file__))
ANSWERS = os.path.join(HERE, "answers.json.gz")


def sample_requests(bundle):
    """(entry point, request) pairs covering every entry point and every record kind."""
    hr = [r["id"] for r in bundle["half_reactions"]]
    refs = [r["id"] for r in bundle["reference_electrodes"]] + ["RHE"]
    mats = [r["id"] for r in bundle["materials"]]
    envs = [r["id"] for r in bundle["environments"]]
    ions = [r["species"] for r in bundle["ions"]]
    out = []
    for i, rid in enumerate(hr):
        out.append(("electrode", {"id": rid, "temp_C": [25, 60, 5][i % 3], "pH": [7, 3.5, 10][i % 3]}))
    for a, b in itertools.islice(itertools.combinations(hr, 2), 0, None, 17):
        out.append(("couple", {"a": a, "b": b, "temp_C": 35, "pH": 6.5}))
    out.append(("couple", {"a": "Zn2+/Zn", "b": "Cu2+/Cu", "temp_C": 35, "activities": {"Zn2+": 1e-5, "Cu2+": 1e-6}, "pH": 6.5}))
    out.append(("couple", {"a": "Zn2+/Zn", "b": "Cu2+/Cu", "temp_C": 60, "molalities": {"Zn2+": 0.01}, "ionic_strength": 0.1}))
    out.append(("couple", {"a": "Fe2+/Fe", "b": "O2/H2O", "temp_C": 20, "env": "seawater-flowing", "pH": 8.1}))
    for a, b in itertools.islice(itertools.permutations(refs, 2), 0, None, 3):
        out.append(("convert", {"from": a, "to": b, "value_V": -0.85, "temp_C": 18, "pH": 7}))
    for i, (sp, model) in enumerate(itertools.product(ions, ("ideal", "limiting", "extended", "davies"))):
        out.append(("activity", {"species": sp, "model": model, "ionic_strength": [0.001, 0.02, 0.3][i % 3], "temp_C": [25, 40, 10][i % 3]}))
    pairs = list(itertools.combinations(mats, 2))
    for i, (a, b) in enumerate(pairs[::5]):
        env = envs[i % len(envs)]
        req = {"a": a, "b": b, "env": env}
        if i % 3:
            req["area_ratio"] = [0.2, 10.0][i % 2]
        out.append(("joint", req))
    from calc.api import call

    for env in envs:  # the materials that have a value on this environment's basis, every second one
        usable = [m for m in mats if call("matrix", {"env": env, "materials": [m]})["ok"]]
        out.append(("matrix", {"env": env, "materials": usable[::2]}))
    out.append(("matrix", {"env": envs[0], "materials": mats[:6], "csv": True}))
    for m in mats:
        out.append(("rate", {"material": m, "current_density_uA_per_cm2": 10}))
    for i, (a, b) in enumerate(pairs[::23]):
        out.append(("measured", {"a_name": a, "a_reading_V": -0.70, "b_name": b, "b_reading_V": -0.40,
                                 "electrode": ["Ag/AgCl seawater", "CSE", "SCE"][i % 3], "env": envs[i % len(envs)],
                                 "temp_C": [12, 25][i % 2]}))
    structures = ("carbon-steel", "high-strength-steel", "stainless-pren-40", "stainless-pren-below-40",
                  "copper-alloys", "aluminium", "galvanized-steel")
    settings = ("soil-aerobic", "soil-anaerobic", "soil-aerated-100-1000", "soil-aerated-above-1000",
                "seawater-aerobic", "seawater-anaerobic")
    for i, (s, st) in enumerate(itertools.product(structures, settings)):
        for j, v in enumerate((-0.70, -0.90, -1.15)):
            req = {"structure": s, "setting": st, "reading_V": v, "electrode": ["CSE", "Ag/AgCl seawater"][(i + j) % 2],
                   "reading_kind": ["instant-off", "on"][j % 2], "temp_C": [10, 25][i % 2]}
            if (i + j) % 4 == 0:
                req["polarisation_mV"] = 120
            if (i + j) % 5 == 0:
                req["structure_temp_C"] = 50
            out.append(("cp", req))
    out.append(("eph", {"lines": [{"id": "Zn2+/Zn"}, {"id": "O2/H2O"}, {"id": "H+/H2"}], "temp_C": 25}))
    out.append(("eph", {"lines": [{"id": "Fe2+/Fe", "activities": {"Fe2+": 1e-6}}], "temp_C": 50, "pH_values": [0, 7, 14]}))
    # refused requests: the message is part of the behaviour
    out += [("electrode", {"id": "Zz/Z"}), ("electrode", {"id": "Cu2+/Cu", "temp_C": 140}),
            ("couple", {"a": "Zn2+/Zn", "b": "Cu2+/Cu", "pH": 17}),
            ("couple", {"a": "Zn2+/Zn", "b": "Cu2+/Cu", "activities": {"Zn2+": -1}}),
            ("convert", {"from": "SCE", "to": "CSE", "value_V": "x"}), ("activity", {"species": "Zn2+", "model": "truesdell-jones"}),
            ("joint", {"a": "zinc", "b": "zinc", "env": "nowhere"}), ("joint", {"a": "zinc", "b": "titanium", "env": envs[0], "area_ratio": -1}),
            ("rate", {"material": "zinc", "current_density_uA_per_cm2": -3}),
            ("cp", {"structure": "carbon-steel", "setting": "moon", "reading_V": -0.9, "electrode": "CSE"}),
            ("measured", {"a_name": "x", "a_reading_V": -0.5, "b_name": "y", "b_reading_V": 30, "electrode": "CSE", "env": envs[0]})]
    return out


def strip_version(value):
    """The answer without the data version (it changes with any data file, not with behaviour)."""
    if isinstance(value, dict):
        return {k: strip_version(v) for k, v in value.items() if k != "data_version"}
    if isinstance(value, list):
        return [strip_version(v) for v in value]
    return value


def answers(bundle):
    import calc.dataset
    from calc.api import call_json

    calc.dataset.set_dataset(bundle)
    requests = sample_requests(bundle)
    return [{"entry": name, "request": req, "answer": strip_version(json.loads(call_json(name, json.dumps(req))))}
            for name, req in requests]


if __name__ == "__main__":
    from sitebuild.dataset import load_project_bundle

    rows = answers(load_project_bundle())
    with gzip.GzipFile(ANSWERS, "wb", mtime=0) as fh:
        fh.write(json.dumps(rows, ensure_ascii=False, sort_keys=True).encode("utf-8"))
    print(len(rows), "answers,", sum(1 for r in rows if not r["answer"]["ok"]), "refused")
