"""Kernel side of a kernel-mode run (imported inside the Jupyter kernel, never by the runner).

The runner sends each template's code cells once (:func:`define`: parsed and compiled here, kept
by key), then one request per calc (:func:`run`): the job's values arrive as JSON text (data,
never code) and go into a fresh namespace, the cells run there as in an in-process run
(``execute.run_calc_inprocess``: same cells, same namespace rule, same collection of sheets),
and each cell's outputs (streams, displays with their updates, the value of a trailing
expression, an error) are captured so the runner can write the executed notebook. The answer
is one display output of :data:`SHEETS_MIME` holding the sheets, the error and the outputs.

Written by hand rather than with ``IPython.utils.capture``: that keeps streams and displays in
separate lists (their order is lost) and does not tell a cell's result from a display.
"""

from __future__ import annotations

import ast
import base64
import builtins
import contextlib
import io
import json
import sys
from dataclasses import dataclass
from types import CodeType
from typing import Any

__all__ = ["SHEETS_MIME", "define", "run"]

SHEETS_MIME = "application/vnd.calcpad.sheets+json"


@dataclass
class _CellCode:
    """One code cell compiled once: its statements, and a trailing expression shown as the
    cell's result (as Jupyter does) unless the cell ends with ``;``."""

    index: int
    parameters: bool
    body: CodeType
    last: CodeType | None


_TEMPLATES: dict[str, list[_CellCode]] = {}


def _compile(name: str, index: int, source: str, parameters: bool) -> _CellCode:
    filename = f"<template {name} cell {index}>"  # as Template.body(), so tracebacks read alike
    tree = ast.parse(source, filename)
    last = None
    if tree.body and isinstance(tree.body[-1], ast.Expr) and not source.rstrip().endswith(";"):
        expr = tree.body.pop()
        last = compile(ast.Expression(expr.value), filename, "eval")
    return _CellCode(index, parameters, compile(tree, filename, "exec"), last)


def define(key: str, spec: str) -> None:
    """Compile a template's cells (``spec``: JSON ``{"name", "cells": [{"index", "source",
    "parameters"}]}``, in notebook order) and keep them under ``key``."""
    data = json.loads(spec)
    _TEMPLATES[key] = [_compile(data["name"], c["index"], c["source"], bool(c["parameters"])) for c in data["cells"]]


def _jsonable(data: Any) -> Any:
    """A display bundle as JSON (bytes, e.g. PNG, as base64 text, as Jupyter sends them)."""
    if isinstance(data, bytes):
        return base64.b64encode(data).decode("ascii")
    if isinstance(data, dict):
        return {str(k): _jsonable(v) for k, v in data.items()}
    if isinstance(data, (list, tuple)):
        return [_jsonable(v) for v in data]
    return data


class _Outputs:
    """The outputs of the cells of one calc, as notebook output dicts (display ids kept so an
    ``update_display`` replaces the earlier output wherever it is, as nbclient does)."""

    def __init__(self) -> None:
        self.by_cell: dict[int, list[dict[str, Any]]] = {}
        self.current: list[dict[str, Any]] = []
        self.ids: dict[str, list[dict[str, Any]]] = {}

    def start(self, index: int) -> None:
        self.current = self.by_cell.setdefault(index, [])

    def stream(self, name: str, text: str) -> None:
        if not text:
            return
        last = self.current[-1] if self.current else None
        if last is not None and last["output_type"] == "stream" and last["name"] == name:
            last["text"] += text
        else:
            self.current.append({"output_type": "stream", "name": name, "text": text})

    def display(self, data: dict[str, Any], metadata: dict[str, Any] | None, transient: dict[str, Any] | None, update: bool) -> None:
        display_id = (transient or {}).get("display_id")
        bundle = {"data": _jsonable(data), "metadata": _jsonable(metadata or {})}
        if update:
            for out in self.ids.get(display_id, []):
                out.update(bundle)
            return
        out = {"output_type": "display_data", **bundle}
        self.current.append(out)
        if display_id:
            self.ids.setdefault(display_id, []).append(out)

    def result(self, data: dict[str, Any], metadata: dict[str, Any]) -> None:
        self.current.append({"output_type": "execute_result", "execution_count": None,
                             "data": _jsonable(data), "metadata": _jsonable(metadata)})

    def error(self, ename: str, evalue: str, traceback: list[str]) -> None:
        self.current.append({"output_type": "error", "ename": ename, "evalue": evalue, "traceback": traceback})

    def clear(self) -> None:
        self.current.clear()


class _Stream(io.TextIOBase):
    def __init__(self, outputs: _Outputs, name: str) -> None:
        self.outputs, self.name_ = outputs, name

    def writable(self) -> bool:
        return True

    def write(self, text: str) -> int:
        self.outputs.stream(self.name_, text)
        return len(text)


_PUBLISHER: list[Any] = []  # one display publisher for the kernel's life (see _publisher)


def _publisher(shell: Any) -> Any:
    """The kernel's capturing display publisher, made once: one made per calc (a class closing
    over the calc's outputs) stayed alive with every output of the calc, ~70 KiB per calc."""
    if not _PUBLISHER:
        from IPython.core.displaypub import DisplayPublisher

        class Publisher(DisplayPublisher):
            outputs: _Outputs | None = None

            def publish(self, data: Any, metadata: Any = None, source: Any = None, *, transient: Any = None, update: bool = False, **_: Any) -> None:
                if self.outputs is not None:
                    self.outputs.display(data, metadata, transient, update)

            def clear_output(self, wait: bool = False) -> None:
                if self.outputs is not None:
                    self.outputs.clear()

        _PUBLISHER.append(Publisher(shell=shell))
    return _PUBLISHER[0]


@contextlib.contextmanager
def _capturing(shell: Any, outputs: _Outputs) -> Any:
    """Send this kernel's displays and streams to ``outputs`` for the duration."""
    publisher = _publisher(shell)
    publisher.outputs = outputs
    saved = shell.display_pub
    shell.display_pub = publisher
    try:
        with contextlib.redirect_stdout(_Stream(outputs, "stdout")), contextlib.redirect_stderr(_Stream(outputs, "stderr")):
            yield
    finally:
        shell.display_pub = saved
        publisher.outputs = None  # the calc's outputs are not kept by the publisher


def run(key: str, values: str, template: str, member: str, text: bool = False) -> None:
    """Run one calc of the template defined under ``key`` with the job's ``values`` (JSON text)
    and display the answer (:data:`SHEETS_MIME`: ``sheets``, ``error``, ``outputs`` per cell
    index, ``executed`` cell indices)."""
    from IPython import get_ipython
    from IPython.display import display

    from calcpad.runner.execute import _close_figures, _close_widgets, _forget_live_views, _live_views, _widget_ids, collect_sheets

    shell = get_ipython()
    given = json.loads(values)
    namespace: dict[str, Any] = {"__name__": "__main__", "__builtins__": builtins}
    namespace.update(given)
    outputs = _Outputs()
    executed: list[int] = []
    error: dict[str, Any] | None = None
    sheets: list[dict[str, Any]] = []
    widgets, views = _widget_ids(), _live_views()
    try:
        with _capturing(shell, outputs):
            for cell in _TEMPLATES[key]:
                outputs.start(cell.index)
                executed.append(cell.index)
                try:
                    exec(cell.body, namespace)  # template code (trusted); job values are data in `namespace`
                    if cell.parameters:
                        namespace.update(given)  # the injected-parameters cell of the kept notebook
                    elif cell.last is not None:
                        value = eval(cell.last, namespace)  # the cell's trailing expression (template code)
                        if value is not None:
                            data, metadata = shell.display_formatter.format(value)
                            outputs.result(data, metadata)
                except Exception as exc:
                    etype, evalue, tb = sys.exc_info()
                    assert etype is not None
                    outputs.error(etype.__name__, str(evalue), shell.InteractiveTB.structured_traceback(etype, evalue, tb, tb_offset=1))
                    error = {"cell": cell.index, "message": f"{type(exc).__name__}: {exc}"}
                    break
            if error is None:
                try:
                    sheets = collect_sheets(namespace, template, member, text)
                except Exception as exc:
                    error = {"cell": None, "message": f"{type(exc).__name__}: {exc}"}
    finally:
        _close_figures()
        _close_widgets(widgets)
        _forget_live_views(views)  # show() keeps each sheet shown for refreshing: a run has none to do
        namespace.clear()  # the calc's objects go now
    display({SHEETS_MIME: {"sheets": sheets, "error": error, "outputs": {str(k): v for k, v in outputs.by_cell.items()},
                           "executed": executed}}, raw=True)
