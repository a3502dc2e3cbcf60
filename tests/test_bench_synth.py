"""The synthetic dataset of the build-scaling benchmark is valid data (bench/synth.py), and the
canonical request JSON of the build-time answers (sitebuild/precompute.py)."""

import pytest


def test_synthetic_dataset_is_valid(tmp_path, shipped_bundle):
    from bench.synth import synthesize
    from sitebuild.dataset import load_bundle

    counts = synthesize(str(tmp_path / "data"), factor=2, marker="test")
    bundle = load_bundle(str(tmp_path / "data"))  # raises DataProblems listing every problem
    for kind, (shipped, synthetic) in counts.items():
        assert len(bundle[kind]) == synthetic
    assert counts["materials"][1] == 2 * counts["materials"][0]
    # half-reactions made only of H and O cannot get a new id and are not cloned
    assert counts["half_reactions"][0] < counts["half_reactions"][1] <= 2 * counts["half_reactions"][0]
    ids = [r["id"] for r in bundle["half_reactions"]]
    assert len(ids) == len(set(ids))
    assert bundle["version"] != shipped_bundle["version"]


def test_renamed_species_still_balance():
    from bench.synth import Renamer
    from calc.species import balance_problems

    r = Renamer()
    ox = [r.species(1, s) for s in ["Fe(OH)3(s)", "3 H+(aq)"]]
    red = [r.species(1, s) for s in ["Fe2+(aq)", "3 H2O(l)"]]
    assert ox[0] != "Fe(OH)3(s)" and ox[0].endswith("(OH)3(s)") and ox[1] == "3 H+(aq)"
    assert balance_problems(ox, red, 1) == []
    assert r.couple_id(1, "Fe3+/Fe2+") != "Fe3+/Fe2+"
    assert r.couple_id(2, "Fe3+/Fe2+") != r.couple_id(1, "Fe3+/Fe2+")


@pytest.mark.parametrize("value,text", [
    (35.0, "35"), (1e-05, "0.00001"), (1e-07, "1e-7"), (1.5e-07, "1.5e-7"), (0.2, "0.2"), (-0.93, "-0.93"),
    (1e21, "1e+21"), (1.2e21, "1.2e+21"), (123456789012.0, "123456789012"), (0.0, "0"), (100.0, "100"),
])
def test_numbers_as_javascript_writes_them(value, text):
    # ECMAScript 2023, §6.1.6.1.20 Number::toString (common practice: what JSON.stringify writes)
    from sitebuild.precompute import js_number

    assert js_number(value) == text


def test_every_opening_request_has_its_build_time_answer(shipped_bundle):
    # the page and the build read the same opening requests (calc.spec): nothing parses the page's JS
    from calc.spec import OPENINGS, page_spec
    from sitebuild.precompute import canonical, precompute

    assert {"couple", "electrode", "convert", "activity", "joint", "matrix"} <= set(OPENINGS)
    assert page_spec()["openings"] == OPENINGS
    data = precompute(shipped_bundle)
    assert data["data_version"] == shipped_bundle["version"]
    for name, req in OPENINGS.items():
        assert canonical(req) in data["answers"][name], name
