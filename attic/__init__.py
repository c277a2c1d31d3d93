"""atticduct: how hot an attic gets, what the ducts in it gain, and the house load they add.

From Python (every result is frozen, SI inside, with ``to_dict()``; hours and points also ``to_frame()``)::

    import attic
    base, *variants = attic.read_case("cases/demo.toml")
    results = attic.design_conditions(base)          # cooling and heating design conditions
    day = attic.design_day(base).to_frame()          # 24 hours, pandas
    table = attic.compare([base, *variants]).to_frame()

The layers, from the bottom up (docs/architecture.md): ``physics`` (pure functions of published equations),
``presets`` (typical values), ``case`` (the case file to a frozen Case), ``network`` (the attic's node network and
its solvers), ``codes`` (IRC/IECC rules), ``runs`` (a condition, the design day, a year, studies), ``present``
(output contract, tables, plots, report), ``api`` (this face) and ``cli``. ``ducts`` stands alone beside them.
"""

__version__ = "0.1.0"

from attic.api import (  # noqa: E402  (the version first, for tools that read it without importing more)
    check_codes,
    compare,
    design_conditions,
    design_day,
    design_frame,
    money,
    read_case,
    read_weather,
    sweep,
    year,
)

__all__ = [
    "__version__", "check_codes", "compare", "design_conditions", "design_day", "design_frame", "money", "read_case",
    "read_weather", "sweep", "year",
]
