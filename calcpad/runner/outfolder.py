"""Output folders: calcpad writes, replaces and deletes only what it wrote itself.

Layout of an output folder ``OUT``::

    OUT/
      .calcpad-manifest.json   every file calcpad wrote here, with its sha256, per revision
      .calcpad-lock            locked (flock) while a run or `calcpad issue` writes here
      rev-A/                   one folder per job revision ([job] revision in the job file)
        submittal.html
        record.json
        notebooks/*.ipynb      (runs with --notebooks)
        issued.json            (after `calcpad issue`: who issued it and when; folder read-only)
      rev-B/ ...

Manifest ``"calcpad-output/1"``::

    {"format", "latest": "B",
     "revisions": {"A": {"folder": "rev-A", "written": iso time,
                         "files": {"rev-A/record.json": sha256, ...},
                         "issued": null | {"by", "date", "at"}}}}

Rules (each refusal is an :class:`OutputRefusedError`, exit code 2, with what to do):

- ``OUT`` may not be a file, the current folder or one of its parents, or a folder that holds
  the job file or a template of the run; an existing ``OUT`` must be empty or carry a manifest.
- A revision folder is replaced only when every file in it is one calcpad wrote, unchanged
  (same sha256 as in the manifest); a file the user added or edited stops the run.
- An issued revision (``issued.json`` inside, or marked in the manifest) is never replaced.

Writing is atomic per revision: the new revision is filled in ``OUT/.calcpad-tmp-*/new``, the
manifest first records the new digests next to the old ones (``replacing``), the old folder is
moved into ``OUT/.calcpad-old-*/prev``, the new one renamed into place, then the manifest is
finalised. Both scratch folders carry a marker file; the next run (under the lock) deletes
leftover scratch folders and moves a ``prev`` back when a kill left its revision missing, so
a kill at any point leaves either the old or the new revision, complete.
"""

from __future__ import annotations

import contextlib
import datetime as dt
import errno
import fcntl
import hashlib
import json
import os
import re
import shutil
import stat
import tempfile
import time
from collections.abc import Callable, Iterable, Iterator, Mapping
from dataclasses import dataclass
from pathlib import Path
from typing import Any

from calcpad.core.errors import CalcpadError, InputError
from calcpad.runner.execute import CalcOutcome

__all__ = [
    "DEFAULT_REVISION",
    "MANIFEST_NAME",
    "OutputBusyError",
    "OutputRefusedError",
    "OutputTarget",
    "OutputWriteError",
    "check_target",
    "folder_lock",
    "issue_revision",
    "new_file_mode",
    "read_manifest",
    "revision_folder",
    "write_outputs",
]

MANIFEST_FORMAT = "calcpad-output/1"
ISSUED_FORMAT = "calcpad-issued/1"
MANIFEST_NAME = ".calcpad-manifest.json"
LOCK_NAME = ".calcpad-lock"
ISSUED_NAME = "issued.json"
SCRATCH_MARKER = ".calcpad-scratch"
DEFAULT_REVISION = "draft"  # template runs (no job file) have no revision of their own
_SCRATCH = re.compile(r"^\.calcpad-(tmp|old)-[A-Za-z0-9_]+$")
_SCRATCH_FILE = re.compile(r"^\.calcpad-(manifest|issued)-[A-Za-z0-9_]+\.tmp$")
_REVISION = re.compile(r"^[A-Za-z0-9][A-Za-z0-9._-]{0,31}$")


class OutputRefusedError(InputError):
    """The output folder cannot be used as asked (exit code 2); the message says what to do."""

    exit_code = 2


class OutputBusyError(CalcpadError):
    """Another calcpad process holds the folder's lock (exit code 3)."""

    exit_code = 3


class OutputWriteError(CalcpadError):
    """The file system refused a write: read-only, full, permissions (exit code 3)."""

    exit_code = 3


def _cannot_write(exc: OSError, path: Path | str) -> OutputWriteError:
    where = exc.filename or path
    return OutputWriteError(f"cannot write {where}: {exc.strerror or exc}")


def revision_folder(revision: str) -> str:
    """``"rev-A"`` for revision ``"A"``; refuses names that are not safe as one folder name."""
    rev = revision.strip() or DEFAULT_REVISION
    if not _REVISION.match(rev) or ".." in rev:
        raise OutputRefusedError(
            f"job.revision: {revision!r}; expected letters, digits, '.', '_' or '-' (up to 32, no '..'),"
            " because it names the output sub-folder rev-<revision>"
        )
    return f"rev-{rev}"


def _sha256(path: Path) -> str:
    h = hashlib.sha256()
    with open(path, "rb") as fh:
        for block in iter(lambda: fh.read(1 << 16), b""):
            h.update(block)
    return h.hexdigest()


def _now() -> dt.datetime:
    return dt.datetime.now(dt.UTC).replace(microsecond=0)


# ----------------------------------------------------------------------------- manifest


def _new_manifest() -> dict[str, Any]:
    return {"format": MANIFEST_FORMAT, "latest": None, "revisions": {}}


def read_manifest(out: Path) -> dict[str, Any] | None:
    """The folder's manifest, or None when there is none. An unreadable one is refused."""
    path = Path(out) / MANIFEST_NAME
    if not path.exists():
        return None
    try:
        data = json.loads(path.read_text(encoding="utf-8"))
    except (OSError, ValueError) as exc:
        raise OutputRefusedError(f"{path}: not a readable calcpad manifest ({exc}); restore it or choose a new --out folder") from None
    ok = isinstance(data, dict) and data.get("format") == MANIFEST_FORMAT and isinstance(data.get("revisions"), dict)
    if ok:
        ok = all(isinstance(e, dict) and isinstance(e.get("files"), dict) for e in data["revisions"].values())
    if not ok:
        raise OutputRefusedError(f"{path}: not a calcpad manifest ({MANIFEST_FORMAT!r} expected); restore it or choose a new --out folder")
    return data


def _write_manifest(out: Path, manifest: dict[str, Any]) -> None:
    text = json.dumps(manifest, indent=1, ensure_ascii=False, sort_keys=True) + "\n"
    fd, tmp = tempfile.mkstemp(prefix=".calcpad-manifest-", suffix=".tmp", dir=out)
    try:
        with os.fdopen(fd, "w", encoding="utf-8") as fh:
            fh.write(text)
            fh.flush()
            os.fsync(fh.fileno())
        os.chmod(tmp, 0o644 & ~_umask())
        os.replace(tmp, out / MANIFEST_NAME)
    except BaseException:
        with contextlib.suppress(OSError):
            os.unlink(tmp)
        raise


def _umask() -> int:
    mask = os.umask(0)
    os.umask(mask)
    return mask


def new_file_mode() -> int:
    """The mode an ordinary new file gets (0o666 less the umask): ``mkstemp`` makes owner-only
    files, and what calcpad writes for reviewers must be as readable as any other file."""
    return 0o666 & ~_umask()


# ----------------------------------------------------------------------------- scratch folders


def _is_scratch(out: Path, name: str) -> bool:
    """A lock file, a manifest temp file, or a scratch folder carrying calcpad's marker (or empty:
    a kill between creating the folder and writing its marker leaves it so; removing an empty
    folder loses nothing)."""
    if name == LOCK_NAME or _SCRATCH_FILE.match(name):
        return True
    p = out / name
    if not (_SCRATCH.match(name) and p.is_dir() and not p.is_symlink()):
        return False
    return (p / SCRATCH_MARKER).is_file() or not any(p.iterdir())


def _make_scratch(out: Path, kind: str, revision: str) -> Path:
    d = Path(tempfile.mkdtemp(prefix=f".calcpad-{kind}-", dir=out))
    (d / SCRATCH_MARKER).write_text(json.dumps({"kind": kind, "revision": revision}) + "\n", encoding="utf-8")
    return d


def _remove_tree(path: Path) -> None:
    """Delete a scratch tree calcpad made (folder permissions restored first if needed)."""
    for root, dirs, _files in os.walk(path):
        for name in dirs:
            p = Path(root) / name
            if not p.is_symlink():
                os.chmod(p, 0o700)
    shutil.rmtree(path)


def _folder_of(revision: Any, out: Path) -> Path | None:
    """``OUT/rev-<revision>``, or None for a revision text that is not a safe folder name."""
    try:
        return out / revision_folder(revision) if isinstance(revision, str) else None
    except OutputRefusedError:
        return None


def _recover(out: Path, manifest: dict[str, Any]) -> bool:
    """Clean what a killed run left (scratch, manifest temp files); True if the manifest changed."""
    for name in sorted(os.listdir(out)):
        if not _is_scratch(out, name) or name == LOCK_NAME:
            continue
        p = out / name
        if p.is_file():
            p.unlink()
            continue
        try:
            marker = json.loads((p / SCRATCH_MARKER).read_text(encoding="utf-8"))
        except (OSError, ValueError):
            marker = {}
        prev = p / "prev"
        target = _folder_of(marker.get("revision"), out)
        if marker.get("kind") == "old" and target is not None and prev.is_dir() and not os.path.lexists(target):
            os.replace(prev, target)  # a kill between the two renames: put the old one back
        _remove_tree(p)
    changed = False
    for rev, entry in manifest["revisions"].items():
        folder = _folder_of(rev, out)
        if "replacing" in entry and folder is not None:  # a write stopped half-way: keep whichever set is on disk
            on_disk = _digests(out, folder)
            if on_disk != entry["files"] and on_disk == entry["replacing"]:
                entry["files"] = entry["replacing"]
            del entry["replacing"]
            changed = True
    return changed


# ----------------------------------------------------------------------------- checks


def _digests(out: Path, folder: Path) -> dict[str, str | None]:
    """``{path relative to OUT: sha256}`` of every file or link under ``folder`` (None: not a plain file)."""
    found: dict[str, str | None] = {}
    if not folder.exists():
        return found
    for root, dirs, files in os.walk(folder):
        for name in dirs + files:
            p = Path(root) / name
            rel = p.relative_to(out).as_posix()
            if p.is_symlink():
                found[rel] = None
            elif name in files:
                found[rel] = _sha256(p) if stat.S_ISREG(p.lstat().st_mode) else None
    return found


def _issued_info(out: Path, manifest: dict[str, Any], revision: str) -> dict[str, Any] | None:
    entry = manifest["revisions"].get(revision) or {}
    if entry.get("issued"):
        return dict(entry["issued"])
    path = out / revision_folder(revision) / ISSUED_NAME
    if path.exists():
        try:
            data = json.loads(path.read_text(encoding="utf-8"))
        except (OSError, ValueError):
            data = {}
        return data if isinstance(data, dict) else {}
    return None


def _check_revision(out: Path, shown: str, manifest: dict[str, Any], revision: str) -> dict[str, str | None]:
    """Refuse when the revision was issued or its folder holds files calcpad did not write."""
    folder = revision_folder(revision)
    issued = _issued_info(out, manifest, revision)
    if issued is not None:
        when = f" on {issued['date']}" if issued.get("date") else ""
        who = f" by {issued['by']}" if issued.get("by") else ""
        raise OutputRefusedError(f"revision {revision} in {shown} was issued{when}{who} and is sealed; bump the revision in the job file ([job] revision) to run it again")
    rev_dir = out / folder
    if not os.path.lexists(rev_dir):
        return {}
    if rev_dir.is_symlink() or not rev_dir.is_dir():
        raise OutputRefusedError(f"{Path(shown) / folder} is not a folder calcpad wrote; move it away or choose another --out folder")
    entry = manifest["revisions"].get(revision) or {}
    files: dict[str, Any] = entry.get("files", {})
    alt: dict[str, Any] = entry.get("replacing", {})  # a write that stopped half-way
    on_disk = _digests(out, rev_dir)
    foreign = []
    for rel, digest in on_disk.items():
        if digest is None or digest not in (files.get(rel), alt.get(rel)):
            state = "was changed since calcpad wrote it" if rel in files or rel in alt else "was not written by calcpad"
            foreign.append(f"{Path(shown) / rel} {state}")
    if foreign:
        more = f" (and {len(foreign) - 5} more)" if len(foreign) > 5 else ""
        raise OutputRefusedError(
            "only files calcpad wrote itself are replaced, and here " + "; ".join(foreign[:5]) + more
            + f". Move your files out of {Path(shown) / folder} (or bump the revision in the job file) and run again"
        )
    return {k: v for k, v in on_disk.items() if v is not None}


@dataclass
class OutputTarget:
    """An output folder checked for a run (nothing written yet); :meth:`write` writes it."""

    path: Path  # as given
    real: Path  # resolved
    revision: str

    @property
    def folder(self) -> Path:
        """Where this revision's files go (as given, for messages)."""
        return self.path / revision_folder(self.revision)

    def write(self, fill: Callable[[Path], None], wait: float = 30.0) -> Path:
        """Let ``fill`` write the revision's files into an empty folder, then put it in place.

        Takes the folder's lock (waits up to ``wait`` seconds, then :class:`OutputBusyError`), checks
        the rules again, cleans leftovers of killed runs and swaps the revision in atomically.
        File-system errors become :class:`OutputWriteError`. Returns the revision folder.
        """
        try:
            self.real.mkdir(parents=True, exist_ok=True)
            with folder_lock(self.real, wait, str(self.path)):
                self._write_locked(fill)
        except OSError as exc:
            raise _cannot_write(exc, self.path) from None
        return self.folder

    def _write_locked(self, fill: Callable[[Path], None]) -> None:
        out, rev, shown = self.real, self.revision, str(self.path)
        manifest = read_manifest(out)
        if manifest is None:
            _refuse_foreign_entries(out, shown)
            manifest = _new_manifest()
            _write_manifest(out, manifest)  # claim the folder before anything else goes in
        if _recover(out, manifest):
            _write_manifest(out, manifest)
        replacing = _check_revision(out, shown, manifest, rev)
        folder = revision_folder(rev)
        before = json.loads(json.dumps(manifest))
        tmp = _make_scratch(out, "tmp", rev)
        old: Path | None = None
        swapped = False
        try:
            new = tmp / "new"
            new.mkdir()
            fill(new)
            files = {f"{folder}/{k.split('/', 1)[1]}": v for k, v in _digests(tmp, new).items() if v is not None}
            entry: dict[str, Any] = {"folder": folder, "written": _now().isoformat(), "files": files, "issued": None}
            if replacing:
                entry["replacing"] = replacing
            manifest["revisions"][rev] = entry
            _write_manifest(out, manifest)
            if os.path.lexists(out / folder):
                old = _make_scratch(out, "old", rev)
                os.replace(out / folder, old / "prev")
            os.replace(new, out / folder)
            swapped = True
            entry.pop("replacing", None)
            manifest["latest"] = rev
            _write_manifest(out, manifest)
        except BaseException:
            # an interrupt between the rename and `swapped = True` leaves the new revision in place
            # (no `new` left): that is the swapped state, not one to roll back
            if not swapped and os.path.lexists(tmp / "new"):
                if old is not None and (old / "prev").exists() and not os.path.lexists(out / folder):
                    os.replace(old / "prev", out / folder)
                with contextlib.suppress(OSError):
                    _write_manifest(out, before)
            raise
        finally:
            for scratch in (tmp, old):
                if scratch is not None:
                    with contextlib.suppress(OSError):
                        _remove_tree(scratch)


def _refuse_foreign_entries(out: Path, shown: str) -> None:
    others = sorted(n for n in os.listdir(out) if not _is_scratch(out, n))
    if others:
        listed = ", ".join(others[:3]) + (", ..." if len(others) > 3 else "")
        raise OutputRefusedError(
            f"--out {shown}: the folder is not empty ({listed}) and has no {MANIFEST_NAME}, so calcpad did not write it;"
            " choose a new folder (e.g. --out build/JOBNAME) or move your files out of it"
        )


def check_target(out_dir: str | Path, revision: str, protect: Iterable[str | Path] = ()) -> OutputTarget:
    """Check that a run may write revision ``revision`` into ``out_dir`` (writes nothing).

    ``protect``: files the folder must not contain (the job file, the templates run).
    Raises :class:`OutputRefusedError` with what to do instead.
    """
    path = Path(out_dir)
    shown = str(out_dir)
    revision_folder(revision)
    if os.path.lexists(path) and not path.exists():
        raise OutputRefusedError(f"--out {shown}: a link to nothing; give a folder name")
    if path.exists() and not path.is_dir():
        raise OutputRefusedError(f"--out {shown}: this is a file, not a folder; calcpad writes a folder: give a new folder name (e.g. --out build/JOBNAME)")
    real = path.resolve()
    here = Path.cwd().resolve()
    if real == here or here.is_relative_to(real):
        what = "the current folder" if real == here else "a parent of the current folder"
        raise OutputRefusedError(f"--out {shown}: this is {what}; give a new sub-folder for the output (e.g. --out build/JOBNAME)")
    for p in protect:
        if Path(p).resolve().is_relative_to(real):
            raise OutputRefusedError(f"--out {shown}: the folder holds {p}, an input of this run; give a separate output folder (e.g. --out build/JOBNAME)")
    if real.is_dir():
        manifest = read_manifest(real)
        if manifest is None:
            _refuse_foreign_entries(real, shown)
        else:
            _check_revision(real, shown, manifest, revision.strip() or DEFAULT_REVISION)
    return OutputTarget(path, real, revision.strip() or DEFAULT_REVISION)


# ----------------------------------------------------------------------------- lock


@contextlib.contextmanager
def folder_lock(out: Path, wait: float = 30.0, shown: str | None = None) -> Iterator[None]:
    """Hold the folder's lock (``flock`` on ``OUT/.calcpad-lock``; released if the process dies).

    Waits up to ``wait`` seconds for another holder, then raises :class:`OutputBusyError`.
    """
    path = Path(out) / LOCK_NAME
    try:
        fd = os.open(path, os.O_RDWR | os.O_CREAT | os.O_NOFOLLOW, 0o644)
    except OSError as exc:
        if exc.errno != errno.ELOOP:
            raise
        raise OutputRefusedError(f"{path}: a link, not calcpad's lock file; remove it and run again") from None
    try:
        deadline = time.monotonic() + max(wait, 0.0)
        while True:
            try:
                fcntl.flock(fd, fcntl.LOCK_EX | fcntl.LOCK_NB)
                break
            except OSError as exc:
                if exc.errno not in (errno.EAGAIN, errno.EACCES):
                    raise
                if time.monotonic() >= deadline:
                    holder = os.pread(fd, 64, 0).decode(errors="replace").strip()
                    who = f" (process {holder})" if holder.isdigit() else ""
                    raise OutputBusyError(f"{shown or out} is being written by another calcpad run{who}; waited {wait:g} s. Run again when it has finished") from None
                time.sleep(0.05)
        os.ftruncate(fd, 0)
        os.pwrite(fd, str(os.getpid()).encode(), 0)
        try:
            yield
        finally:
            with contextlib.suppress(OSError):
                os.ftruncate(fd, 0)
            fcntl.flock(fd, fcntl.LOCK_UN)
    finally:
        os.close(fd)


# ----------------------------------------------------------------------------- issue


def _seal(folder: Path) -> None:
    """Make a revision folder read-only (files 0444, folders 0555)."""
    for root, dirs, files in os.walk(folder, topdown=False):
        for name in files:
            os.chmod(Path(root) / name, 0o444)
        for name in dirs:
            os.chmod(Path(root) / name, 0o555)
    os.chmod(folder, 0o555)


def issue_revision(out_dir: str | Path, by: str, revision: str | None = None, wait: float = 30.0) -> dict[str, Any]:
    """Mark a revision issued: ``issued.json`` in it, the manifest updated, the folder read-only.

    ``revision`` defaults to the latest one written. Refuses (exit 2) a folder without a
    manifest, an unknown or already issued revision, or one whose files were changed.
    Returns the ``issued.json`` content.
    """
    path = Path(out_dir)
    shown = str(out_dir)
    by = by.strip()
    if not by or "\n" in by or len(by) > 120:
        raise OutputRefusedError(f"--by {by!r}; expected the issuer's name on one line, e.g. --by \"J. Smith, P.E.\"")
    real = path.resolve()
    if not real.is_dir() or read_manifest(real) is None:
        raise OutputRefusedError(f"{shown}: not a calcpad output folder (no {MANIFEST_NAME}); give the --out folder of a run")
    try:
        with folder_lock(real, wait, shown):
            return _issue_locked(real, shown, by, revision)
    except OSError as exc:
        raise _cannot_write(exc, path) from None


def _issue_locked(out: Path, shown: str, by: str, revision: str | None) -> dict[str, Any]:
    manifest = read_manifest(out)
    assert manifest is not None
    if _recover(out, manifest):
        _write_manifest(out, manifest)
    rev = revision or manifest.get("latest")
    known = ", ".join(sorted(manifest["revisions"])) or "none"
    if not rev or rev not in manifest["revisions"]:
        raise OutputRefusedError(f"{shown}: no revision {rev!r} written here (revisions: {known}); run the job first")
    entry = manifest["revisions"][rev]
    folder = out / revision_folder(rev)
    issued_path = folder / ISSUED_NAME
    if entry.get("issued"):
        i = entry["issued"]
        if folder.is_dir():
            _seal(folder)  # an earlier `issue` may have stopped before sealing every file
        raise OutputRefusedError(f"revision {rev} in {shown} was already issued on {i.get('date')} by {i.get('by')}")
    if not folder.is_dir():
        raise OutputRefusedError(f"{Path(shown) / folder.name}: missing; run the job again before issuing revision {rev}")
    on_disk = _digests(out, folder)
    half_issued = issued_path.is_file() and not issued_path.is_symlink()
    if half_issued:  # an earlier `issue` stopped before the manifest was updated: finish it
        on_disk.pop(f"{folder.name}/{ISSUED_NAME}", None)
    if on_disk != entry["files"]:
        bad = sorted(k for k in set(on_disk) | set(entry["files"]) if on_disk.get(k) != entry["files"].get(k))
        raise OutputRefusedError(
            f"{shown}: revision {rev} differs from what calcpad wrote ({', '.join(bad[:5])}); run the job again, then issue"
        )
    if half_issued:
        info = json.loads(issued_path.read_text(encoding="utf-8"))
    else:
        now = _now()
        info = {"format": ISSUED_FORMAT, "revision": rev, "by": by, "date": now.date().isoformat(), "at": now.isoformat(), "files": dict(entry["files"])}
        fd, tmp = tempfile.mkstemp(prefix=".calcpad-issued-", suffix=".tmp", dir=out)
        try:
            with os.fdopen(fd, "w", encoding="utf-8") as fh:
                fh.write(json.dumps(info, indent=1, ensure_ascii=False) + "\n")
            os.chmod(tmp, new_file_mode())
            os.replace(tmp, issued_path)
        except BaseException:
            with contextlib.suppress(OSError):
                os.unlink(tmp)
            raise
    entry["files"][f"{folder.name}/{ISSUED_NAME}"] = _sha256(issued_path)
    entry["issued"] = {"by": info["by"], "date": info["date"], "at": info["at"]}
    _write_manifest(out, manifest)
    _seal(folder)
    return info


# ----------------------------------------------------------------------------- reading back


# ----------------------------------------------------------------------------- a run's files


def _notebook_name(o: CalcOutcome) -> str:
    mark = "".join(ch if ch.isalnum() or ch in "-_" else "_" for ch in o.calc.member)
    return f"{o.calc.number:02d}_{o.calc.template.name}_{mark}.ipynb"


def write_outputs(
    target: OutputTarget,
    record: dict[str, Any],
    submittal: Callable[[Path], Any],
    outcomes: Iterable[CalcOutcome] = (),
    wait: float = 30.0,
    files: Mapping[str, bytes] | None = None,
) -> Path:
    """Write one revision: ``record.json``, what ``submittal(folder)`` writes (the submittal's
    HTML and PDF, from the report face), the executed notebooks of ``outcomes`` (kernel runs)
    and ``files`` (plain names → bytes, e.g. member-table results as CSV and Excel).

    The record is streamed into the file (:func:`~calcpad.runner.record.record_chunks`: a run
    that kept its calcs in a spool never holds them all). Returns the revision folder
    (``OUT/rev-<revision>``).
    """
    from calcpad.runner.record import record_chunks

    def fill(folder: Path) -> None:
        with (folder / "record.json").open("w", encoding="utf-8") as fh:
            for chunk in record_chunks(record):
                fh.write(chunk)
        for name, data in (files or {}).items():
            if Path(name).name != name or name.startswith(".") or name in ("record.json", "submittal.html", "submittal.pdf"):
                raise ValueError(f"output file name {name!r} is not a plain name of its own")
            (folder / name).write_bytes(data)
        submittal(folder)
        notebooks = [o for o in outcomes if o.notebook is not None]
        if notebooks:
            import nbformat  # lazy: kernel path only

            nb_dir = folder / "notebooks"
            nb_dir.mkdir()
            for o in notebooks:
                if hasattr(o.notebook, "text"):  # spooled (runner.spool): the file's text as nbformat writes it
                    (nb_dir / _notebook_name(o)).write_bytes(o.notebook.text().encode("utf-8"))
                else:
                    nbformat.write(o.notebook, str(nb_dir / _notebook_name(o)))

    return target.write(fill, wait=wait)
