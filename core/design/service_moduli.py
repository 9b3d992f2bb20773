"""The timber modulus a US-ASD member's stiffness uses: E' = E C_M C_t C_i (NDS 2018
4.3.1 and Table 4.3.1 for sawn lumber, 5.3.1 and Table 5.3.1 for glulam, from memory:
the adjusted modulus of elasticity, with the wet service factor C_M of NDS Supplement
Table 4A/5A, the temperature factor C_t of Table 2.3.3 and the incising factor C_i of
Table 4.3.8). EN 1995-1-1 has no such factor on E_mean: its service class acts through
k_def on the long-term part only, so an EU-LSD basis keeps the materials' moduli.

The adjusted modulus feeds the transformed section, hence the deflections, the split of
moment between the plies and the stresses. E'min (beam stability) is adjusted
separately by the checks from the record's Emin.
"""

from __future__ import annotations

import math
from collections.abc import Mapping
from dataclasses import replace

from ..codes import nds
from ..model.design import DesignSpec
from ..model.materials import Material

#: Where the factors on E come from (shown beside E' on the sheet).
S_E_PRIME = ("NDS 2018 4.3.1 / 5.3.1: E' = E C_M C_t C_i (C_M Supplement Table 4A/5A, C_t "
             "Table 2.3.3, C_i Table 4.3.8; from memory)")


def modulus_factors(mat: Material, design: DesignSpec) -> dict[str, float]:
    """The NDS factors on E of a timber material (each 1.0 where it does not apply);
    empty for steel and other materials and for an EU-LSD basis.
    """
    if not design.us or mat.kind != "timber":
        return {}
    wet, temp = design.wet_service, design.temperature
    return {"C_M": nds.C_M("E", mat.product, wet), "C_t": nds.C_t("E", temp, wet),
            "C_i": nds.C_i("E", design.incised)}


def service_materials(materials: Mapping[str, Material],
                      design: DesignSpec) -> Mapping[str, Material]:
    """``materials`` with each timber modulus E replaced by E' where a factor on it is
    not 1 (:attr:`Material.E_factors` then holds the factors and ``E_reference`` the
    record's E); the mapping itself where none changes.
    """
    if not design.us or not (design.wet_service or design.incised
                             or design.temperature != "normal"):
        return materials  # every factor on E is 1.0
    out: dict[str, Material] = {}
    changed = False
    for mid, mat in materials.items():
        f = modulus_factors(mat, design)
        k = math.prod(f.values())
        if f and k != 1.0:
            changed = True
            mat = replace(mat, E=mat.E * k, E_factors=f, E_reference=mat.E)
        out[mid] = mat
    return out if changed else materials
