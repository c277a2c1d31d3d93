"""The money part of `compare` and `report`: year runs over the weather file, then attic.runs.money.

Helpers only (no commands), so the commands that use them change by a few lines."""

from __future__ import annotations

import sys
from pathlib import Path

import typer

from attic.cli.common import EXIT_INPUT, _fail

WEATHER_HELP = ("Hourly weather CSV (as for `year`): with a \\[money] section, the annual energy, its cost, the "
                "payback and present value of each variant.")


def money_for(case_path, cases, comparison, weather: Path | None):
    """MoneyStudy for the solved cases (base first), or None when the case has no [money] section.

    With a weather file every case is run through attic.runs.year.run_year, the solve of `atticduct year`.
    """
    from attic.runs.money import money_study

    if cases[0].inputs.get("money") is None:
        if weather is not None:
            typer.echo(f"atticduct: {case_path} has no [money] section, so --weather is not used", err=True)
        return None
    if weather is None:
        return money_study(cases, comparison)
    from rich.console import Console
    from rich.progress import Progress

    from attic.case.load import CaseError
    from attic.case.weather import WeatherError, read_weather
    from attic.network.solve import SolveError
    from attic.runs.year import run_year

    try:
        w = read_weather(weather)
    except WeatherError as e:
        _fail(str(e), EXIT_INPUT)
    years, notes = {}, {}
    with Progress(console=Console(stderr=True), transient=True, disable=not sys.stderr.isatty()) as prog:
        task = prog.add_task(f"year runs for the money: {w.n} hours", total=len(cases))
        for c in cases:
            try:
                years[c.name] = run_year(c, w)
            except CaseError as e:
                e.source = e.source or str(case_path)
                _fail(str(e), EXIT_INPUT)
            except (SolveError, ValueError) as e:
                notes[c.name] = f"the year run did not close: {e}"
            prog.advance(task)
    return money_study(cases, comparison, years, notes)


def money_columns(study, name):
    """The flat money.* columns of one variant for CSV (no cash-flow lists); none for a variant the study left
    out (it did not solve at every condition)."""
    one = study.for_case(name)
    if one is None:
        return {}
    v = one.to_dict()
    needs = study.to_dict()["needs"]
    if needs and not v.get("note"):  # the empty annual columns say why in the sheet too, as the table does
        v["note"] = f"annual energy, saving, payback and present value need {needs}"
    return {f"money.{k}": x for k, x in v.items() if k not in ("case", "cash_flow", "cash_flow_undiscounted")}


def money_renderables(study):
    """The money table, what is missing and the caution, as rich renderables."""
    from attic.present.tables import money_table

    d = study.to_dict()
    out = [money_table(d)]
    if d["needs"]:
        out.append(f"Money: annual energy, saving, payback and present value need {d['needs']}.")
    out += [f"Money, {v['case']}: {v['note']}" for v in d["variants"] if v["note"]]
    return out + [f"[dim]{study.caution}[/dim]"]


def cash_flow_path(plot: Path):
    """Where `compare --plot FILE` puts the cash-flow chart: FILE-cash-flow beside it."""
    return plot.with_name(f"{plot.stem}-cash-flow{plot.suffix}")
