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
