"""Calcs run from a notebook display nothing in the user's cell (templates call ``show(sheet)``).

The kernel is stood in for by a shell object whose ``display`` calls are counted; the same stand-in
shows that a template's ``show`` does display when it is not run by the runner.
"""

from __future__ import annotations

import pytest

from calcpad.runner.members import run_table
from calcpad.runner.template import find_template, load_template


@pytest.fixture
def displayed(monkeypatch: pytest.MonkeyPatch) -> list[object]:
    import IPython
    import IPython.display

    seen: list[object] = []
    monkeypatch.setattr(IPython, "get_ipython", lambda: object())  # "in a kernel"
    monkeypatch.setattr(IPython.display, "display", lambda *a, **k: seen.append(a))
    return seen


def test_show_displays_in_a_kernel_outside_the_runner(displayed: list[object]) -> None:
    from calcpad.core.sheet import Sheet
    from calcpad.widgets import show

    sh = Sheet("Stand-in check")
    sh.given("P", "100 lbf", "load")
    show(sh)
    assert len(displayed) >= 1  # the stand-in kernel is seen: the test below can fail


def test_a_member_table_run_from_a_notebook_displays_no_sheets(displayed: list[object], tmp_path) -> None:
    table = tmp_path / "posts.csv"
    table.write_text("mark,P [lbf],L [in],leg\nA1,120,36,Pipe 2 Std\nA2,200,48,Pipe 2 Std\n", encoding="utf-8")
    frame = run_table("leg_bending", table, {"F_y": "35 ksi"})
    assert len(frame) == 2
    assert displayed == []  # before: six sheet displays per calc landed in the user's cell


def test_a_sweep_and_a_build_from_a_notebook_display_no_sheets(displayed: list[object]) -> None:
    from calcpad.runner.build import SheetBuilder
    from calcpad.runner.sweep import steps, sweep

    tpl = load_template(find_template("leg_bending"))
    sweep(tpl, {}, {"P": steps("50 lbf", "200 lbf", 3)}, progress=False)
    SheetBuilder(tpl).sheets({n: p.default for n, p in tpl.parameters.items()})
    assert displayed == []
