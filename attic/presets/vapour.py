"""Typical vapour permeability of deck insulation, and of what lies above the sheathing's inner face.

Used only to judge whether indoor water vapour reaches the sheathing of an unvented deck whose
insulation is all air-impermeable (it gets there by diffusion, not with air). Rated values for the
product installed beat these; the case file can give the layer's permeance instead.
"""

from __future__ import annotations

from dataclasses import dataclass


@dataclass(frozen=True)
class Foam:
    """permeability_perm_in : US perm·in (permeance of a 1 in layer); r_per_in : h·ft²·°F/Btu per inch."""

    permeability_perm_in: float
    r_per_in: float
    source: str


FOAMS = {
    # about 1 perm at 2 in: the thickness at which closed-cell foam is usually taken as a Class II retarder
    "closed-cell": Foam(2.0, 6.5, "2 lb/ft3 closed-cell spray foam (typical; values from memory)"),
    "open-cell": Foam(50.0, 3.7, "0.5 lb/ft3 open-cell spray foam, about 10-15 perm at 3.5-5 in "
                                 "(typical; values from memory)"),
    "rigid-board": Foam(1.1, 5.0, "extruded polystyrene board, unfaced (typical; values from memory); "
                                  "foil-faced boards are far tighter"),
}

# The sheathing (1/2 in plywood or 7/16 in OSB, about 1 perm dry cup) in series with underlayment and
# shingles (about 1 perm): vapour that reaches the sheathing leaves outward through about 0.5 perm.
# Values from memory; a vapour-closed membrane or metal roofing is far tighter (so it is worse here).
EXTERIOR_PERMEANCE_PERM = 0.5


def foam_permeance_perm(kind, r_value_ip):
    """Permeance (US perm) of a layer of `kind` ("closed-cell", "open-cell", "rigid-board") of R `r_value_ip`."""
    f = FOAMS[kind]
    inches = max(r_value_ip / f.r_per_in, 1e-3)
    return f.permeability_perm_in / inches
