"""The example job, run once in-process for the printing tests."""

from __future__ import annotations

from pathlib import Path

import pytest

ROOT = Path(__file__).resolve().parents[2]
EXAMPLE = ROOT / "examples" / "harbor_ridge_condenser_stand.toml"


@pytest.fixture(scope="session")
def example_run(tmp_path_factory: pytest.TempPathFactory):
    """(job, outcomes, output folder) of the example job run in-process."""
    from calcpad.report import write_submittal
    from calcpad.runner.execute import run_job
    from calcpad.runner.job import load_job
    from calcpad.runner.record import job_record

    job = load_job(EXAMPLE)
    outcomes = run_job(job, mode="inprocess")
    out = tmp_path_factory.mktemp("example") / "out"
    out.mkdir()
    write_submittal(out, job, outcomes, job_record(job, outcomes, "inprocess", 0.0), pdf=False)
    return job, outcomes, out
