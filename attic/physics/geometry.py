"""Geometry of a gable attic: roof planes, heights, cross-section and volume."""

from __future__ import annotations

import math
import re
from dataclasses import dataclass

import numpy as np

from attic.physics.radiation import view_factors_triangle

_PITCH = re.compile(r"^\s*(\d+(?:\.\d+)?)\s*/\s*12\s*$")


def parse_pitch(pitch):
    """Roof tilt from a pitch given as "rise/12" (the trade's form) or as degrees.

    Parameters
    ----------
    pitch : str like "6/12", or a number of degrees

    Returns
    -------
    tilt : float, rad

    Raises
    ------
    ValueError if the text is not "N/12" or the tilt is not between 1 and 60 degrees.
    """
    if isinstance(pitch, str):
        m = _PITCH.match(pitch)
        if not m:
            raise ValueError("write the pitch as rise in 12, e.g. \"6/12\", or as degrees, e.g. 26.6")
        tilt = math.atan(float(m.group(1)) / 12.0)
    else:
        tilt = math.radians(float(pitch))
    if not math.radians(1.0) <= tilt <= math.radians(60.0):
        raise ValueError("the roof tilt must be between 1 and 60 degrees (about 0.25/12 to 21/12)")
    return tilt


@dataclass(frozen=True)
class GableAttic:
    """A symmetric gable attic over a rectangular floor (SI).

    Attributes
    ----------
    floor_area : m2
    span : m, width of the floor across the ridge
    tilt : rad
    ridge_azimuth : degrees clockwise from north along which the ridge runs
    """

    floor_area: float
    span: float
    tilt: float
    ridge_azimuth: float

    @property
    def length(self):
        """Length along the ridge, m."""
        return self.floor_area / self.span

    @property
    def slope_length(self):
        """Eave-to-ridge length of one roof plane, m."""
        return (self.span / 2.0) / math.cos(self.tilt)

    @property
    def ridge_height(self):
        """Height of the ridge above the attic floor, m."""
        return (self.span / 2.0) * math.tan(self.tilt)

    @property
    def plane_area(self):
        """Area of one roof plane, m2."""
        return self.slope_length * self.length

    @property
    def volume(self):
        """Attic air volume, m3 (triangular prism; gable ends vertical)."""
        return 0.5 * self.span * self.ridge_height * self.length

    @property
    def plane_azimuths(self):
        """Azimuths the two roof planes face, degrees clockwise from north."""
        return ((self.ridge_azimuth + 90.0) % 360.0, (self.ridge_azimuth + 270.0) % 360.0)

    def view_factors(self):
        """Radiation view factors among [plane 1, plane 2, floor], from the cross-section."""
        s = self.slope_length
        return view_factors_triangle([s, s, self.span])

    def areas(self):
        """Areas of [plane 1, plane 2, floor], m2."""
        return np.array([self.plane_area, self.plane_area, self.floor_area])
