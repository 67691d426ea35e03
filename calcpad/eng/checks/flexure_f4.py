"""Flexure of doubly symmetric I-shapes with noncompact webs about the major axis, AISC 360-16
F4 (from memory): compression flange yielding (F4-1), lateral-torsional buckling (F4-2, F4-3)
and compression flange local buckling (F4-13, F4-14), with the web plastification factor R_pc.

For a doubly symmetric section S_xc = S_xt, so tension flange yielding (F4.4) does not govern
and F_L = 0.7 F_y (Eq. F4-6a). Welded I-sections built from plates are the usual case; rolled
W-shapes have compact webs (F2/F3).
"""

from __future__ import annotations

from calcpad.eng.checks._common import Calc
from calcpad.eng.checks._section import Sec

__all__ = ["write_f4"]


def write_f4(calc: Calc, sec: Sec, braced_len: bool) -> None:
    """Write the F4 limit states; the classification (λ_f, λ_w and their limits) is on the sheet."""
    d, tf, tw = sec.need("d", "F4"), sec.need("tf", "F4"), sec.need("tw", "F4")
    calc.prop("b_f", sec.need("bf", "F4"), "in", "Flange width", sec)
    calc.prop("t_f", tf, "in", "Flange thickness", sec)
    calc.prop("t_w", tw, "in", "Web thickness", sec)
    calc.step("h_c", "lambda_w*t_w", "Web depth in compression x 2 (doubly symmetric: h)", unit="in", ref="AISC 360-16 F4")
    calc.step("M_yc", "F_y*S", "Yield moment of the compression flange side", unit="kip*ft", ref="AISC 360-16 Eq. F4-4")
    calc.step("M_p", "min(F_y*Z, 1.6*F_y*S)", "Plastic moment", unit="kip*ft", ref="AISC 360-16 F4.1")
    calc.branch(
        "R_pc",
        [("lambda_w <= lambda_pw", "M_p/M_yc", "compact web, Eq. F4-9a"),
         (None, "min(M_p/M_yc - (M_p/M_yc - 1)*(lambda_w - lambda_pw)/(lambda_rw - lambda_pw), M_p/M_yc)", "noncompact web, Eq. F4-9b")],
        "Web plastification factor",
        ref="AISC 360-16 F4.1",
    )
    calc.step("F_L", "0.7*F_y", "Nominal compression flange stress, S_xt/S_xc = 1 >= 0.7", unit="ksi", ref="AISC 360-16 Eq. F4-6a")
    calc.step("M_n_CFY", "R_pc*M_yc", "Compression flange yielding", unit="kip*ft", ref="AISC 360-16 Eq. F4-1")
    cands = {"M_n_CFY": "compression flange yielding (F4.1)"}
    if braced_len:
        calc.prop("J", sec.need("J", "F4"), "in**4", "Torsional constant", sec)
        calc.prop("h_o", d - tf, "in", "Distance between flange centroids, d - tf", sec)
        calc.step("a_w", "h_c*t_w/(b_f*t_f)", "Web-to-flange area ratio", ref="AISC 360-16 Eq. F4-12")
        calc.step("r_t", "b_f/sqrt(12*(1 + a_w/6))", "Effective radius of gyration for LTB", unit="in", ref="AISC 360-16 Eq. F4-11")
        calc.step("L_p", "1.1*r_t*sqrt(E/F_y)", "Limiting length, yielding", unit="ft", ref="AISC 360-16 Eq. F4-7")
        calc.step("L_r", "1.95*r_t*E/F_L*sqrt(J/(S*h_o) + sqrt((J/(S*h_o))**2 + 6.76*(F_L/E)**2))", "Limiting length, inelastic LTB",
                  unit="ft", ref="AISC 360-16 Eq. F4-8")
        calc.step("F_cr_LTB", "C_b*pi**2*E/(L_b/r_t)**2*sqrt(1 + 0.078*J/(S*h_o)*(L_b/r_t)**2)", "Elastic LTB stress", unit="ksi",
                  ref="AISC 360-16 Eq. F4-5")
        calc.branch(
            "M_n_LTB",
            [("L_b <= L_p", "R_pc*M_yc", "L_b <= L_p, no lateral-torsional buckling"),
             ("L_b <= L_r", "min(C_b*(R_pc*M_yc - (R_pc*M_yc - F_L*S)*(L_b - L_p)/(L_r - L_p)), R_pc*M_yc)", "inelastic LTB, Eq. F4-2"),
             (None, "min(F_cr_LTB*S, R_pc*M_yc)", "elastic LTB, Eq. F4-3")],
            "Lateral-torsional buckling",
            unit="kip*ft",
            ref="AISC 360-16 F4.2",
        )
        cands["M_n_LTB"] = "lateral-torsional buckling (F4.2)"
    else:
        calc.sh.note("Compression flange continuously braced: lateral-torsional buckling (F4.2) does not apply.")
    calc.step("k_c", "min(max(4/sqrt(lambda_w), 0.35), 0.76)", "Flange buckling coefficient", ref="AISC 360-16 Table B4.1b note [a]")
    calc.branch(
        "M_n_FLB",
        [("lambda_f <= lambda_pf", "R_pc*M_yc", "compact flanges, no flange local buckling"),
         ("lambda_f <= lambda_rf", "R_pc*M_yc - (R_pc*M_yc - F_L*S)*(lambda_f - lambda_pf)/(lambda_rf - lambda_pf)",
          "noncompact flanges, Eq. F4-13"),
         (None, "0.9*E*k_c*S/lambda_f**2", "slender flanges, Eq. F4-14")],
        "Compression flange local buckling",
        unit="kip*ft",
        ref="AISC 360-16 F4.3",
    )
    cands["M_n_FLB"] = "compression flange local buckling (F4.3)"
    calc.sh.note("Doubly symmetric: S_xt = S_xc, so tension flange yielding (F4.4) does not govern.")
    calc.select("M_n", "min", cands, "Nominal flexural strength", unit="kip*ft")
