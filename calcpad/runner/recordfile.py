"""Find and read a job record (``record.json``) back from an output folder.

``OUT`` may be the record file itself, a folder holding ``record.json``, or a folder whose
revision sub-folders hold one (``OUT/rev-A/record.json``, or one level deeper): then the
revision the folder's manifest names as latest, else the newest record (by file time), or the one a ``revision`` names (the sub-folder's name, with or
without a ``rev-`` prefix, or the record's ``job.revision``). Problems raise
:class:`RecordError` with the path and what was expected; nothing here writes.

A record laid out as ``calcpad run`` writes it (:func:`calcpad.runner.record.record_chunks`) is
read with its ``calcs`` left in the file (:class:`~calcpad.runner.record.SpooledCalcs` over each
entry's place; each entry is parsed once here to check it, then again when it is read), so
verifying a large job does not hold every calc; any other JSON is read whole.
"""

from __future__ import annotations

import json
from pathlib import Path
from typing import Any

from calcpad.core.errors import InputError
from calcpad.runner.outfolder import read_manifest, revision_folder
from calcpad.runner.record import JOB_RECORD_FORMAT, SpooledCalcs

__all__ = ["RECORD_NAME", "RecordError", "find_record", "load_record", "read_record"]

RECORD_NAME = "record.json"
_MAX_BYTES = 200 * 1024 * 1024  # a record is a few MB at most; refuse anything absurd before reading it


class RecordError(InputError):
    """A record that cannot be found, read or understood."""


def _revision_of(path: Path) -> str | None:
    try:
        rec = json.loads(path.read_text(encoding="utf-8"))
    except (OSError, ValueError):
        return None
    job = rec.get("job") if isinstance(rec, dict) else None
    rev = job.get("revision") if isinstance(job, dict) else None
    return str(rev) if rev is not None else None


def _matches(path: Path, revision: str) -> bool:
    folder = path.parent.name
    return folder in (revision, f"rev-{revision}", f"rev{revision}", f"revision-{revision}") or _revision_of(path) == revision


def find_record(target: str | Path, revision: str | None = None) -> Path:
    """The ``record.json`` that ``target`` (a file or an output folder) designates."""
    p = Path(target)
    if p.is_file():
        return p
    if not p.exists():
        raise RecordError(f"{str(target)!r}: no such file or folder; expected an output folder holding {RECORD_NAME} or the record file itself")
    if not p.is_dir():
        raise RecordError(f"{str(target)!r}: not a file or folder")
    direct = p / RECORD_NAME
    if direct.is_file() and (revision is None or _matches(direct, revision)):
        return direct
    manifest = read_manifest(p)
    if manifest is not None:  # a calcpad output folder: its manifest names the latest revision
        rev = revision or manifest.get("latest")
        if rev in manifest.get("revisions", {}) and (p / revision_folder(rev) / RECORD_NAME).is_file():
            return p / revision_folder(rev) / RECORD_NAME
    found = sorted({*p.glob(f"*/{RECORD_NAME}"), *p.glob(f"*/*/{RECORD_NAME}")})
    found = [f for f in found if f.is_file() and not f.parent.name.startswith(".")]
    if revision is not None:
        found = [f for f in found if _matches(f, revision)]
        if not found:
            raise RecordError(f"{str(target)!r}: no record of revision {revision!r} found (looked for {RECORD_NAME} in the folder and its sub-folders)")
    if not found:
        raise RecordError(f"{str(target)!r}: no {RECORD_NAME} in this folder or its revision sub-folders; give the output folder of a calcpad run")
    return max(found, key=lambda f: (f.stat().st_mtime_ns, str(f)))


class _FileEntry:
    """One calc entry of a record file, read from its place on each use."""

    __slots__ = ("length", "offset", "path")

    def __init__(self, path: Path, offset: int, length: int) -> None:
        self.path, self.offset, self.length = path, offset, length

    def pretty(self) -> str:
        """The entry as the file holds it (two levels deep, first line's indent left out)."""
        with open(self.path, "rb") as fh:
            fh.seek(self.offset)
            return fh.read(self.length).decode("utf-8")[2:]

    def canonical(self) -> str:
        """The entry as the record digest reads it (sorted keys, no spaces)."""
        return json.dumps(json.loads(self.pretty()), sort_keys=True, separators=(",", ":"), ensure_ascii=False, allow_nan=False)


_CALCS_OPEN, _ENTRY_OPEN, _ENTRY_NEXT, _ENTRY_LAST = b' "calcs": [\n', b"  {\n", b"  },\n", b"  }\n"


def _read_lazily(path: Path) -> dict[str, Any] | None:
    """The record with its calcs left in the file (see the module docstring), or None when the
    file is not laid out as calcpad writes it. Raises ValueError/UnicodeDecodeError as json would."""
    head: list[bytes] = []
    places: list[tuple[int, int]] = []
    offset, start, inside, after_last = 0, -1, False, False
    with open(path, "rb") as fh:
        for line in fh:
            if not inside:
                head.append(line)
                inside = line == _CALCS_OPEN
            elif start < 0:
                if line == _ENTRY_OPEN and not after_last:
                    start = offset
                elif line in (b" ],\n", b" ]\n") and after_last:
                    head.append(line)
                    inside = False
                else:
                    return None
            elif line in (_ENTRY_NEXT, _ENTRY_LAST):
                places.append((start, offset + 3 - start))
                start, after_last = -1, line == _ENTRY_LAST
            elif not line.startswith(b"   "):
                return None
            offset += len(line)
    if inside or not places:
        return None
    rec = json.loads(b"".join(head).decode("utf-8"))
    if not isinstance(rec, dict) or rec.get("calcs") != []:
        return None
    entries = [_FileEntry(path, o, n) for o, n in places]
    for e in entries:  # each entry must be JSON on its own (parsed once, not kept)
        json.loads(e.pretty())
    rec["calcs"] = SpooledCalcs(entries)
    return rec


def read_record(path: str | Path) -> dict[str, Any]:
    """Read and sanity-check one record file (format, calcs, digest present)."""
    path = Path(path)
    try:
        if path.stat().st_size > _MAX_BYTES:
            raise RecordError(f"{str(path)!r}: {path.stat().st_size} bytes; too large to be a calcpad record")
        rec = _read_lazily(path)
        text = path.read_text(encoding="utf-8") if rec is None else ""
    except (OSError, UnicodeDecodeError) as exc:
        raise RecordError(f"{str(path)!r}: cannot read the record ({exc.__class__.__name__}: {exc})") from None
    except ValueError as exc:
        raise RecordError(f"{str(path)!r}: not valid JSON ({exc}); the record is damaged — re-run the job") from None
    try:
        rec = json.loads(text) if rec is None else rec
    except ValueError as exc:
        raise RecordError(f"{str(path)!r}: not valid JSON ({exc}); the record is damaged — re-run the job") from None
    if not isinstance(rec, dict):
        raise RecordError(f"{str(path)!r}: expected a JSON object (a calcpad job record)")
    fmt = rec.get("format")
    if fmt == "calcpad-job-record/1":
        raise RecordError(f"{str(path)!r}: written by an older calcpad (format {fmt!r}) without template and data digests; re-run the job to get a verifiable record")
    if fmt != JOB_RECORD_FORMAT:
        raise RecordError(f"{str(path)!r}: format {fmt!r}; expected {JOB_RECORD_FORMAT!r} (a record written by calcpad run)")
    problems = []
    calcs = rec.get("calcs")  # read lazily: each entry was parsed as an object already
    if not isinstance(calcs, SpooledCalcs) and (not isinstance(calcs, list) or not all(isinstance(c, dict) for c in calcs)):
        problems.append("'calcs' (a list of calc records)")
    if not isinstance(rec.get("record_digest"), str):
        problems.append("'record_digest' (text)")
    for key in ("job", "job_file", "data"):
        if not isinstance(rec.get(key), dict):
            problems.append(f"{key!r} (an object)")
    if not isinstance(rec.get("templates"), list):
        problems.append("'templates' (a list)")
    if problems:
        raise RecordError(f"{str(path)!r}: damaged record, missing or malformed: {', '.join(problems)}")
    return rec


def load_record(target: str | Path, revision: str | None = None) -> tuple[Path, dict[str, Any]]:
    """:func:`find_record` then :func:`read_record`."""
    path = find_record(target, revision)
    return path, read_record(path)
