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
