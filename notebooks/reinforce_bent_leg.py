# %% [markdown]
# # Reinforcing a bent leg: member welded alongside
#
# The leg is a cantilever fixed at its base and loaded sideways at its top. It is reinforced by
# welding a member alongside it: an angle wrapped round one corner (for an angle) or a sister tube
# on the loaded face (for a tube, pipe or bar). The template shows the existing section, the added
# member, the composite properties by the parallel-axis theorem, and the bending stress ratio
# before and after, with the shear flow the intermittent welds must carry.
#
# *For review by a qualified, licensed engineer. Local building codes and the authority having
# jurisdiction govern.*

# %% tags=["parameters"]
P = "950 lbf"  # lateral service load at the top of the leg (ASD); 0 < P <= 20 kip
L = "60 in"  # leg length from base to load; 12 in to 20 ft
leg = "HSS3x3x3/16"  # existing leg, catalog designation: square/rectangular/round HSS or pipe
leg_grade = "A500 Gr C"  # existing leg steel, materials catalog name (A500: round/shaped picked from the leg)
added = "L3x3x1/4"  # added member: an angle (wrapped on a corner) or an HSS, pipe or flat bar (on the loaded face)
added_grade = "A36"  # added member steel, materials catalog name
weld_size = "3/16 in"  # fillet weld leg size; 1/8 in to 5/16 in
weld_length = "2 in"  # length of each intermittent weld segment; 1-1/2 in up to weld_pitch
weld_pitch = "12 in"  # centre-to-centre spacing of the weld segments; weld_length to 24 in
F_EXX = "70 ksi"  # filler metal classification strength; 60 ksi to 80 ksi
member_mark = ""  # member mark (the runner fills it from the job)
calc_title = ""  # calc title (the runner fills it from the job)

# %%
import io

from IPython.display import Image

from calcpad import Q_, Sheet, calc_heading
from calcpad.eng.materials import get_material, hss_material
from calcpad.eng.sections import Angle, get_section
from calcpad.eng.sections.builtup import BuiltUp, compare_sections
from calcpad.eng.sections.plot import draw_sections
from calcpad.eng.sections.steps import add_builtup_steps, add_section_steps, add_shape_props

ASSUMPTIONS = [
    "The leg is a cantilever fixed at its base and loaded sideways at its top.",
    "The bent leg is straightened (or its bow is small) before the member is added.",
    "First-yield bending (M = F_y S) with Omega_b = 1.67, conservative for compact sections; axial load, leg buckling and the base connection are checked elsewhere.",
]

leg_shape = get_section(leg)
add_shape_ = get_section(added)
leg_mat = hss_material(leg_grade, leg_shape) if "A500" in leg_grade.upper() else get_material(leg_grade)
add_mat = hss_material(added_grade, add_shape_) if "A500" in added_grade.upper() else get_material(added_grade)

reinforced = BuiltUp(f"{leg} + {added}")
reinforced.add(leg_shape, label="existing leg")
B_leg, H_leg = leg_shape.width, leg_shape.depth
if isinstance(add_shape_, Angle):
    # heel outside the top-right corner, legs along the top and right faces (rotated 180 degrees)
    reinforced.add(add_shape_, at=(B_leg + add_shape_.t, H_leg + add_shape_.t), rotate=180.0, label="added angle")
else:
    reinforced.add(add_shape_, at=((B_leg - add_shape_.width) / 2, H_leg), label="added member")

fig = draw_sections([leg_shape, reinforced], ["Before: " + leg, "After: " + reinforced.name])
png = io.BytesIO()
fig.savefig(png, format="png", dpi=100, metadata={"Software": None})
Image(png.getvalue())

# %% [markdown]
# ## Existing leg

# %%
before = Sheet(calc_heading("Reinforcement of a bent leg", calc_title, member_mark, "existing section"), meta={"member": member_mark})
for text in ASSUMPTIONS:
    before.assume(text)
before.heading("Section properties")
s = add_section_steps(before, leg_shape, source=f"{leg} (design wall)")
S_name = s["S_x"]
before.heading("Demand")
before.given("P", P, "Lateral load at top of leg")
before.given("L", L, "Leg length, base to load")
before.step("M", "P*L", "Base moment", unit="kip*in", ref="cantilever, statics")
before.step("sigma_b", f"M/{S_name}", "Bending stress at base", unit="ksi", ref="common practice")
before.heading("Capacity and check")
before.given("F_y", Q_(leg_mat.Fy, "ksi"), "Yield stress of the leg", source=leg_mat.name)
before.given("Omega_b", 1.67, "Safety factor for flexure (ASD)", source="AISC 360-16 F1")
before.step("F_b", "F_y/Omega_b", "Allowable bending stress (first yield)", unit="ksi", ref="AISC 360-16 F1, M = F_y*S")
before.check("Bending stress, existing leg", demand="sigma_b", capacity="F_b", ref="AISC 360-16 F1 (ASD)")
before

# %% [markdown]
# ## Reinforced leg

# %%
after = Sheet(calc_heading("Reinforcement of a bent leg", calc_title, member_mark, "reinforced section"), meta={"member": member_mark})
for text in ASSUMPTIONS:
    after.assume(text)
after.figure("Existing and reinforced sections", fig)
after.heading("Added member")
a = add_shape_props(after, add_shape_, suffix="a", names=["A", "I_x", "I_y"])
after.heading("Composite section")
c = add_builtup_steps(after, reinforced)
after.table("Before / after", compare_sections(leg_shape, reinforced).round(4))
after.heading("Demand")
after.given("P", P, "Lateral load at top of leg")
after.given("L", L, "Leg length, base to load")
after.step("M", "P*L", "Base moment", unit="kip*in", ref="cantilever, statics")
after.heading("Stress at the critical fibre of each member, checked against its own steel")
unsym = "I_xy" in c
for i, (member, mat) in enumerate([(reinforced.members[0], leg_mat), (reinforced.members[1], add_mat)], start=1):
    x_p, y_p = reinforced.critical_fibre("x", member=member.label)
    after.given(f"x_p{i}", Q_(x_p, "in"), f"Critical fibre of {member.label}, x from centroid", source="outline point of largest stress")
    after.given(f"y_p{i}", Q_(y_p, "in"), f"Critical fibre of {member.label}, y from centroid", source="outline point of largest stress")
    if unsym:
        after.step(f"sigma_b{i}", f"abs(M*({c['I_y']}*y_p{i} - {c['I_xy']}*x_p{i})/({c['I_x']}*{c['I_y']} - {c['I_xy']}**2))",
                   f"Bending stress in {member.label} (unsymmetric bending)", unit="ksi", ref="common practice")
    else:
        after.step(f"sigma_b{i}", f"abs(M*y_p{i}/{c['I_x']})", f"Bending stress in {member.label}", unit="ksi", ref="common practice")
    after.given(f"F_y{i}", Q_(mat.Fy, "ksi"), f"Yield stress of {member.label}", source=mat.name)
    if i == 1:
        after.given("Omega_b", 1.67, "Safety factor for flexure (ASD)", source="AISC 360-16 F1")
    after.step(f"F_b{i}", f"F_y{i}/Omega_b", f"Allowable bending stress in {member.label} (first yield)", unit="ksi",
               ref="AISC 360-16 F1, M = F_y*S")
    after.check(f"Bending stress after reinforcement, {member.label}", demand=f"sigma_b{i}", capacity=f"F_b{i}", ref="AISC 360-16 F1 (ASD)")
after.heading("Intermittent welds, added member to leg")
after.assume("Two lines of fillet welds join the added member to the leg; shear flow from the x-axis properties.")
after.step("V", "P", "Shear along the leg", unit="lbf", ref="cantilever, statics")
after.step("Q_a", f"{c['A_2']}*abs({c['y_2']} - {c['y_bar']})", "First moment of the added member", unit="in^3",
           ref="common practice")
after.step("q", f"V*Q_a/{c['I_x']}", "Shear flow to be carried by the welds", unit="lbf/in", ref="q = V*Q/I, common practice")
after.given("w", weld_size, "Fillet weld size")
after.given("l_w", weld_length, "Length of each weld segment")
after.given("s_w", weld_pitch, "Pitch of weld segments")
after.given("F_EXX", F_EXX, "Filler metal strength")
after.given("n_w", 2, "Weld lines")
after.given("Omega_w", 2.00, "Safety factor for welds (ASD)", source="AISC 360-16 J2.4")
after.step("F_nw", "0.60*F_EXX", "Nominal weld stress", unit="ksi", ref="AISC 360-16 Eq. J2-5")
after.step("q_a", "n_w*F_nw*0.707*w*l_w/(s_w*Omega_w)", "Allowable shear flow of the intermittent welds",
           unit="lbf/in", ref="AISC 360-16 J2.4 (ASD)")
after.check("Weld shear flow", demand="q", capacity="q_a", ref="AISC 360-16 J2.4")
after

# %% [markdown]
# ## Summary: stress ratio before and after

# %%
import pandas as pd

from calcpad.core.sheet import status_mark

checks = [("before", chk) for chk in before.summary()] + [("after", chk) for chk in after.summary()]
pd.DataFrame(
    {
        "case": [case for case, _ in checks],
        "check": [chk.title for _, chk in checks],
        "demand": [f"{chk.demand.to(chk.capacity.units).magnitude:.2f} {chk.capacity.units:~P}" for _, chk in checks],
        "capacity": [f"{chk.capacity.magnitude:.2f} {chk.capacity.units:~P}" for _, chk in checks],
        "ratio": [round(chk.ratio, 3) for _, chk in checks],
        "status": [status_mark(chk.status) for _, chk in checks],
    }
)
