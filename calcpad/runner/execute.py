"""Execute calcs: a template's code cells with the job's values in place of its parameters cell.

Two modes give the same sheets (and so the same record):

- ``inprocess`` (default): each code cell of the template (trusted engineering code) is compiled
  and run in a fresh namespace in this process. The parameters cell is *not* run: the job's
  values are placed in the namespace as plain Python strings/numbers — they are data, never code.
- ``kernel``: one Jupyter kernel for the run (the ``calcpad`` kernel the set-up registers,
  ``runner.kernel``; ``python3`` when it is missing): each template's cells are sent to it once,
  then each calc is one request with the job's values as JSON (``runner.kernel_session`` and, in
  the kernel, ``runner.kernel_calc``). The kernel runs the same cells in a fresh namespace and
  returns the same collected sheets, plus each cell's outputs: the executed notebooks are kept
  (papermill-style ``injected-parameters`` cell) and ask for that kernel, like the stored
  templates. jupyter_client/nbformat/papermill are imported only on this path.

Sheets are the :class:`~calcpad.core.sheet.Sheet` objects bound to the template's global names
(also inside top-level lists, tuples and dicts), in the order the names were first bound —
deterministic for a given template. A failing cell stops that calc only; it is reported with the
template, the cell number (1-based over all cells, as in the stored ``.ipynb``) and the message.
"""

from __future__ import annotations

import contextlib
import hashlib
import io
import json
import math
import os
import sys
import time
import zlib
from collections.abc import Callable, Iterator
from dataclasses import dataclass, field
from typing import Any

from calcpad.core.results import status_ok
from calcpad.core.sheet import SYSTEM_ENV
from calcpad.eng.sections.shop import ENV_PATH, ENV_SHA256, shop_table_in_use
from calcpad.runner.job import CONTEXT_PARAMETERS, Calc, Job
from calcpad.runner.nodisplay import no_display
from calcpad.runner.progress import RunProgress, in_notebook

__all__ = ["MODES", "CalcOutcome", "SheetItem", "collect_sheets", "numbers_digest", "run_calc_inprocess", "run_job", "sheets_bound"]

MODES = ("inprocess", "kernel")
_SKIP = {"In", "Out", "exit", "quit", "get_ipython"}


class SheetItem(dict):  # type: ignore[type-arg]
    """One sheet of an outcome: ``{"record": ..., "html": ...}`` (and ``"text"``), with the HTML
    kept zlib-compressed (``"html_z"``) until ``item["html"]`` reads it. A large job holds every
    outcome until the submittal is written; MathML compresses about tenfold, so the held HTML
    no longer dominates the memory a job grows by per calc. A run that writes an output folder
    goes further (:mod:`calcpad.runner.spool`): the record and HTML go to a spool file and the
    item keeps only what the summaries read (:attr:`title`, :attr:`checks`, ...)."""

    @classmethod
    def packed(cls, item: dict[str, Any]) -> SheetItem:
        """``item`` with its ``"html"`` compressed."""
        out = cls(item)
        html = out.pop("html", None)
        if isinstance(html, str):
            out["html_z"] = zlib.compress(html.encode("utf-8"), 1)
        elif html is not None:
            out["html"] = html
        return out

    def __missing__(self, key: str) -> Any:
        if key == "html" and "html_z" in self:
            return zlib.decompress(self["html_z"]).decode("utf-8")
        if key == "html" and "_render" in self:
            return self["_render"]()
        raise KeyError(key)

    @property
    def has_html(self) -> bool:
        """True when ``item["html"]`` can be read (held, compressed, spooled or still to be printed)."""
        return any(k in self for k in ("html", "html_z", "_html", "_render"))

    def settle(self, html: bool = True) -> None:
        """Print the HTML of a sheet collected with ``html="lazy"`` now and compress it (``html``),
        or drop the sheet result it waited on (nothing reads the HTML)."""
        render = self.pop("_render", None)
        if render is not None and html:
            self["html_z"] = zlib.compress(render().encode("utf-8"), 1)

    # what the summaries read: from the record, or (spooled) held apart from it
    @property
    def title(self) -> str:
        """The sheet's title."""
        return self["title"] if "title" in self else self["record"]["title"]

    @property
    def method(self) -> str:
        """The design method the sheet states ("" when none)."""
        return self["method"] if "method" in self else self["record"].get("method") or ""

    @property
    def assumptions(self) -> list[str]:
        """The model assumptions the sheet declares."""
        return self["assumptions"] if "assumptions" in self else self["record"].get("assumptions", [])

    @property
    def checks(self) -> list[dict[str, Any]]:
        """The sheet's checks; each has at least ``title``, ``ratio``, ``status`` and ``ref``."""
        return self["checks"] if "checks" in self else self["record"]["checks"]

    @property
    def numbers(self) -> str:
        """A digest of the numbers the sheet printed (results; check demand, capacity, ratio, status):
        two sheets with the same digest print the same values (the typical-member grouping)."""
        return self["numbers"] if "numbers" in self else numbers_digest(self["record"])


def numbers_digest(record: dict[str, Any]) -> str:
    """SHA-256 over a sheet record's results and its checks' demand, capacity, ratio and status."""
    key = {"results": record.get("results"),
           "checks": [{k: c.get(k) for k in ("demand", "capacity", "ratio", "status")} for c in record["checks"]]}
    return hashlib.sha256(json.dumps(key, sort_keys=True, default=str).encode("utf-8")).hexdigest()


@dataclass
class CalcOutcome:
    """What running one calc produced."""

    calc: Calc
    sheets: list[dict[str, Any]] = field(default_factory=list)  # SheetItem: {"record": ..., "html": ...}
    error: dict[str, Any] | None = None  # {"cell": n, "message": "..."}
    seconds: float = 0.0
    notebook: Any = None  # executed notebook (kernel mode)
    spooled: Any = None  # the calc's record entry, kept in a spool (runner.spool) instead of in memory

    def settle(self, html: bool = True) -> None:
        """Print (``html``) or drop the HTML its sheets were collected without (:meth:`SheetItem.settle`)."""
        for s in self.sheets:
            if isinstance(s, SheetItem):
                s.settle(html)

    def slim(self) -> None:
        """Keep of each sheet only what the summaries read (title, method, assumptions, each check's
        title, ratio, status and reference): a run that only tabulates results holds no records."""
        self.sheets = [SheetItem(title=s.title, method=s.method, assumptions=list(s.assumptions),
                                 checks=[{k: c[k] for k in ("title", "ratio", "status", "ref")} for c in s.checks])
                       for s in self.sheets]

    @property
    def status(self) -> str:
        """"ERROR" when a cell failed, "NG" when a check does not pass (NG or not covered), "OK" otherwise."""
        if self.error is not None:
            return "ERROR"
        if any(not status_ok(c["status"]) for s in self.sheets for c in s.checks):
            return "NG"
        return "OK"

    @property
    def checks(self) -> list[dict[str, Any]]:
        """Every check of the calc: ``{"sheet", "name", "ratio", "status", "ref"}`` in sheet order."""
        return [{"sheet": s.title, "name": c["title"], "ratio": c["ratio"], "status": c["status"], "ref": c["ref"]}
                for s in self.sheets for c in s.checks]


def _finite(obj: Any) -> Any:
    """Replace inf/nan floats by None so the record is strict JSON."""
    if isinstance(obj, float):
        return obj if math.isfinite(obj) else None
    if isinstance(obj, dict):
        return {k: _finite(v) for k, v in obj.items()}
    if isinstance(obj, list):
        return [_finite(v) for v in obj]
    return obj


def sheets_bound(namespace: dict[str, Any]) -> list[Any]:
    """Every ``Sheet`` bound to a global name of ``namespace`` (also inside top-level lists,
    tuples and dicts), once each, in the order the names were first bound; names starting with
    ``_`` and IPython's own are skipped. The one rule for which sheets a template made."""
    from calcpad.core.sheet import Sheet

    seen: set[int] = set()
    out: list[Any] = []
    for name, value in list(namespace.items()):
        if name.startswith("_") or name in _SKIP:
            continue
        if isinstance(value, Sheet):
            found = [value]
        elif isinstance(value, (list, tuple)):
            found = [v for v in value if isinstance(v, Sheet)]
        elif isinstance(value, dict):
            found = [v for v in value.values() if isinstance(v, Sheet)]
        else:
            continue
        for sheet in found:
            if id(sheet) not in seen:
                seen.add(id(sheet))
                out.append(sheet)
    return out


def _printer(result: Any) -> Callable[[], str]:
    from calcpad.render.html import sheet_html_fragment

    return lambda: sheet_html_fragment(result, heading_level=3)


def collect_sheets(namespace: dict[str, Any], template: str, member: str, text: bool = False,
                   html: bool | str = True) -> list[dict[str, Any]]:
    """Record and HTML of every Sheet bound in ``namespace`` (runs in-process or in the kernel);
    with ``text=True`` also the plain-text hand calc (printed by a ``--set`` run). ``html="lazy"``
    leaves the HTML to be printed when asked (``"_render"``: see :meth:`SheetItem.settle`; most
    members of a large table are never printed), ``html=False`` leaves it out."""
    from calcpad.render.record import sheet_record
    from calcpad.render.text import sheet_text

    out: list[dict[str, Any]] = []
    for sheet in sheets_bound(namespace):
        result = sheet.evaluate()
        rec = sheet_record(result)
        rec["meta"] = {**rec["meta"], "template": template, "member": member}
        item: dict[str, Any] = {"record": _finite(rec)}
        if html == "lazy":
            item["_render"] = _printer(result)
        elif html:
            item["html"] = _printer(result)()
        if text:
            item["text"] = sheet_text(result)
        out.append(item)
    return out


def _close_figures() -> None:
    plt = sys.modules.get("matplotlib.pyplot")
    if plt is not None:
        plt.close("all")


def _values(calc: Calc) -> dict[str, Any]:
    values: dict[str, Any] = dict(calc.inputs)
    context = {"member_mark": calc.member if calc.member != "-" else "", "calc_title": calc.title, "calc_note": calc.note}
    for name in CONTEXT_PARAMETERS:
        if name in calc.template.parameters:
            values[name] = context[name]
    return {n: values[n] for n in calc.template.parameters if n in values}


# ----------------------------------------------------------------------------- in-process


def _widget_ids() -> set[str]:
    """Ids of the live ipywidgets (empty when ipywidgets was never imported)."""
    mod = sys.modules.get("ipywidgets.widgets.widget")
    return set(getattr(mod, "_instances", {})) if mod is not None else set()


def _close_widgets(before: set[str]) -> None:
    """Close the widgets a calc made (ipywidgets keeps every widget in a registry until closed)."""
    mod = sys.modules.get("ipywidgets.widgets.widget")
    if mod is None:
        return
    for key in set(getattr(mod, "_instances", {})) - before:
        widget = mod._instances.get(key)
        if widget is not None:
            widget.close()


def _live_views() -> set[int]:
    """Keys of the sheets :func:`calcpad.widgets.live.show` keeps for refreshing (empty when it was never imported)."""
    mod = sys.modules.get("calcpad.widgets.live")
    return set(getattr(mod, "_LIVE", {})) if mod is not None else set()


def _forget_live_views(before: set[int]) -> None:
    """Drop the sheets a calc showed from the live-view registry: a notebook keeps them to redraw
    in place, a run (in a kernel) would keep every calc's sheet and displayed outputs to the end."""
    mod = sys.modules.get("calcpad.widgets.live")
    live = getattr(mod, "_LIVE", None) if mod is not None else None
    if live is not None:
        for key in set(live) - before:
            live.pop(key, None)


def run_calc_inprocess(calc: Calc, text: bool = False, html: bool | str = True) -> CalcOutcome:
    """Run one calc in this process: the template's code cells after its parameters cell and
    before its what-if cell (:meth:`Template.body`; the panel is for the notebook reader).
    ``html``: as :func:`collect_sheets` (``"lazy"``: :meth:`CalcOutcome.settle` prints it)."""
    os.environ.setdefault("MPLBACKEND", "Agg")
    start = time.perf_counter()
    tpl = calc.template
    namespace: dict[str, Any] = {"__name__": "__main__", "__builtins__": __builtins__}
    namespace.update(_values(calc))
    outcome = CalcOutcome(calc)
    sink = io.StringIO()
    widgets, views = _widget_ids(), _live_views()
    try:
        # no_display: run from a notebook, the template's show(sh) would display each calc's sheets there
        with contextlib.redirect_stdout(sink), contextlib.redirect_stderr(sink), no_display():
            for index, code in tpl.body():
                try:
                    exec(code, namespace)  # template code (trusted); job values are data in `namespace`
                except Exception as exc:
                    outcome.error = {"cell": index, "message": f"{type(exc).__name__}: {exc}"}
                    break
            if outcome.error is None:
                try:
                    outcome.sheets = [SheetItem.packed(s) for s in collect_sheets(namespace, tpl.name, calc.member, text, html)]
                except Exception as exc:
                    outcome.error = {"cell": None, "message": f"{type(exc).__name__}: {exc}"}
    finally:
        _close_figures()
        _close_widgets(widgets)
        _forget_live_views(views)
        namespace.clear()  # the calc's objects go now, not when a reference cycle is collected
    outcome.seconds = time.perf_counter() - start
    return outcome


# ----------------------------------------------------------------------------- kernel


@contextlib.contextmanager
def _session(mode: str, timeout: int, units: str = "US", extra_env: dict[str, str] | None = None) -> Iterator[Any]:
    """None for in-process runs, else a :class:`~calcpad.runner.kernel_session.KernelSession`."""
    if mode == "inprocess":
        yield None
        return
    from calcpad.runner.kernel_session import KernelSession  # lazy: jupyter_client only for kernel runs

    session = KernelSession(timeout, units, extra_env)
    try:
        yield session
    finally:
        session.close()


@contextlib.contextmanager
def _job_environment(job: Job) -> Iterator[dict[str, str]]:
    """The job's display units for sheets made without ``system=`` and its shop table (no other
    from this process's environment); yields the variables a kernel needs for the shop table."""
    previous = os.environ.get(SYSTEM_ENV)
    os.environ[SYSTEM_ENV] = job.info.units
    stray = {k: os.environ.pop(k) for k in (ENV_PATH, ENV_SHA256) if k in os.environ}
    try:
        shop_env = {ENV_PATH: job.shop_path, ENV_SHA256: job.shop_table.sha256} if job.shop_table is not None and job.shop_path else {}
        with shop_table_in_use(job.shop_table):
            yield shop_env
    finally:
        if previous is None:
            os.environ.pop(SYSTEM_ENV, None)
        else:
            os.environ[SYSTEM_ENV] = previous
        os.environ.update(stray)


def rerun_calc(job: Job, calc: Calc) -> CalcOutcome:
    """Run one calc of ``job`` in-process again, with its HTML (a sheet the run did not keep the
    HTML of, such as a member of a large table that is not printed, asked for by ``--print calc:MARK``)."""
    with _job_environment(job):
        return run_calc_inprocess(calc)


def run_job(
    job: Job,
    mode: str = "inprocess",
    progress: Callable[[CalcOutcome], None] | None = None,
    timeout: int = 600,
    text: bool = False,
    html: bool = True,
) -> list[CalcOutcome]:
    """Run every calc of ``job``; a failing calc is recorded and the others still run.

    ``progress`` is called with each outcome as it is done (without one, a run in a Jupyter
    notebook shows a progress bar once it has gone on for 2 s); ``text=True`` adds each sheet's
    plain-text hand calc (``"text"``) to the collected sheets. In-process, each sheet's HTML waits
    until ``progress`` has seen the outcome (a spool prints only what can be printed) and is then
    printed, or left out with ``html=False`` (re-runs that compare records)."""
    if mode not in MODES:
        raise ValueError(f"mode {mode!r}; expected one of {MODES}")
    outcomes: list[CalcOutcome] = []
    bar = None
    if progress is None and in_notebook():  # a batch run from a notebook gets a bar (after 2 s)
        bar = RunProgress(len(job.calcs))
        progress = lambda o: bar.advance(f"{o.calc.template.name} {o.calc.member}")  # noqa: E731
    try:
        with _job_environment(job) as shop_env, _session(mode, timeout, job.info.units, shop_env) as session:
            for calc in job.calcs:
                outcome = run_calc_inprocess(calc, text, "lazy") if session is None else session.run(calc, text)
                outcomes.append(outcome)
                if progress is not None:
                    progress(outcome)
                outcome.settle(html)  # what the spool did not take is printed now (or dropped)
    finally:
        if bar is not None:
            bar.close()
    return outcomes
