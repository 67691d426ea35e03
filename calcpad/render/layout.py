"""Line breaking of a math row, shared by the LaTeX (notebook) and MathML (submittal) printers.

Neither MathJax nor a browser breaks a long formula, so the printers do it themselves: a row is a
list of *parts* (the sides of ``=``), each part a list of :class:`Piece` s split at its
top-level operators (``+``, ``−``, ``×``, the commas of ``min``/``max``). :func:`break_lines`
fills lines up to an estimated width budget, breaking before ``=`` first and inside a part (before
an operator) only when the part alone does not fit. Continuation lines are indented.

Widths are estimates in "character units" (about half an em of the math font), computed from
the plain-text form of each piece with a few structural rules (a stacked fraction is as wide as
its wider half, a superscript is smaller).
"""

from __future__ import annotations

import html
from collections.abc import Callable, Mapping
from dataclasses import dataclass, replace

import pint
import sympy as sp

from calcpad.core.names import name_text
from calcpad.core.units import format_number, unit_symbol

__all__ = [
    "BUDGET",
    "INDENT",
    "OPS",
    "Piece",
    "break_lines",
    "estimate_width",
    "latex_lines",
    "mathml_lines",
    "tex_text",
]

#: Width budget of one math line, in character units (about 0.5 em of the math font). About
#: 530 px of the submittal's math column on a Letter page and 620 px of a JupyterLab output at
#: 1280 px wide both hold this; the browser test measures it.
BUDGET = 52.0

#: Width of a continuation line's indent, in the same units.
INDENT = 4.0

#: Operator key -> (LaTeX, MathML, plain text).
OPS: dict[str, tuple[str, str, str]] = {
    "": ("", "", ""),
    "=": ("=", "<mo>=</mo>", "="),
    "+": ("+", "<mo>+</mo>", "+"),
    "-": ("-", "<mo>−</mo>", "−"),
    "*": (r"\times", "<mo>&#xD7;</mo>", "×"),
    "/": ("/", "<mo>/</mo>", "/"),
    ".": (r"\cdot", "<mo>&#x22C5;</mo>", "·"),
    ",": (",", "<mo>,</mo>", ","),
    "<": ("<", "<mo>&lt;</mo>", "<"),
    "<=": (r"\le", "<mo>&#x2264;</mo>", "≤"),
    ">": (">", "<mo>&gt;</mo>", ">"),
    ">=": (r"\ge", "<mo>&#x2265;</mo>", "≥"),
    "=>": (r"\;\Rightarrow\;", "<mo>&#x21D2;</mo>", "⇒"),
    " ": (r"\quad", '<mspace width="1em"/>', " "),
    "_": (r"\ ", '<mspace width="0.3em"/>', " "),  # between the words of a text
}


@dataclass(frozen=True)
class Piece:
    """One unbreakable piece of a math line and the operator written before it."""

    op: str
    latex: str
    mathml: str
    width: float

    @property
    def total(self) -> float:
        """Width with the operator (an operator takes about three units with its spacing)."""
        return self.width + (0.0 if self.op == "" else 3.0)


def _text_width(text: str) -> float:
    return float(len(text))


def name_width(name: str) -> float:
    """Estimated width of a printed name: italic letters run wider than digits and the
    subscript is smaller (MathJax measured in JupyterLab: about 1.2 and 0.85 units a letter)."""
    base, _, sub = name_text(name).partition("_")
    return 1.2 * len(base) + 0.85 * len(sub)


def estimate_width(expr: sp.Basic, values: Mapping[str, pint.Quantity] | None = None, sigs: Mapping[str, int] | None = None, sig: int = 4) -> float:
    """Estimated printed width of ``expr``: symbolic when ``values`` is None, else substituted."""
    sigs = sigs or {}

    def leaf(sym: sp.Symbol) -> float:
        if values is None:
            return name_width(sym.name)
        q = values[sym.name]
        number = format_number(float(q.magnitude), sigs.get(sym.name, sig))
        unit = unit_symbol(q.units, "text")
        return len(number) + (len(unit) + 1 if unit else 0) + (2 if float(q.magnitude) < 0 else 0)

    def w(e: sp.Basic) -> float:
        if isinstance(e, sp.Symbol):
            return leaf(e)
        if e.is_Number:
            return _text_width(str(e) if not isinstance(e, sp.Float) else f"{float(e):g}")
        if e is sp.pi:
            return 1.0
        if isinstance(e, sp.Add):
            return sum(w(a) for a in e.args) + 3.0 * (len(e.args) - 1)
        if isinstance(e, sp.Mul):
            from calcpad.render.expressions import split_product

            negative, num, den = split_product(e)

            def row(fs: list[sp.Basic]) -> float:
                return sum(w(f) + (2 if isinstance(f, sp.Add) else 0) for f in fs) + 3.0 * max(len(fs) - 1, 0) if fs else 1.0

            body = row(num) if not den else max(row(num), row(den)) + 1.0
            return body + (2.0 if negative else 0.0)
        if isinstance(e, sp.Pow):
            base, exp = e.args
            if exp == sp.Rational(1, 2):
                return w(base) + 2.0
            if exp == -1:
                return w(base) + 1.0
            bracket = 2.0 if (values is not None and isinstance(base, sp.Symbol)) or isinstance(base, (sp.Add, sp.Mul)) else 0.0
            return w(base) + bracket + 0.7 * w(exp)
        if isinstance(e, (sp.Min, sp.Max)):
            return 5.0 + sum(w(a) for a in e.args) + 2.0 * (len(e.args) - 1)
        if isinstance(e, sp.Abs):
            return w(e.args[0]) + 1.0
        if isinstance(e, sp.Function):
            return len(type(e).__name__) + 2.0 + sum(w(a) for a in e.args)
        return _text_width(str(e))

    return w(expr)


# ---------------------------------------------------------------- splitting a part into pieces


Printer = Callable[[sp.Basic], tuple[str, str]]  # expr -> (latex, mathml)


def _negated(term: sp.Basic) -> sp.Basic | None:
    """``b`` for a term printed as ``- b`` (so the minus becomes the break operator)."""
    if isinstance(term, sp.Mul) and term.args and term.args[0] == -1:
        rest = term.args[1:]
        return rest[0] if len(rest) == 1 else sp.Mul(*rest, evaluate=False)
    if term.is_Number and term < 0:
        return -term
    return None


def _wrap(pieces: list[Piece], before: tuple[str, str, float], after: tuple[str, str, float]) -> list[Piece]:
    first, last = pieces[0], pieces[-1]
    pieces = list(pieces)
    pieces[0] = replace(first, latex=before[0] + first.latex, mathml=before[1] + first.mathml, width=first.width + before[2])
    last = pieces[-1]
    pieces[-1] = replace(last, latex=last.latex + after[0], mathml=last.mathml + after[1], width=last.width + after[2])
    return pieces


def split_expr(expr: sp.Basic, op: str, printer: Printer, width: Callable[[sp.Basic], float], budget: float, mul_op: str = "*") -> list[Piece]:
    """Pieces of ``expr`` (written after operator ``op``): one piece when it fits ``budget``,
    else split at its top-level ``+``/``−``, product ``×`` or ``min``/``max`` commas, recursively."""
    w = width(expr)
    if w <= budget:
        latex, mathml = printer(expr)
        return [Piece(op, latex, mathml, w)]
    if isinstance(expr, sp.Add):
        out: list[Piece] = []
        for i, term in enumerate(expr.args):
            neg = _negated(term) if i > 0 else None
            term_op = ("-" if neg is not None else "+") if i > 0 else op
            out += split_expr(neg if neg is not None else term, term_op, printer, width, budget, mul_op)
        return out
    if isinstance(expr, sp.Mul):
        from calcpad.render.expressions import split_product

        negative, num, den = split_product(expr)
        if not den and len(num) > 1 and not negative:
            out = []
            for i, f in enumerate(num):
                sub = split_expr(f, mul_op if i else op, printer, width, budget, mul_op)
                if isinstance(f, sp.Add):
                    sub = _wrap(sub, (r"\left(" if len(sub) == 1 else "(", "<mo>(</mo>", 1.0), (r"\right)" if len(sub) == 1 else ")", "<mo>)</mo>", 1.0))
                out += sub
            return out
        if den and not negative:
            # a stacked fraction cannot break: written on one level, (numerator)/(denominator),
            # each side breaks at its own operators
            top = num[0] if len(num) == 1 else sp.Mul(*num, evaluate=False)
            bottom = den[0] if len(den) == 1 else sp.Mul(*den, evaluate=False)
            out = _side_pieces(top, op, printer, width, budget, mul_op)
            out += _side_pieces(bottom, "/", printer, width, budget, mul_op)
            return out
    if isinstance(expr, sp.Pow) and expr.exp == sp.Rational(1, 2):
        inner = split_expr(expr.base, op, printer, width, budget, mul_op)
        return _wrap(inner, (r"\surd(", "<mo>&#x221A;</mo><mo>(</mo>", 2.0), (")", "<mo>)</mo>", 1.0))
    if isinstance(expr, sp.Abs):
        inner = split_expr(expr.args[0], op, printer, width, budget, mul_op)
        return _wrap(inner, ("|", "<mo>|</mo>", 1.0), ("|", "<mo>|</mo>", 1.0))
    if isinstance(expr, (sp.Min, sp.Max)):
        name = "min" if isinstance(expr, sp.Min) else "max"
        out = []
        for i, a in enumerate(expr.args):
            out += split_expr(a, "," if i else op, printer, width, budget, mul_op)
        # the first argument keeps the row's operator; the name and brackets wrap the pieces
        return _wrap(out, (rf"\{name}(", f"<mi>{name}</mi><mo>(</mo>", 4.0), (")", "<mo>)</mo>", 1.0))
    latex, mathml = printer(expr)
    return [Piece(op, latex, mathml, w)]


def _side_pieces(expr: sp.Basic, op: str, printer: Printer, width: Callable[[sp.Basic], float], budget: float, mul_op: str) -> list[Piece]:
    """One side of an inline division, bracketed unless it is a single factor."""
    pieces = split_expr(expr, op, printer, width, budget, mul_op)
    if isinstance(expr, (sp.Add, sp.Mul)):
        one = len(pieces) == 1
        pieces = _wrap(pieces, (r"\left(" if one else "(", "<mo>(</mo>", 1.0), (r"\right)" if one else ")", "<mo>)</mo>", 1.0))
    return pieces


# ---------------------------------------------------------------- filling lines


def break_lines(parts: list[list[Piece]], budget: float = BUDGET) -> list[list[Piece]]:
    """Fill lines with the parts' pieces; a line never starts empty and breaks before ``=``
    (a part) first, before an operator inside a part only when the part does not fit alone."""
    lines: list[list[Piece]] = [[]]
    used = 0.0

    def room() -> float:
        return budget - (INDENT if len(lines) > 1 else 0.0)

    on_line = 0  # parts begun on the current line
    for part in parts:
        width = sum(p.total for p in part)
        if used + width <= room():  # the whole part fits on this line
            lines[-1].extend(part)
            used += width
            on_line += 1
            continue
        if lines[-1] and width <= budget - INDENT:  # it fits on a line of its own
            lines.append(list(part))
            used, on_line = width, 1
            continue
        if lines[-1] and not (len(lines) == 1 and on_line == 1):
            lines.append([])  # too long for any line: it starts a line (unless only the name precedes it)
            used = 0.0
        on_line = 2
        for piece in part:
            if lines[-1] and used + piece.total > room():
                lines.append([])
                used = 0.0
            lines[-1].append(piece)
            used += piece.total
    return [line for line in lines if line]


def _trailing_commas(lines: list[list[Piece]]) -> list[tuple[list[Piece], bool]]:
    """(line, ends with a comma): a comma that would start a line ends the line before it."""
    out = []
    for i, line in enumerate(lines):
        nxt = lines[i + 1] if i + 1 < len(lines) else None
        out.append((line, bool(nxt) and nxt[0].op == ","))
    return out


def _op(p: Piece, k: int, first: bool) -> str:
    return "" if first and p.op in (",", "_") else OPS[p.op][k]


def latex_lines(lines: list[list[Piece]]) -> list[str]:
    """LaTeX of each line; continuation lines start with ``\\qquad``."""
    out = []
    for i, (line, comma) in enumerate(_trailing_commas(lines)):
        text = " ".join(x for j, p in enumerate(line) for x in (_op(p, 0, j == 0), p.latex) if x)
        out.append(("" if i == 0 else r"\qquad ") + text + ("," if comma else ""))
    return out


def mathml_lines(lines: list[list[Piece]]) -> list[str]:
    """MathML content (no ``<math>`` wrapper) of each line."""
    out = []
    for line, comma in _trailing_commas(lines):
        out.append("".join(_op(p, 1, j == 0) + p.mathml for j, p in enumerate(line)) + ("<mo>,</mo>" if comma else ""))
    return out


# ---------------------------------------------------------------- text inside math


_TEX_SPECIAL = {
    "\\": r"\backslash",
    "{": r"\{",
    "}": r"\}",
    "$": r"\$",
    "&": r"\&",
    "#": r"\#",
    "%": r"\%",
    "_": r"\_",
    "^": r"\unicode{x5E}",
    "~": r"\unicode{x7E}",
}


def tex_text(text: str) -> str:
    """Plain text as LaTeX math-mode markup that shows every character as typed.

    Ordinary runs go in ``\\text{}``; characters that ``\\text{}`` would read as markup (``\\ { }
    $ & # % _ ^ ~``) are written outside it as math-mode symbols, so no accent, comment or group
    can form whichever text macros the renderer loads.
    """
    out: list[str] = []
    run: list[str] = []
    for ch in text:
        if ch in _TEX_SPECIAL:
            if run:
                out.append(r"\text{" + "".join(run) + "}")
                run = []
            out.append(_TEX_SPECIAL[ch])
        else:
            run.append(ch)
    if run:
        out.append(r"\text{" + "".join(run) + "}")
    return " ".join(out) if out else ""


def mathml_text(text: str) -> str:
    """Plain text inside MathML (``<mtext>``), escaped."""
    return f"<mtext>{html.escape(text)}</mtext>"
