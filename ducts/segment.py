"""One duct segment: the exponential temperature law and the heat exchange of a run with its surroundings.

The insulation models (how a label R performs) and the geometry they give are in ducts.insulation.
"""

from __future__ import annotations

import numpy as np

from ducts.arrays import scalar_or_array
from ducts.films import inside_film_coefficient, outside_film_coefficient
from ducts.insulation import (  # noqa: F401  (re-exported from the geometry's old home)
    FLEX_INSULATION_CONDUCTIVITY,
    R_MODELS,
    Section,
    SegmentGeometry,
    cylindrical_shell_resistance,
    insulated_geometry,
)

SIGMA = 5.670374419e-8  # W/(m2.K4), Stefan-Boltzmann constant as printed by CODATA 2018 (ducts stand alone)

# The R models (how a label R performs) and the geometry they give live in ducts.insulation; the
# names stay importable from here.


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


def round_geometry(diameter, length, r_label, r_model="cylinder",
                   conductivity=FLEX_INSULATION_CONDUCTIVITY):
    """Geometry of a round duct with insulation of labelled R, by the named R model.

    Parameters
    ----------
    diameter : float [m]
        Inner (core) diameter.
    length : float [m]
    r_label : float [m2.K/W]
        The R printed on the jacket (measured flat).
    r_model : str
        A key of ducts.insulation.R_MODELS: "cylinder" (insulation of thickness r_label*k wrapped
        around the core; Palmiter & Kruse 2006), "label" (the label R on the core area, as if the
        wrap were thin, plus the computed films) or "ashrae152" (label R plus Standard 152's film
        allowance on the outer surface).
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
    return insulated_geometry(Section(diameter=diameter), length, r_label, r_model, conductivity)


def rectangular_geometry(width, height, length, r_label, conductivity=FLEX_INSULATION_CONDUCTIVITY,
                         r_model="cylinder"):
    """Geometry of a rectangular duct (duct board or wrapped sheet metal), by the named R model.

    With "cylinder" the insulation is flat on the perimeter at mid-thickness (corners rounded).

    Parameters
    ----------
    width : float [m]
    height : float [m]
    length : float [m]
    r_label : float [m2.K/W]
    conductivity : float [W/(m.K)]
    r_model : str
        A key of ducts.insulation.R_MODELS.

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
    return insulated_geometry(Section(width=width, height=height), length, r_label, r_model, conductivity)


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
    operative surrounding T_env = (h_c T_air + h_r T_mrt)/(h_c + h_r) (when the R model holds its own
    films, as ASHRAE 152's does, they set only that split and the jacket temperature). Q_conv + Q_rad = Q exactly:
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
        if geom.films_included:
            # the model's R already holds the films; the computed outside film only places the jacket
            R_tot = geom.insulation_resistance
            R_o = np.minimum(R_o, R_tot)
        else:
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
