"""The code's own temperature criterion for the condensing surface of an unvented attic."""

from __future__ import annotations

# IRC (2018) Table R806.5, footnote b, as quoted second-hand (not read in the code book here): "sufficient
# insulation shall be installed directly above the structural roof sheathing to maintain the monthly
# average temperature of the underside of the structural roof sheathing above 45°F. For calculation purposes,
# an interior air temperature of 68°F is assumed and the exterior air temperature is assumed to be the
# monthly average outside air temperature of the three coldest months." The 2006 IRC R806.4 put it as the
# condensing surface above 45°F on average in the coldest month. Check the edition your jurisdiction adopted.
CONDENSING_SURFACE_MIN_F = 45.0
CRITERION_INDOOR_F = 68.0
CRITERION_SOURCE = "IRC 2018 Table R806.5 note b (monthly mean of the condensing surface above 45 °F)"
COLDEST_MONTHS = 3
