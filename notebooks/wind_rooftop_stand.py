# %% [markdown]
# # Wind and seismic on a rooftop equipment stand: four-leg frame, leg checks
#
# A condensing unit sits on a four-leg steel stand on a roof. This template finds the wind force
# on the unit (ASCE 7-16 Sec. 29.4.1, rooftop structures and equipment) and its seismic design
# force as a nonstructural component (ASCE 7-16 Sec. 13.3.1), shares them between the two frame
# lines of the stand, analyses one frame line in each principal direction (legs fixed at their
# base plates, the unit a stiff block pinned to or moment-connected to the top rails, as stated)
# for the ASD combinations of ASCE 7-16 Sec. 2.4.1 and 2.4.5, checks the leg at its base for
# yield, checks the governing leg to AISC 360-16 (compression, flexure, shear and their
# interaction, ASD, with B2 of Appendix 8) for wind and seismic in x, in y and on the corner leg under both
# directions at once (wind diagonal; seismic 100 %/30 % and diagonal), and checks the
# stand for sway. A second sheet checks the stand base at strength level: the leg base plate
# under uplift with biaxial moment (four rods) and under compression with moment (AISC Design
# Guide 1), and the anchorage to the concrete pad (ACI 318-19 Chapter 17, with 17.10 and
# ASCE 7-16 13.4 for the seismic case).
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
unit_L = "48 in"  # unit length (stand frame lines of this span run along it, direction x); 12 in to 10 ft
unit_W = "36 in"  # unit width (frame lines of this span, direction y); 12 in to 10 ft
unit_H = "42 in"  # unit height; 12 in to 10 ft
H_leg = "24 in"  # leg height, base plate to top rail; 6 in to 8 ft
D_o = "2.375 in"  # leg tube outside diameter (Pipe 2 Std); > 0
t_nom = "0.154 in"  # leg tube nominal wall thickness; 0 < t < D_o/2
F_y = "35 ksi"  # leg yield stress (ASTM A53 Gr B); 25 to 70 ksi
E_s = "29000 ksi"  # modulus of elasticity of steel
FS_req = 1.67  # required factor of safety against yield; 1.0 to 5.0
K_leg = "2.0"  # effective length factor of the legs (sway frame, fixed bases); 0.5 to 2.5
attachment = "pinned to rails"  # how the unit is fixed to the top rails (pinned: larger leg moments, conservative); pinned to rails or rigid block
S_DS = 0.5  # design spectral response acceleration, short periods (site, ASCE 7-16 Sec. 11.4.5); 0 to 3
a_p = 2.5  # component amplification factor (ASCE 7-16 Table 13.6-1); 1.0 to 2.5
R_p = 6.0  # component response modification factor (ASCE 7-16 Table 13.6-1); 1.0 to 12
I_p = 1.0  # component importance factor (ASCE 7-16 Sec. 13.1.3); 1.0 to 1.5
Omega_0p = 2.0  # overstrength factor of the component for its anchorage (ASCE 7-16 Table 13.6-1); 1.0 to 3.0
plate_B = "8 in"  # leg base plate, square, B x B; 4 in to 24 in
plate_t = "1/2 in"  # leg base plate thickness; 1/4 in to 2 in
plate_grade = "A36"  # base plate steel, materials catalog name
rod_d = "1/2 in"  # anchor rod diameter (four cast-in headed rods per leg, ASTM F1554 Gr 36); 1/2 in to 1-1/2 in
rod_f = "2.75 in"  # plate centre to each rod line (square pattern 2f x 2f); 1 in to plate_B
anchor_h_ef = "6 in"  # anchor rod embedment h_ef (heavy hex nut); 2 in to 25 in
f_c = "3000 psi"  # concrete compressive strength f'c of the pad; 2500 psi to 10000 psi
pad_edge = "6 in"  # anchor rods to each face of the concrete pad; 1.5 in to 48 in
pad_depth = "10 in"  # thickness of the concrete pad; 4 in to 60 in
member_mark = ""  # member mark (the runner fills it from the job)
calc_title = ""  # calc title (the runner fills it from the job)

# %%
from calcpad import Q_, Sheet, calc_heading
from calcpad.eng.materials import ROUND_TUBE_GRADES, grade_label
from IPython.display import Image, display

from calcpad.core.units import parse_quantity

from calcpad.eng.analysis.diagrams import drawing_png, plot_member
from calcpad.eng.analysis.frame import Frame, add_frame_results
from calcpad.eng.analysis.serviceability import add_deflection_check, add_result_given
from calcpad.eng.checks import (add_anchorage_check, add_base_plate_check, add_leg_base_uplift_check, add_second_order,
                                check_frame_member, check_member)
from calcpad.eng.loads.combinations import basic_combinations
from calcpad.eng.loads.seismic import add_component_seismic
from calcpad.eng.loads.wind import add_velocity_pressure, add_wind_force, gcr_uplift
from calcpad.eng.sections import RoundTube

sh = Sheet(calc_heading("Rooftop stand: wind, seismic and leg checks", calc_title, member_mark), method="ASD", meta={"member": member_mark})
sh.assume(f"The unit is a stiff block {attachment}; wind and seismic forces act at its centre.")
sh.assume("Two frame lines share the loads equally; legs are fixed at their base plates.")
sh.heading("Inputs")
sh.given("W_u", W_unit, "Unit operating weight")
sh.given("L_u", unit_L, "Unit length (along the wind)")
sh.given("B_u", unit_W, "Unit width")
sh.given("H_u", unit_H, "Unit height")
sh.given("H", H_leg, "Leg height, base plate to top rail")
sh.given("n_fr", 2, "Frame lines sharing the load")

sh.heading("Wind on the unit (ASCE 7-16), both principal directions")
sh.assume("Wind in direction x (along the unit length, on its B x H face), direction y (along its width, on its L x H "
          "face) and diagonal (75 % of each principal force together, the convention of ASCE 7-16 Fig. 27.4-8 case 3); "
          "GC_r with the larger building dimension (conservative).")
wind = add_velocity_pressure(sh, V, h_roof, exposure, structure="rooftop equipment")
B_wide = max(parse_quantity(B_bldg, "B_bldg"), parse_quantity(L_bldg, "L_bldg"), key=lambda q: q.to("ft").magnitude)
sh.step("A_fux", "B_u*H_u", "Vertical projected area of unit, wind in x", unit="ft^2")
force = add_wind_force(sh, wind.q, sh["A_fux"], kind="rooftop", B=B_wide, h=h_roof, suffix="x")
sh.step("A_fuy", "L_u*H_u", "Vertical projected area of unit, wind in y", unit="ft^2")
force_y = add_wind_force(sh, wind.q, sh["A_fuy"], kind="rooftop", B=B_wide, h=h_roof, suffix="y")
sh.step("A_r", "B_u*L_u", "Horizontal projected area of unit", unit="ft^2")
gcr_v = gcr_uplift(sh["A_r"], B_bldg, L_bldg)
sh.given("GC_rv", round(gcr_v, 3), "Uplift coefficient", source="ASCE 7-16 Sec. 29.4.1")
sh.step("F_v", f"{wind.q}*GC_rv*A_r", "Vertical uplift force", unit="lbf", ref="ASCE 7-16 Eq. 29.4-3")
sh.step("e_w", "H_u/2", "Height of wind resultant above top rail")
sh.step("F_hf", f"{force.F}/n_fr", "Lateral force per frame line, wind in x")
sh.step("F_hfy", f"{force_y.F}/n_fr", "Lateral force per frame line, wind in y")
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
sh.given("F_y", F_y, "Yield stress", source=grade_label(F_y, ROUND_TUBE_GRADES))
sh.given("E_s", E_s, "Modulus of elasticity", source="AISC 360-16 B3 (common practice)")

# %% [markdown]
# One frame line per direction: the windward and leeward legs fixed at their base plates, top rail R,
# and the unit as a stiff block (members K1, K2 to the unit's centre U), pinned to the rails or
# moment-connected as stated. Wind acts at U, sideways and upward. Direction x has the span unit_L,
# direction y the span unit_W.

# %%
pinned = attachment.strip().lower().startswith("pinned")
height, e = sh["H"].to("in").magnitude, sh["e_w"].to("in").magnitude
leg = {"E": sh["E_s"], "A": sh["A_g"], "I": sh["I_l"]}
stiff = {"E": sh["E_s"], "A": Q_(100.0, "in^2"), "I": Q_(1000.0, "in^4")}  # unit casing: stiff block


def frame_line(span, F_h):
    """One frame line: cases D, W (sideways and up), Wh (sideways only), Wv (up only), E, Hs."""
    fr = Frame("lbf", "in")
    for n, x, y in (("A", 0, 0), ("B", 0, height), ("C", span, height), ("D", span, 0), ("U", span / 2, height + e)):
        fr.node(n, x, y)
    fr.member("windward", "A", "B", **leg)
    fr.member("leeward", "D", "C", **leg)
    fr.member("R", "B", "C", **leg)
    fr.member("K1", "B", "U", **stiff, release_start=pinned)
    fr.member("K2", "C", "U", **stiff, release_start=pinned)
    fr.support("A", "fixed")
    fr.support("D", "fixed")
    fr.node_load("D", "U", Fy=-sh["W_f"])
    fr.node_load("W", "U", Fx=F_h, Fy=sh["F_vf"])
    fr.node_load("Wh", "U", Fx=F_h)
    fr.node_load("Wv", "U", Fy=sh["F_vf"])
    fr.node_load("E", "U", Fx=sh["F_pf"])
    for node in ("B", "C"):  # first-order story stiffness for B2: 1 kip of story shear at the rail
        fr.node_load("Hs", node, Fx=Q_(0.5, "kip"))
    for c in combos:
        fr.combination(c.name, c.factors)
    return fr, fr.solve()


combos = basic_combinations("ASD", ["D", "W", "E"], S_DS=S_DS)
names = [c.name for c in combos]
fr, res = frame_line(sh["L_u"].to("in").magnitude, sh["F_hf"])
fr_y, res_y = frame_line(sh["B_u"].to("in").magnitude, sh["F_hfy"])


def base_envelope(result):
    """Governing base moment over the windward and leeward legs and the combinations, its leg, case and axial force."""
    best = None
    for m in ("windward", "leeward"):
        M, case, _ = result.envelope(m, "M", cases=names)
        if best is None or abs(M) > abs(best[0]):
            best = (M, case, m)
    M, case, m = best
    return M, case, m, result.diagram(m, case).N[0]


M_x, case_x, leg_x, N_x = base_envelope(res)
M_y, case_y, leg_y, N_y = base_envelope(res_y)
if abs(M_y) > abs(M_x):
    M_base, case_M, leg_M, N_gov, res_gov, fr_gov, gov_dir = M_y, case_y, leg_y, N_y, res_y, fr_y, "y"
else:
    M_base, case_M, leg_M, N_gov, res_gov, fr_gov, gov_dir = M_x, case_x, leg_x, N_x, res, fr, "x"
sway = max(abs(res.displacement("B", "AC5+")[0]), abs(res_y.displacement("B", "AC5+")[0]))

sh.heading("Frame analysis (one frame line per direction, ASD combinations)")
sh.note("Combinations: " + "; ".join(f"{c.name} = {c.label()} ({c.ref})" for c in combos))
sh.note(f"Wind in direction {gov_dir} gives the larger leg base moment ({leg_M} leg, {case_M}).")
shown = [n for n in names if n in ("AC1", "AC5+", "AC7-", case_M)]
add_frame_results(sh, res_gov, shown, figure_case=case_M, members=["windward", "leeward", "R"])
sh.figure(f"The {leg_M} leg internal forces ({case_M}, direction {gov_dir})", drawing_png(plot_member, res_gov, leg_M, case_M, ("N", "V", "M")))

sh.heading("Leg at base plate")
add_result_given(sh, "M_b", abs(M_base), f"Governing base moment, {leg_M} leg, direction {gov_dir}", f"frame analysis, {case_M}")
add_result_given(sh, "P_b", Q_(abs(N_gov), "lbf"), f"Axial force in the {leg_M} leg, same combination", f"frame analysis, {case_M}")
sh.step("sigma_b", "P_b/A_g + M_b/S_l", "Combined stress at base", unit="ksi", ref="common practice")
sh.check("Leg yield at base", demand="sigma_b", capacity="F_y", required_fs=FS_req, ref="yield-based, common practice")

leg_shape = RoundTube(sh["D_o"], sh["t"], name=f"leg tube {D_o} x {t_nom} nominal wall")
sh.given("H_s", "1 kip", "Story shear of the stiffness case")
for d, r in (("x", res), ("y", res_y)):
    P_story = max(sum(r.reaction(n, c)[1].to("lbf").magnitude for n in ("A", "D")) for c in names)
    add_result_given(sh, f"P_st{d}", Q_(max(P_story, 0.0), "lbf"), f"Largest gravity load on a frame line, direction {d}",
                     "frame analysis, vertical reactions")
    add_result_given(sh, f"Delta_Hs{d}", abs(r.displacement("B", "Hs")[0]), f"Rail drift under 1 kip story shear, direction {d}",
                     "frame analysis, Hs")
    sh.step(f"HL_D{d}", f"H_s*H/Delta_Hs{d}", f"Story stiffness term H L/Δ_H, direction {d}", unit="kip",
            ref="AISC 360-16 Eq. A-8-7")
    add_second_order(sh, leg_shape, P_nt=f"P_st{d}", L="H", sway="given", HL_Delta=f"HL_D{d}", P_story=f"P_st{d}", E="E_s",
                     suffix=f"st{d}")
sh.step("B_2_st", "max(B_2_stx, B_2_sty)", "Sway amplifier used for the legs (larger of the two directions)",
        ref="AISC 360-16 Appendix 8")

for d, r in (("x", res), ("y", res_y)):
    sh.heading(f"Leg member check (AISC 360-16, ASD), wind and seismic in direction {d}")
    check_frame_member(sh, r, ["windward", "leeward"], leg_shape, L="H", K=float(K_leg), cases=names, B2="B_2_st", material="A53 Gr B",
                       F_y="F_y", E="E_s", suffix=d)

sh.heading("Leg member check, corner leg under both frame lines at once (diagonal wind, seismic 100 %/30 % and diagonal)")
sh.assume("Corner leg under loads in both directions at once. Wind: 75 % of the sideways wind of each direction together "
          "(ASCE 7-16 Fig. 27.4-8 case 3). Seismic: F_p on each axis alone in the x and y checks above (ASCE 7-16 13.3.1), "
          "here 100 % on one axis with 30 % on the other (orthogonal combination of ASCE 7-16 12.5.3.1(a), applied to the "
          "component) and F_p on the diagonal (0.707 F_p each way); the governing one is named.")
sh.note("Vertical loads (D and the wind uplift) are taken once, from the direction-x frame; the moments of both planes "
        "combine into the resultant of the round leg (AISC 360-16 H1 by the resultant for round HSS).")
DIRECTIONS = {"W": [("wind diagonal, 0.75 x + 0.75 y", 0.75, 0.75)],
              "E": [("seismic 100 % x + 30 % y", 1.0, 0.3), ("seismic 30 % x + 100 % y", 0.3, 1.0),
                    ("seismic diagonal, 0.707 x + 0.707 y", 0.5**0.5, 0.5**0.5)]}


def corner_forces(factors, m, lateral, kx, ky):
    """Base forces of leg m of both frame lines under the combination factors with the lateral load split kx, ky."""
    def base(r, case):
        dg = r.diagram(m, case)
        return dg.N[0], dg.M[0], dg.V[0]
    fD, fL = factors.get("D", 0.0), factors.get(lateral, 0.0)
    case_h = "Wh" if lateral == "W" else "E"
    Dx, Dy, Hx, Hy = base(res, "D"), base(res_y, "D"), base(res, case_h), base(res_y, case_h)
    Vv = base(res, "Wv") if lateral == "W" else (0.0, 0.0, 0.0)
    Mx = fD * Dx[1] + fL * (Vv[1] + kx * Hx[1])
    My = fD * Dy[1] + fL * ky * Hy[1]
    Vx = fD * Dx[2] + fL * (Vv[2] + kx * Hx[2])
    Vy = fD * Dy[2] + fL * ky * Hy[2]
    N = fD * Dx[0] + fL * (Vv[0] + kx * Hx[0] + ky * Hy[0])
    return (Mx**2 + My**2) ** 0.5, (Vx**2 + Vy**2) ** 0.5, -N, Mx, My


corner = []  # (M_res, V_res, P, leg, combination, direction label, M_x, M_y)
for c in combos:
    for lateral, splits in DIRECTIONS.items():
        if c.factors.get(lateral, 0.0) == 0:
            continue
        for label, kx, ky in splits:
            for m in ("windward", "leeward"):
                M_r, V_r, P_r, Mx, My = corner_forces(c.factors, m, lateral, kx, ky)
                corner.append((M_r, V_r, P_r, m, c.name, label, Mx, My))
per_direction = {}
for row in corner:
    if row[5] not in per_direction or row[0] > per_direction[row[5]][0]:
        per_direction[row[5]] = row
sh.table("Corner leg base, largest resultant moment per direction", [
    [lab, r[3], r[4], Q_(r[6], "lbf*in").to("kip*in"), Q_(r[7], "lbf*in").to("kip*in"), Q_(r[0], "lbf*in").to("kip*in"),
     Q_(r[2], "lbf")] for lab, r in per_direction.items()],
    columns=["direction", "leg", "combination", "M about x-frame", "M about y-frame", "resultant M", "P (compression +)"],
    note="From the two frame analyses (x and y) superposed per combination.")
M_d, V_d, P_d, leg_d, case_d, dir_d, _, _ = max(corner, key=lambda r: r[0])
sh.note(f"Governing for the corner leg: {dir_d} ({leg_d} leg, {case_d}).")
src = f"frame analyses x and y, {case_d}, {dir_d}"
add_result_given(sh, "M_diag", Q_(M_d, "lbf*in"), f"Resultant base moment, {leg_d} leg (round leg)", src)
add_result_given(sh, "V_diag", Q_(V_d, "lbf"), f"Resultant base shear, {leg_d} leg", src)
add_result_given(sh, "P_diag", Q_(P_d, "lbf"), f"Axial force in the {leg_d} leg (compression +)", src)
sh.step("M_diag2", "B_2_st*M_diag", "Resultant base moment, second order", unit="lbf*in", ref="AISC 360-16 Eq. A-8-1")
sh.step("P_diag2", "B_2_st*P_diag", "Axial force, second order", unit="lbf", ref="AISC 360-16 Eq. A-8-2")
check_member(sh, leg_shape, L="H", K=float(K_leg), P="P_diag2", M_x="M_diag2", V="V_diag", material="A53 Gr B", F_y="F_y",
             E="E_s", suffix="diag")

sh.heading("Sway of the stand")
add_result_given(sh, "Delta_s", sway, "Top rail sway under D + 0.6W (larger direction)", "frame analysis, AC5+")
add_deflection_check(sh, "Delta_s", "H", "H/100", title="Stand sway H/100")
sh

# %% [markdown]
# ## Stand base: leg base plate and anchorage to the concrete pad
#
# ACI 318-19 Chapter 17 is strength design, so the leg base forces are taken from the strength
# combinations of ASCE 7-16 Sec. 2.3 (the same two frame analyses, superposed per combination)
# for wind and seismic in x, in y and on the diagonal. The leg whose corner rod is pulled hardest
# governs: once for the wind and gravity combinations, once for the seismic ones (ASCE 7-16
# 13.4, ACI 318-19 17.10 with the component's Ω_0p).

# %%
base = Sheet(calc_heading("Rooftop stand: leg base plate and anchorage", calc_title, member_mark, "stand base"), method="LRFD",
             meta={"member": member_mark})
base.assume("Each leg stands on a square base plate with four cast-in headed anchor rods (square pattern) in a concrete pad; "
            "the pad is thick and wide enough for the edge distances and thickness stated.")
base.assume("Strength-level forces (ASCE 7-16 Sec. 2.3, LRFD) from the frame analyses of the stand sheet; the corner leg takes "
            "both frame lines' moments at once.")
base.assume("Anchor rods: rigid plate on four rods without bearing for the rod forces (conservative when the leg is in "
            "tension); every rod of the group taken at the corner rod's force for the concrete checks (ψ_ec,N = 1, conservative).")
lrfd = basic_combinations("LRFD", ["D", "W", "E"], S_DS=S_DS)
BASE_SPLITS = {"W": [("wind x", 1.0, 0.0), ("wind y", 0.0, 1.0)] + DIRECTIONS["W"],
               "E": [("seismic x", 1.0, 0.0), ("seismic y", 0.0, 1.0)] + DIRECTIONS["E"]}
f_in = parse_quantity(rod_f, "rod_f").to("in").magnitude
k_att = max(float(R_p) / 6.0, 1.0)  # ASCE 7-16 13.4.1: R_p at most 6 for the attachment force
if k_att > 1.0:
    base.note(f"R_p = {float(R_p):g} > 6: the seismic forces on the attachment are multiplied by R_p/6 = {k_att:.3g} "
              "(ASCE 7-16 13.4.1, R_p not larger than 6 for the attachment).")
rows = []  # (T_1 lbf, kind, combination, direction, leg, N_t, M_x, M_y, V)
for c in lrfd:
    lateral = "E" if c.factors.get("E", 0.0) else "W"
    splits = BASE_SPLITS[lateral] if c.factors.get(lateral, 0.0) else [("gravity", 0.0, 0.0)]
    for label, kx, ky in splits:
        for m in ("windward", "leeward"):
            factors = {k: v * (k_att if k == "E" else 1.0) for k, v in c.factors.items()}
            M_r, V_r, P_r, Mx, My = corner_forces(factors, m, lateral, kx, ky)
            rows.append((-P_r / 4 + (abs(Mx) + abs(My)) / (4 * f_in), "seismic" if lateral == "E" and c.factors.get("E") else
                         "wind and gravity", c.name, label, m, -P_r, Mx, My, V_r))
base.note("Combinations: " + "; ".join(f"{c.name} = {c.label()} ({c.ref})" for c in lrfd))
gov = {kind: max((r for r in rows if r[1] == kind), key=lambda r: r[0]) for kind in ("wind and gravity", "seismic")}
comp = max(rows, key=lambda r: (-r[5]) + (r[6]**2 + r[7]**2) ** 0.5 / parse_quantity(plate_B, "plate_B").to("in").magnitude * 6)
base.table("Leg base forces of the governing rows (strength level)", [
    [why, r[2], r[3], r[4], Q_(r[5], "lbf"), Q_(r[6], "lbf*in").to("kip*in"), Q_(r[7], "lbf*in").to("kip*in"), Q_(r[8], "lbf"),
     Q_(r[0], "lbf")] for why, r in (("largest rod tension, wind and gravity", gov["wind and gravity"]),
                                     ("largest rod tension, seismic", gov["seismic"]), ("bearing: compression with moment", comp))],
    columns=["governs", "combination", "direction", "leg", "N_t (uplift +)", "M_x", "M_y", "V", "corner rod T_1"],
    note="Every combination of ASCE 7-16 Sec. 2.3 with W or E in each direction (x, y, diagonal; seismic also 100 %/30 %) "
         "and both legs of each frame line were computed; these rows govern.")
base.heading("Leg base plate")
base.given("D_leg", D_o, "Leg outside diameter")
for key, r in (("w", gov["wind and gravity"]), ("e", gov["seismic"])):
    src = f"frame analyses x and y, {r[2]}, {r[3]}"
    add_result_given(base, f"N_t{key}", Q_(r[5], "lbf"), f"Axial tension in the {r[4]} leg (uplift +), {r[1]}", src)
    add_result_given(base, f"M_x{key}", Q_(r[6], "lbf*in"), f"Base moment about x, {r[1]}", src)
    add_result_given(base, f"M_y{key}", Q_(r[7], "lbf*in"), f"Base moment about y, {r[1]}", src)
    add_result_given(base, f"V_{key}", Q_(r[8], "lbf"), f"Resultant base shear, {r[1]}", src)
    add_leg_base_uplift_check(base, N_t=f"N_t{key}", M_x=f"M_x{key}", M_y=f"M_y{key}", f=rod_f, t_p=plate_t, D_leg="D_leg",
                              material=plate_grade, suffix=key)
src = f"frame analyses x and y, {comp[2]}, {comp[3]}"
add_result_given(base, "P_c", Q_(max(-comp[5], 0.0), "lbf"), f"Axial compression in the {comp[4]} leg", src)
add_result_given(base, "M_c", Q_((comp[6]**2 + comp[7]**2) ** 0.5, "lbf*in"), "Resultant base moment (taken about one plate axis: "
                 "approximate for a biaxial moment)", src)
add_base_plate_check(base, leg_shape, P="P_c", M="M_c", B=plate_B, N=plate_B, t_p=plate_t, f_c=f_c, f=rod_f, n_rods=2,
                     d_rod=rod_d, material=plate_grade, suffix="plate")
base.step("s_rods", "2*f_a_plate", "Anchor rod spacing (square pattern)", unit="in")
for key, seismic in (("w", False), ("e", True)):
    base.step(f"N_g{key}", f"4*T_r_{key}", "Tension on the group, every rod at the corner rod's force (conservative)", unit="kip",
              ref="elastic rod group, common practice")
    add_anchorage_check(base, d_a=rod_d, h_ef=anchor_h_ef, f_c="f_c_plate", c_x1=pad_edge, c_x2=pad_edge, c_y1=pad_edge,
                        c_y2=pad_edge, h_a=pad_depth, N_ua=f"N_g{key}", V_ua=f"V_{key}", n_x=2, n_y=2, s_x="s_rods", s_y="s_rods",
                        seismic=seismic, Omega_0=Omega_0p if seismic else None, suffix=f"anchor{key}")
base.note("Component anchorage, ASCE 7-16 13.4: the attachment force comes from F_p with R_p <= 6 (13.4.1); anchors in "
          "concrete per ACI 318-19 Chapter 17 (13.4.2.1, from memory), here with Ω_0p on the whole seismic combination "
          "(17.10.5.3(d), 17.10.6.3(c)); the 20 % exemptions are not taken.")
base

# %% [markdown]
# The frame line with its loads and deflected shape, and the bending moments, for the governing
# combination (the same figures go into the submittal).

# %%
display(*(Image(f.png) for f in sh.evaluate().figures if f.title.startswith(("Frame model", "Bending moment"))))  # as drawn once for the sheet

# %%
sh.summary_frame()
