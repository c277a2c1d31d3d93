"""The target grammar of `atticduct pick`: a comparison of two arithmetic expressions over output keys.

    target     := expr COMPARATOR expr
    COMPARATOR := "<=" | ">=" | "<" | ">"
    expr       := term (("+" | "-") term)*
    term       := factor (("*" | "/") factor)*
    factor     := NUMBER | KEY | "(" expr ")" | "-" factor
    KEY        := a dotted output key, as in the CSV header: house.total_btuh, attic.air_F,
                  ducts.segments.trunk.gain_btuh; put a key holding spaces in double quotes:
                  "ducts.segments.supply trunk.gain_btuh"

Example: ducts.total_btuh <= 0.10 * house.total_btuh
"""

from __future__ import annotations

import re
from dataclasses import dataclass

_TOKEN = re.compile(r"""\s*(?:(?P<num>\d+(?:\.\d*)?(?:[eE][-+]?\d+)?|\.\d+)|(?P<cmp><=|>=|<|>)|(?P<op>[-+*/()])|
                        "(?P<qkey>[^"]+)"|(?P<key>[A-Za-z_][A-Za-z0-9_.]*))""", re.X)


class TargetError(ValueError):
    """A target that does not parse or names a key the results do not have."""


@dataclass(frozen=True)
class Target:
    """A parsed target; evaluate with .check(values) where values maps keys to numbers."""

    text: str
    left: tuple
    comparator: str
    right: tuple

    def keys(self):
        out = []

        def walk(node):
            if node[0] == "key":
                out.append(node[1])
            elif node[0] in ("bin",):
                walk(node[2])
                walk(node[3])
            elif node[0] == "neg":
                walk(node[1])

        walk(self.left)
        walk(self.right)
        return out

    def sides(self, values):
        """(left value, right value)."""
        return _eval(self.left, values), _eval(self.right, values)

    def check(self, values):
        """(met?, left, right, margin) where margin > 0 means room to spare."""
        a, b = self.sides(values)
        met = {"<=": a <= b, "<": a < b, ">=": a >= b, ">": a > b}[self.comparator]
        margin = b - a if self.comparator in ("<=", "<") else a - b
        return met, a, b, margin


def _eval(node, values):
    kind = node[0]
    if kind == "num":
        return node[1]
    if kind == "key":
        if node[1] not in values:
            import difflib

            close = difflib.get_close_matches(node[1], list(values), n=1)
            hint = f"; did you mean {close[0]}?" if close else ""
            raise TargetError(f'target: no output key "{node[1]}"{hint}')
        v = values[node[1]]
        if v is None:  # an output this condition does not give (tons and CFM per ton in heating, say)
            raise TargetError(f'target: "{node[1]}" has no value at this design condition (tons are given in '
                              "cooling only); compare loads in Btu/h or W instead")
        if not isinstance(v, int | float) or isinstance(v, bool):
            raise TargetError(f'target: "{node[1]}" is not a number ({v!r})')
        return float(v)
    if kind == "neg":
        return -_eval(node[1], values)
    op, a, b = node[1], _eval(node[2], values), _eval(node[3], values)
    if op == "/" and b == 0:
        raise TargetError("target: division by zero")
    return {"+": a + b, "-": a - b, "*": a * b, "/": a / b if b else 0.0}[op]


def _tokens(text):
    pos, out = 0, []
    while pos < len(text):
        if text[pos:].strip() == "":
            break
        m = _TOKEN.match(text, pos)
        if not m or m.end() == pos:
            col = pos + len(text[pos:]) - len(text[pos:].lstrip()) + 1
            raise TargetError(f"target: cannot read {text[pos:].strip()[:20]!r} at column {col}")
        kind = m.lastgroup
        val = m.group(kind)
        out.append(("key" if kind == "qkey" else kind, val, m.start(kind) + 1))
        pos = m.end()
    out.append(("end", None, len(text) + 1))
    return out


def parse_target(text):
    """Parse a target string into a Target; TargetError with the column on a malformed one."""
    toks = _tokens(text)
    i = 0

    def peek():
        return toks[i]

    def take():
        nonlocal i
        t = toks[i]
        i += 1
        return t

    def expr():
        node = term()
        while peek()[0] == "op" and peek()[1] in "+-":
            op = take()[1]
            node = ("bin", op, node, term())
        return node

    def term():
        node = factor()
        while peek()[0] == "op" and peek()[1] in "*/":
            op = take()[1]
            node = ("bin", op, node, factor())
        return node

    def factor():
        t = take()
        if t[0] == "num":
            return ("num", float(t[1]))
        if t[0] == "key":
            return ("key", t[1])
        if t[0] == "op" and t[1] == "-":
            return ("neg", factor())
        if t[0] == "op" and t[1] == "(":
            node = expr()
            if take()[1] != ")":
                raise TargetError(f"target: a ( is not closed (column {t[2]})")
            return node
        what = "the end" if t[0] == "end" else repr(t[1])
        raise TargetError(f"target: expected a number, a key or ( at column {t[2]}, found {what}")

    left = expr()
    c = take()
    if c[0] != "cmp":
        what = "the end" if c[0] == "end" else repr(c[1])
        raise TargetError(f"target: expected one of <= >= < > at column {c[2]}, found {what} "
                          '(e.g. "ducts.total_btuh <= 0.10 * house.total_btuh")')
    right = expr()
    if peek()[0] != "end":
        raise TargetError(f"target: unexpected {peek()[1]!r} at column {peek()[2]}")
    return Target(text, left, c[1], right)
