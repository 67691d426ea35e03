"""Execution: in-process and kernel give the same record; failures stay local to their calc."""

from __future__ import annotations

import json
import math
from pathlib import Path
from typing import Any

import pytest

from calcpad.runner.execute import run_job
from calcpad.runner.job import Job, load_job, parse_job
from calcpad.runner.record import JOB_RECORD_FORMAT, job_record

from .conftest import EXAMPLE, JOB_HEAD, tiny_calc


def _strip_run(record: dict[str, Any]) -> dict[str, Any]:
    return {k: v for k, v in record.items() if k != "run"}


def test_inprocess_and_kernel_records_are_identical() -> None:
    job = load_job(EXAMPLE)
    a = run_job(job, mode="inprocess")
    b = run_job(job, mode="kernel")
    ra, rb = job_record(job, a, "inprocess", 1.0), job_record(job, b, "kernel", 2.0)
    assert ra["summary"]["errors"] == 0 and ra["summary"]["checks"] > 0
    assert _strip_run(ra) == _strip_run(rb)
    assert [s["html"] for o in a for s in o.sheets] == [s["html"] for o in b for s in o.sheets]
    assert [len(o.sheets) for o in a] == [len(o.sheets) for o in b]
    for x, y in zip(a, b, strict=True):  # calc by calc, each sheet's record and printed HTML
        assert x.error is None and y.error is None
        assert [s["record"] for s in x.sheets] == [s["record"] for s in y.sheets], x.calc.member
    assert all(o.notebook is not None for o in b)
    for o in b:  # the kernel ran the cells an in-process run runs: up to the what-if cell
        code = [c for c in o.notebook.cells if c.cell_type == "code"]
        ran = [c for c in code if c.execution_count]
        assert [c.execution_count for c in ran] == list(range(1, len(ran) + 1))
        assert all("what_if(" not in c.source for c in ran)
        assert all(c.execution_count is None and not c.outputs for c in code[len(ran):])
    shown = [out for c in b[1].notebook.cells if c.cell_type == "code" for out in c.outputs]
    assert any("text/html" in out.get("data", {}) for out in shown)  # the live sheet display is kept
    tags = [c.metadata.get("tags", []) for c in b[0].notebook.cells]
    assert ["injected-parameters"] in tags  # papermill-style injection kept in the stored notebook
    # the kept notebooks ask for the kernel the set-up registers, like the stored templates
    stored = json.loads((Path(__file__).resolve().parents[2] / "notebooks" / "leg_bending.ipynb").read_text())
    assert {o.notebook.metadata["kernelspec"]["name"] for o in b} == {stored["metadata"]["kernelspec"]["name"]} == {"calcpad"}


def test_example_leg_matches_hand_calc() -> None:
    # Common practice: tube I = pi/64*(Do^4 - Di^4), sigma = N/A + M c / I, M = B2 P L (cantilever);
    # AISC 360-16 B4.2 design wall 0.93 t; App. 8 Eqs. A-8-6, A-8-7 with P_e,story = 0.85·3EI/L², α = 1.6 (ASD).
    job = load_job(EXAMPLE)
    calc = next(c for c in job.calcs if c.template.name == "leg_bending")
    (o,) = run_job(Job(job.info, [calc]))
    P, N, L, Do, t, Fy = 120.0, 115.0, 30.0, 1.900, 0.93 * 0.145, 35.0  # Pipe 1-1/2 Std
    I = math.pi / 64 * (Do**4 - (Do - 2 * t) ** 4)
    A = math.pi / 4 * (Do**2 - (Do - 2 * t) ** 2)
    B2 = 1 / (1 - 1.6 * N / (0.85 * 3 * 29.0e6 * I / L**2))
    sigma = (N / A + B2 * P * L * (Do / 2) / I) / 1000.0  # ksi
    rec = o.sheets[0]["record"]
    assert rec["results"]["sigma_b"]["unit"] == "ksi"
    assert rec["results"]["sigma_b"]["value"] == pytest.approx(sigma, rel=1e-3)
    check = next(c for c in rec["checks"] if c["title"] == "Combined stress vs yield")
    assert check["ratio"] == pytest.approx(1.67 * sigma / Fy, rel=1e-3)


def test_failing_cell_is_reported_and_other_calcs_run(tiny_env: Path) -> None:
    job = parse_job(JOB_HEAD + tiny_calc("A1", mode='"fail"') + tiny_calc("A2"))
    first, second = run_job(job)
    assert first.status == "ERROR"
    assert first.error == {"cell": 4, "message": "ValueError: requested failure"}
    assert second.status == "OK" and second.sheets


def test_failing_cell_same_in_kernel(tiny_env: Path) -> None:
    job = parse_job(JOB_HEAD + tiny_calc("A1", mode='"fail"') + tiny_calc("A2", P='"300 lbf"'))
    a, b = run_job(job), run_job(job, mode="kernel")
    assert [o.error for o in a] == [o.error for o in b]
    assert _strip_run(job_record(job, a, "x", 0)) == _strip_run(job_record(job, b, "y", 0))
    assert b[1].status == "NG"  # 300 lbf x 10 in = 3000 lbf*in > 2000 lbf*in


def test_sheets_in_binding_order_and_values_are_strings(tiny_env: Path) -> None:
    job = parse_job(JOB_HEAD + tiny_calc())
    (o,) = run_job(job)
    assert [s["record"]["title"] for s in o.sheets] == ["Second created", "First bound later"]
    assert o.sheets[1]["record"]["meta"] == {"template": "tiny", "member": "M1"}
    assert o.sheets[1]["record"]["results"]["M"] == {"value": 1000.0, "unit": "lbf*in"}


def test_record_fields(tiny_env: Path) -> None:
    job = parse_job(JOB_HEAD + tiny_calc())
    rec = job_record(job, run_job(job), "inprocess", 0.5)
    assert rec["format"] == JOB_RECORD_FORMAT
    (calc,) = rec["calcs"]
    assert calc["inputs"]["P"] == {"typed": "100 lbf", "value": 100.0, "unit": "lbf"}
    assert calc["inputs"]["mode"] == {"typed": "ok", "value": "ok", "unit": None}
    assert calc["checks"][0]["name"] == "Moment" and calc["checks"][0]["ratio"] == pytest.approx(0.5)
    assert set(rec["versions"]) >= {"calcpad", "python", "pint", "sympy", "numpy"}
    other = parse_job(JOB_HEAD + tiny_calc(P='"101 lbf"')).calcs[0]
    assert len(calc["input_digest"]) == 64 and calc["input_digest"] != other.input_digest


def test_job_units_set_sheet_display_system(tmp_path):
    """A job with units = "SI" prints sheets (that do not fix their own system) in SI units."""
    import os

    from calcpad.core.sheet import SYSTEM_ENV, Sheet

    before = os.environ.get(SYSTEM_ENV)
    os.environ[SYSTEM_ENV] = "SI"
    try:
        sh = Sheet("si")
        sh.given("P", "100 lbf")
        sh.given("L", "10 in")
        sh.step("M", "P*L")
        assert str(sh["M"].units) == "newton * meter"
        assert sh["M"].magnitude == pytest.approx(112.98482902761669)  # 1000 lbf·in × 0.1129848 N·m (NIST SP 811, from memory)
    finally:
        if before is None:
            os.environ.pop(SYSTEM_ENV, None)
        else:
            os.environ[SYSTEM_ENV] = before
    assert Sheet("us").system == (before or "US")


PANEL_TEMPLATE = '''\
# %% tags=["parameters"]
P = "100 lbf"  # load; 0 < P <= 1 kip

# %%
import ipywidgets
from calcpad import Sheet

sh = Sheet("Panel test")
sh.given("P", P, "Load")
sh.given("P_a", "500 lbf", "Allowable load")
sh.check("Load", demand="P", capacity="P_a")
helper = ipywidgets.FloatSlider(value=1.0)  # a widget made by the calc itself

# %%
from calcpad.widgets import what_if

panel = what_if(sh)

# %%
raise RuntimeError("a cell after the what-if cell ran in a batch")
'''


def test_batch_stops_before_the_what_if_cell_and_leaves_no_widgets(tmp_path: Path, monkeypatch: pytest.MonkeyPatch) -> None:
    import ipywidgets.widgets.widget as w

    (tmp_path / "panel_test.py").write_text(PANEL_TEMPLATE, encoding="utf-8")
    monkeypatch.setenv("CALCPAD_TEMPLATES", str(tmp_path))
    calcs = "".join(f'\n[[calcs]]\ntemplate = "panel_test"\nmember = "M{i}"\n[calcs.inputs]\nP = "{100 + i} lbf"\n' for i in range(4))
    job = parse_job(JOB_HEAD + calcs, "job.toml")
    run_job(job)  # first use: imports and registries settle
    before = len(w._instances)
    outcomes = run_job(job)
    assert [o.error for o in outcomes] == [None] * 4  # the failing cell after the panel is not run
    assert [s["record"]["inputs"]["P"]["value"] for o in outcomes for s in o.sheets] == [100.0, 101.0, 102.0, 103.0]
    assert len(w._instances) == before  # the widget registry does not grow per calc


def test_held_html_is_compressed_and_reads_back_as_printed() -> None:
    from calcpad import Sheet
    from calcpad.render.html import sheet_html_fragment
    from calcpad.runner.execute import SheetItem, collect_sheets

    sh = Sheet("Post")
    sh.given("P", "1.2 kip", "Axial load")
    sh.given("A", "1.07 in**2", "Area")
    sh.step("f_a", "P/A", "Axial stress", unit="ksi")  # 1.2 / 1.07 = 1.121 ksi (hand arithmetic)
    plain = collect_sheets({"sh": sh}, "t", "M1")[0]
    item = SheetItem.packed(plain)
    assert "html" not in item and len(item["html_z"]) < len(plain["html"].encode())
    assert item["html"] == plain["html"] == sheet_html_fragment(sh.evaluate(), heading_level=3)
    assert "<mn>1.121</mn>" in item["html"]
    assert item["record"] is plain["record"]
    with pytest.raises(KeyError):
        item["text"]  # only the HTML is packed; a missing key stays missing
