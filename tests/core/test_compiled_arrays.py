"""Compiled sheets work in arrays they made themselves: inputs and other steps' arrays are never
overwritten, and the folded unit factors, written-out powers, subtracted terms and broadcasting
give what numpy written out in the test gives. Unit facts: 1 ft = 12 in, 1 kip = 1000 lbf
(exact by definition)."""

from __future__ import annotations

import numpy as np
import pytest

from calcpad import Sheet


def sheet() -> Sheet:
    sh = Sheet("arrays")
    sh.given("a", "2 in")
    sh.given("b", "1 ft")
    sh.given("w", "3 kip")
    sh.step("s", "a + b", unit="in")  # terms in two units
    sh.step("d", "-a + 2*b - a", unit="in")  # a leading minus and a subtracted term
    sh.step("p2", "a**2", unit="in^2")
    sh.step("p3", "a**3", unit="in^3")
    sh.step("p4", "(a + b)**4", unit="in^4")
    sh.step("p5", "a**5", unit="in^5")
    sh.step("q", "w*a/b**2", unit="lbf/in")
    sh.step("r", "sqrt(p4)/abs(-s)", unit="in")
    sh.given("cap", "100 in")
    sh.check("r vs cap", "r", "cap")
    return sh


def test_results_equal_numpy_written_out():
    f = sheet().compile()
    rng = np.random.default_rng(7)
    a, b, w = rng.uniform(0.5, 5.0, 1000), rng.uniform(0.5, 3.0, 1000), rng.uniform(1.0, 9.0, 1000)  # in, ft, kip
    keep = a.copy(), b.copy(), w.copy()
    out = f(a=a, b=b, w=w)
    b_in, w_lbf = 12.0 * b, 1000.0 * w
    s = a + b_in
    expect = {
        "s": s,
        "d": -a + 2 * b_in - a,
        "p2": a**2,
        "p3": a**3,
        "p4": s**4,
        "p5": a**5,
        "q": w_lbf * a / b_in**2,
        "r": np.sqrt(s**4) / s,
    }
    for name, value in expect.items():
        assert f.units[name] in ("inch", "inch ** 2", "inch ** 3", "inch ** 4", "inch ** 5", "force_pound / inch"), name
        np.testing.assert_allclose(out[name], value, rtol=1e-12, err_msg=name)
    np.testing.assert_allclose(out["chk_r_vs_cap"], (np.sqrt(s**4) / s) / 100.0, rtol=1e-12)
    for before, after in zip(keep, (a, b, w), strict=True):  # inputs untouched
        assert np.array_equal(before, after)


def test_steps_keep_their_own_arrays():
    f = sheet().compile()
    a = np.linspace(1.0, 3.0, 50)
    out = f(a=a)
    np.testing.assert_allclose(out["p2"], a**2, rtol=1e-12)  # p3, p4, p5 did not square p2's or a's array in place
    np.testing.assert_allclose(out["p3"], a**3, rtol=1e-12)
    np.testing.assert_allclose(out["s"], a + 12.0, rtol=1e-12)
    assert out["a"] is not out["p2"] and np.array_equal(out["a"], np.linspace(1.0, 3.0, 50))


def test_broadcast_scalar_and_grid():
    f = sheet().compile()
    a = np.linspace(1.0, 2.0, 4)[:, None]
    b = np.linspace(0.5, 1.0, 3)[None, :]
    out = f(a=a, b=b)
    assert out["q"].shape == (4, 3)
    np.testing.assert_allclose(out["q"], 3000.0 * a / (12.0 * b) ** 2, rtol=1e-12)
    one = f(a=2.0)
    assert float(one["p4"]) == pytest.approx(14.0**4, rel=1e-12)


def test_a_nan_input_still_marks_the_case_invalid():
    f = sheet().compile()
    out = f(a=np.array([1.0, np.nan, 2.0]))
    assert out.valid.tolist() == [True, False, True]
