"""One duct segment: geometry, the resistance of its wall and the exponential temperature law."""

from __future__ import annotations

import math
from dataclasses import dataclass

import numpy as np

from ducts.arrays import scalar_or_array

from .films import inside_film_coefficient, outside_film_coefficient

SIGMA = 5.670374419e-8  # W/(m2.K4), Stefan-Boltzmann constant as printed by CODATA 2018 (ducts stand alone)

# Conductivity of flexible-duct fiberglass, W/(m.K): 0.357 Btu.in/(h.ft2.F). With it the
# cylindrical model reproduces Palmiter & Kruse (2006): a 6-in core with labels
# performs at and R-5.62 (core area, films excluded). See tests/test_duct_segment.py.
FLEX_INSULATION_CONDUCTIVITY = 0.357 * 0.1441314

R_MODELS = ("cylinder", "label")


def leaving_temperature(T_in, T_env, UA, m_cp):
    """Air temperature leaving a duct of uniform conductance in a uniform surrounding.

    Parameters
    ----------
    T_in : float or array [K]
        Entering air.
    T_env : float or array [K]
        Surrounding (operative) temperature.
    UA : float or array [W/K]
        Overall conductance of the duct.
    m_cp : float or array [W/K]
        Capacity rate of the air (mass flow times specific heat).

    Returns
    -------
    T_out : float or array [K]

    References
    ----------
    Incropera et al., Fundamentals of Heat and Mass Transfer (6th ed.), eq. (8.46b);
    ASHRAE Handbook-Fundamentals (2017), ch. 21 (duct heat gain).

    Examples
    --------
    With UA = m_cp ln 2 the air closes half its difference with the surroundings (by hand:
    exp(-ln 2) = 1/2, so 280 K air in 320 K surroundings leaves at 300 K); with UA = 0 it
    leaves as it entered (limiting case):

    >>> import math
    >>> round(leaving_temperature(280.0, 320.0, 100.0 * math.log(2.0), 100.0), 9)
    300.0
    >>> leaving_temperature(280.0, 320.0, 0.0, 100.0)
    280.0
    """
    T = np.asarray(T_env, float) - (np.asarray(T_env, float) - np.asarray(T_in, float)) * np.exp(
        -np.asarray(UA, float) / np.asarray(m_cp, float))
    return scalar_or_array(T)


def cylindrical_shell_resistance(d_inner, thickness, conductivity):
    """Conduction resistance per unit length of a cylindrical shell.

    Parameters
    ----------
    d_inner : float or array [m]
    thickness : float or array [m]
    conductivity : float or array [W/(m.K)]

    Returns
    -------
    R_prime : float or array [m.K/W]

    References
    ----------
    Incropera et al., Fundamentals of Heat and Mass Transfer (6th ed.), eq. (3.28).

    Examples
    --------
    A shell that doubles the diameter, k = 0.05 W/(m.K): by hand ln 2 / (2 pi 0.05) = 2.206;
    a thin shell tends to the flat-wall value t / (k pi d) (limiting case, 0.004244 for
    0.1 mm on 150 mm):

    >>> round(cylindrical_shell_resistance(0.15, 0.075, 0.05), 3)
    2.206
    >>> round(cylindrical_shell_resistance(0.15, 1e-4, 0.05), 5)
    0.00424
    """
    d_o = np.asarray(d_inner, float) + 2.0 * np.asarray(thickness, float)
    R = np.log(d_o / np.asarray(d_inner, float)) / (2.0 * math.pi * np.asarray(conductivity, float))
    return scalar_or_array(R)


@dataclass(frozen=True)
class SegmentGeometry:
    """Cross-section of a duct run and its insulation (SI).

    Attributes
    ----------
    length : m
    inner_perimeter : m
    flow_area : m2
    hydraulic_diameter : m
    insulation_resistance : m.K/W, per unit length, of the insulation alone
    outer_perimeter : m
    """

    length: float
    inner_perimeter: float
    flow_area: float
    hydraulic_diameter: float
    insulation_resistance: float
    outer_perimeter: float

    @property
    def outer_diameter(self):
        """Diameter of a cylinder with the same outer perimeter, m (for the outside film)."""
        return self.outer_perimeter / math.pi

    @property
    def outer_area(self):
        """Outer surface of one run, m2."""
        return self.outer_perimeter * self.length


def round_geometry(diameter, length, r_label, r_model="cylinder",
                   conductivity=FLEX_INSULATION_CONDUCTIVITY):
    """Geometry of a round duct with insulation of labelled R.

    Parameters
    ----------
    diameter : float [m]
        Inner (core) diameter.
    length : float [m]
    r_label : float [m2.K/W]
        The R printed on the jacket (measured flat).
    r_model : str
        "cylinder" (insulation of thickness r_label*k wrapped around the core; Palmiter &
        Kruse 2006) or "label" (the label R taken on the core area, as if the wrap were thin).
    conductivity : float [W/(m.K)]
        Of the insulation.

    Returns
    -------
    SegmentGeometry

    References
    ----------
    Palmiter, L. and Kruse, E. (2006). True R-values of round residential ductwork. ACEEE Summer
    Study on Energy Efficiency in Buildings: a 6-in core with an R-8 label performs at R-5.62
    (core area, films excluded).

    Examples
    --------
    Palmiter & Kruse's R-8 6-in flex duct; the insulation's resistance per length times the
    core perimeter, in h.ft2.F/Btu (1 h.ft2.F/Btu = 0.17611 m2.K/W):

    >>> import math
    >>> d = 6 * 0.0254
    >>> g = round_geometry(d, 1.0, 8 * 0.17611)
    >>> round(g.insulation_resistance * math.pi * d / 0.17611, 1)
    5.6
    >>> g = round_geometry(d, 1.0, 8 * 0.17611, r_model="label")
    >>> round(g.insulation_resistance * math.pi * d / 0.17611, 6)
    8.0
    """
    if r_model not in R_MODELS:
        raise ValueError(f"r_model {r_model!r} is not one of {R_MODELS}")
    t = r_label * conductivity
    if r_model == "cylinder" and t > 0:
        R_ins = cylindrical_shell_resistance(diameter, t, conductivity)
    else:
        R_ins = r_label / (math.pi * diameter)
    return SegmentGeometry(length, math.pi * diameter, math.pi * diameter**2 / 4.0, diameter, R_ins,
                           math.pi * (diameter + 2.0 * t))


def rectangular_geometry(width, height, length, r_label, conductivity=FLEX_INSULATION_CONDUCTIVITY):
    """Geometry of a rectangular duct (duct board or wrapped sheet metal).

    The insulation is treated as flat on the perimeter at mid-thickness (corners rounded).

    Parameters
    ----------
    width : float [m]
    height : float [m]
    length : float [m]
    r_label : float [m2.K/W]
    conductivity : float [W/(m.K)]

    Returns
    -------
    SegmentGeometry

    References
    ----------
    Hydraulic diameter D_h = 4 A / P: Incropera et al., Fundamentals of Heat and Mass Transfer
    (6th ed.), sect. 8.6 (equation number from memory: 8.67).

    Examples
    --------
    A 300 x 200 mm duct: by hand P = 1.0 m, A = 0.06 m2, D_h = 4 x 0.06 / 1.0 = 0.24 m:

    >>> g = rectangular_geometry(0.3, 0.2, 5.0, 1.0)
    >>> round(g.inner_perimeter, 9), round(g.flow_area, 9), round(g.hydraulic_diameter, 9)
    (1.0, 0.06, 0.24)
    """
    t = r_label * conductivity
    p_in = 2.0 * (width + height)
    p_mid = p_in + math.pi * t
    return SegmentGeometry(length, p_in, width * height, 4.0 * width * height / p_in, r_label / p_mid,
                           p_in + 2.0 * math.pi * t)


def segment_transfer(geom: SegmentGeometry, T_in, m_dot, cp, T_air, T_mrt, jacket_emittance,
                     pressure=101325.0, iterations=3):
    """Heat exchange of one duct run with its surroundings.

    Parameters
    ----------
    geom : SegmentGeometry
    T_in : float or array [K]
        Entering air.
    m_dot : float or array [kg/s]
        Dry air through the run.
    cp : float [J/(kg.K)]
    T_air : float or array [K]
        Surrounding air.
    T_mrt : float or array [K]
        Mean radiant temperature of the surrounding surfaces.
    jacket_emittance : float [-]
    pressure : float [Pa]
    iterations : int
        Fixed-point passes for the outside film (it depends on the jacket temperature); a fixed
        count keeps the result a smooth function of the inputs.

    Returns
    -------
    dict of float or array
        ``T_out`` [K]; ``Q`` [W] into the air; ``Q_conv`` [W] taken from the surrounding air;
        ``Q_rad`` [W] taken from the surrounding surfaces; ``T_jacket_cold`` [K], the jacket at
        the colder end; ``T_jacket_warm`` [K]; ``UA`` [W/K]; ``R_total_per_length`` [m.K/W];
        ``h_inside`` [W/(m2.K)], the inside film at the mean temperature of the duct's own air.

    Notes
    -----
    Films: Gnielinski inside, Churchill-Chu outside plus linearised radiation, combined into an
    operative surrounding T_env = (h_c T_air + h_r T_mrt)/(h_c + h_r). Q_conv + Q_rad = Q exactly:
    integrating h_c (T_air - T_jacket) along the run gives
    Q_conv = h_c P L (T_air - T_env) + Q h_c/(h_c + h_r).

    References
    ----------
    Incropera et al., Fundamentals of Heat and Mass Transfer (6th ed.), eqs. (3.28), (8.46b),
    (8.62), (9.34), (1.9); ASHRAE Handbook-Fundamentals (2017), ch. 21 (duct heat gain).

    Examples
    --------
    10 m of 200 mm duct with R-1 (m2.K/W) insulation, 0.2 kg/s of 285 K air, attic air and
    surfaces at 325 K. By hand, the insulation alone (no films) is ln(0.3029/0.2) / (2 pi x
    0.05145) = 1.284 m.K/W, UA = 10/1.284 = 7.79 W/K, and the air would leave at
    325 - 40 exp(-7.79/201.2) = 286.52 K; the films add resistance, so it leaves a little
    cooler; the air then gains 0.2 x 1006 x (286.3 - 285) = 264 W:

    >>> g = round_geometry(0.2, 10.0, 1.0)
    >>> r = segment_transfer(g, 285.0, 0.2, 1006.0, 325.0, 325.0, 0.9)
    >>> round(float(r["T_out"]), 1), bool(285.0 < r["T_out"] < 286.52), round(float(r["Q"]))
    (286.3, True, 264)

    Surroundings at the air's own temperature exchange nothing (limiting case):

    >>> float(segment_transfer(g, 300.0, 0.2, 1006.0, 300.0, 300.0, 0.9)["Q"])
    0.0
    """
    T_in = np.asarray(T_in, float)
    T_air = np.asarray(T_air, float)
    T_mrt = np.asarray(T_mrt, float)
    D_o = geom.outer_diameter
    T_j = 0.5 * (T_in + T_air)
    T_duct = T_in  # the inside film's properties are those of the duct's own air, refined to its mean below
    for _ in range(iterations):
        h_i = inside_film_coefficient(m_dot, geom.hydraulic_diameter, geom.flow_area, T_duct, cp)
        R_i = 1.0 / (h_i * geom.inner_perimeter)
        h_c = outside_film_coefficient(T_j, T_air, D_o, pressure, cp)
        h_r = jacket_emittance * SIGMA * (T_j**2 + T_mrt**2) * (T_j + T_mrt)
        R_o = 1.0 / ((h_c + h_r) * geom.outer_perimeter)
        R_tot = R_i + geom.insulation_resistance + R_o
        T_env = (h_c * T_air + h_r * T_mrt) / (h_c + h_r)
        UA = geom.length / R_tot
        T_out = leaving_temperature(T_in, T_env, UA, m_dot * cp)
        T_duct = 0.5 * (T_in + T_out)
        # film evaluated at the jacket temperature halfway along the run
        T_j = T_env - (T_env - 0.5 * (T_in + T_out)) * R_o / R_tot
    Q = m_dot * cp * (T_out - T_in)
    share_c = h_c / (h_c + h_r)
    Q_conv = h_c * geom.outer_perimeter * geom.length * (T_air - T_env) + Q * share_c
    Q_rad = Q - Q_conv
    jacket_in = T_env - (T_env - T_in) * R_o / R_tot
    jacket_out = T_env - (T_env - T_out) * R_o / R_tot
    return {"T_out": T_out, "Q": Q, "Q_conv": Q_conv, "Q_rad": Q_rad, "UA": UA, "h_inside": h_i,
            "T_jacket_cold": np.minimum(jacket_in, jacket_out),
            "T_jacket_warm": np.maximum(jacket_in, jacket_out),
            "R_total_per_length": R_tot}
