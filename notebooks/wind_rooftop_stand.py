# %% [markdown]
# # Wind and seismic on a rooftop equipment stand: four-leg frame, leg checks
#
# A condensing unit sits on a four-leg steel stand on a roof. This template finds the wind force
# on the unit (ASCE 7-16 Sec. 29.4.1, rooftop structures and equipment) and its seismic design
# force as a nonstructural component (ASCE 7-16 Sec. 13.3.1), shares them between the two frame
# lines of the stand, analyses one frame line (legs fixed at their base plates, the unit
# modelled as a stiff block on the top rail) for the ASD combinations of ASCE 7-16 Sec. 2.4.1 and
# 2.4.5, checks the leg at its base for yield, checks the governing leg to
# AISC 360-16 (compression, flexure, shear and their interaction, ASD) in the combination that
# governs it, and checks the stand for sway.
#
# Example data: Harbor Ridge Mechanical (fictional fabricator), unit CU-2 on the roof of an
# invented two-storey building.
#
# *For review by a qualified, licensed engineer. Local building codes and the authority having
# jurisdiction govern. The first leg check is a yield-based screening check (combined axial and
# bending stress against F_y with a factor of safety); the AISC 360-16 member check follows it.*

# %% tags=["parameters"]
V = "115 mph"  # basic wind speed (ASCE 7-16 Fig. 26.5-1, site risk category); 85 to 200 mph
exposure = "C"  # terrain exposure category; B, C or D
h_roof = "28 ft"  # mean roof height of the building; 10 ft to 200 ft
B_bldg = "60 ft"  # building width normal to the wind; > 0
L_bldg = "90 ft"  # building length along the wind; > 0
W_unit = "450 lbf"  # operating weight of the unit; > 0
unit_L = "48 in"  # unit length along the frame line (wind direction); 12 in to 10 ft
unit_W = "36 in"  # unit width across the wind; 12 in to 10 ft
unit_H = "42 in"  # unit height; 12 in to 10 ft
H_leg = "24 in"  # leg height, base plate to top rail; 6 in to 8 ft
D_o = "2.375 in"  # leg tube outside diameter (Pipe 2 Std); > 0
t_nom = "0.154 in"  # leg tube nominal wall thickness; 0 < t < D_o/2
F_y = "35 ksi"  # leg yield stress (ASTM A53 Gr B); 25 to 70 ksi
E_s = "29000 ksi"  # modulus of elasticity of steel
FS_req = 1.67  # required factor of safety against yield; 1.0 to 5.0
K_leg = "2.0"  # effective length factor of the legs (sway frame, fixed bases); 0.5 to 2.5
S_DS = 0.5  # design spectral response acceleration, short periods (site, ASCE 7-16 Sec. 11.4.5); 0 to 3
a_p = 2.5  # component amplification factor (ASCE 7-16 Table 13.6-1); 1.0 to 2.5
R_p = 6.0  # component response modification factor (ASCE 7-16 Table 13.6-1); 1.0 to 12
I_p = 1.0  # component importance factor (ASCE 7-16 Sec. 13.1.3); 1.0 to 1.5

# %%
from calcpad import Q_, Sheet
from IPython.display import Image, display

from calcpad.eng.analysis.diagrams import draw_frame, draw_frame_diagram, plot_member, png_bytes
from calcpad.eng.analysis.frame import Frame, add_frame_results
from calcpad.eng.analysis.serviceability import add_deflection_check, add_result_given
from calcpad.eng.checks import add_second_order, check_frame_member
from calcpad.eng.loads.combinations import basic_combinations
from calcpad.eng.loads.seismic import add_component_seismic
from calcpad.eng.loads.wind import add_velocity_pressure, add_wind_force, gcr_uplift
from calcpad.eng.sections import RoundTube

sh = Sheet("CU-2 stand - wind and leg base moments", method="ASD")
sh.heading("Inputs")
sh.given("W_u", W_unit, "Unit operating weight")
sh.given("L_u", unit_L, "Unit length (along the wind)")
sh.given("B_u", unit_W, "Unit width")
sh.given("H_u", unit_H, "Unit height")
sh.given("H", H_leg, "Leg height, base plate to top rail")
sh.given("n_fr", 2, "Frame lines sharing the load")

sh.heading("Wind on the unit (ASCE 7-16)")
wind = add_velocity_pressure(sh, V, h_roof, exposure, structure="rooftop equipment")
sh.step("A_fu", "B_u*H_u", "Vertical projected area of unit", unit="ft^2")
force = add_wind_force(sh, wind.q, sh["A_fu"], kind="rooftop", B=B_bldg, h=h_roof)
sh.step("A_r", "B_u*L_u", "Horizontal projected area of unit", unit="ft^2")
gcr_v = gcr_uplift(sh["A_r"], B_bldg, L_bldg)
sh.given("GC_rv", round(gcr_v, 3), "Uplift coefficient", source="ASCE 7-16 Sec. 29.4.1")
sh.step("F_v", f"{wind.q}*GC_rv*A_r", "Vertical uplift force", unit="lbf", ref="ASCE 7-16 Eq. 29.4-3")
sh.step("e_w", "H_u/2", "Height of wind resultant above top rail")
sh.step("F_hf", f"{force.F}/n_fr", "Lateral force per frame line")
sh.step("F_vf", "F_v/n_fr", "Uplift per frame line")
sh.step("W_f", "W_u/n_fr", "Unit weight per frame line")

seis = add_component_seismic(sh, S_DS=S_DS, W_p=W_unit, a_p=a_p, R_p=R_p, I_p=I_p, z=h_roof, h=h_roof)
sh.step("F_pf", f"{seis.F_p}/n_fr", "Seismic force per frame line (at the unit's centre of mass)")
sh.note("The vertical seismic effect E_v = 0.2 S_DS D is carried in the dead-load factor of the seismic combinations "
        "(ASCE 7-16 Sec. 2.4.5, 12.4.2.2).")

sh.heading("Leg section (round tube)")
sh.given("D_o", D_o, "Outside diameter")
sh.given("t_n", t_nom, "Nominal wall thickness")
sh.step("t", "0.93*t_n", "Design wall thickness", ref="AISC 360-16 B4.2")
sh.step("D_i", "D_o - 2*t", "Inside diameter")
sh.step("A_g", "pi/4*(D_o**2 - D_i**2)", "Area", unit="in^2", ref="common practice")
sh.step("I_l", "pi/64*(D_o**4 - D_i**4)", "Moment of inertia", unit="in^4", ref="common practice")
sh.step("S_l", "I_l/(D_o/2)", "Elastic section modulus", unit="in^3")
sh.given("F_y", F_y, "Yield stress", source="ASTM A53 Gr B")
sh.given("E_s", E_s, "Modulus of elasticity", source="AISC 360-16 B3 (common practice)")

# %% [markdown]
# One frame line: legs L1 (windward) and L2 fixed at their base plates, top rail R, and the unit
# as a stiff block (members K1, K2 to the unit's centre U). Wind acts at U, sideways and upward.

# %%
fr = Frame("lbf", "in")
span, height, e = sh["L_u"].to("in").magnitude, sh["H"].to("in").magnitude, sh["e_w"].to("in").magnitude
fr.node("A", 0, 0)
fr.node("B", 0, height)
fr.node("C", span, height)
fr.node("D", span, 0)
fr.node("U", span / 2, height + e)
leg = {"E": sh["E_s"], "A": sh["A_g"], "I": sh["I_l"]}
stiff = {"E": sh["E_s"], "A": Q_(100.0, "in^2"), "I": Q_(1000.0, "in^4")}  # unit casing: stiff block
fr.member("L1", "A", "B", **leg)
fr.member("L2", "D", "C", **leg)
fr.member("R", "B", "C", **leg)
fr.member("K1", "B", "U", **stiff)
fr.member("K2", "C", "U", **stiff)
fr.support("A", "fixed")
fr.support("D", "fixed")
fr.node_load("D", "U", Fy=-sh["W_f"])
fr.node_load("W", "U", Fx=sh["F_hf"], Fy=sh["F_vf"])
fr.node_load("E", "U", Fx=sh["F_pf"])
for node in ("B", "C"):  # first-order story stiffness for B2: 1 kip of story shear at the rail
    fr.node_load("Hs", node, Fx=Q_(0.5, "kip"))
combos = basic_combinations("ASD", ["D", "W", "E"], S_DS=S_DS)
for c in combos:
    fr.combination(c.name, c.factors)
res = fr.solve()

names = [c.name for c in combos]
M_base, case_M, _ = res.envelope("L1", "M", cases=names)
M_base2, case_M2, _ = res.envelope("L2", "M", cases=names)
if abs(M_base2) > abs(M_base):
    M_base, case_M, leg_M = M_base2, case_M2, "L2"
else:
    leg_M = "L1"
N_gov = res.diagram(leg_M, case_M).N[0]
sway = res.displacement("B", "AC5+")[0]

sh.heading("Frame analysis (one frame line, ASD combinations)")
sh.note("Combinations: " + "; ".join(f"{c.name} = {c.label()} ({c.ref})" for c in combos))
shown = [n for n in names if n in ("AC1", "AC5+", "AC7-", case_M)]
add_frame_results(sh, res, shown, figure_case=case_M, members=["L1", "L2", "R"])
sh.figure(f"Leg {leg_M} internal forces ({case_M})", plot_member(res, leg_M, case_M, ("N", "V", "M")))

sh.heading("Leg at base plate")
add_result_given(sh, "M_b", abs(M_base), f"Governing base moment, leg {leg_M}", f"frame analysis, {case_M}")
add_result_given(sh, "P_b", Q_(abs(N_gov), "lbf"), f"Axial force in leg {leg_M}, same combination", f"frame analysis, {case_M}")
sh.step("sigma_b", "P_b/A_g + M_b/S_l", "Combined stress at base", unit="ksi", ref="common practice")
sh.check("Leg yield at base", demand="sigma_b", capacity="F_y", required_fs=FS_req, ref="yield-based, common practice")

leg_shape = RoundTube(sh["D_o"], sh["t"], name=f"leg tube {D_o} x {t_nom} nominal wall")
P_story = max(sum(res.reaction(n, c)[1].to("lbf").magnitude for n in ("A", "D")) for c in names)
add_result_given(sh, "P_st", Q_(max(P_story, 0.0), "lbf"), "Largest gravity load on the frame line (any combination)",
                 "frame analysis, vertical reactions")
add_result_given(sh, "Delta_Hs", abs(res.displacement("B", "Hs")[0]), "Rail drift under 1 kip story shear", "frame analysis, Hs")
sh.given("H_s", "1 kip", "Story shear of the stiffness case")
sh.step("HL_D", "H_s*H/Delta_Hs", "Story stiffness term H L/Δ_H (first-order)", unit="kip", ref="AISC 360-16 Eq. A-8-7")
add_second_order(sh, leg_shape, P_nt="P_st", L="H", sway="given", HL_Delta="HL_D", P_story="P_st", E="E_s", suffix="st")

sh.heading("Leg member check (AISC 360-16, ASD)")
check_frame_member(sh, res, ["L1", "L2"], leg_shape, L="H", K=float(K_leg), cases=names, B2="B_2_st", material="A53 Gr B",
                   F_y="F_y", E="E_s")

sh.heading("Sway of the stand")
add_result_given(sh, "Delta_s", abs(sway), "Top rail sway under D + 0.6W", "frame analysis, AC5+")
add_deflection_check(sh, "Delta_s", "H", "H/100", title="Stand sway H/100")
sh

# %% [markdown]
# The frame line with its loads and deflected shape, and the bending moments, for the governing
# combination (the same figures go into the submittal).

# %%
display(Image(png_bytes(draw_frame(fr, res, case_M))), Image(png_bytes(draw_frame_diagram(res, case_M, "M", members=["L1", "L2", "R"]))))

# %%
sh.summary_frame()
