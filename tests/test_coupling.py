"""Ducts coupled to the attic: moving them inside, and the regain of an unvented attic."""

import pytest

from helpers import solve_case

INSIDE = {"duct.*.location": "conditioned"}


def test_moving_ducts_inside_saves_the_duct_load_less_the_warmer_attic():
    # With the ducts in the attic, their cold surfaces and supply leaks cool the attic air; moved inside,
    # that sink is gone, the attic warms and the ceiling gains a little more. So the equipment load drops by
    # the attic case's duct load minus the rise in ceiling gain - exactly, since nothing else changes.
    att = solve_case(with_ducts=True)
    ins = solve_case(INSIDE, with_ducts=True)
    assert ins.attic.air_K > att.attic.air_K
    rise = ins.house.ceiling_w - att.house.ceiling_w
    assert rise > 0
    saved = att.house.equipment_w - ins.house.equipment_w
    assert ins.house.ducts_w == pytest.approx(0.0, abs=1e-6)
    assert saved == pytest.approx(att.house.ducts_w - rise, abs=1e-6)
    assert saved < att.house.ducts_w


def test_ducts_in_conditioned_space_put_nothing_into_the_attic():
    r = solve_case(INSIDE, with_ducts=True)
    f = r.attic.heat_flows_w
    assert f["ducts_from_air"] == 0 and f["ducts_from_surfaces"] == 0 and f["supply_leak_into_attic"] == 0
    assert all(s.gain_w == 0 for s in r.ducts.segments)


def test_unvented_attic_regains_part_of_the_duct_loss():
    # In a vented attic a supply leak is lost outdoors; in an unvented one it cools the attic, which then
    # sends less heat to the house: the same extra leakage costs less equipment load.
    def extra(attic):
        tight = solve_case({**attic, "leakage.supply_fraction": 0.0}, with_ducts=True).house.equipment_w
        leaky = solve_case({**attic, "leakage.supply_fraction": 0.15}, with_ducts=True).house.equipment_w
        return leaky - tight

    vented = extra({})
    unvented = extra({"attic.type": "unvented", "roof.deck_r": 20, "attic.ceiling_r": 0})
    assert 0 < unvented < vented


def test_leaky_cold_ducts_cool_a_vented_attic():
    tight = solve_case({"leakage.supply_fraction": 0.0}, with_ducts=True).attic.air_K
    leaky = solve_case({"leakage.supply_fraction": 0.15}, with_ducts=True).attic.air_K
    assert leaky < tight


def test_house_totals_add_up():
    h = solve_case(with_ducts=True).house
    assert h.house_w == pytest.approx(h.base_sensible_w + h.base_latent_w + h.ceiling_w + h.attic_air_sensible_w
                                      + h.attic_air_latent_w)
    assert h.equipment_w == pytest.approx(h.house_w / h.delivery_effectiveness)
    assert h.tons == pytest.approx(h.equipment_w / 0.29307107 / 12000.0)
