"""Write tests/golden/*.json from the current code: ``python tests/make_golden.py``.

Run it only when a change is meant to move numbers, and say which moved in the commit message.
"""

from pathlib import Path

ROOT = Path(__file__).resolve().parent.parent
GOLDEN = Path(__file__).resolve().parent / "golden"


def golden_commands():
    """(name, argv) for every golden file."""
    cases = sorted((ROOT / "cases").glob("*.toml")) + [ROOT / "attic" / "data" / "starter.toml"]
    out = []
    for c in cases:
        out.append((f"run-{c.stem}", ["run", str(c), "-f", "json"]))
        out.append((f"run-{c.stem}-si", ["run", str(c), "-f", "json", "-u", "si"]))
        out.append((f"check-{c.stem}", ["check", str(c), "-f", "json"]))
    demo = str(ROOT / "cases" / "demo.toml")
    out.append(("compare-demo", ["compare", demo, "-f", "json"]))
    out.append(("day-demo", ["day", demo, "-f", "json"]))
    out.append(("day-mass-demo", ["day", demo, "-f", "json", "--mass"]))
    weather = str(ROOT / "cases" / "demo-weather.csv")
    out.append(("year-demo", ["year", demo, "--weather", weather, "-f", "json"]))
    out.append(("compare-money-demo", ["compare", demo, "--weather", weather, "-f", "json"]))
    return out


def main():
    from typer.testing import CliRunner

    from attic.cli import app

    runner = CliRunner()
    GOLDEN.mkdir(exist_ok=True)
    for name, args in golden_commands():
        result = runner.invoke(app, args)
        if result.exit_code != 0:
            raise SystemExit(f"{name}: exit {result.exit_code}\n{result.output}")
        (GOLDEN / f"{name}.json").write_text(result.stdout)
        print("wrote", name)


if __name__ == "__main__":
    main()
