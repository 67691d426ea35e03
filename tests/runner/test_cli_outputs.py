"""`calcpad run --out`: user files survive every output-folder form; exit codes 2/3/4/130."""

from __future__ import annotations

import errno
import json
import os
import re
import tempfile
from pathlib import Path
from typing import Any

import pytest

from calcpad.cli import main
from calcpad.runner.outfolder import folder_lock

from .conftest import JOB_HEAD, tiny_calc


def _snapshot(root: Path) -> dict[str, bytes]:
    return {p.relative_to(root).as_posix(): p.read_bytes() for p in sorted(root.rglob("*")) if p.is_file()}


@pytest.fixture
def site(tmp_path: Path, tiny_env: Path) -> Path:
    """A user's disk: a job folder with notes, files beside it, a folder of their own, a file,
    and the output folder of an earlier run whose submittal the user then edited by hand."""
    root = tmp_path / "site"
    proj = root / "proj"
    (proj / "sub").mkdir(parents=True)
    (proj / "job.toml").write_text(JOB_HEAD + tiny_calc())
    (proj / "notes.txt").write_text("site visit notes\n")
    (proj / "sub" / "data.csv").write_bytes(b"a,b\n1,2\n")
    (root / "beside.txt").write_text("beside the output folder\n")
    (root / "mine").mkdir()
    (root / "mine" / "user.docx").write_bytes(bytes(range(256)))
    (root / "plain.txt").write_text("a plain file\n")
    return root


def test_user_files_survive_every_out_form(site: Path, monkeypatch: pytest.MonkeyPatch, capsys: pytest.CaptureFixture[str]) -> None:
    proj = site / "proj"
    monkeypatch.chdir(proj)
    assert main(["run", "job.toml", "--out", "../prev"]) == 0
    edited = site / "prev" / "rev-0" / "submittal.html"
    edited.write_text(edited.read_text() + "<!-- reviewer: see note 3 -->")
    (site / "elsewhere").mkdir()
    forms = [
        (proj, "../mine", "has no .calcpad-manifest.json"),  # an existing folder of the user's
        (proj, ".", "the current folder"),  # the job's own folder, as the current folder
        (proj, "../proj", "the current folder"),  # the same, named from its parent
        (proj, "..", "a parent of the current folder"),
        (proj, "sub", "has no .calcpad-manifest.json"),
        (proj, "../plain.txt", "this is a file"),
        (proj, "notes.txt", "this is a file"),
        (proj, "../prev", "was changed since calcpad wrote it"),  # a run whose output the user edited
        (site / "elsewhere", "../proj", "holds ../proj/job.toml"),  # the job's folder from outside
    ]
    for cwd, out, message in forms:
        monkeypatch.chdir(cwd)
        before = _snapshot(site)
        job = "job.toml" if cwd == proj else "../proj/job.toml"
        assert main(["run", job, "--out", out]) == 2, out
        err = capsys.readouterr().err
        assert message in err and "Traceback" not in err, (out, err)
        assert _snapshot(site) == before, out
    # a successful run beside the user's files leaves them alone
    before = _snapshot(site)
    monkeypatch.chdir(proj)
    assert main(["run", "job.toml", "--out", "../fresh"]) == 0
    after = _snapshot(site)
    assert {k: v for k, v in after.items() if not k.startswith("fresh/")} == before


def test_rerun_keeps_files_the_user_put_beside_revisions(site: Path, monkeypatch: pytest.MonkeyPatch) -> None:
    monkeypatch.chdir(site / "proj")
    assert main(["run", "job.toml", "--out", "../out"]) == 0
    (site / "out" / "transmittal.txt").write_text("sent 2025-03-14\n")
    assert main(["run", "job.toml", "--out", "../out"]) == 0
    assert (site / "out" / "transmittal.txt").read_text() == "sent 2025-03-14\n"


def test_issued_revision_refused_through_cli(site: Path, monkeypatch: pytest.MonkeyPatch, capsys: pytest.CaptureFixture[str]) -> None:
    monkeypatch.chdir(site / "proj")
    assert main(["run", "job.toml", "--out", "../out"]) == 0
    assert main(["issue", "../out", "--by", "J. Smith, P.E."]) == 0
    assert "revision 0 issued by J. Smith, P.E." in capsys.readouterr().out
    sealed = _snapshot(site / "out" / "rev-0")
    assert main(["run", "job.toml", "--out", "../out"]) == 2
    assert "bump the revision in the job file" in capsys.readouterr().err
    assert _snapshot(site / "out" / "rev-0") == sealed
    job = site / "proj" / "job.toml"
    job.write_text(job.read_text().replace('revision = "0"', 'revision = "1"'))
    assert main(["run", "job.toml", "--out", "../out"]) == 0
    assert (site / "out" / "rev-1" / "record.json").is_file() and _snapshot(site / "out" / "rev-0") == sealed


def test_busy_folder_exit_3(site: Path, monkeypatch: pytest.MonkeyPatch, capsys: pytest.CaptureFixture[str]) -> None:
    monkeypatch.chdir(site / "proj")
    assert main(["run", "job.toml", "--out", "../out"]) == 0
    before = _snapshot(site / "out")
    with folder_lock(site / "out"):
        assert main(["run", "job.toml", "--out", "../out", "--wait", "0.2"]) == 3
    assert "being written by another calcpad run" in capsys.readouterr().err
    assert _snapshot(site / "out") == before


def test_disk_full_exit_3_names_path_and_keeps_previous(site: Path, monkeypatch: pytest.MonkeyPatch, capsys: pytest.CaptureFixture[str]) -> None:
    monkeypatch.chdir(site / "proj")
    assert main(["run", "job.toml", "--out", "../out"]) == 0
    before = _snapshot(site / "out")
    real_open = Path.open

    def full(self: Path, *args: object, **kwargs: object) -> Any:
        if self.name == "record.json" and "w" in str(args[0] if args else kwargs.get("mode", "r")):
            raise OSError(errno.ENOSPC, "No space left on device", str(self))
        return real_open(self, *args, **kwargs)  # type: ignore[arg-type]

    monkeypatch.setattr(Path, "open", full)
    capsys.readouterr()
    assert main(["run", "job.toml", "--out", "../out"]) == 3
    err = capsys.readouterr().err
    assert re.search(r"cannot write \S*record\.json: No space left on device", err) and "Traceback" not in err
    assert _snapshot(site / "out") == before
    assert not [p for p in (site / "out").iterdir() if p.name.startswith((".calcpad-tmp", ".calcpad-old"))]


def test_ctrl_c_exit_130_one_line(site: Path, monkeypatch: pytest.MonkeyPatch, capsys: pytest.CaptureFixture[str]) -> None:
    import calcpad.runner.execute as execute

    def interrupted(*args: object, **kwargs: object) -> None:
        raise KeyboardInterrupt

    monkeypatch.setattr(execute, "run_job", interrupted)
    monkeypatch.chdir(site / "proj")
    assert main(["run", "job.toml", "--out", "../out"]) == 130
    assert capsys.readouterr().err == "calcpad: interrupted\n"
    assert not (site / "out").exists()


def test_internal_error_exit_4_with_log(site: Path, monkeypatch: pytest.MonkeyPatch, capsys: pytest.CaptureFixture[str], tmp_path: Path) -> None:
    import calcpad.runner.record as record

    def broken(*args: object, **kwargs: object) -> None:
        raise ZeroDivisionError("planted bug")

    logs = tmp_path / "logs"
    logs.mkdir()
    monkeypatch.setattr(tempfile, "tempdir", str(logs))
    monkeypatch.setattr(record, "job_record", broken)
    monkeypatch.chdir(site / "proj")
    assert main(["run", "job.toml", "--out", "../out"]) == 4
    err = capsys.readouterr().err
    assert err.count("\n") == 1 and "internal error (ZeroDivisionError: planted bug)" in err and "Traceback" not in err
    (log,) = logs.iterdir()
    assert str(log) in err
    text = log.read_text()
    assert "Traceback (most recent call last)" in text and "ZeroDivisionError: planted bug" in text
    assert not (site / "out").exists()


def test_json_and_out_record_agree(site: Path, monkeypatch: pytest.MonkeyPatch, capsys: pytest.CaptureFixture[str]) -> None:
    monkeypatch.chdir(site / "proj")
    assert main(["run", "job.toml", "--out", "../out", "--json"]) == 0
    printed = json.loads(capsys.readouterr().out)
    assert printed == json.loads((site / "out" / "rev-0" / "record.json").read_text())


def test_more_bad_input_is_exit_2_without_traceback(site: Path, monkeypatch: pytest.MonkeyPatch, capsys: pytest.CaptureFixture[str]) -> None:
    monkeypatch.chdir(site / "proj")
    with pytest.raises(SystemExit) as info:
        main(["run", "job.toml", "--out", "../out", "--wait", "nan"])
    assert info.value.code == 2 and "expected seconds" in capsys.readouterr().err
    assert main(["run", "job.toml", "--templates", "no-such-dir", "--out", "../out"]) == 2
    assert "--templates no-such-dir: not a folder" in capsys.readouterr().err
    (site / "out").mkdir()
    os.symlink(site / "beside.txt", site / "out" / ".calcpad-lock")
    assert main(["run", "job.toml", "--out", "../out"]) == 2
    assert "a link, not calcpad's lock file" in capsys.readouterr().err
    assert (site / "beside.txt").read_text() == "beside the output folder\n"
    job = site / "proj" / "job.toml"
    job.write_text(job.read_text().replace('revision = "0"', 'revision = "../up"'))
    assert main(["run", "job.toml", "--out", "../out2"]) == 2
    assert "job.revision: '../up'" in capsys.readouterr().err and not (site / "out2").exists()


def test_cannot_write_new_job_exit_3(tmp_path: Path, capsys: pytest.CaptureFixture[str]) -> None:
    assert main(["new", str(tmp_path / "missing" / "job.toml")]) == 3
    err = capsys.readouterr().err
    assert f"cannot read or write {tmp_path / 'missing' / 'job.toml'}: No such file or directory" in err and "Traceback" not in err


def test_readme_exit_code_table_matches_cli() -> None:
    from calcpad import cli

    from .conftest import ROOT

    text = (ROOT / "README.md").read_text(encoding="utf-8")
    table = text[text.index("### Exit codes") :]
    codes = [int(c) for c in re.findall(r"^\| (\d+) \|", table, re.M)]
    assert codes == [cli.EXIT_OK, cli.EXIT_NG, cli.EXIT_BAD, cli.EXIT_WRITE, cli.EXIT_INTERNAL, cli.EXIT_INTERRUPTED]


def test_interrupt_wrapped_by_python_is_still_interrupted(site: Path, monkeypatch: pytest.MonkeyPatch, capsys: pytest.CaptureFixture[str]) -> None:
    """Python wraps an exception raised while a class is created (e.g. Ctrl-C during an import) in RuntimeError."""
    import calcpad.runner.execute as execute

    def wrapped(*args: object, **kwargs: object) -> None:
        try:
            raise KeyboardInterrupt
        except KeyboardInterrupt as exc:
            raise RuntimeError("Error calling __set_name__") from exc

    monkeypatch.setattr(execute, "run_job", wrapped)
    monkeypatch.chdir(site / "proj")
    assert main(["run", "job.toml", "--out", "../out"]) == 130
    assert capsys.readouterr().err == "calcpad: interrupted\n"
