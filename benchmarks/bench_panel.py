"""What-if panel: refresh after one change vs a full rebuild, in both panel modes.

A full rebuild is what a change cost without the in-place redraw: run the template's cells with
the new value, evaluate, print every row of the sheet once (the notebook rows and LaTeX blocks of
a fresh :class:`~calcpad.widgets.live.SheetView`, the printers the live display uses) and the
check summary. A refresh is ``panel.set(...)`` with the sheet shown live above the panel
(``show(sh)`` and ``show_summary(sh)``; IPython's display calls are stubbed so only calcpad's
work is timed): a load is applied to the sheet and evaluated incrementally; a section re-runs
the template and the new sheet goes through the same in-place path (only rows that print
differently are printed and redrawn). In ``sheet`` mode the panel also keeps its own copy.
Goal: refresh <= 0.3 x rebuild for a load change in every mode; the section rows are printed
for the record (a section changes about a third of the rows and needs the template's cells run).

Each row alternates between two values; rebuilds and refreshes run in turn (so both see the same
machine load) and each takes the fastest of REPEAT runs (on a shared machine the minimum is the
cost without interference).

    .venv/bin/python benchmarks/bench_panel.py
"""

from __future__ import annotations

import time
from collections.abc import Callable

import IPython.display as ipd

from calcpad.widgets import live, what_if
from calcpad.widgets.session import TemplateSession
from calcpad.widgets.summary import summary_html, summary_text

#: template -> (bind, [(parameter, two values)])
CASES = {
    "leg_bending": (["P", "L", "F_y"], [("P", ("120 lbf", "150 lbf")), ("leg", ("Pipe 2 Std", "Pipe 1-1/2 Std"))]),
    "post_combined": ({"P": "P_top", "H": "H_top", "L": "L_post"}, [("H", ("0.5 kip", "0.55 kip")), ("post", ("HSS5x5x1/4", "HSS4x4x1/4"))]),
}
REPEAT = 30


def _best_pair(rebuild: Callable[[int], None], refresh: Callable[[int], None]) -> tuple[float, float]:
    """Fastest of REPEAT runs of each, the two taken in turn so both see the same machine load."""
    rebuild(0)
    refresh(0)
    times: tuple[list[float], list[float]] = ([], [])
    for i in range(REPEAT):
        for fn, out in ((rebuild, times[0]), (refresh, times[1])):
            t = time.perf_counter()
            fn(i + 1)
            out.append(time.perf_counter() - t)
    return min(times[0]), min(times[1])


def main() -> None:
    live._shell = lambda: None if live._QUIET[0] else object()  # type: ignore[assignment] # as if in a notebook
    ipd.display = lambda *_a, **_k: None  # type: ignore[assignment]
    ipd.update_display = lambda *_a, **_k: None  # type: ignore[assignment]
    print(f"{'template':15} {'mode':7} {'change':8} {'rebuild ms':>10} {'refresh ms':>10} {'ratio':>6}")
    for name, (bind, changes) in CASES.items():
        session = TemplateSession(name)
        for param, values in changes:

            def rebuild(i: int, session: TemplateSession = session, param: str = param, values: tuple[str, str] = values) -> None:
                sheet = session.build({**session.values, param: values[i % 2]})[0]
                result = sheet.evaluate()
                live.SheetView(sheet).update()
                summary_html(result)
                summary_text(result)

            for mode in ("checks", "sheet"):
                sh = session.build()[0]
                live.show(sh)
                live.show_summary(sh)
                panel = what_if(sh, template=name, bind=bind, show=mode)

                def refresh(i: int, panel=panel, param: str = param, values: tuple[str, str] = values) -> None:
                    assert panel.set(param, values[i % 2]), panel.last_error

                t_rebuild, t_refresh = _best_pair(rebuild, refresh)
                kind = "load" if panel._inputs[param].given else "re-run"
                print(f"{name:15} {mode:7} {param:8} {t_rebuild * 1e3:10.2f} {t_refresh * 1e3:10.2f} {t_refresh / t_rebuild:6.2f}  ({kind})")


if __name__ == "__main__":
    main()
