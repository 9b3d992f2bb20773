"""Partial composite action of stacked plies against hand calculations of EN 1995-1-1:2004
Annex B (the gamma method, from memory) with the slip modulus of Table 7.1 and K_u of
7.1(4) (from memory), and against the limits the method must reach (common practice):
rigid fasteners give the fully composite section, fasteners without stiffness give the
plies acting alone.

Hand calculations in N and mm, as the standard writes them. Simply supported span
l = 4000 mm, screws d = 6 mm at s = 100 mm, one per station. Timber EN 338 C24 (from
memory): E_0,mean = 11000 N/mm^2, rho_mean = 420 kg/m^3. Steel EN 10025 S275 (from memory):
E = 210000 N/mm^2.

Table 7.1, screws: K_ser = rho_m^1.5 d / 23, rho_m = sqrt(420 x 420) = 420 (7.1(2)):
    420^1.5 = 8607.43864, K_ser = 8607.43864 x 6 / 23 = 2245.41878 N/mm;
    K_u = 2/3 K_ser = 1496.94585 N/mm.
Steel to timber (7.1(3)): 2 K_ser = 4490.83755 N/mm, K_u = 2993.89170 N/mm.
"""

from __future__ import annotations

import math

import numpy as np
import pytest

from plystack.core.io.output import check_json
from plystack.core.io.project_file import from_dict
from plystack.core.model.errors import MissingCheck
from plystack.core.pipeline import run
from plystack.core.section.gamma import Joint, PartialSection, build, gamma_factor
from plystack.core.section.transformed import analyse
from tests.helpers import rect, steel, timber

PI2 = math.pi**2
L = 4000.0
S = 100.0
E_T = 11000.0
E_S = 210000.0
K_SER = 420**1.5 * 6 / 23
K_U = 2 * K_SER / 3


def project(flange: str = "C24", connector: dict | None = None, supports: str = "simple",
            spans: tuple[str, ...] = ("4 m",), basis: str = "EU-LSD",
            bottom: bool = False) -> dict:
    """Web 50 x 200 mm of C24 with a flange 100 mm wide on top (40 mm of C24 or 6 mm of
    S275), and with ``bottom`` a second flange the same below; UDL G 1 kN/m, Q 2 kN/m.
    """
    h = "40 mm" if flange == "C24" else "6 mm"
    plies = [{"name": "web", "material": "C24", "x": "25 mm", "y": "0 mm",
              "width": "50 mm", "height": "200 mm"},
             {"name": "flange", "material": flange, "x": "0 mm", "y": "200 mm",
              "width": "100 mm", "height": h}]
    if bottom:
        plies.append({"name": "bottom", "material": flange, "x": "0 mm", "y": f"-{h}",
                      "width": "100 mm", "height": h})
    conn = connector if connector is not None else {
        "type": "screw", "allowable": "2.6 kN", "rows": 1, "diameter": "6 mm",
        "spacing": "100 mm"}
    return {
        "format": "plystack", "version": 1, "title": "gamma", "display_units": "SI",
        "plies": plies,
        "beam": {"spans": list(spans), "supports": supports, "self_weight": False,
                 "loads": [{"case": "D", "type": "line", "value": "1 kN/m"},
                           {"case": "L", "type": "line", "value": "2 kN/m"}],
                 "combinations": "EN1990"},
        "design": {"basis": basis, "service_class": 1, "connector": conn}}


def annex_b_two_plies(E1: float, A1: float, I1: float, h1: float, K: float, E2: float = E_T,
                      b2: float = 50.0, h2: float = 200.0) -> tuple[float, float, float, float]:
    """Annex B for a flange 1 on a web 2: (gamma_1, a_1, a_2, (EI)_ef) in N and mm."""
    g1 = 1 / (1 + PI2 * E1 * A1 * S / (K * L**2))                       # (B.5)
    A2 = b2 * h2
    a2 = g1 * E1 * A1 * (h1 + h2) / (2 * (g1 * E1 * A1 + E2 * A2))       # (B.6)
    a1 = (h1 + h2) / 2 - a2
    EI = E1 * I1 + E2 * b2 * h2**3 / 12 + g1 * E1 * A1 * a1**2 + E2 * A2 * a2**2  # (B.1)
    return g1, a1, a2, EI


def test_slip_moduli_table_7_1():
    """K_ser and K_u of the hand calculation (N/mm), timber to timber and steel to timber."""
    a = run(from_dict(project()))
    joint = a.section.joints[0]
    assert joint.K_ser / 1e3 == pytest.approx(2245.41878, rel=1e-8)
    assert joint.K_u / 1e3 == pytest.approx(1496.94585, rel=1e-8)
    b = run(from_dict(project("S275")))
    assert b.section.joints[0].K_ser / 1e3 == pytest.approx(4490.83755, rel=1e-8)


def test_timber_flange_hand_calculation():
    """C24 flange 100 x 40 mm screwed on the web, the numbers written out.

    A_1 = 4000 mm^2, I_1 = 100 x 40^3 / 12 = 533333.3 mm^4; A_2 = 10000 mm^2,
    I_2 = 50 x 200^3 / 12 = 33.3333e6 mm^4.
    K_ser: pi^2 E_1 A_1 s / (K l^2) = 9.8696 x 11000 x 4000 x 100 / (2245.419 x 4000^2)
    = 1.208744, gamma_1 = 1 / 2.208744 = 0.4527456.
    a_2 = 0.4527456 x 4000 x 240 / (2 (0.4527456 x 4000 + 10000)) = 18.39964 mm,
    a_1 = 120 - 18.39964 = 101.60036 mm.
    (EI)_ef = 11000 (533333.3 + 33.33333e6 + 0.4527456 x 4000 x 101.60036^2
    + 10000 x 18.39964^2) = 6.154086e11 N mm^2 = 615408.6 N m^2.
    K_u: gamma_1 = 0.3554773, a_2 = 14.93876 mm, a_1 = 105.06124 mm,
    (EI)_ef = 5.697249e11 N mm^2.
    """
    a = run(from_dict(project()))
    sec = a.section
    assert isinstance(sec, PartialSection)
    g, a1, a2, EI = annex_b_two_plies(E_T, 4000.0, 100 * 40**3 / 12, 40.0, K_SER)
    assert (g, a1, a2, EI / 1e6) == pytest.approx((0.4527456, 101.60036, 18.39964, 615408.6),
                                                  rel=1e-6)
    assert sec.gamma[1] == pytest.approx(g, rel=1e-12) and sec.gamma[0] == 1.0
    assert sec.EI == pytest.approx(EI * 1e-6, rel=1e-12)        # N mm^2 -> N m^2
    gu, a1u, a2u, EIu = annex_b_two_plies(E_T, 4000.0, 100 * 40**3 / 12, 40.0, K_U)
    assert (gu, a1u, a2u, EIu / 1e6) == pytest.approx(
        (0.3554773, 105.06124, 14.93876, 569724.9), rel=1e-6)
    assert sec.gamma_uls[1] == pytest.approx(gu, rel=1e-12)
    assert sec.EI_uls == pytest.approx(EIu * 1e-6, rel=1e-12)
    # the neutral axis a_2 above the web's centroid (100 mm), with K_u
    assert sec.neutral_axis_y == pytest.approx((100 + a2u) / 1000, rel=1e-12)


def test_timber_flange_stresses_and_fastener_load():
    """(B.7)-(B.10) at M = 10 kN m and V = 8.7 kN (the ULS 1.35 G + 1.5 Q support shear
    (1.35 + 3.0) x 4 / 2 = 8.7 kN), K_u values of the test above, N and mm:
    sigma_1 = 0.3554773 x 11000 x 105.06124 x 10e6 / 5.697249e11 = 7.2107 N/mm^2;
    sigma_m,1 = 0.5 x 11000 x 40 x 10e6 / 5.697249e11 = 3.8616 N/mm^2;
    sigma_2 = 11000 x 14.93876 x 10e6 / 5.697249e11 = 2.8843, sigma_m,2 = 19.3076 N/mm^2;
    tau_2,max = 0.5 E_2 b_2 h^2 V / (b_2 (EI)_ef), h = 100 + 14.93876 = 114.93876 mm:
    0.5 x 11000 x 114.93876^2 x 8700 / 5.697249e11 = 1.10956 N/mm^2;
    F_1 = 0.3554773 x 11000 x 4000 x 105.06124 x 100 x 8700 / 5.697249e11 = 2509.35 N.
    """
    a = run(from_dict(project()))
    sec = a.section
    gu, a1, a2, EI = annex_b_two_plies(E_T, 4000.0, 100 * 40**3 / 12, 40.0, K_U)
    M, V = 10e6, 8700.0
    s1, sm1 = gu * E_T * a1 * M / EI, 0.5 * E_T * 40 * M / EI
    s2, sm2 = E_T * a2 * M / EI, 0.5 * E_T * 200 * M / EI
    assert (s1, sm1, s2, sm2) == pytest.approx((7.2107, 3.8616, 2.8843, 19.3076), rel=1e-4)
    top, bot = sec.ply_extreme_stresses(M / 1e3)                 # N m
    # sagging: the flange is in compression; the web's top above the neutral axis
    assert top[1] / 1e6 == pytest.approx(-(s1 + sm1), rel=1e-12)
    assert bot[1] / 1e6 == pytest.approx(-(s1 - sm1), rel=1e-12)
    assert top[0] / 1e6 == pytest.approx(-(sm2 - s2), rel=1e-12)
    assert bot[0] / 1e6 == pytest.approx(sm2 + s2, rel=1e-12)
    assert sec.centroid_stress(M / 1e3, 1) / 1e6 == pytest.approx(-s1, rel=1e-12)
    h = 100 + a2
    tau = 0.5 * E_T * 50 * h**2 * V / (50 * EI)
    assert tau == pytest.approx(1.10956, rel=1e-5)
    ys = np.array([sec.neutral_axis_y])
    assert sec.shear_stress(V, ys)[0, 0] / 1e6 == pytest.approx(tau, rel=1e-12)
    F = gu * E_T * 4000 * a1 * S * V / EI
    assert F == pytest.approx(2509.35, rel=1e-5)
    c = next(c for c in a.checks if c.id == "connectors")
    assert c.demand == pytest.approx(F, rel=1e-12)
    assert c.capacity == 2600.0 and c.ok
    assert c.ratio == pytest.approx(F / 2600.0, rel=1e-12)
    web_shear = max(c.demand for c in a.checks if c.id == "shear" and c.ply == "web")
    assert web_shear / 1e6 == pytest.approx(tau, rel=1e-12)


def test_timber_flange_deflection_uses_EI_ef_with_K_ser():
    """SLS characteristic G + Q: u = 5 q l^4 / (384 (EI)_ef) = 5 x 3 x 4000^4 /
    (384 x 6.154086e11) = 16.249 mm (AISC Manual beam diagrams, simple span UDL, from
    memory, with (EI)_ef of Annex B).
    """
    a = run(from_dict(project()))
    _, _, _, EI = annex_b_two_plies(E_T, 4000.0, 100 * 40**3 / 12, 40.0, K_SER)
    u = 5 * 3.0 * L**4 / (384 * EI)
    assert u == pytest.approx(16.249, rel=1e-4)
    c = next(c for c in a.checks if c.id == "deflection-total"
             and c.combination.startswith("SLS char G + Q[L]"))
    assert c.demand * 1000 == pytest.approx(u, rel=1e-9)


def test_timber_flange_long_term_stiffness():
    """Creep, service class 1 (EN 1995-1-1 Table 3.2, from memory: k_def = 0.6 for solid
    timber): E_fin = 11000 / 1.6 = 6875 N/mm^2; the joint of two timbers of the same creep
    takes 2 k_def (2.3.2.2(3), from memory): K_ser,fin = 2245.419 / 2.2 = 1020.645 N/mm.
    gamma_1 = 1 / (1 + pi^2 x 6875 x 4000 x 100 / (1020.645 x 4000^2)) = 1 / 2.662026
    = 0.3756537, (EI)_fin
    from (B.1) with these values.
    """
    a = run(from_dict(project()))
    E, K = E_T / 1.6, K_SER / 2.2
    g, _, _, EI = annex_b_two_plies(E, 4000.0, 100 * 40**3 / 12, 40.0, K, E2=E)
    assert g == pytest.approx(0.3756537, rel=1e-6)
    crept = a.beam.creep_section
    assert isinstance(crept, PartialSection)
    assert crept.gamma[1] == pytest.approx(g, rel=1e-12)
    assert crept.EI == pytest.approx(EI * 1e-6, rel=1e-12)


def test_steel_flange_hand_calculation():
    """S275 flange 100 x 6 mm screwed on the web (steel to timber, 7.1(3)).

    A_1 = 600 mm^2, I_1 = 100 x 6^3 / 12 = 1800 mm^4, K_ser = 4490.838 N/mm.
    pi^2 x 210000 x 600 x 100 / (4490.838 x 4000^2) = 1.730694, gamma_1 = 0.3662058.
    a_2 = 0.3662058 x 210000 x 600 x 206 / (2 (0.3662058 x 210000 x 600 + 11000 x 10000))
    = 30.43782 mm, a_1 = 103 - 30.43782 = 72.56218 mm.
    (EI)_ef = 210000 x 1800 + 11000 x 33.33333e6 + 0.3662058 x 210000 x 600 x 72.56218^2
    + 11000 x 10000 x 30.43782^2 = 7.119051e11 N mm^2.
    K_u = 2993.892 N/mm: gamma_1 = 0.2780824, (EI)_ef = 6.489662e11 N mm^2.
    Creep: steel does not creep, the joint takes the timber's k_def = 0.6 (2.3.2.2, from
    memory): E_2,fin = 6875 N/mm^2, K_ser,fin = 4490.838 / 1.6.
    """
    a = run(from_dict(project("S275")))
    sec = a.section
    assert isinstance(sec, PartialSection)
    g, a1, a2, EI = annex_b_two_plies(E_S, 600.0, 1800.0, 6.0, 2 * K_SER)
    assert (g, a1, a2, EI / 1e6) == pytest.approx((0.3662058, 72.56218, 30.43782, 711905.1),
                                                  rel=1e-6)
    assert sec.gamma[1] == pytest.approx(g, rel=1e-12)
    assert sec.EI == pytest.approx(EI * 1e-6, rel=1e-12)
    gu, a1u, _, EIu = annex_b_two_plies(E_S, 600.0, 1800.0, 6.0, 2 * K_U)
    assert (gu, EIu / 1e6) == pytest.approx((0.2780824, 648966.2), rel=1e-6)
    assert sec.EI_uls == pytest.approx(EIu * 1e-6, rel=1e-12)
    F = gu * E_S * 600 * a1u * S * 8700.0 / EIu
    c = next(c for c in a.checks if c.id == "connectors")
    assert c.demand == pytest.approx(F, rel=1e-12)
    gf, _, _, EIf = annex_b_two_plies(E_S, 600.0, 1800.0, 6.0, 2 * K_SER / 1.6,
                                      E2=E_T / 1.6)
    assert a.beam.creep_section.EI == pytest.approx(EIf * 1e-6, rel=1e-12)
    assert a.beam.creep_section.gamma[1] == pytest.approx(gf, rel=1e-12)


def test_two_flanges_shear_b9():
    """Web with C24 flanges 100 x 40 mm above and below (symmetric, a_2 = 0), K_u:
    gamma_1 = gamma_3 = 0.3554773, a_1 = a_3 = 120 mm, (EI)_ef = 11000 (2 x 533333.3
    + 33.33333e6 + 2 x 0.3554773 x 4000 x 120^2); tau_2,max (B.9) = (gamma_3 E_3 A_3 a_3
    + 0.5 E_2 b_2 h^2) V / (b_2 (EI)_ef) with h = 100 mm at V = 8.7 kN... (the member's
    own ULS shear, its self-weight off).
    """
    a = run(from_dict(project(bottom=True)))
    sec = a.section
    assert isinstance(sec, PartialSection)
    g = 1 / (1 + PI2 * E_T * 4000 * S / (K_U * L**2))
    EI = E_T * (2 * 100 * 40**3 / 12 + 50 * 200**3 / 12 + 2 * g * 4000 * 120**2)
    assert sec.gamma_uls[1] == pytest.approx(g, rel=1e-12)
    assert sec.gamma_uls[2] == pytest.approx(g, rel=1e-12)
    assert sec.EI_uls == pytest.approx(EI * 1e-6, rel=1e-12)
    assert sec.neutral_axis_y == pytest.approx(0.1, rel=1e-12)
    V = 8700.0
    tau = (g * E_T * 4000 * 120 + 0.5 * E_T * 50 * 100**2) * V / (50 * EI)
    assert sec.shear_stress(V, np.array([0.1]))[0, 0] / 1e6 == pytest.approx(tau, rel=1e-12)
    forces = sorted(c.demand for c in a.checks if c.id == "connectors")
    F = g * E_T * 4000 * 120 * S * V / EI
    assert forces == pytest.approx([F, F], rel=1e-12)


def _plain_and_partial(K: float) -> tuple:
    mats = {"wood": timber("wood", E=11e9, density=420.0),
            "steel": steel("steel", E=210e9)}
    plies = (rect("web", "wood", 0.025, 0.0, 0.05, 0.2),
             rect("flange", "wood", 0.0, 0.2, 0.1, 0.04),
             rect("plate", "steel", 0.0, -0.006, 0.1, 0.006))
    plain = analyse(plies, mats)
    part = build(plain, 0, (Joint(1, K, 0.1, 0.1), Joint(2, K, 0.1, 0.1)), 4.0)
    return plain, part


def test_rigid_fasteners_give_the_composite_section():
    """K -> infinity: gamma -> 1 and every result equals the transformed section's
    (common practice: Annex B with gamma = 1 is the fully composite section).
    """
    plain, part = _plain_and_partial(1e40)
    assert part.EI == pytest.approx(plain.EI, rel=1e-9)
    assert part.EI_uls == pytest.approx(plain.EI, rel=1e-9)
    assert part.neutral_axis_y == pytest.approx(plain.neutral_axis_y, rel=1e-9)
    for got, want in zip(part.ply_extreme_stresses(1000.0), plain.ply_extreme_stresses(1000.0),
                         strict=True):
        np.testing.assert_allclose(got, want, rtol=1e-9)
    ys = np.linspace(-0.006, 0.24, 23)
    np.testing.assert_allclose(part.shear_flow(1000.0, ys), plain.shear_flow(1000.0, ys),
                               rtol=1e-9, atol=1e-9)
    flows = [q for _, q in part.interface_shear_flows(1000.0)]
    assert flows == pytest.approx([q for _, q in plain.interface_shear_flows(1000.0)],
                                  rel=1e-9)
    np.testing.assert_allclose(part.moment_shares(), plain.moment_shares(), rtol=1e-9)


def test_fasteners_without_stiffness_give_the_plies_alone():
    """K -> 0: gamma -> 0, (EI)_ef = sum E_i I_i, each ply bends about its own centroid
    with stress +- 0.5 E_i h_i M / (EI)_ef (common practice).
    """
    plain, part = _plain_and_partial(1e-30)
    own = [0.05 * 0.2**3 / 12, 0.1 * 0.04**3 / 12, 0.1 * 0.006**3 / 12]
    EI = 11e9 * own[0] + 11e9 * own[1] + 210e9 * own[2]
    assert part.EI == pytest.approx(EI, rel=1e-9)
    assert part.EI_uls == pytest.approx(EI, rel=1e-9)
    top, bot = part.ply_extreme_stresses(1000.0)
    for i, (E, h) in enumerate(((11e9, 0.2), (11e9, 0.04), (210e9, 0.006))):
        assert top[i] == pytest.approx(-0.5 * E * h * 1000.0 / EI, rel=1e-9)
        assert bot[i] == pytest.approx(0.5 * E * h * 1000.0 / EI, rel=1e-9)
    assert [q for _, q in part.interface_shear_flows(1000.0)] == pytest.approx([0, 0],
                                                                                abs=1e-12)


def test_gamma_factor_b5():
    """(B.5) with the numbers of the timber flange: 1 / (1 + 1.208744) (N, mm)."""
    assert gamma_factor(11000e6, 4000e-6, 0.1, K_SER * 1e3, 4.0) == pytest.approx(
        1 / (1 + PI2 * 11000 * 4000 * 100 / (K_SER * 4000**2)), rel=1e-13)


def test_json_keys():
    """section.EI_effective (N m^2) and section.gamma (per ply in ply order) where a
    mechanical connector applies; absent without a diameter and for glue.
    """
    a = run(from_dict(project(bottom=True)))
    sec = check_json(a)["section"]
    assert sec["EI_effective"] == a.section.EI == sec["EI"]
    assert sec["gamma"] == [1.0, float(a.section.gamma[1]), float(a.section.gamma[2])]
    assert sec["gamma_ultimate"][0] == 1.0 and sec["EI_effective_ultimate"] < sec["EI"]
    assert sec["slip_length"] == 4.0
    for conn in ({"type": "screw", "allowable": "2 kN"}, {"type": "glue"}):
        sec = check_json(run(from_dict(project(connector=conn))))["section"]
        assert "EI_effective" not in sec and "gamma" not in sec


def test_no_diameter_keeps_full_composite_action():
    """Without a diameter the section is the transformed section, as before."""
    conn = {"type": "screw", "allowable": "2 kN", "rows": 1}
    a = run(from_dict(project(connector=conn)))
    assert not isinstance(a.section, PartialSection)
    c = next(c for c in a.checks if c.id == "connectors")
    assert any("Full composite action is assumed" in n for n in c.notes)


def test_glue_is_fully_composite_and_its_glue_line_named():
    a = run(from_dict(project(connector={"type": "glue"})))
    assert not isinstance(a.section, PartialSection)
    assert not [c for c in a.checks if c.id == "connectors"]
    assert any(w.path == "design.connector.type" and isinstance(w, MissingCheck)
               for w in a.warnings)
    assert a.verdict != "OK"


@pytest.mark.parametrize(("changes", "path"), [
    ({"supports": "continuous", "spans": ("4 m", "4 m")}, "beam.supports"),
    ({"connector": {"type": "screw", "allowable": "2 kN", "diameter": "6 mm"}},
     "design.connector.spacing"),
])
def test_refused_where_annex_b_does_not_apply(changes, path):
    """Continuous members and a missing spacing: a named missing check, never OK."""
    a = run(from_dict(project(**changes)))
    assert not isinstance(a.section, PartialSection)
    assert any(w.path == path and isinstance(w, MissingCheck) for w in a.warnings)
    assert a.verdict in ("INCOMPLETE", "NOT OK")


def test_refused_for_plies_side_by_side_under_a_flange():
    """Two webs side by side under one flange is not an arrangement of Annex B."""
    d = project()
    d["plies"][0]["width"] = "25 mm"
    d["plies"].append({"name": "web 2", "material": "C24", "x": "50 mm", "y": "0 mm",
                       "width": "25 mm", "height": "200 mm"})
    a = run(from_dict(d))
    assert not isinstance(a.section, PartialSection)
    assert any(w.path == "plies" and isinstance(w, MissingCheck) and "Annex B" in w.message
               for w in a.warnings)


def test_us_basis_uses_the_same_method():
    """US basis: Annex B as a published method with rho_m of the library's density
    (DF-L 33.2 lb/ft^3 = 531.81 kg/m^3, NDS Supplement 3.1.3, from memory); K_ser =
    531.81^1.5 x 6 / 23 N/mm.
    """
    d = project()
    d["design"]["basis"] = "US-ASD"
    d["beam"]["combinations"] = "ASD"
    for p in d["plies"]:
        p["material"] = "DFL-No2"
    a = run(from_dict(d))
    sec = a.section
    assert isinstance(sec, PartialSection)
    rho = sec.materials[0].density
    assert rho == pytest.approx(531.81, rel=1e-4)
    assert sec.joints[0].K_ser / 1e3 == pytest.approx(rho**1.5 * 6 / 23, rel=1e-12)
    E = sec.materials[0].E / 1e6
    g, _, _, EI = annex_b_two_plies(E, 4000.0, 100 * 40**3 / 12, 40.0,
                                    rho**1.5 * 6 / 23, E2=E)
    assert sec.gamma[1] == pytest.approx(g, rel=1e-12)
    assert sec.EI == pytest.approx(EI * 1e-6, rel=1e-12)
    assert any(c.id == "connectors" for c in a.checks)


def _us(d: dict) -> dict:
    d["design"]["basis"] = "US-ASD"
    d["beam"]["combinations"] = "ASD"
    for p in d["plies"]:
        if p["material"] == "C24":
            p["material"] = "DFL-No2"
    d["design"]["connector"]["allowable"] = "500 lbf"
    return d


@pytest.mark.parametrize("d", [project(bottom=True), project("S275"), _us(project()),
                               _us(project("S275"))],
                         ids=["EU two timber flanges", "EU steel flange", "US timber flange",
                              "US steel flange"])
def test_sheet_writes_the_slip_out(d):
    """Every check of the sheet recomputed from its printed numbers (the sheet's text read
    back with pypdf, as in test_sheet_recompute), the gamma method's among them.
    """
    import io

    from pypdf import PdfReader

    from plystack.core.report.sheet import build_sheet
    from tests.validation.test_sheet_recompute import assert_recomputes

    p = from_dict(d)
    buf = io.BytesIO()
    build_sheet(p, buf)
    text = "\n".join(pg.extract_text() for pg in PdfReader(io.BytesIO(buf.getvalue())).pages)
    assert "not written out" not in text
    assert "EN 1995-1-1 Annex B" in text
    assert_recomputes(text, check_json(run(p))["checks"])


def _notched(d: dict) -> dict:
    d["beam"]["notches"] = [{"at": "support 1", "face": "bottom", "depth": "20 mm",
                             "length": "50 mm"}]
    return d


def _flange_stops_short(d: dict) -> dict:
    d["plies"][1]["from"] = "0.5 m"
    d["plies"][1]["to"] = "3.5 m"
    return d


def _steel_on_steel(d: dict) -> dict:
    d["plies"][0]["material"] = "S275"
    return d


def _no_density(d: dict) -> dict:
    d["materials"] = {"wood": {"kind": "timber", "name": "wood without density",
                               "E": "11000 MPa", "fm_k": "24 MPa", "fv_k": "4 MPa"}}
    d["plies"][1]["material"] = "wood"
    return d


def _no_beam(d: dict) -> dict:
    del d["beam"]
    return d


@pytest.mark.parametrize(("change", "path"), [
    (_notched, "beam.notches"), (_flange_stops_short, "plies"),
    (_steel_on_steel, "design.connector.type"), (_no_density, "materials.wood.density"),
    (_no_beam, "beam")])
def test_more_refusals_name_their_field(change, path):
    """Where Annex B or Table 7.1 does not reach, a named missing check, never OK."""
    a = run(from_dict(change(project("S275") if change is _steel_on_steel else project())))
    assert not isinstance(a.section, PartialSection)
    assert any(w.path == path and isinstance(w, MissingCheck) for w in a.warnings), [
        str(w) for w in a.warnings]
    assert a.verdict in ("INCOMPLETE", "NOT OK")


def test_web_of_a_t_carries_tension_with_its_bending():
    """The web of the T carries an axial force gamma-weighted by (B.7), so EN 1995-1-1
    6.2.3 applies (from memory): sigma_t,0,d / f_t,0,d + sigma_m,d / f_m,d <= 1.

    ULS 1.35 G + 1.5 Q, M = (1.35 + 3.0) x 4^2 / 8 = 8.7 kN m, in the final state of
    2.3.2.2(2) (from memory): psi_2 = 0.3 (domestic, EN 1990 Table A1.1), k_def = 0.6:
    E_fin = 11000 / 1.18 = 9322.03 N/mm^2; the joint of two timbers 2 k_def (2.3.2.2(3)):
    K_u,fin = 1496.946 / (1 + 0.3 x 1.2) = 1100.696 N/mm.
    gamma_1 = 1 / (1 + pi^2 x 9322.03 x 4000 x 100 / (1100.696 x 4000^2)) = 0.3236564,
    a_2 = 0.3236564 x 4000 x 240 / (2 (0.3236564 x 4000 + 10000)) = 13.75478 mm,
    a_1 = 106.24522 mm, (EI)_ef = 4.695732e11 N mm^2.
    sigma_t,2 = 9322.03 x 13.75478 x 8.7e6 / 4.695732e11 = 2.37564 N/mm^2,
    sigma_m,2 = 0.5 x 9322.03 x 200 x 8.7e6 / 4.695732e11 = 17.27136 N/mm^2,
    f_t,0,d = 0.8 x 14.5 / 1.3 = 8.92308, f_m,d = 0.8 x 24 / 1.3 = 14.76923 (k_mod 0.8
    medium term, gamma_M 1.3, k_h 1 at 200 mm, from memory of EN 1995-1-1 3.1.3, 2.4.1,
    3.2): 2.37564 / 8.92308 + 17.27136 / 14.76923 = 1.43565.
    """
    a = run(from_dict(project()))
    E = E_T / 1.18
    K = K_U / 1.36
    g = 1 / (1 + PI2 * E * 4000 * S / (K * L**2))
    a2 = g * 4000 * 240 / (2 * (g * 4000 + 10000))
    a1 = 120 - a2
    EI = E * (100 * 40**3 / 12 + 50 * 200**3 / 12 + g * 4000 * a1**2 + 10000 * a2**2)
    assert (g, a2, EI) == pytest.approx((0.3236564, 13.75478, 4.695732e11), rel=1e-6)
    M = 8.7e6
    ratio = (E * a2 * M / EI) / (0.8 * 14.5 / 1.3) + (0.5 * E * 200 * M / EI) / (0.8 * 24 / 1.3)
    assert ratio == pytest.approx(1.43565, rel=1e-5)
    c = next(c for c in a.checks if c.id == "tension-bending" and c.ply == "web"
             and c.combination.startswith("ULS 1.35G + 1.5Q[L]"))
    assert c.demand == pytest.approx(ratio, rel=1e-12)
    assert not c.ok
