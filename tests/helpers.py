"""Shared test helpers: an in-memory case and a way to vary it."""

from __future__ import annotations

import copy

from attic.case.load import apply_overrides, build_case, validate_raw
from attic.runs.condition import run_case

# An invented case for tests (not a real house).
BASE = {
    "title": "test house",
    "site": {"latitude_deg": 30.0, "elevation_ft": 0, "climate_zone": "2A"},
    "cooling": {"outdoor_F": 92, "outdoor_dewpoint_F": 72, "indoor_F": 75, "indoor_rh": 0.5, "wind_mph": 5,
                "month": 7, "day": 21, "solar_hour": 13},
    "heating": {"outdoor_F": 35, "indoor_F": 70, "wind_mph": 10},
    "house": {"conditioned_area_ft2": 1600, "cooling_sensible_btuh": 16000, "cooling_latent_btuh": 2500,
              "heating_btuh": 20000},
    "roof": {"pitch": "6/12", "ridge_azimuth_deg": 90, "covering": "asphalt-shingle-dark"},
    "attic": {"type": "vented", "ceiling_r": 30},
    "vents": {"low_length_ft": 100, "low_nfa_in2_per_ft": 9, "high_length_ft": 40, "high_nfa_in2_per_ft": 18},
}

DUCTS = {
    "air_handler": {"airflow_cfm": 1000, "supply_F": 55, "heating_supply_F": 115},
    "duct": [
        {"name": "trunk", "side": "supply", "location": "attic", "diameter_in": 14, "length_ft": 40, "r_value": 6},
        {"name": "runs", "side": "supply", "location": "attic", "fed_by": "trunk", "count": 8, "diameter_in": 6,
         "length_ft": 15, "r_value": 6},
        {"name": "return", "side": "return", "location": "attic", "diameter_in": 16, "length_ft": 10,
         "r_value": 6},
    ],
    "leakage": {"supply_fraction": 0.05, "return_fraction": 0.03},
}


def raw_case(with_ducts=False, **sections):
    raw = copy.deepcopy(BASE)
    if with_ducts:
        raw.update(copy.deepcopy(DUCTS))
    for k, v in sections.items():
        raw[k] = v
    return raw


def make_case(overrides=None, with_ducts=False, raw=None):
    raw = raw if raw is not None else raw_case(with_ducts)
    return build_case(validate_raw(apply_overrides(raw, overrides or {})), "test")


def solve_case(overrides=None, with_ducts=False, raw=None, kind="cooling"):
    case = make_case(overrides, with_ducts, raw)
    return {r.kind: r for r in run_case(case)}[kind]


def _toml_value(v):
    if isinstance(v, bool):
        return "true" if v else "false"
    if isinstance(v, str):
        return '"' + v.replace("\\", "\\\\").replace('"', '\\"') + '"'
    if isinstance(v, dict):
        return "{ " + ", ".join(f"{_toml_value(k)} = {_toml_value(x)}" for k, x in v.items()) + " }"
    return repr(v)


def to_toml(raw):
    """A small TOML writer for test cases (scalars, tables, arrays of tables)."""
    lines = [f"{k} = {_toml_value(v)}" for k, v in raw.items() if not isinstance(v, dict | list)]
    for k, v in raw.items():
        if isinstance(v, dict):
            lines.append(f"\n[{k}]")
            lines += [f"{kk} = {_toml_value(vv)}" for kk, vv in v.items()]
        elif isinstance(v, list):
            for item in v:
                lines.append(f"\n[[{k}]]")
                lines += [f"{kk} = {_toml_value(vv)}" for kk, vv in item.items()]
    return "\n".join(lines) + "\n"


def fail_heating_of(monkeypatch, name):
    """Make the heating solve of the case or variant `name` fail as no airflow serving it would (a ValueError,
    the input's doing), every other condition solving as it does."""
    from attic.runs import batch

    real = batch.run_conditions

    def failing(cases, kind, *a, **k):
        out = real(cases, kind, *a, **k)
        return [(None, ValueError(f"{c.name} (heating): no airflow serves it")) if kind == "heating"
                and c.name == name else r for c, r in zip(cases, out, strict=True)]

    monkeypatch.setattr(batch, "run_conditions", failing)
