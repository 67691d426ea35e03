"""Member checks per AISC 360-16 (ASD and LRFD), yield-based stress checks and welds.

Shape families: round and rectangular HSS, W-shapes, channels, tees, single angles and solid
bars (see :data:`KINDS`); limit states D2, E3/E4/E5/E7, F2/F3/F6/F7/F8/F9/F10/F11, G2/G3/G4/G5,
H1, H3, J2 with J4.2 base metal, J3 bolts in bearing; anchorage to concrete per ACI 318-19 Chapter 17
(cast-in anchors). Equations are those of the 2016 edition; where a jurisdiction
has adopted AISC 360-22, confirm clause numbers and any changed provisions for the job.

Each ``add_*`` function writes traceable steps (given, formula, branch, selection) on a
:class:`~calcpad.core.sheet.Sheet` with the clause or equation number as reference and ends
with a check. The available strength uses φ (LRFD) or Ω (ASD) per ``sheet.method``.

Sections come from :mod:`calcpad.eng.sections` (shape objects) or as a mapping of properties
with ``kind=`` (see :data:`calcpad.eng.checks._section.PROPS`). Limit states outside the
scope raise :class:`CheckNotCoveredError` ("... is not covered by this check").
"""

from __future__ import annotations

from calcpad.eng.checks._common import RESISTANCE, CheckInputError, CheckNotCoveredError, CheckWarning
from calcpad.eng.checks._section import KINDS, PROPS, resolve_section
from calcpad.eng.checks.anchorage import ANCHOR_GRADES, add_anchorage_check
from calcpad.eng.checks.base_plate import add_base_plate_check
from calcpad.eng.checks.block_shear import add_block_shear_check
from calcpad.eng.checks.bolts import BOLT_GRADES, add_bolt_line_check
from calcpad.eng.checks.classify import add_classification
from calcpad.eng.checks.combined import add_interaction_check
from calcpad.eng.checks.compression import add_compression_check
from calcpad.eng.checks.euler import EULER_AXES, add_euler_load
from calcpad.eng.checks.flexure import add_flexure_check
from calcpad.eng.checks.frame_member import MemberForces, check_frame_member, frame_member_forces
from calcpad.eng.checks.leg_base import add_leg_base_uplift_check
from calcpad.eng.checks.member import MemberChecks, check_member
from calcpad.eng.checks.shear import add_shear_check
from calcpad.eng.checks.stability import add_second_order
from calcpad.eng.checks.stress import add_stress_check
from calcpad.eng.checks.tension import add_tension_check
from calcpad.eng.checks.torsion import add_torsion_check, add_torsion_interaction_check
from calcpad.eng.checks.weld_group import WELD_GROUP_SHAPES, add_weld_group_check
from calcpad.eng.checks.welds import add_fillet_weld_check, add_stitch_weld_check

__all__ = [
    "ANCHOR_GRADES",
    "BOLT_GRADES",
    "EULER_AXES",
    "KINDS",
    "PROPS",
    "RESISTANCE",
    "WELD_GROUP_SHAPES",
    "CheckInputError",
    "CheckNotCoveredError",
    "CheckWarning",
    "MemberChecks",
    "MemberForces",
    "add_anchorage_check",
    "add_base_plate_check",
    "add_block_shear_check",
    "add_bolt_line_check",
    "add_classification",
    "add_compression_check",
    "add_euler_load",
    "add_fillet_weld_check",
    "add_flexure_check",
    "add_interaction_check",
    "add_leg_base_uplift_check",
    "add_second_order",
    "add_shear_check",
    "add_stitch_weld_check",
    "add_stress_check",
    "add_tension_check",
    "add_torsion_check",
    "add_torsion_interaction_check",
    "add_weld_group_check",
    "check_frame_member",
    "check_member",
    "frame_member_forces",
    "resolve_section",
]
