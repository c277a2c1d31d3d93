"""Commands hour by hour: the design day and a year of weather."""

from __future__ import annotations

import json
import sys
from enum import StrEnum
from pathlib import Path

import typer

from attic.cli.common import EXIT_CASE, Fmt, UnitSystem, _fail, _finish, _load, _rows_csv, _save_each, app


@app.command()
def day(
    case: Path = typer.Argument(..., help="The case file (every variant is run)."),
    variant: str = typer.Option(None, "--variant", "-v", help="Run only this variant."),
    format: Fmt = typer.Option(Fmt.table, "--format", "-f", help="table, json or csv."),
    units: UnitSystem = typer.Option(UnitSystem.ip, "--units", "-u", help="ip or si."),
    plot: Path = typer.Option(None, "--plot", "-p", help="Plot temperatures and loads through the day (.png/.svg); "
                                                         "with several variants, one file each (name-variant.png)."),
    mass: bool = typer.Option(False, "--mass", help="Include the heat capacity of the roof covering and sheathing "
                                                    "(a repeating day); by default each hour is quasi-steady."),
):
    """The 24 hours of the cooling design day, hour by hour, with the peak hour.

    The design dry bulb with ASHRAE's daily-range profile (cooling.daily_range_F) and clear-sky sun on each
    roof plane. Each hour is quasi-steady unless --mass."""
    from attic.network.solve import SolveError
    from attic.present.hours import day_output
    from attic.runs.day import run_design_day

    cases = _load(case, variant)
    days, failures = [], []
    for c in cases:
        try:
            days.append(run_design_day(c, mass=mass))
        except SolveError as e:
            failures.append(str(e))
    u = units.value
    if format == Fmt.json:
        typer.echo(json.dumps([day_output(d, u) for d in days], indent=2))
    elif format == Fmt.csv:
        sys.stdout.write(_rows_csv([{"case": d.case, **r} for d in days for r in day_output(d, u)["hours"]]))
    else:
        from rich.console import Console
        from rich.table import Table

        con = Console()
        t_, w_ = ("_F", "_btuh") if u == "ip" else ("_C", "_w")
        for d in days:
            dd = day_output(d, u)
            unit = "Btu/h" if u == "ip" else "W"
            t = Table(title=f"{d.title} — {d.case}: cooling design day (solar time; loads in {unit}, ducts with "
                            "the air handler running)", title_justify="left")
            for col in ("hour", "outdoor", "attic air", "deck 1", "deck 2", "ceiling", "ducts"):
                t.add_column(col, justify="right")
            for r in dd["hours"]:
                style = "bold" if r["hour"] == d.peak_hour else None
                t.add_row(str(r["hour"]), f"{r['outdoor' + t_]:.1f}", f"{r['attic_air' + t_]:.1f}",
                          f"{r['plane1_inner' + t_]:.1f}", f"{r['plane2_inner' + t_]:.1f}", f"{r['ceiling' + w_]:,.0f}",
                          f"{r['ducts' + w_]:,.0f}", style=style)
            con.print(t)
            how = ("With the roof's heat capacity (covering and sheathing)." if d.mass else
                   "Quasi-steady: a real roof's heat capacity delays and trims the peak (try --mass).")
            con.print(f"Peak ceiling + duct load at hour {d.peak_hour}; hottest attic at hour {d.peak_attic_hour} "
                      f"(solar time). {how}")
    if plot:
        from attic.present.plots import design_day_chart

        _save_each(plot, case, days, lambda d: design_day_chart(d, u))
    _finish(failures)


class Runtime(StrEnum):
    load = "load"
    full = "full"


@app.command()
def year(
    case: Path = typer.Argument(..., help="The case file (every variant is run). Needs site.longitude_deg and "
                                          "site.utc_offset_h."),
    weather: Path = typer.Option(..., "--weather", "-w", help="Hourly weather CSV; columns: timestamp, "
                                 "drybulb_F|drybulb_C, dewpoint_F|dewpoint_C|rh|rh_pct, ghi_w_m2|ghi_btuh_ft2, "
                                 "wind_mph|wind_m_s, optional dni_w_m2 and dhi_w_m2."),
    above: str = typer.Option("100,120,140", "--above", help="Count the hours the attic air is above these "
                                                             "temperatures (°F, or °C with --units si)."),
    seer: float = typer.Option(None, "--seer", min=1, max=60, help="Cooling efficiency, Btu/Wh, for kWh of "
                                                                    "electricity."),
    hspf: float = typer.Option(None, "--hspf", min=1, max=30, help="Heating efficiency, Btu/Wh, for kWh of "
                                                                    "electricity."),
    runtime: Runtime = typer.Option(Runtime.load, "--runtime", help="load: the air handler runs as much of each "
                                    "hour as the load needs; full: all of every cooling or heating hour."),
    variant: str = typer.Option(None, "--variant", "-v", help="Run only this variant."),
    format: Fmt = typer.Option(Fmt.table, "--format", "-f", help="table, json or csv (csv: one row an hour)."),
    units: UnitSystem = typer.Option(UnitSystem.ip, "--units", "-u", help="ip or si."),
    plot: Path = typer.Option(None, "--plot", "-p", help="Heat map of attic temperature by day and hour (.png/.svg); "
                                                         "with several variants, one file each."),

    deck_plot: Path = typer.Option(None, "--deck-plot", help="The roof deck month by month: condensing surface, "
                                   "underside and outdoor means against 45 °F, and hours below the dew point "
                                   "(.png/.svg); with several variants, one file each."),
):
    """A year (or any span) of weather: hours above attic temperatures and the ceiling and duct energy.

    Energy at the coil in Btu and kWh, for cooling and heating, per variant. Cooling hours are those at or above
    65 °F outdoors, heating hours at or below 60 °F. The base load of each hour follows a straight line from
    zero at those temperatures to the design load at the design condition (the bin method's load line). Each
    hour is quasi-steady."""
    from rich.console import Console

    from attic.case.load import CaseError
    from attic.case.weather import WeatherError, read_weather
    from attic.network.solve import SolveError
    from attic.present.hours import year_output
    from attic.runs.year import run_year
    from attic.units import F_to_K

    cases = _load(case, variant)
    try:
        w = read_weather(weather)
    except WeatherError as e:
        _fail(str(e), EXIT_CASE)
    u = units.value
    try:
        limits = [float(x) for x in above.split(",") if x.strip()]
    except ValueError:
        _fail(f"--above {above!r}: give temperatures separated by commas, e.g. 100,120,140", EXIT_CASE)
    to_K = (lambda t: float(F_to_K(t))) if u == "ip" else (lambda t: t + 273.15)
    con = Console(stderr=True)
    years, failures = [], []
    from rich.progress import Progress

    with Progress(console=con, transient=True) as prog:
        task = prog.add_task(f"solving {w.n} hours", total=len(cases))
        for c in cases:
            try:
                years.append(run_year(c, w, [to_K(t) for t in limits], runtime.value))
            except CaseError as e:
                e.source = e.source or str(case)
                _fail(str(e), EXIT_CASE)
            except SolveError as e:
                failures.append(str(e))
            prog.advance(task)
    if format == Fmt.json:
        typer.echo(json.dumps([year_output(y, u, seer, hspf) for y in years], indent=2))
    elif format == Fmt.csv:
        import csv
        import io

        from attic.units import BTUH, K_to_C, K_to_F

        buf = io.StringIO()
        wr = csv.writer(buf, lineterminator="\n")
        k, wu = (1 / BTUH, "btuh") if u == "ip" else (1.0, "w")
        tk = "F" if u == "ip" else "C"
        parts = ("base", "ceiling", "attic_air", "duct_conduction", "duct_leakage_sensible", "duct_leakage_latent",
                 "ducts", "coil")
        wr.writerow(["case", "timestamp", f"attic_air_{tk}", "mode", "runtime"] + [f"{p}_{wu}" for p in parts]
                    + [f"deck_surface_{tk}", f"deck_dewpoint_{tk}"])
        conv = K_to_F if u == "ip" else K_to_C
        for y in years:
            T = conv(y.hourly["attic_air_K"])
            Ts, Td = conv(y.hourly["deck_surface_K"]), conv(y.hourly["deck_dewpoint_K"])
            for i, t in enumerate(y.times):
                m = {1: "cooling", -1: "heating", 0: "off"}[int(y.hourly["mode"][i])]
                wr.writerow([y.case, f"{t:%Y-%m-%d %H:%M}", f"{T[i]:.2f}", m, f"{y.hourly['runtime'][i]:.3f}"]
                            + [f"{y.hourly[p + '_w'][i] * k:.1f}" for p in parts] + [f"{Ts[i]:.2f}", f"{Td[i]:.2f}"])
        sys.stdout.write(buf.getvalue())
    else:
        from rich.table import Table

        out = Console()
        for y in years:
            d = year_output(y, u, seer, hspf)
            out.print(f"[bold]{y.title} — {y.case}[/bold]: {d['hours']} hours, {d['start']} to {d['end']}")
            tk = "_F" if u == "ip" else "_C"
            hot = ", ".join(f"{h} h above {k.replace(tk, '')}{'°F' if u == 'ip' else '°C'}"
                            for k, h in d["hours_above"].items())
            out.print(f"Attic air: hottest {d['attic_air_max' + tk]:.1f}{'°F' if u == 'ip' else '°C'}; {hot}.")
            t = Table(title="energy at the coil over the span", title_justify="left")
            t.add_column("")
            for mode in ("cooling", "heating"):
                t.add_column(f"{mode} ({d[mode]['hours']} h)", justify="right")
            rows = [("base load (load line)", "base"), ("ceiling", "ceiling"), ("air from the attic", "attic_air"),
                    ("duct conduction", "duct_conduction"), ("duct leakage, sensible", "duct_leakage_sensible"),
                    ("duct leakage, latent", "duct_leakage_latent"), ("ducts, all", "ducts"), ("coil total", "coil")]
            for label, p in rows:
                cells = []
                for mode in ("cooling", "heating"):
                    kwh = d[mode][p + "_kwh"]
                    cells.append(f"{y.energy(mode, p, 'btu') / 1e6:,.2f} MMBtu = {kwh:,.0f} kWh" if u == "ip"
                                 else f"{kwh:,.0f} kWh")
                t.add_row(label, *cells)
            if seer or hspf:
                t.add_row("electricity", *[f"{d[m]['electricity_kwh']:,.0f} kWh" if "electricity_kwh" in d[m] else "-"
                                           for m in ("cooling", "heating")])
            out.print(t)
            _deck_year_table(out, d, u)
        out.print("[dim]Quasi-steady hours: the roof's heat capacity is left out, which sharpens the daily swing. "
                  "Annual energy is an estimate for comparing variants, not a bill.[/dim]")
    if plot:
        from attic.present.plots import attic_heatmap

        _save_each(plot, case, years, lambda y: attic_heatmap(y, u))
    if deck_plot:
        from attic.present.deck_plot import deck_year_chart

        _save_each(deck_plot, case, years, lambda y: deck_year_chart(y, u))
    _finish(failures)




def _deck_year_table(out, d, u):
    """Month by month at the roof deck: hours with a negative margin and mean temperatures against 45 °F."""
    from rich.table import Table

    dk = d.get("deck")
    if not dk:
        return
    tk, unit = ("_F", "°F") if u == "ip" else ("_C", "°C")
    t = Table(title=f"roof deck: the {dk['condensing_surface']} ({dk['reached_by']}), month by month",
              title_justify="left")
    for col in ("month", "hours at risk", f"condensing surface, mean {unit}", f"deck underside, mean {unit}",
                f"outdoor air, mean {unit}", f"above {dk['criterion' + tk]:g}{unit}"):
        t.add_column(col, justify="right")
    for m in dk["months"]:
        above = "-" if m["above_criterion"] is None else ("yes" if m["above_criterion"] else "NO")
        t.add_row(m["month"], f"{m['hours_at_risk']}", f"{m['surface_mean' + tk]:.1f}",
                  f"{m['underside_mean' + tk]:.1f}", f"{m['outdoor_mean' + tk]:.1f}", above)
    out.print(t)
    cold = ", ".join(dk["coldest_months"])
    if dk["meets_criterion"] is None:
        verdict = "the code's criterion is for unvented attics; it is shown for comparison only"
    else:
        verdict = ("its monthly means stay above the criterion" if dk["meets_criterion"] else
                   "its monthly mean FALLS BELOW the criterion in at least one of them")
    out.print(f"{dk['hours_at_risk']} hours with the condensing surface below the dew point reaching it. Coldest "
              f"months ({cold}): {verdict} ({dk['criterion']}; check the edition adopted). Moisture damage is "
              "real; the adopted code and licensed practice govern.")
