"""The duct R models: one registry in ducts, and the case key's choices follow it."""

import pytest

from ducts.segment import round_geometry


def test_r_models_are_one_registry_and_the_case_key_follows_it():
    from attic.case.schema import SECTIONS
    from ducts.insulation import R_MODELS

    assert set(R_MODELS) == {"cylinder", "label", "ashrae152"}
    assert SECTIONS["duct"]["r_model"].choices == tuple(R_MODELS)
    with pytest.raises(ValueError, match="is not one of"):
        round_geometry(0.15, 1.0, 1.0, r_model="flat")
