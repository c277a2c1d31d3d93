"""Figures (matplotlib, imported on first use). Each function returns the Figure and can save it.

Colours: the Okabe-Ito palette, chosen to stay distinct for colour-blind readers (Okabe & Ito 2008,
"Color Universal Design"). Figures read result objects; they compute nothing but unit conversions.
"""

from __future__ import annotations

from attic.units import BTUH

OKABE_ITO = ["#E69F00", "#56B4E9", "#009E73", "#F0E442", "#0072B2", "#D55E00", "#CC79A7", "#000000"]

LOAD_PARTS = (  # (label, attribute of CompareRow, colour): the base in neutral grey, no two warm hues side by side
    ("base load (your calculation)", "base_w", "#A0A0A0"),
    ("ceiling", "ceiling_w", OKABE_ITO[0]),
    ("air from the attic", "attic_air_w", OKABE_ITO[6]),
    ("duct conduction", "duct_conduction_w", OKABE_ITO[4]),
    ("duct leakage, sensible", "duct_leak_sensible_w", OKABE_ITO[1]),
    ("duct leakage, latent", "duct_leak_latent_w", OKABE_ITO[2]),
)


def _mpl():
    import matplotlib

    matplotlib.use("Agg")
    import matplotlib.pyplot as plt

    plt.rcParams["svg.fonttype"] = "none"  # text stays text in SVG
    return plt


def _power(units):
    return ("Btu/h", 1.0 / BTUH) if units == "ip" else ("W", 1.0)


def comparison_chart(comparison, kind="cooling", units="ip"):
    """Stacked bars of the equipment load's make-up for every variant at one condition.

    Returns the Figure; bar heights are exactly the CompareRow parts (in the chosen unit).
    """
    plt = _mpl()
    rows = comparison.by_kind(kind)
    unit, k = _power(units)
    names = [r.case for r in rows]
    fig, ax = plt.subplots(figsize=(max(6.0, 1.6 * len(rows) + 2.5), 5.2), dpi=100)
    bottoms = [0.0] * len(rows)
    for label, attr, colour in LOAD_PARTS:
        vals = [getattr(r, attr) * k for r in rows]
        if all(abs(v) < 1e-9 for v in vals):
            continue
        ax.bar(names, vals, bottom=bottoms, color=colour, label=label, edgecolor="white", linewidth=0.6)
        bottoms = [b + v for b, v in zip(bottoms, vals, strict=True)]
    for i, r in enumerate(rows):
        text = f"{r.tons:.2f} tons" if kind == "cooling" else f"{r.equipment_w * k:,.0f}"
        ax.annotate(text, (i, r.equipment_w * k), ha="center", va="bottom", fontsize=9,
                    xytext=(0, 3), textcoords="offset points")
    top = max([r.equipment_w * k for r in rows] + [1.0])
    ax.set_ylim(0, top * 1.12)  # room for the labels above the tallest bar, inside the frame
    _thousands(ax)
    ax.set_ylabel(f"equipment load, {unit}")
    ax.set_title(f"{comparison.title}\nload make-up at the {kind} design condition")
    ax.tick_params(axis="x", labelrotation=20)
    for lab in ax.get_xticklabels():
        lab.set_horizontalalignment("right")
    handles, labels = ax.get_legend_handles_labels()  # listed top down, as the parts are stacked
    ax.legend(handles[::-1], labels[::-1], loc="upper left", bbox_to_anchor=(1.01, 1.0), frameon=False, fontsize=9)
    ax.grid(axis="y", alpha=0.3)
    ax.set_axisbelow(True)
    fig.tight_layout()
    return fig


def sweep_chart(result, y_keys):
    """Chosen outputs against the first swept key (one line per value of a second swept key)."""
    plt = _mpl()
    x_key = result.params[0]
    fig, axes = plt.subplots(len(y_keys), 1, figsize=(7.0, 2.8 * len(y_keys) + 0.8), dpi=100, squeeze=False)
    second = result.params[1] if len(result.params) > 1 else None
    groups = {}
    for p, o in zip(result.points, result.outputs, strict=True):
        groups.setdefault(p.get(second) if second else None, []).append((p[x_key], o))
    for pts in groups.values():  # a line runs along x whatever order the values were typed in
        if all(isinstance(x, (int, float)) for x, _ in pts):
            pts.sort(key=lambda xo: xo[0])
    from matplotlib.lines import Line2D

    for ax, y in zip(axes[:, 0], y_keys, strict=True):
        failed = False
        for k, ((g, pts), colour) in enumerate(zip(groups.items(), OKABE_ITO * 4, strict=False)):
            # a point that did not solve breaks the line (NaN) and is marked on the axis: never bridged over
            ys = [float("nan") if o is None or o.get(y) is None else o[y] for _, o in pts]
            ax.plot([x for x, _ in pts], ys, marker="o", ms=3.5, color=colour,
                    label=None if g is None else f"{second} = {g:g}" if isinstance(g, float) else f"{second} = {g}")
            bad = [x for x, o in pts if o is None]
            if bad:
                # marked in its line's colour, each line's marks a little above the last's, so that on a grid
                # it says which line it broke, and two lines failing at one x show two marks
                failed = True
                ax.plot(bad, [0.035 * k] * len(bad), "x", color=colour if second else "#D55E00", ms=7, mew=2,
                        clip_on=False, transform=ax.get_xaxis_transform())
        if all(o is None or o.get(y) is None for pts in groups.values() for _, o in pts):
            ax.set_yticks([])  # no value to read off: an empty scale would look like one
            xs = [x for pts in groups.values() for x, _ in pts]
            if all(isinstance(x, (int, float)) for x in xs) and min(xs) < max(xs):
                ax.set_xlim(min(xs), max(xs))  # the swept values still, as nothing was drawn to scale it
            solved_any = any(o is not None for pts in groups.values() for _, o in pts)
            ax.text(0.5, 0.5, f"not given at the {result.kind} design condition" if solved_any else "no point solved",
                    ha="center", va="center", transform=ax.transAxes)
        ax.set_ylabel(_label(y))
        if y.endswith(("_btuh", "_w", "_cfm", "_l_s")):
            _thousands(ax)
        ax.grid(alpha=0.3)
        handles, _ = ax.get_legend_handles_labels()
        if failed:  # in the legend, where it cannot sit on a line
            handles.append(Line2D([], [], ls="none", marker="x", ms=7, mew=2,
                                  color="0.35" if second else "#D55E00", label="did not solve (marked on the axis)"))
        if handles:
            ax.legend(handles=handles, frameon=False, fontsize=8)
    axes[-1, 0].set_xlabel(param_label(x_key))
    import textwrap

    # long key paths wrap rather than run off the figure's edge
    fig.suptitle("\n".join(textwrap.wrap(f"sweep of {' and '.join(result.params)} ({result.kind} design condition)",
                                          60)))
    fig.tight_layout()
    return fig


def param_label(path):
    """An axis label for a case key path, with the unit the schema gives it."""
    from attic.case.schema import SECTIONS

    parts = path.split(".")
    sec, key = (parts[0], parts[-1]) if len(parts) > 1 else ("", parts[0])
    k = SECTIONS.get(sec, {}).get(key)
    return f"{path}, {k.unit}" if k is not None and k.unit else path


def _label(key):
    """An axis label with its unit, from an output key's suffix."""
    units = {"_F": "°F", "_C": "°C", "_btuh": "Btu/h", "_w": "W", "_cfm": "CFM", "_l_s": "L/s", "_ft2": "ft²",
             "_m2": "m²"}
    words = {"house.total": "equipment load (house.total)", "ducts.total": "duct load (ducts.total)",
             "house.tons": "tons (house.tons)", "attic.air": "attic air (attic.air)"}
    for suf, u in units.items():
        if key.endswith(suf):
            stem = key[: -len(suf)]
            return f"{words.get(stem, stem)}, {u}"
    return words.get(key, key)


def save(fig, path):
    """Save a figure through a temporary file in the same folder (PNG or SVG by the suffix)."""
    from pathlib import Path

    from attic.present.files import atomic_path

    path = Path(path)
    fmt = path.suffix.lstrip(".").lower() or "png"
    if fmt not in ("png", "svg"):
        raise ValueError(f"plot file {path}: use .png or .svg")
    with atomic_path(path, suffix=f".{fmt}") as tmp:
        fig.savefig(tmp, format=fmt, metadata={"Date": None} if fmt == "svg" else None)
    _mpl().close(fig)


def svg_text(fig):
    """The figure as inline SVG for HTML: no XML prolog, DTD, metadata or namespace URLs."""
    import io
    import re

    buf = io.StringIO()
    fig.savefig(buf, format="svg", metadata={"Date": None, "Creator": None, "Format": None, "Type": None})
    _mpl().close(fig)
    s = buf.getvalue()
    s = s[s.index("<svg"):]
    s = re.sub(r"<metadata>.*?</metadata>", "", s, flags=re.S)
    s = re.sub(r'\s+xmlns(:\w+)?="[^"]*"', "", s)
    return s


def _thousands(ax, axis="y"):
    """Load axes read 12,000 not 12000."""
    from matplotlib.ticker import FuncFormatter

    fmt = FuncFormatter(lambda v, _pos: f"{v:,.0f}".replace("-0", "0") if abs(v) >= 1 or v == 0 else f"{v:g}")
    (ax.yaxis if axis == "y" else ax.xaxis).set_major_formatter(fmt)


def design_day_chart(days, units="ip"):
    """Temperatures (left) and loads (right) through the design day, one row per variant, the peak hour marked.

    days : a DesignDay or a list of them; one figure either way."""
    import numpy as np

    plt = _mpl()
    from attic.present.contract import _facing
    from attic.units import K_to_C, K_to_F

    days = list(days) if isinstance(days, list | tuple) else [days]
    T = (lambda K: K_to_F(K)) if units == "ip" else (lambda K: K_to_C(K))
    tu = "°F" if units == "ip" else "°C"
    wu, k = _power(units)
    n = len(days)
    fig, axes = plt.subplots(n, 2, figsize=(13.0, 3.6 * n + 1.0), dpi=100, sharex=True, squeeze=False)
    t_lo = min(float(min(T(d.T_out_K).min(), T(d.inner_K).min(), *(T(x).min() for x in d.duct_leaving_K.values())))
               for d in days)
    t_hi = max(float(max(T(d.inner_K).max(), T(d.attic_air_K).max(), T(d.T_out_K).max()))
               for d in days)  # outdoors can be the hottest line (an unvented attic)
    w_hi = max(float(max((d.ceiling_w * k).max(), (d.duct_load_w * k).max(), (d.attic_air_w * k).max()))
               for d in days)
    w_lo = min(0.0, *(float(min((d.ceiling_w * k).min(), (d.duct_load_w * k).min(), (d.attic_air_w * k).min()))
                      for d in days))
    for row, day in enumerate(days):
        a1, a2 = axes[row]
        h = day.hours
        a1.plot(h, T(day.T_out_K), color=OKABE_ITO[7], lw=2, label="outdoor")
        a1.plot(h, T(day.attic_air_K), color=OKABE_ITO[5], lw=2.2, label="attic air")
        for j, az in enumerate(day.plane_azimuths):
            a1.plot(h, T(day.inner_K[:, j]), color=OKABE_ITO[[0, 4][j % 2]], ls="--", lw=1.8,
                    label=f"deck underside, {_facing(az)} plane")
        styles = ((OKABE_ITO[2], "-."), (OKABE_ITO[6], ":"), (OKABE_ITO[1], (0, (5, 2, 1, 2))))
        for (name, Tl), (colour, ls) in zip(day.duct_leaving_K.items(), styles * 4, strict=False):
            a1.plot(h, T(Tl), color=colour, ls=ls, lw=2.0, label=f"duct leaving: {name}")
        a1.set_ylabel(f"temperature, {tu}")
        a1.set_ylim(t_lo - 5, t_hi + 8)
        a1.set_title(day.case, loc="left", fontsize=10)
        a2.plot(h, day.ceiling_w * k, color=OKABE_ITO[1], lw=2, label="ceiling")
        a2.plot(h, day.duct_load_w * k, color=OKABE_ITO[5], lw=2, label="ducts (air handler running)")
        if np.any(day.attic_air_w != 0):  # an unvented attic's air into the house, as run's row
            a2.plot(h, day.attic_air_w * k, color=OKABE_ITO[2], lw=2, ls="--", label="air from the attic")
        a2.set_ylabel(f"load, {wu} (+ adds to load)")
        a2.set_ylim(w_lo - 0.05 * (w_hi - w_lo), w_hi + 0.15 * (w_hi - w_lo))
        _thousands(a2)
        for ax in (a1, a2):
            ax.axvline(day.peak_hour, color="0.4", lw=1)
            ax.grid(alpha=0.3)
            ax.set_xticks(range(0, 25, 3))
        a2.annotate(f"peak load, hour {day.peak_hour}", (day.peak_hour, 1.0), xycoords=("data", "axes fraction"),
                    xytext=(4, -14), textcoords="offset points", fontsize=9)
    for ax in axes[-1]:
        ax.set_xlabel("hour of the day (apparent solar time)")
    # each panel's lines named beside it: the load panel's colours repeat temperature lines' (attic air, return)
    axes[0][1].legend(fontsize=8, frameon=False, loc="upper left")
    handles, labels = axes[0][0].get_legend_handles_labels()
    fig.suptitle(f"{days[0].title}: cooling design day")
    fig.tight_layout(rect=(0, 0.9 / (3.6 * n + 1.0), 1, 1))
    fig.legend(handles, labels, loc="lower center", ncol=4, fontsize=8, frameon=False)
    return fig


MONTHS = ("Jan", "Feb", "Mar", "Apr", "May", "Jun", "Jul", "Aug", "Sep", "Oct", "Nov", "Dec")


def attic_heatmap(years, units="ip"):
    """Attic air temperature by date (x, in months) and hour (y), one panel per variant, one colour scale.

    years : a YearResult or a list of them; one figure either way."""
    import datetime as dt

    import numpy as np

    plt = _mpl()
    from attic.units import K_to_C, K_to_F

    years = list(years) if isinstance(years, list | tuple) else [years]
    grids, firsts = [], []
    for year in years:
        T = K_to_F(year.hourly["attic_air_K"]) if units == "ip" else K_to_C(year.hourly["attic_air_K"])
        first = year.times[0]
        lead = first.hour
        n_days = int(np.ceil((lead + len(T)) / 24))
        grid = np.full(n_days * 24, np.nan)
        grid[lead:lead + len(T)] = T
        grids.append(grid.reshape(n_days, 24).T)
        firsts.append(first)
    lo = min(float(np.nanmin(g)) for g in grids)
    hi = max(float(np.nanmax(g)) for g in grids)
    n = len(years)
    # constrained: the title, the panels' own titles and the shared colour bar take the room they need
    fig, axes = plt.subplots(n, 1, figsize=(11.0, 3.0 * n + 1.0), dpi=100, squeeze=False, layout="constrained")
    for ax, year, grid, first in zip(axes[:, 0], years, grids, firsts, strict=True):
        n_days = grid.shape[1]
        im = ax.imshow(grid, aspect="auto", origin="lower", cmap="cividis", interpolation="nearest",
                       extent=(-0.5, n_days - 0.5, -0.5, 23.5), vmin=lo, vmax=hi)
        # month ticks: the first day of each month within the span
        day0 = dt.date(first.year, first.month, first.day)
        ticks, labels = [], []
        d = dt.date(day0.year, day0.month, 1)
        while (d - day0).days < n_days:
            if (d - day0).days >= 0:
                ticks.append((d - day0).days)
                labels.append(MONTHS[d.month - 1] if d.month != 1 or not ticks[:-1] else f"Jan {d.year}")
            d = dt.date(d.year + (d.month == 12), d.month % 12 + 1, 1)
        ax.set_xticks(ticks, labels)
        ax.set_yticks(range(0, 24, 6))
        ax.set_ylabel("hour (local\nstandard time)")
        ax.set_title(year.case, loc="left", fontsize=10)
    cb = fig.colorbar(im, ax=axes[:, 0].tolist(), pad=0.01)
    cb.set_label(f"attic air, {'°F' if units == 'ip' else '°C'}")
    fig.suptitle(f"{years[0].title}: attic air temperature from {firsts[0]:%Y-%m-%d}")
    return fig


def uncertainty_chart(res, units="ip", saves_w=0.0):
    """A band per case: P10-P90 of the equipment load (bar), P50 (line) and mean (dot), on an axis from zero so
    the bands' lengths compare; beside it the band of each variant's paired saving against the base, with the
    --saves amount dashed when given (saves_w, W). Reads an UncertaintyResult."""
    import numpy as np

    plt = _mpl()
    unit, k = _power(units)
    names = list(res.cases)
    n_var = len(names) - 1
    fig, axes = plt.subplots(1, 2 if n_var else 1, figsize=(11.5 if n_var else 6.5, 1.6 + 0.6 * len(names)),
                             dpi=100, squeeze=False, sharey=True)

    def band(ax, y, v, colour):
        v = v[np.isfinite(v)] * k
        if not len(v):  # no sample of this case solved: no band
            return
        p10, p50, p90 = np.percentile(v, (10, 50, 90))
        ax.barh(y, p90 - p10, left=p10, height=0.5, color=colour, alpha=0.75)
        ax.plot([p50, p50], [y - 0.25, y + 0.25], color="black", linewidth=1.6)
        ax.plot([np.mean(v)], [y], "o", color="white", markeredgecolor="black", markersize=5)

    ax = axes[0][0]
    for i, c in enumerate(names):
        band(ax, i, res.outputs[c]["equipment_w"], OKABE_ITO[i % len(OKABE_ITO)])
    ax.set_yticks(range(len(names)), names)
    ax.set_xlim(left=0.0)
    ax.invert_yaxis()
    ax.set_xlabel(f"equipment load, {unit}\n(bar P10-P90, line P50, dot mean)")
    ax.set_title(f"{res.kind} design condition, {res.n:,} samples", fontsize=10)
    _thousands(ax, "x")
    ax.grid(axis="x", alpha=0.3)
    ax.set_axisbelow(True)
    if n_var:
        ax2 = axes[0][1]
        for i, c in enumerate(names[1:], start=1):  # each variant on its own row of the left panel
            band(ax2, i, res.saving(c), OKABE_ITO[i % len(OKABE_ITO)])
        ax2.axvline(0.0, color="grey", linewidth=0.8)
        if saves_w > 0:
            ax2.axvline(saves_w * k, color="black", linewidth=1.0, linestyle="--")
            ax2.annotate(f"--saves {saves_w * k:,.0f} {unit}", (saves_w * k, 1.0), xycoords=("data", "axes fraction"),
                         xytext=(3, -12), textcoords="offset points", fontsize=8)
        ax2.set_xlabel(f"saving against the base, {unit}\n(paired: the same samples)")
        ax2.set_title("saving of each variant", fontsize=10)
        _thousands(ax2, "x")
        ax2.grid(axis="x", alpha=0.3)
        ax2.set_axisbelow(True)
    fig.suptitle(res.title, fontsize=11)
    fig.tight_layout()
    return fig


def cash_flow_chart(study):
    """Cumulative cash flow of each variant against the base, year by year over the life (a MoneyStudy).

    Solid: discounted at the study's rate (its last point is the present value); dotted: undiscounted, where
    it crosses zero is the simple payback. Returns the Figure.
    """
    plt = _mpl()
    t = study.terms
    life, rate = t["life_years"], t["discount_rate"]
    fig, ax = plt.subplots(figsize=(9.5, 5.2), dpi=100)
    years = list(range(life + 1))
    others = [v for v in study.variants if not v.is_base and v.cash_flow]
    colours = [OKABE_ITO[i] for i in (0, 4, 2, 5, 6, 1, 7)]  # neighbours in the legend stay far apart in hue
    for v, colour in zip(others, colours, strict=False):
        ax.plot(years, v.cash_flow, color=colour, lw=2.2, marker="o", ms=3, label=v.case)
        if rate > 0:
            ax.plot(years, v.cash_flow_undiscounted, color=colour, lw=1.2, ls=":")
    ax.axhline(0.0, color="0.3", lw=1, label="base ($0)")
    ax.set_xlabel("years after the work")
    ax.set_ylabel("cumulative cash flow against the base, $")
    ax.yaxis.set_major_formatter(plt.FuncFormatter(lambda y, _: f"{'-' if y < 0 else ''}${abs(y):,.0f}"))
    how = (f"solid: discounted at {rate:.1%} a year,\nending at the present value\n\ndotted: undiscounted,\n"
           "crossing $0 at the simple payback" if rate > 0 else "undiscounted (discount rate 0):\ncrosses $0 at "
           "the simple payback")
    ax.set_title(f"{study.title}\ncumulative cash flow against the base", fontsize=11)
    ax.text(1.02, 0.0, how, transform=ax.transAxes, fontsize=8, color="0.25", va="bottom")
    ax.grid(alpha=0.3)
    ax.legend(fontsize=8, frameon=False, loc="upper left", bbox_to_anchor=(1.01, 1.0))
    ax.set_xlim(0, life)
    fig.tight_layout()
    return fig
