"""Section properties: closed-form shapes, a catalog of standard sizes, and built-up sections.

Numbers are plain floats in inches inside (fast); ``SectionProps.quantity(name)`` and
``as_dict(quantities=True)`` give pint quantities from the shared registry. The ``steps``
module adds the same calculations to a sheet as traceable steps.

    >>> from calcpad.eng.sections import get_section, BuiltUp
    >>> leg = get_section("HSS3x3x3/16")
    >>> bu = BuiltUp("Leg L2 reinforced").add(leg, label="leg")
    >>> bu = bu.add(get_section("L3x3x1/4"), at=(3.25, 3.25), rotate=180, label="angle")
"""

from __future__ import annotations

from calcpad.eng.sections.builtup import BuiltUp, OverlapWarning, compare_sections
from calcpad.eng.sections.catalog import (
    FAMILIES,
    UnknownSectionError,
    check_designation,
    designations,
    find_sections,
    get_entry,
    get_section,
    section_table,
)
from calcpad.eng.sections.plot import draw_sections
from calcpad.eng.sections.props import SectionProps
from calcpad.eng.sections.rolled import RolledAngle, RolledChannel, RolledIShape, RolledTee
from calcpad.eng.sections.rolled_sloped import SlopedIShape, SlopedTee
from calcpad.eng.sections.shapes import Angle, Channel, IShape, RectBar, RectTube, RoundBar, RoundTube, Shape, Tee
from calcpad.eng.sections.shop import (
    ShopTable,
    ShopTableError,
    load_shop_table,
    read_shop_table,
    shop_table_in_use,
    use_shop_table,
)
from calcpad.eng.sections.slender import add_qs_steps, section_qs
from calcpad.eng.sections.steps import (
    add_builtup_steps,
    add_rect_tube_steps,
    add_round_tube_steps,
    add_section_steps,
    add_shape_props,
)

__all__ = [
    "FAMILIES",
    "Angle",
    "BuiltUp",
    "Channel",
    "IShape",
    "OverlapWarning",
    "RectBar",
    "RectTube",
    "RolledAngle",
    "RolledChannel",
    "RolledIShape",
    "RolledTee",
    "RoundBar",
    "RoundTube",
    "SectionProps",
    "Shape",
    "ShopTable",
    "ShopTableError",
    "SlopedIShape",
    "SlopedTee",
    "Tee",
    "UnknownSectionError",
    "add_builtup_steps",
    "add_qs_steps",
    "add_rect_tube_steps",
    "add_round_tube_steps",
    "add_section_steps",
    "add_shape_props",
    "check_designation",
    "compare_sections",
    "designations",
    "draw_sections",
    "find_sections",
    "get_entry",
    "get_section",
    "load_shop_table",
    "read_shop_table",
    "section_qs",
    "section_table",
    "shop_table_in_use",
    "use_shop_table",
]
