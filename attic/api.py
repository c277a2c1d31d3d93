"""The Python face of atticduct, for notebooks and scripts: read a case, solve it, get frozen results.

Every result is a frozen dataclass in SI units with ``to_dict()``; the hour-by-hour and many-point results
also have ``to_frame()`` (pandas). The command line is a thin user of these same functions.
"""

from __future__ import annotations

from pathlib import Path


def read_case(source, variant=None):
    """The base case and each ``[[variant]]``, validated and built (list of Case, base first).

    Parameters
    ----------
    source : str, Path or dict
        A case file (TOML) or the same tables as a dict.
    variant : str, optional
        Build only this variant ("base" for the case without variants).

    Raises
    ------
    attic.case.load.CaseError
        Naming the key, the value and what is allowed.
    """
    from attic.case.load import cases_from_dict, load_cases

    if isinstance(source, dict):
        return cases_from_dict(source, only=variant)
    return load_cases(Path(source), only=variant)


def design_conditions(case):
    """The case solved at its cooling (and heating) design condition: list of ConditionResult.

    Raises attic.network.solve.SolveError when a balance does not close, ValueError when no airflow serves the
    load (the same solve as the command line's, attic.runs.batch).
    """
    return _solved([case])[case.name]


def design_frame(results):
    """ConditionResults as a pandas DataFrame in SI, one row each."""
    from attic.runs.condition import to_frame

    return to_frame(results)


def design_day(case, mass=False):
    """The 24 hours of the cooling design day (DesignDay); ``mass=True`` includes the roof's heat capacity."""
    from attic.runs.day import run_design_day

    return run_design_day(case, mass=mass)


def read_weather(path):
    """An hourly weather file (CSV; see README) as Weather in SI."""
    from attic.case.weather import read_weather as _read

    return _read(Path(path))


def year(case, weather, runtime="load"):
    """Every hour of ``weather`` for ``case`` (YearResult); runtime "load" (part load) or "full"."""
    from attic.runs.year import run_year

    return run_year(case, weather, runtime_model=runtime)


def compare(cases):
    """Solve every case and set each beside the first (Comparison); raises as design_conditions."""
    from attic.runs.study import compare as _compare

    return _compare(cases, _solved(cases))


def _solved(cases):
    """{name: [ConditionResult]} of every case, solved together; the first error raised."""
    from attic.runs.batch import run_cases

    results, errors = run_cases(cases)
    for c in cases:
        if c.name in errors:
            raise errors[c.name]
    return results


def sweep(source, settings, condition="cooling", units="si"):
    """The case at every combination of the given values (SweepResult).

    Parameters
    ----------
    source : str, Path or dict
        The case file or its tables; its variants are ignored.
    settings : dict
        Dotted key path -> list of values, e.g. ``{"duct.*.r_value": [4.2, 6, 8]}`` (IP values, as in a case file).
    condition : "cooling" or "heating"
    units : "si" or "ip" for the output columns
    """
    from attic.case.load import read_toml
    from attic.runs.study import sweep as _sweep

    raw = source if isinstance(source, dict) else read_toml(Path(source))
    return _sweep(raw, [(k, list(v)) for k, v in settings.items()], kind=condition, units=units)


def check_codes(case):
    """The code rules (IRC vents and unvented assembly, IECC ducts) for one case: list of RuleResult."""
    from attic.codes.rules import check_case

    return check_case(case)


def money(cases, weather=None):
    """What each variant costs and pays back (MoneyStudy), or None when the case has no [money] section.

    cases : read_case's list, base first; weather : read_weather's Weather for the annual figures (the same
    year runs as ``year``), or None: then only first cost and equipment credit, and ``needs`` says why.
    """
    from attic.runs.money import money_study
    from attic.runs.year import run_year

    cmp = compare(cases)
    years = None if weather is None else {c.name: run_year(c, weather) for c in cases}
    return money_study(cases, cmp, years)
