"""JSON Schemas of the catalog and sites file formats, for editors that validate TOML.

The schemas describe the shape (keys, types, allowed words, quantity strings); machinecheck's
own validation adds the physics checks (plausible ranges, poles against speed ...). Allowed
words are given in their canonical spelling, which machinecheck also accepts in any case.
"""

from __future__ import annotations

from ..inputs.catalog import DESIGN_LETTERS, INSULATION_CLASSES
from ..model import KINDS, STANDARDS, SYSTEMS
from ..physics.efficiency import CLASSES as EFFICIENCY_CLASSES
from ..physics.loads import LOAD_TYPES
from ..physics.starting import CODE_LETTERS

DRAFT = "https://json-schema.org/draft/2020-12/schema"
_NUMBER = r"[-+]?([0-9]+\.?[0-9]*|\.[0-9]+)([eE][-+]?[0-9]+)?"
#: A number with a unit ("75 kW"), or a bare number in a string ("400").
_QUANTITY_PATTERN = rf"^\s*{_NUMBER}\s*[^\s0-9].*$|^\s*{_NUMBER}\s*$"
_RANGE_PATTERN = r"^\s*[0-9.]+\s*(-|–|to)\s*[0-9.]+\s*\S.*$"


def _quantity(description: str) -> dict:
    return {"description": description,
            "anyOf": [{"type": "number"},
                      {"type": "string", "pattern": _QUANTITY_PATTERN}]}


def _text(description: str, choices=None) -> dict:
    result = {"type": "string", "description": description}
    if choices is not None:
        result["enum"] = list(choices)
    return result


def _one_or_list(item: dict, description: str) -> dict:
    return {"description": description,
            "anyOf": [item, {"type": "array", "items": item, "minItems": 1}]}


def _fraction(description: str) -> dict:
    return {"description": description,
            "anyOf": [{"type": "number", "exclusiveMinimum": 0, "maximum": 1},
                      {"type": "string", "pattern": _QUANTITY_PATTERN}]}


def catalog_schema() -> dict:
    """JSON Schema of a machine catalog (see docs/format.md)."""
    voltage = {"anyOf": [{"type": "number"},
                         {"type": "string", "pattern": _QUANTITY_PATTERN},
                         {"type": "string", "pattern": _RANGE_PATTERN}]}
    rating = {
        "type": "object", "additionalProperties": False,
        "required": ["frequency", "voltage", "power"],
        "properties": {
            "frequency": _quantity("rated frequency, e.g. '60 Hz' (bare number: Hz)"),
            "voltage": _one_or_list(voltage, "rated voltage, a range '380-415 V', or one per "
                                             "connection (bare number: V)"),
            "connection": _one_or_list({"type": "string", "minLength": 1},
                                       "connection names, one per voltage"),
            "current": _one_or_list(_quantity("rated current (bare number: A)"),
                                    "rated current, one per voltage"),
            "power": _quantity("rated output, '75 kW' or '100 hp'; generators '500 kVA' "
                               "(bare number: kW)"),
            "speed": _quantity("rated speed, '1775 rpm' (bare number: rpm)"),
            "power_factor": _fraction("rated power factor, 0.86 or '86 %'"),
            "efficiency": _fraction("rated efficiency, 0.941 or '94.1 %'"),
            "service_factor": {"type": "number", "minimum": 1.0, "maximum": 2.0},
            "locked_rotor_current": _one_or_list(_quantity("locked-rotor current"),
                                                 "locked-rotor current, one per voltage"),
            "starting_current_ratio": {"type": "number", "minimum": 1, "maximum": 20,
                                       "description": "Ia / In"},
        },
    }
    load = {
        "type": "object", "additionalProperties": False, "required": ["type"],
        "properties": {
            "type": _text("driven load", LOAD_TYPES),
            "power": _quantity("power drawn at the rated speed of the rating set used"),
            "torque": _quantity("torque at the rated speed, '200 N*m'"),
            "max_speed": _quantity("speed limit of the driven equipment"),
        },
    }
    machine = {
        "type": "object", "additionalProperties": False, "required": ["id", "rating"],
        "properties": {
            "id": {"type": "string", "minLength": 1, "maxLength": 200},
            "description": {"type": "string"},
            "kind": _text("machine kind (default induction-motor)", KINDS),
            "phases": {"type": "integer", "enum": [1, 3]},
            "poles": {"type": "integer", "minimum": 2, "maximum": 200, "multipleOf": 2},
            "service_factor": {"type": "number", "minimum": 1.0, "maximum": 2.0},
            "insulation_class": _text("insulation class", INSULATION_CLASSES),
            "efficiency_class": _text("IEC 60034-30-1 class", EFFICIENCY_CLASSES),
            "max_speed": _quantity("mechanical speed limit"),
            "code_letter": _text("NEMA locked-rotor code letter", tuple(CODE_LETTERS)),
            "design_letter": _text("NEMA design A-D or IEC N/H", DESIGN_LETTERS),
            "cooling": {"type": "string", "pattern": "^\\s*[Ii][Cc][0-9A-Za-z]{2,8}\\s*$"},
            "duty": {"type": "string", "pattern": "^\\s*[Ss](10|[1-9])"},
            "rated_ambient": _quantity("rated coolant temperature (default 40 degC)"),
            "rated_altitude": _quantity("rated altitude (default 1000 m)"),
            "prime_mover_speed": _quantity("generators: engine or turbine rated speed"),
            "rating": {"type": "array", "minItems": 1, "items": rating},
            "load": load,
        },
    }
    return {
        "$schema": DRAFT, "$id": "machinecheck:catalog", "title": "machinecheck machine catalog",
        "type": "object", "additionalProperties": False, "required": ["machine"],
        "properties": {
            "catalog": {"type": "object", "additionalProperties": False,
                        "properties": {"title": {"type": "string"}}},
            "machine": {"type": "array", "items": machine},
        },
    }


def sites_schema() -> dict:
    """JSON Schema of a sites file (see docs/format.md)."""
    voltage = {"anyOf": [{"type": "number"}, {"type": "string", "pattern": _QUANTITY_PATTERN}]}
    site = {
        "type": "object", "additionalProperties": False,
        "required": ["id", "frequency", "voltage"],
        "properties": {
            "id": {"type": "string", "minLength": 1, "maxLength": 200},
            "name": {"type": "string"},
            "frequency": _quantity("supply frequency (bare number: Hz)"),
            "voltage": _quantity("nominal voltage, line-to-line (bare number: V)"),
            "phases": {"type": "integer", "enum": [1, 2, 3]},
            "system": _text("supply system", SYSTEMS),
            "standard": _text("tolerance rules (default NEMA at 60 Hz, IEC otherwise)",
                              STANDARDS),
            "voltage_range": {"anyOf": [{"type": "array", "items": voltage, "minItems": 2,
                                         "maxItems": 2},
                                        {"type": "string", "pattern": _RANGE_PATTERN}]},
            "unbalance": _quantity("voltage unbalance, '1.2 %'"),
            "line_voltages": {"type": "array", "items": voltage, "minItems": 3, "maxItems": 3},
            "altitude": _quantity("altitude, '1650 m'"),
            "ambient": _quantity("coolant temperature, '45 degC'"),
            "min_efficiency_class": _text("lowest IE class allowed on the site",
                                          EFFICIENCY_CLASSES),
        },
    }
    return {
        "$schema": DRAFT, "$id": "machinecheck:sites", "title": "machinecheck site supplies",
        "type": "object", "additionalProperties": False, "required": ["site"],
        "properties": {"site": {"type": "array", "items": site}},
    }
