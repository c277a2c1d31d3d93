"""Engineering economics of one option against the base: pure functions of dollars, years and energy.

Nothing here solves or reads a case; attic.runs.money feeds these functions the year run's energy and the
case's prices. Money is in dollars of today (constant prices, a real discount rate); energy is in the trade's
accounting units (Btu, kWh, therm), which is where a price is quoted.
"""

from __future__ import annotations

import math

BTU_PER_THERM = 100_000.0  # the US therm is 100,000 Btu (fact of the trade)
BTU_PER_KWH = 3.6e6 / 1055.05585  # 3,412.14 Btu (IT) per kWh (NIST SP 811, 2008)


def uniform_series_present_worth(rate, years):
    """Uniform-series present-worth factor (P/A, i, n): today's value of 1 $ a year for `years` years.

    Parameters
    ----------
    rate : float [1/year]
        Discount rate i per year, 0 allowed.
    years : int [year]
        Number of end-of-year payments n.

    Returns
    -------
    factor : float [year]
        (P/A, i, n) = ((1 + i)^n - 1) / (i (1 + i)^n); n when i = 0 (the limit, the plain sum).

    References
    ----------
    Newnan, Eschenbach & Lavelle, Engineering Economic Analysis, ch. 4, "uniform series present worth factor"
    (P/A, i, n) and its compound interest tables (value from memory). The same factor is the present-worth
    term of the life-cycle cost in ASHRAE Handbook-HVAC Applications, ch. "Owning and Operating Costs".

    Examples
    --------
    The interest tables give (P/A, 10 %, 10) = 6.1446 and (P/A, 5 %, 20) = 12.4622 (value from memory):

    >>> round(uniform_series_present_worth(0.10, 10), 4)
    6.1446
    >>> round(uniform_series_present_worth(0.05, 20), 4)
    12.4622
    >>> uniform_series_present_worth(0.0, 15)
    15.0
    """
    if years < 0:
        raise ValueError(f"years {years}: must be 0 or more")
    if rate <= -1.0:
        raise ValueError(f"rate {rate}: must be above -1")
    if rate == 0.0:
        return float(years)
    # (1 - (1 + i)^-n) / i, the same factor, through expm1/log1p so a tiny rate does not cancel to 0
    return -math.expm1(-years * math.log1p(rate)) / rate


def equipment_credit(base_tons, variant_tons, cost_per_ton):
    """First cost saved by smaller cooling equipment: the fall in design tons times the cost per ton.

    Parameters
    ----------
    base_tons, variant_tons : float [ton]
        Equipment load of the base and of the variant at the cooling design condition.
    cost_per_ton : float [$/ton]

    Returns
    -------
    credit : float [$]
        (base_tons - variant_tons) x cost_per_ton when the variant lowers the tons, else 0: an option that
        raises the load is not charged here (its running cost shows in the annual figures).

    References
    ----------
    Definition of the issue this implements (no published method); equipment is priced per ton of cooling
    in common practice, no source.

    Examples
    --------
    3.50 tons down to 3.00 at 1,800 $/ton is 0.5 x 1,800 = 900 $:

    >>> round(equipment_credit(3.50, 3.00, 1800.0), 6)
    900.0
    >>> equipment_credit(3.0, 3.2, 1800.0)
    0.0
    """
    return max(0.0, float(base_tons) - float(variant_tons)) * float(cost_per_ton)


def simple_payback(net_first_cost, annual_saving):
    """Years for undiscounted savings to repay the net first cost.

    Parameters
    ----------
    net_first_cost : float [$]
        First cost less any equipment credit; 0 or less means the option costs nothing up front.
    annual_saving : float [$/year]

    Returns
    -------
    payback : float or None [year]
        net_first_cost / annual_saving; 0 when it costs nothing and saves something (it pays back at once);
        None when it saves nothing (it never pays back).

    References
    ----------
    Newnan, Eschenbach & Lavelle, Engineering Economic Analysis, ch. "Payback period" (value from memory).

    Examples
    --------
    1,200 $ saving 150 $ a year: 1,200 / 150 = 8 years.

    >>> simple_payback(1200.0, 150.0)
    8.0
    >>> simple_payback(-300.0, 40.0)
    0.0
    >>> simple_payback(500.0, 0.0) is None
    True
    """
    if annual_saving <= 0.0:
        return None
    return max(0.0, net_first_cost) / annual_saving


def net_present_value(net_first_cost, annual_saving, rate, years):
    """Present value of choosing the option: its savings over the life, discounted, less its net first cost.

    Parameters
    ----------
    net_first_cost : float [$]
    annual_saving : float [$/year]
        A uniform end-of-year saving (negative: the option costs more to run).
    rate : float [1/year]
    years : int [year]

    Returns
    -------
    pv : float [$]
        -net_first_cost + annual_saving x (P/A, i, n); positive means the option pays over its life.

    References
    ----------
    Newnan, Eschenbach & Lavelle, Engineering Economic Analysis, ch. 5, present worth analysis (value from memory).

    Examples
    --------
    1,000 $ saving 100 $ a year for 10 years at 10 %: -1,000 + 100 x 6.1446 = -385.54 $; at 0 % the plain sum,
    -1,000 + 10 x 100 = 0 $.

    >>> round(net_present_value(1000.0, 100.0, 0.10, 10), 2)
    -385.54
    >>> net_present_value(1000.0, 100.0, 0.0, 10)
    0.0
    """
    return -float(net_first_cost) + float(annual_saving) * uniform_series_present_worth(rate, years)


def cumulative_cash_flow(net_first_cost, annual_saving, rate, years):
    """Discounted cumulative cash flow at the end of each year 0..years; the last entry is the present value.

    Parameters
    ----------
    net_first_cost : float [$]
    annual_saving : float [$/year]
    rate : float [1/year]
    years : int [year]

    Returns
    -------
    flows : list of float [$], years + 1 entries
        -net_first_cost + annual_saving x (P/A, i, t) for t = 0..years.

    References
    ----------
    Newnan, Eschenbach & Lavelle, Engineering Economic Analysis, ch. 4 and 5 (value from memory).

    Examples
    --------
    900 $ saving 300 $ a year, undiscounted, for 4 years:

    >>> cumulative_cash_flow(900.0, 300.0, 0.0, 4)
    [-900.0, -600.0, -300.0, 0.0, 300.0]
    """
    return [net_present_value(net_first_cost, annual_saving, rate, t) for t in range(int(years) + 1)]


def electricity_kwh(heat_btu, btu_per_wh):
    """Electricity a heat pump or air conditioner uses to move an amount of heat, from its seasonal rating.

    Parameters
    ----------
    heat_btu : float [Btu]
        Heat delivered at the coil over the season.
    btu_per_wh : float [Btu/Wh]
        SEER for cooling, HSPF for heating.

    Returns
    -------
    electricity : float [kWh]
        heat_btu / (btu_per_wh x 1,000).

    References
    ----------
    SEER and HSPF are defined as seasonal heat moved (Btu) per Wh of electricity: AHRI Standard 210/240
    (value from memory).

    Examples
    --------
    15 million Btu of cooling at SEER 15: 15e6 / 15 = 1e6 Wh = 1,000 kWh.

    >>> electricity_kwh(15e6, 15.0)
    1000.0
    """
    return float(heat_btu) / (float(btu_per_wh) * 1000.0)


def resistance_kwh(heat_btu):
    """Electricity of resistance heating: every kWh becomes 3,412 Btu of heat.

    Parameters
    ----------
    heat_btu : float [Btu]

    Returns
    -------
    electricity : float [kWh]

    References
    ----------
    1 kWh = 3.6 MJ and 1 Btu (IT) = 1,055.056 J, NIST SP 811 (2008).

    Examples
    --------
    >>> round(resistance_kwh(3412.14), 4)
    1.0
    """
    return float(heat_btu) / BTU_PER_KWH


def gas_therms(heat_btu, afue):
    """Gas a furnace burns to deliver an amount of heat, from its annual fuel utilization efficiency.

    Parameters
    ----------
    heat_btu : float [Btu]
        Heat delivered by the furnace.
    afue : float [0-1]

    Returns
    -------
    gas : float [therm]
        heat_btu / (afue x 100,000).

    References
    ----------
    AFUE is annual heat output over annual fuel energy input, ASHRAE Standard 103 (value from memory);
    1 therm = 100,000 Btu.

    Examples
    --------
    40 million Btu at AFUE 0.8: 40e6 / 0.8 / 1e5 = 500 therms.

    >>> gas_therms(40e6, 0.8)
    500.0
    """
    return float(heat_btu) / (float(afue) * BTU_PER_THERM)
