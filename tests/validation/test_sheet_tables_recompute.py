"""The sheet's member tables recomputed from their printed numbers, as a reviewer would:
segments, staged loading, load transfer and the plate details (issues 14 and 15).

Sources, named beside each test:
- hand calculations of the named formulas (b h^3 / 12 of a rectangle; w L^2 / 8 and
  5 w L^4 / (384 EI) of a simple span under a uniform load, AISC Manual beam diagrams,
  from memory; f = M c / I);
- the printed arithmetic itself (alpha F, n Z', their ratio; a dimension chain adds up to
  the overall length), evaluated from the printed numbers with the helpers of
  test_sheet_recompute (within one unit in the last printed digit);
- clauses recalled from memory: the standard hole of AISC 360-16 Table J3.3 (bolt + 1/16 in),
  the normal clearance of EN 1090-2 Table 11 for M12 (1 mm), the loaded-edge distance 4 D
  of NDS 2018 Table 12.5.1C.

Each table's rows are the cells the sheet prints (the same functions build both), and
every test also finds its cells in the PDF's text.
"""

from __future__ import annotations

import io
import json
import re
from pathlib import Path

import pytest
from pypdf import PdfReader

from plystack.core.io.output import check_json
from plystack.core.io.project_file import from_dict, load
from plystack.core.pipeline import run
from plystack.core.report.connections import plate_layouts
from plystack.core.report.member import (
    segment_rows,
    staged_combinations,
    staged_rows,
    transfer_rows,
)
from plystack.core.report.plate_detail import plate_dims, schedule_rows
from plystack.core.report.sheet import build_sheet
from tests.validation.test_sheet_recompute import printed, squash

DEMO = Path(__file__).resolve().parents[2] / "assets" / "demo"
US, EU = DEMO / "porch-header.plystack.json", DEMO / "stair-trimmer-eu.plystack.json"
LBF, INCH = 4.4482216152605, 0.0254
FT = 12 * INCH
PSI = LBF / INCH**2
UNIT_SI = {"psi": PSI, "lbf": LBF, "in": INCH, "MPa": 1e6, "kN": 1e3, "mm": 1e-3,
           "lbf·ft": LBF * FT, "kN·m": 1e3, "lbf·in²": LBF * INCH**2, "kN·m²": 1e3}


def _demo(path: Path, change=None) -> dict:
    d = json.loads(path.read_text())
    d.pop("alternatives", None)
    if change is not None:
        change(d)
    return d


def _text(project) -> str:
    buf = io.BytesIO()
    build_sheet(project, buf)
    return squash("\n".join(p.extract_text() for p in PdfReader(io.BytesIO(buf.getvalue())).pages))


def _in_text(cell: str, text: str) -> bool:
    return squash(cell.replace("\u00a0", " ")) in text


def _value(cell: str) -> tuple[float, float, str]:
    """SI value, half a unit of its last printed digit (SI) and unit of a printed cell."""
    value, ulp, unit = printed(cell.replace("\u00a0", " ").split("= ")[-1])
    return value * UNIT_SI[unit], ulp / 2 * UNIT_SI[unit], unit


def test_segments_table_against_hand_section_properties():
    """Source: hand calculation. A plate from 1 ft to 11 ft of the 12 ft demo header: the end
    segments hold the two 2x10 alone, EI = 2 E b h^3 / 12 with E = 1,600,000 psi (NDS
    Supplement Table 4A, DF-L No.2, from memory), b = 1.5 in, h = 9.25 in, neutral axis at
    h / 2; the middle segment is the whole section (check --json's EI)."""
    p = from_dict(_demo(US, lambda d: d["plies"][1].update({"from": "1 ft", "to": "11 ft"})))
    a = run(p)
    rows = segment_rows(a)
    assert [r[1:3] for r in rows[1:]] == [["0′-0″", "1′-0″"], ["1′-0″", "11′-0″"],
                                          ["11′-0″", "12′-0″"]]
    EI_timbers = 2 * 1.6e6 * PSI * (1.5 * INCH) * (9.25 * INCH) ** 3 / 12
    EI_all = check_json(a)["section"]["EI"]
    text = _text(p)
    for row, EI in zip(rows[1:], (EI_timbers, EI_all, EI_timbers), strict=True):
        value, half, _ = _value(row[4])
        assert abs(value - EI) <= half * (1 + 1e-9), row
        y, half_y, _ = _value(row[5])
        assert abs(y - 9.25 / 2 * INCH) <= half_y * (1 + 1e-9), row
        assert _in_text(" ".join(row[4:6]), text) or _in_text(row[4], text)
    assert rows[1][3] == "left 2x10, right 2x10"
    assert rows[2][3] == "left 2x10, flitch plate, right 2x10"
    # the governing check of each segment is the highest ratio of the checks made in it
    for seg, row in zip(a.segments, rows[1:], strict=True):
        own = [c for c in a.checks if c.segment == seg.index]
        assert row[7] == f"{max(c.ratio for c in own):.3f}"
    assert "Segments along the member" in text


def _staged() -> dict:
    """The invented joist of tests/validation/test_staged_loading.py: a 2x10 DF-L No.2,
    15 ft simple span, 40 plf dead load before a 1/4 x 9 1/4 A36 side plate is bolted on,
    100 plf live load afterwards, no self-weight."""
    return {
        "format": "plystack", "version": 1, "display_units": "US",
        "title": "Invented test: 2x10 joist plated under its dead load", "materials": {},
        "plies": [
            {"name": "joist", "material": "DFL-No2", "x": "0 in", "y": "0 in",
             "width": "1.5 in", "height": "9.25 in"},
            {"name": "plate", "material": "A36", "x": "1.5 in", "y": "0 in",
             "width": "0.25 in", "height": "9.25 in", "stage": "added"}],
        "beam": {"spans": ["15 ft"], "supports": "simple", "self_weight": False,
                 "combinations": "ASD",
                 "loads": [{"case": "D", "type": "line", "value": "40 plf", "stage": "before"},
                           {"case": "L", "type": "line", "value": "100 plf"}]},
        "design": {"basis": "US-ASD", "bolt": {"diameter": "1/2 in", "Fyb": "45000 psi",
                                               "rows": 1}},
    }


def test_staged_table_against_the_two_hand_stages():
    """Source: hand calculation by superposition. Before: M1 = 40 plf (15 ft)^2 / 8 on the
    2x10 alone, f = M1 c / I, delta = 5 w L^4 / (384 E I); after: M2 = 100 plf (15 ft)^2 / 8
    on the transformed section (plate width times n = 29,000,000 / 1,600,000 psi, AISC
    360-16 and NDS Supplement Table 4A, from memory), I_t = (b + n t) d^3 / 12; the plate
    carries nothing of the first stage. The sum column is the two columns added."""
    p = from_dict(_staged())
    a = run(p)
    assert staged_combinations(a) == ["D + L"]
    rows = {r[0]: r[1:] for r in staged_rows(a, "D + L")[1:]}
    Et, Es = 1.6e6 * PSI, 29e6 * PSI
    L, b, t, d = 15 * FT, 1.5 * INCH, 0.25 * INCH, 9.25 * INCH
    I1 = b * d**3 / 12
    I2 = (b + Es / Et * t) * d**3 / 12
    w1, w2 = 40 * LBF / FT, 100 * LBF / FT
    M1, M2 = w1 * L**2 / 8, w2 * L**2 / 8
    hand = {"largest sagging moment": (M1, M2),
            "largest immediate deflection": (5 * w1 * L**4 / (384 * Et * I1),
                                             5 * w2 * L**4 / (384 * Et * I2)),
            "joist: top fibre stress": (-M1 * d / 2 / I1, -M2 * d / 2 / I2),
            "joist: bottom fibre stress": (M1 * d / 2 / I1, M2 * d / 2 / I2),
            "plate: top fibre stress": (0.0, -Es / Et * M2 * d / 2 / I2),
            "plate: bottom fibre stress": (0.0, Es / Et * M2 * d / 2 / I2)}
    text = _text(p)
    for what, (before, after) in hand.items():
        cells = rows[what]
        for cell, expected in zip(cells, (before, after, before + after), strict=True):
            if expected == 0.0:
                assert cell.split("\u00a0")[0] == "0", (what, cell)
                continue
            value, half, _ = _value(cell)
            assert abs(value - expected) <= half * (1 + 1e-9), (what, cell, expected)
        # the sum recomputes from the printed columns
        parts = [_value(c) for c in cells]
        assert abs(parts[0][0] + parts[1][0] - parts[2][0]) <= (
            parts[0][1] + parts[1][1] + parts[2][1]) * (1 + 1e-9)
        assert _in_text(" ".join(cells), text), (what, cells)
    assert "the two stages add" in text and "Stages under D + L" in text


def test_shored_member_states_the_rule_without_stage_tables():
    """A shored member takes every load on the built-up section (common practice): no
    stage tables, the sentence only."""
    d = _staged()
    d["beam"]["shored"] = True
    text = _text(from_dict(d))
    assert "This member is shored: every load acts on the built-up section." in text
    assert "Stages under" not in text


@pytest.mark.parametrize("path", [US, EU])
def test_load_transfer_table_recomputes_and_equals_check_json(path):
    """Source: the printed arithmetic. alpha F from alpha and F, n Z' from n and Z' (or
    n F_v,Rd), the ratio from both; each equal to the check's JSON; the zone is x -/+ d
    (the member depth, 9.25 in / 220 mm) within the plate and holds the stations listed."""
    p = load(path)
    a = run(p)
    data = {f"C{k}": c for k, c in enumerate(check_json(a)["checks"], start=1)}
    rows = transfer_rows(a)
    assert len(rows) - 1 == sum(1 for c in a.checks if c.id == "load-transfer") > 0
    text = _text(p)
    lay = plate_layouts(a)[0][1]
    depth = 9.25 * INCH if path == US else 0.220
    for row in rows[1:]:
        check = data[row[0]]
        assert check["id"] == "load-transfer" and check["combination"] == row[2]
        F, _, unit = _value(row[4])
        alpha = float(row[5])
        aF, half_aF, _ = _value(row[6])
        n = int(row[9])
        per, _, _ = _value(row[10])
        nZ, half_nZ, _ = _value(row[11])
        k = UNIT_SI[unit]
        assert abs(alpha * F - aF) <= (2 * half_aF + 0.5e-5 * F) * (1 + 1e-9), row
        assert abs(n * per - nZ) <= (2 * half_nZ + n * 0.5e-4 * per) * (1 + 1e-9), row
        assert abs(aF / nZ - float(row[12])) <= 0.0005 + 2e-3 * aF / nZ, row
        assert abs(aF - check["demand"]) <= half_aF * (1 + 1e-9)
        assert abs(nZ - check["capacity"]) <= half_nZ * (1 + 1e-9)
        assert row[12] == f"{check['ratio']:.3f}"
        assert n == check["factors"]["n"]
        # the zone: the stations within d of the support or load, within the plate
        listed = [int(s.split(" at ")[0]) - 1 for s in row[8].split("; ")]
        assert sum(lay.at_station(s) for s in listed) == n
        x = check["x"]
        inside = [s for s, xs in enumerate(lay.stations) if abs(xs - x) <= depth * (1 + 1e-9)]
        assert listed == (inside or listed)
        assert k > 0 and _in_text(row[11], text) and _in_text(row[6], text)
    assert "Load transfer at supports and point loads" in text


def test_us_plate_detail_dimensions_by_hand():
    """Source: hand calculation and clauses from memory. The demo's 3/8 x 8 3/4 plate runs
    the 12 ft member: 6 stations at 24 in with 12 in ends, 12 + 5 x 24 + 12 = 144 in; two
    rows 4 D = 2 in from the plate's edges (NDS 2018 Table 12.5.1C, loaded edge, from
    memory), 2 1/4 in from the timbers' (the plate is set 1/4 in in); holes 1/2 + 1/16 =
    9/16 in (AISC 360-16 Table J3.3, standard hole, from memory)."""
    p = load(US)
    a = run(p)
    (jt, lay), = plate_layouts(a)
    dims = plate_dims(a, jt, lay)
    assert sum(dims.gaps) == pytest.approx(144 * INCH, rel=1e-12)
    rows = schedule_rows(a, [(jt, lay)])
    assert rows[1] == ["B1", "flitch plate", "1/2\u00a0in", "12", "2", "6", "24\u00a0in",
                       "12\u00a0in / 12\u00a0in", "2\u00a0in / 2\u00a0in",
                       "2 1/4\u00a0in / 2 1/4\u00a0in", "9/16\u00a0in"]
    text = _text(p)
    m = re.search(r"(\d+) in (\d+) @ (\d+) in = (\d+) in (\d+) in overall 12′-0″ \((\d+) in\)",
                  text)
    assert m, "the dimension chain is not printed"
    first, n, s, inner, last, overall = (int(g) for g in m.groups())
    assert n * s == inner and first + inner + last == overall == 144
    assert "8 Plate details and bolt schedule" in text
    assert ("Member: 2-2x10 DF-L No.2 w/ 3/8 x 8 3/4 x 12′-0″ A36 PL, 1/2 in dia bolts @ "
            "24 in o.c., 2 rows") in text


def test_eu_plate_detail_dimensions_by_hand():
    """Source: hand calculation and EN 1090-2 Table 11 (M12: normal clearance 1 mm, from
    memory). The 10 x 200 plate, 3.6 m: 6 stations at 600 mm with 300 mm ends
    (300 + 5 x 600 + 300 = 3600); rows 4 d = 48 mm from its edges (EN 1995-1-1 Table 8.4,
    a4,t at 90 degrees, from memory), 58 mm from the timbers' (set 10 mm in)."""
    a = run(load(EU))
    rows = schedule_rows(a, plate_layouts(a))
    assert rows[1] == ["B1", "plate", "12\u00a0mm", "12", "2", "6", "600\u00a0mm",
                       "300\u00a0mm / 300\u00a0mm", "48\u00a0mm / 48\u00a0mm",
                       "58\u00a0mm / 58\u00a0mm", "13\u00a0mm"]
    text = _text(load(EU))
    assert "300 mm 5 @ 600 mm = 3000 mm 300 mm overall 3600 mm" in text
