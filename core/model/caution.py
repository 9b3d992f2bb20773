"""The caution shown with every verdict, on screen and on paper (see the domain brief)."""

CAUTION = (
    "Caution: these results depend on the inputs and the stated assumptions. They must be "
    "checked by a licensed professional; local building codes and the authority having "
    "jurisdiction govern."
)

#: Assumptions that commonly fail in practice, named with every result.
ASSUMPTIONS = (
    "Plane sections remain plane: strain is linear over the depth.",
    "Every ply is linear elastic.",
    "The plies are fully connected (no slip): full composite action needs enough fasteners.",
    "Bending about the horizontal axis from vertical loads only.",
    "Steel plates are braced against buckling by the timbers.",
    "Existing timber may be decayed, notched or of unknown grade: verify it on site.",
)

#: Fire: what the published methods are; Plystack makes no fire check (from memory).
FIRE_NOTE = (
    "Fire: Plystack makes no fire check. Published methods for timber in fire: EN 1995-1-2 "
    "3.4 charring rates (softwood: one-dimensional beta_0 = 0.65 mm/min; notional beta_n "
    "= 0.8 mm/min for solid timber, 0.7 mm/min for glulam and LVL) with the reduced "
    "cross-section method (zero-strength layer k_0 d_0, d_0 = 7 mm); NDS 2018 Chapter 16 "
    "(nominal char rate beta_n = 1.5 in/h, effective char depth a_eff = 1.2 beta_n "
    "t^0.813 with t in hours). Exposed steel plates and bolts heat quickly and lose "
    "strength (about half of f_y near 600 C, EN 1993-1-2 Table 3.1): they need protection "
    "or an assessment by a qualified person. All values from memory; verify them against "
    "the current editions."
)
