"""The cooling design day: 24 quasi-steady hours with ASHRAE's daily temperature profile and clear-sky sun."""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

# ASHRAE Handbook-Fundamentals (2009-2017), ch. 14, Table 6 "Fraction of daily temperature range", for
# hours 1-24 (values from memory). T(hour) = T_design - fraction * daily range; zero (the peak) at 14 and 15.
DAILY_RANGE_FRACTIONS = np.array([
    0.88, 0.92, 0.95, 0.98, 1.00, 0.98, 0.91, 0.74, 0.55, 0.38, 0.23, 0.13,
    0.05, 0.00, 0.00, 0.06, 0.14, 0.24, 0.39, 0.50, 0.59, 0.68, 0.75, 0.82,
])
HOURS = np.arange(1, 25)


def hourly_dry_bulb(T_design, daily_range, hours=HOURS):
    """Dry bulb through the design day.

    Parameters
    ----------
    T_design : float, K, the design (peak) dry bulb
    daily_range : float, K, mean daily range
    hours : array of hours 1-24

    Returns
    -------
    T : array, K

    References
    ----------
    ASHRAE Handbook-Fundamentals (2017), ch. 14, eq. (2) with the fractions of Table 6.
    """
    f = DAILY_RANGE_FRACTIONS[np.asarray(hours, dtype=int) - 1]
    return T_design - f * daily_range


@dataclass(frozen=True)
class DesignDay:
    """The 24 hours of the cooling design day (SI arrays over hours 1-24).

    Duct quantities are with the air handler running all hour at its airflow (no hourly base load is
    known, so nothing is scaled to one). attic_air_w is what the attic's air brings into the house (sensible and
    latent; an unvented attic's, zero for a vented one). The peak hour is the hour of the largest ceiling + attic
    air + duct load.
    """

    case: str
    title: str
    hours: np.ndarray
    T_out_K: np.ndarray
    irradiance_w_m2: np.ndarray  # (24, 2)
    attic_air_K: np.ndarray
    outer_K: np.ndarray  # (24, 2)
    inner_K: np.ndarray  # (24, 2)
    floor_K: np.ndarray
    ceiling_w: np.ndarray
    duct_load_w: np.ndarray
    duct_leaving_K: dict  # segment name -> (24,)
    plane_azimuths: tuple
    peak_hour: int
    peak_attic_hour: int
    residual_w: float
    mass: bool = False
    airflow_m3_s: float | None = None  # the case's air handler airflow the ducts run at (None: no ducts)
    attic_air_w: np.ndarray | None = None  # (24,) the attic's air into the house, sensible + latent

    def to_dict(self):
        """SI, as held (arrays as lists); attic.present.hours.day_output gives the output contract in IP or SI."""
        from attic.runs.plain import si_dict

        return si_dict(self)

    def to_frame(self):
        """The 24 hours as a pandas DataFrame in SI (K, W, W/m²), one row an hour, planes named by facing."""
        from attic.runs.plain import facing, frame

        cols = {"outdoor_K": self.T_out_K, "attic_air_K": self.attic_air_K}
        for j, az in enumerate(self.plane_azimuths):
            f = facing(az)
            cols[f"{f}_outer_K"] = self.outer_K[:, j]
            cols[f"{f}_inner_K"] = self.inner_K[:, j]
            cols[f"{f}_sun_w_m2"] = self.irradiance_w_m2[:, j]
        cols.update({"floor_K": self.floor_K, "ceiling_w": self.ceiling_w, "attic_air_w": self.attic_air_w,
                     "ducts_w": self.duct_load_w})
        cols.update({f"duct.{n}.leaving_K": T for n, T in self.duct_leaving_K.items()})
        return frame(cols, index=self.hours, index_name="hour")


def run_design_day(case, mass=False):
    """Solve the 24 hours of a case's cooling design day together.

    mass : False for quasi-steady hours (attic.network.solve.solve_hours); True to include the heat capacity of
        the roof covering and sheathing over a repeating day (attic.network.periodic.solve_periodic_day).
    """
    from attic.network.build import build_network_hours
    from attic.network.nodes import COOLING, Hours
    from attic.network.periodic import solve_periodic_day
    from attic.network.solve import solve_hours
    from attic.physics.solar import clear_sky_on_planes
    from attic.runs.coupling import duct_energy_hours
    from ducts import moist_air

    c = case.cooling
    g = case.geometry
    T = hourly_dry_bulb(c.T_out, c.daily_range)
    # the design humidity held all day, but no more than saturation in the cool of the night
    W = np.minimum(c.W_out, moist_air.humidity_ratio_from_rh(T, case.pressure, 1.0))
    if c.irradiance is not None:
        poa = np.full((24, 2), c.irradiance)
    else:
        # the table's hours are taken as apparent solar time (the longitude and zone offsets are not known)
        cs = clear_sky_on_planes(case.latitude, c.doy, HOURS.astype(float), [np.degrees(g.tilt)] * 2,
                                 list(g.plane_azimuths), pressure=case.pressure, elevation=case.elevation,
                                 linke_turbidity=c.linke_turbidity, albedo=c.albedo)
        poa = cs["poa"].T
    one = np.ones(24)
    hours = Hours(mode=np.full(24, COOLING), T_out=T, W_out=W, T_in=c.T_in * one, W_in=c.W_in * one, wind=c.wind * one,
                  poa=poa, T_supply=c.T_supply * one, runtime=one, solar_hour=HOURS.astype(float))
    net = build_network_hours(case, hours)
    label = f'case "{case.name}", cooling design day'
    st = solve_periodic_day(net, label=label) if mass else solve_hours(net, label=label)
    duct = np.zeros(24)
    leaving = {}
    if case.ducts is not None:
        chain, e = duct_energy_hours(case, net, st, "cooling")
        duct = e["equipment"] - e["delivered"]
        leaving = {name: np.asarray(s["T_out"]) for name, s in chain.segments.items()}
    attic_air = st.attic_air_to_house_w + st.attic_air_to_house_latent_w
    load = st.ceiling_to_house_w + attic_air + duct
    return DesignDay(case.name, case.title, HOURS, T, poa, st.air_K, st.outer_K, st.inner_K, st.floor_K,
                     st.ceiling_to_house_w, duct, leaving, g.plane_azimuths, int(HOURS[np.argmax(load)]),
                     int(HOURS[np.argmax(st.air_K)]), float(np.max(st.residual_w)), mass,
                     None if case.ducts is None else float(case.ducts.airflow), np.asarray(attic_air, float))
