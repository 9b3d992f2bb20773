"""The user's design-basis choices (the project file's "design" object).

Both bases read the same object; keys that do not apply to a basis are ignored by it.
"""

from __future__ import annotations

from collections.abc import Mapping
from dataclasses import dataclass, field

from .constants import PSI

BASES = ("US-ASD", "EU-LSD")
STEEL_RULES = ("0.6Fy", "AISC-F11")
TEMPERATURES = ("normal", "up-to-125F", "up-to-150F")


#: Connector types of stacked plies ("bolt", "screw" and "nail" first, as before).
CONNECTOR_TYPES = ("screw", "bolt", "nail", "lag-screw", "glue")
#: The dowel-type connectors whose slip EN 1995-1-1 Table 7.1 gives (from memory).
MECHANICAL_CONNECTORS = ("screw", "bolt", "nail", "lag-screw")


@dataclass(frozen=True)
class Connector:
    """A connector for the interfaces of stacked plies: screw, nail or bolt, with the
    allowable (US) or design (EU) lateral load per connector in N, as the user gives it
    (already adjusted); None: the spacing check is not made. ``spacing`` in m; None: the
    tool picks the largest stock spacing that works.

    Attributes:
        type: "screw", "bolt", "nail", "lag-screw" or "glue" (glue: full composite).
        allowable: allowable (US) or design (EU) load per connector, N.
        rows: connectors at each station along the member (across the width).
        spacing: spacing of the stations along the member, m (the smallest where it
            varies).
        diameter: fastener diameter, m; given for a mechanical connector, the slip of
            the fasteners is taken into account (EN 1995-1-1 Annex B with the slip
            modulus of Table 7.1, from memory); None: full composite action is assumed.
        predrilled: nails in predrilled holes (EN 1995-1-1 Table 7.1 takes the dowel
            value for them); only read for nails.
        spacing_max: the largest spacing where the spacing varies with the shear force,
            m (at most 4 x ``spacing``); None: constant spacing.

    """

    type: str = "screw"
    allowable: float | None = None
    rows: int = 1
    spacing: float | None = None
    diameter: float | None = None
    predrilled: bool = False
    spacing_max: float | None = None

    @property
    def slips(self) -> bool:
        """True where the fasteners' slip is analysed (a mechanical type with a diameter)."""
        return self.type in MECHANICAL_CONNECTORS and self.diameter is not None


@dataclass(frozen=True)
class Bolt:
    """Through-bolt of a flitch beam (NDS 12.3.1 yield limit equations).

    Attributes:
        diameter: m.
        Fyb: bolt bending yield strength, Pa (45,000 psi typical, from memory of NDS
            Table 12.3.3 footnote).
        rows: bolts across the depth at each bolt location.
        fu: bolt tensile strength for EN 1995-1-1 (8.30) and the steel side of the bolt
            (AISC 360-16 J3.6, EN 1993-1-8 Table 3.4), Pa (grade 4.6: 400 MPa, EN
            1993-1-8 Table 3.1, from memory).
        spacing: spacing of bolt locations along the member, m; None: the tool picks the
            largest stock spacing that works.
        row_heights: heights y of the bolt rows (the section's y, m), given in the file
            as a list under "rows"; empty: ``rows`` rows placed by the tool.
        stations: explicit positions of the bolt locations along the member (m from its
            left end); empty: placed at ``spacing`` from ``end_distance``.
        stagger: True where neighbouring rows take alternate stations (rows 1, 3, ... at
            stations 1, 3, ...; rows 2, 4, ... at stations 2, 4, ...).
        end_distance: from the end of the plate to the first and last station, m; None:
            the stations are centred on the plate.

    """

    diameter: float = 0.0127
    Fyb: float = 45000 * PSI
    rows: int = 2
    fu: float = 400e6
    spacing: float | None = None
    row_heights: tuple[float, ...] = ()
    stations: tuple[float, ...] = ()
    stagger: bool = False
    end_distance: float | None = None

    @property
    def row_count(self) -> int:
        """Rows of bolts: the given heights, or ``rows``."""
        return len(self.row_heights) or self.rows


@dataclass(frozen=True)
class VibrationSpec:
    """Floor vibration inputs (the design file's "vibration" object; SI).

    Attributes:
        spacing: joist spacing s, m: the floor's mass and stiffness per metre width are
            the member's divided by it.
        floor_width: b, the floor's width across the joists, m (EN 7.3.3 velocity).
        damping: modal damping ratio zeta (EN 1995-1-1 7.3.1(5): 0.01).
        transverse_EI: (EI)_b, the floor's bending stiffness across the joists per metre
            of length, N m^2/m (EN 7.3.3 velocity).
        a: EN 1995-1-1 (7.3) limit of w/F, m/N; None for the stated default.
        b: EN 1995-1-1 (7.4) constant b; None for the stated default.
        frequency_min: US common-practice minimum frequency, Hz; None for the default.
        point_load: US common-practice concentrated load, N; None for the default.
        point_deflection_limit: US common-practice deflection limit under that load, m;
            None for the default.

    """

    spacing: float
    floor_width: float | None = None
    damping: float = 0.01
    transverse_EI: float | None = None
    a: float | None = None
    b: float | None = None
    frequency_min: float | None = None
    point_load: float | None = None
    point_deflection_limit: float | None = None


@dataclass(frozen=True)
class DesignSpec:
    """Design basis and options.

    Attributes:
        basis: "US-ASD" or "EU-LSD".
        wet_service: NDS C_M for wet service; K_cr 2.0 instead of 1.5.
        fabricated_wet: the timber is fabricated wet and used dry (NDS 2018 Table 11.3.3
            C_M = 0.4 for bolt groups, from memory).
        temperature: NDS Table 2.3.3 range for C_t.
        repetitive_member: NDS 4.3.9 C_r = 1.15.
        incised: NDS 4.3.8 C_i.
        compression_edge_braced: True gives C_L = 1.0 (the user's declaration).
        unbraced_length: m, for C_L / k_crit where an edge is not braced (both edges
            unless ``unbraced_length_bottom`` is given).
        unbraced_length_bottom: m, for the bottom edge in compression (hogging moment).
        bottom_edge_braced: True where the bottom edge is braced (the user's declaration).
        stability_width: "ply" (each timber ply's own width) or "member" (the user
            declares the plies act as one for lateral stability).
        plate_unbraced_length: m, L_b of steel plates (None: braced between two timbers,
            the fastener spacing on a face).
        load_level: where the loads act for lateral stability: "top" (gravity loads on
            the top edge, the default), "centroid" or "bottom" (EN 1995-1-1 6.3.3(3)).
        live_limit: span / this for live-load deflection.
        total_limit: span / this for total-load deflection.
        long_term_limit: span / this for long-term (creep) deflection.
        K_cr: NDS 3.5.2 creep factor; None for the default (1.5, 2.0 wet).
        k_def: EN 1995-1-1 Table 3.2; None for the default of the service class.
        steel_rule: "0.6Fy" or "AISC-F11".
        service_class: EN 1995-1-1 2.3.1.3 (1, 2 or 3).
        psi: EN 1990 psi factors per case, overriding Table A1.1.
        overrides: per ply name, factor symbol -> value, replacing what the tool derives.
        connector: for the interfaces of stacked plies.
        bolt: for flitch (side-by-side) plies.
        steel_bears: True where steel plies bear on the supports (their own seats).
        en1990_expression: "6.10" or "6.10a/b" (EN 1990 6.4.3.2(3), from memory).
        vibration: floor vibration inputs; None: no vibration checks.

    """

    basis: str = "US-ASD"
    wet_service: bool = False
    temperature: str = "normal"
    repetitive_member: bool = False
    incised: bool = False
    compression_edge_braced: bool = True
    unbraced_length: float | None = None
    live_limit: float | None = None
    total_limit: float | None = None
    long_term_limit: float | None = None
    K_cr: float | None = None
    k_def: float | None = None
    steel_rule: str = "0.6Fy"
    service_class: int = 1
    psi: Mapping[str, tuple[float, float, float]] = field(default_factory=dict)
    overrides: Mapping[str, Mapping[str, float]] = field(default_factory=dict)
    connector: Connector = field(default_factory=Connector)
    bolt: Bolt = field(default_factory=Bolt)
    steel_bears: bool = False
    en1990_expression: str = "6.10"
    vibration: VibrationSpec | None = None
    unbraced_length_bottom: float | None = None
    bottom_edge_braced: bool = False
    stability_width: str = "ply"
    plate_unbraced_length: float | None = None
    load_level: str = "top"
    fabricated_wet: bool = False

    @property
    def us(self) -> bool:
        """True for the US allowable stress basis."""
        return self.basis == "US-ASD"

    def deflection_limits(self) -> tuple[float, float, float]:
        """(live, total, long-term) span ratios with the basis's defaults: US L/360 live and
        L/240 total (IBC 2018 Table 1604.3, floors, from memory); EU L/300 (common
        practice; national annexes vary).
        """
        if self.us:
            live = self.live_limit or 360.0
            total = self.total_limit or 240.0
        else:
            live = self.live_limit or 300.0
            total = self.total_limit or 300.0
        return live, total, self.long_term_limit or total
