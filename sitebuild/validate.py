"""Semantic validation of the dataset (provisional: schema and semantic checks to come)."""


def validate_raw(raw, data_dir):
    """Every problem in the raw records, as file:record:field: message."""
    return []


def check_folder(data_dir=None):
    from .dataset import PROJECT_DATA, read_folder

    raw, problems = read_folder(data_dir or PROJECT_DATA)
    return problems + validate_raw(raw, data_dir or PROJECT_DATA)
