"""Code-check results as short terminal lines (rich markup). Reads RuleResult objects; computes nothing."""

from __future__ import annotations

import re

from attic.codes.rules import DEFER

_SHORT = (  # (start of the rule's text, short name)
    ("Attic ventilation", "vent area"),
    ("Intake (low) vent area", "intake vs exhaust vents"),
    ("Unvented attic: air-impermeable", "unvented: deck insulation"),
    ("Unvented attic: combustion", "unvented: combustion appliances"),
    ("Duct leakage", "duct leakage"),
    ("Roof deck in winter", "roof deck in winter"),
)

_STYLE = {"pass": "green", "fail": "bold red", "n/a": "dim"}


def short_rule(rule):
    """A few words for a rule: 'vent area', 'duct R "return"', ..."""
    for start, name in _SHORT:
        if rule.startswith(start):
            return name
    m = re.match(r'Duct insulation: "(.+?)"', rule)
    if m:
        return f'duct R "{m.group(1)}"'
    m = re.match(r"Air handler airflow .*\((cooling|heating)\)$", rule)
    if m:
        return f"air handler, {m.group(1)}"
    return rule.split(":")[0]


def _clip(text):
    """The head of a has/needs text: before any bracket or semicolon. Never cut inside it: a requirement read to
    its middle ("needs sealed-combustion or ...") hides the half that matters, so a long one wraps instead."""
    return re.split(r" \(|; ", text)[0]


def _has(text):
    """'has X', or the text alone where it says nothing is there ('not described in the case')."""
    return text if text.startswith("not described") else f"has {text}"


def short_line(r):
    """'PASS vent area (IRC 2021 R806.2): has 14.62 ft²; needs 7.00 ft² at 1/300 of 2100 ft²': the first clause of
    each side, whole."""
    from rich.markup import escape

    source = "rule of thumb" if r.source.startswith("rule of thumb") else r.source  # --verbose says the rest
    head = f"{r.verdict.upper():4s} {short_rule(r.rule)} ({source})"
    has, need = _clip(r.provided), _clip(r.required)
    plain = f"{head}: {_has(has)}; needs {need}" if need != "-" else f"{head}: {has}"
    return f"[{_STYLE[r.verdict]}]{escape(plain[:4])}[/]{escape(plain[4:])}"


def check_lines(name, results, verbose=False):
    """Lines of rich markup for one case's rules: one short line each, the fix indented under a failure.

    verbose: each rule's full text, its note and the deferral to the adopted edition after every rule (the
    short form says the deferral once, after all the rules)."""
    from rich.markup import escape

    lines = [f"[bold]Code checks — {escape(name)}[/bold]"]
    for r in results:
        if verbose:
            needs = f"; requires {escape(r.required)}" if r.required != "-" else ""
            lines.append(f"[{_STYLE[r.verdict]}]{r.verdict.upper():4s}[/] {escape(r.rule)} [dim]({escape(r.source)})"
                         f"[/dim]: {escape(_has(r.provided))}{needs}.")
            note = r.note.replace(DEFER, "").strip()
            if note:
                lines.append(f"     {escape(note)}")
            if not (r.fix and r.verdict == "fail"):
                lines[-1] += f" [dim]{escape(DEFER)}[/dim]"
        else:
            lines.append(short_line(r))
        if r.fix and r.verdict == "fail":
            fix = r.fix if r.fix.endswith((".", ")")) or not verbose else r.fix + "."  # a sentence before the next
            lines.append(f"     [bold]fix:[/bold] {escape(fix)}")
            if verbose:
                lines[-1] += f" [dim]{escape(DEFER)}[/dim]"
    return lines
