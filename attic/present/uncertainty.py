"""The uncertainty run as the output contract (dicts with unit-suffixed keys), every sample as CSV rows, and
terminal tables. Only unit conversion and percentiles of the solved samples happen here."""

from __future__ import annotations

import numpy as np

from attic.present.contract import CAUTION, Units, _round, gives_tons

# (output name in the result, contract name, unit kind of contract.Units or None)
QUANTITIES = (("attic_air_K", "attic_air", "T"), ("ducts_w", "ducts", "W"), ("equipment_w", "equipment", "W"),
              ("tons", "tons", None), ("deck_margin_K", "deck_margin", "dT"))
METHOD = ("Latin hypercube sample (scipy.stats.qmc) of the [uncertainty] inputs, the same samples for the base "
          "and every variant, so a saving is a paired difference; P10, P50, P90 are percentiles of the "
          "samples that solved. Which inputs move the answer most: Spearman rank correlation.")


# Common practice, no source: the 10th and 90th percentiles of a sample settle to a few per cent of the band's
# width only with some hundreds of draws.
FEW_SAMPLES = 200


def few_samples_note(n):
    """A line to say that n samples give rough percentiles, or None when n is enough."""
    if n >= FEW_SAMPLES:
        return None
    return (f"{n:,} samples give rough percentiles and rank correlations; P10 and P90 settle with some hundreds "
            "(the default is 2,000)")


def parse_saves(text, units="ip"):
    """'0.25t' (tons), '5000' (Btu/h in IP, W in SI), '5000btuh' or '1500w' -> W; ValueError if unreadable."""
    from attic.units import BTUH, TON

    t = text.strip().lower().replace(",", "").replace(" ", "")
    for suffix, k in (("tons", TON), ("ton", TON), ("t", TON), ("btuh", BTUH), ("btu/h", BTUH), ("w", 1.0)):
        if t.endswith(suffix):
            num, factor = t[: -len(suffix)], k
            break
    else:
        num, factor = t, None
    try:
        v = float(num)
    except ValueError:
        raise ValueError(f'"{text}": give an amount like 0.25t (tons), 5000btuh or 1500w') from None
    if not np.isfinite(v):
        raise ValueError(f'"{text}": give a finite amount')
    if factor is None:  # a bare number: Btu/h (W in SI); below 10 it is surely tons meant without the t
        if 0 < v < 10:
            unit = "btuh" if units == "ip" else "w"
            raise ValueError(f'"{text}" without a unit is {v:g} {"Btu/h" if units == "ip" else "W"}: write '
                             f'{v:g}t for tons, or {v:g}{unit} if you mean it')
        factor = BTUH if units == "ip" else 1.0
    return v * factor


def _rounded(by_input):
    """Rank correlations to 3 decimals (their sampling error at 2,000 samples is about 0.02)."""
    return {k: None if v is None else round(float(v), 3) for k, v in by_input.items()}


def _put(d, u, name, kind, value):
    if kind is None:
        d[name] = None if value is None else _round(value)
    else:
        u.put(d, name, kind, value)


def given_at(kind):
    """The outputs (contract names) a design condition gives, as `run` shows them: tons size cooling equipment
    only, and the roof deck's margin to the dew point is a winter check."""
    return (("attic_air", "ducts", "equipment") + (("tons",) if gives_tons(kind) else ())
            + (("deck_margin",) if kind == "heating" else ()))


def _sized(res, key):
    """Whether an output of the result (a key of its outputs) is given at its condition (given_at)."""
    return next(name for k, name, _ in QUANTITIES if k == key) in given_at(res.kind)


def _stats(res, case, u):
    out = {}
    for key, name, kind in QUANTITIES:
        st = res.stats(case, key) if _sized(res, key) else dict.fromkeys(("p10", "p50", "p90", "mean"))
        out[name] = {}
        for p, v in st.items():
            _put(out[name], u, p, kind, v)
    margin = res.outputs[case]["deck_margin_K"]
    margin = margin[np.isfinite(margin)]
    # the share of the samples in which the deck's condensing surface is below the dew point reaching it
    out["share_deck_at_risk"] = _round(float(np.mean(margin < 0.0))) if len(margin) and _sized(
        res, "deck_margin_K") else None
    return out


BASE_LOAD_KEYS = {"cooling": ("house.cooling_sensible_btuh", "house.cooling_latent_btuh"),
                  "heating": ("house.heating_btuh",)}


def base_load_held(res):
    """A sentence when the condition's weather or indoor state is drawn but the base load is not: that load comes
    from the user's own calculation at the case's design condition, so it stays at its value in every sample and
    the band holds only what the attic and ducts make of the drawn condition. None otherwise."""
    moist = ("rh", "dewpoint", "wetbulb")  # the heating base load is sensible: the air's water does not move it
    drawn = [i.path for i in res.inputs if i.path.startswith(f"{res.kind}.")
             and not (res.kind == "heating" and any(w in i.path for w in moist))]
    keys = BASE_LOAD_KEYS[res.kind]
    if not drawn or any(i.path in keys for i in res.inputs):
        return None
    return (f"{', '.join(drawn)} {'is' if len(drawn) == 1 else 'are'} drawn, but the base load ({', '.join(keys)}, "
            "from your load calculation) stays at the case's value in every sample: the bands hold what the attic "
            "and ducts make of the drawn condition, not the walls' and windows' share. Make the base load uncertain "
            "too for the whole spread.")


def uncertainty_output(res, units="ip", saves_w=0.0):
    """The whole run as one dict: inputs, bands per case, savings per variant, rank correlations."""
    u = Units(units)
    base = res.cases[0]
    saves = {}
    _put(saves, u, "at_least", "W", saves_w)
    out = {
        "title": res.title, "condition": res.kind, "units": units, "samples": res.n, "seed": res.seed,
        "method": METHOD,
        "inputs": [{"path": i.path, "distribution": i.dist.kind, "parameters": list(i.dist.params),
                    "range": [i.dist.lo, i.dist.hi], "scales_the_case_value": i.scale} for i in res.inputs],
        "held_by_variants": [{"variant": v, "path": p} for v, p in res.held],
        "base_load_held": base_load_held(res),
        "cases": [], "savings": [],
        "rank_correlation": {"what": "Spearman rank correlation of each input with the output",
                             f"{base} equipment load":
                                 _rounded(res.rank_correlations(res.outputs[base]["equipment_w"]))},
        "caution": CAUTION,
    }
    if _sized(res, "deck_margin_K"):  # in winter, what moves the deck's margin (the indoor humidity, say)
        out["rank_correlation"][f"{base} roof deck margin"] = _rounded(
            res.rank_correlations(res.outputs[base]["deck_margin_K"]))
    for c in res.cases:
        entry = {"case": c, "solved": int(np.sum(res.ok(c))), "failed": [{"sample": i, "why": e}
                                                                          for i, e in res.errors[c]]}
        entry.update(_stats(res, c, u))
        out["cases"].append(entry)
    for v in res.cases[1:]:
        s = res.saving(v)
        s = s[np.isfinite(s)]
        share = res.share_saving(v, saves_w)
        entry = {"variant": v, "share_saving_at_least": _round(share) if np.isfinite(share) else None}
        entry.update(saves)
        if len(s):
            p10, p50, p90 = np.percentile(s, (10, 50, 90))
            for name, val in (("p10", p10), ("p50", p50), ("p90", p90), ("mean", float(np.mean(s)))):
                _put(entry, u, f"saving_{name}", "W", float(val))
        out["savings"].append(entry)
        out["rank_correlation"][f"{v} saving"] = _rounded(res.rank_correlations(res.saving(v)))
    return out


def summary_rows(out):
    """The summary as one CSV table, a row per case: its bands; for a variant its saving's band and the share of
    samples saving at least the --saves amount; and each input's rank correlation with the base's equipment
    load (base row) or with the variant's saving (variant rows), as rho.INPUT."""
    savings = {s["variant"]: s for s in out["savings"]}
    base = out["cases"][0]["case"]
    rows = []
    for c in out["cases"]:
        row = {"case": c["case"], "solved": c["solved"]}
        for q in ("attic_air", "ducts", "equipment", "tons") + (("deck_margin",) if out["condition"] == "heating"
                                                                   else ()):
            row.update({f"{q}.{k}": v for k, v in c[q].items()})
        if out["condition"] == "heating":
            row["share_deck_at_risk"] = c["share_deck_at_risk"]
        sv = savings.get(c["case"], {})
        for k in (k for s in out["savings"][:1] for k in s if k != "variant"):
            row[k] = sv.get(k)
        rc = out["rank_correlation"][f"{base} equipment load" if c["case"] == base else f"{c['case']} saving"]
        row.update({f"rho.{k}": v for k, v in rc.items()})
        rows.append(row)
    return rows


# a sample is one point, as a sweep's: its outputs keep the names run and sweep give them (the output contract)
SAMPLE_NAMES = {"attic_air": "attic.air", "ducts": "ducts.total", "equipment": "house.total", "tons": "house.tons",
                "deck_margin": "deck.margin"}


def sample_rows(res, units="ip"):
    """One CSV row per sample and case: the drawn inputs, the four outputs (named as in run and sweep), and where
    a sample failed, blank outputs and why in the error column."""
    u = Units(units)
    rows = []
    for c in res.cases:
        why = dict(res.errors[c])
        for i in range(res.n):
            row = {"case": c, "sample": i}
            for j, inp in enumerate(res.inputs):
                row[inp.label] = float(res.values[i, j])
            for key, name, kind in QUANTITIES:
                if key == "deck_margin_K" and not _sized(res, key):
                    continue  # a winter check: no column in cooling
                v = float(res.outputs[c][key][i])
                _put(row, u, SAMPLE_NAMES[name], kind, v if np.isfinite(v) and _sized(res, key) else None)
            row["error"] = why.get(i)
            rows.append(row)
    return rows


def _n(v, fmt):
    if v is None:
        return "-"
    return fmt.format(v + 0.0 if abs(v) > 1e-9 else 0.0)  # no "-0"


def uncertainty_tables(out, top=3):
    """rich renderables of an uncertainty_output dict: the bands, the savings, what moves the answer."""
    from rich.table import Table

    ip = out["units"] == "ip"
    T, W = ("°F", "Btu/h") if ip else ("°C", "W")
    t_, w_ = ("_F", "_btuh") if ip else ("_C", "_w")
    items = []
    bands = Table(title=f"{out['title']} — {out['condition']} design condition, {out['samples']:,} samples",
                  title_justify="left")
    bands.add_column("case", min_width=14, ratio=1)
    bands.add_column("quantity")
    for col in ("P10", "P50", "P90", "mean"):
        bands.add_column(col, justify="right")
    for c in out["cases"]:
        label = c["case"] + ("" if not c["failed"] else f" ({len(c['failed'])} samples failed)")
        rows = {"attic_air": (f"attic air {T}", t_, "{:.1f}"), "ducts": (f"ducts {W}", w_, "{:,.0f}"),
                "equipment": (f"equipment {W}", w_, "{:,.0f}"), "tons": ("tons", "", "{:.2f}"),
                "deck_margin": (f"deck margin {'°F' if ip else 'K'}", "_F" if ip else "_K", "{:+.1f}")}
        shown = [(name, *rows[name]) for name in given_at(out["condition"])]
        for name, text, suf, fmt in shown:
            d = c[name]
            bands.add_row(label, text, *[_n(d[p + suf], fmt) for p in ("p10", "p50", "p90", "mean")],
                          end_section=name == shown[-1][0])
            label = ""
    items.append(bands)
    if out["savings"]:
        at = out["savings"][0]["at_least" + w_]
        sv = Table(title=f"Savings against the base, sample by sample ({W})", title_justify="left")
        sv.add_column("variant", min_width=14, ratio=1)
        tons = f" ({at / 12000.0:.2f} t)" if ip and at and gives_tons(out["condition"]) else ""  # 12,000 Btu/h a ton
        for col in ("P10", "P50", "P90", f"saves ≥ {at:,.0f} {W}{tons}"):
            sv.add_column(col, justify="right")
        for s in out["savings"]:
            if "saving_p10" + w_ not in s:
                sv.add_row(s["variant"], "-", "-", "-", "-")
                continue
            sv.add_row(s["variant"], *[_n(s[f"saving_{p}{w_}"], "{:,.0f}") for p in ("p10", "p50", "p90")],
                       f"{100 * s['share_saving_at_least']:.0f} % of samples")
        items.append(sv)
    rc = out["rank_correlation"]
    corr = Table(title="What moves the answer most (Spearman rank correlation with the output)",
                 title_justify="left")
    corr.add_column("output", min_width=14, ratio=1)
    corr.add_column(f"the {top} strongest inputs")
    for k, by_input in rc.items():
        if k == "what":
            continue
        ranked = sorted(((abs(v), name, v) for name, v in by_input.items() if v is not None), reverse=True)[:top]
        corr.add_row(k, ", ".join(f"{name} {v:+.2f}" for _, name, v in ranked) or "-")
    items.append(corr)
    for h in out["held_by_variants"]:
        items.append(f'Variant "{h["variant"]}" sets {h["path"]} itself: it keeps its own value there in every sample.')
    if out["base_load_held"]:
        items.append(out["base_load_held"])
    items += deck_risk_lines(out)
    return items


def deck_risk_lines(out):
    """One line naming the cases whose roof deck is below the dew point reaching it in some samples, and in what
    share of them, then the moisture caution; none when no sample is at risk."""
    from attic.runs.deck import CAUTION as DECK_CAUTION

    risky = [f"{c['case']} {_share(c['share_deck_at_risk'])}" for c in out["cases"] if c.get("share_deck_at_risk")]
    if not risky:
        return []
    return [f"Roof deck at risk of winter condensation (below the dew point reaching it), share of the samples: "
            f"{'; '.join(risky)}. {DECK_CAUTION}"]


def _share(v):
    """A share as a per cent that never rounds a few samples away (0.2 % is not 0 %, 99.8 % is not 100 %)."""
    p = 100.0 * v
    return f"{p:.0f} %" if 1.0 <= p <= 99.0 or p in (0.0, 100.0) else f"{p:.1f} %"
