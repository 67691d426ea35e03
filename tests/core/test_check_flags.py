"""Check statuses beyond OK/NG: a flag turns an OK check into "OK, above recommended slenderness"
(still passing) and any check into "not covered" (not passing), evaluated with the values."""

from __future__ import annotations

import pytest

from calcpad import Sheet
from calcpad.core.errors import SheetError
from calcpad.core.results import EXISTING_NG, EXISTING_OK, NG, NOT_COVERED, OK, OK_SLENDER, status_ok


def _sheet(d="5 kip", slender="150"):
    sh = Sheet("flags")
    sh.given("D", d)
    sh.given("C", "10 kip")
    sh.given("s", slender)
    sh.check("ratio", "D", "C", key="r", flags=[("s", 200, OK_SLENDER)])
    sh.check("limit", "D", "C", key="n", flags=[("s", 300, NOT_COVERED)])
    return sh


@pytest.mark.parametrize(("d", "s", "r", "n"), [("5 kip", "150", OK, OK), ("5 kip", "250", OK_SLENDER, OK),
                                                ("12 kip", "250", NG, NG), ("5 kip", "350", OK_SLENDER, NOT_COVERED),
                                                ("12 kip", "350", NG, NOT_COVERED)])
def test_flags_set_the_status_with_the_values(d, s, r, n):
    sh = _sheet()
    sh.set(D=d, s=s)
    got = {c.key: c for c in sh.evaluate().checks}
    assert (got["r"].status, got["n"].status) == (r, n)
    assert got["r"].ok == (r != NG)
    assert got["n"].ok == (n == OK)


def test_status_ok():
    assert status_ok(OK) and status_ok(OK_SLENDER)
    assert not status_ok(NG) and not status_ok(NOT_COVERED)


def test_bad_flag_is_a_sheet_error():
    sh = Sheet("bad")
    sh.given("D", "1 kip")
    sh.given("C", "2 kip")
    with pytest.raises(SheetError, match="flag"):
        sh.check("x", "D", "C", flags=[("D", 1)])


@pytest.mark.parametrize(("d", "status"), [("5 kip", EXISTING_OK), ("12 kip", EXISTING_NG)])
def test_existing_condition_keeps_its_verdict_but_passes(d, status):
    sh = Sheet("before")
    sh.given("D", d)
    sh.given("C", "10 kip")
    sh.check("before repair", "D", "C", key="b", existing=True)
    res = sh.evaluate()
    assert res.checks[0].status == status
    assert res.checks[0].ok and res.ok and status_ok(status)
