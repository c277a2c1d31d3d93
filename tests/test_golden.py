"""Byte-for-byte JSON of every shipped case, taken before a change that must not move a digit.

A refactor that changes no physics leaves these files as they are. A physics change moves them on purpose:
regenerate with ``python tests/make_golden.py`` and say in the commit message which numbers moved and why.
"""

import json
from pathlib import Path

import pytest
from make_golden import GOLDEN, golden_commands
from typer.testing import CliRunner

runner = CliRunner()


@pytest.mark.parametrize("name,args", golden_commands(), ids=[n for n, _ in golden_commands()])
def test_output_matches_the_golden_file(name, args):
    result = runner.invoke(_app(), args)
    assert result.exit_code == 0, result.output
    expected = (GOLDEN / f"{name}.json").read_text()
    # compare parsed first for a readable failure, then the exact text
    assert json.loads(result.stdout) == json.loads(expected)
    assert result.stdout == expected


def _app():
    from attic.cli import app

    return app


def test_every_shipped_case_has_a_golden_file():
    cases = {p.stem for p in (Path(__file__).parent.parent / "cases").glob("*.toml")}
    covered = {n.removeprefix("run-") for n, _ in golden_commands() if n.startswith("run-") and not n.endswith("-si")}
    assert cases <= covered
