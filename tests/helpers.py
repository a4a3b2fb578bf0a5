"""Build machines and sites for tests through the same validation as the files."""

from machinecheck.inputs.catalog import catalog_from_data, sites_from_data


def machine(rating=None, **fields):
    data = {"id": fields.pop("id", "M"), **fields, "rating": rating if isinstance(rating, list)
            else [rating]}
    return catalog_from_data({"machine": [data]}, "test").machines[0]


def site(**fields):
    data = {"id": "S", "phases": 3, **fields}
    return sites_from_data({"site": [data]}, "test")[0]


def codes(assessment, severity=None):
    return {f.code for f in assessment.findings if severity in (None, f.severity)}
