"""Inside a roof deck assembly: temperatures at the layer interfaces, water vapour by diffusion, and the
humidity of mixed air streams. Pure functions of SI floats or arrays; they say where moisture can condense.
"""

from __future__ import annotations

import numpy as np

EPSILON_WATER = 0.621945  # ratio of the molar masses of water vapour and dry air; ASHRAE Fundamentals (2017) ch. 1
PERM = 5.72135e-11  # kg/(s.m2.Pa) per US perm (grain/(h.ft2.inHg)); ASHRAE Fundamentals (2017) ch. 26 (from memory)


def interface_temperatures(T_outer, T_inner, resistances):
    """Steady temperatures at the interfaces between layers in series.

    Parameters
    ----------
    T_outer : float or array [K]
        Temperature of the outer surface of the first layer.
    T_inner : float or array [K]
        Temperature of the inner surface of the last layer.
    resistances : sequence of float [m2.K/W]
        Thermal resistance of each layer, from the outside in.

    Returns
    -------
    T : array [K]
        Temperature at each interface, from the outside in: shape ``T_outer.shape + (len(resistances) - 1,)``.

    Notes
    -----
    In steady one-dimensional conduction the same heat flux crosses every layer, so the temperature
    falls across each layer in proportion to its share of the total resistance. Surface films are not
    layers here: the outer and inner surface temperatures come from the solved heat balance. A layer of
    zero resistance puts two interfaces at the same temperature.

    References
    ----------
    .. [1] ASHRAE Handbook-Fundamentals (2017), ch. 25 (steady-state temperature profile through an
       assembly: each layer's temperature drop is its share of the total resistance times the total drop)
       and ch. 27 (series resistances of an assembly).

    Examples
    --------
    Outer surface -10 degC, inner surface 20 degC, layers of 0.1, 0.2 and 0.3 m2.K/W: the flux is
    30/0.6 = 50 W/m2, so the interfaces sit at -10 + 50(0.1) = -5 degC and -10 + 50(0.3) = 5 degC
    (hand calculation):

    >>> [round(float(t) - 273.15, 6) for t in interface_temperatures(263.15, 293.15, [0.1, 0.2, 0.3])]
    [-5.0, 5.0]
    """
    R = np.asarray(resistances, dtype=float)
    if R.ndim != 1 or len(R) < 2:
        raise ValueError("resistances: give at least two layers, from the outside in")
    if np.any(R < 0) or not np.sum(R) > 0:
        raise ValueError("resistances: each layer's R must be zero or more, and the sum above zero")
    To = np.asarray(T_outer, dtype=float)[..., None]
    Ti = np.asarray(T_inner, dtype=float)[..., None]
    share = np.cumsum(R)[:-1] / np.sum(R)
    return To + (Ti - To) * share


def vapour_pressure_from_humidity_ratio(W, P):
    """Partial pressure of water vapour in moist air.

    Parameters
    ----------
    W : float or array [kg/kg]
        Humidity ratio (per kg of dry air).
    P : float or array [Pa]
        Total pressure.

    Returns
    -------
    p_w : float or array [Pa]

    References
    ----------
    .. [1] ASHRAE Handbook-Fundamentals (2017), ch. 1, eq. (20), W = 0.621945 p_w / (P - p_w), solved for p_w.

    Examples
    --------
    W = 0.01 kg/kg at 101325 Pa: p_w = 101325 (0.01) / 0.631945 (hand calculation):

    >>> round(float(vapour_pressure_from_humidity_ratio(0.01, 101325.0)), 1)
    1603.4
    """
    W = np.asarray(W, dtype=float)
    return P * W / (EPSILON_WATER + W)


def humidity_ratio_from_vapour_pressure(p_w, P):
    """Humidity ratio of moist air from the partial pressure of its water vapour.

    Parameters
    ----------
    p_w : float or array [Pa]
    P : float or array [Pa]
        Total pressure.

    Returns
    -------
    W : float or array [kg/kg]

    References
    ----------
    .. [1] ASHRAE Handbook-Fundamentals (2017), ch. 1, eq. (20).

    Examples
    --------
    The inverse of the example above:

    >>> round(float(humidity_ratio_from_vapour_pressure(1603.372, 101325.0)), 5)
    0.01
    """
    p_w = np.asarray(p_w, dtype=float)
    return EPSILON_WATER * p_w / (P - p_w)


def mixed_humidity_ratio(m_a, W_a, m_b, W_b):
    """Humidity ratio of two moist-air streams mixed together (water conserved).

    Parameters
    ----------
    m_a, m_b : float or array [kg/s]
        Dry-air mass flow of each stream.
    W_a, W_b : float or array [kg/kg]
        Humidity ratio of each stream.

    Returns
    -------
    W : float or array [kg/kg]; W_a where both flows are zero.

    References
    ----------
    .. [1] ASHRAE Handbook-Fundamentals (2017), ch. 1, adiabatic mixing of two moist airstreams (mass balance
       of the water).

    Examples
    --------
    Three parts of outdoor air at 0.001 kg/kg with one part of house air at 0.005 kg/kg:

    >>> round(float(mixed_humidity_ratio(3.0, 0.001, 1.0, 0.005)), 6)
    0.002
    """
    m_a, W_a, m_b, W_b = (np.asarray(v, dtype=float) for v in (m_a, W_a, m_b, W_b))
    m = m_a + m_b
    with np.errstate(invalid="ignore", divide="ignore"):
        return np.where(m > 0, (m_a * W_a + m_b * W_b) / np.where(m > 0, m, 1.0), W_a)


def interface_vapour_pressure(p_in, p_out, Z_in, Z_out):
    """Vapour pressure at an interface inside an assembly by steady diffusion (the dew-point method).

    Parameters
    ----------
    p_in, p_out : float or array [Pa]
        Vapour pressure of the air on the inside and on the outside.
    Z_in, Z_out : float or array [m2.s.Pa/kg]
        Vapour diffusion resistance (1 / permeance) of the layers between the interface and the inside, and
        between it and the outside.

    Returns
    -------
    p : float or array [Pa]
        Vapour pressure at the interface if no vapour condenses.

    Notes
    -----
    The vapour pressure falls across each layer in proportion to its share of the total diffusion
    resistance. Where it exceeds the saturation pressure at the interface's temperature, the method says
    vapour condenses there (Glaser). It is steady and ignores the moisture the materials store and release,
    so it is conservative for short cold spells: a negative margin means vapour arrives faster than it
    leaves, not that the assembly fails.

    References
    ----------
    .. [1] ASHRAE Handbook-Fundamentals (2017), ch. 25, the dew-point method for steady vapour diffusion.
    .. [2] Glaser, H. (1959). Graphisches Verfahren zur Untersuchung von Diffusionsvorgaengen. Kaeltetechnik
       11, 345-349.

    Examples
    --------
    Inside 800 Pa, outside 200 Pa, four times the resistance inside the interface as outside it: the
    interface sits one fifth of the way from outside, 200 + 600/5 = 320 Pa (hand calculation):

    >>> round(float(interface_vapour_pressure(800.0, 200.0, 4.0e10, 1.0e10)), 6)
    320.0
    """
    p_in, p_out, Z_in, Z_out = (np.asarray(v, dtype=float) for v in (p_in, p_out, Z_in, Z_out))
    return p_out + (p_in - p_out) * Z_out / (Z_in + Z_out)


R_FILM_DOWN = 0.92  # h.ft2.F/Btu, still air, horizontal surface, heat flowing down; ASHRAE F (2017) ch. 26 Table 10
R_FILM_UP = 0.61  # same table, heat flowing up (values from memory)
R_DRYWALL = 0.45  # h.ft2.F/Btu, 1/2 in gypsum board; ASHRAE F (2017) ch. 26 Table 1 (value from memory)


def ceiling_conductance(r_ceiling, heat_flows_up):
    """Conductance from the top of the ceiling insulation to the indoor air.

    Parameters
    ----------
    r_ceiling : float [m2.K/W]
        The insulation's R.
    heat_flows_up : bool or array
        True in heating (indoor film for upward flow), False otherwise (downward).

    Returns
    -------
    U : float or array [W/(m2.K)]
        1 / (insulation + 1/2 in drywall + indoor film), in series.

    References
    ----------
    ASHRAE Handbook-Fundamentals (2017), ch. 26, Table 1 (gypsum board) and Table 10 (still-air films); series
    resistances as in ch. 25-27 (values from memory).

    Examples
    --------
    R-30 in cooling, by hand: 1 / ((30 + 0.45 + 0.92) h.ft2.F/Btu x 0.17611) = 0.1810 W/(m2.K).

    >>> round(float(ceiling_conductance(30 * 0.17611, False)), 4)
    0.181
    """
    from attic.units import R_IP

    film = np.where(heat_flows_up, R_FILM_UP, R_FILM_DOWN)
    return 1.0 / (r_ceiling + (R_DRYWALL + film) * R_IP)
