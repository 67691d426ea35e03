"""The what-if panel: controls change givens, the checks follow, bad values are refused.

Hand arithmetic for the leg (plain floats, not through calcpad), all common practice:
M = P·L, I = π/64·(D_o⁴ − D_i⁴), D_i = D_o − 2t, c = D_o/2, σ = M·c/I, FS = F_y/σ,
ratio = FS_req/FS. Tube 1.900 in OD × 0.145 in wall (NPS 1-1/2 Sch 40 nominal, ASME B36.10M,
from memory); ASTM A53 Gr B F_y = 35 ksi (common practice).
"""

from __future__ import annotations

import math
import subprocess
import sys
from pathlib import Path

import pytest

from calcpad import Sheet
from calcpad.core.errors import SheetError
from calcpad.widgets import WhatIfPanel, what_if

ROOT = Path(__file__).resolve().parents[2]
REL = 1e-9
FS_REQ = 1.67


def leg_sheet() -> Sheet:
    """The sheet of notebooks/leg_bending.py with its default parameters."""
    sh = Sheet("Leg - bending at base")
    sh.heading("Inputs")
    sh.given("P", "85 lbf", "Lateral load at top of leg")
    sh.given("L", "42 in", "Leg length, base to load")
    sh.given("D_o", "1.900 in", "Outside diameter")
    sh.given("t", "0.145 in", "Wall thickness")
    sh.given("F_y", "35 ksi", "Yield stress", source="ASTM A53 Gr B")
    sh.heading("Section properties")
    sh.step("D_i", "D_o - 2*t", "Inside diameter")
    sh.step("I", "pi/64*(D_o**4 - D_i**4)", "Moment of inertia", unit="in^4")
    sh.step("c", "D_o/2", "Extreme fibre distance")
    sh.heading("Demand and check")
    sh.step("M", "P*L", "Base moment", ref="cantilever, statics")
    sh.step("sigma_b", "M*c/I", "Bending stress at base", unit="ksi")
    sh.check("Bending stress vs yield", demand="sigma_b", capacity="F_y", required_fs=FS_REQ, ref="yield-based, common practice")
    return sh


def hand_ratio(P_lbf: float, L_in: float = 42.0, D_o: float = 1.900, t: float = 0.145, F_y_psi: float = 35_000.0) -> float:
    """ratio = FS_req / (F_y / σ), σ = P·L·(D_o/2)/I, I = π/64·(D_o⁴ − D_i⁴) (common practice)."""
    D_i = D_o - 2 * t
    I = math.pi / 64 * (D_o**4 - D_i**4)
    sigma = P_lbf * L_in * (D_o / 2) / I
    return FS_REQ / (F_y_psi / sigma)


def test_one_control_per_given_in_its_own_unit() -> None:
    sh = leg_sheet()
    panel = what_if(sh)
    assert isinstance(panel, WhatIfPanel)
    assert panel.sheet is sh
    assert list(panel.controls) == ["P", "L", "D_o", "t", "F_y"]
    assert panel.controls["P"].value == 85.0  # lbf, as given
    assert panel.controls["F_y"].value == 35.0  # ksi, as given
    assert panel.last_error is None


def test_changing_p_through_the_control_recomputes_the_check() -> None:
    sh = leg_sheet()
    panel = what_if(sh)
    before = sh.summary()[0].ratio
    assert before == pytest.approx(hand_ratio(85.0), rel=REL)
    panel.controls["P"].value = 120.0
    after = sh.summary()[0].ratio
    assert after != before
    assert after == pytest.approx(hand_ratio(120.0), rel=REL)
    assert sh["P"].to("lbf").magnitude == pytest.approx(120.0)
    assert panel.last_error is None
    shown = panel._out.outputs[0]["data"]["text/plain"]
    assert f"{after:.3f}" in shown and "OK" in shown


def test_set_with_another_unit_updates_sheet_and_control() -> None:
    sh = leg_sheet()
    panel = what_if(sh)
    assert panel.set("P", "0.2 kip") is True
    assert panel.controls["P"].value == pytest.approx(200.0)  # shown in the control's unit, lbf
    assert sh.summary()[0].ratio == pytest.approx(hand_ratio(200.0), rel=REL)


def test_wrong_unit_is_refused_and_sheet_keeps_its_value() -> None:
    sh = leg_sheet()
    panel = what_if(sh)
    assert panel.set("L", "3 lbf") is False
    assert panel.last_error is not None
    assert "'L'" in panel.last_error and "3 lbf" in panel.last_error and "in" in panel.last_error
    assert sh["L"].to("in").magnitude == pytest.approx(42.0)
    assert panel.controls["L"].value == 42.0
    assert "3 lbf" in panel._message.value  # shown in the panel, not raised


def test_zero_capacity_is_refused_and_the_last_good_values_stay() -> None:
    sh = leg_sheet()
    panel = what_if(sh)
    panel.set("P", "120 lbf")
    panel.controls["F_y"].value = 0.0  # the check's capacity becomes zero: the sheet refuses it
    assert panel.last_error is not None and "capacity" in panel.last_error and "F_y" in panel.last_error
    assert sh["F_y"].to("ksi").magnitude == pytest.approx(35.0)
    assert panel.controls["F_y"].value == 35.0
    assert sh.summary()[0].ratio == pytest.approx(hand_ratio(120.0), rel=REL)
    assert panel.set("P", "100 lbf") is True  # a good value clears the message
    assert panel.last_error is None and panel._message.value == ""


def test_reset_restores_the_starting_values() -> None:
    sh = leg_sheet()
    panel = what_if(sh)
    panel.set("P", "150 lbf")
    panel.reset()
    assert sh.summary()[0].ratio == pytest.approx(hand_ratio(85.0), rel=REL)
    assert panel.controls["P"].value == 85.0


def test_slider_and_dropdown_from_the_given_control() -> None:
    sh = leg_sheet()
    sh.given("a", "2 in", "Offset", min="1 in", max="5 in")
    sh.given("b", "2 in", "Spacing", choices=["1 in", "2 in", "4 in"])
    panel = what_if(sh, names=["a", "b"])
    slider, drop = panel.controls["a"], panel.controls["b"]
    assert type(slider).__name__ == "FloatSlider" and (slider.min, slider.max) == (1.0, 5.0)
    assert type(drop).__name__ == "Dropdown" and drop.value == "2 in"
    drop.value = "4 in"
    assert sh["b"].to("in").magnitude == pytest.approx(4.0)
    assert panel.set("a", "9 in") is False
    assert "max" in panel.last_error and sh["a"].to("in").magnitude == pytest.approx(2.0)


def test_governing_check_is_highlighted() -> None:
    sh = leg_sheet()
    sh.given("F_a", "20 ksi", "Allowable stress")
    sh.check("Bending stress vs allowable", demand="sigma_b", capacity="F_a")
    panel = what_if(sh, names=["P"])
    html = panel._out.outputs[0]["data"]["text/html"]
    governing = max(sh.summary(), key=lambda c: c.ratio)
    rows = [r for r in html.split("<tr") if "(governs)" in r]
    assert len(rows) == 1 and governing.title in rows[0] and "background" in rows[0]


def test_show_sheet_adds_a_live_copy_of_the_sheet() -> None:
    panel = what_if(leg_sheet(), show="sheet")
    kinds = [set(o.outputs[0]["data"]) for o in panel._sheet_outs]
    assert len(kinds) == 1 + len(panel.sheet.steps)  # the title, then one output per step
    assert all(k in ({"text/html", "text/latex", "text/plain"}, {"text/plain"}) for k in kinds)  # text only: a hidden step
    assert kinds[0] == {"text/html", "text/latex", "text/plain"}


def test_unknown_name_is_a_clear_error() -> None:
    with pytest.raises(SheetError, match=r"'Fy'.*did you mean 'F_y'"):
        what_if(leg_sheet(), names=["Fy"])


def test_panel_displays_as_its_widget_container() -> None:
    panel = what_if(leg_sheet())
    bundle = panel._repr_mimebundle_()
    assert bundle["application/vnd.jupyter.widget-view+json"]["model_id"] == panel.container.model_id


def test_import_calcpad_does_not_import_ipywidgets() -> None:
    code = "import sys, calcpad, calcpad.widgets; print('ipywidgets' in sys.modules)"
    out = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True, check=True, cwd=ROOT)
    assert out.stdout.strip() == "False"


def test_no_lower_layer_imports_the_widgets() -> None:
    for layer in ("core", "eng", "render"):
        for path in (ROOT / "calcpad" / layer).rglob("*.py"):
            assert "calcpad.widgets" not in path.read_text(encoding="utf-8"), path
