"""Interactive faces for notebooks: the what-if panel.

ipywidgets is imported only when a panel is made, so ``import calcpad`` (and this package)
stays fast and works where ipywidgets is not installed.
"""

from __future__ import annotations

from calcpad.widgets.whatif import WhatIfPanel, what_if

__all__ = ["WhatIfPanel", "what_if"]
