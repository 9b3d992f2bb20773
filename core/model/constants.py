"""Exact conversion factors to SI, in one place (for clause equations written in US units
and for stock sizes). Definitions: 1 in = 0.0254 m exactly; 1 lbf = 4.4482216152605 N
(the international avoirdupois pound times standard gravity 9.80665 m/s^2).
"""

from __future__ import annotations

INCH = 0.0254  # m
FOOT = 12 * INCH  # m
MM = 0.001  # m
LBF = 4.4482216152605  # N
KIP = 1000 * LBF  # N
PSI = LBF / INCH**2  # Pa, 6894.757293168361
GRAVITY = 9.80665  # m/s^2, standard gravity
