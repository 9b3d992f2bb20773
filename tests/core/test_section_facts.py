"""Facts of the trade about transformed sections (common practice; no source needed):
one material gives b h^3 / 12; the reference material changes I_transformed but not EI,
the neutral axis or any stress; at an interface strains match and stresses differ by the
modulus ratio; splitting a ply in two of the same material changes nothing."""

from __future__ import annotations

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from plystack.core.model.errors import ProjectError
from plystack.core.section.transformed import analyse
from tests.helpers import rect, steel, timber

dims = st.floats(min_value=0.005, max_value=0.4)


@given(b=dims, h=dims, y0=st.floats(-0.2, 0.2))
def test_single_material_rectangle(b, h, y0):
    s = analyse([rect("r", "w", 0.0, y0, b, h)], {"w": timber("w", 10e9)})
    assert s.I_transformed == pytest.approx(b * h**3 / 12, rel=1e-9)
    assert s.neutral_axis_y == pytest.approx(y0 + h / 2, rel=1e-9, abs=1e-12)
    assert s.EA == pytest.approx(10e9 * b * h, rel=1e-12)


@st.composite
def stacked_sections(draw):
    """A random column of stacked plies, each of timber or steel, with random widths."""
    n = draw(st.integers(2, 5))
    y = 0.0
    plies = []
    for i in range(n):
        h = draw(st.floats(0.003, 0.2))
        w = draw(st.floats(0.01, 0.2))
        mat = draw(st.sampled_from(["w", "s", "w2"]))
        plies.append(rect(f"p{i}", mat, 0.0, y, w, h))
        y += h
    return plies


MATS = {"w": timber("w", 11e9), "w2": timber("w2", 7e9), "s": steel("s", 200e9)}


@settings(max_examples=60, deadline=None)
@given(plies=stacked_sections(), moment=st.floats(-5e4, 5e4))
def test_reference_changes_nothing_physical(plies, moment):
    a = analyse(plies, MATS, reference="w")
    b = analyse(plies, MATS, reference="s")
    assert a.EI == pytest.approx(b.EI, rel=1e-10)
    assert a.neutral_axis_y == pytest.approx(b.neutral_axis_y, rel=1e-10, abs=1e-12)
    assert a.I_transformed / b.I_transformed == pytest.approx(200e9 / 11e9, rel=1e-10)
    ta, ba = a.ply_extreme_stresses(moment)
    tb, bb = b.ply_extreme_stresses(moment)
    np.testing.assert_allclose(ta, tb, rtol=1e-9, atol=1e-6)
    np.testing.assert_allclose(ba, bb, rtol=1e-9, atol=1e-6)


@settings(max_examples=60, deadline=None)
@given(plies=stacked_sections(), moment=st.floats(1.0, 5e4))
def test_interfaces_equal_strain_stress_jump(plies, moment):
    s = analyse(plies, MATS)
    for i in range(len(plies) - 1):
        y = plies[i].top
        e_low = s.strain(moment, y)
        # strain is one linear function of height
        assert float(e_low) == pytest.approx(-moment / s.EI * (y - s.neutral_axis_y), rel=1e-12)
        top_lower = float(s.stress(moment, i, y))
        bot_upper = float(s.stress(moment, i + 1, y))
        ratio = s.E[i + 1] / s.E[i]
        assert bot_upper == pytest.approx(top_lower * ratio, rel=1e-9, abs=1e-6)


@settings(max_examples=60, deadline=None)
@given(plies=stacked_sections(), frac=st.floats(0.1, 0.9), moment=st.floats(-1e4, 1e4),
       shear=st.floats(10, 1e4))
def test_splitting_a_ply_changes_nothing(plies, frac, moment, shear):
    k = 0
    p = plies[k]
    lower = rect("a", p.material, p.x, p.y, p.width, p.height * frac)
    upper = rect("b", p.material, p.x, p.y + p.height * frac, p.width, p.height * (1 - frac))
    split = [lower, upper, *plies[1:]]
    a = analyse(plies, MATS)
    b = analyse(split, MATS)
    assert a.EI == pytest.approx(b.EI, rel=1e-9)
    assert a.EA == pytest.approx(b.EA, rel=1e-12)
    assert a.neutral_axis_y == pytest.approx(b.neutral_axis_y, rel=1e-9, abs=1e-12)
    ys = np.linspace(p.y + 1e-6, plies[-1].top - 1e-6, 23)
    np.testing.assert_allclose(a.shear_flow(shear, ys), b.shear_flow(shear, ys), rtol=1e-7,
                               atol=1e-6)


def test_rectangle_shear_stress_peak_is_three_halves_average():
    """Handbook: a rectangle's peak shear stress is 1.5 V / (b h) at mid-depth."""
    s = analyse([rect("r", "w", 0, 0, 0.05, 0.2)], {"w": timber("w")})
    tau = s.shear_stress(1000.0, np.array([0.1]))
    assert float(tau[0, 0]) == pytest.approx(1.5 * 1000 / (0.05 * 0.2), rel=1e-12)


def test_flitch_plies_carry_shear_in_proportion_and_free_edges_carry_none():
    """Side-by-side plies (common practice): the shear forces across a cut add up to
    V Q_t / I_t, and a free edge carries no shear."""
    mats = {"w": timber("w", 11e9), "s": steel("s", 200e9)}
    plies = [rect("L", "w", 0, 0, 0.038, 0.235), rect("P", "s", 0.038, 0.0, 0.01, 0.235),
             rect("R", "w", 0.048, 0, 0.038, 0.235)]
    s = analyse(plies, mats)
    ys = np.array([0.0, 0.05, 0.1175, 0.2, 0.235])
    tau = s.shear_stress(5000.0, ys)
    widths = np.array([[p.width] for p in plies])
    np.testing.assert_allclose((tau * widths).sum(axis=0), s.shear_flow(5000.0, ys),
                               rtol=1e-9, atol=1e-6)
    assert np.allclose(tau[:, [0, -1]], 0.0, atol=1e-6)


def test_moment_shares_add_to_one_and_steel_takes_more():
    mats = {"w": timber("w", 11e9), "s": steel("s", 200e9)}
    plies = [rect("L", "w", 0, 0, 0.038, 0.235), rect("P", "s", 0.038, 0.006, 0.01, 0.223)]
    s = analyse(plies, mats)
    shares = s.moment_shares()
    assert shares.sum() == pytest.approx(1.0, rel=1e-12)
    assert shares[1] > shares[0]


def test_clipped_away_and_detached_plies_warn():
    mats = {"w": timber("w")}
    plies = [rect("hidden", "w", 0, 0, 0.05, 0.05), rect("cover", "w", 0, 0, 0.05, 0.1),
             rect("far", "w", 1.0, 0, 0.05, 0.1)]
    s = analyse(plies, mats)
    text = " ".join(str(w) for w in s.warnings)
    assert "hidden" in text and "clipped away" in text
    assert "far" in text and "touches no other ply" in text


@pytest.mark.parametrize("w,h,field", [(0.0, 0.1, "width"), (-0.1, 0.1, "width"),
                                       (0.1, float("nan"), "height")])
def test_bad_dimensions_are_named_errors(w, h, field):
    with pytest.raises(ProjectError) as info:
        analyse([rect("p", "w", 0, 0, w, h)], {"w": timber("w")})
    assert f"plies[0].{field}" in str(info.value)


def test_unknown_material_is_named():
    with pytest.raises(ProjectError) as info:
        analyse([rect("p", "nope", 0, 0, 0.1, 0.1)], {"w": timber("w")})
    assert "plies[0].material" in str(info.value)


def test_a_thin_ply_far_from_the_origin_keeps_its_own_second_moment() -> None:
    """b h^3 / 12 exactly (hand formula) for a whole rectangle, however far from y = 0:
    a 1/1024 m ply 8 m up (all exact binary numbers) loses seven digits in the
    parallel-axis difference of its moments about y = 0."""
    from plystack.core.io.library import load_library
    from plystack.core.model.plies import Ply
    from plystack.core.section.transformed import analyse, own_second_moment

    mats = load_library()
    h = 2.0 ** -10
    plies = (Ply("deep", "C24", 0.0, 0.0, 0.125, 8.0), Ply("thin", "S275", 0.125, 8.0, 0.25, h))
    s = analyse(plies, mats)
    assert s.is_unclipped(1)
    assert own_second_moment(s, 1) == 0.25 * h ** 3 / 12
    assert s.ply_results()[1].I_own == 0.25 * h ** 3 / 12
