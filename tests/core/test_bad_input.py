"""Bad input gives clear errors naming the step and what was expected."""

from __future__ import annotations

import pytest

from calcpad import Sheet
from calcpad.core.errors import CalcpadError, DimensionError, FormulaError, SheetError
from calcpad.core.formula import parse_condition, parse_formula


def test_adding_length_to_force():
    sh = Sheet("bad")
    sh.given("P", "250 lbf")
    sh.given("L", "84 in")
    sh.step("X", "P + L", "nonsense")
    with pytest.raises(DimensionError, match=r"step 'X': cannot add P \(a force\) and L \(a length\)"):
        sh.evaluate()


def test_unknown_name_suggests():
    sh = Sheet("bad")
    sh.given("sigma_b", "20 ksi")
    sh.given("F_y", "36 ksi")
    sh.step("FS", "F_y/sigma_bb")
    with pytest.raises(SheetError, match=r"step 'FS': unknown name 'sigma_bb'; did you mean 'sigma_b'"):
        sh.evaluate()


def test_dependency_cycle():
    sh = Sheet("cycle")
    sh.step("a", "b*2")
    sh.step("b", "c + 1")
    sh.step("c", "a/3")
    with pytest.raises(SheetError, match=r"dependency cycle between steps: a -> b -> c -> a"):
        sh.evaluate()


INJECTIONS = [
    "__import__('os').system('echo hi')",
    "os.system('ls')",
    "P.__class__",
    "(lambda: 1)()",
    "[x for x in range(3)]",
    "open('/etc/passwd')",
    "eval('1+1')",
    "a[0]",
    "x if y else z",
    "(y := 2)",
    "'text'",
    "sqrt(x, key=1)",
    "import os",
    "P; Q",
    "{1: 2}",
    "f'{P}'",
    "getattr(P, 'm')",
    "*args",
    "_private + 1",
]


@pytest.mark.parametrize("text", INJECTIONS)
def test_parser_rejects_code(text):
    with pytest.raises(FormulaError) as err:
        parse_formula(text)
    assert "formula" in str(err.value)


def test_comparisons_only_in_conditions():
    with pytest.raises(FormulaError, match="branch condition"):
        parse_formula("a < b")
    assert parse_condition("a < b and c >= d").names == ("a", "b", "c", "d")


def test_unknown_function_suggests():
    with pytest.raises(FormulaError, match=r"unknown function 'sqr'; did you mean 'sqrt'"):
        parse_formula("sqr(x)")


def test_step_errors_name_the_step():
    sh = Sheet("s")
    with pytest.raises(FormulaError, match=r"step 'M': formula 'P\*\*\*L'"):
        sh.step("M", "P***L")
    sh.given("P", "1 kip")
    with pytest.raises(SheetError, match="defined twice"):
        sh.given("P", "2 kip")
    with pytest.raises(SheetError, match="not a given; did you mean 'P'"):
        sh.set(Pp="3 kip")
    with pytest.raises(CalcpadError, match=r"does not have the dimension"):
        sh.set(P="3 in")


def test_check_capacity_must_be_positive_and_same_kind():
    sh = Sheet("c")
    sh.given("d", "10 ksi")
    sh.given("z", "0 ksi")
    sh.given("L", "3 in")
    sh.check("zero", "d", "z")
    with pytest.raises(SheetError, match="must be greater than zero"):
        sh.evaluate()
    sh2 = Sheet("c2")
    sh2.given("d", "10 ksi")
    sh2.given("L", "3 in")
    sh2.check("mixed", "d", "L")
    with pytest.raises(DimensionError, match="different kinds"):
        sh2.evaluate()


def test_keyword_names_rejected_at_definition():
    sh = Sheet("kw")
    with pytest.raises(SheetError, match="'lambda' is not a valid name"):
        sh.given("lambda", 2.0)
