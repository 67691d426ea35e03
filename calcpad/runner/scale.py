"""Scale-out on Dask: a job's calcs, a design search or a sweep in chunks on a cluster.

``calcpad run JOB.toml --workers 2`` starts a local cluster (one process per worker, one thread
each) for the run; ``--scheduler tcp://HOST:8786`` uses a running cluster whose workers have
calcpad (same version) and the template folders installed. The work is cut into chunks: a
chunk is a list of calcs, a slice of members, or a range of grid cases generated on the worker
from the axis definitions, so no large array is shipped. Each chunk is a Dask task with
``retries``; a chunk that still fails is reported with its inputs (:class:`ChunkFailure`),
never dropped: a batch turns it into failed calcs in the record, a search or sweep raises
:class:`ChunkFailedError`. Results come back in input order, so they equal the serial run.
"""

from __future__ import annotations

import contextlib
import dataclasses
import functools
import logging
import math
import os
from collections.abc import Callable, Iterator, Sequence
from dataclasses import dataclass
from typing import Any

from calcpad.core.errors import CalcpadError

__all__ = ["ChunkFailedError", "ChunkFailure", "chunk_ranges", "cluster_client", "map_chunks", "progress_bar", "run_calcs_on_cluster", "search_on_cluster"]

RETRIES = 2
#: Most calcs in one batch chunk (fewer when that leaves under four chunks per worker).
CHUNK_CALCS = 100
#: Free memory glibc keeps at the top of a worker's heap (``MALLOC_TOP_PAD_``), see :func:`cluster_client`.
MALLOC_TOP_PAD = 64 * 2**20


@dataclass
class ChunkFailure:
    """A chunk that failed on every try: what it held and the last error."""

    index: int
    inputs: str  # the chunk's inputs in words (calcs and members, or the grid cases)
    error: str


class ChunkFailedError(CalcpadError):
    """Chunks that failed on the cluster after their retries (each with its inputs); exit code 2
    as for a calc that failed to run."""

    exit_code = 2

    def __init__(self, failures: list[ChunkFailure]) -> None:
        self.failures = failures
        lines = [f"{len(failures)} chunk(s) failed on the cluster after {RETRIES + 1} tries each:"]
        lines += [f"  chunk {f.index}: {f.inputs}: {f.error}" for f in failures]
        super().__init__("\n".join(lines))


@contextlib.contextmanager
def cluster_client(workers: int | None = None, scheduler: str | None = None) -> Iterator[Any]:
    """A Dask client: on a new local cluster of ``workers`` processes, or on ``scheduler``."""
    from distributed import Client, LocalCluster

    if scheduler:
        try:
            client = Client(scheduler, timeout="20s")
        except Exception as exc:  # OSError (unreachable), ValueError/TypeError (not an address)
            raise CalcpadError(f"--scheduler {scheduler}: cannot reach the Dask scheduler ({type(exc).__name__}: {exc}); "
                               "expected an address such as tcp://10.0.0.5:8786 of a running cluster") from None
        try:
            yield client
        finally:
            client.close()
        return
    import dask

    n = int(workers or 2)
    # Dask's nanny sets MALLOC_TRIM_THRESHOLD_ in each worker, which turns off glibc's adaptive
    # mmap threshold: every large numpy temporary is then mmapped and page-faulted afresh, and a
    # sweep chunk ran 3.5x slower on a worker than in this process (measured). Leave it unset.
    environ = {k: v for k, v in dask.config.get("distributed.nanny.pre-spawn-environ", {}).items() if k != "MALLOC_TRIM_THRESHOLD_"}
    # glibc returns the top of the heap to the system whenever enough of it is free, i.e. after
    # each block of a sweep or calc; the next block faults those pages in again (kernel time).
    # Keeping MALLOC_TOP_PAD bytes at the top made a sweep's chunks 20 % cheaper in a worker
    # thread (measured; 64 MiB of the worker's memory at most).
    environ.setdefault("MALLOC_TOP_PAD_", os.environ.get("MALLOC_TOP_PAD_", str(MALLOC_TOP_PAD)))
    # The workers' statistical profiler samples every task's stack every 10 ms (for the
    # dashboard); calcs are pure Python, so that is CPU taken from them. Off for our clusters.
    with dask.config.set({"distributed.nanny.pre-spawn-environ": environ, "distributed.worker.profile.enabled": False}):
        cluster = LocalCluster(n_workers=n, threads_per_worker=1, processes=True, dashboard_address=":0",
                               silence_logs=logging.ERROR, memory_limit="auto")
    client = Client(cluster)
    try:
        yield client
    finally:
        client.close()
        cluster.close()


@contextlib.contextmanager
def progress_bar(total: int, label: str) -> Iterator[Callable[[int], None]]:
    """A rich progress bar on stderr (shown on a terminal or in a notebook, hidden in logs and
    pipes, gone when done); yields ``advance(n)``."""
    from rich.console import Console
    from rich.progress import BarColumn, MofNCompleteColumn, Progress, TextColumn, TimeElapsedColumn, TimeRemainingColumn

    console = Console(stderr=True)
    with Progress(TextColumn("{task.description}"), BarColumn(), MofNCompleteColumn(), TimeElapsedColumn(), TimeRemainingColumn(),
                  console=console, transient=True, disable=not (console.is_terminal or console.is_jupyter)) as bar:
        task = bar.add_task(label, total=total)
        yield lambda n: bar.update(task, advance=n)


def chunk_ranges(n: int, size: int, workers: int = 1, tail: bool = True) -> list[tuple[int, int]]:
    """Contiguous (start, stop) ranges covering ``range(n)``, none empty, none over ``size``.

    With ``tail`` the last ones shrink (each at most the remaining work over twice the workers,
    down to an eighth of ``size``): the scheduler hands chunks out as workers free up, and small
    chunks at the end keep one worker from finishing a full chunk alone while the other waits."""
    size = max(1, size)
    smallest = max(1, size // 8)
    ranges: list[tuple[int, int]] = []
    a = 0
    while a < n:
        step = size
        if tail:
            step = max(smallest, min(size, math.ceil((n - a) / (2 * max(1, workers)))))
        ranges.append((a, min(a + step, n)))
        a = ranges[-1][1]
    return ranges


def map_chunks(
    client: Any,
    func: Callable[..., Any],
    chunks: Sequence[tuple[Any, ...]],
    describe: Callable[[int], str],
    progress: Callable[[int, Any], None] | None = None,
    retries: int = RETRIES,
) -> tuple[list[Any], list[ChunkFailure]]:
    """Run ``func(*chunk)`` for each chunk on the cluster; results in chunk order, and the
    chunks that failed after ``retries`` (``describe(i)`` says what chunk ``i`` held).
    ``progress(i, result)`` is called as each chunk finishes."""
    from distributed import as_completed

    futures = [client.submit(func, *args, retries=retries, pure=False) for args in chunks]
    where = {f.key: i for i, f in enumerate(futures)}
    results: list[Any] = [None] * len(futures)
    failures: list[ChunkFailure] = []
    for fut in as_completed(futures):
        i = where[fut.key]
        if fut.status == "error":
            exc = fut.exception()
            failures.append(ChunkFailure(i + 1, describe(i), f"{type(exc).__name__}: {exc}"))
        else:
            results[i] = fut.result()
        fut.release()
        if progress is not None:
            progress(i, results[i])
    failures.sort(key=lambda f: f.index)
    return results, failures


def _run_calcs(calcs: list[Any], units: str, text: bool = False) -> list[Any]:
    """Worker side: run a chunk of calcs in this process, as the serial runner does (``text``:
    with each sheet's plain-text hand calc)."""
    from calcpad.core.sheet import SYSTEM_ENV
    from calcpad.runner.execute import run_calc_inprocess

    os.environ[SYSTEM_ENV] = units
    return [run_calc_inprocess(c, text=text) for c in calcs]


def _run_chunk(task: Callable[[list[Any], str], list[Any]], shop_table: Any, calcs: list[Any], units: str,
               templates: dict[int, Any] | None = None) -> list[dict[str, Any]]:
    """Worker side: ``task`` with the job's own section table in use (a worker is another process:
    the table the job named must travel with the chunk). Each outcome comes back without its
    calc (the client has it): the calc holds the template, whose compiled cells and parameter
    quantities would otherwise be pickled back with every chunk.

    ``templates``: the calcs come without their template (``template`` holds a key of this dict):
    each template was sent to every worker once (``scatter``), so a chunk neither carries nor
    rebuilds it and the worker's caches keyed by the template's objects stay warm."""
    from calcpad.eng.sections.shop import shop_table_in_use

    if templates is not None:
        calcs = [dataclasses.replace(c, template=templates[c.template]) for c in calcs]
    with shop_table_in_use(shop_table):
        outcomes = task(calcs, units)
    return [{f.name: getattr(o, f.name) for f in dataclasses.fields(o) if f.init and f.name != "calc"} for o in outcomes]


def run_calcs_on_cluster(
    job: Any, client: Any, progress: Callable[[Any], None] | None = None, chunk_calcs: int | None = None,
    task: Callable[[list[Any], str], list[Any]] | None = None, text: bool = False,
) -> list[Any]:
    """Every calc of ``job`` on the cluster, in chunks; outcomes in job order (as ``run_job``).

    A chunk that fails after its retries gives each of its calcs a failed outcome naming the
    chunk and the error (the record lists them; the other calcs stand). ``task(calcs, units)``
    runs one chunk on a worker (default: each calc in-process, as the serial runner)."""
    from calcpad.runner.execute import CalcOutcome

    calcs = list(job.calcs)
    workers = max(1, len(client.scheduler_info().get("workers", {})) or 1)
    size = chunk_calcs or max(1, min(CHUNK_CALCS, math.ceil(len(calcs) / (4 * workers))))
    ranges = chunk_ranges(len(calcs), size, workers, tail=chunk_calcs is None)

    def describe(i: int) -> str:
        a, b = ranges[i]
        return f"calcs {calcs[a].number}-{calcs[b - 1].number} (members {', '.join(c.member for c in calcs[a:b])})"

    built: dict[int, list[Any]] = {}  # chunk -> its outcomes, made as the chunk comes back

    def tick(i: int, result: Any) -> None:
        if result is not None:
            a, b = ranges[i]
            built[i] = [CalcOutcome(c, **fields) for c, fields in zip(calcs[a:b], result, strict=True)]
            if progress is not None:
                for o in built[i]:
                    progress(o)

    run = functools.partial(_run_chunk, task or functools.partial(_run_calcs, text=text), getattr(job, "shop_table", None))
    # each template goes to every worker once; a chunk's calcs name theirs by key
    keys: dict[int, int] = {}
    sent: dict[int, Any] = {}
    for c in calcs:
        sent[keys.setdefault(id(c.template), len(keys))] = c.template
    # one list: scatter() splits a container given alone into one future per item
    shared = dict(zip(sent, client.scatter(list(sent.values()), broadcast=True, hash=False), strict=True))
    bare = [dataclasses.replace(c, template=keys[id(c.template)]) for c in calcs]
    _results, failures = map_chunks(client, run, [(bare[a:b], job.info.units, shared) for a, b in ranges], describe, tick)
    by_chunk = {f.index - 1: f for f in failures}
    outcomes: list[Any] = []
    for i, (a, b) in enumerate(ranges):
        if i in by_chunk:
            f = by_chunk[i]
            for c in calcs[a:b]:
                o = CalcOutcome(c, error={"cell": None, "message": f"chunk {f.index} ({f.inputs}) failed on the cluster after {RETRIES + 1} tries: {f.error}"})
                outcomes.append(o)
                if progress is not None:
                    progress(o)
        else:
            outcomes.extend(built[i])
    return outcomes


def _search_chunk(template: Any, members: list[tuple[str, dict[str, Any]]], settings: dict[str, Any], sizes: Any) -> list[Any]:
    from calcpad.runner.search import search

    return search(template, members, settings, sizes)


def search_on_cluster(
    client: Any, template: Any, members: Sequence[tuple[str, Any]], settings: Any, sizes: Any = None,
    progress: Callable[[int], None] | None = None, chunk_members: int | None = None,
) -> list[Any]:
    """:func:`calcpad.runner.search.search` with the members split into chunks on the cluster.

    Raises :class:`ChunkFailedError` (with the members of each failed chunk) after retries."""
    members = [(m, dict(v)) for m, v in members]
    workers = max(1, len(client.scheduler_info().get("workers", {})) or 1)
    size = chunk_members or max(1, math.ceil(len(members) / (2 * workers)))
    ranges = chunk_ranges(len(members), size, tail=False)  # few chunks: each pays for its search plan

    def describe(i: int) -> str:
        a, b = ranges[i]
        return f"members {a + 1}-{b} ({', '.join(m for m, _v in members[a:b][:5])}{', ...' if b - a > 5 else ''})"

    def tick(i: int, _result: Any) -> None:
        if progress is not None:
            progress(ranges[i][1] - ranges[i][0])

    # the template goes to every worker once: a chunk carrying its own copy would meet cold caches
    # (keyed by the template's objects) and build and compile every candidate's sheets again
    shared = client.scatter([template], broadcast=True, hash=False)[0]
    results, failures = map_chunks(client, _search_chunk, [(shared, members[a:b], dict(settings), sizes) for a, b in ranges], describe, tick)
    if failures:
        raise ChunkFailedError(failures)
    return [r for chunk in results for r in chunk]
