"""Output folders: refusals, revisions side by side, atomic replacement, leftovers, lock, issue."""

from __future__ import annotations

import hashlib
import json
import os
import stat
from pathlib import Path

import pytest

from calcpad.runner.outfolder import (
    MANIFEST_NAME,
    OutputBusyError,
    OutputRefusedError,
    check_target,
    folder_lock,
    issue_revision,
    read_manifest,
    revision_folder,
)
from calcpad.runner.recordfile import find_record


def _fill(text: str):
    def fill(d: Path) -> None:
        (d / "record.json").write_text(json.dumps({"text": text}))
        (d / "submittal.html").write_text(f"<p>{text}</p>")

    return fill


def _snapshot(folder: Path) -> dict[str, bytes]:
    return {p.relative_to(folder).as_posix(): p.read_bytes() for p in sorted(folder.rglob("*")) if p.is_file()}


def _write(out: Path, revision: str, text: str) -> Path:
    return check_target(out, revision).write(_fill(text))


@pytest.fixture(autouse=True)
def _elsewhere(tmp_path: Path, monkeypatch: pytest.MonkeyPatch) -> None:
    work = tmp_path / "cwd"
    work.mkdir()
    monkeypatch.chdir(work)


def test_revisions_side_by_side_with_manifest_digests(tmp_path: Path) -> None:
    out = tmp_path / "out"
    assert _write(out, "A", "first") == out / "rev-A"
    _write(out, "B", "second")
    assert (out / "rev-A" / "submittal.html").read_text() == "<p>first</p>"
    assert (out / "rev-B" / "submittal.html").read_text() == "<p>second</p>"
    m = read_manifest(out)
    assert m is not None and m["latest"] == "B" and sorted(m["revisions"]) == ["A", "B"]
    for rev in ("A", "B"):
        for rel, digest in m["revisions"][rev]["files"].items():
            assert hashlib.sha256((out / rel).read_bytes()).hexdigest() == digest
    assert sorted(p.name for p in out.iterdir()) == sorted([".calcpad-lock", MANIFEST_NAME, "rev-A", "rev-B"])


def test_rerun_replaces_untouched_revision(tmp_path: Path) -> None:
    out = tmp_path / "out"
    _write(out, "A", "first")
    _write(out, "A", "again")
    assert (out / "rev-A" / "record.json").read_text() == json.dumps({"text": "again"})


def test_failed_fill_leaves_previous_revision_and_no_scratch(tmp_path: Path) -> None:
    out = tmp_path / "out"
    _write(out, "A", "first")
    before = _snapshot(out)

    def broken(d: Path) -> None:
        (d / "record.json").write_text("half")
        raise KeyboardInterrupt

    with pytest.raises(KeyboardInterrupt):
        check_target(out, "A").write(broken)
    assert _snapshot(out) == before
    assert not [p for p in out.iterdir() if p.name.startswith(".calcpad-tmp") or p.name.startswith(".calcpad-old")]


@pytest.mark.parametrize(
    ("setup", "expected"),
    [
        ("file", "this is a file"),
        ("cwd", "the current folder"),
        ("parent", "a parent of the current folder"),
        ("holds_job", "holds"),
        ("foreign", "has no .calcpad-manifest.json"),
        ("bad_manifest", "not a readable calcpad manifest"),
    ],
)
def test_refusals_write_nothing(tmp_path: Path, setup: str, expected: str) -> None:
    out = tmp_path / "target"
    protect: list[Path] = []
    if setup == "file":
        out.write_text("user data")
    elif setup == "cwd":
        out = Path.cwd()
    elif setup == "parent":
        out = Path.cwd().parent
    elif setup == "holds_job":
        out.mkdir()
        (out / "job.toml").write_text("[job]")
        protect = [out / "job.toml"]
    elif setup == "foreign":
        out.mkdir()
        (out / "notes.txt").write_text("mine")
    elif setup == "bad_manifest":
        out.mkdir()
        (out / MANIFEST_NAME).write_text("{not json")
    before = _snapshot(tmp_path)
    with pytest.raises(OutputRefusedError, match=expected):
        check_target(out, "A", protect)
    assert _snapshot(tmp_path) == before


def test_user_edit_or_addition_in_revision_is_refused(tmp_path: Path) -> None:
    out = tmp_path / "out"
    _write(out, "A", "first")
    target = check_target(out, "A")  # checked before the user's edit ...
    (out / "rev-A" / "submittal.html").write_text("<p>my markup</p>")
    with pytest.raises(OutputRefusedError, match="changed since calcpad wrote it"):
        target.write(_fill("second"))  # ... and checked again under the lock
    assert (out / "rev-A" / "submittal.html").read_text() == "<p>my markup</p>"
    (out / "rev-A" / "submittal.html").write_text("<p>first</p>")  # user restores it
    (out / "rev-A" / "answers.txt").write_text("reviewer notes")
    with pytest.raises(OutputRefusedError, match=r"answers\.txt was not written by calcpad"):
        check_target(out, "A")
    os.symlink(tmp_path, out / "rev-B")
    with pytest.raises(OutputRefusedError, match="not a folder calcpad wrote"):
        check_target(out, "B")


def test_user_files_beside_revisions_are_kept(tmp_path: Path) -> None:
    out = tmp_path / "out"
    _write(out, "A", "first")
    (out / "README-client.txt").write_text("kept")
    _write(out, "A", "second")
    _write(out, "B", "third")
    assert (out / "README-client.txt").read_text() == "kept"


def test_revision_names_are_folder_safe() -> None:
    assert revision_folder("A") == "rev-A" and revision_folder("2.1") == "rev-2.1" and revision_folder("") == "rev-draft"
    for bad in ("../x", "a/b", "..", ".hidden", "A B", "x" * 40, "a\\b"):
        with pytest.raises(OutputRefusedError, match=r"job\.revision"):
            revision_folder(bad)


def test_leftovers_of_a_killed_run_are_cleaned_only_if_marked(tmp_path: Path) -> None:
    out = tmp_path / "out"
    _write(out, "A", "first")
    marked = out / ".calcpad-tmp-abc123"
    marked.mkdir()
    (marked / ".calcpad-scratch").write_text('{"kind": "tmp", "revision": "A"}')
    (marked / "new").mkdir()
    (marked / "new" / "record.json").write_text("half")
    unmarked = out / ".calcpad-tmp-userdir"
    unmarked.mkdir()
    (unmarked / "keep.txt").write_text("not calcpad's")
    (out / ".calcpad-manifest-zz9.tmp").write_text("{")
    # a kill right after the scratch folder was made, before its marker was written (seen once in CI)
    bare = out / ".calcpad-old-jva86_ix"
    bare.mkdir()
    _write(out, "B", "second")
    assert not marked.exists() and not (out / ".calcpad-manifest-zz9.tmp").exists() and not bare.exists()
    assert (unmarked / "keep.txt").read_text() == "not calcpad's"


def test_kill_between_the_two_renames_is_undone(tmp_path: Path) -> None:
    """The state a kill leaves after the old revision was moved aside: it is moved back."""
    out = tmp_path / "out"
    _write(out, "A", "first")
    old = out / ".calcpad-old-k1ll3d"
    old.mkdir()
    (old / ".calcpad-scratch").write_text('{"kind": "old", "revision": "A"}')
    os.replace(out / "rev-A", old / "prev")
    _write(out, "B", "second")  # any run into the folder recovers it
    assert (out / "rev-A" / "submittal.html").read_text() == "<p>first</p>" and not old.exists()


def test_lock_refuses_a_second_writer(tmp_path: Path) -> None:
    out = tmp_path / "out"
    _write(out, "A", "first")
    with folder_lock(out), pytest.raises(OutputBusyError, match="being written by another calcpad run") as info:
        check_target(out, "A").write(_fill("second"), wait=0.2)
    assert info.value.exit_code == 3
    assert (out / "rev-A" / "record.json").read_text() == json.dumps({"text": "first"})


def test_issue_seals_and_blocks_rerun(tmp_path: Path) -> None:
    out = tmp_path / "out"
    _write(out, "A", "first")
    _write(out, "B", "second")
    info = issue_revision(out, "J. Smith, P.E.", "A")
    folder = out / "rev-A"
    issued = json.loads((folder / "issued.json").read_text())
    assert issued["by"] == "J. Smith, P.E." and issued["revision"] == "A" and issued == info
    assert issued["files"]["rev-A/record.json"] == hashlib.sha256((folder / "record.json").read_bytes()).hexdigest()
    m = read_manifest(out)
    assert m is not None and m["revisions"]["A"]["issued"]["by"] == "J. Smith, P.E." and m["revisions"]["B"]["issued"] is None
    assert stat.S_IMODE(folder.stat().st_mode) == 0o555
    assert all(stat.S_IMODE(p.stat().st_mode) == 0o444 for p in folder.iterdir())
    with pytest.raises(OutputRefusedError, match="bump the revision in the job file"):
        check_target(out, "A")
    with pytest.raises(OutputRefusedError, match="already issued"):
        issue_revision(out, "Someone Else", "A")
    _write(out, "B", "third")  # other revisions still run
    assert (folder / "record.json").read_text() == json.dumps({"text": "first"})


def test_issue_refuses_changed_or_unknown_revision(tmp_path: Path) -> None:
    out = tmp_path / "out"
    with pytest.raises(OutputRefusedError, match="not a calcpad output folder"):
        issue_revision(tmp_path, "J. Smith")
    _write(out, "A", "first")
    with pytest.raises(OutputRefusedError, match="no revision 'C'"):
        issue_revision(out, "J. Smith", "C")
    with pytest.raises(OutputRefusedError, match="--by"):
        issue_revision(out, "  ", "A")
    (out / "rev-A" / "record.json").write_text("edited")
    with pytest.raises(OutputRefusedError, match="differs from what calcpad wrote"):
        issue_revision(out, "J. Smith", "A")
    assert not (out / "rev-A" / "issued.json").exists()


def test_issue_half_done_is_finished_and_counts_as_issued(tmp_path: Path) -> None:
    """A kill after issued.json was written but before the manifest: still sealed for runs."""
    out = tmp_path / "out"
    _write(out, "A", "first")
    (out / "rev-A" / "issued.json").write_text(json.dumps({"format": "calcpad-issued/1", "revision": "A", "by": "K. Lee", "date": "2025-04-01", "at": "2025-04-01T10:00:00+00:00"}))
    with pytest.raises(OutputRefusedError, match=r"issued on 2025-04-01 by K\. Lee"):
        check_target(out, "A")
    info = issue_revision(out, "K. Lee", "A")
    assert info["date"] == "2025-04-01"
    m = read_manifest(out)
    assert m is not None and m["revisions"]["A"]["issued"]["by"] == "K. Lee"


def test_find_record(tmp_path: Path) -> None:
    out = tmp_path / "out"
    _write(out, "A", "first")
    _write(out, "B", "second")
    assert find_record(out) == out / "rev-B" / "record.json"
    assert find_record(out, "A") == out / "rev-A" / "record.json"
    assert find_record(out / "rev-A") == out / "rev-A" / "record.json"
    assert find_record(out / "rev-A" / "record.json") == out / "rev-A" / "record.json"
