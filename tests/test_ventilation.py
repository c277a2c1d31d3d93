import numpy as np
import pytest

from attic.physics.atmosphere import G
from attic.physics.ventilation import combined_flow, openings_in_series, stack_flow, wind_flow


def test_series_of_equal_openings():
    # 1/A^2 = 1/A1^2 + 1/A2^2 (orifices in series): equal areas give A/sqrt(2)
    assert openings_in_series(2.0, 2.0) == pytest.approx(2.0 / np.sqrt(2.0))
    assert openings_in_series(1.0, 0.0) == 0.0


def test_stack_flow_equals_ashrae_neutral_plane_form_for_balanced_vents():
    # ASHRAE Handbook-Fundamentals (2017) ch. 16 eq. (38): Q = C_D A sqrt(2 g dH_NPL (Ti - To)/Ti), A the
    # inlet area; with equal inlet and outlet the neutral plane is at mid-height, dH_NPL = H/2.
    A, H, Ti, To = 0.5, 2.4, 330.0, 305.0
    ashrae = 0.65 * A * np.sqrt(2 * G * (H / 2) * (Ti - To) / Ti)
    ours = stack_flow(openings_in_series(A, A), H, Ti, To, 0.65)
    assert ours == pytest.approx(ashrae, rel=1e-6)


def test_stack_flow_grows_with_square_root_of_temperature_difference():
    q1 = stack_flow(0.4, 2.0, 320.0, 300.0)
    q4 = stack_flow(0.4, 2.0, 380.0, 300.0)
    # ASHRAE ch. 16 eq. (38): Q ~ sqrt(dT/Ti)
    assert q4 / q1 == pytest.approx(np.sqrt((80 / 380) / (20 / 320)), rel=1e-4)


def test_wind_flow_scales_with_area_and_speed():
    # ASHRAE ch. 16 eq. (37), Q = C_v A U: no wind, no flow; twice the area or twice the wind, twice the flow
    assert wind_flow(0.5, 0.0) == 0.0
    assert wind_flow(1.0, 4.0) == pytest.approx(2.0 * wind_flow(0.5, 4.0))
    assert wind_flow(0.5, 8.0) == pytest.approx(2.0 * wind_flow(0.5, 4.0))
    # the default effectiveness lies in ASHRAE's range for diagonal winds, 0.25-0.35
    assert 0.25 <= wind_flow(1.0, 1.0) <= 0.35


def test_combined_flow_limits():
    # ASHRAE ch. 16 eq. (40): either driving force alone gives its own flow; together, more than the larger
    # and less than the sum
    assert combined_flow(0.3, 0.0) == pytest.approx(0.3)
    assert combined_flow(0.0, 0.4) == pytest.approx(0.4)
    both = combined_flow(0.3, 0.4)
    assert 0.4 < both < 0.7
