"""Kernel mode: one request per calc; the kept notebook's outputs; a dead or hung kernel fails
only its calc (reported, kernel restarted) and the run goes on."""

from __future__ import annotations

from pathlib import Path

import nbformat
import pytest

from calcpad.runner.execute import run_job
from calcpad.runner.job import parse_job

from .conftest import JOB_HEAD

PROBE_TEMPLATE = '''\
# %% [markdown]
# # Probe template

# %% tags=["parameters"]
P = "100 lbf"  # load; 0 < P <= 1 kip
mode = "ok"  # what the calc does; ok, fail, die or hang

# %%
import os
import time

from calcpad import Sheet

print("building", P)
if mode == "die":
    os._exit(3)
if mode == "hang":
    time.sleep(600)
if mode == "fail":
    raise ValueError("requested failure")
sh = Sheet("Probe")
sh.given("P", P, "Load")
sh.given("L", "10 in", "Arm")
sh.step("M", "P*L", "Moment", unit="lbf*in")
sh.given("M_a", "2000 lbf*in", "Allowable moment")
sh.check("Moment", demand="M", capacity="M_a")
round(sh["M"].magnitude)

# %%
what_if(sh)  # never run by a batch: the what-if cell and those after it are for the reader
'''


@pytest.fixture
def probe_env(tmp_path: Path, monkeypatch: pytest.MonkeyPatch) -> Path:
    d = tmp_path / "templates"
    d.mkdir()
    (d / "probe.py").write_text(PROBE_TEMPLATE, encoding="utf-8")
    monkeypatch.setenv("CALCPAD_TEMPLATES", str(d))
    return d


def _job(*calcs: tuple[str, str, str]) -> str:
    return JOB_HEAD + "".join(
        f'\n[[calcs]]\ntemplate = "probe"\nmember = "{m}"\n[calcs.inputs]\nP = "{p}"\nmode = "{mode}"\n' for m, p, mode in calcs
    )


def test_outputs_and_errors_in_the_kept_notebook(probe_env: Path) -> None:
    job = parse_job(_job(("A1", "100 lbf", "ok"), ("A2", "150 lbf", "fail"), ("A3", "300 lbf", "ok")))
    a, b = run_job(job), run_job(job, mode="kernel")
    assert [o.error for o in a] == [o.error for o in b]
    assert b[1].error == {"cell": 3, "message": "ValueError: requested failure"}
    assert [o.status for o in b] == ["OK", "ERROR", "NG"]  # 300 lbf x 10 in = 3000 lbf*in > 2000 lbf*in
    assert [s["record"] for o in a for s in o.sheets] == [s["record"] for o in b for s in o.sheets]
    for o in b:
        nbformat.validate(o.notebook)
    params, injected, body, panel = [c for c in b[0].notebook.cells if c.cell_type == "code"]
    assert "parameters" in params.metadata["tags"] and "injected-parameters" in injected.metadata["tags"]
    assert 'P = "100 lbf"' in injected.source
    assert [params.execution_count, injected.execution_count, body.execution_count] == [1, 2, 3]
    assert [o.output_type for o in body.outputs] == ["stream", "execute_result"]
    assert body.outputs[0].text == "building 100 lbf\n"
    assert body.outputs[1].data["text/plain"] == "1000" and body.outputs[1].execution_count == 3  # 100 lbf x 10 in
    assert panel.execution_count is None and panel.outputs == []
    failed = [c for c in b[1].notebook.cells if c.cell_type == "code"][2]
    assert [o.output_type for o in failed.outputs] == ["stream", "error"]
    assert failed.outputs[1].ename == "ValueError" and failed.outputs[1].evalue == "requested failure"


def test_text_hand_calc_same_in_kernel(probe_env: Path) -> None:
    job = parse_job(_job(("A1", "120 lbf", "ok")))
    a, b = run_job(job, text=True), run_job(job, mode="kernel", text=True)
    assert a[0].sheets[0]["text"] == b[0].sheets[0]["text"]
    assert "= 1,200 lbf·in" in b[0].sheets[0]["text"]  # 120 lbf x 10 in = 1200 lbf*in


def test_dead_or_hung_kernel_fails_only_its_calc(probe_env: Path) -> None:
    job = parse_job(_job(("A1", "100 lbf", "ok"), ("A2", "100 lbf", "die"), ("A3", "200 lbf", "ok"),
                         ("A4", "100 lbf", "hang"), ("A5", "300 lbf", "ok")))
    out = run_job(job, mode="kernel", timeout=20)
    assert [o.status for o in out] == ["OK", "ERROR", "OK", "ERROR", "NG"]
    assert out[1].error is not None and "kernel died" in out[1].error["message"] and "restarted" in out[1].error["message"]
    assert out[3].error is not None and "did not finish within 20 s" in out[3].error["message"]
    assert out[2].sheets[0]["record"]["results"]["M"] == {"value": 2000.0, "unit": "lbf*in"}  # 200 lbf x 10 in


def test_the_kernel_keeps_no_sheet_a_calc_showed() -> None:
    """widgets.live.show() keeps each shown sheet (and its outputs) to redraw it in a notebook; in a
    run's kernel every calc's sheet would stay to the end (the kernel grew ~230 KiB per calc)."""
    from calcpad.runner.kernel_calc import SHEETS_MIME
    from calcpad.runner.kernel_session import KernelSession
    from calcpad.runner.template import find_template, load_template

    tpl = load_template(find_template("leg_bending"))
    job = parse_job(JOB_HEAD + "".join(
        f'\n[[calcs]]\ntemplate = "leg_bending"\nmember = "L{i}"\n[calcs.inputs]\n'
        + "".join(f"{n} = {p.default!r}\n" for n, p in tpl.parameters.items() if n not in ("member_mark", "calc_title", "calc_note"))
        for i in range(3)).replace("'", '"'))
    probe = ("import sys; from IPython.display import display; live = sys.modules.get('calcpad.widgets.live'); "
             f"display({{{SHEETS_MIME!r}: {{'shown': live is not None, 'kept': len(getattr(live, '_LIVE', {{}}))}}}}, raw=True)")
    session = KernelSession(300, "US")
    try:
        outcomes = [session.run(c) for c in job.calcs]
        payload, failure = session._request(probe)
    finally:
        session.close()
    assert all(o.error is None for o in outcomes) and failure is None
    assert payload == {"shown": True, "kept": 0}  # the template showed its sheets; none is kept
