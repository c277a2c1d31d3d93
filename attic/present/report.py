"""A self-contained HTML report: inputs, every variant's results, code checks, method, cautions.

Plots are inline SVG; the page loads nothing from the network. It reads result objects and the
output-contract dicts; it computes nothing.
"""

from __future__ import annotations

import datetime as _dt
from html import escape

from attic.present.contract import CAUTION

CSS = """
body{font-family:system-ui,-apple-system,'Segoe UI',sans-serif;max-width:1100px;margin:2em auto;padding:0 1em;
color:#222;line-height:1.45}
h1{font-size:1.6em}h2{border-bottom:2px solid #0072B2;padding-bottom:.2em;margin-top:1.8em}
table{border-collapse:collapse;margin:.6em 0 1.2em;font-size:.92em}
th,td{border:1px solid #ccc;padding:.3em .55em;text-align:right}th{background:#eef4fa}
td.l,th.l{text-align:left}.caution{background:#fff4e0;border-left:5px solid #E69F00;padding:.7em 1em}
.pass{color:#009E73;font-weight:bold}.fail{color:#D55E00;font-weight:bold}.na{color:#777}
pre{background:#f6f6f6;padding:.8em;overflow-x:auto;font-size:.85em}svg{max-width:100%;height:auto}
@media (max-width:700px){table{display:block;overflow-x:auto;max-width:100%}}
"""

METHOD = [
    "Steady-state heat balance of each roof plane (outer and inner surface), the attic air and the top of the "
    "ceiling insulation, solved by Newton's method (scipy.optimize.root as the fallback); every node's residual "
    "is below 0.1 W.",
    "Sun: NREL SPA solar position, Ineichen-Perez clear sky and Hay-Davies transposition (pvlib). Sky: "
    "Berdahl & Martin (1984). Exterior convection: {convection}, wind brought to roof height by "
    "ASHRAE Handbook-Fundamentals (2017) ch. 24 eq. (4).",
    "Inside the attic: Walton (1983) natural convection; grey diffuse radiosity with crossed-string view "
    "factors. Ventilation from the vents' net free areas by stack and wind, ASHRAE Fundamentals ch. 16.",
    "Ducts: Gnielinski and Churchill-Chu films, a cylindrical insulation model that reproduces Palmiter & "
    "Kruse (2006), leakage by enthalpy with CoolProp's moist-air properties (ASHRAE RP-1485); delivery "
    "effectiveness checked against ASHRAE Standard 152. Ducts are coupled to the attic air and surfaces.",
    "Design state: the equipment runs the whole hour and delivers the house load at the case's supply "
    "temperature; the airflow that does so is found together with the attic (a fixed point), and the case's "
    "air handler is flagged when its airflow delivers less. Duct leaks are spread over each side's ducts by "
    "bare surface area (or the given leak_share).",
    "Code checks paraphrase IRC R806.2, R806.5 and IECC R403.3 (2012-2021 editions).",
    "Winter moisture at the roof deck, at the heating design condition: the condensing surface's temperature "
    "from the solved deck by the series-resistance profile (ASHRAE Fundamentals ch. 25), against the dew point of "
    "what reaches it: attic air (outdoor air plus the house air the stack effect pushes through the ceiling, "
    "ASHRAE Fundamentals ch. 16) in a vented attic, indoor air in an unvented one, or for foam alone the vapour "
    "that diffuses through it (the steady dew-point method, ASHRAE Fundamentals ch. 25). Moisture damage is real; "
    "the adopted code and licensed practice govern.",
    "A steady value ignores the heat capacity of the roof, so it sits above a measured peak: a few °F for "
    "shingle and metal roofs, more for heavy tile (checked against Parker & Sherwin 1998).",
]


def _table(head, rows, left=1):
    h = "".join(f'<th class="{"l" if i < left else ""}">{escape(str(c))}</th>' for i, c in enumerate(head))
    body = []
    for r in rows:
        body.append("<tr>" + "".join(f'<td class="{"l" if i < left else ""}">{c}</td>' for i, c in enumerate(r))
                    + "</tr>")
    return f"<table><thead><tr>{h}</tr></thead><tbody>{''.join(body)}</tbody></table>"


def _signed(v, d=0):
    """A difference with its sign, as the terminal's tables show it (attic.present.tables._signed); "-" for none."""
    from attic.present.tables import _signed as signed

    return "-" if v is None else escape(signed(v, d))


def _n(v, d=0):
    if v is None:
        return "-"
    if isinstance(v, bool):
        return "yes" if v else "no"
    if isinstance(v, int | float):
        s = f"{v:,.{d}f}"
        return escape(s[1:] if s.startswith("-") and float(s.replace(",", "")) == 0 else s)  # never "-0"
    return escape(str(v))


def _condition_rows(o):
    a, h = o["attic"], o["house"]
    cool = o["condition"] == "cooling"  # tons and ft² per ton mean little for heating
    rows = [["attic air, °F", _n(a["air_F"], 1)]]
    if o["ducts"]:
        rows.append(["attic air without the duct leakage, °F", _n(a["air_without_leaks_F"], 1)])
    for p in a["planes"]:
        rows.append([f"{p['facing']} plane: outer / deck underside, °F",
                     f"{_n(p['outer_F'], 1)} / {_n(p['inner_F'], 1)}"])
    rows += [["top of ceiling insulation, °F", _n(a["floor_F"], 1)],
             ["ventilation, CFM (air changes per hour; unvented: leakage)",
              f"{_n(a['ventilation_cfm'])} ({_n(a['air_changes_per_hour'], 1)})"],
             ["ceiling gain (+) or loss (-), Btu/h", _n(a["ceiling_gain_btuh"])]]
    if o["ducts"]:
        d = o["ducts"]
        for s in d["segments"]:
            flag = ' <span class="fail">sweats</span>' if s["sweats"] else ""
            rows.append([f"duct {escape(s['name'])}: leaving °F, gain Btu/h, jacket margin to dew point °F",
                         f"{_n(s['leaving_F'], 1)}, {_n(s['gain_btuh'])}, {_n(s['dewpoint_margin_F'], 1)}{flag}"])
        rows += [["duct conduction / leakage sensible / latent, Btu/h",
                  f"{_n(d['conduction_btuh'])} / {_n(d['leakage_sensible_btuh'])} / {_n(d['leakage_latent_btuh'])}"
                  + (" (the latent part is a credit: return leaks draw attic air drier than the house's)"
                     if d.get("leakage_latent_credit") else "")],
                 ["delivery effectiveness", _n(d["delivery_effectiveness"], 3)],
                 ["design airflow, CFM (CFM per ton)", f"{_n(d['airflow_cfm'])} ({_n(d['cfm_per_ton'])})"],
                 ["air handler in the case: CFM, delivers Btu/h",
                  f"{_n(h['air_handler_cfm'])}, {_n(h['air_handler_delivers_btuh'])}"
                  + (' <span class="fail">too small for the load</span>' if h["air_handler_short"] else "")]]
    d = o.get("deck")
    if d:
        flag = ' <span class="fail">at risk</span>' if d["at_risk"] else ""
        rows += [["winter condensing surface (reached by)", f"{escape(d['condensing_surface'])} "
                  f"({escape(d['reached_by'])})"],
                 ["condensing surface / dew point / margin, °F",
                  f"{_n(d['surface_F'], 1)} / {_n(d['dewpoint_F'], 1)} / {_n(d['margin_F'], 1)}{flag}"],
                 ["deck underside / outdoor air, °F", f"{_n(d['underside_F'], 1)} / {_n(d['outdoor_F'], 1)}"]]
    else:
        rows += [["winter condensing surface (reached by)", "-"], ["condensing surface / dew point / margin, °F", "-"],
                 ["deck underside / outdoor air, °F", "-"]]
    rows += [["house load at the registers, Btu/h", _n(h["load_btuh"])],
             ["equipment load, Btu/h (tons of cooling)",
              f"<b>{_n(h['total_btuh'])}</b>" + (f" ({_n(h['tons'], 2)})" if cool else "")],
             ["ft² per ton of cooling (rule of thumb 400-500)", _n(h["ft2_per_ton"]) if cool else "-"]]
    return rows


def uncertainty_section(out, svg):
    """HTML of an uncertainty run (attic.present.uncertainty.uncertainty_output in IP) and its chart."""
    from attic.present.uncertainty import deck_risk_lines, few_samples_note, given_at

    parts = [f"<h2>How sure at the {escape(out['condition'])} design condition: {out['samples']:,} samples of the "
             "uncertain inputs</h2>",
             f"<p>{escape(out['method'])} Seed {out['seed']}; {escape(out['condition'])} design condition.</p>",
             _table(["input", "distribution", "parameters", "scales the case value"],
                    [[escape(i["path"]), escape(i["distribution"]),
                      escape(", ".join(f"{p:g}" for p in i["parameters"])), _n(i["scales_the_case_value"])]
                     for i in out["inputs"]])]
    if few_samples_note(out["samples"]):  # on the page too, where a client reads the bands
        parts.append(f'<p class="caution"><strong>Few samples.</strong> {escape(few_samples_note(out["samples"]))}.'
                     "</p>")
    failed = [c for c in out["cases"] if c["failed"]]
    if failed:
        first = failed[0]["failed"][0]
        parts.append("<p class=\"caution\"><strong>Not every sample solved.</strong> "
                     + "; ".join(f"{escape(c['case'])}: {len(c['failed']):,} of {out['samples']:,} left out"
                                 for c in failed)
                     + f". The bands below are of the samples that solved. First failure (sample {first['sample']}, "
                     f"{escape(failed[0]['case'])}): {escape(first['why'])}</p>")
    rows = []
    labels = {"attic_air": ("attic air °F", "_F", 1), "ducts": ("ducts Btu/h", "_btuh", 0),
              "equipment": ("equipment Btu/h", "_btuh", 0), "tons": ("tons", "", 2),
              "deck_margin": ("roof deck margin to dew point °F", "_F", 1)}
    quantities = [(name, *labels[name]) for name in given_at(out["condition"])]
    for c in out["cases"]:
        name_shown = c["case"] + (f" ({len(c['failed'])} samples failed)" if c["failed"] else "")
        for name, label, suf, d in quantities:
            rows.append([escape(name_shown), escape(label)] + [_n(c[name][p + suf], d) for p in ("p10", "p50", "p90",
                                                                                                "mean")])
    parts.append(_table(["case", "quantity", "P10", "P50", "P90", "mean"], rows, left=2))
    if out["savings"]:
        at = out["savings"][0].get("at_least_btuh", 0.0)
        def share(s):
            v = s["share_saving_at_least"]
            return "-" if v is None else _n(100 * v) + " %"

        parts.append(_table(["variant", "saving P10 Btu/h", "P50", "P90", f"share saving ≥ {at:,.0f} Btu/h"],
                            [[escape(s["variant"])] + [_n(s.get(f"saving_{p}_btuh")) for p in ("p10", "p50", "p90")]
                             + [share(s)] for s in out["savings"]]))
    rc = out["rank_correlation"]
    outs = [k for k in rc if k != "what"]
    labels = list(rc[outs[0]]) if outs else []
    parts.append("<p>What moves the answer most: Spearman rank correlation of each input with each output.</p>")
    parts.append(_table(["input"] + outs, [[escape(lab)] + [_n(rc[k][lab], 2) for k in outs] for lab in labels]))
    for h in out["held_by_variants"]:
        parts.append(f"<p>Variant {escape(h['variant'])} sets {escape(h['path'])} itself and keeps its own value "
                     "there in every sample.</p>")
    if out.get("base_load_held"):
        parts.append(f"<p>{escape(out['base_load_held'])}</p>")
    parts += [f'<p class="caution">{escape(line)}</p>' for line in deck_risk_lines(out)]
    parts.append(f"<figure>{svg}<figcaption>Equipment load of each case and saving of each variant: bar P10-P90, "
                 "line P50, dot mean.</figcaption></figure>")
    return "\n".join(parts)


def _money_section(money, chart):
    """The money section: one row per variant, the terms, the chart, the caution (all read from the dict)."""
    from attic.present.tables import money_cells, money_head

    t = money["terms"]
    fuel = t["heating_fuel"] or "none"
    terms = (f"Electricity ${t['electricity_per_kwh']:.3f}/kWh; heating fuel {fuel}"
             + (f" at ${t['gas_per_therm']:.2f}/therm, AFUE {t['heating_efficiency']:.2f}" if fuel == "gas" else "")
             + f"; SEER {t['seer']:g}" + (f", HSPF {t['hspf']:g}" if fuel == "heat-pump" else "")
             + f"; equipment ${t['equipment_per_ton']:,.0f}/ton; life {t['life_years']} years; real discount rate "
             f"{t['discount_rate']:.1%}.")
    parts = ["<h2>Money: what each option costs and pays back</h2>", f"<p>{escape(terms)}</p>"]
    if money["needs"]:
        parts.append(f"<p><b>Annual figures need {escape(money['needs'])}.</b></p>")
    rows = [[escape(v["case"])] + [escape(c) for c in money_cells(v, money["needs"])] for v in money["variants"]]
    parts.append(_table(list(money_head(money["needs"])), rows))
    notes = [f"{escape(v['case'])}: {escape(v['note'])}" for v in money["variants"] if v["note"]]
    if notes:
        parts.append("<p>" + "<br>".join(notes) + "</p>")
    parts.append("<p>Payback is simple (undiscounted): net first cost (first cost less the equipment credit) over "
                 "the annual saving. Present value: the savings over the life, discounted with the uniform-series "
                 "present-worth factor (Newnan, Engineering Economic Analysis; ASHRAE Handbook-HVAC Applications, "
                 "Owning and Operating Costs), less the net first cost; positive pays. Annual energy is the coil "
                 "energy of the same hourly run as <code>atticduct year</code>, at the equipment's seasonal "
                 "ratings.</p>")
    if chart:
        parts.append(f"<figure>{chart}<figcaption>Cumulative cash flow of each variant against the base"
                     "</figcaption></figure>")
    parts.append(f'<div class="caution"><b>Caution.</b> {escape(money["caution"])}</div>')
    return parts


# the published source of each roof exterior-convection model a case can choose (attic.physics.convection)
CONVECTION_SOURCES = {
    "clear-gartland-winkelmann": "Clear, Gartland & Winkelmann (2003)",
    "walton-tarp": "Walton (1983), TARP",
    "yazdanian-klems": "Yazdanian & Klems (1994)",
    "watmuff": "Watmuff et al. (1977)",
}


def build_report(case_text, case_name, comparison, outputs_by_case, checks_by_case, charts, extra=(), money=None,
                 money_chart=None, convection=("clear-gartland-winkelmann",), failed=()):
    """The HTML text.

    case_text : the case file as written; outputs_by_case : {name: [output dicts]};
    checks_by_case : {name: [RuleResult]}; charts : {title: inline svg text}; extra : more HTML sections
    (e.g. uncertainty_section), placed after the results of every variant;
    money : MoneyStudy.to_dict() or None (no [money] section); money_chart : inline svg text or None;
    convection : the exterior-convection models the variants use (keys of CONVECTION_SOURCES);
    failed : [{"case", "conditions", "error"}] for each variant that did not solve at some condition
    """
    from importlib.metadata import PackageNotFoundError, version

    try:
        made_by = f"atticduct {version('atticduct')}"
    except PackageNotFoundError:  # run from a source tree that was never installed
        made_by = "atticduct"
    used = "; ".join(f"{CONVECTION_SOURCES.get(k, k)} ({k})" for k in convection)
    method = [m.replace("{convection}", used) for m in METHOD]
    parts = [f"<!DOCTYPE html><html lang=\"en\"><head><meta charset=\"utf-8\">"
             '<meta name="viewport" content="width=device-width, initial-scale=1">'
             f"<title>{escape(comparison.title)}</title><style>{CSS}</style></head><body>",
             f"<h1>{escape(comparison.title)}</h1>",
             f"<p>Case file: <code>{escape(case_name)}</code>. Made by {escape(made_by)} on "
             f"{_dt.date.today().isoformat()}.</p>",
             f'<div class="caution"><b>Caution.</b> {escape(CAUTION)}</div>',
             "<h2>Variants side by side</h2>"]
    if failed:  # said first: a reader must not take a missing variant for one that was never asked for
        parts.append('<div class="caution"><b>Not every variant solved.</b> '
                     + " ".join(f"<b>{escape(f['case'])}</b> ({', '.join(f['conditions']) or 'every condition'}): "
                                f"{escape(f['error'])}." for f in failed)
                     + " Its results there are not on this page.</div>")
    # from the output contract, as the command line's tables are, so the page and the terminal show the same digits
    from attic.present.contract import comparison_output

    cmp = comparison_output(comparison, "ip")
    for kind in ("cooling", "heating"):
        rows = [r for r in cmp["rows"] if r["condition"] == kind]
        if not rows:
            continue
        parts.append(f"<h3>{kind.capitalize()} design condition</h3>")
        deck = kind == "heating" and any(r.get("deck_margin_F") is not None for r in rows)
        cool = kind == "cooling"
        # every part of the equipment load has its column, so a row adds up: base, ceiling, the attic's air
        # reaching the house, ducts; tons only in cooling (they measure cooling)
        head = (["variant", "attic air °F", "base Btu/h", "ceiling Btu/h", "air from the attic Btu/h", "ducts Btu/h",
                 "equipment Btu/h"] + (["tons"] if cool else []) + ["vs base Btu/h"]
                + (["vs base tons"] if cool else []) + (["deck margin to dew point °F"] if deck else []))
        body = []
        for r in rows:
            h = r["house"]
            margin = r.get("deck_margin_F")
            body.append(
                [escape(r["case"]), _n(r["attic"]["air_F"], 1), _n(h["base_btuh"]), _n(h["ceiling_btuh"]),
                 _n(h["attic_air_btuh"]), _n(h["ducts_btuh"]), _n(h["total_btuh"])]
                + ([_n(h["tons"], 2)] if cool else []) + [_signed(r["vs_base"]["total_btuh"])]
                + ([_signed(r["vs_base"]["tons"], 2)] if cool else [])
                + ([("-" if margin is None else f"{margin:+.1f}")
                    + (' <span class="fail">at risk</span>' if (margin or 0) < 0 else "")] if deck else []))
        body += [[escape(f["case"]), '<span class="fail">did not solve</span>'] + [""] * (len(head) - 2)
                 for f in failed if kind in f["conditions"]]
        parts.append(_table(head, body))
    for d in cmp["ducts_inside"]:
        parts.append(f"<p><b>Moving the ducts inside</b> ({escape(d['variant'])}) saves {_n(d['saved_btuh'])} Btu/h, "
                     f"{_n(d['saved_tons'], 2)} tons at the cooling design condition.</p>")
    for title, svg in charts.items():
        parts.append(f"<figure>{svg}<figcaption>{escape(title)}</figcaption></figure>")
    if money is not None:
        parts += _money_section(money, money_chart)
    parts.append("<h2>Results of every variant</h2>")
    for name, outs in outputs_by_case.items():
        parts.append(f"<h3>{escape(name)}</h3>")
        by = {o["condition"]: _condition_rows(o) for o in outs}
        kinds = list(by)
        labels = [r[0] for r in by[kinds[0]]]
        rows = []
        for i, lab in enumerate(labels):
            rows.append([escape(lab)] + [by[k][i][1] if i < len(by[k]) else "-" for k in kinds])
        parts.append(_table(["quantity"] + kinds, rows))
        v = outs[0]["vents"]
        if v["applies"]:
            parts.append(f"<p>Vents: {_n(v['provided_nfa_ft2'], 2)} ft² provided, {_n(v['required_nfa_ft2'], 2)} ft² "
                         f"required at {escape(str(v['ratio']))}. {escape(v['why'])}. {escape(v['fix'])}</p>")
    parts.extend(extra)
    parts.append("<h2>Code checks</h2><p>Check the edition your jurisdiction adopted; local amendments govern.</p>")
    for name, rules in checks_by_case.items():
        parts.append(f"<h3>{escape(name)}</h3>")
        cls = {"pass": "pass", "fail": "fail", "n/a": "na"}
        parts.append(_table(["rule", "source", "the case has", "required", "verdict", "to fix"],
                            [[escape(r.rule), escape(r.source), escape(r.provided), escape(r.required),
                              f'<span class="{cls[r.verdict]}">{escape(r.verdict)}</span>', escape(r.fix)]
                             for r in rules], left=6))
    parts.append("<h2>Method and references</h2><ul>" + "".join(f"<li>{escape(m)}</li>" for m in method) + "</ul>")
    parts.append("<h2>Inputs (the case file)</h2>" f"<pre>{escape(case_text)}</pre>")
    parts.append(f'<div class="caution"><b>Caution.</b> {escape(CAUTION)}</div></body></html>')
    return "\n".join(parts)
