"""Materials and the material library.

A material record in a file uses the trade's own symbols as keys: "kind", "name", "E",
"density", "source"; US timber reference values "Fb", "Ft", "Fv", "Fc", "Fc_perp",
"Emin", "G"; European timber characteristic values "fm_k", "ft0_k", "fv_k", "fc0_k",
"fc90_k", "rho_k", and for LVL its declared size effect exponent "s" (EN 1995-1-1
3.4(5)); steel "Fy", "Fu". Inside ``core`` all values are SI floats.
"""

from __future__ import annotations

from collections.abc import Mapping
from dataclasses import dataclass, field
from typing import Any

from . import units
from .errors import Problem, shown

KINDS = ("timber", "steel", "other")

#: Design-value keys whose values are stresses (or moduli), parsed as stresses.
STRESS_KEYS = (
    "Fb", "Fb_neg", "Ft", "Fv", "Fc", "Fc_perp", "Emin",
    "fm_k", "ft0_k", "fv_k", "fc0_k", "fc90_k", "E0_05",
    "Fy", "Fu",
)
#: Keys parsed as densities.
DENSITY_KEYS = ("rho_k",)
#: Plain numbers, with the open range each must lie in and what it is.
NUMBER_RANGES = {"G": (0.0, 2.0, ""), "s": (0.0, 1.0, " (the LVL's declared size effect "
                                                  "exponent)")}
NUMBER_KEYS = tuple(NUMBER_RANGES)
#: Text keys.
TEXT_KEYS = ("name", "kind", "source", "product", "notes", "grade_rule")
#: Flags.
FLAG_KEYS = ("size_adjusted",)
ALL_KEYS = frozenset(
    ("E", "density", "sources", *STRESS_KEYS, *DENSITY_KEYS, *NUMBER_KEYS, *TEXT_KEYS,
     *FLAG_KEYS)
)

#: Timber products: sawn lumber, glued laminated timber, laminated veneer lumber.
PRODUCTS = ("sawn", "glulam", "lvl", "steel", "aluminium", "other")
#: Strength values an existing-timber condition factor multiplies (not moduli, density,
#: G or rho_k).
STRENGTH_KEYS = ("Fb", "Fb_neg", "Ft", "Fv", "Fc", "Fc_perp",
                 "fm_k", "ft0_k", "fv_k", "fc0_k", "fc90_k")
#: Keys of an existing-timber record.
EXISTING_KEYS = ("existing", "name", "notes")
VERIFY_ON_SITE = "existing timber: verify its grade and condition on site"


@dataclass(frozen=True)
class Existing:
    """Existing timber of unknown grade, taken as the grade ``assumed`` (a material id)
    with its strengths times ``condition_factor`` (0 < factor <= 1, the user's judgement).
    """

    assumed: str
    condition_factor: float = 1.0


@dataclass(frozen=True)
class Material:
    """One material with its stiffness, density and design values (SI).

    Attributes:
        id: key used by plies.
        name: readable name.
        kind: "timber", "steel" or "other".
        E: elastic modulus used for stiffness, Pa (mean/reference value).
        density: mass density, kg/m^3.
        source: where the record comes from, or "user".
        values: design values keyed by the trade's symbol, Pa (G is dimensionless,
            rho_k kg/m^3).
        product: "sawn", "glulam", "lvl", "steel", "aluminium" or "other".
        size_adjusted: True where tabulated values already include size (NDS Table 4B).
        sources: per-value sources where they differ from ``source``.
        notes: free text shown with the record.
        existing: for existing timber of unknown grade, the assumed grade and condition
            factor its values come from; None otherwise.
        grade_rule: the grading rule the values belong to (text), kept for the file.
        E_factors: where ``E`` is an adjusted modulus made for a design basis (US-ASD
            E' = E C_M C_t C_i, ``design.service_moduli``), the factors by symbol; empty
            for a record as read.
        E_reference: the record's own E where ``E`` is adjusted; None otherwise.

    """

    id: str
    name: str
    kind: str
    E: float
    density: float
    source: str = "user"
    values: Mapping[str, float] = field(default_factory=dict)
    product: str = "other"
    size_adjusted: bool = False
    sources: Mapping[str, str] = field(default_factory=dict)
    notes: str = ""
    grade_rule: str = ""
    existing: Existing | None = None
    E_factors: Mapping[str, float] = field(default_factory=dict)
    E_reference: float | None = None

    def value(self, key: str) -> float | None:
        """Return design value ``key`` or None where the record has none."""
        return self.values.get(key)

    def source_of(self, key: str) -> str:
        """Return the source of value ``key`` (its own, or the record's)."""
        return self.sources.get(key, self.source)


def material_from_record(mid: str, record: Any, path: str) -> tuple[Material | None, list[Problem]]:
    """Parse one material record from a file. Returns (material or None, problems)."""
    problems: list[Problem] = []
    if not isinstance(record, dict):
        return None, [Problem(path, "must be an object with the material's values")]
    for key in record:
        if key not in ALL_KEYS:
            problems.append(Problem(f"{path}.{key}", "is not a known material key"))
    kind = record.get("kind")
    if kind not in KINDS:
        problems.append(Problem(f"{path}.kind", f"must be one of {', '.join(KINDS)}"))
    E = density = 0.0
    if "E" not in record:
        problems.append(Problem(f"{path}.E", "is missing"))
    else:
        try:
            E = units.parse(record["E"], "modulus", f"{path}.E")
            if E <= 0:
                problems.append(Problem(f"{path}.E", "must be greater than zero"))
        except units.UnitError as exc:
            problems.append(units.problem(exc))
    if "density" in record:
        try:
            density = units.parse(record["density"], "density", f"{path}.density")
            if density < 0:
                problems.append(Problem(f"{path}.density", "must not be negative"))
        except units.UnitError as exc:
            problems.append(units.problem(exc))
    values: dict[str, float] = {}
    for key in STRESS_KEYS + DENSITY_KEYS:
        if key in record:
            dim = "density" if key in DENSITY_KEYS else "stress"
            try:
                v = units.parse(record[key], dim, f"{path}.{key}")
                if v <= 0:
                    problems.append(Problem(f"{path}.{key}", "must be greater than zero"))
                values[key] = v
            except units.UnitError as exc:
                problems.append(units.problem(exc))
    for key, (lo, hi, what) in NUMBER_RANGES.items():
        if key not in record:
            continue
        v = record[key]
        if isinstance(v, bool) or not isinstance(v, int | float) or not lo < v < hi:
            problems.append(Problem(f"{path}.{key}", f"must be a plain number between "
                                    f"{lo:g} and {hi:g}{what}"))
        else:
            values[key] = float(v)
    for key in ("name", "source", "product", "notes", "grade_rule"):
        if key in record and not isinstance(record[key], str):
            problems.append(Problem(f"{path}.{key}", "must be text"))
    product = record.get("product", _default_product(kind))
    if isinstance(product, str) and product not in PRODUCTS:
        problems.append(Problem(f"{path}.product", f"must be one of {', '.join(PRODUCTS)}"))
    size_adjusted = record.get("size_adjusted", False)
    if not isinstance(size_adjusted, bool):
        problems.append(Problem(f"{path}.size_adjusted", "must be true or false"))
    sources = record.get("sources", {})
    if not isinstance(sources, dict) or not all(
        isinstance(k, str) and isinstance(v, str) for k, v in sources.items()
    ):
        problems.append(Problem(f"{path}.sources", "must map value keys to source text"))
        sources = {}
    if problems:
        return None, problems
    return (
        Material(
            id=mid,
            name=str(record.get("name", mid)),
            kind=str(kind),
            E=E,
            density=density,
            source=str(record.get("source", "user")),
            values=values,
            product=str(product),
            size_adjusted=bool(size_adjusted),
            sources=dict(sources),
            notes=str(record.get("notes", "")),
            grade_rule=str(record.get("grade_rule", "")),
        ),
        [],
    )


def _default_product(kind: Any) -> str:
    return {"timber": "sawn", "steel": "steel"}.get(kind if isinstance(kind, str) else "", "other")


def existing_from_record(mid: str, record: dict[str, Any], known: Mapping[str, Material],
                         path: str) -> tuple[Material | None, list[Problem]]:
    """Resolve an existing-timber record against the materials it may assume (the library
    and the project's own ordinary records). Returns (material or None, problems).
    """
    problems = [Problem(f"{path}.{key}", "is not a key of an existing-timber record (its "
                        "values come from the assumed grade); use " + ", ".join(EXISTING_KEYS))
                for key in record if key not in EXISTING_KEYS]
    spec = record["existing"]
    if not isinstance(spec, dict):
        return None, [*problems, Problem(f"{path}.existing", 'must be an object such as '
                                         '{"assumed": "DFL-No2", "condition_factor": 0.9}')]
    for key in spec:
        if key not in ("assumed", "condition_factor"):
            problems.append(Problem(f"{path}.existing.{key}", "is not one of assumed, "
                                    "condition_factor"))
    grade = spec.get("assumed")
    assumed = known.get(grade) if isinstance(grade, str) else None
    if assumed is None or assumed.kind != "timber":
        problems.append(Problem(f"{path}.existing.assumed", f"{shown(grade)} is not a known timber "
                                "grade (the lower-bound grade the existing timber is taken as)"))
    elif assumed.existing is not None:
        problems.append(Problem(f"{path}.existing.assumed", f"{shown(grade)} is itself existing "
                                "timber; assume a graded material"))
    k = spec.get("condition_factor", 1.0)
    if isinstance(k, bool) or not isinstance(k, int | float) or not 0 < k <= 1:
        problems.append(Problem(f"{path}.existing.condition_factor", f"{shown(k)} must be a plain "
                                "number greater than 0 and at most 1"))
    for key in ("name", "notes"):
        if key in record and not isinstance(record[key], str):
            problems.append(Problem(f"{path}.{key}", "must be text"))
    if problems or assumed is None:
        return None, problems
    return existing_material(mid, assumed, float(k), record.get("name"),
                             str(record.get("notes", ""))), []


def existing_material(mid: str, assumed: Material, factor: float, name: str | None = None,
                      notes: str = "") -> Material:
    """Existing timber taken as grade ``assumed`` with its strengths times ``factor``."""
    said = f"condition factor {factor:g} (the user's judgement); {VERIFY_ON_SITE}"
    values = {key: v * factor if key in STRENGTH_KEYS else v
              for key, v in assumed.values.items()}
    sources = {key: f"{assumed.source_of(key)}; assumed grade {assumed.id} of existing timber, "
               f"times {said}" for key in values if key in STRENGTH_KEYS}
    return Material(
        id=mid, name=name if name is not None else default_existing_name(assumed),
        kind="timber", E=assumed.E, density=assumed.density,
        source=f"existing timber of unknown grade, assumed {assumed.name} ({assumed.id}: "
               f"{assumed.source}), strengths times {said}",
        values=values, product=assumed.product, size_adjusted=assumed.size_adjusted,
        sources={**assumed.sources, **sources}, notes=notes,
        existing=Existing(assumed.id, factor))


def default_existing_name(assumed: Material) -> str:
    """The name of an existing-timber material that was given none."""
    return f"existing, assumed {assumed.name}"


#: Order of the groups a material browser lists (basis, then product).
BASIS_ORDER = ("US", "EU", "US and EU", "any")
PRODUCT_WORDS = {"sawn": "sawn timber", "glulam": "glued laminated timber",
                 "lvl": "structural composite lumber (LVL, PSL)", "steel": "steel",
                 "aluminium": "aluminium", "other": "other"}


def basis_of(m: Material) -> str:
    """The design basis a material's values serve: timber by its values (NDS reference
    values "US", EN characteristic values "EU"), metals by the standard their source
    names (ASTM "US", EN "EU"); "any" otherwise.
    """
    if m.kind == "timber":
        us, eu = "Fb" in m.values, "fm_k" in m.values
        return "US and EU" if us and eu else "US" if us else "EU" if eu else "any"
    text = f"{m.name} {m.source}"
    if "ASTM" in text:
        return "US"
    if "EN " in text:
        return "EU"
    return "any"


def grouped(materials: Mapping[str, Material]) -> list[tuple[str, str, list[Material]]]:
    """Materials in groups (basis, product words, materials by id), in a browser's order."""
    groups: dict[tuple[str, str], list[Material]] = {}
    for mid in sorted(materials):
        m = materials[mid]
        groups.setdefault((basis_of(m), m.product), []).append(m)
    products = list(PRODUCT_WORDS)
    order = sorted(groups, key=lambda k: (BASIS_ORDER.index(k[0]),
                                          products.index(k[1]) if k[1] in products else 99))
    return [(basis, PRODUCT_WORDS.get(product, product), groups[(basis, product)])
            for basis, product in order]
