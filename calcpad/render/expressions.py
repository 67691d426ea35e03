"""Expression printers: the symbolic form and the substituted form, in LaTeX, MathML and text.

Each is a small subclass of a sympy printer. The symbolic printers print names with Greek
letters and subscripts; the substituted printers print each name as its value with unit and
bracket a substituted base under a power, e.g. ``(1.900 in)^4``. Terms keep the author's order
(``order="none"``).
"""

from __future__ import annotations

import functools
import html
from collections.abc import Mapping

import pint
import sympy as sp
from sympy.printing.latex import LatexPrinter
from sympy.printing.mathml import MathMLPresentationPrinter
from sympy.printing.str import StrPrinter

from calcpad.core.names import name_latex, name_mathml, name_text
from calcpad.core.units import format_number, unit_symbol

__all__ = [
    "quantity_latex",
    "quantity_mathml",
    "quantity_text",
    "substituted_latex",
    "substituted_mathml",
    "substituted_text",
    "symbolic_latex",
    "symbolic_mathml",
    "symbolic_text",
]


# ---------------------------------------------------------------- products as written


def split_product(expr: sp.Mul) -> tuple[bool, list[sp.Basic], list[sp.Basic]]:
    """(negative, numerator factors, denominator factors) of a product in the author's order.

    sympy's printers re-split unevaluated products with ``fraction()``, which mangles forms such
    as ``x/(D_o/2)``; our printers use this instead.
    """
    args = list(expr.args)
    negative = False
    if args and args[0] == -1:
        negative, args = True, args[1:]
    num = [a for a in args if not (isinstance(a, sp.Pow) and a.exp.is_Number and a.exp < 0)]
    den = [a.base if a.exp == -1 else sp.Pow(a.base, -a.exp, evaluate=False) for a in args if a not in num]
    return negative, num, den


# ---------------------------------------------------------------- values with units


def _magnitude(q: pint.Quantity) -> float:
    return float(q.magnitude)


def quantity_latex(q: pint.Quantity, sig: int = 4) -> str:
    """``1.750\\ \\mathrm{kip} \\cdot \\mathrm{ft}``."""
    number = format_number(_magnitude(q), sig, "latex")
    unit = unit_symbol(q.units, "latex")
    unit = unit.replace("°", r"^{\circ}").replace("%", r"\%")
    return f"{number}\\ {unit}" if unit else number


def quantity_text(q: pint.Quantity, sig: int = 4) -> str:
    """``1.750 kip·ft``."""
    number = format_number(_magnitude(q), sig, "text")
    unit = unit_symbol(q.units, "text")
    if unit in ("°", "%"):
        return number + unit
    return f"{number} {unit}" if unit else number


def _unit_mathml(q: pint.Quantity) -> str:
    return _units_mathml(tuple(q.units._units.items()))


@functools.lru_cache(maxsize=4096)
def _units_mathml(units: tuple[tuple[str, float], ...]) -> str:
    """MathML of a unit's (name, power) pairs, in the author's order (cached: few units, printed often)."""
    parts = []
    from calcpad.core.units import ureg

    num = [(ureg.get_symbol(n), p) for n, p in units if p > 0]
    den = [(ureg.get_symbol(n), -p) for n, p in units if p < 0]

    def one(sym: str, p: float) -> str:
        sym = {"degree": "°", "percent": "%"}.get(sym, sym)
        mi = f'<mi mathvariant="normal">{html.escape(sym)}</mi>'
        return mi if p == 1 else f"<msup>{mi}<mn>{p:g}</mn></msup>"

    if not num and not den:
        return ""
    parts.append("<mo>&#x00B7;</mo>".join(one(s, p) for s, p in num) if num else "<mn>1</mn>")
    if den:
        parts.append("<mo>/</mo>")
        inner = "<mo>&#x00B7;</mo>".join(one(s, p) for s, p in den)
        parts.append(f"<mrow><mo>(</mo>{inner}<mo>)</mo></mrow>" if len(den) > 1 else inner)
    return "".join(parts)


def quantity_mathml(q: pint.Quantity, sig: int = 4) -> str:
    """``<mrow><mn>1.750</mn><mspace/><mi mathvariant="normal">kip</mi>...</mrow>``."""
    number = format_number(_magnitude(q), sig, "text")
    if number.startswith("−"):
        mn = f"<mo>−</mo><mn>{number[1:]}</mn>"
    else:
        mn = f"<mn>{html.escape(number)}</mn>"
    unit = _unit_mathml(q)
    if not unit:
        return f"<mrow>{mn}</mrow>"
    return f'<mrow>{mn}<mspace width="0.25em"/>{unit}</mrow>'


# ---------------------------------------------------------------- LaTeX


class _SymbolicLatex(LatexPrinter):
    def __init__(self) -> None:
        super().__init__({"order": "none", "mul_symbol": "dot"})

    def _print_Symbol(self, expr: sp.Symbol, style: str = "plain") -> str:
        return name_latex(expr.name)

    def _print_Float(self, expr: sp.Float) -> str:
        return _float_text(expr, "latex")

    mul_sep = r" \cdot "

    def _factor(self, e: sp.Basic) -> str:
        text = self._print(e)
        if isinstance(e, sp.Add) or (isinstance(e, sp.Mul) and e.args and e.args[0] == -1):
            return rf"\left({text}\right)"
        return text

    def _print_Mul(self, expr: sp.Mul) -> str:
        negative, num, den = split_product(expr)
        top = self.mul_sep.join(self._factor(f) for f in num) if num else "1"
        body = top if not den else rf"\frac{{{top}}}{{{self.mul_sep.join(self._factor(f) for f in den)}}}"
        return ("- " if negative else "") + body

    def _print_Min(self, expr: sp.Min, exp: str | None = None) -> str:
        return self._minmax("min", expr, exp)

    def _print_Max(self, expr: sp.Max, exp: str | None = None) -> str:
        return self._minmax("max", expr, exp)

    def _minmax(self, name: str, expr: sp.Basic, exp: str | None) -> str:
        tex = rf"\{name}\left({', '.join(self._print(a) for a in expr.args)}\right)"  # in the order written
        return f"{tex}^{{{exp}}}" if exp is not None else tex


def _float_text(expr: sp.Float, style: str) -> str:
    value = float(expr)
    text = repr(value) if abs(value) >= 1e-4 else f"{value:g}"
    if text.endswith(".0"):
        text = text[:-2]
    return text if style != "latex" or "e" not in text else format_number(value, 6, "latex")


class _SubstitutedLatex(_SymbolicLatex):
    def __init__(self, values: Mapping[str, pint.Quantity], sigs: Mapping[str, int], sig: int) -> None:
        super().__init__()
        self.mul_sep = r" \times "
        self.values = values
        self.sigs = sigs
        self.sig = sig

    def _value(self, name: str) -> str:
        q = self.values[name]
        text = quantity_latex(q, self.sigs.get(name, self.sig))
        if float(q.magnitude) < 0:
            text = rf"\left({text}\right)"
        return text

    def _print_Symbol(self, expr: sp.Symbol, style: str = "plain") -> str:
        return self._value(expr.name)

    def _print_Pow(self, expr: sp.Pow) -> str:
        base, exp = expr.args
        if isinstance(base, sp.Symbol) and exp.is_Number and exp not in (sp.Rational(1, 2), sp.Integer(-1)) and exp > 0:
            q = self.values[base.name]
            inner = quantity_latex(q, self.sigs.get(base.name, self.sig))
            return rf"\left({inner}\right)^{{{self._print(exp)}}}"
        return super()._print_Pow(expr)

    def parenthesize(self, item: sp.Basic, level: int, is_neg: bool = False, strict: bool = False) -> str:
        # a substituted symbol inside a product is "250 lbf": fine without brackets,
        # but a fraction's or power's base needs them, handled in _print_Pow.
        return super().parenthesize(item, level, is_neg, strict)


def symbolic_latex(expr: sp.Basic) -> str:
    """The formula as written, e.g. ``\\frac{M \\cdot c}{I}``."""
    return _SymbolicLatex().doprint(expr)


def substituted_latex(expr: sp.Basic, values: Mapping[str, pint.Quantity], sigs: Mapping[str, int] | None = None, sig: int = 4) -> str:
    """The formula with each name replaced by its value and unit."""
    return _SubstitutedLatex(values, sigs or {}, sig).doprint(expr)


# ---------------------------------------------------------------- MathML


class _MathMLMinMax:
    """min/max in MathML with the arguments in the order written (sympy's printer sorts them)."""

    def _print_Min(self, expr: sp.Min) -> object:
        return self._minmax("min", expr)

    def _print_Max(self, expr: sp.Max) -> object:
        return self._minmax("max", expr)

    def _minmax(self, name: str, expr: sp.Basic) -> object:
        mrow = self.dom.createElement("mrow")  # type: ignore[attr-defined]
        mo = self.dom.createElement("mo")  # type: ignore[attr-defined]
        mo.appendChild(self.dom.createTextNode(name))  # type: ignore[attr-defined]
        mrow.appendChild(mo)
        mrow.appendChild(self._paren_comma_separated(*expr.args))  # type: ignore[attr-defined]
        return mrow


class _SymbolicMathML(_MathMLMinMax, MathMLPresentationPrinter):
    times = "&#x22C5;"

    def __init__(self) -> None:
        super().__init__({"order": "none", "mul_symbol": "dot"})

    def _factor(self, term: sp.Basic) -> str:
        markup = self._print(term).toxml()
        if isinstance(term, sp.Add) or (isinstance(term, sp.Mul) and term.args and term.args[0] == -1):
            markup = f"<mrow><mo>(</mo>{markup}<mo>)</mo></mrow>"
        return markup

    def _row(self, factors: list[sp.Basic]) -> str:
        if not factors:
            return "<mn>1</mn>"
        op = f"<mo>{self.times}</mo>"
        return "<mrow>" + op.join(self._factor(f) for f in factors) + "</mrow>"

    def _print_Mul(self, expr: sp.Mul) -> object:
        """Keep the author's factor order (sympy's printer sorts factors)."""
        args = list(expr.args)
        sign = ""
        if args and args[0] == -1:
            sign, args = "<mo>-</mo>", args[1:]
        num = [a for a in args if not (isinstance(a, sp.Pow) and a.exp.is_Number and a.exp < 0)]
        den = [a.base if a.exp == -1 else sp.Pow(a.base, -a.exp, evaluate=False) for a in args if a not in num]
        body = self._row(num) if not den else f"<mfrac>{self._row(num)}{self._row(den)}</mfrac>"
        return _raw(self.dom, f"<mrow>{sign}{body}</mrow>")

    def _print_Symbol(self, sym: sp.Symbol, style: str = "plain") -> object:
        return _raw(self.dom, name_mathml(sym.name))

    def _print_Float(self, expr: sp.Float) -> object:
        node = self.dom.createElement("mn")
        node.appendChild(self.dom.createTextNode(_float_text(expr, "text")))
        return node


class _Raw:
    """A DOM stand-in that writes prepared markup (sympy's printer calls ``writexml``)."""

    def __init__(self, markup: str) -> None:
        self.markup = markup
        self.childNodes: list = []
        self.nodeName = "raw"
        self.parentNode = None
        self.ownerDocument = None
        self.nodeType = 1

    def writexml(self, writer, indent="", addindent="", newl="") -> None:
        writer.write(self.markup)

    def toxml(self) -> str:
        return self.markup

    def cloneNode(self, deep: bool = False) -> _Raw:
        return _Raw(self.markup)


def _raw(dom: object, markup: str) -> _Raw:  # noqa: ARG001
    return _Raw(markup)


class _SubstitutedMathML(_SymbolicMathML):
    def __init__(self, values: Mapping[str, pint.Quantity], sigs: Mapping[str, int], sig: int) -> None:
        super().__init__()
        self.times = "&#xD7;"
        self.values = values
        self.sigs = sigs
        self.sig = sig

    def _print_Symbol(self, sym: sp.Symbol, style: str = "plain") -> object:
        q = self.values[sym.name]
        markup = quantity_mathml(q, self.sigs.get(sym.name, self.sig))
        if float(q.magnitude) < 0:
            markup = f"<mrow><mo>(</mo>{markup}<mo>)</mo></mrow>"
        return _raw(self.dom, markup)

    def _print_Pow(self, e: sp.Pow) -> object:
        base, exp = e.args
        if isinstance(base, sp.Symbol) and exp.is_Number and exp not in (sp.Rational(1, 2), sp.Integer(-1)) and exp > 0:
            q = self.values[base.name]
            inner = quantity_mathml(q, self.sigs.get(base.name, self.sig))
            exp_ml = self._print(exp).toxml()
            return _raw(self.dom, f"<msup><mrow><mo>(</mo>{inner}<mo>)</mo></mrow>{exp_ml}</msup>")
        return super()._print_Pow(e)


def _mathml(printer: MathMLPresentationPrinter, expr: sp.Basic) -> str:
    return printer._print(expr).toxml()


def symbolic_mathml(expr: sp.Basic) -> str:
    """Presentation MathML of the formula as written (no ``<math>`` wrapper)."""
    return _mathml(_SymbolicMathML(), expr)


def substituted_mathml(expr: sp.Basic, values: Mapping[str, pint.Quantity], sigs: Mapping[str, int] | None = None, sig: int = 4) -> str:
    """Presentation MathML of the substituted formula (no ``<math>`` wrapper)."""
    return _mathml(_SubstitutedMathML(values, sigs or {}, sig), expr)


# ---------------------------------------------------------------- plain text


class _SymbolicText(StrPrinter):
    def __init__(self) -> None:
        super().__init__({"order": "none"})

    def _print_Symbol(self, expr: sp.Symbol) -> str:
        return name_text(expr.name)

    def _print_Float(self, expr: sp.Float) -> str:
        return _float_text(expr, "text")

    def _print_Pi(self, expr: sp.Basic) -> str:
        return "π"

    def _print_Pow(self, expr: sp.Pow, rational: bool = False) -> str:
        base, exp = expr.args
        if exp == sp.Rational(1, 2):
            return f"√({self._print(base)})"
        text = super()._print_Pow(expr)
        return text.replace("**", "^")

    mul_sep = "·"

    def _factor(self, e: sp.Basic, in_den: bool = False) -> str:
        text = self._print(e)
        # a product inside a product is bracketed: M·(D_o/2)/I, not M·D_o/2/I
        wrap = isinstance(e, (sp.Add, sp.Mul))
        return f"({text})" if wrap else text

    def _print_Mul(self, expr: sp.Mul) -> str:
        negative, num, den = split_product(expr)
        top = self.mul_sep.join(self._factor(f) for f in num) if num else "1"
        if den:
            bottom = self.mul_sep.join(self._factor(f, True) for f in den)
            if len(den) > 1:
                bottom = f"({bottom})"
            top = f"{top}/{bottom}"
        return ("-" if negative else "") + top

    def _print_Min(self, expr: sp.Min) -> str:
        return "min(" + ", ".join(self._print(a) for a in expr.args) + ")"

    def _print_Max(self, expr: sp.Max) -> str:
        return "max(" + ", ".join(self._print(a) for a in expr.args) + ")"

    def _print_Abs(self, expr: sp.Abs) -> str:
        return "|" + self._print(expr.args[0]) + "|"


class _SubstitutedText(_SymbolicText):
    def __init__(self, values: Mapping[str, pint.Quantity], sigs: Mapping[str, int], sig: int) -> None:
        super().__init__()
        self.values = values
        self.sigs = sigs
        self.sig = sig

    def _print_Symbol(self, expr: sp.Symbol) -> str:
        q = self.values[expr.name]
        text = quantity_text(q, self.sigs.get(expr.name, self.sig))
        return f"({text})" if float(q.magnitude) < 0 else text

    def _print_Pow(self, expr: sp.Pow, rational: bool = False) -> str:
        base, exp = expr.args
        if isinstance(base, sp.Symbol) and exp.is_Number and exp > 0 and exp != sp.Rational(1, 2):
            q = self.values[base.name]
            return f"({quantity_text(q, self.sigs.get(base.name, self.sig))})^{self._print(exp)}"
        return super()._print_Pow(expr, rational)

    mul_sep = " × "


def symbolic_text(expr: sp.Basic) -> str:
    """Plain-text formula: ``M·c/I``, ``π/64·(D_o^4 - D_i^4)``."""
    return _SymbolicText().doprint(expr)


def substituted_text(expr: sp.Basic, values: Mapping[str, pint.Quantity], sigs: Mapping[str, int] | None = None, sig: int = 4) -> str:
    """Plain-text substituted formula: ``(250 lbf) × (84 in)``."""
    return _SubstitutedText(values, sigs or {}, sig).doprint(expr)
