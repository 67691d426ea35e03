"""Step results as printable rows: label, reference, and the math broken into lines.

One layout for every printer: the notebook (LaTeX in an HTML table) and the submittal (MathML)
both print :class:`MathRow` s built here, so they break lines at the same places. Headings,
notes, tables and figures are not math rows; each printer prints them itself.
"""

from __future__ import annotations

import functools
from dataclasses import dataclass

import pint
import sympy as sp

from calcpad.core.names import name_latex, name_mathml, name_text
from calcpad.core.results import BranchResult, CheckResult, FormulaResult, GivenResult, SelectResult
from calcpad.core.units import format_number
from calcpad.render.expressions import (
    quantity_latex,
    quantity_mathml,
    quantity_text,
    substituted_latex,
    substituted_mathml,
    symbolic_latex,
    symbolic_mathml,
)
from calcpad.render.layout import BUDGET, Piece, break_lines, estimate_width, mathml_text, name_width, split_expr, tex_text

__all__ = ["MathRow", "check_label", "math_rows", "same_at_print", "select_words"]


@dataclass
class MathRow:
    """One printed row: a plain-text label and reference, math lines, and a check status."""

    label: str
    ref: str
    lines: list[list[Piece]]
    strong: bool = False  # a check's title
    status: str = ""  # "OK" / "NG" for a check's verdict row
    check: bool = False


def _name(name: str, op: str = "") -> Piece:
    return Piece(op, name_latex(name), name_mathml(name), name_width(name))


def _quantity(q: pint.Quantity, sig: int, op: str = "=") -> Piece:
    return Piece(op, quantity_latex(q, sig), quantity_mathml(q, sig), float(len(quantity_text(q, sig))))


def _number(x: float, sig: int, op: str) -> Piece:
    return Piece(op, format_number(x, sig, "latex"), f"<mn>{format_number(x, sig)}</mn>", float(len(format_number(x, sig))))


def _words(text: str, op: str = " ") -> Piece:
    return Piece(op, tex_text(text), mathml_text(text), float(len(text)))


def _phrase(text: str, op: str = " ") -> list[Piece]:
    """A text as one piece per word, so a long phrase breaks between words."""
    return [_words(w, op if i == 0 else "_") for i, w in enumerate(text.split())]


def _symbolic(expr: sp.Basic, op: str, budget: float) -> list[Piece]:
    return list(_symbolic_pieces(expr, op, budget))


@functools.lru_cache(maxsize=8192)
def _symbolic_pieces(expr: sp.Basic, op: str, budget: float) -> tuple[Piece, ...]:
    """The symbolic form depends on the formula only, not on the values: printed once per formula
    (a what-if change re-prints rows whose values moved; their symbolic lines come from here).
    Pieces are frozen, so sharing them is safe."""

    def printer(e: sp.Basic) -> tuple[str, str]:
        return symbolic_latex(e), symbolic_mathml(e)

    return tuple(split_expr(expr, op, printer, estimate_width, budget, mul_op="."))


def _substituted(f: FormulaResult, op: str, budget: float) -> list[Piece]:
    def printer(e: sp.Basic) -> tuple[str, str]:
        return substituted_latex(e, f.values, f.sigs, f.sig), substituted_mathml(e, f.values, f.sigs, f.sig)

    def width(e: sp.Basic) -> float:
        return estimate_width(e, f.values, f.sigs, f.sig)

    return split_expr(f.expr, op, printer, width, budget)


def formula_parts(f: FormulaResult, budget: float = BUDGET) -> list[list[Piece]]:
    """``name = symbolic = substituted = result`` as parts (the substituted form is left out
    when it prints the same as the symbolic form or the result)."""
    head = [_name(f.name)]
    sym = _symbolic(f.expr, "=", budget)
    if f.expr.is_Number:  # a value written into the formula
        return [head, sym]
    parts = [head, sym]
    sub = _substituted(f, "=", budget)
    result = [_quantity(f.value, f.sig)]
    flat = " ".join(p.latex for p in sub)
    if flat not in (" ".join(p.latex for p in sym), result[0].latex):
        parts.append(sub)
    parts.append(result)
    return parts


def _lines(parts: list[list[Piece]], budget: float) -> list[list[Piece]]:
    return break_lines(parts, budget)


def same_at_print(a: pint.Quantity, b: pint.Quantity, sig: int) -> bool:
    """True when two values of one kind print the same at ``sig`` figures (so neither governs)."""
    return format_number(float(a.magnitude), sig) == format_number(float(b.to(a.units).magnitude), sig)


_FLIP = {"<": ">=", "<=": ">", ">": "<=", ">=": "<"}


def _side(expr: sp.Basic, value: pint.Quantity, op: str, budget: float) -> list[list[Piece]]:
    if getattr(expr, "is_Number", False):
        return [_symbolic(expr, op, budget)]
    return [_symbolic(expr, op, budget), [_quantity(value, 4)]]


def _branch_rows(b: BranchResult, budget: float) -> list[MathRow]:
    cond = b.cases[b.tested].condition
    label = b.cases[b.chosen].label
    rows: list[MathRow] = []
    if cond is not None and b.condition_sides is not None and hasattr(cond, "rel_op"):
        lhs, rhs = b.condition_sides
        op = cond.rel_op if b.condition_held else _FLIP[cond.rel_op]
        parts = _side(cond.lhs, lhs, "", budget) + _side(cond.rhs, rhs, op, budget)
        parts.append(_phrase(label if b.words else "use " + label, "=>"))
        rows.append(MathRow(b.description, b.ref, _lines(parts, budget)))
        if not b.words:
            rows.append(MathRow("", label, _lines(formula_parts(b.formula, budget), budget)))
    elif b.words:
        rows.append(MathRow(b.description, b.ref, _lines([_phrase(label, "")], budget)))
    else:
        rows.append(MathRow(b.description, label or b.ref, _lines(formula_parts(b.formula, budget), budget)))
    return rows


def select_words(governing: str, ties: list[str]) -> str:
    """"X governs", or "X and Y give the same value" when others print the same (no false governs)."""
    if not ties:
        return f"{governing} governs"
    labels = [governing, *ties]
    return f"{', '.join(labels[:-1])} and {labels[-1]} give the same value"


def _select_row(s: SelectResult, budget: float) -> MathRow:
    gov = s.candidates[s.governing]
    ties = [c for c in s.candidates if c is not gov and same_at_print(gov.value, c.value, s.sig)]

    def listing(pieces: list[Piece]) -> list[Piece]:
        first, last = pieces[0], pieces[-1]
        pieces = list(pieces)
        pieces[0] = Piece(first.op, rf"\{s.mode}(" + first.latex, f"<mi>{s.mode}</mi><mo>(</mo>" + first.mathml, first.width + 4)
        last = pieces[-1]
        pieces[-1] = Piece(last.op, last.latex + ")", last.mathml + "<mo>)</mo>", last.width + 1)
        return pieces

    names = listing([_name(c.name, "," if i else "=") for i, c in enumerate(s.candidates)])
    values = listing([_quantity(c.value, s.sig, "," if i else "=") for i, c in enumerate(s.candidates)])
    words = select_words(gov.label, [c.label for c in ties])
    parts = [[_name(s.name)], names, values, [_quantity(s.value, s.sig)], _phrase(words, " ")]
    return MathRow(s.description, s.ref, _lines(parts, budget))


def _frac(top: Piece, bottom: Piece, op: str) -> Piece:
    return Piece(
        op,
        rf"\frac{{{top.latex}}}{{{bottom.latex}}}",
        f"<mfrac><mrow>{top.mathml}</mrow><mrow>{bottom.mathml}</mrow></mfrac>",
        max(top.width, bottom.width) + 1,
    )


def _abs(p: Piece) -> Piece:
    return Piece(p.op, rf"\left|{p.latex}\right|", f"<mrow><mo>|</mo>{p.mathml}<mo>|</mo></mrow>", p.width + 2)


def check_label(c: CheckResult) -> str:
    """The check's title, with the sign of a negative demand explained."""
    if float(c.demand.magnitude) < 0:
        return f"{c.title} (demand {name_text(c.demand_name)} = {quantity_text(c.demand, c.sig)} acts in the negative direction; its magnitude is checked)"
    return c.title


def _check_rows(c: CheckResult, budget: float) -> list[MathRow]:
    d, cap = _name(c.demand_name, ""), _name(c.capacity_name, "")
    negative = float(c.demand.magnitude) < 0
    if negative:
        d = _abs(d)
    dq = _quantity(abs(c.demand), c.sig, "")
    cq = _quantity(c.capacity, c.sig, "")
    fs = Piece("", r"\mathit{FS}", '<mi mathvariant="italic">FS</mi>', 2)
    if c.required_fs is not None:
        parts = [
            [fs],
            [_frac(cap, d, "=")],
            [_frac(cq, dq, "=")],
            [_number(c.fs, c.sig, "=")],
            [_number(c.required_fs, 3, ">=" if c.ok else "<")],
        ]
    else:
        parts = [
            [_frac(d, cap, "")],
            [_frac(dq, cq, "=")],
            [_number(c.ratio, 3, "=")],
            [_number(c.limit, 3, "<=" if c.ok else ">")],
        ]
    rows = [MathRow(check_label(c), c.ref, _lines(parts, budget - 4), strong=True, status=c.status, check=True)]
    if c.show_fs and c.fs is not None and c.required_fs is None:
        rows.append(MathRow("", "", _lines([[fs], [_frac(cap, d, "=")], [_number(c.fs, c.sig, "=")]], budget), check=True))
    return rows


def math_rows(step: object, budget: float = BUDGET) -> list[MathRow] | None:
    """Rows of a math step (given, formula, branch, selection, check); None for other steps."""
    if isinstance(step, GivenResult):
        return [MathRow(step.description, step.source, _lines([[_name(step.name)], [_quantity(step.value, step.sig)]], budget))]
    if isinstance(step, FormulaResult):
        if step.hidden:
            return []
        return [MathRow(step.description, step.ref, _lines(formula_parts(step, budget), budget))]
    if isinstance(step, BranchResult):
        return _branch_rows(step, budget)
    if isinstance(step, SelectResult):
        return [_select_row(step, budget)]
    if isinstance(step, CheckResult):
        return _check_rows(step, budget)
    return None

