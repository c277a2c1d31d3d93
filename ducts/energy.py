"""The duct system's energy balance at a converged state: enthalpy balances of return mixing, coil, supply
conduction and supply leakage (CoolProp), giving delivery effectiveness and the duct load split into its parts."""

from __future__ import annotations

import math
from dataclasses import asdict, dataclass, field

import numpy as np

from ducts import moist_air
from ducts.arrays import scalar_or_array
from ducts.chain import ChainState
from ducts.layout import CONDITIONED, DuctSystem


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
    T_leaving : float [K]
    W_entering : float [kg/kg]
    pressure : float [Pa]
    rh_leaving : float [-]
        Relative humidity of the leaving air when the coil dehumidifies.

    Returns
    -------
    W : float [kg/kg]
        The smaller of the entering value (a dry coil) and the value at `rh_leaving` (common
        practice, no source: a wet coil's leaving air is near 90-95 % RH).

    References
    ----------
    Moist-air properties: ASHRAE RP-1485 through ducts.moist_air; psychrolib (ASHRAE
    Handbook-Fundamentals 2017, ch. 1) for the check value.

    Examples
    --------
    Air leaving at 286 K (12.85 °C): psychrolib puts 95 % RH there at 0.00877 kg/kg. Entering
    air wetter than that leaves at it; drier air passes unchanged (a dry coil):

    >>> round(coil_leaving_humidity_ratio(286.0, 0.0093, 101325.0), 4)
    0.0088
    >>> coil_leaving_humidity_ratio(286.0, 0.006, 101325.0)
    0.006
    """
    W = np.minimum(W_entering, moist_air.humidity_ratio_from_rh(T_leaving, pressure, rh_leaving))
    return scalar_or_array(W)


def energy_parts(system: DuctSystem, chain: ChainState, mode, W_house, surroundings, pressure=101325.0):
    """Enthalpy balances of the duct system at a solved chain, vectorised over hours (SI, W).

    Parameters
    ----------
    system : DuctSystem or ducts.stack.DuctStack
    chain : ChainState
        From thermal_chain (scalars, or arrays over hours or over a stack's rows).
    mode : str
        "cooling" (moist air, enthalpies) or "heating" (sensible only: the humidity ratio of the
        house air everywhere, so no latent parts).
    W_house : float or array [kg/kg]
    surroundings : dict
        Location -> Surroundings.
    pressure : float [Pa]

    Returns
    -------
    dict of float or array [W]
        equipment, delivered, supply_conduction, return_conduction, supply_leak_sensible,
        supply_leak_latent, return_leak_sensible, return_leak_latent; and W_supply [kg/kg].

    References
    ----------
    ASHRAE Standard 152 (2004), design delivery effectiveness; ASHRAE Handbook-Fundamentals
    (2017), ch. 1, moist-air enthalpy (RP-1485 through ducts.moist_air).

    Examples
    --------
    The supply run of thermal_chain's example warms 0.24 kg/s of air from 285 to 286.106 K; by
    hand m cp dT = 0.24 x 1006 x 1.106 = 267 W, and with no leaks the equipment's work is what
    is delivered plus that:

    >>> from ducts.chain import Surroundings, thermal_chain
    >>> from ducts.layout import DuctSegment, DuctSystem
    >>> system = DuctSystem((DuctSegment("sup", "supply", "attic", length=10.0, r_label=1.0, diameter=0.2),),
    ...                     airflow=0.2)
    >>> attic = {"attic": Surroundings(325.0, 325.0, 0.005)}
    >>> chain = thermal_chain(system, 0.24, 1006.0, 285.0, 297.0, attic)
    >>> e = energy_parts(system, chain, "cooling", 0.005, attic)
    >>> round(float(e["supply_conduction"]), -1)
    270.0
    >>> bool(abs(e["equipment"] - e["delivered"] - e["supply_conduction"]) < 1e-6)
    True

    Notes
    -----
    equipment = m (h_ei - h_eo), with h_ei = a_r h_re + (1 - a_r) sum_l f_l h_l the adiabatic mix of the return
    and its leaks (ASHRAE Handbook-Fundamentals (2017), ch. 1, adiabatic mixing of moist airstreams), so
    equipment = a_r m (h_re - h_h) [return conduction]
              + (1 - a_r) m sum_l f_l (h_l - h_h) [return leakage, from each location l in its share f_l]
              + (1 - a_s) m (h_h - h_eo) [supply leakage] + a_s m (h_d - h_eo) [supply conduction]
              + a_s m (h_h - h_d) [delivered],
    signs for cooling; heating is the negative of each. The share of the supply leakage that opens in
    conditioned space is delivered. With dry air and no interactions this
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
    # the return leaks draw the air of every location where they open, in its share
    sources = []
    for loc, share in system.leak_split("return").items():
        if loc == CONDITIONED:
            T_l, W_l = T_h, W_h
        else:
            T_l, W_l = np.asarray(surroundings[loc].T_air, float), np.asarray(surroundings[loc].W, float)
        sources.append((share, T_l, W_h if mode == "heating" else W_l))
    W_ei = a_r * W_h
    for share, _, W_l in sources:
        W_ei = W_ei + (1.0 - a_r) * share * W_l
    T_eo = np.asarray(chain.T_supply, float)
    W_eo = coil_leaving_humidity_ratio(T_eo, W_ei, P) if mode == "cooling" else W_ei
    T_re = np.asarray(chain.T_return_end, float)
    T_d = np.asarray(chain.T_delivered, float)
    # one property call for the five states: (temperature, humidity ratio) pairs
    states = np.broadcast_arrays(T_h, T_re, T_eo, T_d, T_h, W_h, W_h, W_eo, W_eo, W_eo)
    h_h, h_re, h_eo, h_d, h_h_Weo = moist_air.enthalpy(np.stack(states[:5]), P, np.stack(states[5:]))
    ret_cond = s * a_r * m * (h_re - h_h)
    ret_leak = ret_leak_sens = 0.0 * h_h
    h_mix = a_r * h_re  # the air entering the equipment: adiabatic mixing keeps enthalpy (per kg of dry air)
    for share, T_l, W_l in sources:
        h_l, h_h_Wl = moist_air.enthalpy(np.stack(np.broadcast_arrays(T_l, T_h)), P,
                                         np.stack(np.broadcast_arrays(W_l, W_l)))
        h_mix = h_mix + (1.0 - a_r) * share * h_l
        ret_leak = ret_leak + s * (1.0 - a_r) * share * m * (h_l - h_h)
        # sensible part of a leak: the temperature change at the leaked air's own humidity ratio
        ret_leak_sens = ret_leak_sens + s * (1.0 - a_r) * share * m * (h_l - h_h_Wl)
    sup_leak = s * (1.0 - a_s) * m * (h_h - h_eo)
    sup_leak_sens = s * (1.0 - a_s) * m * (h_h_Weo - h_eo)
    sup_cond = s * a_s * m * (h_d - h_eo)
    delivered = s * a_s * m * (h_h - h_d)
    inside = system.leak_split("supply").get(CONDITIONED, 0.0)
    if np.any(inside > 0):  # the part leaked into the house is delivered after all (rows of 0 add exactly 0)
        delivered = delivered + inside * sup_leak
        sup_leak, sup_leak_sens = (1.0 - inside) * sup_leak, (1.0 - inside) * sup_leak_sens
    # the coil's work from the mixed return's enthalpy: mixing streams keeps their enthalpy, not their temperature
    # (the chain's T_equipment_in mixes temperatures at one specific heat), so the parts add up to it exactly
    equipment = s * m * (h_mix - h_eo)
    return {"equipment": equipment, "delivered": delivered, "supply_conduction": sup_cond,
            "return_conduction": ret_cond, "supply_leak_sensible": sup_leak_sens,
            "supply_leak_latent": sup_leak - sup_leak_sens, "return_leak_sensible": ret_leak_sens,
            "return_leak_latent": ret_leak - ret_leak_sens, "W_supply": W_eo}


def energy_balance(system: DuctSystem, chain: ChainState, mode, W_house, surroundings, pressure=101325.0):
    """The duct system at one design condition (scalars): energy_parts plus each segment's result.

    Parameters
    ----------
    system : DuctSystem
    chain : ChainState
        From thermal_chain, scalars.
    mode : str
        "cooling" or "heating".
    W_house : float [kg/kg]
    surroundings : dict
        Location -> Surroundings.
    pressure : float [Pa]

    Returns
    -------
    DuctResult

    References
    ----------
    ASHRAE Standard 152 (2004), design delivery effectiveness; moist-air enthalpies of ASHRAE
    RP-1485 through ducts.moist_air.

    Examples
    --------
    The system of thermal_chain's example with dry-enough house air (W = 0.005, so the coil stays
    dry) and no leaks. ASHRAE 152's delivery effectiveness then reduces to the supply's sensible
    share, (T_house - T_delivered)/(T_house - T_supply) = (297 - 286.106)/12 = 0.908, by hand:

    >>> from ducts.chain import Surroundings, thermal_chain
    >>> from ducts.layout import DuctSegment, DuctSystem
    >>> system = DuctSystem((DuctSegment("sup", "supply", "attic", length=10.0, r_label=1.0, diameter=0.2),),
    ...                     airflow=0.2)
    >>> attic = {"attic": Surroundings(325.0, 325.0, 0.005)}
    >>> chain = thermal_chain(system, 0.24, 1006.0, 285.0, 297.0, attic)
    >>> r = energy_balance(system, chain, "cooling", 0.005, attic)
    >>> round(r.delivery_effectiveness, 3)
    0.908

    Ducts wholly inside the house lose nothing (ASHRAE 152: B = 1):

    >>> inside = DuctSystem((DuctSegment("sup", "supply", "conditioned", length=10.0, r_label=1.0,
    ...                                  diameter=0.2),), airflow=0.2)
    >>> energy_balance(inside, thermal_chain(inside, 0.24, 1006.0, 285.0, 297.0, {}), "cooling", 0.005,
    ...                {}).delivery_effectiveness
    1.0
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


def energy_balances(stack, chain: ChainState, mode, W_house, surroundings, pressure=101325.0):
    """energy_balance for every row of a DuctStack at once: one DuctResult per row.

    Parameters
    ----------
    stack : ducts.stack.DuctStack
    chain : ChainState
        From thermal_chain on the stack, (n,) arrays.
    mode : str
        "cooling" or "heating".
    W_house : float or (n,) array [kg/kg]
    surroundings : dict
        Location -> Surroundings of (n,) arrays.
    pressure : float [Pa]

    Returns
    -------
    list of DuctResult
        Row i equals energy_balance(stack.row(i), chain of row i, ...) (tested); the properties come from
        vectorised calls (one dew-point call for every row and segment), so from ducts.moist_air's tables
        once a call holds TABLE_MIN states or more, as the hourly year's do.

    References
    ----------
    As energy_balance: ASHRAE Standard 152 (2004); moist-air properties of ASHRAE RP-1485.
    """
    P = pressure
    n = stack.n

    def rows(x):
        return np.broadcast_to(np.asarray(x, float), (n,))

    e = {k: rows(v) for k, v in energy_parts(stack, chain, mode, W_house, surroundings, P).items()}
    segs = stack.segments
    k = len(segs)
    T_j = np.array([rows(chain.segments[s.name]["T_jacket_cold"]) for s in segs]).reshape(k, n)
    W_env = np.array([rows(W_house if s.location == CONDITIONED else surroundings[s.location].W)
                      for s in segs]).reshape(k, n)
    margin = T_j - np.asarray(moist_air.dew_point(np.maximum(T_j, 200.0), P, W_env), float).reshape(k, n)
    cols = {name: np.array([rows(chain.segments[s.name][name]) for s in segs]).reshape(k, n)
            for name in ("T_in", "T_out", "Q", "UA")}
    models = sorted({s.r_model for s in segs if s.location != CONDITIONED})
    r_model = models[0] if len(models) == 1 else ("mixed: " + ", ".join(models) if models else "none")
    eq = e["equipment"]
    with np.errstate(divide="ignore", invalid="ignore"):
        de = np.where(eq != 0, e["delivered"] / np.where(eq != 0, eq, 1.0), math.nan)
    base = [rows(x) for x in (chain.m_dot, chain.T_supply, chain.T_equipment_in, chain.T_delivered)]
    names = ("equipment", "delivered", "supply_conduction", "return_conduction", "supply_leak_sensible",
             "supply_leak_latent", "return_leak_sensible", "return_leak_latent")
    table = np.array([e[x] for x in names] + [de] + base).T.tolist()  # floats, row by row
    seg_table = np.stack([cols["T_in"], cols["T_out"], cols["Q"], T_j, margin, cols["UA"]], axis=-1).tolist()
    out = []
    for i in range(n):
        v = table[i]
        sr = tuple(SegmentResult(s.name, s.side, s.location, s.count, t_in, t_out, q, tj, mg,
                                 bool(mg < 0 and s.location != CONDITIONED), ua * s.count)
                   for s, (t_in, t_out, q, tj, mg, ua) in zip(segs, (seg_table[j][i] for j in range(k)), strict=True))
        out.append(DuctResult(mode, r_model, v[9], *v[0:9], v[10], v[11], v[12], sr))
    return out
