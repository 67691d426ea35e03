"""The submittal face: a print layout of our own, typical members, and PDF through Chromium.

Imports runner, render and core (never imported by them).
"""

from calcpad.report.grouping import CalcGroup, group_calcs
from calcpad.report.layout import submittal_html
from calcpad.report.pdf import PdfResult, write_pdf
from calcpad.report.write import write_submittal

__all__ = ["CalcGroup", "PdfResult", "group_calcs", "submittal_html", "write_pdf", "write_submittal"]
