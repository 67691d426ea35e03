"""Read a value with its unit (``"3'-6 1/2\\""``, ``"1,200 lbf"``) or a unit (``"kip*ft"``) from text.

A value is one number and a unit, never an expression. The text is read by a grammar of our
own: a small tokenizer and a recursive-descent reader over the trade notations below, with the
numbers kept exact (:class:`fractions.Fraction`) until the end. Unit names are looked up one
by one in the shared registry (``ureg.parse_unit_name``); pint's string expression evaluator
never sees the user's text. The work is bounded by rule, not by a timeout: at most
:data:`MAX_LENGTH` characters, scientific exponents of at most :data:`MAX_EXPONENT`, unit
powers whole numbers from 1 to :data:`MAX_POWER` (or halves, for ACI 318's ``psi^0.5``), no nesting beyond one pair of parentheses.

Accepted forms (see :data:`ACCEPTED_FORMS`)::

    84 in    0.5 in    .5 in    1.5e3 psi    1,200 lbf    -6 in    0.85    5%
    3/16 in    1 1/2 in    1-1/2 in    6"    6 1/2"
    3'    3'-6"    3' 6"    3'6"    3'-6 1/2"    3'-6-1/2"    -0'-6"
    3 ft 6 in    3 ft 6-1/2 in    3 ft 6 1/2 in
    kip*ft  kip-ft  kip·ft  lbf/ft  kip/(ft*in)  in^4  in**4  in⁴  kN*m  psf  ksi  MPa

Feet-inch forms give inches. Refused, each with a hint: ``3ft-6in``, ``1 200``, ``1,2``,
``0.5e in``, ``9^9^9``, ``in^1.5``, ``nan``, ``1e400`` and everything else.
"""

from __future__ import annotations

import difflib
import functools
import math
import re
from dataclasses import dataclass
from fractions import Fraction
from importlib import resources

import pint

from calcpad.core.errors import UnitInputError
from calcpad.core.registry import Q_, ureg

__all__ = ["ACCEPTED_FORMS", "MAX_EXPONENT", "MAX_LENGTH", "MAX_POWER", "read_unit", "read_value"]

MAX_LENGTH = 80
"""Longest text read at all (a value such as ``3'-6 1/2"`` is 9 characters)."""
MAX_EXPONENT = 400
"""Largest |exponent| of scientific notation read (anything beyond is out of float range)."""
MAX_POWER = 6
"""Largest |power| of a unit (``in^6`` is a warping constant)."""

ACCEPTED_FORMS = (
    "84 in, 0.5 in, 1.5e3 psi, 1,200 lbf, 3/16 in, 1 1/2 in, 1-1/2 in, 3'-6\", 3'-6 1/2\", "
    "3 ft 6 in, 3 ft 6-1/2 in, -0'-6\", 2.5 kip*ft (or kip-ft), 12 lbf/ft, 4.5 in^4, 0.85"
)

# Typographic forms read as their ASCII twins.
_TRANSLATE = str.maketrans({
    "²": "^2", "³": "^3", "⁴": "^4", "⁵": "^5", "⁶": "^6",
    "·": "*", "⋅": "*", "×": "*", "µ": "u", "μ": "u",
    "−": "-", "–": "-", "‐": "-", "‑": "-",
    "′": "'", "’": "'", "‘": "'", "″": '"', "“": '"', "”": '"',
    "°": " degree ", "%": " percent ",
    "½": " 1/2", "¼": " 1/4", "¾": " 3/4", "⅛": " 1/8", "⅜": " 3/8", "⅝": " 5/8", "⅞": " 7/8",
})
_ALLOWED = frozenset("0123456789abcdefghijklmnopqrstuvwxyzABCDEFGHIJKLMNOPQRSTUVWXYZ_ .,+-*/^()'\"")
_PUNCT = "+-*/^()'\".,"
_NUMBER = re.compile(r"(?:[1-9]\d{0,2}(?:,\d{3})+|\d+)(?:\.\d*)?(?:[eE][+-]?\d+)?|\.\d+(?:[eE][+-]?\d+)?")
_NAME = re.compile(r"[A-Za-z][A-Za-z0-9_]*")

_FOOT_NAMES = frozenset({"ft", "foot", "feet"})
_INCH_NAMES = frozenset({"in", "inch", "inches"})
_POUND_FORCE = frozenset({"lb", "lbs"})  # a bare lb is a load (documented); "pound" is mass
# Only SI units take a prefix: "kin" (kilo-inch) or "pft" is a typo, not a unit.
_PREFIXABLE = frozenset({"meter", "gram", "newton", "pascal", "second", "joule", "watt", "liter", "radian"})
_BASE_DIMENSIONS = frozenset({"[length]", "[mass]", "[time]"})
_COMMON_UNITS = (
    "in", "ft", "yd", "lbf", "kip", "psi", "ksi", "psf", "ksf", "plf", "klf", "pcf", "pound", "mph",
    "mm", "cm", "m", "N", "kN", "Pa", "kPa", "MPa", "GPa", "kg", "degree", "radian", "percent", "s",
)


@dataclass(frozen=True)
class _Token:
    kind: str  # "num", "name", or the punctuation character itself
    text: str
    col: int  # 1-based column in the normalised text
    space: bool  # whitespace right before it

    @property
    def whole(self) -> bool:
        """A whole number written with digits only (fractions and mixed numbers use these)."""
        return self.kind == "num" and _ascii_digits(self.text)


@dataclass(frozen=True)
class _Magnitude:
    value: Fraction
    whole: bool  # written as a whole number (1,200 or 3), not a decimal or fraction


class _RefusedError(Exception):
    def __init__(self, reason: str, hint: str = "") -> None:
        super().__init__(reason)
        self.reason, self.hint = reason, hint


def _message(field: str, raw: object, reason: str, hint: str, what: str) -> str:
    hint = f"; {hint}" if hint else ""
    return f"{field}: {raw!r} is not {what}: {reason}{hint}. Accepted forms: {ACCEPTED_FORMS}"


# --------------------------------------------------------------------------- tokens


def _ascii_digits(text: str) -> bool:
    """True for a non-empty run of 0-9 (``str.isdigit`` also takes superscripts such as ``¹``)."""
    return bool(text) and all("0" <= ch <= "9" for ch in text)


def _normalise(text: str) -> str:
    return " ".join(text.translate(_TRANSLATE).split())


def _tokens(text: str) -> list[_Token]:
    out: list[_Token] = []
    i, n, space = 0, len(text), False
    while i < n:
        c = text[i]
        if c == " ":
            space, i = True, i + 1
            continue
        if c not in _ALLOWED:
            raise _RefusedError(f"the character {c!r} is not part of a value")
        if _ascii_digits(c) or (c == "." and i + 1 < n and _ascii_digits(text[i + 1])):
            m = _NUMBER.match(text, i)
            assert m is not None  # a digit (or .digit) always starts a number
            j = m.end()
            nxt = text[j] if j < n else ""
            if _ascii_digits(nxt) or (nxt == "," and j + 1 < n and _ascii_digits(text[j + 1])):
                raise _RefusedError(f"{text[i:j + 2]!r} is not a number", "commas separate thousands in groups of three (1,200); decimals take a point (1.5)")
            if nxt == ".":
                raise _RefusedError(f"{text[i:j + 1]!r} is not a number", "a number has one decimal point")
            if nxt and nxt in "eE" and not re.search(r"[eE][+-]?\d+$", m.group()):
                raise _RefusedError(f"{text[i:j + 1]!r} is not a number",
                                    "write scientific notation with digits after e (1.5e3) and a space before the unit")
            out.append(_Token("num", m.group(), i + 1, space))
            i = j
        elif c.isalpha():
            m = _NAME.match(text, i)
            assert m is not None
            out.append(_Token("name", m.group(), i + 1, space))
            i = m.end()
        elif c in _PUNCT:
            if c == "*" and text.startswith("**", i):
                out.append(_Token("^", "**", i + 1, space))
                i += 2
            else:
                out.append(_Token(c, c, i + 1, space))
                i += 1
        else:
            raise _RefusedError(f"the character {c!r} is not part of a value")
        space = False
    return out


# --------------------------------------------------------------------------- unit names


@functools.lru_cache(maxsize=1)
def _constant_names() -> frozenset[str]:
    """Names of pint's physical constants (``e``, ``c``, ``pi``, ``k``, ``R`` ...): never units here."""
    names = {"pi", "e", "c", "k", "R", "G_0", "g_0", "g0", "g_n", "gravity", "eulers_number"}
    try:
        text = resources.files("pint").joinpath("constants_en.txt").read_text(encoding="utf-8")
    except (OSError, ModuleNotFoundError):  # pragma: no cover - another pint layout keeps the short list
        return frozenset(names)
    for line in text.splitlines():
        line = line.split("#", 1)[0]
        if "=" not in line or line.lstrip().startswith("@"):
            continue
        parts = [p.strip() for p in line.split("=")]
        names.add(parts[0])
        names.update(p for p in parts[2:] if re.fullmatch(r"\w+", p))
    return frozenset(names)


@functools.lru_cache(maxsize=512)
def _unit_named(name: str) -> pint.Unit:
    """The registry unit of one name, or :class:`_RefusedError` saying why it is not one."""
    if name in _POUND_FORCE:
        name = "lbf"
    if name in _constant_names():
        raise _RefusedError(f"{name!r} is a physical constant, not a unit", _unit_hint(name))
    candidates = ureg.parse_unit_name(name)
    if not candidates:
        raise _RefusedError(f"unknown unit {name!r}", _unit_hint(name))
    prefix, base, _suffix = candidates[0]
    if base in _constant_names():
        raise _RefusedError(f"{name!r} is a physical constant, not a unit", _unit_hint(name))
    if prefix and base not in _PREFIXABLE:
        raise _RefusedError(f"unknown unit {name!r} (read as {prefix}-{base})", _unit_hint(name))
    unit = ureg.Unit(prefix + base)
    if set(unit.dimensionality) - _BASE_DIMENSIONS:
        raise _RefusedError(f"{name!r} is not a unit of length, force, mass, time or angle", _unit_hint(name))
    return unit


def _unit_hint(name: str) -> str:
    m = re.fullmatch(r"([A-Za-z]+)([2-6])", name)
    if m:
        return f"write {m.group(1)}^{m.group(2)}"
    close = difflib.get_close_matches(name, _COMMON_UNITS, n=2, cutoff=0.6)
    return f"did you mean {' or '.join(close)}?" if close else f"units such as {', '.join(_COMMON_UNITS[:12])}"


# --------------------------------------------------------------------------- grammar


class _Reader:
    """Recursive descent over the tokens; every method consumes what it reads."""

    def __init__(self, tokens: list[_Token]) -> None:
        self.tokens = tokens
        self.i = 0

    def peek(self, k: int = 0) -> _Token | None:
        j = self.i + k
        return self.tokens[j] if j < len(self.tokens) else None

    def at(self, kind: str, k: int = 0) -> bool:
        tok = self.peek(k)
        return tok is not None and tok.kind == kind

    def take(self) -> _Token:
        if self.i >= len(self.tokens):
            raise _RefusedError("it ends where a number or unit should follow", "write e.g. 1-1/2 in or 84 in")
        tok = self.tokens[self.i]
        self.i += 1
        return tok

    def end(self) -> None:
        tok = self.peek()
        if tok is None:
            return
        if tok.kind == ".":
            raise _RefusedError(f"unexpected '.' at column {tok.col}", "write a unit without a period (84 in)")
        before = self.tokens[self.i - 1] if self.i else None
        after_unit = before is not None and (before.kind == "name" or (before.kind == "num" and self.i >= 2 and self.tokens[self.i - 2].kind == "^"))
        if tok.kind == "name" and after_unit:
            raise _RefusedError(f"two units side by side before {tok.text!r}", "join units with * or - (kip*ft or kip-ft)")
        raise _RefusedError(f"unexpected {tok.text!r} at column {tok.col}", "a value is one number and one unit")

    # ----------------------------------------------------------------- values

    def value(self) -> tuple[Fraction, pint.Unit]:
        negative = False
        if self.at("-") or self.at("+"):
            negative = self.take().kind == "-"
        tok = self.peek()
        if tok is None:
            raise _RefusedError("there is no number", "write e.g. 84 in")
        if tok.kind != "num":
            if tok.kind == "name" and tok.text.lower() in ("nan", "inf", "infinity"):
                raise _RefusedError(f"{tok.text!r} is not a finite number", "write the value as a number, e.g. 84 in")
            raise _RefusedError(f"a value starts with a number, not {tok.text!r}", "write e.g. 84 in")
        first = self.magnitude()
        if self.at("'"):
            amount, unit = self.feet_marks(first), ureg.inch
        elif self.at('"'):
            self.take()
            amount, unit = first.value, ureg.inch
        elif self.at("name") and self.peek().text in _FOOT_NAMES and self.at("num", 1):  # type: ignore[union-attr]
            amount, unit = self.feet_words(first), ureg.inch
        elif self.at("name") and self.peek().text in _FOOT_NAMES and self.at("-", 1) and self.at("num", 2):  # type: ignore[union-attr]
            raise _RefusedError("feet and inches joined by '-' after a unit", "write 3 ft 6 in or 3'-6\"")
        elif self.peek() is None:
            amount, unit = first.value, ureg.dimensionless
        else:
            amount, unit = first.value, self.unit()
        self.end()
        return (-amount if negative else amount), unit

    def magnitude(self) -> _Magnitude:
        tok = self.take()
        if self.at("/") and self.at("num", 1):
            self.take()
            den = self.take()
            value = self.fraction(tok, den)
            whole = False
        elif self.at("num") and self.peek().space:  # type: ignore[union-attr]
            second = self.take()
            if not (self.at("/") and self.at("num", 1)):
                digits = tok.text.replace(",", "")
                if _ascii_digits(digits) and second.whole and len(second.text) == 3:
                    hint = f"write {tok.text},{second.text} or {digits}{second.text}"
                else:
                    hint = "a value is one number; a mixed number is written 1 1/2 or 1-1/2"
                raise _RefusedError(f"two numbers {tok.text} and {second.text}", hint)
            self.take()
            value, whole = self.mixed(tok, second, self.take()), False
        elif self.at("-") and self.at("num", 1) and self.at("/", 2) and not self.peek().space and not self.peek(1).space:  # type: ignore[union-attr]
            self.take()
            second = self.take()
            self.take()
            value, whole = self.mixed(tok, second, self.take()), False
        elif self.at("-") and self.at("num", 1):
            raise _RefusedError(f"'-' between the numbers {tok.text} and {self.peek(1).text}",  # type: ignore[union-attr]
                                "a mixed number is written 1-1/2 or 1 1/2; a value is one number")
        else:
            value, whole = self.decimal(tok), "." not in tok.text and "e" not in tok.text.lower()
        nxt = self.peek()
        if nxt is not None and (nxt.kind in "^*(" or (nxt.kind == "/" and self.at("num", 1))):
            raise _RefusedError(f"{nxt.text!r} after the number {tok.text}: a value is a number, not a calculation",
                                "work the number out first; powers belong to units (in^4)")
        return _Magnitude(value, whole)

    @staticmethod
    def decimal(tok: _Token) -> Fraction:
        text = tok.text.replace(",", "")
        exp = re.search(r"[eE]([+-]?\d+)$", text)
        if exp and abs(int(exp.group(1))) > MAX_EXPONENT:
            raise _RefusedError(f"{tok.text} is out of range", "engineering values lie far inside 1e-300 to 1e300")
        return Fraction(text)

    @staticmethod
    def fraction(num: _Token, den: _Token) -> Fraction:
        if not (num.whole and den.whole):
            raise _RefusedError(f"{num.text}/{den.text} is not a fraction of whole numbers", "write e.g. 3/16 in")
        if int(den.text) == 0:
            raise _RefusedError(f"{num.text}/{den.text} divides by zero", "write e.g. 3/16 in")
        return Fraction(int(num.text), int(den.text))

    def mixed(self, whole: _Token, num: _Token, den: _Token) -> Fraction:
        digits = whole.text.replace(",", "")
        if not _ascii_digits(digits):
            raise _RefusedError(f"{whole.text} before a fraction is not a whole number", "write 1 1/2 or 1.5")
        part = self.fraction(num, den)
        if not 0 < part < 1:
            raise _RefusedError(f"{num.text}/{den.text} in a mixed number is not between 0 and 1", "write e.g. 1 1/2 in")
        return int(digits) + part

    def feet_marks(self, feet: _Magnitude) -> Fraction:
        self.take()  # the foot mark
        if self.peek() is None:
            return feet.value * 12
        if not feet.whole:
            raise _RefusedError("feet followed by inches must be a whole number of feet", "write 3'-6\" or 3.5'")
        if self.at("-"):
            self.take()
        if not self.at("num"):
            raise _RefusedError("after feet (') come inches with the inch mark (\")", "write 3'-6\" or 3'-6 1/2\"")
        inches = self.magnitude()
        if not self.at('"'):
            raise _RefusedError("the inches after feet (') need the inch mark (\")", "write 3'-6\" or 3 ft 6 in")
        self.take()
        return feet.value * 12 + self.inches_part(inches)

    def feet_words(self, feet: _Magnitude) -> Fraction:
        self.take()  # ft
        if not feet.whole:
            raise _RefusedError("feet followed by inches must be a whole number of feet", "write 3 ft 6 in or 3.5 ft")
        inches = self.magnitude()
        tok = self.peek()
        if tok is None or tok.kind != "name" or tok.text not in _INCH_NAMES:
            raise _RefusedError("feet and inches written in words end with the inch unit", "write 3 ft 6 in or 3'-6\"")
        self.take()
        return feet.value * 12 + self.inches_part(inches)

    @staticmethod
    def inches_part(inches: _Magnitude) -> Fraction:
        if not 0 <= inches.value < 12:
            raise _RefusedError("the inches after whole feet must be less than 12", "write 4'-1\" rather than 3'-13\"")
        return inches.value

    # ----------------------------------------------------------------- units

    def unit(self, reciprocal: bool = False) -> pint.Unit:
        if reciprocal and self.at("num") and self.peek().text == "1" and self.at("/", 1):  # type: ignore[union-attr]
            self.take()
            self.take()
            u = self.denominator() ** -1
        else:
            if not self.at("name"):
                tok = self.peek()
                what = "nothing" if tok is None else repr(tok.text)
                raise _RefusedError(f"expected a unit name, found {what}", "write e.g. in, kip*ft, lbf/ft, in^4")
            u = self.product()
            if self.at("/"):
                self.take()
                u = u / self.denominator()
        tok = self.peek()
        if tok is None:
            return u
        if tok.kind == "/" or (tok.kind in "*-" and self.at("name", 1)):
            raise _RefusedError(f"{tok.text!r} at column {tok.col}: a unit has one '/' with the whole denominator after it",
                                "write kip/(ft*in) or lbf/ft^2")
        if tok.kind in "*-^":
            raise _RefusedError(f"unexpected {tok.text!r} at column {tok.col}", "write units as kip*ft, kip-ft, lbf/ft or in^4")
        return u

    def product(self) -> pint.Unit:
        u = self.term()
        while True:
            if self.at("*"):
                self.take()
                u = u * self.term()
            elif self.at("-") and self.at("name", 1) and not self.peek().space and not self.peek(1).space:  # type: ignore[union-attr]
                self.take()
                u = u * self.term()
            else:
                return u

    def denominator(self) -> pint.Unit:
        if self.at("("):
            self.take()
            u = self.product()
            if not self.at(")"):
                raise _RefusedError("a '(' in a unit needs its ')'", "write kip/(ft*in)")
            self.take()
            return u
        return self.term()

    def term(self) -> pint.Unit:
        tok = self.peek()
        if tok is None or tok.kind != "name":
            what = "the end" if tok is None else repr(tok.text)
            raise _RefusedError(f"expected a unit name, found {what}", "write e.g. kip*ft, lbf/ft, in^4")
        self.take()
        u = _unit_named(tok.text)
        if self.at("^"):
            self.take()
            sign = 1
            if self.at("-"):
                self.take()
                sign = -1
            p = self.peek()
            power = _unit_power(p.text) if p is not None and p.kind == "num" else None
            if power is None or self.at("/", 1) or self.at("^", 1):
                raise _RefusedError(f"the power of {tok.text} must be a whole number from 1 to {MAX_POWER} (or a half, psi^0.5)", "write e.g. in^4 or in**4")
            self.take()
            u = u ** (sign * power)
        return u


def _unit_power(text: str) -> int | float | None:
    """A unit power as written: a whole number 1 to :data:`MAX_POWER`, or a half (0.5 to 5.5, as in
    ACI 318's lbf/(psi^0.5 in^1.5)); None for anything else."""
    if _ascii_digits(text):
        return int(text) if 1 <= int(text) <= MAX_POWER else None
    whole, dot, frac = text.partition(".")
    if dot and frac == "5" and (whole == "" or _ascii_digits(whole)) and int(whole or 0) < MAX_POWER:
        return int(whole or 0) + 0.5
    return None


# --------------------------------------------------------------------------- public


def _prepare(text: str) -> list[_Token]:
    if len(text) > MAX_LENGTH:
        raise _RefusedError(f"it is {len(text)} characters long (the limit is {MAX_LENGTH})", "write one number and a unit")
    norm = _normalise(text)
    if not norm:
        raise _RefusedError("it is empty", "write e.g. 84 in")
    return _tokens(norm)


def _to_float(amount: Fraction) -> float:
    try:
        x = float(amount)
    except OverflowError:
        raise _RefusedError("the number is too large to represent", "engineering values lie far inside 1e-300 to 1e300") from None
    if not math.isfinite(x):  # pragma: no cover - float(Fraction) overflows rather than returning inf
        raise _RefusedError("the number is not finite")
    if x == 0 and amount != 0:
        raise _RefusedError("the number is too small to represent", "engineering values lie far inside 1e-300 to 1e300")
    return x + 0.0  # no negative zero


def read_value(text: str, field: str = "value") -> pint.Quantity:
    """Read one value with its unit from ``text`` (see the module docstring for the forms).

    Raises:
        UnitInputError: naming ``field``, showing the text, the reason, a hint and the accepted forms.
    """
    try:
        amount, unit = _Reader(_prepare(text)).value()
        return Q_(_to_float(amount), unit)
    except _RefusedError as why:
        raise UnitInputError(_message(field, text, why.reason, why.hint, "a value with a unit")) from None


def read_unit(text: str, field: str = "unit") -> pint.Unit:
    """Read a unit (``"kip*ft"``, ``"kip-ft"``, ``"lbf/ft"``, ``"in^4"``, ``"1/in"``); ``""`` and ``"1"`` are no unit.

    Raises:
        UnitInputError: naming ``field``, the text and what a unit looks like.
    """
    try:
        tokens = _prepare(text) if text.strip() not in ("", "1") else []
        if not tokens:
            return ureg.dimensionless
        reader = _Reader(tokens)
        unit = reader.unit(reciprocal=True)
        reader.end()
        return unit
    except _RefusedError as why:
        raise UnitInputError(_message(field, text, why.reason, why.hint, "a unit")) from None
