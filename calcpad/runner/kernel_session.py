"""Kernel-mode runs: one Jupyter kernel per run, one request per calc.

Each template's code cells are sent to the kernel once (``kernel_calc.define``: compiled there
and kept); each calc is then one ``execute`` request calling ``kernel_calc.run`` with the job's
values as JSON text (data, never code). The kernel runs the same cells as an in-process run
(the template's code cells up to its what-if cell) in a fresh namespace and answers with the
sheets (recorded and printed by the same function as in-process, so records are identical),
the error if a cell failed, and each cell's outputs, from which the executed notebook is written
(papermill's ``injected-parameters`` cell after the parameters cell; the what-if cells are kept
unexecuted). A kernel that dies or does not answer within ``timeout`` fails that calc only: it
is restarted and the run goes on.

nbformat, papermill and jupyter_client are imported only here (kernel runs).
"""

from __future__ import annotations

import hashlib
import json
import os
import queue
import time
from typing import Any

from calcpad.eng.sections.shop import ENV_PATH, ENV_SHA256
from calcpad.runner.execute import CalcOutcome, SheetItem, _values
from calcpad.runner.kernel import KERNEL, kernel_to_run, kernelspec_metadata
from calcpad.runner.kernel_calc import SHEETS_MIME
from calcpad.runner.template import Template, is_what_if_cell

__all__ = ["KernelSession"]


_WARM_UP = """\
import calcpad.runner.kernel_calc, calcpad.runner.execute, calcpad.render.html, calcpad.render.record, calcpad.render.text
"""


class _KernelLostError(Exception):
    """The kernel died or did not answer in time (the message says which)."""


def _cells_to_run(tpl: Template) -> list[dict[str, Any]]:
    """The code cells a calc runs, in notebook order: those before the first what-if cell (the
    parameters cell included, flagged), as :meth:`Template.body` (which leaves out the
    parameters cell: the in-process run places the values instead)."""
    cells = []
    for cell in tpl.code_cells:
        if cell.index != tpl.parameters_cell and is_what_if_cell(cell.source):
            break
        cells.append({"index": cell.index, "source": cell.source, "parameters": cell.index == tpl.parameters_cell})
    return cells


class KernelSession:
    """One Jupyter kernel for the calcs of a run; each template defined in it once."""

    def __init__(self, timeout: int, units: str = "US", extra_env: dict[str, str] | None = None) -> None:
        from calcpad.core.sheet import SYSTEM_ENV

        self.timeout = timeout
        self.kernel = kernel_to_run()
        env = dict(os.environ, MPLBACKEND="Agg", **{SYSTEM_ENV: units}, **(extra_env or {}))
        if not extra_env or ENV_PATH not in extra_env:
            env.pop(ENV_PATH, None)
            env.pop(ENV_SHA256, None)
        self.env = env
        self.defined: set[str] = set()  # keys of the templates defined in the current kernel
        self._specs: dict[int, tuple[Template, str, str]] = {}  # id(template) -> (template, key, spec)
        self._start()

    def _start(self) -> None:
        from jupyter_client.manager import KernelManager

        self.km = KernelManager(kernel_name=self.kernel, transport="ipc")  # local sockets, not TCP
        self.km.start_kernel(env=self.env, cwd=os.getcwd())
        self.kc = self.km.client()
        self.kc.start_channels()
        self.kc.wait_for_ready(timeout=120)
        self.defined.clear()
        # The kernel imports the engine while this process imports what writes the notebooks
        # (papermill takes seconds); the first calc's request queues behind it.
        self.kc.execute(_WARM_UP, silent=True, store_history=False, allow_stdin=False)
        import nbformat  # noqa: F401
        import papermill.parameterize  # noqa: F401

    def close(self) -> None:
        """Stop the kernel."""
        self.kc.stop_channels()
        self.km.shutdown_kernel(now=True)

    def _restart(self) -> None:
        """A fresh kernel after one died or hung (its templates are sent again when used)."""
        try:
            self.close()
        except Exception:  # the old kernel is gone either way
            pass
        self._start()

    # ------------------------------------------------------------------ requests

    def _request(self, code: str) -> tuple[dict[str, Any] | None, str | None]:
        """Execute ``code``; the :data:`SHEETS_MIME` payload it displayed (or None) and the
        error the request raised (or None). Raises :class:`_KernelLostError`."""
        msg_id = self.kc.execute(code, silent=False, store_history=False, allow_stdin=False)
        deadline = time.monotonic() + self.timeout
        payload: dict[str, Any] | None = None
        failure: str | None = None
        while True:
            remaining = deadline - time.monotonic()
            if remaining <= 0:
                raise _KernelLostError(f"the calc did not finish within {self.timeout} s")
            try:
                msg = self.kc.get_iopub_msg(timeout=min(1.0, remaining))
            except queue.Empty:
                if not self.km.is_alive():
                    raise _KernelLostError("the kernel died while running this calc") from None
                continue
            if msg["parent_header"].get("msg_id") != msg_id:
                continue
            kind, content = msg["msg_type"], msg["content"]
            if kind == "display_data" and SHEETS_MIME in content.get("data", {}):
                payload = content["data"][SHEETS_MIME]
            elif kind == "error":
                failure = f"{content['ename']}: {content['evalue']}"
            elif kind == "status" and content.get("execution_state") == "idle":
                break
        while True:  # the shell reply of this request (so replies do not pile up)
            try:
                reply = self.kc.get_shell_msg(timeout=max(1.0, deadline - time.monotonic()))
            except queue.Empty:
                break
            if reply["parent_header"].get("msg_id") == msg_id:
                break
        return payload, failure

    def _define(self, tpl: Template) -> str:
        """The key of ``tpl`` in the kernel, its cells sent and compiled there on first use."""
        known = self._specs.get(id(tpl))
        if known is None or known[0] is not tpl:
            spec = json.dumps({"name": tpl.name, "cells": _cells_to_run(tpl)})
            known = (tpl, f"{tpl.name}-{hashlib.sha256(spec.encode('utf-8')).hexdigest()[:16]}", spec)
            self._specs[id(tpl)] = known
        _tpl, key, spec = known
        if key not in self.defined:
            _payload, failure = self._request(f"__import__('calcpad.runner.kernel_calc', fromlist=['define']).define({key!r}, {spec!r})")
            if failure is not None:
                raise _DefineError(failure)
            self.defined.add(key)
        return key

    # ------------------------------------------------------------------ calcs

    def run(self, calc: Any, text: bool = False) -> CalcOutcome:
        """Run one calc: one request, its sheets, error and executed notebook."""
        start = time.perf_counter()
        outcome = CalcOutcome(calc)
        tpl = calc.template
        payload: dict[str, Any] | None = None
        try:
            key = self._define(tpl)
            values = json.dumps(_values(calc))
            payload, failure = self._request(
                f"__import__('calcpad.runner.kernel_calc', fromlist=['run']).run({key!r}, {values!r}, {tpl.name!r}, {calc.member!r}, {bool(text)!r})"
            )
            if payload is None:
                outcome.error = {"cell": None, "message": failure or "the kernel gave no result"}
        except _DefineError as exc:  # a template that does not compile, or calcpad missing in the kernel
            outcome.error = {"cell": None, "message": str(exc)}
        except _KernelLostError as exc:
            outcome.error = {"cell": None, "message": f"{exc} (kernel restarted for the next calc)"}
            self._restart()
        if payload is not None:
            outcome.error = payload["error"]
            if outcome.error is None:
                outcome.sheets = [SheetItem.packed(s) for s in payload["sheets"]]
        outcome.notebook = self.notebook(calc, payload)
        outcome.seconds = time.perf_counter() - start
        return outcome

    def notebook(self, calc: Any, payload: dict[str, Any] | None) -> Any:
        """The executed notebook of ``calc``: the template's cells, papermill's injected
        parameters, and the outputs and execution counts of the cells the kernel ran."""
        import nbformat
        from papermill.parameterize import parameterize_notebook

        tpl = calc.template
        nb = nbformat.v4.new_notebook()
        nb.metadata["kernelspec"] = kernelspec_metadata()
        nb.metadata["language_info"] = {"name": "python"}
        nb.metadata["papermill"] = {}
        for cell in tpl.cells:
            new = nbformat.v4.new_markdown_cell(cell.source) if cell.kind == "markdown" else nbformat.v4.new_code_cell(cell.source)
            new.metadata["tags"] = list(cell.tags)  # papermill reads .tags on every cell
            new.metadata["calcpad_cell"] = cell.index
            nb.cells.append(new)
        nb = parameterize_notebook(nb, _values(calc), comment="Parameters from the calcpad job", kernel_name=KERNEL, language="python")
        executed = set(payload["executed"]) if payload is not None else set()
        outputs = payload["outputs"] if payload is not None else {}
        count = 0
        params_ran = tpl.parameters_cell in executed
        for c in nb.cells:
            index = c.metadata.pop("calcpad_cell", None)
            if not c.metadata.get("tags"):
                c.metadata.pop("tags", None)
            if c.cell_type != "code":
                continue
            injected = index is None and "injected-parameters" in c.metadata.get("tags", [])
            if index in executed or (injected and params_ran):
                count += 1
                c.execution_count = count
                c.outputs = [nbformat.from_dict(o) for o in outputs.get(str(index), [])]
                for o in c.outputs:
                    if o.output_type == "execute_result":
                        o.execution_count = count
        return nb


class _DefineError(Exception):
    """A template's cells could not be defined in the kernel."""
