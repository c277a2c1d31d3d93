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
    T_in : float or array, K, entering air
    T_env : float or array, K, surrounding (operative) temperature
    UA : float or array, W/K, overall conductance of the duct
    m_cp : float or array, W/K, capacity rate of the air (mass flow times specific heat)

    Returns
    -------
    T_out : float or array, K

    References
    ----------
    Incropera et al., Fundamentals of Heat and Mass Transfer (6th ed.), eq. (8.46b);
    ASHRAE Handbook-Fundamentals (2017), ch. 21 (duct heat gain).
    """
    T = np.asarray(T_env, float) - (np.asarray(T_env, float) - np.asarray(T_in, float)) * np.exp(
        -np.asarray(UA, float) / np.asarray(m_cp, float))
    return scalar_or_array(T)


def cylindrical_shell_resistance(d_inner, thickness, conductivity):
    """Conduction resistance per unit length of a cylindrical shell.

    Parameters
    ----------
    d_inner : float or array, m
    thickness : float or array, m
    conductivity : float or array, W/(m.K)

    Returns
    -------
    R' : float or array, m.K/W

    References
    ----------
    Incropera et al., Fundamentals of Heat and Mass Transfer (6th ed.), eq. (3.28).
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
    diameter : m, inner (core) diameter
    length : m
    r_label : m2.K/W, the R printed on the jacket (measured flat)
    r_model : "cylinder" (insulation of thickness r_label*k wrapped around the core; Palmiter &
        Kruse 2006) or "label" (the label R taken on the core area, as if the wrap were thin)
    conductivity : W/(m.K), of the insulation
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
    width, height, length : m
    r_label : m2.K/W
    conductivity : W/(m.K)
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
    T_in : float or array, K, entering air
    m_dot : float or array, kg/s of dry air through the run
    cp : float, J/(kg.K)
    T_air : float or array, K, surrounding air
    T_mrt : float or array, K, mean radiant temperature of the surrounding surfaces
    jacket_emittance : float, dimensionless
    pressure : float, Pa
    iterations : int, fixed-point passes for the outside film (it depends on the jacket
        temperature); a fixed count keeps the result a smooth function of the inputs.

    Returns
    -------
    dict of float or array:
        ``T_out`` (K), ``Q`` (W into the air), ``Q_conv`` (W taken from the surrounding air),
        ``Q_rad`` (W taken from the surrounding surfaces), ``T_jacket_cold`` (K, jacket at the
        colder end), ``T_jacket_warm`` (K), ``UA`` (W/K)

    Notes
    -----
    Films: Gnielinski inside, Churchill-Chu outside plus linearised radiation, combined into an
    operative surrounding T_env = (h_c T_air + h_r T_mrt)/(h_c + h_r). Q_conv + Q_rad = Q exactly:
    integrating h_c (T_air - T_jacket) along the run gives
    Q_conv = h_c P L (T_air - T_env) + Q h_c/(h_c + h_r).
    """
    T_in = np.asarray(T_in, float)
    T_air = np.asarray(T_air, float)
    T_mrt = np.asarray(T_mrt, float)
    T_mid_air = 0.5 * (T_in + T_air)
    h_i = inside_film_coefficient(m_dot, geom.hydraulic_diameter, geom.flow_area, T_mid_air, cp)
    R_i = 1.0 / (h_i * geom.inner_perimeter)
    D_o = geom.outer_diameter
    T_j = 0.5 * (T_in + T_air)
    for _ in range(iterations):
        h_c = outside_film_coefficient(T_j, T_air, D_o, pressure, cp)
        h_r = jacket_emittance * SIGMA * (T_j**2 + T_mrt**2) * (T_j + T_mrt)
        R_o = 1.0 / ((h_c + h_r) * geom.outer_perimeter)
        R_tot = R_i + geom.insulation_resistance + R_o
        T_env = (h_c * T_air + h_r * T_mrt) / (h_c + h_r)
        UA = geom.length / R_tot
        T_out = leaving_temperature(T_in, T_env, UA, m_dot * cp)
        # film evaluated at the jacket temperature halfway along the run
        T_j = T_env - (T_env - 0.5 * (T_in + T_out)) * R_o / R_tot
    Q = m_dot * cp * (T_out - T_in)
    share_c = h_c / (h_c + h_r)
    Q_conv = h_c * geom.outer_perimeter * geom.length * (T_air - T_env) + Q * share_c
    Q_rad = Q - Q_conv
    jacket_in = T_env - (T_env - T_in) * R_o / R_tot
    jacket_out = T_env - (T_env - T_out) * R_o / R_tot
    return {"T_out": T_out, "Q": Q, "Q_conv": Q_conv, "Q_rad": Q_rad, "UA": UA,
            "T_jacket_cold": np.minimum(jacket_in, jacket_out),
            "T_jacket_warm": np.maximum(jacket_in, jacket_out),
            "R_total_per_length": R_tot}
