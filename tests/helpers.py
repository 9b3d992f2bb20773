"""Small builders used by several tests (each call returns new objects)."""

from __future__ import annotations

from plystack.core.model.materials import Material
from plystack.core.model.plies import Ply

IN = 0.0254
FT = 0.3048
PSI = 6894.757293168361
LBF = 4.4482216152605


def timber(mid: str = "wood", E: float = 11e9, density: float = 500.0, **values: float
           ) -> Material:
    return Material(mid, mid, "timber", E, density, "test", dict(values), "sawn")


def steel(mid: str = "steel", E: float = 200e9, density: float = 7850.0, **values: float
          ) -> Material:
    return Material(mid, mid, "steel", E, density, "test", dict(values), "steel")


def rect(name: str, material: str, x: float, y: float, w: float, h: float) -> Ply:
    return Ply(name, material, x, y, w, h)


def unit_load_deflection(L, w, pieces, x0) -> float:
    """delta(x0) of a simple span under a uniform load w, by virtual work (the unit-load
    method: delta = integral of M m / EI(x) dx, any structural analysis text), integrated
    exactly by sympy over the piecewise stiffness; pieces: (a, b, EI).
    """
    import sympy as sp

    x = sp.symbols("x")
    M = w * x * (L - x) / 2
    m = sp.Piecewise((x * (L - x0) / L, x <= x0), (x0 * (L - x) / L, True))
    total = 0
    for a, b, EI in pieces:
        for lo, hi in ((a, min(b, x0)), (max(a, x0), b)):
            if hi > lo:
                total += sp.integrate(M * m / EI, (x, lo, hi))
    return float(total)
