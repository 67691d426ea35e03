"""Keep a run's finished calcs out of memory: record entries and sheet HTML in one spool file.

A run that writes an output folder hands each outcome to :meth:`RunSpool.keep` as it finishes.
The calc's record entry (as the record file prints it, and in the canonical form the record
digest is taken over) and each sheet's HTML go, zlib-compressed, to an anonymous temporary file
(``tempfile.TemporaryFile``: it has no name, so nothing is left on disk when the run ends or is
killed) — the HTML only of sheets a submittal can print (:mod:`calcpad.runner.cases`: each member
of a small member table, the member governing its case so far in a large one; the others' HTML is
never made, see :func:`calcpad.runner.execute.run_job`) and a kernel run's executed notebook; the
outcome keeps only what the summaries read — per sheet its title, method,
assumptions, a digest of its numbers and each check's title, ratio, status and reference. The
record (:func:`calcpad.runner.record.job_record`), the submittal and the results table then read
the spool back one calc at a time, so memory stays flat in the number of calcs.
"""

from __future__ import annotations

import json
import tempfile
import threading
import weakref
import zlib
from pathlib import Path
from typing import IO, Any

from calcpad.runner.cases import CaseTracker
from calcpad.runner.execute import CalcOutcome, SheetItem
from calcpad.runner.record import calc_record, template_digest
from calcpad.runner.recordtext import record_layout

__all__ = ["RunSpool"]

_SLIM_CHECK = ("title", "ratio", "status", "ref")
_MAX_TEXTS = 10_000


class _Ref:
    """Where one compressed blob lies in the spool file."""

    __slots__ = ("length", "offset", "spool")

    def __init__(self, spool: RunSpool, offset: int, length: int) -> None:
        self.spool, self.offset, self.length = spool, offset, length

    def text(self) -> str:
        return zlib.decompress(self.spool._read(self.offset, self.length)).decode("utf-8")


class SpooledEntry:
    """One calc's record entry in the spool (see :class:`calcpad.runner.record.SpooledCalcs`)."""

    __slots__ = ("_canonical", "_pretty", "template_sha256")

    def __init__(self, pretty: _Ref, canonical: _Ref, template_sha256: str) -> None:
        self._pretty, self._canonical, self.template_sha256 = pretty, canonical, template_sha256

    def pretty(self) -> str:
        """The entry as the record file prints it (``record_layout(entry, 2)``, two levels deep)."""
        return self._pretty.text()

    def canonical(self) -> str:
        """The entry as the record digest reads it (sorted keys, no spaces)."""
        return self._canonical.text()


class SpooledNotebook:
    """A kernel run's executed notebook in the spool, as the notebook file's text (``nbformat.writes``)."""

    __slots__ = ("_ref",)

    def __init__(self, ref: _Ref) -> None:
        self._ref = ref

    def text(self) -> str:
        """The ``.ipynb`` file's text, as ``nbformat.write`` writes it."""
        return self._ref.text()


class SpooledSheet(SheetItem):
    """A sheet whose record and HTML live in the spool: ``item["record"]`` and ``item["html"]``
    read them back (each time; nothing is cached), the summary fields are held."""

    def __missing__(self, key: str) -> Any:
        if key == "html" and "_html" in self:
            return self["_html"].text()
        if key == "record":  # the calc's record entry holds its sheets' records
            return json.loads(self["_entry"].pretty())["sheets"][self["_index"]]
        raise KeyError(key)


class RunSpool:
    """One spool per run (see the module docstring); :meth:`keep` each outcome as it finishes."""

    def __init__(self, folder: str | Path | None = None, html: bool = True) -> None:
        """``html=False``: no sheet HTML is kept (a re-run that only compares records)."""
        self._html = html
        self._file: IO[bytes] = tempfile.TemporaryFile(prefix="calcpad-spool-", dir=folder)
        # a spool nobody closes (verify's: it lives as long as the record it fed) closes its file
        # when it is collected, as a close() would, rather than leaving that to the file's finalizer
        weakref.finalize(self, self._file.close)
        self._end = 0
        self._lock = threading.Lock()
        self._shas: dict[Path, str] = {}
        self._texts: dict[str, str] = {}  # one copy of each repeated text (titles, references)
        self._cases = CaseTracker()  # whose sheets can be printed (the HTML of the others is never made)

    def close(self) -> None:
        """Drop the spool file (outcomes kept in it can no longer be read)."""
        self._file.close()

    def __enter__(self) -> RunSpool:
        return self

    def __exit__(self, *exc: object) -> None:
        self.close()

    def _put(self, text: str) -> _Ref:
        return self._put_compressed(zlib.compress(text.encode("utf-8"), 1))

    def _put_compressed(self, data: bytes) -> _Ref:
        with self._lock:
            self._file.seek(self._end)
            self._file.write(data)
            ref = _Ref(self, self._end, len(data))
            self._end += len(data)
        return ref

    def _read(self, offset: int, length: int) -> bytes:
        with self._lock:
            self._file.seek(offset)
            return self._file.read(length)

    def _text(self, value: Any) -> Any:
        if not isinstance(value, str):
            return value
        if len(self._texts) < _MAX_TEXTS:
            return self._texts.setdefault(value, value)
        return self._texts.get(value, value)

    def keep(self, o: CalcOutcome) -> None:
        """Move ``o``'s record entry and sheet HTML into the spool; ``o`` keeps a summary."""
        if o.spooled is not None:
            return
        path = o.calc.template.path
        if path not in self._shas:
            self._shas[path] = template_digest(path)
        entry = calc_record(o, self._shas[path])
        pretty = record_layout(entry, 2)  # as the record file prints it, two levels deep
        canonical = json.dumps(entry, sort_keys=True, separators=(",", ":"), ensure_ascii=False, allow_nan=False)
        spooled = SpooledEntry(self._put(pretty), self._put(canonical), self._shas[path])
        printable = self._html and self._cases.printable(o)
        sheets = []
        for index, s in enumerate(o.sheets):
            item = s if isinstance(s, SheetItem) else SheetItem(s)
            rec = item["record"]
            slim = SpooledSheet(
                title=rec["title"], method=self._text(rec.get("method") or ""),
                assumptions=[self._text(a) for a in rec.get("assumptions", [])],
                checks=[{k: self._text(c[k]) for k in _SLIM_CHECK} for c in rec["checks"]],
                numbers=item.numbers, _entry=spooled, _index=index,
            )
            if printable and "html_z" in item:
                slim["_html"] = self._put_compressed(item["html_z"])
            elif printable and item.has_html:
                slim["_html"] = self._put(item["html"])
            if "text" in item:
                slim["text"] = item["text"]
            sheets.append(slim)
        o.sheets = sheets
        o.spooled = spooled
        if o.notebook is not None and not isinstance(o.notebook, SpooledNotebook):  # --notebooks: one per calc
            import nbformat  # lazy: kernel runs only

            text = nbformat.writes(o.notebook)
            o.notebook = SpooledNotebook(self._put(text if text.endswith("\n") else text + "\n"))
