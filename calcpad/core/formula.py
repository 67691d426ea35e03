"""Safe formula parser: a whitelist walk over Python's ``ast`` that builds sympy expressions.

The engineer's text is parsed with ``ast.parse(mode="eval")`` and every node is checked
against a short whitelist before a sympy node is built with ``evaluate=False``, so the printed
formula keeps the order and form the engineer wrote. Nothing is ever passed to ``eval`` or to
``sympify``. Attribute access, subscripts, imports, lambdas, comprehensions, keyword arguments,
strings and dunder names are all rejected with a message naming the offending piece.
"""

from __future__ import annotations

import ast
import difflib
import functools
from collections.abc import Iterable
from dataclasses import dataclass

import sympy as sp

from calcpad.core.errors import FormulaError
from calcpad.core.names import is_valid_name

__all__ = ["FUNCTIONS", "MAX_DEPTH", "RESERVED_NAMES", "Formula", "formula_from_sympy", "parse_condition", "parse_formula"]

MAX_LENGTH = 2000
MAX_DEPTH = 100
"""Deepest nesting of operations in one formula (the printers and evaluators recurse per level)."""

class _AsWritten:
    """Keeps a lattice function's arguments in the order written (sympy's Min/Max sort them);
    the result is still a :class:`sympy.Min`/:class:`sympy.Max` for evaluation and printing."""

    def __new__(cls, *args: object, **_options: object) -> sp.Expr:
        obj = sp.Expr.__new__(cls, *(sp.sympify(a) for a in args))
        obj._argset = frozenset(obj._args)
        return obj

    @property
    def args(self) -> tuple[sp.Basic, ...]:
        """The arguments in the order written."""
        return self._args  # type: ignore[attr-defined]


class MinAsWritten(_AsWritten, sp.Min):
    """``min(...)`` with its arguments in the order written."""


class MaxAsWritten(_AsWritten, sp.Max):
    """``max(...)`` with its arguments in the order written."""


# name in formula text -> (sympy class, number of arguments or None for 1+)
FUNCTIONS: dict[str, tuple[type, int | None]] = {
    "sqrt": (sp.Pow, 1),
    "min": (MinAsWritten, None),
    "max": (MaxAsWritten, None),
    "abs": (sp.Abs, 1),
    "sin": (sp.sin, 1),
    "cos": (sp.cos, 1),
    "tan": (sp.tan, 1),
    "asin": (sp.asin, 1),
    "acos": (sp.acos, 1),
    "atan": (sp.atan, 1),
    "log": (sp.log, 1),
    "log10": (sp.log, 1),
    "exp": (sp.exp, 1),
}
CONSTANTS = {"pi": sp.pi}
RESERVED_NAMES = frozenset(FUNCTIONS) | frozenset(CONSTANTS)
"""Names a formula reads as a constant or function; a given or step may not take them."""
_OPERATIONS = (ast.BinOp, ast.UnaryOp, ast.Call, ast.Compare, ast.BoolOp)


def _depth(tree: ast.AST) -> int:
    """Deepest nesting of operations, counted without recursion."""
    deepest, stack = 0, [(tree, 0)]
    while stack:
        node, level = stack.pop()
        if isinstance(node, _OPERATIONS):
            level += 1
            deepest = max(deepest, level)
        stack.extend((child, level) for child in ast.iter_child_nodes(node))
    return deepest


@dataclass(frozen=True)
class Formula:
    """A parsed formula: the sympy expression and the names it uses, in order of appearance."""

    text: str
    expr: sp.Basic
    names: tuple[str, ...]


def _suggest(word: str, options: Iterable[str]) -> str:
    close = difflib.get_close_matches(word, list(options), n=3, cutoff=0.6)
    return f"; did you mean {', '.join(repr(c) for c in close)}?" if close else ""


class _Builder(ast.NodeVisitor):
    def __init__(self, text: str, allow_compare: bool) -> None:
        self.text = text
        self.allow_compare = allow_compare
        self.names: list[str] = []

    def fail(self, node: ast.AST, what: str) -> FormulaError:
        col = getattr(node, "col_offset", None)
        where = f" at column {col + 1}" if col is not None else ""
        return FormulaError(f"formula {self.text!r}: {what}{where}")

    def generic_visit(self, node: ast.AST) -> sp.Basic:  # anything not whitelisted
        kind = {
            ast.Attribute: "attribute access ('.') is not allowed",
            ast.Subscript: "indexing ('[...]') is not allowed",
            ast.Lambda: "lambda is not allowed",
            ast.ListComp: "comprehensions are not allowed",
            ast.GeneratorExp: "comprehensions are not allowed",
            ast.SetComp: "comprehensions are not allowed",
            ast.DictComp: "comprehensions are not allowed",
            ast.NamedExpr: "assignment (':=') is not allowed",
            ast.IfExp: "inline 'if' is not allowed; use a branch step",
            ast.Starred: "'*' unpacking is not allowed",
            ast.JoinedStr: "strings are not allowed",
        }.get(type(node), f"{type(node).__name__} is not allowed in a formula")
        raise self.fail(node, kind)

    def visit_Expression(self, node: ast.Expression) -> sp.Basic:
        return self.visit(node.body)

    def visit_Constant(self, node: ast.Constant) -> sp.Basic:
        value = node.value
        if isinstance(value, bool) or not isinstance(value, (int, float)):
            raise self.fail(node, f"{value!r} is not a number")
        if isinstance(value, int):
            return sp.Integer(value)
        return sp.Float(repr(value), dps=15)

    def visit_Name(self, node: ast.Name) -> sp.Basic:
        name = node.id
        if name in CONSTANTS:
            return CONSTANTS[name]
        if name in FUNCTIONS:
            raise self.fail(node, f"{name!r} is a function; write {name}(...)")
        if name.startswith("_") or "__" in name or not is_valid_name(name):
            raise self.fail(node, f"name {name!r} is not allowed (letters, digits and single underscores only)")
        if name not in self.names:
            self.names.append(name)
        return sp.Symbol(name)

    def visit_UnaryOp(self, node: ast.UnaryOp) -> sp.Basic:
        operand = self.visit(node.operand)
        if isinstance(node.op, ast.USub):
            if isinstance(operand, sp.Number):
                return -operand
            return sp.Mul(sp.Integer(-1), operand, evaluate=False)
        if isinstance(node.op, ast.UAdd):
            return operand
        if isinstance(node.op, ast.Not) and self.allow_compare:
            return sp.Not(operand, evaluate=False)
        raise self.fail(node, f"operator {type(node.op).__name__} is not allowed")

    def visit_BinOp(self, node: ast.BinOp) -> sp.Basic:
        left, right = self.visit(node.left), self.visit(node.right)
        op = node.op
        # a chain a*b*c (or a + b - c) becomes one flat node, as written, not ((a*b)*c)
        chained = isinstance(node.left, ast.BinOp)
        if isinstance(op, (ast.Add, ast.Sub)):
            term = right if isinstance(op, ast.Add) else sp.Mul(sp.Integer(-1), right, evaluate=False)
            lead = list(left.args) if chained and isinstance(node.left.op, (ast.Add, ast.Sub)) and isinstance(left, sp.Add) else [left]
            return sp.Add(*lead, term, evaluate=False)
        if isinstance(op, ast.Mult):
            negated = isinstance(node.left, ast.UnaryOp) and isinstance(node.left.op, ast.USub) and isinstance(left, sp.Mul)
            flat = (chained and isinstance(node.left.op, ast.Mult)) or negated
            lead = list(left.args) if flat and isinstance(left, sp.Mul) else [left]
            return sp.Mul(*lead, right, evaluate=False)
        if isinstance(op, ast.Div):
            negated = isinstance(node.left, ast.UnaryOp) and isinstance(node.left.op, ast.USub)
            flat = (chained and isinstance(node.left.op, ast.Mult)) or negated
            lead = list(left.args) if flat and isinstance(left, sp.Mul) else [left]
            return sp.Mul(*lead, sp.Pow(right, sp.Integer(-1), evaluate=False), evaluate=False)
        if isinstance(op, ast.Pow):
            return sp.Pow(left, right, evaluate=False)
        symbol = {ast.BitXor: "'^' (write powers as **)", ast.FloorDiv: "'//'", ast.Mod: "'%'", ast.MatMult: "'@'"}
        raise self.fail(node, f"operator {symbol.get(type(op), type(op).__name__)} is not allowed")

    def visit_Call(self, node: ast.Call) -> sp.Basic:
        if not isinstance(node.func, ast.Name):
            raise self.fail(node, "only calls of the functions " + ", ".join(sorted(FUNCTIONS)) + " are allowed")
        fname = node.func.id
        if fname not in FUNCTIONS:
            raise self.fail(node, f"unknown function {fname!r}{_suggest(fname, FUNCTIONS)}; allowed: " + ", ".join(sorted(FUNCTIONS)))
        if node.keywords:
            raise self.fail(node, f"{fname}() takes no keyword arguments")
        cls, nargs = FUNCTIONS[fname]
        args = [self.visit(a) for a in node.args]
        if nargs is not None and len(args) != nargs:
            raise self.fail(node, f"{fname}() takes {nargs} argument(s), got {len(args)}")
        if nargs is None and len(args) < 1:
            raise self.fail(node, f"{fname}() needs at least one argument")
        if fname == "sqrt":
            return sp.Pow(args[0], sp.Rational(1, 2), evaluate=False)
        if fname == "log10":
            return sp.log(args[0], sp.Integer(10), evaluate=False)
        if nargs is None and len(args) == 1:
            return args[0]
        return cls(*args, evaluate=False)

    def visit_Compare(self, node: ast.Compare) -> sp.Basic:
        if not self.allow_compare:
            raise self.fail(node, "comparisons belong in a branch condition, not in a formula")
        ops = {ast.Lt: sp.StrictLessThan, ast.LtE: sp.LessThan, ast.Gt: sp.StrictGreaterThan, ast.GtE: sp.GreaterThan}
        left = self.visit(node.left)
        parts = []
        for op, comp in zip(node.ops, node.comparators, strict=True):
            if type(op) not in ops:
                raise self.fail(node, f"comparison {type(op).__name__} is not allowed; use <, <=, > or >=")
            right = self.visit(comp)
            parts.append(ops[type(op)](left, right, evaluate=False))
            left = right
        return parts[0] if len(parts) == 1 else sp.And(*parts, evaluate=False)

    def visit_BoolOp(self, node: ast.BoolOp) -> sp.Basic:
        if not self.allow_compare:
            raise self.fail(node, "'and'/'or' belong in a branch condition, not in a formula")
        args = [self.visit(v) for v in node.values]
        return (sp.And if isinstance(node.op, ast.And) else sp.Or)(*args, evaluate=False)


def _short(text: str) -> str:
    return text if len(text) <= 60 else text[:57] + "..."


def _parse(text: str, allow_compare: bool) -> Formula:
    if not isinstance(text, str):
        raise FormulaError(f"formula {text!r}: expected a formula string such as 'M*c/I'")
    return _parse_text(text, allow_compare)


@functools.lru_cache(maxsize=8192)
def _parse_text(text: str, allow_compare: bool) -> Formula:
    """Parse once per text: a template re-run (what-if panel) writes the same formulas again.
    Formulas are frozen and sympy trees immutable, so sheets can share them; a refused text
    raises every time (exceptions are not cached)."""
    if len(text) > MAX_LENGTH:
        raise FormulaError(f"formula is {len(text)} characters long; the limit is {MAX_LENGTH}")
    if not text.strip():
        raise FormulaError("formula is empty; expected e.g. 'M*c/I'")
    if "__" in text:
        raise FormulaError(f"formula {text!r}: double-underscore names are not allowed")
    try:
        tree = ast.parse(text.strip(), mode="eval")
    except SyntaxError as exc:
        col = f" at column {exc.offset}" if exc.offset else ""
        raise FormulaError(f"formula {text!r}: not a valid formula{col} ({exc.msg})") from None
    except (RecursionError, MemoryError):
        raise FormulaError(f"formula {_short(text)!r}: nested too deeply to read; split it into steps") from None
    depth = _depth(tree)
    if depth > MAX_DEPTH:
        raise FormulaError(f"formula {_short(text)!r}: operations nest {depth} levels deep (the limit is {MAX_DEPTH}); split it into steps")
    builder = _Builder(text, allow_compare)
    expr = builder.visit(tree)
    return Formula(text=text, expr=expr, names=tuple(builder.names))


def parse_formula(text: str) -> Formula:
    """Parse an arithmetic formula such as ``"pi/64*(D_o**4 - D_i**4)"``.

    Raises:
        FormulaError: The text uses anything outside the whitelist, or is not valid syntax.
    """
    return _parse(text, allow_compare=False)


def parse_condition(text: str) -> Formula:
    """Parse a branch condition such as ``"KL_r <= 4.71*sqrt(E/F_y)"`` (comparisons, and/or)."""
    return _parse(text, allow_compare=True)


def formula_from_sympy(expr: sp.Basic, text: str | None = None) -> Formula:
    """Wrap a sympy expression built in Python; its free symbols become the names it uses."""
    if not isinstance(expr, sp.Basic):
        raise FormulaError(f"expected a formula string or sympy expression, got {type(expr).__name__}")
    names = []
    for sym in sp.preorder_traversal(expr):
        if isinstance(sym, sp.Symbol) and sym.name not in names:
            if not is_valid_name(sym.name):
                raise FormulaError(f"symbol {sym.name!r} is not a valid calc name")
            names.append(sym.name)
    return Formula(text=text or str(expr), expr=expr, names=tuple(names))
