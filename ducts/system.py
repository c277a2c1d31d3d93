"""A duct system: segments on the supply and return side, leakage, and its energy balance.

Two steps, so that a coupled solver can call the cheap one many times:

``thermal_chain``  temperatures along every segment and the heat each takes from its
                   surroundings, with a fixed specific heat (no property calls);
``energy_balance`` enthalpy balances of return mixing, coil, supply conduction and supply
                   leakage at the converged state (CoolProp), giving delivery effectiveness and
                   the duct load split into its parts.
"""

from __future__ import annotations

import math
from dataclasses import asdict, dataclass, field
from functools import cached_property

import numpy as np

from . import moist_air
from .segment import FLEX_INSULATION_CONDUCTIVITY, rectangular_geometry, round_geometry, segment_transfer

CONDITIONED = "conditioned"
SIDES = ("supply", "return")
LEAKAGE_FLOW_EXPONENT = 0.6  # common practice for duct leaks (orifice-like 0.5 to crack-like 0.65)


def cfm25_to_operating(Q25, operating_pressure, exponent=LEAKAGE_FLOW_EXPONENT):
    """Leakage flow at operating pressure from the flow measured at 25 Pa.

    Parameters
    ----------
    Q25 : float or array, m3/s at 25 Pa test pressure
    operating_pressure : float or array, Pa, the pressure across the leaks in operation
    exponent : float, dimensionless flow exponent

    Returns
    -------
    Q : float or array, m3/s

    References
    ----------
    Power law Q = C dP^n (ASHRAE Handbook-Fundamentals (2017), ch. 16, eq. (47)); ASHRAE
    Standard 152 converts duct leakage from 25 Pa the same way (exponent 0.6: common practice).
    """
    Q = np.asarray(Q25, float) * (np.asarray(operating_pressure, float) / 25.0) ** exponent
    return Q if Q.ndim else float(Q)


@dataclass(frozen=True)
class DuctSegment:
    """One duct run, or `count` identical parallel runs (SI).

    Attributes
    ----------
    name : str
    side : "supply" or "return"
    location : "attic", "conditioned" or the name of another surrounding
    length : m
    r_label : m2.K/W, the labelled insulation R
    diameter : m (round) or None
    width, height : m (rectangular) or None
    count : number of identical runs
    fed_by : name of the trunk this run hangs on (supply: takes its air; return: feeds it)
    airflow : m3/s through one run, or None to share the trunk's air by count
    r_model : "cylinder" or "label" (see ducts.segment.round_geometry)
    jacket_emittance : dimensionless
    insulation_conductivity : W/(m.K)
    """

    name: str
    side: str
    location: str
    length: float
    r_label: float
    diameter: float | None = None
    width: float | None = None
    height: float | None = None
    count: int = 1
    fed_by: str | None = None
    airflow: float | None = None
    r_model: str = "cylinder"
    jacket_emittance: float = 0.9
    insulation_conductivity: float = FLEX_INSULATION_CONDUCTIVITY

    def geometry(self):
        """The run's SegmentGeometry (computed once)."""
        return self._geometry

    @cached_property
    def _geometry(self):
        if self.diameter is not None:
            return round_geometry(self.diameter, self.length, self.r_label, self.r_model,
                                  self.insulation_conductivity)
        return rectangular_geometry(self.width, self.height, self.length, self.r_label,
                                    self.insulation_conductivity)


@dataclass(frozen=True)
class DuctSystem:
    """Segments, air handler airflow and leakage (SI).

    Attributes
    ----------
    segments : tuple of DuctSegment
    airflow : m3/s at the air handler, at the house air's density
    supply_leak_fraction, return_leak_fraction : of the air-handler flow, in operation
    supply_leak_location, return_leak_location : where the leaks open; None = where most of
        that side's duct surface is
    """

    segments: tuple
    airflow: float
    supply_leak_fraction: float = 0.0
    return_leak_fraction: float = 0.0
    supply_leak_location: str | None = None
    return_leak_location: str | None = None

    def __post_init__(self):
        names = [s.name for s in self.segments]
        if len(set(names)) != len(names):
            raise ValueError(f"duct names must be unique, got {names}")
        by_name = {s.name: s for s in self.segments}
        for s in self.segments:
            if s.side not in SIDES:
                raise ValueError(f"duct {s.name!r}: side {s.side!r} is not one of {SIDES}")
            if s.fed_by is not None:
                parent = by_name.get(s.fed_by)
                if parent is None:
                    raise ValueError(f"duct {s.name!r}: fed_by {s.fed_by!r} names no duct")
                if parent.side != s.side:
                    raise ValueError(f"duct {s.name!r} ({s.side}) cannot hang on {parent.name!r} ({parent.side})")
        for s in self.segments:  # no cycles
            seen, cur = set(), s
            while cur.fed_by is not None:
                if cur.name in seen:
                    raise ValueError(f"duct {s.name!r}: fed_by forms a loop")
                seen.add(cur.name)
                cur = by_name[cur.fed_by]
        for f in (self.supply_leak_fraction, self.return_leak_fraction):
            if not 0.0 <= f < 1.0:
                raise ValueError(f"leak fraction {f} must be at least 0 and below 1")

    def side(self, side):
        return [s for s in self.segments if s.side == side]

    def children(self, name):
        return self._children.get(name, [])

    @cached_property
    def _children(self):
        kids: dict[str, list] = {}
        for s in self.segments:
            if s.fed_by is not None:
                kids.setdefault(s.fed_by, []).append(s)
        return kids

    def leak_location(self, side):
        """Where that side's leaks open."""
        given = self.supply_leak_location if side == "supply" else self.return_leak_location
        if given is not None:
            return given
        area: dict[str, float] = {}
        for s in self.side(side):
            area[s.location] = area.get(s.location, 0.0) + s.geometry().outer_area * s.count
        return max(area, key=area.get) if area else CONDITIONED

    def run_flows(self):
        """Volume flow through one run of every segment, m3/s (dict by name; computed once)."""
        return dict(self._run_flows)

    @cached_property
    def _run_flows(self):
        """Volume flow through one run of every segment, m3/s (dict by name).

        A segment fed by nothing shares its side's flow (air-handler flow less that side's
        leakage) with the other such segments in proportion to count; the runs fed by one trunk
        share what it carries in proportion to their count; a given airflow overrides both.
        """
        flows: dict[str, float] = {}
        for side, frac in (("supply", self.supply_leak_fraction), ("return", self.return_leak_fraction)):
            side_flow = self.airflow * (1.0 - frac)
            self._share(side_flow, [s for s in self.side(side) if s.fed_by is None], flows)
        return flows

    def _share(self, total, group, flows):
        if not group:
            return
        free = [s for s in group if s.airflow is None]
        fixed = sum(s.airflow * s.count for s in group if s.airflow is not None)
        rest = total - fixed
        if rest < -1e-12 * max(total, 1e-9):
            names = ", ".join(s.name for s in group)
            raise ValueError(f"ducts {names}: their airflows add up to more than the air that feeds them")
        n_free = sum(s.count for s in free)
        for s in group:
            flows[s.name] = s.airflow if s.airflow is not None else (rest / n_free if n_free else 0.0)
        for s in group:
            self._share(flows[s.name], self.children(s.name), flows)


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
    T_jacket_cold (K), mass flow per run (kg/s) and count.
    """

    m_dot: float
    cp: float
    T_supply: float
    T_house: float
    T_return_end: float
    T_equipment_in: float
    T_delivered: float
    segments: dict
    supply_leak_location: str
    return_leak_location: str
    m_supply_leak: float
    m_return_leak: float

    def sinks(self, location):
        """Heat the ducts take from a location's air and surfaces, and the leak flows there.

        Returns dict: Q_conv (W from the air), Q_rad (W from the surfaces), m_in (kg/s of supply
        leak into the location at T_supply), m_out (kg/s of return leak drawn from it).
        """
        Qc = sum(s["Q_conv"] for s in self.segments.values() if s["location"] == location)
        Qr = sum(s["Q_rad"] for s in self.segments.values() if s["location"] == location)
        return {
            "Q_conv": Qc, "Q_rad": Qr,
            "m_in": self.m_supply_leak if self.supply_leak_location == location else 0.0,
            "m_out": self.m_return_leak if self.return_leak_location == location else 0.0,
            "T_in": self.T_supply,
        }


def mass_flow(system: DuctSystem, T_house, W_house, pressure):
    """Mass flow of dry air at the air handler, kg/s (airflow at the house air's density)."""
    return system.airflow / moist_air.specific_volume(T_house, pressure, W_house)


def thermal_chain(system: DuctSystem, m_dot, cp, T_supply, T_house, surroundings, pressure=101325.0):
    """Temperatures along every segment, return mixing and the delivered air (SI).

    Parameters
    ----------
    system : DuctSystem
    m_dot : float, kg/s of dry air at the air handler
    cp : float, J/(kg.K) of the moist air, per kg dry air
    T_supply : float or array, K, air leaving the equipment
    T_house : float or array, K
    surroundings : dict location -> Surroundings; "conditioned" need not be given
    pressure : float, Pa

    Returns
    -------
    ChainState

    Notes
    -----
    Supply leaks open at the plenum, before any conduction; return leaks at the air-handler end,
    after all of it (the order of ASHRAE Standard 152's delivery-effectiveness formula). Ducts in
    conditioned space exchange heat only with the house itself, so they count as no gain.
    """
    vol = system.airflow
    rho = m_dot / vol
    flows = system._run_flows
    out: dict[str, dict] = {}

    def run(seg, T_in):
        m = flows[seg.name] * rho
        if seg.location == CONDITIONED or np.all(m <= 0):
            zero = np.zeros(np.broadcast(np.asarray(T_in, float), m).shape)
            res = {"T_out": np.asarray(T_in, float) + zero, "Q": zero, "Q_conv": zero, "Q_rad": zero,
                   "T_jacket_cold": np.asarray(T_house, float) + zero, "UA": 0.0}
        else:
            sur = surroundings[seg.location]
            res = segment_transfer(seg.geometry(), T_in, m, cp, sur.T_air, sur.T_mrt, seg.jacket_emittance,
                                   pressure)
        out[seg.name] = {
            "T_in": T_in, "T_out": res["T_out"], "Q": res["Q"] * seg.count, "Q_conv": res["Q_conv"] * seg.count,
            "Q_rad": res["Q_rad"] * seg.count, "T_jacket_cold": res["T_jacket_cold"], "m_run": m,
            "count": seg.count, "location": seg.location, "side": seg.side, "UA": res["UA"],
        }
        return res["T_out"]

    def supply_down(seg, T_in):
        T_out = run(seg, T_in)
        kids = system.children(seg.name)
        carried = flows[seg.name] * seg.count
        sent = sum(flows[k.name] * k.count for k in kids)
        delivered = (carried - sent) * T_out  # what the trunk's own outlets deliver
        for k in kids:
            delivered = delivered + supply_down(k, T_out)
        return delivered

    def return_up(seg):
        kids = system.children(seg.name)
        carried = flows[seg.name] * seg.count
        mix = (carried - sum(flows[k.name] * k.count for k in kids)) * np.asarray(T_house, float)
        for k in kids:
            mix = mix + return_up(k) * flows[k.name] * k.count
        T_in = mix / carried if carried > 0 else np.asarray(T_house, float)
        return run(seg, T_in)

    a_s = 1.0 - system.supply_leak_fraction
    a_r = 1.0 - system.return_leak_fraction
    roots_s = [s for s in system.side("supply") if s.fed_by is None]
    roots_r = [s for s in system.side("return") if s.fed_by is None]

    delivered = 0.0
    for r in roots_s:
        delivered = delivered + supply_down(r, T_supply)
    sup_flow = vol * a_s
    sent = sum(flows[r.name] * r.count for r in roots_s)
    delivered = delivered + (sup_flow - sent) * np.asarray(T_supply, float)  # no supply ducts: plenum outlets
    T_delivered = delivered / sup_flow if sup_flow > 0 else np.asarray(T_supply, float)

    ret_flow = vol * a_r
    mix = (ret_flow - sum(flows[r.name] * r.count for r in roots_r)) * np.asarray(T_house, float)
    for r in roots_r:
        mix = mix + return_up(r) * flows[r.name] * r.count
    T_return_end = mix / ret_flow if ret_flow > 0 else np.asarray(T_house, float)

    loc_r = system.leak_location("return")
    T_leak_src = np.asarray(T_house, float) if loc_r == CONDITIONED else surroundings[loc_r].T_air
    T_ei = a_r * T_return_end + (1.0 - a_r) * T_leak_src
    return ChainState(m_dot, cp, T_supply, T_house, T_return_end, T_ei, T_delivered, out,
                      system.leak_location("supply"), loc_r,
                      system.supply_leak_fraction * m_dot, system.return_leak_fraction * m_dot)


@dataclass(frozen=True)
class SegmentResult:
    """One segment at the solved state (SI). Heat in W for all its runs, positive into the air."""

    name: str
    side: str
    location: str
    count: int
    entering_K: float
    leaving_K: float
    gain_w: float
    jacket_K: float
    dewpoint_margin_K: float
    sweats: bool
    ua_w_per_K: float

    def to_dict(self):
        return asdict(self)


@dataclass(frozen=True)
class DuctResult:
    """Duct system at the solved state (SI). Loads are what the equipment must add or remove:
    positive when they add to its work, in W; `mode` is "cooling" or "heating".

    The parts add up (to the accuracy of mixing by temperature, tested): equipment = delivered
    + supply_conduction + return_conduction + supply_leak_sensible + supply_leak_latent
    + return_leak_sensible + return_leak_latent.
    """

    mode: str
    r_model: str
    mass_flow_kg_s: float
    equipment_w: float
    delivered_w: float
    supply_conduction_w: float
    return_conduction_w: float
    supply_leak_sensible_w: float
    supply_leak_latent_w: float
    return_leak_sensible_w: float
    return_leak_latent_w: float
    delivery_effectiveness: float
    supply_leaving_equipment_K: float
    equipment_entering_K: float
    delivered_K: float
    segments: tuple = field(default_factory=tuple)

    @property
    def duct_load_w(self):
        return self.equipment_w - self.delivered_w

    @property
    def parts_w(self):
        """Sum of the duct load's parts (closes on duct_load_w)."""
        return (self.supply_conduction_w + self.return_conduction_w + self.supply_leak_sensible_w
                + self.supply_leak_latent_w + self.return_leak_sensible_w + self.return_leak_latent_w)

    @property
    def conduction_w(self):
        return self.supply_conduction_w + self.return_conduction_w

    @property
    def leakage_sensible_w(self):
        return self.supply_leak_sensible_w + self.return_leak_sensible_w

    @property
    def leakage_latent_w(self):
        return self.supply_leak_latent_w + self.return_leak_latent_w

    def scaled(self, factor):
        """The same system delivering `factor` times as much (a runtime fraction, or sizing to a load)."""
        names = ("equipment_w", "delivered_w", "supply_conduction_w", "return_conduction_w",
                 "supply_leak_sensible_w", "supply_leak_latent_w", "return_leak_sensible_w",
                 "return_leak_latent_w")
        kw = {k: v for k, v in self.__dict__.items()}
        for n in names:
            kw[n] = getattr(self, n) * factor
        kw["segments"] = tuple(
            SegmentResult(**{**s.__dict__, "gain_w": s.gain_w * factor}) for s in self.segments)
        return DuctResult(**kw)

    def to_dict(self):
        d = {k: v for k, v in asdict(self).items() if k != "segments"}
        d["segments"] = [s.to_dict() for s in self.segments]
        return d


def coil_leaving_humidity_ratio(T_leaving, W_entering, pressure, rh_leaving=0.95):
    """Humidity ratio of air leaving a cooling coil.

    Parameters
    ----------
    T_leaving : float, K
    W_entering : float, kg/kg
    pressure : float, Pa
    rh_leaving : float, relative humidity of the leaving air when the coil dehumidifies

    Returns
    -------
    W : float, kg/kg: the smaller of the entering value (a dry coil) and the value at
    `rh_leaving` (common practice, no source: a wet coil's leaving air is near 90-95 % RH).
    """
    W = np.minimum(W_entering, moist_air.humidity_ratio_from_rh(T_leaving, pressure, rh_leaving))
    return W if np.ndim(W) else float(W)


def energy_parts(system: DuctSystem, chain: ChainState, mode, W_house, surroundings, pressure=101325.0):
    """Enthalpy balances of the duct system at a solved chain, vectorised over hours (SI, W).

    Parameters
    ----------
    system : DuctSystem
    chain : ChainState from thermal_chain (scalars or arrays over hours)
    mode : "cooling" (moist air, enthalpies) or "heating" (sensible only: the humidity ratio
        of the house air everywhere, so no latent parts)
    W_house : float or array, kg/kg
    surroundings : dict location -> Surroundings
    pressure : float, Pa

    Returns
    -------
    dict of float or array, W: equipment, delivered, supply_conduction, return_conduction,
    supply_leak_sensible, supply_leak_latent, return_leak_sensible, return_leak_latent

    Notes
    -----
    equipment = m (h_ei - h_eo) = a_r m (h_re - h_h) [return conduction]
              + (1 - a_r) m (h_lr - h_h) [return leakage] + (1 - a_s) m (h_h - h_eo) [supply leakage]
              + a_s m (h_d - h_eo) [supply conduction] + a_s m (h_h - h_d) [delivered],
    signs for cooling; heating is the negative of each. With dry air and no interactions this
    reduces to ASHRAE Standard 152's delivery effectiveness (tested).
    """
    if mode not in ("cooling", "heating"):
        raise ValueError(f"mode {mode!r} is not 'cooling' or 'heating'")
    s = 1.0 if mode == "cooling" else -1.0
    P = pressure
    m = chain.m_dot
    a_s = 1.0 - system.supply_leak_fraction
    a_r = 1.0 - system.return_leak_fraction
    T_h = np.asarray(chain.T_house, float)
    W_h = np.asarray(W_house, float)
    loc_r = chain.return_leak_location
    if loc_r == CONDITIONED:
        T_lr, W_lr = T_h, W_h
    else:
        T_lr, W_lr = np.asarray(surroundings[loc_r].T_air, float), np.asarray(surroundings[loc_r].W, float)
    if mode == "heating":
        W_lr = W_h
    W_ei = a_r * W_h + (1.0 - a_r) * W_lr
    T_eo = np.asarray(chain.T_supply, float)
    W_eo = coil_leaving_humidity_ratio(T_eo, W_ei, P) if mode == "cooling" else W_ei
    T_re = np.asarray(chain.T_return_end, float)
    T_d = np.asarray(chain.T_delivered, float)
    T_ei = np.asarray(chain.T_equipment_in, float)
    # one property call for all eight states: (temperature, humidity ratio) pairs
    states = np.broadcast_arrays(T_h, T_re, T_lr, T_eo, T_d, T_h, T_ei,
                                 W_h, W_h, W_lr, W_eo, W_eo, W_eo, W_ei)
    h_h, h_re, h_lr, h_eo, h_d, h_h_Weo, h_ei = moist_air.enthalpy(np.stack(states[:7]), P, np.stack(states[7:]))
    h_h_Wlr = moist_air.enthalpy(T_h, P, W_lr)
    ret_cond = s * a_r * m * (h_re - h_h)
    ret_leak = s * (1.0 - a_r) * m * (h_lr - h_h)
    # sensible part of a leak: the temperature change at the leaked air's own humidity ratio
    ret_leak_sens = s * (1.0 - a_r) * m * (h_lr - h_h_Wlr)
    sup_leak = s * (1.0 - a_s) * m * (h_h - h_eo)
    sup_leak_sens = s * (1.0 - a_s) * m * (h_h_Weo - h_eo)
    sup_cond = s * a_s * m * (h_d - h_eo)
    delivered = s * a_s * m * (h_h - h_d)
    if chain.supply_leak_location == CONDITIONED:  # leaked into the house: delivered after all
        delivered = delivered + sup_leak
        sup_leak = sup_leak_sens = 0.0 * sup_leak
    # the coil's work straight from its entering state (the chain mixes by temperature): the sum of
    # the parts must close on it, which the tests check
    equipment = s * m * (h_ei - h_eo)
    return {"equipment": equipment, "delivered": delivered, "supply_conduction": sup_cond,
            "return_conduction": ret_cond, "supply_leak_sensible": sup_leak_sens,
            "supply_leak_latent": sup_leak - sup_leak_sens, "return_leak_sensible": ret_leak_sens,
            "return_leak_latent": ret_leak - ret_leak_sens, "W_supply": W_eo}


def energy_balance(system: DuctSystem, chain: ChainState, mode, W_house, surroundings, pressure=101325.0):
    """The duct system at one design condition (scalars): energy_parts plus each segment's result.

    Returns DuctResult.
    """
    P = pressure
    e = {k: float(v) for k, v in energy_parts(system, chain, mode, W_house, surroundings, P).items()}
    segs = []
    for seg in system.segments:
        st = chain.segments[seg.name]
        W_env = W_house if seg.location == CONDITIONED else surroundings[seg.location].W
        T_j = float(st["T_jacket_cold"])
        margin = T_j - float(moist_air.dew_point(max(T_j, 200.0), P, W_env))
        segs.append(SegmentResult(
            seg.name, seg.side, seg.location, seg.count, float(st["T_in"]), float(st["T_out"]),
            float(st["Q"]), T_j, margin, bool(margin < 0 and seg.location != CONDITIONED),
            float(st["UA"]) * seg.count))
    models = sorted({seg.r_model for seg in system.segments if seg.location != CONDITIONED})
    r_model = models[0] if len(models) == 1 else ("mixed: " + ", ".join(models) if models else "none")
    eq = e["equipment"]
    return DuctResult(
        mode, r_model, float(chain.m_dot), eq, e["delivered"], e["supply_conduction"], e["return_conduction"],
        e["supply_leak_sensible"], e["supply_leak_latent"], e["return_leak_sensible"], e["return_leak_latent"],
        e["delivered"] / eq if eq != 0 else math.nan, float(chain.T_supply), float(chain.T_equipment_in),
        float(chain.T_delivered), tuple(segs))
