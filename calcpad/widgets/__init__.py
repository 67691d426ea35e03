"""Interactive faces for notebooks: the what-if panel and sheets that redraw in place.

ipywidgets is imported only when a panel is made, so ``import calcpad`` (and this package)
stays fast and works where ipywidgets is not installed.
"""

from __future__ import annotations

from calcpad.widgets.live import refresh, show, show_summary
from calcpad.widgets.whatif import WhatIfPanel, what_if

__all__ = ["WhatIfPanel", "refresh", "show", "show_summary", "what_if"]
