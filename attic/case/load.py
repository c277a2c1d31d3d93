"""Reading a case: a TOML file or a dict to the base Case and its variants.

The case layer's modules, by job: ``schema`` (every key), ``errors`` (CaseError), ``validate`` (a dict against
the schema), ``variants`` (dotted paths set on a copy), ``build`` (the frozen Case in SI), ``declared`` (what only
the codes read), ``uncertainty`` and ``weather``. The names below are re-exported so that callers can import
them from here.
"""

from __future__ import annotations

import tomllib
from dataclasses import replace
from pathlib import Path
from typing import TYPE_CHECKING

if TYPE_CHECKING:
    pass


from attic.case.build import HEATING_DESIGN_HOUR, Case, Condition, Vents, build_case  # noqa: F401
from attic.case.errors import CaseError  # noqa: F401
from attic.case.validate import validate_raw, vent_nfa_in2  # noqa: F401
from attic.case.variants import apply_overrides, raw_of  # noqa: F401


def read_toml(path):
    """Parse a TOML case file; a syntax error is a CaseError naming the line."""
    p = Path(path)
    try:
        text = p.read_text(encoding="utf-8")
    except FileNotFoundError:
        raise CaseError("", f"no case file at {p}") from None
    except (OSError, UnicodeDecodeError) as e:
        raise CaseError("", f"cannot read {p}: {e}") from None
    try:
        return tomllib.loads(text)
    except tomllib.TOMLDecodeError as e:
        raise CaseError("", f"not valid TOML: {e}", source=str(p)) from None


def load_cases(path, only=None):
    """The base case and each variant of a case file, validated and built (list of Case).

    only : a variant name (or "base") to build just that one.
    """
    return cases_from_dict(read_toml(path), only, source=str(path))


def cases_from_dict(raw, only=None, source=None):
    """The base case and each variant of a case given as a dict (the TOML's tables), validated and built.

    only : a variant name (or "base") to build just that one.
    source : what to name in error messages (a file name), if any.
    """
    try:
        checked = validate_raw(raw)
        cases = []
        if only in (None, "base"):
            cases.append(build_case(checked, "base"))
        for i, var in enumerate(checked["variant"]):
            where = f"variant[{i + 1}].set"
            new = apply_overrides(raw, var["set"], where)
            try:  # every variant is checked, so a slip in one is found whichever is asked for
                valid = validate_raw(new)
                if only in (None, var["name"]):
                    cases.append(replace(build_case(valid, var["name"]), first_cost=var["cost"]))
            except CaseError as e:
                raise CaseError(f'variant "{var["name"]}": {e.path}', e.args[0]) from None
        if only is not None and not cases:
            names = ", ".join(["base"] + [v["name"] for v in checked["variant"]])
            raise CaseError("variant", f'"{only}" is not in the case; it has: {names}')
        return cases
    except CaseError as e:
        if e.source is None and source is not None:
            e.source = source
        raise
