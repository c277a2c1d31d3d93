"""How a duct's labelled insulation R performs: one registry of named models, each a function.

A model turns a duct's cross-section and its label R into a SegmentGeometry: the resistance of
the wall per unit length and the outer perimeter. Add a model by writing its function and one
line in R_MODELS; the case key `duct.r_model` takes its allowed values from that registry.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

import numpy as np

from ducts.arrays import scalar_or_array

# Conductivity of flex-duct fiberglass, W/(m.K): 0.357 Btu.in/(h.ft2.F). With it the
# cylindrical model reproduces Palmiter & Kruse (2006): a 6-in core with labels
# performs at and R-5.62 (core area, films excluded). See tests/test_duct_segment.py.
FLEX_INSULATION_CONDUCTIVITY = 0.357 * 0.1441314

# ASHRAE Standard 152 (2004) takes a duct's R as the insulation's rated R plus a fixed allowance for
# the air films, 0.7 h.ft2.F/Btu, on the outer surface area (value from memory). In SI m2.K/W.
STD152_FILM_R = 0.7 * 0.09290304 * (5.0 / 9.0) / 0.29307107


@dataclass(frozen=True)
class SegmentGeometry:
    """Cross-section of a duct run and its insulation (SI).

    Attributes
    ----------
    length : m
    inner_perimeter : m
    flow_area : m2
    hydraulic_diameter : m
    insulation_resistance : m.K/W, per unit length, of the insulation alone (or of the whole wall
        when films_included)
    outer_perimeter : m
    films_included : bool, True when insulation_resistance already holds the air films (ASHRAE 152's
        fixed allowance), so the computed inside and outside films add nothing to it
    """

    length: float
    inner_perimeter: float
    flow_area: float
    hydraulic_diameter: float
    insulation_resistance: float
    outer_perimeter: float
    films_included: bool = False

    @property
    def outer_diameter(self):
        """Diameter of a cylinder with the same outer perimeter, m (for the outside film)."""
        return self.outer_perimeter / math.pi

    @property
    def outer_area(self):
        """Outer surface of one run, m2."""
        return self.outer_perimeter * self.length


@dataclass(frozen=True)
class Section:
    """The bare duct's cross-section (SI): round (diameter) or rectangular (width, height)."""

    diameter: float | None = None
    width: float | None = None
    height: float | None = None

    @property
    def inner_perimeter(self):
        if self.diameter is not None:
            return math.pi * self.diameter
        return 2.0 * (self.width + self.height)

    @property
    def flow_area(self):
        if self.diameter is not None:
            return math.pi * self.diameter**2 / 4.0
        return self.width * self.height

    @property
    def hydraulic_diameter(self):
        if self.diameter is not None:
            return self.diameter
        return 4.0 * self.flow_area / self.inner_perimeter

    def outer_perimeter(self, thickness):
        """Perimeter of the jacket over insulation of this thickness [m]."""
        if self.diameter is not None:
            return math.pi * (self.diameter + 2.0 * thickness)
        return self.inner_perimeter + 2.0 * math.pi * thickness


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


def _geometry(section, length, R_per_length, thickness, films_included=False):
    return SegmentGeometry(length, section.inner_perimeter, section.flow_area, section.hydraulic_diameter,
                           R_per_length, section.outer_perimeter(thickness), films_included)


def cylinder_wrap(section, length, r_label, conductivity=FLEX_INSULATION_CONDUCTIVITY):
    """Installed R of insulation wrapped round the duct: a shell of thickness r_label * k.

    Round ducts: a cylindrical shell (Palmiter & Kruse 2006). Rectangular ducts: flat on the
    perimeter at mid-thickness (corners rounded). The computed films are added in segment_transfer.

    Parameters
    ----------
    section : Section
    length : float or array [m]
    r_label : float or array [m2.K/W], the R printed on the jacket (measured flat)
    conductivity : float or array [W/(m.K)], of the insulation

    References
    ----------
    Palmiter, L. and Kruse, E. (2006). True R-values of round residential ductwork. ACEEE Summer Study.
    """
    t = r_label * conductivity
    if section.diameter is not None:
        if np.ndim(t) == 0:
            R = cylindrical_shell_resistance(section.diameter, t, conductivity) if t > 0 else 0.0
        else:  # rows of a duct stack: a bare duct (no thickness) has no shell, whatever its conductivity
            with np.errstate(divide="ignore", invalid="ignore"):
                R = np.where(t > 0, cylindrical_shell_resistance(section.diameter, t, conductivity), 0.0)
    else:
        R = r_label / (section.inner_perimeter + math.pi * t)
    return _geometry(section, length, R, t)


def label_on_core(section, length, r_label, conductivity=FLEX_INSULATION_CONDUCTIVITY):
    """The label R taken at face value on the core area, as if the wrap were thin.

    The insulation performs at exactly its label per unit of core surface; the computed inside and
    outside films are added in segment_transfer, as for every model that does not hold its own films.

    Parameters
    ----------
    section : Section
    length : float [m]
    r_label : float [m2.K/W]
    conductivity : float [W/(m.K)], only for the outer perimeter (the jacket sits r_label * k out)
    """
    return _geometry(section, length, r_label / section.inner_perimeter, r_label * conductivity)


def ashrae152_label(section, length, r_label, conductivity=FLEX_INSULATION_CONDUCTIVITY):
    """ASHRAE Standard 152's duct R: the rated R plus a fixed air-film allowance, on the outer surface.

    The whole wall, films included, is r_label + 0.7 h.ft2.F/Btu over the outer surface area (the
    standard's A_s); no film is computed on top.

    Parameters
    ----------
    section : Section
    length : float [m]
    r_label : float [m2.K/W]
    conductivity : float [W/(m.K)], only for the outer perimeter

    References
    ----------
    ASHRAE Standard 152 (2004), duct conduction: B = exp(-A_s / (rho c_p Q R_s)) with R_s the duct
    insulation R including air films (value from memory).
    """
    t = r_label * conductivity
    p_out = section.outer_perimeter(t)
    return _geometry(section, length, (r_label + STD152_FILM_R) / p_out, t, films_included=True)


R_MODELS = {"cylinder": cylinder_wrap, "label": label_on_core, "ashrae152": ashrae152_label}


def insulated_geometry(section, length, r_label, r_model="cylinder", conductivity=FLEX_INSULATION_CONDUCTIVITY):
    """The SegmentGeometry of a duct by the named R model (a key of R_MODELS)."""
    try:
        model = R_MODELS[r_model]
    except KeyError:
        raise ValueError(f"r_model {r_model!r} is not one of {tuple(R_MODELS)}") from None
    return model(section, length, r_label, conductivity)
