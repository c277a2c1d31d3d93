"""README's "Use" block runs as written: every command, in order, in a fresh folder, with the exit code the
README gives it (0 unless its comment says otherwise)."""

import re
import shlex
import shutil
from pathlib import Path

from typer.testing import CliRunner

from attic.cli import app

ROOT = Path(__file__).resolve().parent.parent


def use_commands():
    text = (ROOT / "README.md").read_text(encoding="utf-8")
    block = text.split("## Use", 1)[1].split("```bash", 1)[1].split("```", 1)[0]
    lines = block.replace("\\\n", " ").splitlines()
    out = []
    for line in lines:
        if not line.strip():
            continue
        argv = shlex.split(line, comments=True)
        comment = line.split("#", 1)[1] if "#" in line else ""
        assert argv[0] == "atticduct", line
        out.append((argv[1:], comment))
    return out


def test_the_use_block_is_found():
    cmds = [a[0] for a, _ in use_commands()]
    for name in ("demo", "new", "run", "check", "keys", "compare", "sweep", "pick", "report", "day", "year"):
        assert name in cmds


def test_every_command_of_the_use_block_runs_as_written(tmp_path, monkeypatch):
    monkeypatch.chdir(tmp_path)
    shutil.copy(ROOT / "cases" / "demo-weather.csv", tmp_path / "weather.csv")
    runner = CliRunner()
    for argv, comment in use_commands():
        res = runner.invoke(app, argv)
        # a comment that says "exit 1 if/when ..." documents a possible 1; the example itself must succeed
        assert res.exit_code == 0, (argv, comment, res.output[-2000:])
        assert "Traceback" not in res.output
    written = {p.name for p in tmp_path.iterdir()}
    for name in re.findall(r"(?:-o|--plot) (\S+)", " ".join(" ".join(a) for a, _ in use_commands())):
        assert name in written, name


def test_the_readme_demo_table_is_what_the_demo_prints():
    text = (ROOT / "README.md").read_text(encoding="utf-8")
    after = text.split("(`atticduct demo -n base`):", 1)[1]
    shown = after.split("```\n", 2)[1]
    res = CliRunner().invoke(app, ["demo", "-n", "base"], env={"COLUMNS": "80"})
    assert res.exit_code == 0
    # the solver's last residual sits at round-off (1e-11 W), whose digits change with the order of
    # floating-point sums (array alignment, library build): that line is checked against its limit only
    assert [_unresidual(ln) for ln in shown.splitlines()] == [_unresidual(ln) for ln in res.output.splitlines()][
        : len(shown.splitlines())]
    residuals = [float(v) for ln in res.output.splitlines() if "largest node residual" in ln
                 for v in re.findall(r"\d\.\de-\d\d", ln)]
    assert residuals and max(residuals) < 0.1  # attic.network.solve.RESIDUAL_LIMIT_W


def _unresidual(line):
    line = line.rstrip()
    return re.sub(r"\d\.\de-\d\d", "<round-off>", line) if "largest node residual" in line else line


def test_developers_guide_stands_alone():
    # an outside contributor has only the repository: no path outside it, and every file it names exists
    text = (ROOT / "DEVELOPERS.md").read_text(encoding="utf-8")
    assert "../" not in text and "DESIGN.md" not in text
    for path in set(re.findall(r"`((?:attic|ducts|tests|cases)/[\w./]+\.(?:py|toml|md))", text)):
        assert (ROOT / path.split(":")[0]).exists(), path
