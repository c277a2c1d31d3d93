"""What every code rule shares: the verdict record, the deferral to the adopted edition, the printed line.

Each rule names the code, edition and section it paraphrases. Values recalled rather than read
are marked "from memory". The codes are paraphrased, not quoted: the adopted edition and local
amendments govern, and every rule's text ends by saying so.
"""

from __future__ import annotations

from dataclasses import asdict, dataclass

DEFER = "Check the edition your jurisdiction adopted; local amendments govern."


@dataclass(frozen=True)
class RuleResult:
    """One rule's verdict. verdict: "pass", "fail" or "n/a"."""

    rule: str
    source: str
    provided: str
    required: str
    verdict: str
    fix: str = ""
    note: str = DEFER

    def to_dict(self):
        return asdict(self)


def ip(value_si, unit):
    """A Case's SI value in the IP unit the code states, cleared of the last-digit noise of the round trip.

    The codes compare and print IP numbers the user typed (6.875 ft² must print as 6.88, not 6.87);
    12 significant digits keep every digit a case file can hold and drop the conversion's noise.

    Examples
    --------
    >>> ip(6.875 * 0.09290304, 0.09290304)
    6.875
    """
    return float(f"{value_si / unit:.12g}")


def check_lines(name, results):
    """One line of text (rich markup) per rule."""
    style = {"pass": "green", "fail": "bold red", "n/a": "dim"}
    lines = [f"[bold]Code checks — {name}[/bold]"]
    for r in results:
        line = (f"[{style[r.verdict]}]{r.verdict.upper():4s}[/] {r.rule} [dim]({r.source})[/dim]: "
                f"has {r.provided}; requires {r.required}.")
        if r.fix:
            line += f" [bold]Fix:[/bold] {r.fix}."
        if r.note != DEFER:
            line += f" {r.note.replace(DEFER, '').strip()}"
        lines.append(line + f" [dim]{DEFER}[/dim]")
    return lines
