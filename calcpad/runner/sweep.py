"""Sweeps: a template over a grid of inputs on its compiled sheet, and design charts from it.

``sweep(template, fixed, axes)`` evaluates every combination of the axis values. Axes that set
one given each (loads, lengths, found with :func:`~calcpad.runner.build.given_map`) run on the
compiled sheet; the others (a section, a grade, a method) build the sheet once per value. The
grid is cut into chunks of at most ``chunk_cases`` cases (on a Dask cluster without a table, at
least 1/8 of a worker's share), each generated from the axis values by index
(``numpy.unravel_index``), so memory stays bounded whatever the grid size. Results:

- ``table``: one row per case (axis values, governing ratio and check, pass) — refused with a
  message when it would pass ``max_table_cases`` (ask for ``table=False``);
- ``envelope``: for a chosen axis, its largest passing value for every combination of the
  other axes (e.g. the longest leg per load and tube size): the data of a design chart.

A case passes when it is valid on the compiled sheet and every check ratio is within its limit.
With a Dask ``client`` the chunks run on the cluster, generated on the workers.
"""

from __future__ import annotations

import contextlib
import itertools
import math
from collections.abc import Callable, Mapping, Sequence
from dataclasses import dataclass
from typing import Any

import numpy as np

from calcpad.core.errors import InputError
from calcpad.core.units import parse_quantity, unit_symbol, ureg
from calcpad.runner.build import SheetBuilder, given_map
from calcpad.runner.job import CONTEXT_PARAMETERS
from calcpad.runner.template import Template

__all__ = ["SweepResult", "SweepTooLargeError", "design_chart", "pass_fail_figure", "steps", "sweep"]

CHUNK_CASES = 250_000
MAX_TABLE_CASES = 2_000_000
MAX_CASES = 10_000_000_000
#: Cases evaluated at a time inside a chunk: the temporaries of a block (about 100 bytes a case)
#: come from the allocator's heap; a whole chunk of a million cases mapped fresh pages for each
#: temporary, and the page faults (kernel time, slow on a busy machine) cost more than the
#: arithmetic (a sweep 25 % faster in blocks, measured).
BLOCK_CASES = 65_536
#: On a cluster, without a table, a sweep's tasks hold at least 1/TASKS_PER_WORKER of a worker's
#: share of the cases: each task costs the client and scheduler about 5 ms of CPU (measured: 1 s
#: for the 200 tasks of a 200 M-case sweep in chunks of a million, on cores the workers need).
TASKS_PER_WORKER = 8


class SweepTooLargeError(InputError):
    """A sweep whose grid or table would not fit: the message says the size and what to ask instead."""


@dataclass
class SweepResult:
    """What a sweep found (see the module docstring)."""

    axes: dict[str, list[Any]]
    cases: int
    passed: int
    checks: list[str]
    table: Any = None  # pandas DataFrame, or None when table=False
    envelope: Any = None  # pandas DataFrame, or None without an envelope axis
    envelope_axis: str | None = None


def _axis_values(tpl: Template, name: str, values: Sequence[Any]) -> list[Any]:
    if name not in tpl.parameters:
        raise InputError(f"sweep axis {name!r}: not a parameter of template {tpl.name!r}{tpl.suggest(name)}")
    if not values:
        raise InputError(f"sweep axis {name!r}: no values")
    p = tpl.parameters[name]
    where = f"sweep axis {name}"
    if p.kind != "quantity":
        return [p.coerce(v, where) for v in values]
    # each value text read once: checked here and its magnitude kept for the grid (see _column)
    default, unit = p.quantity, p.unit
    out, magnitudes = [], []
    for v in values:
        q = None
        if isinstance(v, str):
            with contextlib.suppress(InputError):
                q = parse_quantity(v, where)
        if q is None or q.dimensionality != default.dimensionality:
            v = p.coerce(v, where)  # a value of another form, or one refused with the parameter's message
            q = parse_quantity(v, where)
        out.append(v)
        magnitudes.append(float(q.to(unit).magnitude))
    _keep_column(name, tuple(out), unit, np.asarray(magnitudes))
    return out


def steps(start: str, stop: str, count: int) -> list[str]:
    """``count`` evenly spaced values from ``start`` to ``stop`` as value texts in ``start``'s
    unit, e.g. ``steps("12 in", "96 in", 43)`` (an axis for :func:`sweep`)."""
    a, b = parse_quantity(start, "sweep start"), parse_quantity(stop, "sweep stop")
    if count < 1:
        raise InputError(f"sweep steps: count {count}; expected 1 or more")
    unit = a.units
    hi = float(b.to(unit).magnitude)
    return [f"{float(v):.10g} {unit_symbol(unit, 'ascii')}" for v in np.linspace(float(a.magnitude), hi, count)]


_COLUMNS: dict[tuple[str, tuple[Any, ...], str], np.ndarray] = {}  # per process (see _column)


def _column(name: str, values: tuple[Any, ...], unit: Any) -> np.ndarray:
    """An axis's values as magnitudes in ``unit``, parsed once per process (every plan of a
    sweep, one per section or grade, shares its grid axes; parsing thousands of value texts
    was most of a plan's cost). A Dask worker is given the client's columns (:func:`_plan`):
    parsing them again was most of its first chunk."""
    col = _COLUMNS.get((name, values, _unit_key(unit)))
    if col is None:
        col = _keep_column(name, values, unit, np.asarray([float(parse_quantity(v, name).to(unit).magnitude) for v in values]))
    return col


def _unit_key(unit: Any) -> str:
    """A unit (text or pint unit) as pint names it: ``"lbf"`` and ``force_pound`` are one key."""
    return str(ureg.Unit(unit)) if isinstance(unit, str) else str(unit)


def _native(a: np.ndarray) -> np.ndarray:
    """``a`` with numpy's own float64 dtype object. An unpickled array (one sent to a Dask
    worker) carries a dtype equal to it but not the same object, and so does everything indexed
    from it; ``np.maximum.at`` then leaves its fast loop (28x slower, measured: a fifth of a
    worker's time on a sweep's envelope)."""
    return np.asarray(a, dtype=np.float64)


def _keep_column(name: str, values: tuple[Any, ...], unit: Any, col: np.ndarray) -> np.ndarray:
    """Keep ``col`` as the column of ``values`` in ``unit`` (bounded; read-only)."""
    if len(_COLUMNS) >= 64:
        _COLUMNS.clear()
    col = _native(col)
    col.setflags(write=False)
    return _COLUMNS.setdefault((name, values, _unit_key(unit)), col)


class _Plan:
    """The compiled sheets for one combination of the build axes, and how to feed the grid axes."""

    def __init__(self, builder: SheetBuilder, values: Mapping[str, Any], grid: dict[str, list[Any]], mapping: dict[str, Any]) -> None:
        sheets = builder.sheets(values)
        self.compiled = [s.compile() for s in sheets]
        self.limits = [{c.key: (c.title, c.limit) for c in s.evaluate().checks} for s in sheets]
        self.grid = grid
        self.columns: list[list[tuple[str, np.ndarray]]] = []  # per sheet: (given, values in its unit per axis)
        for si, comp in enumerate(self.compiled):
            cols = []
            for name, vals in grid.items():
                g = mapping[name][si]
                if g is not None:
                    cols.append((g, _column(name, tuple(vals), comp.given_units[g])))
                else:
                    cols.append(("", np.empty(0)))
            self.columns.append(cols)

    def evaluate(self, start: int, stop: int) -> tuple[np.ndarray, np.ndarray, np.ndarray, np.ndarray]:
        """Cases ``start``..``stop`` of the grid: (axis indices, pass, governing ratio, governing check index)."""
        shape = tuple(len(v) for v in self.grid.values())
        idx = np.unravel_index(np.arange(start, stop), shape) if shape else ()
        n = stop - start
        ok = np.ones(n, dtype=bool)
        worst = np.full(n, -np.inf)
        which = np.full(n, -1, dtype=np.int32)
        rr = np.empty(n)
        better = np.empty(n, dtype=bool)
        k = 0
        for comp, cols, limits in zip(self.compiled, self.columns, self.limits, strict=True):
            kwargs = {g: vals[idx[j]] for j, (g, vals) in enumerate(cols) if g}
            res = comp.ratios(**kwargs)
            ok &= np.broadcast_to(res.valid, (n,))
            for key, (_title, limit) in limits.items():
                r = np.broadcast_to(res[key], (n,))
                ok &= r <= limit
                np.copyto(rr, r)  # NaN governs (as +inf); the first check of the largest ratio wins
                np.copyto(rr, np.inf, where=np.isnan(rr))
                np.greater(rr, worst, out=better)
                np.copyto(worst, rr, where=better)
                np.copyto(which, k, where=better)
                k += 1
        return np.asarray(idx, dtype=np.int64).reshape(len(shape), n), ok, worst, which


_PLANS: dict[Any, _Plan] = {}  # per process (a Dask worker builds each plan once)


@dataclass(frozen=True)
class _Shared:
    """What every chunk of a sweep shares: sent to each Dask worker once, as one object (Dask
    serializes a list or dict it is given item by item: the grid's value texts one by one took
    0.03-0.6 s of the client's time before the first chunk started, measured)."""

    template: Template
    grid: dict[str, list[Any]]
    mapping: dict[str, Any]
    env_vals: np.ndarray | None  # the envelope axis in its parameter's unit
    columns: dict[str, np.ndarray]  # the grid axes parsed once, in their parameter's unit (see _column)


def _plan(shared: _Shared, values: dict[str, Any]) -> _Plan:
    """The plan for ``values``, built once per process."""
    tpl, grid = shared.template, shared.grid
    key = (str(tpl.path), repr(sorted(values.items())), repr(grid))
    if key not in _PLANS:
        if len(_PLANS) > 64:
            _PLANS.clear()
        for name, col in shared.columns.items():
            _keep_column(name, tuple(grid[name]), tpl.parameters[name].unit, col)
        _PLANS[key] = _Plan(SheetBuilder(tpl), values, grid, shared.mapping)
    return _PLANS[key]


def _chunk(shared: _Shared, values: dict[str, Any], start: int, stop: int, env_axis: int | None, want_table: bool) -> dict[str, Any]:
    """One chunk of the grid (runs where it is sent: here or on a Dask worker), evaluated
    :data:`BLOCK_CASES` cases at a time: the pass count and the envelope are folded block by
    block, so only the table (when asked for) is as large as the chunk."""
    plan = _plan(shared, values)
    grid = shared.grid
    out: dict[str, Any] = {"passed": 0, "checks": [t for lim in plan.limits for t, _l in lim.values()]}
    shape = [len(v) for v in grid.values()]
    others = [j for j in range(len(shape)) if j != env_axis]
    best = None
    if env_axis is not None:
        best = np.full(math.prod(shape[j] for j in others), -np.inf)
        env_col = _native(shared.env_vals)
    parts = []
    for a in range(start, stop, BLOCK_CASES):
        idx, ok, worst, which = plan.evaluate(a, min(a + BLOCK_CASES, stop))
        out["passed"] += int(ok.sum())
        if want_table:
            parts.append((idx, ok, worst, which))
        if best is not None:
            flat = np.ravel_multi_index(tuple(idx[j][ok] for j in others), tuple(shape[j] for j in others)) if others else np.zeros(int(ok.sum()), dtype=np.int64)
            np.maximum.at(best, flat, env_col[idx[env_axis][ok]])
    if want_table:
        out.update(idx=np.concatenate([p[0] for p in parts], axis=1), ok=np.concatenate([p[1] for p in parts]),
                   worst=np.concatenate([p[2] for p in parts]), which=np.concatenate([p[3] for p in parts]))
    if best is not None:
        out["envelope"] = best
    return out


def _envelope_frame(ax: dict[str, list[Any]], build_axes: list[str], others: list[str], combos: list[tuple[Any, ...]],
                    jobs: list[tuple[Any, ...]], results: list[dict[str, Any]], column: str) -> Any:
    """The envelope table: a row per combination of the build axes and the other grid axes (in
    grid order), with the largest passing value of the envelope axis (NaN where none passes)."""
    import pandas as pd

    per_combo: dict[Any, np.ndarray] = {}
    for (combo, _args), r in zip(jobs, results, strict=True):
        per_combo[combo] = np.maximum(per_combo[combo], r["envelope"]) if combo in per_combo else r["envelope"]
    rest = list(zip(*itertools.product(*(ax[n] for n in others)), strict=True)) if others else []
    n_rest = math.prod(len(ax[n]) for n in others)
    cols: dict[str, list[Any]] = {n: [] for n in [*build_axes, *others]}
    for combo in combos:
        for j, n in enumerate(build_axes):
            cols[n].extend([combo[j]] * n_rest)
        for j, n in enumerate(others):
            cols[n].extend(rest[j])
    best = np.concatenate([per_combo[c] for c in combos])
    return pd.DataFrame({**cols, column: np.where(np.isfinite(best), best, np.nan)})


def sweep(
    template: Template,
    fixed: Mapping[str, Any],
    axes: Mapping[str, Sequence[Any]],
    *,
    envelope: str | None = None,
    table: bool = True,
    chunk_cases: int = CHUNK_CASES,
    max_table_cases: int = MAX_TABLE_CASES,
    client: Any = None,
    progress: Callable[[int], None] | bool | None = None,
) -> SweepResult:
    """Evaluate ``template`` over the grid of ``axes`` (parameter → values as in a job), the other
    parameters from ``fixed`` (else the template's defaults). See the module docstring.

    ``envelope``: a quantity axis set through one given; the result's ``envelope`` holds its
    largest passing value per combination of the other axes (NaN where none passes).
    ``progress``: a callable given the number of cases each finished chunk held, True for a
    progress bar, False for none; None (default): a bar in a notebook once the sweep has gone on
    for 2 s, none elsewhere.
    """
    if progress is True:
        from calcpad.runner.scale import progress_bar

        total = math.prod(len(v) for v in axes.values())
        with progress_bar(total, f"sweep of {template.name}") as advance:
            return sweep(template, fixed, axes, envelope=envelope, table=table, chunk_cases=chunk_cases,
                         max_table_cases=max_table_cases, client=client, progress=advance)
    if progress is None:  # in a notebook, a bar once the sweep has gone on for 2 s
        from calcpad.runner.progress import notebook_progress

        total = math.prod(len(v) for v in axes.values())
        with notebook_progress(total, f"sweep of {template.name}") as bar:
            if bar is not None:
                return sweep(template, fixed, axes, envelope=envelope, table=table, chunk_cases=chunk_cases,
                             max_table_cases=max_table_cases, client=client,
                             progress=lambda n: bar.advance(f"sweep of {template.name}", n))
    if progress is False:
        progress = None
    import pandas as pd

    params = {n: p for n, p in template.parameters.items() if n not in CONTEXT_PARAMETERS}
    base = {n: p.default for n, p in params.items()}
    base.update({n: params[n].coerce(v, n) for n, v in fixed.items() if n in params})
    unknown = [n for n in fixed if n not in params]
    if unknown:
        raise InputError(f"sweep: {', '.join(map(repr, unknown))} not parameters of template {template.name!r}")
    ax = {n: _axis_values(template, n, v) for n, v in axes.items()}
    cases = math.prod(len(v) for v in ax.values())
    if cases > MAX_CASES:
        raise SweepTooLargeError(f"sweep: {cases:,} cases; at most {MAX_CASES:,} (use a coarser grid)")
    if table and cases > max_table_cases:
        raise SweepTooLargeError(
            f"sweep: {cases:,} cases would make a table of about {cases * (len(ax) + 4) * 8 / 1e9:.1f} GB (limit {max_table_cases:,} rows); "
            "ask for table=False (the envelope and pass counts are still computed, chunk by chunk) or use a coarser grid")
    builder = SheetBuilder(template)
    first = {**base, **{n: v[0] for n, v in ax.items()}}
    mapping = given_map(builder, first, [n for n in ax if params[n].kind == "quantity"])
    grid_axes = [n for n in ax if mapping.get(n) is not None]
    build_axes = [n for n in ax if n not in grid_axes]
    if envelope is not None and envelope not in grid_axes:
        raise InputError(f"sweep: envelope axis {envelope!r} must be a swept quantity that sets one given of the sheet "
                         f"(grid axes: {', '.join(grid_axes) or 'none'})")
    grid = {n: ax[n] for n in grid_axes}
    n_grid = math.prod(len(v) for v in grid.values())
    env_axis = grid_axes.index(envelope) if envelope is not None else None
    columns = {n: _column(n, tuple(grid[n]), params[n].unit) for n in grid_axes}
    shared = _Shared(template, grid, mapping, columns[envelope] if envelope is not None else None, columns)
    if client is not None and not table:  # no table to bound: tasks of at least 1/TASKS_PER_WORKER of a worker's share
        workers = max(1, len(client.scheduler_info().get("workers", {})))
        chunk_cases = max(chunk_cases, math.ceil(cases / (workers * TASKS_PER_WORKER)))
    pieces = math.ceil(n_grid / chunk_cases)
    jobs = []
    for combo in itertools.product(*(ax[n] for n in build_axes)):
        values = {**first, **dict(zip(build_axes, combo, strict=True))}
        for k in range(pieces):  # equal pieces of at most chunk_cases cases
            jobs.append((combo, (shared, values, k * n_grid // pieces, (k + 1) * n_grid // pieces, env_axis, table)))
    if client is None:
        results = []
        for _combo, args in jobs:
            results.append(_chunk(*args))
            if progress is not None:
                progress(args[3] - args[2])
    else:
        from calcpad.runner.scale import ChunkFailedError, map_chunks

        def describe(i: int) -> str:
            combo, args = jobs[i]
            return f"{dict(zip(build_axes, combo, strict=True))} grid cases {args[2]}-{args[3] - 1} of {n_grid}"

        def tick(i: int, _r: Any) -> None:
            if progress is not None:
                progress(jobs[i][1][3] - jobs[i][1][2])

        # the template, the grid and its axes parsed here go to every worker once (each chunk
        # would carry them, and rebuild the template, every time; each worker parsed the axes
        # again on its first chunk), in a list: scatter() splits a container given alone
        [shared_f] = client.scatter([shared], broadcast=True, hash=False)
        sent = [(shared_f, *a[1:]) for _c, a in jobs]
        results, failures = map_chunks(client, _chunk, sent, describe, tick)
        if failures:
            raise ChunkFailedError(failures)
    checks = list(dict.fromkeys(t for r in results for t in r["checks"]))
    out = SweepResult({n: list(v) for n, v in ax.items()}, cases, sum(r["passed"] for r in results), checks, envelope_axis=envelope)
    combos = list(itertools.product(*(ax[n] for n in build_axes)))
    if table:
        frames = []
        for (combo, _args), r in zip(jobs, results, strict=True):
            cols = {n: combo[j] for j, n in enumerate(build_axes)}
            cols.update({n: np.asarray(ax[n], dtype=object)[r["idx"][j]] for j, n in enumerate(grid_axes)})
            cols["governing ratio"] = np.where(np.isinf(r["worst"]), np.nan, r["worst"])
            cols["governing check"] = np.asarray(r["checks"] + [""], dtype=object)[r["which"]]
            cols["pass"] = r["ok"]
            frames.append(pd.DataFrame(cols, columns=[*ax, "governing ratio", "governing check", "pass"]))
        out.table = pd.concat(frames, ignore_index=True)
    if envelope is not None:
        out.envelope = _envelope_frame(ax, build_axes, [n for n in grid_axes if n != envelope], combos, jobs, results,
                                       f"max {envelope} [{params[envelope].unit}]")
    return out


def design_chart(result: SweepResult, x: str, curves: str, title: str = "") -> Any:
    """A design chart from a sweep's envelope: the envelope axis's largest passing value against
    ``x`` (a swept quantity), one curve per value of ``curves`` (e.g. the tube size). A
    matplotlib Figure (no pyplot state)."""
    from matplotlib.figure import Figure

    env = result.envelope
    if env is None:
        raise InputError("design chart: the sweep has no envelope; run sweep(..., envelope=AXIS)")
    ycol = next(c for c in env.columns if c.startswith("max "))
    fig = Figure(figsize=(6.4, 4.2), dpi=100)
    axp = fig.add_subplot()
    for value in result.axes[curves]:
        part = env[env[curves] == value]
        xs = [float(parse_quantity(v, x).magnitude) for v in part[x]]
        axp.plot(xs, part[ycol].to_numpy(dtype=float), marker="o", markersize=3, label=str(value))
    axp.set_xlabel(f"{x} [{unit_symbol(parse_quantity(result.axes[x][0], x).units)}]")
    axp.set_ylabel(ycol)
    axp.grid(True, alpha=0.3)
    axp.legend(title=curves, fontsize=8)
    axp.set_title(title or f"Largest passing {result.envelope_axis} by {x} and {curves}")
    fig.tight_layout()
    return fig


def pass_fail_figure(result: SweepResult, x: str, y: str, where: Mapping[str, Any] | None = None, title: str = "") -> Any:
    """Pass/fail region of two swept quantities (the other axes fixed by ``where``, default
    their first values), shaded by the governing ratio with the ratio = 1.0 contour."""
    from matplotlib.figure import Figure

    if result.table is None:
        raise InputError("pass/fail figure: the sweep kept no table; run sweep(..., table=True)")
    t = result.table
    for n in result.axes:
        if n not in (x, y):
            t = t[t[n] == (where or {}).get(n, result.axes[n][0])]
    xs = [float(parse_quantity(v, x).magnitude) for v in result.axes[x]]
    ys = [float(parse_quantity(v, y).magnitude) for v in result.axes[y]]
    grid = t.pivot_table(index=y, columns=x, values="governing ratio", sort=False).reindex(index=result.axes[y], columns=result.axes[x])
    fig = Figure(figsize=(6.4, 4.2), dpi=100)
    axp = fig.add_subplot()
    mesh = axp.pcolormesh(xs, ys, grid.to_numpy(dtype=float), shading="nearest", cmap="RdYlGn_r", vmin=0.0, vmax=2.0)
    axp.contour(xs, ys, grid.to_numpy(dtype=float), levels=[1.0], colors="black", linewidths=1.2)
    fig.colorbar(mesh, ax=axp, label="governing ratio (≤ 1.0 passes)")
    axp.set_xlabel(f"{x} [{unit_symbol(parse_quantity(result.axes[x][0], x).units)}]")
    axp.set_ylabel(f"{y} [{unit_symbol(parse_quantity(result.axes[y][0], y).units)}]")
    axp.set_title(title or f"Pass/fail: {x} x {y}")
    fig.tight_layout()
    return fig
