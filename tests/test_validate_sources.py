"""Source checks (sitebuild.validate.sources): unknown, uncited and missing sources and confidences."""

from validatekit import assert_names, check, edit, folder, record, run_check  # noqa: F401 - folder is a fixture


def test_missing_source(folder):
    edit(folder, "half_reactions.yaml", lambda doc: record(doc, "half_reactions", "Fe3+/Fe2+").pop("E0_source"))
    status, lines = run_check(folder)
    assert status == 1
    hits = [ln for ln in lines if ln.startswith("half_reactions.yaml:Fe3+/Fe2+:E0_")]
    assert hits, lines
    assert_names(lines, "half_reactions.yaml", "Fe3+/Fe2+", "E0_V", "no source", "E0_source")


def test_unknown_source(folder):
    edit(folder, "materials.yaml",
         lambda doc: record(doc, "materials", "zinc").__setitem__("density_source", "astm-g012"))
    status, lines = run_check(folder)
    assert status == 1
    assert_names(lines, "materials.yaml", "zinc", "density_source", "unknown source id 'astm-g012'", "astm-g102")


def test_unknown_source_in_a_nested_model(folder):
    edit(folder, "reference_electrodes.yaml",
         lambda doc: record(doc, "reference_electrodes", "SCE")["temperature"].__setitem__("source", "ives-1961"))
    status, lines = check(folder)
    assert status == 1
    assert_names(lines, "reference_electrodes.yaml", "SCE", "temperature.source", "unknown source id")


def test_unused_source(folder):
    def change(doc):
        doc["sources"].append({"id": "orphan-2020", "kind": "book", "author": "A. Nobody",
                               "title": "A book no value cites", "year": 2020})
    edit(folder, "sources.yaml", change)
    status, lines = run_check(folder)
    assert status == 1
    assert_names(lines, "sources.yaml", "orphan-2020", "id", "cited by no value")


def test_missing_confidence(folder):
    edit(folder, "materials.yaml", lambda doc: record(doc, "materials", "zinc").pop("density_confidence"))
    status, lines = check(folder)
    assert status == 1
    assert any(ln.startswith("materials.yaml:zinc:density_") and "confidence" in ln for ln in lines), lines
