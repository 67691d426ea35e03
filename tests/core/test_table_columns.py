"""One column of a sheet table prints with one precision rule (common practice for tables of
results: fixed decimals per column, set so the column's largest value has the sheet's 4
significant figures; DEVELOPERS.md "Results use 4 significant figures").

The frame case is a cantilever leg, 48 in, lateral W = 0.2 kip and dead D = 0.5 kip at the top
(invented), whose base reactions are statics: Rx = -P, Ry = -(vertical load), M = P L.
"""

from __future__ import annotations

import pandas as pd

from calcpad.core.sheet import Sheet
from calcpad.core.units import Q_
from calcpad.eng.analysis.frame import Frame, add_frame_results


def _rows(frame: pd.DataFrame) -> list[list[str]]:
    sh = Sheet("t", system="US")
    sh.table("T", frame)
    return sh.steps[-1].rows


def test_a_float_column_takes_the_decimals_of_its_largest_value() -> None:
    rows = _rows(pd.DataFrame({"case": ["D", "L", "W"], "Ry [lbf]": [0.07276, 1606.3, -0.4], "M [kip*ft]": [12.345, -0.001, 0.5]}))
    assert [r[1] for r in rows] == ["0", "1,606", "0"]  # not 0.07276 beside 1,606; no "−0"
    assert [r[2] for r in rows] == ["12.35", "0.00", "0.50"]


def test_a_quantity_column_is_shown_in_one_unit() -> None:
    rows = _rows(pd.DataFrame({"R": [Q_(1606.0, "lbf"), Q_(72.0, "lbf"), Q_(-3.2, "kip")]}))
    assert [r[0] for r in rows] == ["1.606 kip", "0.072 kip", "−3.200 kip"]


def test_mixed_kinds_keep_their_own_figures() -> None:
    rows = _rows(pd.DataFrame({"value": [Q_(2.5, "in"), Q_(1606.0, "lbf")], "label": ["a", "b"]}))
    assert [r[0] for r in rows] == ["2.500 in", "1.606 kip"]


def test_reaction_table_columns_use_one_rule() -> None:
    fr = Frame("kip", "in")
    fr.node("base", 0, 0)
    fr.node("top", 0, 48)
    fr.member("leg", "base", "top", E=29000.0, A=2.0, I=3.0)
    fr.support("base", "fixed")
    fr.node_load("W", "top", Fx=0.2)
    fr.node_load("D", "top", Fy=-0.5)
    sh = Sheet("Leg", system="US")
    add_frame_results(sh, fr.solve(), ["W", "D"])
    table = next(s for s in sh.steps if type(s).__name__ == "Table")
    by_case = {r[0]: r for r in table.rows}
    # statics: W gives Rx = -0.2 kip, Ry = 0, Mz = 0.2 x 48 = 9.6 kip*in; D gives Ry = 0.5 kip
    assert by_case["W"][2:] == ["−0.2000", "0.0000", "9.600"]
    assert by_case["D"][2:] == ["0.0000", "0.5000", "0.000"]
    for j in range(2, 5):  # every cell of a column has the same decimals
        assert len({len(r[j].split(".")[1]) if "." in r[j] else 0 for r in table.rows}) == 1
