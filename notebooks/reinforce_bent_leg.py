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
P = "700 lbf"  # lateral service load at the top of the leg (ASD); 0 < P <= 20 kip
L = "60 in"  # leg length from base to load; 12 in to 20 ft
leg = "HSS3x3x3/16"  # existing leg, catalog designation: square/rectangular/round HSS or pipe
leg_grade = "A500 Gr C"  # existing leg steel, materials catalog name (A500: round/shaped picked from the leg)
added = "L3x3x1/4"  # added member: an angle (wrapped on a corner) or an HSS, pipe or flat bar (on the loaded face)
added_grade = "A36"  # added member steel, materials catalog name
weld_size = "3/16 in"  # fillet weld leg size; 1/8 in to 5/16 in
weld_length = "2 in"  # length of each intermittent weld segment; 1-1/2 in up to weld_pitch
weld_pitch = "5 in"  # centre-to-centre spacing of the weld segments (E6.2 limits it when N > 0); weld_length to 24 in
F_EXX = "70 ksi"  # filler metal classification strength; 60 ksi to 80 ksi
N = "150 lbf"  # axial compression in the leg (share of the unit weight, ASD); 0 lbf to 20 kip
e0 = "1/8 in"  # residual bow of the leg measured after straightening; 0 in to 2 in
end_weld = "3 in"  # length of each of the two end welds of the added member at the base; 1 in to 24 in
member_mark = ""  # member mark (the runner fills it from the job)
calc_title = ""  # calc title (the runner fills it from the job)
calc_note = ""  # the job's note on this calc, printed on its sheets (the runner fills it from the job)

# %%
from IPython.display import Image

from calcpad import Q_, Sheet, calc_heading
from calcpad.eng.checks import add_fillet_weld_check, add_stitch_weld_check
from calcpad.eng.materials import get_material, hss_material
from calcpad.eng.sections import Angle, get_section
from calcpad.eng.sections.builtup import BuiltUp, compare_sections
from calcpad.eng.sections.plot import sections_png
from calcpad.eng.sections.steps import add_builtup_steps, add_section_steps, add_shape_props

ASSUMPTIONS = [
    "The leg is a cantilever fixed at its base and loaded sideways at its top.",
    "The bent leg is straightened before the member is added and its residual bow e0 is measured; the axial load N acts on that bow (M = H L + N e0).",
    "First-yield bending (M = F_y S) with Omega_b = 1.67, conservative for compact sections; leg buckling and the base connection are checked elsewhere.",
    "The existing-section check is reported for information; the repaired checks govern.",
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

png = sections_png([leg_shape, reinforced], ["Before: " + leg, "After: " + reinforced.name], dpi=100)
Image(png)  # drawn once: the same picture goes into the sheet below

# %% [markdown]
# ## Existing leg

# %%
before = Sheet(calc_heading("Reinforcement of a bent leg", calc_title, member_mark, "existing section"), meta={"member": member_mark})
for text in ASSUMPTIONS:
    before.assume(text)
if calc_note.strip():
    before.note(calc_note.strip())
before.heading("Section properties")
s = add_section_steps(before, leg_shape, source=f"{leg} (design wall)")
S_name = s["S_x"]
before.heading("Demand")
before.given("P", P, "Lateral load at top of leg")
before.given("L", L, "Leg length, base to load")
before.given("N", N, "Axial compression in the leg")
before.given("e_0", e0, "Residual bow, measured")
before.step("M", "P*L + N*e_0", "Base moment (lateral load and axial load on the bow)", unit="kip*in", ref="cantilever, statics")
before.step("sigma_b", f"M/{S_name}", "Bending stress at base", unit="ksi", ref="common practice")
before.heading("Capacity and check")
before.given("F_y", Q_(leg_mat.Fy, "ksi"), "Yield stress of the leg", source=leg_mat.name)
before.given("Omega_b", 1.67, "Safety factor for flexure (ASD)", source="AISC 360-16 F1")
before.step("F_b", "F_y/Omega_b", "Allowable bending stress (first yield)", unit="ksi", ref="AISC 360-16 F1, M = F_y*S")
before.check("Bending stress, existing leg", demand="sigma_b", capacity="F_b", ref="AISC 360-16 F1 (ASD)", existing=True)
before.note("Existing condition, for information (load parallel to a face): this check does not decide the job; the "
            "reinforced leg below governs, for the worst load direction.")
before

# %% [markdown]
# ## Reinforced leg

# %%
after = Sheet(calc_heading("Reinforcement of a bent leg", calc_title, member_mark, "reinforced section"), meta={"member": member_mark})
for text in ASSUMPTIONS:
    after.assume(text)
if calc_note.strip():
    after.note(calc_note.strip())
after.figure("Existing and reinforced sections", png)
after.heading("Added member")
a = add_shape_props(after, add_shape_, suffix="a", names=["A", "I_x", "I_y"])
after.heading("Composite section")
c = add_builtup_steps(after, reinforced)
after.table("Before / after", compare_sections(leg_shape, reinforced).round(4))
after.heading("Demand")
after.given("P", P, "Lateral load at top of leg")
after.given("L", L, "Leg length, base to load")
after.given("N", N, "Axial compression in the leg")
after.given("e_0", e0, "Residual bow, measured after straightening")
after.step("M", "P*L + N*e_0", "Base moment (lateral load and axial load on the bow)", unit="kip*in", ref="cantilever, statics")
after.heading("Stress at the critical fibre of each member, worst load direction, against its own steel")
after.assume("The lateral load may act in any direction: the moment vector is taken at 0, 45, 90 and 135 degrees from x "
             "and the direction giving the largest stress in each member is written (unsymmetric bending, common practice).")
unsym = "I_xy" in c
for i, (member, mat) in enumerate([(reinforced.members[0], leg_mat), (reinforced.members[1], add_mat)], start=1):
    theta, x_p, y_p, _ = reinforced.worst_direction(member=member.label)
    after.given(f"theta_{i}", Q_(theta, "degree"), f"Direction of the moment vector from x, worst for {member.label}",
                source="largest stress of 0/45/90/135 degrees")
    after.given(f"x_p{i}", Q_(x_p, "in"), f"Critical fibre of {member.label}, x from centroid", source="outline point of largest stress")
    after.given(f"y_p{i}", Q_(y_p, "in"), f"Critical fibre of {member.label}, y from centroid", source="outline point of largest stress")
    if unsym:
        after.step(f"sigma_b{i}", f"abs(M*(cos(theta_{i})*({c['I_y']}*y_p{i} - {c['I_xy']}*x_p{i}) + sin(theta_{i})*({c['I_x']}*x_p{i} - "
                   f"{c['I_xy']}*y_p{i}))/({c['I_x']}*{c['I_y']} - {c['I_xy']}**2))",
                   f"Bending stress in {member.label} (unsymmetric bending)", unit="ksi", ref="common practice")
    else:
        after.step(f"sigma_b{i}", f"abs(M*(cos(theta_{i})*y_p{i}/{c['I_x']} + sin(theta_{i})*x_p{i}/{c['I_y']}))",
                   f"Bending stress in {member.label}", unit="ksi", ref="common practice")
    after.given(f"F_y{i}", Q_(mat.Fy, "ksi"), f"Yield stress of {member.label}", source=mat.name)
    if i == 1:
        after.given("Omega_b", 1.67, "Safety factor for flexure (ASD)", source="AISC 360-16 F1")
    after.step(f"F_b{i}", f"F_y{i}/Omega_b", f"Allowable bending stress in {member.label} (first yield)", unit="ksi",
               ref="AISC 360-16 F1, M = F_y*S")
    after.check(f"Bending stress after reinforcement, {member.label}", demand=f"sigma_b{i}", capacity=f"F_b{i}", ref="AISC 360-16 F1 (ASD)")
after.heading("Force transfer between the added member and the leg, worst load direction")
after.assume("The load may act in any direction: the shear flow and the force the added member picks up are taken for the "
             "direction that makes them largest, from the first moments of the added member about both composite axes.")
after.step("Q_ax", f"{c['A_2']}*({c['y_2']} - {c['y_bar']})", "First moment of the added member about the composite x-axis",
           unit="in^3", ref="common practice")
after.step("Q_ay", f"{c['A_2']}*({c['x_2']} - {c['x_bar']})", "First moment of the added member about the composite y-axis",
           unit="in^3", ref="common practice")
if unsym:
    after.step("k_Q", f"sqrt(({c['I_y']}*Q_ax - {c['I_xy']}*Q_ay)**2 + ({c['I_x']}*Q_ay - {c['I_xy']}*Q_ax)**2)/"
               f"({c['I_x']}*{c['I_y']} - {c['I_xy']}**2)",
               "Largest force in the added member per unit moment over all directions (unsymmetric bending; the force "
               "is the integral of the bending stress over the added member)", unit="1/in", ref="unsymmetric bending, common practice")
else:
    after.step("k_Q", f"sqrt((Q_ax/{c['I_x']})**2 + (Q_ay/{c['I_y']})**2)",
               "Largest force in the added member per unit moment over all directions", unit="1/in", ref="common practice")
after.heading("Intermittent welds, added member to leg")
after.assume("Two lines of fillet welds join the added member to the leg; shear flow q = V k_Q for the worst direction.")
after.step("V", "P", "Shear along the leg", unit="lbf", ref="cantilever, statics")
t_leg = leg_shape.t
t_add = getattr(add_shape_, "t", None) or min(add_shape_.width, add_shape_.depth)
thin = f"{min(t_leg, t_add):.4f} in"
base_metal = [{"label": "existing leg", "t": f"{t_leg:.4f} in", "F_y": f"{leg_mat.Fy} ksi", "F_u": f"{leg_mat.Fu} ksi"},
              {"label": "added member", "t": f"{t_add:.4f} in", "F_y": f"{add_mat.Fy} ksi", "F_u": f"{add_mat.Fu} ksi"}]
compression = after["N"].to("lbf").magnitude > 0  # a compression member (the leg carries the unit): E6 applies
built_up = {"t": f"{t_add:.4f} in", "F_y": f"{add_mat.Fy} ksi"} if compression else None
add_stitch_weld_check(after, V="V", Q_over_I="k_Q", w=weld_size, L_seg=weld_length, s=weld_pitch, n=2, F_EXX=F_EXX,
                      t_p=thin, t_e=f"{t_add:.4f} in", base=base_metal, compression=built_up)
after.heading("End welds of the added member")
after.step("F_end", "M*k_Q", "Force the added member picks up at its lower end (M·Q/I for the worst direction, base moment)",
           unit="kip", ref="flexure of the composite section, common practice")
add_fillet_weld_check(after, R="F_end", w=weld_size, L=end_weld, t_p=thin, t_e=f"{t_add:.4f} in", F_EXX=F_EXX, n=2,
                      base_t=f"{t_add:.4f} in", base_Fy=f"{add_mat.Fy} ksi", base_Fu=f"{add_mat.Fu} ksi", suffix="end")
if compression:
    after.heading("Built-up compression member: end connection and components between stitches (AISC 360-16 E6)")
    after.given("L_end", end_weld, "Length of each end weld line of the added member at the base")
    after.step("b_max", f"max({c['x_right']} - {c['x_left']}, {c['y_top']} - {c['y_bot']})", "Largest width of the built-up member",
               unit="in", ref="outline")
    after.check("End weld length, built-up member bearing on the base plate", demand="b_max", capacity="L_end",
                ref="AISC 360-16 E6.2(a) (each weld line at least the largest width; from memory)")
    after.given("K_b", 2.1, "Effective length factor of the built-up leg (fixed base, free top)",
                source="AISC 360-16 Commentary Table C-A-7.1")
    after.step("I_min", f"({c['I_x']} + {c['I_y']})/2 - sqrt((({c['I_x']} - {c['I_y']})/2)**2" +
               (f" + {c['I_xy']}**2" if unsym else "") + ")", "Least principal moment of inertia of the built-up member",
               unit="in^4", ref="Mohr's circle, common practice")
    after.step("r_min", f"sqrt(I_min/{c['A']})", "Least radius of gyration of the built-up member", unit="in")
    after.step("KL_r", "K_b*L/r_min", "Governing slenderness of the built-up member", ref="AISC 360-16 E2")
    after.given("r_i", Q_(add_shape_.props.value("r_min"), "in"), "Least radius of gyration of the added member",
                source=f"{added} (computed from dimensions)")
    after.given("a_s", weld_pitch, "Distance between the stitch welds (the pitch, conservative)")
    after.step("a_r", "a_s/r_i", "Slenderness of the added member between stitches")
    after.step("a_rmax", "0.75*KL_r", "Limit: three quarters of the governing slenderness of the built-up member",
               ref="AISC 360-16 E6.1 (from memory)")
    after.check("Added member slenderness between stitches", demand="a_r", capacity="a_rmax", ref="AISC 360-16 E6.1")
else:
    after.note("No axial compression given: the built-up compression member rules of AISC 360-16 E6 do not apply.")
after.note("Caution on straightening: cold straightening of HSS may crack the cold-formed corners; heat straightening "
           "is done with controlled temperatures (about 1100 to 1200 °F at most for carbon steel, common practice) "
           "and no quenching. After straightening, inspect the corners and the bent region for cracks (magnetic "
           "particle or dye penetrant testing), measure the residual bow e₀ entered above, and inspect the new welds.")
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
