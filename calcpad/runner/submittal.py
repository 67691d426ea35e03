"""Kept for old imports: the submittal page now lives in :mod:`calcpad.report.layout`."""

from __future__ import annotations

from calcpad.report.layout import submittal_html

__all__ = ["submittal_html"]
