"""Validation of the dataset: JSON Schema first, then semantic checks; every problem collected.

Each problem is one line ``file:record:field: message`` where ``record`` is the record's id (or
``#index`` when it has none) and ``field`` the field concerned (``-`` when the problem is about a
whole file or record). Lines that start with ``warning`` report something a maintainer should look
at (for example two handbook values that agree only to a few millivolts) but do not fail a check.

Checks, in order (module in brackets):

1. file shape: the ``# yaml-language-server`` first line, one top-level key per file [files];
2. JSON Schema (Draft 2020-12) of ``schema/<file>.schema.json``, every error reported [schema];
3. sources: every ``source``/``*_source`` id exists, every source is used, every value has a
   source and a confidence [sources];
3a. where each value was read: every value flagged ``read`` names its place in the document
   (``<field>_where``, or ``where`` for a mapping with one value) [where];
4. duplicate ids, aliases and UNS numbers within a kind (compared the way lookups compare them)
   [records];
5. physical ranges and range ends in the right order [ranges];
6. half-reactions: species parse, atoms and charge balance, the id names the reaction's species
   [reactions];
7. thermodynamic consistency: free-energy additivity of linked couples (A: X→Y, B: Y→Z,
   C: X→Z), and acid/alkaline forms of a couple through the ionic product of water [thermo];
   E° against the Gibbs energies of formation of its species, ΔrG° = −nFE° within 10 mV [gibbs];
8. reference electrodes: the temperature model gives ``E_V_SHE`` at 25 °C within 1 mV [refelec];
9. materials: equivalent weights follow ASTM G102, ``other_state`` links point back, passive
   states are nobler than active ones [materials];
10. environments and ions: basis, series, tiers and charges are coherent [records];
11. cathodic-protection criteria: structure, setting and electrode ids exist, values and ranges
    are coherent, one base criterion and one limit per structure and setting, limits below
    protection potentials [cp].
"""

import os

from ..dataset import PROJECT_DATA
from .collect import KIND_ORDER, Collector
from .cp import check_cp_criteria
from .files import file_shape, locate_read_problems
from .gibbs import check_gibbs
from .materials import check_materials
from .ranges import check_ranges
from .reactions import check_stoichiometry
from .records import check_duplicates, check_environments, check_ions
from .refelec import check_reference_electrodes, refelec_potential
from .schema import schema_problems
from .sources import check_sources
from .thermo import check_acid_alkaline, check_additivity
from .where import check_where

__all__ = ["check_folder", "refelec_potential", "validate_raw"]

#: the semantic checks, in the order their problems are reported
SEMANTIC_CHECKS = (check_sources, check_where, check_duplicates, check_ranges, check_stoichiometry, check_additivity,
                   check_acid_alkaline, check_gibbs, check_reference_electrodes, check_materials, check_environments,
                   check_ions, check_cp_criteria)


def _schemas(raw, data_dir, out):
    for kind in KIND_ORDER:
        if kind in raw:
            records = raw[kind]
            if records is None or (isinstance(records, list) and not records):
                out.error(kind, "-", kind, f"no records: '{kind}' must list at least one record")
            schema_problems(kind, records, data_dir or PROJECT_DATA, out)


def validate_raw(raw, data_dir):
    """Every problem in the raw records, as ``file:record:field: message`` lines.

    Args:
        raw: top-level key -> list of records, as read by :func:`sitebuild.dataset.read_folder` [unitless]
        data_dir: the folder the records came from (for the file checks and its schema/) [unitless]

    Returns:
        list of problem lines; lines that start with ``warning`` do not fail a check
    """
    out = Collector()
    if data_dir:
        file_shape(raw, data_dir, out)
    _schemas(raw, data_dir, out)
    for check in SEMANTIC_CHECKS:
        check(raw, out)
    return out.lines


def check_folder(data_dir=None):
    """Read and validate a data folder: every problem of reading, then of validation.

    Args:
        data_dir: the folder holding the dataset files; default the project's data/ [unitless]

    Returns:
        list of ``file:record:field: message`` lines; lines that start with ``warning`` do not fail
    """
    from ..dataset import read_folder

    folder = data_dir or PROJECT_DATA
    if not os.path.isdir(folder):
        return [f"-:-:-: {folder} is not a folder"]
    raw, problems = read_folder(folder)
    return locate_read_problems(problems, folder) + validate_raw(raw, folder)
