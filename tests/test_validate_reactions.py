"""Half-reaction checks (sitebuild.validate.reactions): species read, atoms and charge balance, ids."""

from validatekit import assert_names, check, edit, folder, record, run_check  # noqa: F401 - folder is a fixture


def test_unbalanced_atoms(folder):
    edit(folder, "half_reactions.yaml",
         lambda doc: record(doc, "half_reactions", "O2/H2O").__setitem__("reduced", ["H2O(l)"]))
    status, lines = run_check(folder)
    assert status == 1
    assert_names(lines, "half_reactions.yaml", "O2/H2O", "reduced", "does not balance", "atoms: H")


def test_unbalanced_charge(folder):
    edit(folder, "half_reactions.yaml", lambda doc: record(doc, "half_reactions", "Zn2+/Zn").__setitem__("n", 1))
    status, lines = run_check(folder)
    assert status == 1
    assert_names(lines, "half_reactions.yaml", "Zn2+/Zn", "n", "does not balance", "charge")


def test_unparseable_species(folder):
    edit(folder, "half_reactions.yaml",
         lambda doc: record(doc, "half_reactions", "Zn2+/Zn").__setitem__("oxidised", ["Zn2+"]))
    status, lines = check(folder)
    assert status == 1
    assert_names(lines, "half_reactions.yaml", "Zn2+/Zn", "oxidised[0]", "cannot be read", "'Zn2+'")


def test_id_does_not_name_the_reaction(folder):
    edit(folder, "half_reactions.yaml",
         lambda doc: record(doc, "half_reactions", "Zn2+/Zn").__setitem__("id", "Zn2+/Cd"))
    status, lines = check(folder)
    assert status == 1
    assert_names(lines, "half_reactions.yaml", "Zn2+/Cd", "id", "reduced form")
