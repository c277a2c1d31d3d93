"""Terminal tables of results (rich). Reads the output-contract dicts; computes nothing."""

from __future__ import annotations


def _fmt(v, digits=0):
    if v is None:
        return "-"
    if isinstance(v, bool):
        return "yes" if v else "no"
    if isinstance(v, float):
        s = f"{v:,.{digits}f}"
        return s[1:] if s.startswith("-") and float(s.replace(",", "")) == 0 else s  # never "-0"
    return str(v)


def case_table(outputs, units="ip"):
    """A rich Table for one case: rows are quantities, columns its conditions."""
    from rich.table import Table

    T = "°F" if units == "ip" else "°C"
    dT, dt_ = ("°F", "_F") if units == "ip" else ("K", "_K")  # a difference of temperatures
    t_ = "_F" if units == "ip" else "_C"
    W = "Btu/h" if units == "ip" else "W"
    w_ = "_btuh" if units == "ip" else "_w"
    Q = "CFM" if units == "ip" else "L/s"
    q_ = "_cfm" if units == "ip" else "_l_s"
    first = outputs[0]
    table = Table(title=f"{first['title']} — {first['case']}", title_justify="left", show_lines=False)
    table.add_column("quantity", style="bold")
    for o in outputs:
        table.add_column(o["condition"], justify="right")

    def row(label, get, digits=0, style=None):
        vals = []
        for o in outputs:
            try:
                vals.append(_fmt(get(o), digits))
            except (KeyError, TypeError, IndexError):
                vals.append("-")
        table.add_row(label, *vals, style=style)

    def section(name):
        table.add_row(f"[underline]{name}[/underline]", *[""] * len(outputs))

    section(f"attic ({first['attic']['type']})")
    row(f"attic air, {T}", lambda o: o["attic"]["air" + t_], 1)
    if first.get("ducts"):
        row(f"attic air without the duct leakage, {T}", lambda o: o["attic"]["air_without_leaks" + t_], 1)
    for i, p in enumerate(first["attic"]["planes"]):
        row(f"{p['facing']} plane: sun, {'Btu/h·ft²' if units == 'ip' else 'W/m²'}",
            lambda o, i=i: o["attic"]["planes"][i]["irradiance" + ("_btuh_ft2" if units == "ip" else "_w_m2")])
        row(f"{p['facing']} plane: outer surface, {T}", lambda o, i=i: o["attic"]["planes"][i]["outer" + t_], 1)
        row(f"{p['facing']} plane: deck underside, {T}", lambda o, i=i: o["attic"]["planes"][i]["inner" + t_], 1)
        row(f"{p['facing']} plane: sol-air, {T}", lambda o, i=i: o["attic"]["planes"][i]["sol_air" + t_], 1)
    row(f"top of ceiling insulation, {T}", lambda o: o["attic"]["floor" + t_], 1)
    row(f"ventilation, {Q}", lambda o: o["attic"]["ventilation" + q_])
    row("air changes per hour (unvented: leakage)", lambda o: o["attic"]["air_changes_per_hour"], 1)
    row(f"ceiling gain (+) or loss (-), {W}", lambda o: o["attic"]["ceiling_gain" + w_])
    one_kind = _one_kind_note(first.get("vents") or {})
    if one_kind:
        table.add_row(f"[bold]note:[/bold] {one_kind}", *[""] * len(outputs))
    if first.get("ducts"):
        model = first["ducts"]["r_model"]
        section("ducts (all in conditioned space)" if model == "none" else f"ducts (insulation: {model} model)")
        for i, s in enumerate(first["ducts"]["segments"]):
            n = s["name"] + (f" ×{s['count']}" if s["count"] > 1 else "")
            row(f"{n} ({s['location']}): leaving air, {T}", lambda o, i=i: o["ducts"]["segments"][i]["leaving" + t_], 1)
            row(f"{n}: gain (+) or loss (-), {W}", lambda o, i=i: o["ducts"]["segments"][i]["gain" + w_])
            row(f"{n}: jacket / margin to dew point, {T if T == dT else T + ' / ' + dT}",
                lambda o, i=i: "{:.1f} / {:+.1f}{}".format(
                    o["ducts"]["segments"][i]["jacket" + t_],
                    o["ducts"]["segments"][i]["dewpoint_margin" + dt_],
                    "  SWEATS" if o["ducts"]["segments"][i]["sweats"] else ""))
        row(f"conduction: supply, {W}", lambda o: o["ducts"]["supply_conduction" + w_])
        row(f"conduction: return, {W}", lambda o: o["ducts"]["return_conduction" + w_])
        row(f"leakage, sensible, {W}", lambda o: o["ducts"]["leakage_sensible" + w_])
        row(f"leakage, latent, {W}", lambda o: _latent(o["ducts"], w_))
        row("delivery effectiveness", lambda o: o["ducts"]["delivery_effectiveness"], 3)
        row(f"design airflow (carries the equipment load), {Q}", lambda o: o["ducts"]["airflow" + q_])
        row(f"air handler in the case: airflow, {Q}", lambda o: o["house"]["air_handler" + q_])
        row(f"air handler in the case: delivers, {W}", lambda o: o["house"]["air_handler_delivers" + w_])
        row("air handler in the case: too small for the load?",
            lambda o: "YES, SHORT" if o["house"]["air_handler_short"] else "no",
            style="bold" if any(o["house"].get("air_handler_short") for o in outputs) else None)
    deck = next((o["deck"] for o in outputs if o.get("deck")), None)
    if deck:
        section(f"roof deck in winter: {deck['condensing_surface']} ({deck['reached_by']})")
        row(f"condensing surface / dew point, {T}",
            lambda o: f"{o['deck']['surface' + t_]:.1f} / {o['deck']['dewpoint' + t_]:.1f}")
        row(f"margin to the dew point, {dT}", lambda o: "{:+.1f}{}".format(o["deck"]["margin" + dt_],
                                                          "  AT RISK" if o["deck"]["at_risk"] else ""))
        row(f"deck underside / outdoor air, {T}",
            lambda o: f"{o['deck']['underside' + t_]:.1f} / {o['deck']['outdoor' + t_]:.1f}")
    section("house (every row adds to the equipment load)")
    row(f"base load (your load calculation), {W}",
        lambda o: o["house"]["base_sensible" + w_] + o["house"]["base_latent" + w_])
    row(f"ceiling, {W}", lambda o: o["house"]["ceiling" + w_])
    if any(abs(o["house"]["attic_air" + w_] or 0) > 0.5 for o in outputs):
        row(f"air from the attic, {W}", lambda o: o["house"]["attic_air" + w_])
    row(f"ducts, {W}", lambda o: o["house"]["ducts" + w_])
    row(f"equipment load, {W}", lambda o: o["house"]["total" + w_], style="bold")
    cooling = lambda get: lambda o: get(o) if o["condition"] == "cooling" else None  # noqa: E731
    row("tons of cooling (12,000 Btu/h each)", cooling(lambda o: o["house"]["tons"]), 2, style="bold")
    if units == "ip":
        row("ft² per ton (rule of thumb 400-500)", cooling(lambda o: o["house"]["ft2_per_ton"]))
    else:
        row("m² per ton (rule of thumb 37-46)", cooling(lambda o: o["house"]["m2_per_ton"]), 1)
    row("largest node residual, W", lambda o: f"{o['residual_w']:.1e}")
    return table


def _latent(ducts, w_):
    """The latent leakage load, labelled a credit when dry attic air drawn into return leaks lowers it."""
    v = ducts["leakage_latent" + w_]
    if ducts.get("leakage_latent_credit"):
        return f"{v:,.0f} (credit)"
    return v


def _one_kind_note(vents):
    """The table's note for an attic with one kind of vent, or "" (unvented attics and both kinds)."""
    if vents.get("has_exhaust") is False:
        return "no exhaust (low vents only): wind across the low vents is all the ventilation"
    if vents.get("has_intake") is False:
        return "no intake (high vents only): wind across the high vents is all the ventilation"
    return ""


def vents_line(output):
    v = output["vents"]
    if not v["applies"]:
        return f"Vents: {v['why']}."
    a = "_ft2" if "required_nfa_ft2" in v else "_m2"
    unit = "ft²" if a == "_ft2" else "m²"
    verdict = "meets" if v["complies"] else "FALLS SHORT OF"
    s = (f"Vents: {v['provided_nfa' + a]:.2f} {unit} net free area {verdict} the {v['required_nfa' + a]:.2f} "
         f"{unit} required at {v['ratio']} (IRC R806.2; {v['why']}).")
    if v["fix"]:
        s += f" Fix: {v['fix']}."
    return s


def no_sun_line(output):
    """A sentence when the cooling design hour has no sun on the roof (the hour is at night, or the month's sun
    never clears the planes), else None: cooling design conditions are taken in the afternoon sun."""
    if output["condition"] != "cooling":
        return None
    planes = output["attic"]["planes"]
    if any((p.get("irradiance_btuh_ft2") or p.get("irradiance_w_m2") or 0) > 0 for p in planes):
        return None
    return ("No sun on the roof at this cooling design hour (check cooling.solar_hour and cooling.month: the sun "
            "is down, or low in that month at this latitude); the attic then runs near the outdoor air.")


def deck_line(output):
    """One sentence on the winter condensing surface of a heating output, or None."""
    d = output.get("deck")
    if not d:
        return None
    ip = "surface_F" in d
    t, dt, unit = ("_F", "_F", "°F") if ip else ("_C", "_K", "°C")
    s = (f"Roof deck in winter: the {d['condensing_surface']} ({d['reached_by']}) is at {d['surface' + t]:.1f}{unit}, "
         f"the dew point reaching it {d['dewpoint' + t]:.1f}{unit}: margin {d['margin' + dt]:+.1f} "
         f"{'°F' if ip else 'K'}.")
    if d["at_risk"]:
        s += " AT RISK of condensation or frost."
        if d.get("accumulation_g_m2_day") is not None:
            s += (f" By the same steady diffusion method about {d['accumulation_g_m2_day']:.2g} g/m² a day would "
                  "condense on the sheathing (7/16 in OSB takes about 65 g/m² per percent of moisture content).")
        s += " " + d["caution"]
    return s


def _signed(v, digits=0):
    """+1,234 / -1,234 / 0: a difference with its sign, never -0."""
    s = f"{v:+,.{digits}f}"
    return s[1:] if float(s.replace(",", "")) == 0 else s


def comparison_tables(out):
    """Rich Tables of comparison_output(...) (already in its units): one per design condition.

    Every load column is what adds to the equipment load (+). Heating shows Btu/h, not tons."""
    from rich import box
    from rich.markup import escape
    from rich.table import Table

    ip = out["units"] == "ip"
    T, t_ = ("°F", "_F") if ip else ("°C", "_C")
    W, w_ = ("Btu/h", "_btuh") if ip else ("W", "_w")
    tables = []
    for kind in ("cooling", "heating"):
        rows = [r for r in out["rows"] if r["condition"] == kind]
        if not rows:
            continue
        # the parts shown add up to the equipment load: the base (in the title when every variant has the same),
        # the ceiling, the attic's air reaching the house (a column where any variant has some) and the ducts
        bases = {round(r["house"]["base" + w_], 6) for r in rows}
        one_base = len(bases) == 1
        air = any(abs(r["house"]["attic_air" + w_]) > 0 for r in rows)
        base_words = f"; base load {_fmt(rows[0]['house']['base' + w_])} in each" if one_base else ""
        # no rules between columns and short headers on two lines: the table fits 80 columns, names wrapped
        t = Table(title=escape(f"{out['title']} — {kind} design condition; loads in {W}, + adds to the "
                               f"equipment load{base_words}"), title_justify="left", box=box.SIMPLE_HEAD,
                  collapse_padding=True, pad_edge=False)
        t.add_column("variant", min_width=10, ratio=1)
        cols = [f"attic\nair, {T}"] + ([] if one_base else ["base"]) + ["ceiling"]
        cols += (["from\nattic"] if air else []) + ["ducts", "equip-\nment"]
        cols += ["tons", "vs base", "vs base,\ntons"] if kind == "cooling" else ["vs base"]
        dk = "deck_margin" + ("_F" if ip else "_K")
        deck = kind == "heating" and any(r.get(dk) is not None for r in rows)
        if deck:
            cols.append(f"deck\nmargin, {'°F' if ip else 'K'}")
        for col in cols:
            t.add_column(col, justify="right", no_wrap=True)
        for r in rows:
            h = r["house"]
            cells = ([f"{r['attic']['air' + t_]:.1f}"] + ([] if one_base else [_fmt(h["base" + w_])])
                     + [_fmt(h["ceiling" + w_])] + ([_fmt(h["attic_air" + w_])] if air else [])
                     + [_fmt(h["ducts" + w_]), _fmt(h["total" + w_])])
            if kind == "cooling":
                cells += [f"{h['tons']:.2f}", _signed(r["vs_base"]["total" + w_]), _signed(r["vs_base"]["tons"], 2)]
            else:
                cells += [_signed(r["vs_base"]["total" + w_])]
            if deck:
                m = r.get(dk)
                cells.append("-" if m is None else f"{m:+.1f}{' AT RISK' if m < 0 else ''}")
            t.add_row(escape(r["case"]), *cells)
        for f in out.get("failed", []):  # a variant that did not solve here is in the table, saying so
            if kind in f.get("conditions", ()):
                t.add_row(escape(f["case"]), "failed", "(below)", *[""] * (len(cols) - 2))
        tables.append(t)
    return tables


def day_table(d):
    """A rich Table of day_output(...): the hours, planes named by facing, the peak hour in bold."""
    from rich.markup import escape
    from rich.table import Table

    ip = d["units"] == "ip"
    T, t_ = ("°F", "_F") if ip else ("°C", "_C")
    W, w_ = ("Btu/h", "_btuh") if ip else ("W", "_w")
    faces = [p["facing"] for p in d["planes"]]
    q = d.get("air_handler_cfm", d.get("air_handler_l_s"))
    ran = "" if q is None else f" at the case's {q:,.0f} {'CFM' if ip else 'L/s'} (run sizes the design airflow)"
    t = Table(title=escape(f"{d['title']} — {d['case']}: cooling design day (solar time; temperatures in {T}, "
                           f"loads in {W}, + adds to the equipment load; ducts with the air handler running{ran})"),
              title_justify="left")
    # the attic's own air into the house (an unvented attic's): a column where some hour has it, as run's row
    air = any(r["attic_air_to_house" + w_] for r in d["hours"])
    # headers broken between words by hand, so that a narrow terminal never cuts one ("undersi…")
    for col in (["hour", "outdoor", "attic\nair"] + [f"{f}\ndeck\nunderside" for f in faces] + ["ceiling"]
                + (["air from\nattic"] if air else []) + ["ducts"]):
        t.add_column(col, justify="right")
    for r in d["hours"]:
        style = "bold" if r["hour"] == d["peak_hour"] else None
        t.add_row(str(r["hour"]), f"{r['outdoor' + t_]:.1f}", f"{r['attic_air' + t_]:.1f}",
                  *[f"{r[f'planes.{f}.inner' + t_]:.1f}" for f in faces], _fmt(float(r["ceiling" + w_])),
                  *([_fmt(float(r["attic_air_to_house" + w_]))] if air else []),
                  _fmt(float(r["ducts" + w_])), style=style)
    return t


YEAR_ROWS = (("base load (load line)", "base"), ("ceiling", "ceiling"), ("air from the attic", "attic_air"),
             ("duct conduction", "duct_conduction"), ("duct leakage, sensible", "duct_leakage_sensible"),
             ("duct leakage, latent", "duct_leakage_latent"), ("ducts, all", "ducts"),
             ("left undelivered (air handler short)", "unmet"), ("equipment load (total)", "total"))


def year_lines(y, d, units):
    """Lines and a rich Table for year_output(...)."""
    from rich.markup import escape
    from rich.table import Table

    ip = units == "ip"
    tk, deg = ("_F", "°F") if ip else ("_C", "°C")
    out = [f"[bold]{escape(y.title)} — {escape(y.case)}[/bold]: {d['hours']:,} hours, {d['start']} to {d['end']}"]
    hot = ", ".join(f"{h:,} h above {k.replace(tk, '')}{deg}" for k, h in d["hours_above"].items())
    out.append(f"Attic air: hottest {d['attic_air_max' + tk]:.1f}{deg}; {hot}.")
    t = Table(title="energy at the coil over the span (+ adds to the equipment load)", title_justify="left")
    t.add_column("")
    for mode in ("cooling", "heating"):
        t.add_column(f"{mode} ({d[mode]['hours']:,} h)", justify="right")
    for label, p in YEAR_ROWS:
        cells = []
        for mode in ("cooling", "heating"):
            kwh = d[mode][p + "_kwh"]
            cells.append(_fmt(d[mode][p + "_btu"] / 1e6, 2) + " MMBtu = " + _fmt(float(kwh)) + " kWh" if ip
                         else _fmt(float(kwh)) + " kWh")
        t.add_row(label, *cells)
    if any("electricity_kwh" in d[m] for m in ("cooling", "heating")):
        t.add_row("electricity", *[_fmt(float(d[m]["electricity_kwh"])) + " kWh" if "electricity_kwh" in d[m]
                                   else "-" for m in ("cooling", "heating")])
    out.append(t)
    short = {m: d[m].get("hours_air_handler_short", 0) for m in ("cooling", "heating")}
    if any(short.values()):
        out.append(f"[bold]The air handler runs the whole hour and still falls short of the house load in "
                   f"{short['cooling']:,} cooling and {short['heating']:,} heating hours.[/bold]")
    return out


def money_head(needs, short=False):
    """Column heads of the money table; without annual figures the last column says what they need."""
    head = ("variant", "first cost", "equipment credit")
    if short:
        head = ("variant", "first\ncost", "equipment\ncredit")
    if needs:
        return head + ("annual figures",)
    if short:
        return head + ("energy\n$/year", "saving\n$/year", "payback", "present\nvalue")
    return head + ("energy $/year", "saving $/year", "payback", "present value")


def money_cells(v, needs):
    """The money row of one variant for people: first cost, credit, energy $ a year, saving, payback, PV.

    v : one entry of MoneyStudy.to_dict()["variants"]; needs : the study's reason annual figures are missing
    (then one cell says so in place of the four annual ones).
    """
    def usd(x, sign=False):
        if x is None:
            return "-"
        s = f"{abs(x):,.0f}"
        return ("-" if x < 0 else ("+" if sign and x > 0 else "")) + "$" + s

    base = v["case"] == "base"
    first = [usd(v["first_cost"]), usd(v["equipment_credit"])]
    if needs:
        return first + ["needs a whole year of weather" if "whole year" in needs else "needs a weather file"]
    if v["annual_energy_cost"] is None:
        return first + ["no year run", "-", "-", "-"]
    if base:
        payback = "-"
    elif v["payback_years"] is None:
        payback = "never"
    elif v["payback_years"] == 0:
        payback = "at once"
    else:
        payback = f"{v['payback_years']:.1f} y"
    return first + [usd(v["annual_energy_cost"]), "-" if base else usd(v["annual_saving"], True), payback,
                    "-" if base else usd(v["present_value"], True)]


def money_table(study):
    """A rich Table of a MoneyStudy.to_dict(): one row per variant."""
    from rich.table import Table

    t = study["terms"]
    title = (f"money against the base: {t['life_years']} years at {t['discount_rate']:.1%}, electricity "
             f"${t['electricity_per_kwh']:.3f}/kWh")
    table = Table(title=title, title_justify="left")
    head = money_head(study["needs"], short=True)
    table.add_column(head[0], min_width=14, ratio=1)
    for col in head[1:]:
        table.add_column(col, justify="right", no_wrap=True)
    for v in study["variants"]:
        table.add_row(v["case"], *money_cells(v, study["needs"]))
    return table


def air_handler_lines(outputs):
    """A plain sentence for each condition whose design load the case's air handler cannot carry."""
    from attic.runs.totals import air_handler_advice

    lines = []
    for o in outputs:
        h, d = o["house"], o.get("ducts")
        if not d or not h.get("air_handler_short"):
            continue
        ip = "air_handler_cfm" in h
        q, w = ("_cfm", "_btuh") if ip else ("_l_s", "_w")
        qu, wu = ("CFM", "Btu/h") if ip else ("L/s", "W")
        advice = air_handler_advice(o["condition"], d["airflow" + q] / h["air_handler" + q],
                                    h["air_handler_delivers" + w])
        fix = advice or "give the air handler that airflow, or a colder (cooling) or warmer (heating) supply"
        lines.append(
            f"Air handler too small ({o['condition']}): at {h['air_handler' + q]:,.0f} {qu} it delivers "
            f"{h['air_handler_delivers' + w]:,.0f} {wu} to the house, which needs {h['load' + w]:,.0f} {wu}. "
            f"The results above are for the {d['airflow' + q]:,.0f} {qu} that carries the load at the same "
            f"supply temperature; {fix}.")
    return lines
