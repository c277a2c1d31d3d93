"""What each variant costs and pays back: first cost, smaller equipment, annual energy and money, payback.

Orchestration only. The design tons come from the comparison (attic.runs.study), the annual coil energy from
the year runs (attic.runs.year, the same solve as `atticduct year`), the arithmetic from attic.runs.economics.
Nothing here solves anything or guesses an energy figure: without year runs the annual rows stay empty and
say what is needed.
"""

from __future__ import annotations

from dataclasses import dataclass

from attic.case.schema import SECTIONS
from attic.runs import economics as eco

CAUTION = ("Energy from load lines and seasonal ratings compares the options with one another; it does not predict "
           "a utility bill. Prices are held at today's dollars and discounted at the real rate given. Equipment "
           "comes in size steps, so a credit for fewer tons is real only when the smaller load crosses a step.")
NEEDS_WEATHER = "a weather file (--weather FILE): the annual energy is not guessed"
HOURS_IN_YEAR = (8760, 8784)


@dataclass(frozen=True)
class VariantMoney:
    """One variant's money against the base ($, $/year, years; None where it cannot be known)."""

    case: str
    is_base: bool
    first_cost: float
    design_tons: float | None
    equipment_credit: float
    net_first_cost: float
    cooling_electricity_kwh: float | None = None
    heating_electricity_kwh: float | None = None
    heating_gas_therms: float | None = None
    annual_energy_cost: float | None = None
    annual_saving: float | None = None
    payback_years: float | None = None
    present_value: float | None = None
    cash_flow: tuple = ()  # discounted cumulative $ at the end of years 0..life
    cash_flow_undiscounted: tuple = ()  # the same at a 0 rate; it crosses 0 at the simple payback
    note: str | None = None

    def to_dict(self):
        def r(x, d=2):
            return None if x is None else round(float(x), d) + 0.0  # + 0.0: no "-0.0" in the output

        return {"case": self.case, "first_cost": r(self.first_cost), "equipment_credit": r(self.equipment_credit),
                "net_first_cost": r(self.net_first_cost), "design_tons": r(self.design_tons, 4),
                "cooling_electricity_kwh": r(self.cooling_electricity_kwh, 3),
                "heating_electricity_kwh": r(self.heating_electricity_kwh, 3),
                "heating_gas_therms": r(self.heating_gas_therms, 3),
                "annual_energy_cost": r(self.annual_energy_cost), "annual_saving": r(self.annual_saving),
                "payback_years": r(self.payback_years), "present_value": r(self.present_value),
                "cash_flow": [r(x) for x in self.cash_flow],
                "cash_flow_undiscounted": [r(x) for x in self.cash_flow_undiscounted], "note": self.note}


@dataclass(frozen=True)
class MoneyStudy:
    """Every solved variant's money, base first, with the terms used and why any annual figure is missing."""

    title: str
    terms: dict
    variants: tuple
    needs: str | None
    caution: str = CAUTION

    @property
    def complete(self):
        """True when every variant has its annual figures (the cash-flow chart can be drawn)."""
        return self.needs is None and all(v.annual_energy_cost is not None for v in self.variants)

    def for_case(self, name):
        return next((v for v in self.variants if v.case == name), None)

    def to_dict(self):
        return {"terms": dict(self.terms), "needs": self.needs, "variants": [v.to_dict() for v in self.variants],
                "caution": self.caution}

    def to_frame(self):
        """One row per variant (pandas), indexed by name; the cash-flow series are left to to_dict."""
        from attic.runs.plain import frame

        rows = [{k: x for k, x in v.to_dict().items() if not k.startswith("cash_flow")} for v in self.variants]
        return frame(rows).set_index("case")


def annual_energy(year, terms):
    """(cooling kWh, heating kWh, heating therms, $ a year) from one year run's coil energy and the terms."""
    cool_kwh = year.electricity_kwh("cooling", terms["seer"])
    heat_btu = year.energy("heating", "coil", "btu")
    fuel = terms["heating_fuel"]
    heat_kwh, therms = 0.0, None
    if fuel == "heat-pump":
        heat_kwh = year.electricity_kwh("heating", terms["hspf"])
    elif fuel == "electric":
        heat_kwh = eco.resistance_kwh(heat_btu)
    elif fuel == "gas":
        therms = eco.gas_therms(heat_btu, terms["heating_efficiency"])
    elif heat_btu > 0:
        raise ValueError("the year run has heating hours but [money] gives no heating_fuel")
    cost = (cool_kwh + heat_kwh) * terms["electricity_per_kwh"] + (therms or 0.0) * (terms["gas_per_therm"] or 0.0)
    return cool_kwh, heat_kwh, therms, cost


def _whole_year(year):
    n = len(year.times)
    if n in HOURS_IN_YEAR:
        return None
    return f"a weather file of one whole year (8,760 hours) for annual figures; this one has {n:,} hours"


def money_study(cases, comparison, years=None, notes=None):
    """The MoneyStudy of solved cases (base first) or None when the case has no [money] section.

    comparison : attic.runs.study.Comparison of the same cases (its cooling rows give the design tons)
    years : {case name: YearResult} from attic.runs.year.run_year over one weather file, or None (no weather)
    notes : {case name: why its year run gave nothing}, e.g. a solve that did not converge
    """
    terms = cases[0].inputs.get("money")
    if terms is None:
        return None
    notes = notes or {}
    tons = {r.case: r.tons for r in comparison.by_kind("cooling")}
    base = cases[0]
    needs = NEEDS_WEATHER if years is None else None
    if years and needs is None:
        needs = next((w for w in (_whole_year(y) for y in years.values()) if w), None)
    have = years is not None and needs is None
    base_cost = None
    if have and base.name in years:
        base_cost = annual_energy(years[base.name], terms)[3]
    life, rate = terms["life_years"], terms["discount_rate"]
    out = []
    for c in cases:
        is_base = c is base
        first = 0.0 if is_base else float(c.first_cost or 0.0)
        t = tons.get(c.name)
        credit = 0.0 if is_base or t is None else eco.equipment_credit(tons[base.name], t, terms["equipment_per_ton"])
        net = first - credit
        row = {"case": c.name, "is_base": is_base, "first_cost": first, "design_tons": t, "equipment_credit": credit,
               "net_first_cost": net}
        if have and c.name in years and base_cost is not None:
            ck, hk, th, cost = annual_energy(years[c.name], terms)
            saving = base_cost - cost
            row.update(cooling_electricity_kwh=ck, heating_electricity_kwh=hk, heating_gas_therms=th,
                       annual_energy_cost=cost, annual_saving=saving,
                       payback_years=None if is_base else eco.simple_payback(net, saving),
                       present_value=eco.net_present_value(net, saving, rate, life))
            if not is_base:  # the base is the reference line, $0 every year
                row.update(cash_flow=tuple(eco.cumulative_cash_flow(net, saving, rate, life)),
                           cash_flow_undiscounted=tuple(eco.cumulative_cash_flow(net, saving, 0.0, life)))
        elif have:
            row["note"] = notes.get(c.name) or notes.get(base.name) or "no year run for this variant"
        out.append(VariantMoney(**row))
    return MoneyStudy(comparison.title, {k: terms[k] for k in SECTIONS["money"]}, tuple(out), needs)
