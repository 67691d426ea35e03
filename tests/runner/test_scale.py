"""Dask scale-out: results identical to the serial run; a failing chunk retried, then reported with its inputs."""

from __future__ import annotations

from pathlib import Path

import pytest

from calcpad.runner import sweep as sweep_module
from calcpad.runner.execute import run_job
from calcpad.runner.job import load_job
from calcpad.runner.record import UNSEALED_KEYS, job_record
from calcpad.runner.scale import ChunkFailedError, chunk_ranges, cluster_client, map_chunks, run_calcs_on_cluster, search_on_cluster
from calcpad.runner.search import search
from calcpad.runner.sweep import steps, sweep
from calcpad.runner.template import find_template, load_template

ROOT = Path(__file__).resolve().parents[2]


@pytest.fixture(scope="module")
def client():
    with cluster_client(workers=2) as c:
        yield c


def _flaky(x: int, marker: str) -> int:
    """Fails the first time it is called for a marker file that does not exist yet."""
    p = Path(marker)
    if not p.exists():
        p.write_text("tried")
        raise RuntimeError("first try fails")
    return x * 10


def _broken(x: int) -> int:
    if x == 3:
        raise ValueError(f"chunk with x={x} always fails")
    return x


def test_batch_on_the_cluster_equals_serial(client) -> None:
    job = load_job(ROOT / "examples" / "harbor_ridge_condenser_stand.toml")
    serial = job_record(job, run_job(job), "inprocess", 0.0)
    seen = []
    parallel = job_record(job, run_calcs_on_cluster(job, client, progress=seen.append, chunk_calcs=3), "inprocess", 0.0)
    strip = lambda r: {k: v for k, v in r.items() if k not in UNSEALED_KEYS}  # noqa: E731
    assert strip(parallel) == strip(serial)
    assert parallel["record_digest"] == serial["record_digest"]
    assert len(seen) == len(job.calcs)


def test_search_and_sweep_on_the_cluster_equal_serial(client, monkeypatch) -> None:
    tpl = load_template(find_template("leg_bending"))
    base = {n: p.default for n, p in tpl.parameters.items() if n not in ("member_mark", "calc_title")}
    members = [(f"M{i}", {**base, "P": f"{40 + 30 * i} lbf", "L": f"{20 + 7 * i} in"}) for i in range(9)]
    settings = {"parameter": "leg", "family": "pipe"}
    assert search_on_cluster(client, tpl, members, settings, chunk_members=2) == search(tpl, members, settings)
    axes = {"leg": ["Pipe 1 Std", "Pipe 2 Std"], "P": steps("50 lbf", "400 lbf", 30), "L": steps("12 in", "96 in", 40)}
    b = sweep(tpl, {}, axes, envelope="L", chunk_cases=300, client=client)
    # here each chunk runs in blocks of 7 cases (the last one short), on the workers in one block
    monkeypatch.setattr(sweep_module, "BLOCK_CASES", 7)
    a = sweep(tpl, {}, axes, envelope="L", chunk_cases=300)
    assert a.table.equals(b.table) and a.envelope.equals(b.envelope) and a.passed == b.passed
    assert 0 < a.passed < a.cases and a.envelope.iloc[:, -1].notna().any() and a.envelope.iloc[:, -1].isna().any()
    # without a table the cluster's tasks are larger (2,400 cases / (2 workers x 8) = 150 per task, not 20)
    c = sweep(tpl, {}, axes, envelope="L", table=False, chunk_cases=20, client=client)
    assert c.envelope.equals(a.envelope) and c.passed == a.passed and c.table is None


def test_a_failed_chunk_is_retried_then_reported_with_its_inputs(client, tmp_path: Path) -> None:
    chunks = [(i, str(tmp_path / f"m{i}")) for i in range(4)]
    results, failures = map_chunks(client, _flaky, chunks, describe=lambda i: f"x={i}")
    assert results == [0, 10, 20, 30] and failures == []  # each failed once, retried
    results, failures = map_chunks(client, _broken, [(i,) for i in range(5)], describe=lambda i: f"x={i} (members X{i})")
    assert [r for i, r in enumerate(results) if i != 3] == [0, 1, 2, 4]
    assert len(failures) == 1 and failures[0].index == 4 and failures[0].inputs == "x=3 (members X3)"
    assert "always fails" in failures[0].error
    with pytest.raises(ChunkFailedError, match=r"chunk 4: x=3 \(members X3\): ValueError"):
        raise ChunkFailedError(failures)


def test_cli_workers_gives_the_serial_record(tmp_path: Path) -> None:
    from calcpad.cli import main
    from calcpad.runner.recordfile import load_record

    (tmp_path / "legs.csv").write_text("mark,P [lbf],N [lbf],L [in],leg\n" + "".join(
        f"A{i},{60 + 20 * i},50,{24 + 6 * i},Pipe 1-1/2 Std\n" for i in range(1, 7)), encoding="utf-8")
    (tmp_path / "job.toml").write_text(
        '[job]\nnumber = "T-9"\ntitle = "Cluster run (invented)"\nclient = "Ferncliff Fabricators (fictional)"\nsite = "Yard 2"\n'
        'engineer = "E. Example"\nrevision = "A"\ndate = 2025-03-14\n\n[[calcs]]\ntemplate = "leg_bending"\ntable = "legs.csv"\n'
        '[calcs.inputs]\nD_o = "1.900 in"\nt = "0.145 in"\nF_y = "35 ksi"\nFS_req = 1.67\n', encoding="utf-8")
    rc_serial = main(["run", str(tmp_path / "job.toml"), "--out", str(tmp_path / "serial"), "--no-pdf"])
    rc_dask = main(["run", str(tmp_path / "job.toml"), "--out", str(tmp_path / "dask"), "--no-pdf", "--workers", "2"])
    assert rc_serial == rc_dask
    (_p1, a), (_p2, b) = load_record(tmp_path / "serial"), load_record(tmp_path / "dask")
    assert a["record_digest"] == b["record_digest"]


def _calcs_failing_on_l2(calcs: list, units: str) -> list:
    """A chunk task that dies (as a worker crash would) for the chunk holding member L2."""
    from calcpad.runner.scale import _run_calcs

    if any(c.member == "L2" for c in calcs):
        raise MemoryError("worker ran out of memory (simulated)")
    return _run_calcs(calcs, units)


def test_a_failed_batch_chunk_becomes_failed_calcs_naming_it(client) -> None:
    job = load_job(ROOT / "examples" / "harbor_ridge_condenser_stand.toml")
    outcomes = run_calcs_on_cluster(job, client, chunk_calcs=2, task=_calcs_failing_on_l2)
    assert [o.calc.member for o in outcomes] == [c.member for c in job.calcs]  # nothing dropped, job order
    failed = [o for o in outcomes if o.error is not None]
    members = [o.calc.member for o in failed]
    assert "L2" in members and len(failed) == 2  # the whole chunk of two calcs
    msg = failed[0].error["message"]
    assert "failed on the cluster after 3 tries" in msg and "MemoryError" in msg and f"members {', '.join(members)}" in msg
    assert all(o.error is None and o.sheets for o in outcomes if o.calc.member not in members)


def _sweep_chunk_failing_at_600(shared, values, start, stop, env_axis, want_table):
    """A sweep chunk task that dies (as a worker crash would) for the chunks starting at grid case 600."""
    if start == 600:
        raise MemoryError("worker ran out of memory (simulated)")
    return sweep_module._chunk(shared, values, start, stop, env_axis, want_table)


def test_a_failed_sweep_chunk_is_reported_with_its_grid_cases(client, monkeypatch) -> None:
    from calcpad.runner import scale

    tpl = load_template(find_template("leg_bending"))
    axes = {"leg": ["Pipe 1 Std", "Pipe 2 Std"], "P": steps("50 lbf", "400 lbf", 30), "L": steps("12 in", "96 in", 40)}
    real = scale.map_chunks
    monkeypatch.setattr(scale, "map_chunks", lambda c, _func, chunks, *a, **k: real(c, _sweep_chunk_failing_at_600, chunks, *a, **k))
    with pytest.raises(ChunkFailedError) as err:
        sweep(tpl, {}, axes, envelope="L", chunk_cases=300, client=client)
    # 1,200 grid cases per pipe size in chunks of 300: the third chunk of each size fails
    assert [f.index for f in err.value.failures] == [3, 7]
    assert "chunk 3: {'leg': 'Pipe 1 Std'} grid cases 600-899 of 1200: MemoryError" in str(err.value)
    assert "chunk 7: {'leg': 'Pipe 2 Std'} grid cases 600-899 of 1200: MemoryError" in str(err.value)


def _bound_on_worker(tpl) -> tuple[bool, bool]:
    """Worker side: the template arrived pickled; is its upper bound on L one of calcpad's quantities?"""
    from calcpad.core.units import Q_, ureg

    upper = tpl.parameters["L"].upper.value
    return upper._REGISTRY is ureg, bool(Q_(29, "ft") < upper <= Q_(360, "in"))


def test_a_template_sent_to_a_worker_keeps_calcpads_unit_registry(client) -> None:
    # leg_bending states L from 6 in to 30 ft; 30 ft = 360 in (unit fact). Unpickled quantities
    # used to join a second registry of pint's (slow to build, not comparable with ours).
    tpl = load_template(find_template("leg_bending"))
    assert client.submit(_bound_on_worker, tpl, pure=False).result() == (True, True)


def test_columns_sent_to_a_worker_keep_numpys_own_float_dtype() -> None:
    # An unpickled array's dtype equals float64 but is another object, and np.maximum.at (the
    # sweep's envelope) then leaves its fast loop; what a worker keeps must be numpy's own.
    import pickle

    import numpy as np

    col = pickle.loads(pickle.dumps(np.linspace(6.0, 160.0, 50)))
    assert col.dtype == np.float64 and col.dtype is not np.dtype(np.float64)  # what arrives
    kept = sweep_module._keep_column("L", tuple(f"{v} in" for v in col), "in", col)
    assert kept.dtype is np.dtype(np.float64) and np.array_equal(kept, col) and not kept.flags.writeable


@pytest.mark.parametrize(("n", "size", "workers"), [(0, 5, 2), (1, 5, 2), (7, 3, 1), (2000, 100, 2), (999, 64, 3), (10, 1, 4)])
def test_chunk_ranges_cover_every_item_once_and_shrink_at_the_tail(n: int, size: int, workers: int) -> None:
    for tail in (False, True):
        ranges = chunk_ranges(n, size, workers, tail=tail)
        assert [i for a, b in ranges for i in range(a, b)] == list(range(n))  # in order, each once
        lengths = [b - a for a, b in ranges]
        assert all(0 < k <= size for k in lengths)
        if not tail:
            assert all(k == size for k in lengths[:-1])
        else:  # never growing, and never under an eighth of the size but for the last
            assert lengths == sorted(lengths, reverse=True)
            assert all(k >= max(1, size // 8) for k in lengths[:-1])
    if n == 2000:  # 2 workers, 100 per chunk: the last chunks are smaller than the first
        assert chunk_ranges(n, size, workers)[-2][1] - chunk_ranges(n, size, workers)[-2][0] < size
