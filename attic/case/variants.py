"""Variants: dotted key paths set on a copy of the case dict, and the dict of a built Case."""

from __future__ import annotations

import copy
from typing import TYPE_CHECKING

from attic.case.schema import SECTIONS

if TYPE_CHECKING:
    pass


from attic.case.build import Case
from attic.case.errors import CaseError
from attic.case.validate import _suggest


def _set_path(raw, path, value, where):
    """Apply one variant override (dotted path) to a raw case dict, in place."""
    parts = path.split(".")
    if parts[0] == "duct":
        if len(parts) != 3:
            raise CaseError(where, f'"{path}": write duct.*.KEY, duct.NAME.KEY or duct.N.KEY')
        ducts = raw.get("duct", [])
        sel, key = parts[1], parts[2]
        if sel == "*":
            targets = ducts
        elif sel.isdigit() and 1 <= int(sel) <= len(ducts):
            targets = [ducts[int(sel) - 1]]
        else:
            targets = [d for d in ducts if d.get("name") == sel]
        if not targets:
            names = ", ".join(repr(d.get("name")) for d in ducts if d.get("name"))
            raise CaseError(where, f'"{path}" matches no duct: give *, a number from 1 to {len(ducts)} (the '
                                   f'[[duct]] tables in order){", or a name: " + names if names else ""}')
        if key not in SECTIONS["duct"]:
            raise CaseError(where, f'"{path}": unknown duct key' + _suggest(key, "duct", f"duct.{sel}"))
        for d in targets:
            d[key] = value
        return
    if len(parts) == 1 and parts[0] in SECTIONS[""]:
        raw[parts[0]] = value
        return
    if len(parts) != 2 or parts[0] not in SECTIONS or parts[0] == "":
        raise CaseError(where, f'"{path}" is not a key path like roof.deck_r' + _suggest(parts[-1], ""))
    sec, key = parts
    if key not in SECTIONS[sec]:
        raise CaseError(where, f'"{path}": unknown key' + _suggest(key, sec))
    raw.setdefault(sec, {})[key] = value


def raw_of(case):
    """A case dict as TOML gives it, without variants, from a Case or from such a dict (a copy either way).

    A Case keeps its validated inputs, where every key not given holds its default or None; dropping the
    Nones gives a dict that validates back to the same inputs.
    """
    if isinstance(case, Case):
        def strip(d):
            return {k: v for k, v in d.items() if v is not None}

        raw = {}
        for k, v in case.inputs.items():
            if k == "duct":
                raw[k] = [strip(d) for d in v]
            elif isinstance(v, dict) and k != "uncertainty":
                raw[k] = strip(v)
            elif v is not None and k not in ("variant", "uncertainty"):
                raw[k] = v
        return copy.deepcopy(raw)
    if not isinstance(case, dict):
        raise TypeError(f"expected a Case or a case dict, got {type(case).__name__}")
    new = copy.deepcopy(case)
    new.pop("variant", None)
    new.pop("uncertainty", None)
    return new


def _copy_case(value):
    """A copy of a case dict deep enough that setting keys on the copy leaves the original as it was (dicts and
    lists are copied, the values in them are not: they are numbers, strings and booleans). Far cheaper than
    copy.deepcopy, which a study with thousands of points pays once per point."""
    if isinstance(value, dict):
        return {k: _copy_case(v) for k, v in value.items()}
    if isinstance(value, list):
        return [_copy_case(v) for v in value]
    return value


def apply_overrides(raw, overrides, where="set"):
    """A copy of a raw case with dotted-path overrides applied (validated when built)."""
    new = _copy_case(raw)
    new.pop("variant", None)
    new.pop("uncertainty", None)  # it describes the file's base case; the uncertainty run applies it
    sep = " " if where.startswith("--") else "."  # an option reads as typed (--set roof.deck_r), a table as TOML
    for path, value in overrides.items():
        _set_path(new, path, value, f"{where}{sep}{path}")
    return new


# The heating design dry bulb is a night's minimum, which falls near sunrise: the hour (apparent solar
# time) at which the sky's hourly correction is taken for heating (common practice, no source).
