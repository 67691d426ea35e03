"""Load combinations vs ASCE 7-16 Sec. 2.3.1 (LRFD) and 2.4.1 (ASD)."""

from __future__ import annotations

import numpy as np
import pytest

from calcpad.core.errors import InputError
from calcpad.core.units import Q_
from calcpad.eng.loads.combinations import basic_combinations, combine


def _factor_sets(method: str, loads: list[str], **kw: object) -> set[tuple[tuple[str, float], ...]]:
    return {tuple(sorted(c.factors.items())) for c in basic_combinations(method, loads, **kw)}


def test_lrfd_basic_set_d_l_s_w() -> None:
    # ASCE 7-16 Sec. 2.3.1 combinations 1-5 with roof load S, wind both ways (from memory)
    got = _factor_sets("LRFD", ["D", "L", "S", "W"])
    want = {
        (("D", 1.4),),
        (("D", 1.2), ("L", 1.6), ("S", 0.5)),
        (("D", 1.2), ("L", 1.0), ("S", 1.6)),
        (("D", 1.2), ("S", 1.6), ("W", 0.5)),
        (("D", 1.2), ("S", 1.6), ("W", -0.5)),
        (("D", 1.2), ("L", 1.0), ("S", 0.5), ("W", 1.0)),
        (("D", 1.2), ("L", 1.0), ("S", 0.5), ("W", -1.0)),
        (("D", 0.9), ("W", 1.0)),
        (("D", 0.9), ("W", -1.0)),
    }
    assert got == want


def test_asd_basic_set_d_l_lr_w() -> None:
    # ASCE 7-16 Sec. 2.4.1 combinations 1-7 with roof live load Lr (from memory)
    got = _factor_sets("ASD", ["D", "L", "Lr", "W"], wind_reversal=False)
    want = {
        (("D", 1.0),),
        (("D", 1.0), ("L", 1.0)),
        (("D", 1.0), ("Lr", 1.0)),
        (("D", 1.0), ("L", 0.75), ("Lr", 0.75)),
        (("D", 1.0), ("W", 0.6)),
        (("D", 1.0), ("L", 0.75), ("Lr", 0.75), ("W", 0.45)),
        (("D", 0.6), ("W", 0.6)),
    }
    assert got == want


def test_governing_combination_named_for_uplift_and_gravity() -> None:
    # a leg axial force (kip, compression +): D = 2, L = 3, W = +/-6 (invented effects)
    r = combine({"D": 2.0, "L": 3.0, "W": 6.0}, "LRFD")
    # 1.2D + 1.6L = 7.2; 1.2D + 1.0W + 1.0L = 11.4; 0.9D - 1.0W = -4.2
    assert r.max == pytest.approx(11.4)
    assert r.governing("max") == "LC4+"
    assert r.min == pytest.approx(-4.2)
    assert r.governing("min") == "LC5-"
    assert "0.9D - W" in r.label(r.names.index("LC5-"))


def test_arrays_and_quantities() -> None:
    D = Q_(np.array([1.0, -2.0, 0.5]), "kip*ft")
    W = Q_(np.array([4.0, 1.0, -3.0]), "kip*ft")
    r = combine({"D": D, "W": W}, "ASD", unit="kip*ft")
    assert r.values.shape[1:] == (3,)
    expected_abs = np.max(np.abs(np.array([c.factors.get("D", 0) * D.magnitude + c.factors.get("W", 0) * W.magnitude
                                            for c in r.combinations])), axis=0)
    assert np.allclose(np.abs(r.absmax), expected_abs)
    assert list(r.governing("abs")) == [r.names[i] for i in r.governing_abs]


def test_live_half_exception() -> None:
    # ASCE 7-16 Sec. 2.3.1 exception 1: L factor 0.5 in comb. 3 and 4
    got = _factor_sets("LRFD", ["D", "L", "W"], live_half=True, wind_reversal=False)
    assert (("D", 1.2), ("L", 0.5), ("W", 1.0)) in got


def test_bad_inputs() -> None:
    with pytest.raises(InputError, match="method"):
        basic_combinations("WSD", ["D"])
    with pytest.raises(InputError, match="load name"):
        combine({"D": 1.0, "Q": 2.0})
    with pytest.raises(InputError, match="dead load"):
        basic_combinations("LRFD", ["L"])
    with pytest.raises(InputError, match="shapes"):
        combine({"D": [1.0, 2.0], "L": [1.0]})


def test_governing_effect_in_sheet() -> None:
    sheet = pytest.importorskip("calcpad.core.sheet")
    sh = sheet.Sheet("Leg axial", method="ASD")
    from calcpad.eng.loads.combinations import add_governing_effect

    # leg axial force, tension +: D = -0.4 kip, W = +1.5 kip (invented effects)
    name = add_governing_effect(sh, "P_a", {"D": Q_(-0.4, "kip"), "W": Q_(1.5, "kip")}, which="max")
    # ASCE 7-16 Sec. 2.4.1 comb. 7: 0.6D + 0.6W = -0.24 + 0.9 = 0.66 kip governs uplift
    assert name == "AC7+"
    assert sh["P_a"].to("kip").magnitude == pytest.approx(0.66)
    tables = [s for s in sh.steps if type(s).__name__ == "Table"]
    assert len(tables[0].rows) == 7  # AC1, AC5+-, AC6+- (D + 0.75(0.6W) with no L), AC7+-
    with pytest.raises(InputError, match="which"):
        add_governing_effect(sh, "P_b", {"D": 1.0}, which="mid")
