"""The roof deck's winter moisture through a year run, month by month (matplotlib, imported on first use)."""

from __future__ import annotations

from attic.present.plots import OKABE_ITO, _mpl


def deck_year_chart(year, units="ip"):
    """Two panels: monthly mean temperatures of the condensing surface, deck underside and outdoor air against
    the code's 45 °F criterion; and the hours each month with the surface below the dew point reaching it.

    Reads year.deck (attic.runs.deck.monthly_deck, SI); converts units and nothing else.
    """
    import numpy as np

    from attic.units import K_to_C, K_to_F

    plt = _mpl()
    dk = year.deck
    conv = K_to_F if units == "ip" else K_to_C
    unit = "°F" if units == "ip" else "°C"
    months = [m["month"] for m in dk["months"]]
    x = np.arange(len(months))
    fig, (top, bottom) = plt.subplots(2, 1, figsize=(9.0, 6.0), dpi=100, sharex=True,
                                      gridspec_kw={"height_ratios": [3, 2]})
    for key, label, colour, style in (("surface_mean_K", f"condensing surface ({dk['surface']})", OKABE_ITO[5], "-"),
                                      ("underside_mean_K", "deck underside", OKABE_ITO[4], "--"),
                                      ("outdoor_mean_K", "outdoor air", OKABE_ITO[7], ":")):
        top.plot(x, conv(np.array([m[key] for m in dk["months"]])), style, marker="o", color=colour, label=label)
    crit = float(conv(dk["criterion_K"]))
    words = "code criterion for unvented attics" + ("" if dk["meets_criterion"] is not None else " (not this attic's)")
    top.axhline(crit, color=OKABE_ITO[0], lw=1.5, label=f"{crit:g}{unit}: {words}")
    top.set_ylabel(f"monthly mean, {unit}")
    top.legend(fontsize=8, loc="best")
    top.set_title(f"{year.title} — {year.case}\nthe roof deck: monthly means and hours below the dew point",
                  fontsize=10)
    bottom.bar(x, [m["hours_at_risk"] for m in dk["months"]], color=OKABE_ITO[5])
    bottom.set_ylabel("hours below the dew point")
    bottom.set_xticks(x, months, rotation=45, ha="right", fontsize=8)
    fig.tight_layout()
    return fig
