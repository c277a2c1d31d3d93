"""The thermal chain: temperatures along every duct, return mixing and the delivered air, with a fixed
specific heat and no property calls, cheap enough for a coupled solver to call many times."""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from ducts import moist_air
from ducts.layout import CONDITIONED, DuctSystem
from ducts.levels import transfer_many


@dataclass(frozen=True)
class Surroundings:
    """What a duct sees: air temperature, mean radiant temperature, humidity ratio (SI).

    T_air : K, T_mrt : K, W : kg/kg of dry air
    """

    T_air: float
    T_mrt: float
    W: float


@dataclass(frozen=True)
class ChainState:
    """Temperatures and heat flows along the ducts (SI; heat positive into the duct air).

    ``segments`` maps each name to a dict with T_in, T_out, Q, Q_conv, Q_rad (W, all runs),
    T_jacket_cold (K), mass flow per run (kg/s) and count. ``supply_leaks`` and ``return_leaks`` map
    each location where leaks open to the leak's mass flow there (kg/s of dry air).
    """

    m_dot: float
    cp: float
    T_supply: float
    T_house: float
    T_return_end: float
    T_equipment_in: float
    T_delivered: float
    segments: dict
    supply_leaks: dict
    return_leaks: dict

    @property
    def m_supply_leak(self):
        return sum(self.supply_leaks.values())

    @property
    def m_return_leak(self):
        return sum(self.return_leaks.values())

    def sinks(self, location):
        """Heat the ducts take from a location's air and surfaces, and the leak flows there.

        Returns dict: Q_conv (W from the air), Q_rad (W from the surfaces), m_in (kg/s of supply
        leak into the location at T_supply), m_out (kg/s of return leak drawn from it).
        """
        Qc = sum(s["Q_conv"] for s in self.segments.values() if s["location"] == location)
        Qr = sum(s["Q_rad"] for s in self.segments.values() if s["location"] == location)
        return {
            "Q_conv": Qc, "Q_rad": Qr,
            "m_in": self.supply_leaks.get(location, 0.0),
            "m_out": self.return_leaks.get(location, 0.0),
            "T_in": self.T_supply,
        }


def _still(T_in, m, T_house):
    """A run that exchanges nothing: in conditioned space, or carrying no air."""
    zero = np.zeros(np.broadcast(np.asarray(T_in, float), m).shape)
    return {"T_out": np.asarray(T_in, float) + zero, "Q": zero, "Q_conv": zero, "Q_rad": zero,
            "T_jacket_cold": np.asarray(T_house, float) + zero, "UA": 0.0}


def _ratio(num, den, fallback):
    """num / den where den > 0, else the fallback: a mixing temperature with nothing to mix.

    A scalar den keeps the scalar branch (a DuctSystem's numbers do not move); an array den (a
    DuctStack's rows) divides only where it is positive.
    """
    if np.ndim(den) == 0:
        return num / den if den > 0 else np.asarray(fallback, float)
    num, den, fb = np.broadcast_arrays(np.asarray(num, float), np.asarray(den, float),
                                       np.asarray(fallback, float))
    return np.divide(num, den, out=np.array(fb, dtype=float), where=den > 0)


def mass_flow(system: DuctSystem, T_house, W_house, pressure):
    """Mass flow of dry air at the air handler (airflow at the house air's density).

    Parameters
    ----------
    system : DuctSystem
    T_house : float or array [K]
    W_house : float or array [kg/kg]
    pressure : float [Pa]

    Returns
    -------
    m_dot : float or array [kg/s]
        Of dry air.

    References
    ----------
    m = Q / v with v the moist air's volume per kilogram of dry air (ASHRAE Handbook-Fundamentals
    (2017), ch. 1); psychrolib for the check value.

    Examples
    --------
    0.5 m3/s of house air at 24 °C and W = 0.0093 kg/kg; psychrolib gives v = 0.8544 m3/kg,
    so by hand m = 0.5 / 0.8544 = 0.585 kg/s:

    >>> round(mass_flow(DuctSystem((), 0.5), 297.15, 0.0093, 101325.0), 3)
    0.585
    """
    return system.airflow / moist_air.specific_volume(T_house, pressure, W_house)


def thermal_chain(system: DuctSystem, m_dot, cp, T_supply, T_house, surroundings, pressure=101325.0,
                  cp_supply=None):
    """Temperatures along every segment, return mixing and the delivered air (SI).

    Parameters
    ----------
    system : DuctSystem or ducts.stack.DuctStack
        A stack's rows run side by side: every input below is then a (n,) array (or broadcasts to one).
    m_dot : float or array [kg/s]
        Dry air at the air handler.
    cp : float or array [J/(kg.K)]
        Of the moist air, per kg of dry air: the return side's (house air).
    cp_supply : float or array [J/(kg.K)], optional
        The supply air's, at its own humidity ratio (a cooling coil dries it); cp when not given. With each side's
        own value, a run's m cp dT is the enthalpy change ducts.energy_parts gives that side (ASHRAE
        Handbook-Fundamentals (2017), ch. 1: enthalpy per kilogram of dry air at the air's humidity ratio).
    T_supply : float or array [K]
        Air leaving the equipment.
    T_house : float or array [K]
    surroundings : dict
        Location -> Surroundings; "conditioned" need not be given.
    pressure : float [Pa]

    Returns
    -------
    ChainState

    Notes
    -----
    Supply leaks open at the plenum, before any conduction; return leaks at the air-handler end,
    after all of it (the order of ASHRAE Standard 152's delivery-effectiveness formula). Where they
    open is DuctSystem.leak_split: the return leaks draw the air of each location in its share. Ducts in
    conditioned space exchange heat only with the house itself, so they count as no gain.

    References
    ----------
    ASHRAE Standard 152 (2004), design delivery effectiveness (the order of leaks and conduction,
    and ducts inside the envelope counted as B = 1); the exponential law of each run
    (ducts.segment.leaving_temperature).

    Examples
    --------
    One supply run in a 325 K attic, the return inside. The supply run is the one of
    ducts.segment.segment_transfer's example at 0.24 kg/s: by hand, its insulation alone bounds
    the air's warming from 285 K to 325 - 40 exp(-7.79/241.4) = 286.27 K, and the films lower it;
    a return inside the house hands the equipment house air (limiting case):

    >>> from ducts.layout import DuctSegment, DuctSystem
    >>> system = DuctSystem((DuctSegment("sup", "supply", "attic", length=10.0, r_label=1.0, diameter=0.2),
    ...                      DuctSegment("ret", "return", "conditioned", length=5.0, r_label=1.0, diameter=0.3)),
    ...                     airflow=0.2)
    >>> c = thermal_chain(system, 0.24, 1006.0, 285.0, 297.0, {"attic": Surroundings(325.0, 325.0, 0.005)})
    >>> round(float(c.T_delivered), 2), bool(285.0 < c.T_delivered < 286.27), float(c.T_equipment_in)
    (286.11, True, 297.0)
    """
    vol = system.airflow
    rho = m_dot / vol
    flows = system._run_flows
    segs = system.segments
    plan = system._chain_plan
    res: list = [None] * len(segs)  # each run's transfer, as its own segment_transfer call gives it
    leaving: dict = {}  # name -> T_out of the runs done so far
    T_ins: list = [None] * len(segs)
    ms: list = [None] * len(segs)

    def entering(i):
        seg = segs[i]
        if seg.side == "supply":
            return T_supply if seg.fed_by is None else leaving[seg.fed_by]
        # a return trunk takes the mix of the house air at its own grilles and its feeding runs' air
        kids = system.children(seg.name)
        carried = flows[seg.name] * seg.count
        mix = (carried - sum(flows[k.name] * k.count for k in kids)) * np.asarray(T_house, float)
        for k in kids:
            mix = mix + leaving[k.name] * flows[k.name] * k.count
        return _ratio(mix, carried, T_house)

    # level by level (ducts.levels): the runs of one level and one film kind go through one call
    for still, groups in plan.waves:
        for i in still:
            T_ins[i] = entering(i)
            ms[i] = flows[segs[i].name] * rho
            res[i] = _still(T_ins[i], ms[i], T_house)
            leaving[segs[i].name] = res[i]["T_out"]
        for group in groups:
            live, dead = [], []
            for i in group:
                T_ins[i] = T_in = entering(i)
                ms[i] = m = flows[segs[i].name] * rho
                d = np.less_equal(m, 0)
                if d.all():
                    res[i] = _still(T_in, m, T_house)
                    leaving[segs[i].name] = res[i]["T_out"]
                else:
                    live.append(i)
                    dead.append(d if d.any() else None)
            if not live:
                continue
            # rows (of a DuctStack) where a run carries no air run on a dummy flow and are then set still
            m_run = [ms[i] if d is None else np.where(d, 1.0, ms[i]) for i, d in zip(live, dead, strict=True)]
            sur = [surroundings[segs[i].location] for i in live]
            cps = [cp if cp_supply is None or segs[i].side != "supply" else cp_supply for i in live]
            got = transfer_many([segs[i].geometry() for i in live], [T_ins[i] for i in live], m_run, cps,
                                [s.T_air for s in sur], [s.T_mrt for s in sur],
                                [segs[i].jacket_emittance for i in live], pressure, system._transfer_cache,
                                tuple(live))
            for i, d, r in zip(live, dead, got, strict=True):
                if d is not None:
                    st = _still(T_ins[i], ms[i], T_house)
                    r = {k: np.where(d, st[k], r[k]) for k in st}
                res[i] = r
                leaving[segs[i].name] = r["T_out"]

    out: dict[str, dict] = {}
    for i in plan.order:  # the order of the recursive chain's output (sums over it keep their order)
        seg, r = segs[i], res[i]
        out[seg.name] = {
            "T_in": T_ins[i], "T_out": r["T_out"], "Q": r["Q"] * seg.count, "Q_conv": r["Q_conv"] * seg.count,
            "Q_rad": r["Q_rad"] * seg.count, "T_jacket_cold": r["T_jacket_cold"], "m_run": ms[i],
            "count": seg.count, "location": seg.location, "side": seg.side, "UA": r["UA"],
        }

    def supply_down(seg):
        T_out = out[seg.name]["T_out"]
        kids = system.children(seg.name)
        carried = flows[seg.name] * seg.count
        sent = sum(flows[k.name] * k.count for k in kids)
        delivered = (carried - sent) * T_out  # what the trunk's own outlets deliver
        for k in kids:
            delivered = delivered + supply_down(k)
        return delivered

    a_s = 1.0 - system.supply_leak_fraction
    a_r = 1.0 - system.return_leak_fraction
    roots_s = [s for s in system.side("supply") if s.fed_by is None]
    roots_r = [s for s in system.side("return") if s.fed_by is None]

    delivered = 0.0
    for r in roots_s:
        delivered = delivered + supply_down(r)
    sup_flow = vol * a_s
    sent = sum(flows[r.name] * r.count for r in roots_s)
    delivered = delivered + (sup_flow - sent) * np.asarray(T_supply, float)  # no supply ducts: plenum outlets
    T_delivered = _ratio(delivered, sup_flow, T_supply)

    ret_flow = vol * a_r
    mix = (ret_flow - sum(flows[r.name] * r.count for r in roots_r)) * np.asarray(T_house, float)
    for r in roots_r:
        mix = mix + out[r.name]["T_out"] * flows[r.name] * r.count
    T_return_end = _ratio(mix, ret_flow, T_house)

    T_ei = a_r * T_return_end
    for loc, share in system.leak_split("return").items():
        T_src = np.asarray(T_house, float) if loc == CONDITIONED else surroundings[loc].T_air
        T_ei = T_ei + (1.0 - a_r) * share * T_src
    sup = {loc: system.supply_leak_fraction * share * m_dot for loc, share in system.leak_split("supply").items()}
    ret = {loc: system.return_leak_fraction * share * m_dot for loc, share in system.leak_split("return").items()}
    return ChainState(m_dot, cp, T_supply, T_house, T_return_end, T_ei, T_delivered, out, sup, ret)

