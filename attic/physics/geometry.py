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
    pitch : str or float [-] or [deg]
        "N/12" (rise in 12 of run, e.g. "6/12"), or a number of degrees.

    Returns
    -------
    tilt : float [rad]

    Raises
    ------
    ValueError
        If the text is not "N/12" or the tilt is not between 1 and 60 degrees.

    References
    ----------
    Definition of roof pitch (rise over a 12-unit run): tilt = atan(rise/12); fact of the trade.

    Examples
    --------
    A 6/12 roof rises 6 in 12, so by hand tilt = atan(0.5) = 26.57 degrees; 12/12 is 45 degrees:

    >>> import math
    >>> round(math.degrees(parse_pitch("6/12")), 2)
    26.57
    >>> round(math.degrees(parse_pitch("12/12")), 6)
    45.0
    >>> round(math.degrees(parse_pitch(30)), 6)
    30.0
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
    floor_area : float [m2]
    span : float [m]
        Width of the floor across the ridge.
    tilt : float [rad]
    ridge_azimuth : float [deg]
        Clockwise from north, the direction along which the ridge runs.

    References
    ----------
    Plane geometry of a triangular prism; view factors by Hottel's crossed strings
    (attic.physics.radiation.view_factors_triangle).

    Examples
    --------
    A 100 m2 floor 10 m across under a 6/12 roof, ridge running east-west. By hand: the ridge
    stands 5 x 0.5 = 2.5 m high, each plane is sqrt(5^2 + 2.5^2) = 5.590 m from eave to ridge
    and 10 m long, and the prism holds 0.5 x 10 x 2.5 x 10 = 125 m3:

    >>> import math
    >>> g = GableAttic(100.0, 10.0, math.atan(0.5), 90.0)
    >>> round(g.ridge_height, 6), round(g.slope_length, 3), round(g.plane_area, 2), round(g.volume, 6)
    (2.5, 5.59, 55.9, 125.0)
    >>> g.plane_azimuths
    (180.0, 0.0)
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
