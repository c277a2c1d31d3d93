"""Run the Examples sections of the physics modules: each is a check value from its source."""

import doctest
import importlib

import pytest


@pytest.mark.parametrize("module", ["attic.physics.convection", "attic.physics.channel"])
def test_examples(module):
    result = doctest.testmod(importlib.import_module(module))
    assert result.attempted > 0 and result.failed == 0
