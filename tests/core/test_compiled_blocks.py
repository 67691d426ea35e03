"""Large compiled calls run in blocks of rows (buffers reused from block to block, steps written
straight into their output rows): the results equal those of one whole-array pass bit for bit,
invalid cases and their messages included, and the values equal the chain written out in plain
numpy (the oracle) in SI base units. Unit facts: 1 in = 0.0254 m, 1 lbf = 4.4482216152605 N,
1 psi = 6894.757293168361 Pa (exact by definition, NIST SP 811, 2008, Appendix B)."""

from __future__ import annotations

import numpy as np
import pytest

from calcpad.core import compiled

from .test_compiled import chain  # the leg chain both files compile

IN, LBF, PSI = 0.0254, 4.4482216152605, 6894.757293168361


def inputs(n: int, bad: bool) -> dict[str, np.ndarray]:
    rng = np.random.default_rng(11)
    v = {"P": rng.uniform(10, 5000, n), "L": rng.uniform(12, 200, n), "D_o": rng.uniform(1.0, 8.0, n), "K": rng.uniform(0.5, 2.5, n)}
    v["t"] = v["D_o"] * rng.uniform(0.03, 0.3, n)
    if bad:  # a hollow-free zero tube (0/0), an infinite load, a zero yield stress (capacity not > 0)
        v["D_o"][5::777] = 0.0
        v["t"][5::777] = 0.0
        v["P"][7::3001] = np.inf
        v["F_y"] = np.where(np.arange(n) % 4999 == 3, 0.0, rng.uniform(30, 50, n))
    return v


def run(f, monkeypatch, block: int, method: str = "__call__", **values):
    monkeypatch.setattr(compiled, "BLOCK_CASES", block)
    return getattr(f, method)(**values)


@pytest.mark.parametrize("bad", [False, True])
@pytest.mark.parametrize("method", ["__call__", "ratios"])
def test_blocks_equal_one_pass(monkeypatch, bad, method):
    f = chain().compile()
    x = inputs(20_000, bad)
    whole = run(f, monkeypatch, 10**9, method, **x)
    blocked = run(f, monkeypatch, 1000, method, **x)  # 20 blocks plus the pool reused between them
    assert set(whole) == set(blocked)
    for k in whole:
        assert np.array_equal(np.broadcast_to(whole[k], (20_000,)), np.broadcast_to(blocked[k], (20_000,)), equal_nan=True), k
    assert np.array_equal(whole.valid, blocked.valid)
    assert whole.all_valid is (not bad)
    assert list(whole.invalid_step) == list(blocked.invalid_step)
    assert whole.reasons(40) == blocked.reasons(40)
    if bad:
        assert {"r", "M", "chk_bending"} <= set(whole.invalid_step)
        assert "capacity F_y = 0 ksi is not greater than zero" in blocked.reason(3)


def test_blocks_of_a_grid_equal_one_pass(monkeypatch):
    """Members down the rows, sizes across (as a design search calls it): blocks of rows."""
    f = chain().compile()
    rng = np.random.default_rng(3)
    P, L = rng.uniform(10, 5000, (3000, 1)), rng.uniform(12, 200, (3000, 1))
    D_o = rng.uniform(1.0, 8.0, (1, 40))
    for method in ("__call__", "ratios"):
        whole = run(f, monkeypatch, 10**9, method, P=P, L=L, D_o=D_o, t=0.1 * D_o)
        blocked = run(f, monkeypatch, 4000, method, P=P, L=L, D_o=D_o, t=0.1 * D_o)  # 100 rows a block
        for k in whole:
            assert np.shape(whole[k]) == np.shape(blocked[k]), k
            assert np.array_equal(whole[k], blocked[k], equal_nan=True), k
        if method == "__call__":
            assert blocked["I"].shape == (1, 40)  # a step of the sizes alone stays one row
            assert blocked["M"].shape == (3000, 1)
            assert blocked["chk_bending"].shape == (3000, 40)


def test_blocked_values_equal_numpy_written_out(monkeypatch):
    f = chain().compile()
    x = inputs(20_000, False)
    x["F_y"] = np.full(20_000, 36.0)
    out = run(f, monkeypatch, 1000, **x)
    P, L, D_o, t = x["P"] * LBF, x["L"] * IN, x["D_o"] * IN, x["t"] * IN
    Fy, E = 36e3 * PSI, 29e6 * PSI
    D_i = D_o - 2 * t
    I = np.pi / 64 * (D_o**4 - D_i**4)
    A = np.pi / 4 * (D_o**2 - D_i**2)
    r = np.sqrt(I / A)
    sigma = P * L * (D_o / 2) / I
    KL_r = x["K"] * L / r
    F_e = np.pi**2 * E / KL_r**2
    F_cr = np.where(KL_r <= 4.71 * np.sqrt(E / Fy), 0.658 ** (Fy / F_e) * Fy, 0.877 * F_e)
    F_lim = np.minimum(Fy, F_cr)
    assert out["sigma_b"] * 1e3 * PSI == pytest.approx(sigma, rel=1e-12)  # ksi
    assert out["KL_r"] == pytest.approx(KL_r, rel=1e-12)
    assert out["F_lim"] * 1e3 * PSI == pytest.approx(F_lim, rel=1e-12)
    assert out["chk_bending"] == pytest.approx(1.67 * sigma / Fy, rel=1e-12)
    assert out["chk_buckling"] == pytest.approx(sigma / F_lim, rel=1e-12)


def test_results_are_not_reused_buffers(monkeypatch):
    """What a call returned is not overwritten by the next call (block buffers stay internal)."""
    f = chain().compile()
    x = inputs(20_000, False)
    first = run(f, monkeypatch, 1000, **x)
    keep = {k: np.array(v, copy=True) for k, v in first.items()}
    run(f, monkeypatch, 1000, **inputs(20_000, True))
    run(f, monkeypatch, 1000, "ratios", **{k: v[::-1].copy() for k, v in x.items()})
    for k, v in keep.items():
        assert np.array_equal(first[k], v, equal_nan=True), k
