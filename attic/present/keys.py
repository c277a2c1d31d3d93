"""The case-file keys as a reference: terminal tables (rich) or Markdown (README). Reads the schema only."""

from __future__ import annotations

VARIANT_NOTE = ('`name` (text) and `set`, a table of dotted key paths to new values, e.g. '
                '`set = { "roof.deck_r" = 20, "duct.*.r_value" = 8 }` (`duct.*` all ducts, `duct.NAME` one; `money.*` '
                'cannot be set by a variant), and `cost` ($, from -500000 to 500000): the installed first cost of '
                'the variant against the base (negative: cheaper), needed when the case has [money].')

UNCERTAINTY_NOTE = ('optional, for `uncertainty` (and a section of `report`): any number key by its dotted path, '
                    'quoted, with a distribution: `{ uniform = [MIN, MAX] }`, `{ triangular = [MIN, MODE, MAX] }` or '
                    '`{ normal = [MEAN, SD], min = ..., max = ... }` (min and max optional), or '
                    '`{ scale = { ... } }` to multiply the case\'s own value, e.g. '
                    '`"duct.*.r_value" = { scale = { uniform = [0.75, 1.0] } }`.')


def _heading(sec):
    return {"": "top level", "duct": "[[duct]] (one table per duct run)"}.get(sec, f"[{sec}]")


def _default(key):
    from attic.case.schema import REQUIRED

    if key.default is REQUIRED:
        return "required"
    if key.default is None:
        return "—"
    if isinstance(key.default, bool):
        return "true" if key.default else "false"
    return str(key.default)


def _accepts(key):
    """What the key accepts, without repeating the unit the unit column already gives."""
    text = key.allowed()
    if key.unit and text.endswith(" " + key.unit):
        text = text[: -len(key.unit) - 1]
    return text


def keys_markdown():
    from attic.case.schema import SECTIONS

    lines = []
    for sec, ks in SECTIONS.items():
        lines.append(f"\n**{_heading(sec)}**\n")
        lines.append("| key | unit | default | accepts | meaning |")
        lines.append("|---|---|---|---|---|")
        for k, key in ks.items():
            d = _default(key)
            d = d if d in ("required", "—") else f"`{d}`"
            lines.append(f"| `{k}` | {key.unit} | {d} | {_accepts(key)} | {key.doc} |")
    lines.append(f"\n**[[variant]]**: {VARIANT_NOTE}")
    lines.append(f"\n**[uncertainty]**: {UNCERTAINTY_NOTE}")
    return "\n".join(lines)


NARROW = 110  # columns below which a five-column table breaks its words: one block per key instead


def keys_tables(width=200):
    """One rich Table per section, then the variant and uncertainty notes; in a terminal narrower than NARROW,
    one short paragraph per key (key, unit, default, what it accepts, meaning) under each section's heading."""
    from rich.markup import escape
    from rich.table import Table

    out = []
    if width < NARROW:
        from rich.padding import Padding

        for sec, ks in _sections():
            out.append(f"[bold]{escape(_heading(sec))}[/bold]")
            for k, key in ks.items():
                unit = f", {key.unit}" if key.unit else ""
                d = _default(key)
                given = d if d == "required" else "optional" if d == "—" else f"default {d}"
                out.append(Padding(f"[bold]{escape(k)}[/bold]{escape(unit)} ({escape(given)}): "
                                   f"{escape(_accepts(key))}. {escape(key.doc)}", (0, 0, 0, 2)))
            out.append("")
        out.append(escape("[[variant]]: " + VARIANT_NOTE.replace("`", "")))
        out.append(escape("[uncertainty]: " + UNCERTAINTY_NOTE.replace("`", "")))
        return out
    for sec, ks in _sections():
        t = Table(title=escape(_heading(sec)), title_justify="left", show_lines=False)
        t.add_column("key", style="bold", no_wrap=True)
        t.add_column("unit", no_wrap=True)
        # a preset name is typed into the case file: where the column is narrow it folds, never ends in "…"
        t.add_column("default", overflow="fold")
        t.add_column("accepts", ratio=2, overflow="fold")
        t.add_column("meaning", ratio=3, overflow="fold")  # a key named in the text must read whole
        for k, key in ks.items():
            t.add_row(escape(k), escape(key.unit), escape(_default(key)), escape(_accepts(key)), escape(key.doc))
        out.append(t)
    out.append(escape("[[variant]]: " + VARIANT_NOTE.replace("`", "")))
    out.append(escape("[uncertainty]: " + UNCERTAINTY_NOTE.replace("`", "")))
    return out


def _sections():
    from attic.case.schema import SECTIONS

    return SECTIONS.items()
