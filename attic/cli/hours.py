"""Commands hour by hour: the design day and a year of weather."""

from __future__ import annotations

from enum import StrEnum
from pathlib import Path

import typer

from attic.cli.common import (
    EXIT_INPUT,
    PLOT_SUFFIXES,
    Fmt,
    UnitSystem,
    _caution_line,
    _check_output_path,
    _emit_data,
    _fail,
    _load,
    _save_figure,
    command,
    format_option,
    output_option,
    plot_option,
    units_option,
    variant_option,
)
from attic.cli.solving import _finish

WEATHER_COLUMNS = ("timestamp; drybulb_F or drybulb_C; dewpoint_F, dewpoint_C, rh (0-1) or rh_pct; ghi_w_m2 or "
                   "ghi_btuh_ft2; wind_mph or wind_m_s; optional dni_w_m2 and dhi_w_m2 together")


@command()
def day(
    case: Path = typer.Argument(..., help="The case file (every variant is run)."),
    variant: str = variant_option(),
    format: Fmt | None = format_option("table, json or csv (csv: one row per variant and hour)."),
    output: Path = output_option(),
    units: UnitSystem = units_option(),
    plot: Path = plot_option("Temperatures and loads through the day: one file, a row of two panels per "
                             "variant."),
    mass: bool = typer.Option(False, "--mass", help="Include the heat capacity of the roof covering and sheathing "
                                                    "(a repeating day); by default each hour is quasi-steady."),
):
    """The 24 hours of the cooling design day, hour by hour, with the peak hour.

    The design dry bulb with ASHRAE's daily-range profile (cooling.daily_range_F) and clear-sky sun on each
    roof plane. Each hour is quasi-steady unless --mass. Duct loads are for the air handler running.
    """
    from attic.network.solve import SolveError
    from attic.present.hours import day_output
    from attic.runs.day import run_design_day

    _check_output_path(output, [case])
    _check_output_path(plot, [case], PLOT_SUFFIXES, "--plot")
    cases = _load(case, variant)
    days, failures = [], []
    for c in cases:
        try:
            days.append(run_design_day(c, mass=mass))
        except SolveError as e:
            failures.append(str(e))
    u = units.value
    outs = [day_output(d, u) for d in days]

    def renderables():
        from attic.present.tables import day_table

        out = []
        for d, o in zip(days, outs, strict=True):
            how = ("With the roof's heat capacity (covering and sheathing)." if d.mass else
                   "Quasi-steady: a real roof's heat capacity delays and trims the peak (try --mass).")
            parts = "ceiling + air from the attic + duct" if any(d.attic_air_w) else "ceiling + duct"
            out += [day_table(o), f"Peak {parts} load at hour {d.peak_hour}; hottest attic at hour "
                                  f"{d.peak_attic_hour} (solar time). {how}"]
        return out + [_caution_line()]

    _emit_data(format, outs, lambda: [{"case": o["case"], **r} for o in outs for r in o["hours"]], renderables,
               output, [case])
    if plot and days:
        from attic.present.plots import design_day_chart

        _save_figure(design_day_chart(days, u), plot)
    _finish(failures)


class Runtime(StrEnum):
    load = "load"
    full = "full"


@command()
def year(
    case: Path = typer.Argument(..., help="The case file (every variant is run). Needs site.longitude_deg and "
                                          "site.utc_offset_h."),
    weather: Path = typer.Option(..., "--weather", "-w", help="Hourly weather CSV. Columns: " + WEATHER_COLUMNS
                                 + "."),
    above: str = typer.Option(None, "--above", help="Count the hours the attic air is above these "
                                                    "temperatures (°F, or °C with --units si) [default: 100,120,140 "
                                                    "°F; 38,49,60 °C with --units si]."),
    seer: float = typer.Option(None, "--seer", min=1, max=60, help="Cooling efficiency, Btu/Wh, for kWh of "
                                                                    "electricity."),
    hspf: float = typer.Option(None, "--hspf", min=1, max=30, help="Heating efficiency, Btu/Wh, for kWh of "
                                                                    "electricity."),
    runtime: Runtime = typer.Option(Runtime.load, "--runtime", help="load: the air handler runs as much of each "
                                    "hour as the load needs; full: all of every cooling or heating hour."),
    variant: str = variant_option(),
    format: Fmt | None = format_option("table, json or csv (csv: one row per variant and hour)."),
    output: Path = output_option(),
    units: UnitSystem = units_option(),
    plot: Path = plot_option("Heat map of attic air temperature by month and hour: one file, a panel per "
                             "variant."),
    deck_plot: Path = typer.Option(None, "--deck-plot", help="The roof deck month by month: condensing surface, "
                                   "underside and outdoor means against 45 °F, and hours below the dew point. "
                                   "Writes exactly this file (.png or .svg); one variant (-n NAME)."),
):
    """A year (or any span) of weather: hours above attic temperatures and the ceiling and duct energy.

    Energy at the coil in Btu and kWh, for cooling and heating, per variant; the total is the equipment load's
    energy. Cooling hours are those at or above 65 °F outdoors, heating hours at or below 60 °F. The base load of
    each hour follows a straight line from zero at those temperatures to the design load at the design
    condition (the bin method's load line). Each hour is quasi-steady.
    """
    from rich.console import Console

    from attic.case.load import CaseError
    from attic.case.weather import WeatherError, read_weather
    from attic.network.solve import SolveError
    from attic.present.hours import year_output
    from attic.runs.year import run_year
    from attic.units import F_to_K

    reads = [case, (weather, "weather file")]
    _check_output_path(output, reads)
    _check_output_path(plot, reads, PLOT_SUFFIXES, "--plot")
    _check_output_path(deck_plot, reads, PLOT_SUFFIXES, "--deck-plot")
    u = units.value
    if above is None:  # the same three attic temperatures in either system, not 100 °F read as 100 °C
        above = "100,120,140" if u == "ip" else "38,49,60"
    try:
        limits = [float(x) for x in above.split(",") if x.strip()]
    except ValueError:
        _fail(f"--above {above!r}: give temperatures separated by commas, e.g. 100,120,140", EXIT_INPUT)
    cases = _load(case, variant)
    if deck_plot and len(cases) > 1:
        _fail(f"--deck-plot {deck_plot}: one figure draws one variant; name it with -n (the case has "
              f"{len(cases)}: {', '.join(c.name for c in cases)})", EXIT_INPUT)
    if weather.is_dir():
        _fail(f"--weather {weather}: that is a folder; give the weather CSV file", EXIT_INPUT)
    try:
        w = read_weather(weather)
    except WeatherError as e:
        _fail(str(e), EXIT_INPUT)
    except UnicodeDecodeError:
        _fail(f"--weather {weather}: not UTF-8 text; a weather file is a CSV saved as UTF-8", EXIT_INPUT)
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
                _fail(str(e), EXIT_INPUT)
            except SolveError as e:
                failures.append(str(e))
            prog.advance(task)
    outs = [year_output(y, u, seer, hspf) for y in years]

    def rows():
        from attic.units import BTUH, K_to_C, K_to_F

        k, wu = (1 / BTUH, "btuh") if u == "ip" else (1.0, "w")
        tk = "F" if u == "ip" else "C"
        parts = (("base", "base"), ("ceiling", "ceiling"), ("attic_air", "attic_air"),
                 ("duct_conduction", "duct_conduction"), ("duct_leakage_sensible", "duct_leakage_sensible"),
                 ("duct_leakage_latent", "duct_leakage_latent"), ("ducts", "ducts"), ("unmet", "unmet"),
                 ("coil", "total"))
        out = []
        conv = K_to_F if u == "ip" else K_to_C
        for y in years:
            T = conv(y.hourly["attic_air_K"])
            Ts, Td = conv(y.hourly["deck_surface_K"]), conv(y.hourly["deck_dewpoint_K"])
            for i, t in enumerate(y.times):
                r = {"case": y.case, "timestamp": f"{t:%Y-%m-%d %H:%M}", f"attic_air_{tk}": f"{T[i]:.2f}",
                     "mode": {1: "cooling", -1: "heating", 0: "off"}[int(y.hourly["mode"][i])],
                     "runtime": f"{y.hourly['runtime'][i]:.3f}"}
                for p, name in parts:
                    r[f"{name}_{wu}"] = f"{y.hourly[p + '_w'][i] * k:.1f}"
                r[f"deck_surface_{tk}"], r[f"deck_dewpoint_{tk}"] = f"{Ts[i]:.2f}", f"{Td[i]:.2f}"
                out.append(r)
        return out

    def renderables():
        from attic.present.tables import year_lines

        out = []
        for y, d in zip(years, outs, strict=True):
            out += year_lines(y, d, u) + _deck_year_table(d, u)
        return out + ["[dim]Quasi-steady hours: the roof's heat capacity is left out, which sharpens the daily "
                      "swing. Annual energy is an estimate for comparing variants, not a bill.[/dim]", _caution_line()]

    _emit_data(format, outs, rows, renderables, output, reads)
    if plot and years:
        from attic.present.plots import attic_heatmap

        _save_figure(attic_heatmap(years, u), plot)
    if deck_plot and years:
        from attic.present.deck_plot import deck_year_chart

        _save_figure(deck_year_chart(years[0], u), deck_plot)
    _finish(failures)


def _deck_year_table(d, u):
    """Month by month at the roof deck: hours with a negative margin and mean temperatures against 45 °F."""
    from rich.markup import escape
    from rich.table import Table

    dk = d.get("deck")
    if not dk:
        return []
    tk, unit = ("_F", "°F") if u == "ip" else ("_C", "°C")
    t = Table(title=escape(f"roof deck: the {dk['condensing_surface']} ({dk['reached_by']}), month by month"),
              title_justify="left")
    for col in ("month", "hours at risk", f"condensing surface, mean {unit}", f"deck underside, mean {unit}",
                f"outdoor air, mean {unit}", f"above {dk['criterion' + tk]:g}{unit}"):
        t.add_column(col, justify="right")
    for m in dk["months"]:
        above = "-" if m["above_criterion"] is None else ("yes" if m["above_criterion"] else "NO")
        t.add_row(m["month"], f"{m['hours_at_risk']:,}", f"{m['surface_mean' + tk]:.1f}",
                  f"{m['underside_mean' + tk]:.1f}", f"{m['outdoor_mean' + tk]:.1f}", above)
    cold = ", ".join(dk["coldest_months"])
    if dk["meets_criterion"] is None:
        verdict = "the code's criterion is for unvented attics; it is shown for comparison only"
    else:
        verdict = ("its monthly means stay above the criterion" if dk["meets_criterion"] else
                   "its monthly mean FALLS BELOW the criterion in at least one of them")
    return [t, escape(f"{dk['hours_at_risk']:,} hours with the condensing surface below the dew point reaching it. "
                      f"Coldest months ({cold}): {verdict} ({dk['criterion']}; check the edition adopted). "
                      "Moisture damage is real; the adopted code and licensed practice govern.")]
