"""Vectorised evaluation equals the scalar (pint) path to 1e-12 relative on random inputs."""

from __future__ import annotations

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from calcpad import Sheet


def chain() -> Sheet:
    sh = Sheet("leg chain")
    sh.given("P", "250 lbf")
    sh.given("L", "84 in")
    sh.given("D_o", "2.375 in")
    sh.given("t", "0.154 in")
    sh.given("F_y", "35 ksi")
    sh.given("E", "29000 ksi")
    sh.given("K", 2.1)
    sh.step("M", "P*L")
    sh.step("D_i", "D_o - 2*t")
    sh.step("I", "pi/64*(D_o**4 - D_i**4)")
    sh.step("A", "pi/4*(D_o**2 - D_i**2)")
    sh.step("r", "sqrt(I/A)")
    sh.step("sigma_b", "M*(D_o/2)/I")
    sh.step("KL_r", "K*L/r")
    sh.step("F_e", "pi**2*E/KL_r**2")
    sh.branch("F_cr", [("KL_r <= 4.71*sqrt(E/F_y)", "0.658**(F_y/F_e)*F_y", "E3-2"), (None, "0.877*F_e", "E3-3")])
    sh.select("F_lim", "min", ["F_y", "F_cr"])
    sh.check("bending", "sigma_b", "F_y", required_fs=1.67)
    sh.check("buckling", "sigma_b", "F_lim")
    return sh


@settings(max_examples=40, deadline=None)
@given(
    P=st.floats(10, 5000),
    L=st.floats(12, 200),
    D_o=st.floats(1.0, 8.0),
    t_frac=st.floats(0.03, 0.3),
    K=st.floats(0.5, 2.5),
)
def test_compiled_equals_scalar(P, L, D_o, t_frac, K):
    sh = chain()
    f = sh.compile()
    t = D_o * t_frac
    out = f(P=np.array([P]), L=np.array([L]), D_o=np.array([D_o]), t=np.array([t]), K=np.array([K]))
    sh.set(P=f"{P!r} lbf", L=f"{L!r} in", D_o=f"{D_o!r} in", t=f"{t!r} in", K=K)
    res = sh.evaluate()
    for name in ("M", "I", "r", "sigma_b", "KL_r", "F_cr", "F_lim"):
        assert out[name][0] == pytest.approx(sh[name].to(f.units[name]).magnitude, rel=1e-12), name
    for c in res.checks:
        assert out[c.key][0] == pytest.approx(c.ratio, rel=1e-12), c.key


def test_compiled_defaults_and_quantities():
    sh = chain()
    f = sh.compile()
    base = f()
    assert base["M"] == pytest.approx(sh["M"].to(f.units["M"]).magnitude, rel=1e-12)
    from calcpad import Q_

    out = f(P=Q_(np.array([1.0, 2.0]), "kip"))
    assert out["M"].shape == (2,)
    assert out["M"][1] == pytest.approx(2 * out["M"][0])


def test_ratios_near_marks_the_cases_at_a_branch_boundary():
    """The column-curve limit KL/r = 4.71 sqrt(E/F_y) (AISC 360-16 E3) falls at
    L = 4.71 sqrt(E/F_y) r / K, with r = sqrt(I/A) = sqrt(D_o² + D_i²)/4 for a round tube
    (arithmetic): lengths within 1e-12 of it are marked, lengths 20 % off are not."""
    sh = chain()
    f = sh.compile()
    d_o, t = 2.375, 0.154
    r = np.hypot(d_o, d_o - 2 * t) / 4
    limit = 4.71 * np.sqrt(29000 / 35) * r / 2.1
    lengths = np.array([limit * (1 - 1e-12), limit * (1 + 1e-12), limit * 0.8, limit * 1.2])
    res, near = f.ratios_near(1e-9, L=lengths)
    assert near.tolist() == [True, True, False, False]
    plain = f.ratios(L=lengths)
    assert len(plain) == 2
    for key in plain:  # the same ratios as without the record
        assert np.array_equal(res[key], plain[key]), key
