"""Seismic force on nonstructural components and the seismic load combinations.

Sources: ASCE 7-16 Sec. 13.3.1, Eqs. 13.3-1 (F_p = 0.4 a_p S_DS W_p (1 + 2 z/h) / (R_p/I_p)),
13.3-2 (upper limit 1.6 S_DS I_p W_p), 13.3-3 (lower limit 0.3 S_DS I_p W_p), Sec. 13.3.1.2
(vertical 0.2 S_DS W_p); Sec. 2.3.6 comb. 6/7 and Sec. 2.4.5 comb. 8/9/10 with
E_v = 0.2 S_DS D (Sec. 12.4.2.2), all from memory. Expected values are worked by hand in the tests.
"""

from __future__ import annotations

import pytest

from calcpad import Sheet
from calcpad.core.errors import InputError
from calcpad.eng.loads.combinations import basic_combinations
from calcpad.eng.loads.seismic import add_component_seismic

REL = 1e-9


def _fp(sds, wp, ap, rp, ip, z, h):
    fp = 0.4 * ap * sds * wp / (rp / ip) * (1 + 2 * min(z / h, 1.0))
    return min(max(fp, 0.3 * sds * ip * wp), 1.6 * sds * ip * wp)


@pytest.mark.parametrize(
    ("sds", "ap", "rp", "ip", "z_ft", "bound"),
    [(0.5, 2.5, 6.0, 1.0, 28.0, "eq"),  # rooftop unit: Eq. 13.3-1 between the limits
     (0.5, 1.0, 12.0, 1.0, 0.0, "min"),  # at grade, low a_p/R_p: lower limit 13.3-3 governs
     (1.0, 2.5, 1.0, 1.5, 28.0, "max"),  # rigid attachment high up: upper limit 13.3-2 governs
     (0.8, 2.5, 6.0, 1.0, 40.0, "eq")],  # z above h: z/h taken as 1.0
)
def test_component_force(sds, ap, rp, ip, z_ft, bound):
    sh = Sheet("seismic")
    names = add_component_seismic(sh, S_DS=sds, W_p="450 lbf", a_p=ap, R_p=rp, I_p=ip, z=f"{z_ft} ft", h="28 ft")
    expected = _fp(sds, 450.0, ap, rp, ip, z_ft, 28.0)
    assert sh[names.F_p].to("lbf").magnitude == pytest.approx(expected, rel=REL)
    assert sh[names.F_v].to("lbf").magnitude == pytest.approx(0.2 * sds * 450.0, rel=REL)
    raw = 0.4 * ap * sds * 450.0 / (rp / ip) * (1 + 2 * min(z_ft / 28.0, 1.0))
    limits = {"min": 0.3 * sds * ip * 450.0, "max": 1.6 * sds * ip * 450.0, "eq": raw}
    assert expected == pytest.approx(limits[bound], rel=REL)


@pytest.mark.parametrize(
    ("kw", "field"),
    [({"S_DS": 4.0}, "S_DS"), ({"a_p": 3.0}, "a_p"), ({"R_p": 0.5}, "R_p"), ({"I_p": 2.0}, "I_p"),
     ({"W_p": "-5 lbf"}, "W_p"), ({"W_p": "5 ft"}, "W_p"), ({"z": "-1 ft"}, "z"), ({"h": "0 ft"}, "h")],
)
def test_bad_input_names_the_field(kw, field):
    args = {"S_DS": 0.5, "W_p": "450 lbf", "a_p": 2.5, "R_p": 6.0, "z": "28 ft", "h": "28 ft"} | kw
    sh = Sheet("x")
    with pytest.raises(InputError, match=field):
        add_component_seismic(sh, **args)
    assert sh.steps == []


@pytest.mark.parametrize("sds", [0.3, 1.0])
def test_seismic_combinations_carry_e_v_in_the_dead_load_factor(sds):
    lrfd = {c.name: c.factors for c in basic_combinations("LRFD", ["D", "E"], S_DS=sds)}
    asd = {c.name: c.factors for c in basic_combinations("ASD", ["D", "L", "S", "E"], S_DS=sds)}
    assert lrfd["LC6E+"]["D"] == pytest.approx(1.2 + 0.2 * sds)
    assert lrfd["LC7E+"]["D"] == pytest.approx(0.9 - 0.2 * sds)
    assert asd["AC8E+"]["D"] == pytest.approx(1.0 + 0.14 * sds) and asd["AC8E+"]["E"] == pytest.approx(0.7)
    assert asd["AC9E+"]["D"] == pytest.approx(1.0 + 0.105 * sds) and asd["AC9E+"]["E"] == pytest.approx(0.525)
    assert asd["AC10E-"]["D"] == pytest.approx(0.6 - 0.14 * sds) and asd["AC10E-"]["E"] == pytest.approx(-0.7)


def test_without_s_ds_the_combinations_say_e_is_combined():
    combos = basic_combinations("ASD", ["D", "E"])
    assert all("E given as" in c.ref for c in combos if "E" in c.factors)
    with pytest.raises(InputError, match="S_DS"):
        basic_combinations("ASD", ["D", "E"], S_DS=-0.1)
