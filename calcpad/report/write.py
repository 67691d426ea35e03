"""Write a job's submittal (HTML, and the PDF when Chromium is there) into a folder."""

from __future__ import annotations

from pathlib import Path
from typing import Any

from calcpad.report.layout import submittal_chunks
from calcpad.report.pdf import PdfResult, write_pdf
from calcpad.runner.execute import CalcOutcome
from calcpad.runner.job import Job

__all__ = ["write_submittal"]


def write_submittal(
    folder: Path, job: Job, outcomes: list[CalcOutcome], record: dict[str, Any], print_mode: str | None = None, pdf: bool = True
) -> PdfResult | None:
    """Write ``submittal.html`` (and ``submittal.pdf`` unless ``pdf`` is False) into ``folder``.

    Returns the :class:`PdfResult` (None without ``pdf``); a missing Chromium leaves the PDF out
    and says so in that result, never an error.
    """
    html_path = Path(folder) / "submittal.html"
    with open(html_path, "w", encoding="utf-8") as fh:  # streamed: a large job's page is never one text in memory
        for chunk in submittal_chunks(job, outcomes, record, print_mode):
            fh.write(chunk)
    return write_pdf(html_path, Path(folder) / "submittal.pdf") if pdf else None
