# %% [markdown]
# # Leg in bending: cantilever tube, yield-based check
#
# A leg of a light frame fixed at its base and loaded sideways at its top acts as a cantilever.
# This template shows the base moment, the tube's section properties (design wall per AISC 360-16
# B4.2), the second-order amplifier B2 when the leg carries axial load, the combined stress and the
# factor of safety against yield, each as formula = substituted values = result.
#
# *For review by a qualified, licensed engineer. Local building codes and the authority having
# jurisdiction govern.*

# %% tags=["parameters"]
P = "85 lbf"  # lateral load at the top of the leg, service level (ASD); 0 < P <= 20 kip
N = "0 lbf"  # axial compression in the leg, service level (ASD); 0 lbf to 20 kip
L = "42 in"  # leg length from base to load; 6 in to 30 ft
leg = "Pipe 1-1/2 Std"  # catalog designation of a pipe or round HSS (design wall per AISC 360-16 B4.2), or custom for D_o and t
D_o = "1.900 in"  # tube outside diameter (custom leg only); > 0
t = "0.145 in"  # tube nominal wall thickness (custom leg only; an ERW tube uses 0.93 t, AISC 360-16 B4.2); 0 < t < D_o/2
F_y = "35 ksi"  # specified minimum yield stress of the tube (ASTM A53 Gr B: 35 ksi)
FS_req = 1.67  # required factor of safety against yield; 1.0 to 5.0
member_mark = ""  # member mark (the runner fills it from the job)
calc_title = ""  # calc title (the runner fills it from the job)
calc_note = ""  # the job's note on this calc, printed on its sheets (the runner fills it from the job)

# %%
from calcpad import Sheet, calc_heading
from calcpad.eng.checks import CheckInputError, add_second_order
from calcpad.eng.materials import ROUND_TUBE_GRADES, grade_label
from calcpad.eng.sections import RoundTube, get_section
from calcpad.widgets import show, show_summary

sh = Sheet(calc_heading("Leg bending at base", calc_title, member_mark), meta={"member": member_mark}, method="ASD")
sh.assume("The leg is a cantilever fixed at its base and loaded sideways at its top.")
sh.assume("Service-level (ASD) loads; yield-based check of the extreme fibre with the required factor of safety; "
          "second-order effects by AISC 360-16 Appendix 8 (B2 of the fixed-free leg).")
if calc_note.strip():
    sh.note(calc_note.strip())
sh.heading("Inputs")
sh.given("P", P, "Lateral load at top of leg (service level)")
sh.given("N_ax", N, "Axial compression in the leg (service level)")
sh.given("L", L, "Leg length, base to load")
sh.given("F_y", F_y, "Yield stress", source=grade_label(F_y, ROUND_TUBE_GRADES))
sh.heading("Section properties")
if leg.strip().lower() == "custom":
    sh.given("D_o", D_o, "Outside diameter")
    sh.given("t_nom", t, "Nominal wall thickness")
    sh.step("t", "0.93*t_nom", "Design wall thickness (ERW)", unit="in", ref="AISC 360-16 B4.2")
    tube = RoundTube(sh["D_o"], sh["t"], t_nominal=sh["t_nom"], name=f"tube {D_o} x {t} nominal wall")
else:
    tube = get_section(leg)
    if not isinstance(tube, RoundTube):
        raise CheckInputError("leg", leg, "a pipe or round HSS designation, or 'custom' with D_o and t")
    sh.given("D_o", f"{tube.width:.3f} in", "Outside diameter", source=tube.name)  # table precision
    sh.given("t_nom", f"{tube.t_nominal:.3f} in", "Nominal wall thickness", source=tube.name)
    sh.step("t", "0.93*t_nom", "Design wall thickness (ERW pipe / HSS)", unit="in", ref="AISC 360-16 B4.2")
sh.step("D_i", "D_o - 2*t", "Inside diameter")
sh.step("A", "pi/4*(D_o**2 - D_i**2)", "Area", unit="in^2")
sh.step("I", "pi/64*(D_o**4 - D_i**4)", "Moment of inertia", unit="in^4")
sh.step("c", "D_o/2", "Extreme fibre distance")
sh.heading("Demand")
sh.step("M_1", "P*L", "Base moment, first order", ref="cantilever, statics")
_, M_name = add_second_order(sh, tube, P_nt="N_ax", M_lt="M_1", L="L", sway="cantilever", E="29000 ksi")
sh.heading("Check")
sh.step("sigma_b", f"N_ax/A + {M_name}*c/I", "Combined stress at base", unit="ksi", ref="common practice")
sh.check("Combined stress vs yield", demand="sigma_b", capacity="F_y", required_fs=FS_req, ref="yield-based, common practice")
show(sh)

# %%
show_summary(sh)

# %% [markdown]
# ## What-if
#
# Each parameter has a control with its stated range; the sheet and the summary above redraw in
# place. A value outside its range, or one the sheet cannot take, is refused with its message and
# the last good values stay. "Sensitivity" ranks the inputs by their effect on the ratio; "What
# would it take?" gives the load or length at which the check reaches 1.0; "Export job block"
# gives the values as a job-file calc.

# %% tags=["nbval-ignore-output"]
from calcpad.widgets import what_if

panel = what_if(sh, template="leg_bending", bind=["P", "L", "F_y"], values=globals())
panel

# %%
panel.set("P", "120 lbf")
ratio_at_120_lbf = round(next(c.ratio for c in panel.sheet.summary() if c.title == "Combined stress vs yield"), 3)
panel.reset()  # back to this template's parameters, so the stored sheet is the one above
ratio_at_120_lbf
