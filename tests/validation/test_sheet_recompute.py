"""The calculation sheet recomputed from its own printed numbers, as a reviewer would.

Source: the sheet's text read back with pypdf; the printed arithmetic evaluated here
from the printed numbers only (units stripped, × and / and + as printed), and compared
with the printed result and with ``plystack check --json`` converted to display units
with the exact definitions 1 in = 0.0254 m, 1 lbf = 4.4482216152605 N.

"Within its printed precision": a recomputed value may differ from the printed result
by at most one unit in its last printed digit (half a unit for rounding the result and
up to half a unit for rounding the inputs, which are printed to one more significant
figure). Integers without a unit (counts, 12 in/ft, 1,000 N/kN) are exact.
"""

from __future__ import annotations

import io
import json
import re
from pathlib import Path

import pytest
from pypdf import PdfReader

from plystack.core.cli import main
from plystack.core.io.project_file import from_dict, load
from plystack.core.pipeline import run
from plystack.core.report.sheet import build_sheet

DEMO = Path(__file__).resolve().parents[2] / "assets" / "demo"
DEMOS = ["porch-header.plystack.json", "stair-trimmer-eu.plystack.json"]
LBF, INCH = 4.4482216152605, 0.0254
#: SI value of one display unit, from the definitions (not from the program).
UNIT_SI = {"psi": LBF / INCH**2, "lbf": LBF, "in": INCH, "MPa": 1e6, "kN": 1e3, "mm": 1e-3,
           "lbf/in": LBF / INCH, "N/mm": 1e3}
SUPER = str.maketrans("⁰¹²³⁴⁵⁶⁷⁸⁹⁻", "0123456789-")
NUMBER = re.compile(r"^[-−]?\d[\d,]*(\.\d+)?$")
POWER = re.compile(r"^10[⁰¹²³⁴⁵⁶⁷⁸⁹⁻]+$")
UNITS = ("psi", "lbf", "lbf·ft", "lbf·in²", "lbf·in³", "in²", "in³", "in⁴", "plf", "psf", "pcf",
         "kN", "kN·m", "kN·m²", "kN·m³", "MPa", "mm", "mm²", "mm³", "mm⁴", "kN/m", "kPa",
         "kg/m³", "lb/ft", "kg/m", "ft", "m", "in")


def sheet_text(name: str) -> str:
    buf = io.BytesIO()
    build_sheet(load(DEMO / name), buf)
    return "\n".join(p.extract_text() for p in PdfReader(io.BytesIO(buf.getvalue())).pages)


def squash(text: str) -> str:
    return re.sub(r"\s+", " ", text.replace("\u00a0", " "))


def evaluate(expr: str) -> float:
    """The printed arithmetic, units dropped, evaluated."""
    out = []
    for raw in expr.replace("×", " × ").split():
        lead = len(raw) - len(raw.lstrip("("))
        trail = len(raw) - len(raw.rstrip(")"))
        core = raw[lead:len(raw) - trail]
        out.append("(" * lead)
        if core == "×":
            out.append("*")
        elif core in ("/", "+"):
            out.append(core)
        elif core in ("−", "-"):
            out.append("-")
        elif NUMBER.match(core):
            out.append(core.replace(",", "").replace("−", "-"))
        elif POWER.match(core):
            out.append(f"1e{core[2:].translate(SUPER)}")
        else:
            assert re.search(r"[A-Za-zµ°]", core), f"cannot read {core!r} in {expr!r}"
        out.append(")" * trail)
    text = " ".join(out)
    assert re.fullmatch(r"[\d.e+\-*/() ]+", text), text
    return float(eval(text))  # digits and operators only, checked above


def printed(result: str) -> tuple[float, float, str]:
    """Value, one unit in its last digit, and unit of a printed result."""
    m = re.match(r"\s*([-−]?\d[\d,]*(?:\.(\d+))?)(?: × (10[⁰¹²³⁴⁵⁶⁷⁸⁹⁻]+))?\s*(\S*)", result)
    assert m, result
    value = float(m.group(1).replace(",", "").replace("−", "-"))
    ulp = 10.0 ** -len(m.group(2) or "")
    if m.group(3):
        scale = 10.0 ** int(m.group(3)[2:].translate(SUPER))
        value, ulp = value * scale, ulp * scale
    return value, ulp, m.group(4)


def blocks(text: str, count: int) -> dict[int, str]:
    flat = squash(text)
    heads = [(int(m.group(1)), m.start()) for m in
             re.finditer(r"\bC(\d+) (?:bending|shear|bearing|deflection-\S+|bolts|connectors|"
                         r"tension-bending|compression-bending|uplift|vibration-\S+|"
                         r"load-transfer|bolt-spacing|bolt-edge|bolt-end|bending-net|"
                         r"splitting) —",
                         flat)]
    end = flat.find("All checks", heads[-1][1])
    out = {}
    for k, (label, start) in enumerate(heads):
        stop = heads[k + 1][1] if k + 1 < len(heads) else end
        out[label] = flat[start:stop]
    assert sorted(out) == list(range(1, count + 1))
    return out


def equation(block: str, start: str, stop: str) -> tuple[str, str]:
    """The numbers and the result of "start sym = symbols = numbers = result stop"."""
    i = block.index(start) + len(start)
    j = block.index(stop, i)
    parts = block[i:j].split(" = ")
    return parts[-2], parts[-1]


def json_checks(name: str, capsys: pytest.CaptureFixture[str]) -> dict:
    assert main(["check", str(DEMO / name), "--json"]) == 0
    return json.loads(capsys.readouterr().out)


def assert_recomputes(text: str, checks: list[dict]) -> None:
    """Every check's demand, capacity and ratio recomputed from the printed numbers."""
    found = blocks(text, len(checks))
    for k, check in enumerate(checks, start=1):
        block = found[k]
        assert f"{check['id']} —" in block and (check["combination"] or "") in block
        if check["id"] in NOT_WRITTEN_OUT:
            assert_stated(block, check)
            continue
        for start, stop, si in (("Demand: ", "Capacity: ", check["demand"]),
                                ("Capacity: ", "ratio = ", check["capacity"])):
            expr, res = equation(block, start, stop)
            value, ulp, unit = printed(res)
            again = evaluate(expr)
            assert abs(abs(again) - abs(value)) <= ulp * (1 + 1e-9), (k, start, expr, res)
            # the printed result is the program's value, rounded
            assert abs(abs(si) / UNIT_SI[unit] - abs(value)) <= ulp / 2 * (1 + 1e-9), (k, res)
        i = block.index("ratio = ") + len("ratio = ")
        expr, res = block[i:].split(" ≤ ")[0].split(" > ")[0].rsplit(" = ", 1)
        ratio, ulp, _ = printed(res)
        assert abs(evaluate(expr) - ratio) <= ulp, (k, expr, res)
        assert abs(ratio - check["ratio"]) <= ulp / 2 * (1 + 1e-9)
        assert ("→ OK" in block) == check["ok"]


#: Checks the sheet states with their equation and the check's worked numbers (notes) but
#: does not write out from printed inputs: the interaction checks' allowables (F't, F*b,
#: F'c, F_cE, f_t,0,d, ...) are intermediate values of the design module, not printed on
#: the sheet as inputs, so the interaction sum cannot be recomputed to its printed
#: precision; uplift and vibration likewise print their notes. For these the printed
#: demand, capacity and ratio must still be the program's, and the verdict its verdict.
NOT_WRITTEN_OUT = frozenset({"tension-bending", "compression-bending", "uplift",
                             "vibration-frequency", "vibration-stiffness",
                             "vibration-velocity"})


def assert_stated(block: str, check: dict) -> None:
    """The check's equation and notes are printed, and its numbers are the program's."""
    assert "Demand: " in block and "Capacity: " in block
    if check["quantity"] == "ratio":
        value, ulp, _ = printed(equation(block, "Demand: ", "Capacity: ")[1])
        assert abs(value - check["demand"]) <= ulp / 2 * (1 + 1e-9), block
    i = block.index("ratio = ") + len("ratio = ")
    ratio, ulp, _ = printed(block[i:].split(" ≤ ")[0].split(" > ")[0].rsplit(" = ", 1)[1])
    assert abs(ratio - check["ratio"]) <= ulp / 2 * (1 + 1e-9)
    assert ("→ OK" in block) == check["ok"]
    for note in check["notes"]:
        if not note.startswith("Caution"):
            assert squash(note)[:40] in block, note


@pytest.mark.parametrize("name", DEMOS)
def test_every_demand_capacity_and_ratio_recomputes_from_the_printed_numbers(name, capsys):
    data = json_checks(name, capsys)
    assert_recomputes(sheet_text(name), data["checks"])


def _variant(name: str, change) -> dict:
    d = json.loads((DEMO / name).read_text())
    change(d)
    return d


def _cover(d: dict) -> None:
    timber, steel = d["plies"][0]["material"], d["plies"][1]["material"]
    us = d["display_units"] == "US"
    d["plies"] = [{"name": "joist", "material": timber, "x": "0 in", "y": "0 in",
                   "width": "1.5 in" if us else "45 mm", "height": "9.25 in" if us else "220 mm"},
                  {"name": "cover", "material": steel, "x": "0 in",
                   "y": "9.25 in" if us else "220 mm", "width": "1.5 in" if us else "45 mm",
                   "height": "1/4 in" if us else "6 mm"}]
    d.pop("alternatives", None)
    d["design"]["connector"] = {"type": "screw", "allowable": "300 lbf" if us else "1.5 kN",
                                "rows": 2}


def _stack(d: dict) -> None:
    """Two timber plies, one on the other: each wholly on one side of the neutral axis,
    so each carries axial force with its bending (tension-bending, compression-bending)."""
    timber = d["plies"][0]["material"]
    us = d["display_units"] == "US"
    w, h = ("1.5 in", "9.25 in") if us else ("45 mm", "220 mm")
    d["plies"] = [{"name": "lower", "material": timber, "x": "0 in", "y": "0 in",
                   "width": w, "height": h},
                  {"name": "upper", "material": timber, "x": "0 in", "y": h, "width": w,
                   "height": h}]
    d.pop("alternatives", None)
    d["design"]["connector"] = {"type": "screw", "allowable": "300 lbf" if us else "1.5 kN",
                                "rows": 2}


def _side(d: dict) -> None:
    d["plies"] = [d["plies"][0], {**d["plies"][1], "x": d["plies"][0]["width"]}]
    d.pop("alternatives", None)


VARIANTS = {
    "US stacked cover plate with connectors": (DEMOS[0], _cover),
    "EU stacked cover plate with connectors": (DEMOS[1], _cover),
    "US side plate, bolts in single shear": (DEMOS[0], _side),
    "EU side plate, bolts in single shear": (DEMOS[1], _side),
    "US overhang and a partial snow load": (DEMOS[0], lambda d: (
        d["beam"].update(overhang_right="2 ft"),
        d["beam"]["loads"].append({"case": "S", "type": "line", "value": "100 plf",
                                   "from": "2 ft", "to": "8 ft"}))),
    "US AISC F11, wet, warm, unbraced, sustained live": (DEMOS[0], lambda d: (
        d["design"].update(steel_rule="AISC-F11", wet_service=True, temperature="up-to-125F",
                           compression_edge_braced=False),
        d["beam"].update(sustained_live_fraction=0.3))),
    "EU demo shown in US units": (DEMOS[1], lambda d: d.update(display_units="US")),
    "US two stacked joists (interaction checks)": (DEMOS[0], lambda d: _stack(d)),
    "EU two stacked joists (interaction checks)": (DEMOS[1], lambda d: _stack(d)),
}


@pytest.mark.parametrize("variant", sorted(VARIANTS))
def test_variants_recompute_too(variant):
    """Beyond the demos: stacked plies (connectors), single shear, overhangs, partial
    loads, the other steel rule and creep of part of the live load."""
    name, change = VARIANTS[variant]
    project = from_dict(_variant(name, change))
    buf = io.BytesIO()
    build_sheet(project, buf)
    text = "\n".join(p.extract_text() for p in PdfReader(io.BytesIO(buf.getvalue())).pages)
    checks = [c.to_dict() for c in run(project).checks]
    assert_recomputes(text, checks)


def test_bolt_check_shows_every_yield_mode_and_defines_w(capsys):
    text = squash(sheet_text(DEMOS[0]))
    data = json_checks(DEMOS[0], capsys)
    bolts = [c for c in data["checks"] if c["id"] == "bolts"]
    assert bolts
    for mode in ("Im", "Is", "IIIs", "IV"):
        assert re.search(rf"\b{mode} [^|]*? \d[\d,.]* lbf", text), mode
    assert "W = total load on the member under" in text
    z = bolts[0]["reference"]["value"] / LBF
    m = re.search(r"Z = ([\d,.]+) lbf: the lowest mode, (\w+)", text)
    assert m and abs(float(m.group(1).replace(",", "")) - z) <= 0.05
    # W is the sum of the reactions of each combination (check --json)
    for combo in data["beam"]["combinations"]:
        w = sum(combo["reactions"]) / LBF
        m = re.search(rf"W = total load on the member under {re.escape(combo['name'])} = ΣR = "
                      r"([^=]+) = ([\d,.]+) lbf", text)
        assert m, combo["name"]
        assert abs(evaluate(m.group(1)) - float(m.group(2).replace(",", ""))) <= 0.1
        assert abs(float(m.group(2).replace(",", "")) - w) <= 0.05


def test_us_loads_page_converts_area_loads_and_lists_combination_reactions(capsys):
    text = squash(sheet_text(DEMOS[0]))
    data = json_checks(DEMOS[0], capsys)
    # 12 psf x 6 ft = 72 plf and 40 psf x 6 ft = 240 plf (hand calculation)
    assert "w = q s = 12 psf × 6′-0″ (6 ft) = 72.000 plf" in text
    assert "w = q s = 40 psf × 6′-0″ (6 ft) = 240.00 plf" in text
    assert "Self-weight of the member" in text and "w_sw = Σ ρ A g" in text
    for combo in data["beam"]["combinations"]:
        name = combo["name"]
        i = text.index(f"{name}: R1 = ")
        line = text[i:text.index(". ", i) if ". " in text[i:i + 400] else i + 400]
        for k, reaction in enumerate(combo["reactions"], start=1):
            m = re.search(rf"R{k} = ([^=;]+) = ([\d,.]+) lbf", line)
            assert m, (name, k, line)
            value = float(m.group(2).replace(",", ""))
            assert abs(value - reaction / LBF) <= 0.05  # printed to 0.1 lbf
            assert abs(evaluate(m.group(1)) - value) <= 0.1
    assert "Reactions per combination" in text


@pytest.mark.parametrize("name", DEMOS)
def test_no_table_cell_wraps_a_unit_away_from_its_number(name):
    for line in sheet_text(name).splitlines():
        tokens = line.replace("\u00a0", " ").split()
        if not tokens:
            continue
        first = tokens[0]
        if first == "in" and len(tokens) > 1 and tokens[1][0].isalpha() and tokens[1] not in UNITS:
            continue  # the English word "in" opening a wrapped sentence
        assert first not in UNITS, f"a line starts with the unit {first!r}: {line!r}"


@pytest.mark.parametrize("name", DEMOS)
def test_deflections_recompute_from_the_loads_by_handbook_formulas(name, capsys):
    """Source: simple-span beam formulas of the AISC Manual beam diagrams (from memory),
    as printed on the sheet; each load's EI δ recomputed from its printed numbers, each
    case the sum of its loads."""
    data = json_checks(name, capsys)
    found = blocks(sheet_text(name), len(data["checks"]))
    seen = 0
    for k, check in enumerate(data["checks"], start=1):
        if not check["id"].startswith("deflection"):
            continue
        parts = found[k].split(" · ")
        sums: dict[str, float] = {}
        ulps: dict[str, float] = {}
        for line in parts:
            m = re.match(r"EI δ, (?:load \d+|self-weight) \((\w+)\)", line)
            if not m:
                continue
            *_, expr, res = line.split(" = ")
            value, ulp, _ = printed(res)
            assert abs(evaluate(expr) - value) <= ulp * (1 + 1e-9), (k, line)
            sums[m.group(1)] = sums.get(m.group(1), 0.0) + value
            ulps[m.group(1)] = ulps.get(m.group(1), 0.0) + ulp / 2
            seen += 1
        line = next(p for p in parts if p.startswith("EI δ of each case"))
        for case, total in sums.items():
            m = re.search(rf"\b{case} ([\d,.]+(?: × 10[⁰¹²³⁴⁵⁶⁷⁸⁹]+)?) (?:lbf·in³|kN·m³)", line)
            assert m, (case, line)
            value, ulp, _ = printed(m.group(1))
            assert abs(value - total) <= ulp / 2 + ulps[case], (k, case, line)
    assert seen > 0


def _text_of(project) -> str:
    buf = io.BytesIO()
    build_sheet(project, buf)
    return squash("\n".join(p.extract_text() for p in PdfReader(io.BytesIO(buf.getvalue())).pages))


def _incomplete(d: dict) -> None:
    """A floor vibration check asked for on a member with an overhang: the method cannot
    make it, so the verdict is INCOMPLETE (core.design.vibration)."""
    d["beam"].update(overhang_right="0.3 m")
    d["design"]["vibration"] = {"floor_width": "4.5 m", "spacing": "400 mm", "damping": 0.01,
                                "transverse_EI": "2.7 kN*m^2/m"}


@pytest.mark.parametrize("name", DEMOS)
def test_summary_shows_the_analysis_verdict_and_the_fire_note(name):
    project = load(DEMO / name)
    text = _text_of(project)
    assert f"Verdict: {run(project).verdict}" in text
    assert "Fire: Plystack makes no fire check." in text


def test_incomplete_analysis_is_never_ok_on_the_sheet_and_names_its_reasons():
    project = from_dict(_variant(DEMOS[1], _incomplete))
    a = run(project)
    assert a.verdict == "INCOMPLETE" and all(c.ok for c in a.checks)
    text = _text_of(project)
    assert "Verdict: INCOMPLETE" in text and "Verdict: OK" not in text
    for reason in a.incomplete_reasons:
        assert squash(str(reason)) in text


def test_sheet_lists_each_combination_with_its_kind_and_the_governing_patterns():
    name, change = VARIANTS["US overhang and a partial snow load"]
    project = from_dict(_variant(name, change))
    beam = run(project).beam
    assert beam is not None and beam.patterned_cases
    text = _text_of(project)
    assert "Pattern loading" in text
    for combo in beam.combinations:
        assert f"{combo.name} {combo.kind} " in text, combo.name
    # the arrangements tried and, beside each maximum, the regions its arrangement loads
    d_l = next(c for c in beam.combinations if c.name == "D + L")
    assert d_l.patterns_tried > 1
    m = re.search(r"D \+ L (\d+) ([\d,.]+) lbf·ft, ([a-z0-9 +]+?) −?[\d,.]+ lbf·ft, ", text)
    assert m, "no pattern row for D + L"
    assert int(m.group(1)) == d_l.patterns_tried
    assert abs(float(m.group(2).replace(",", "")) - d_l.extremes.M_max / (LBF * 0.3048)) <= 0.5
    assert m.group(3) == " + ".join(d_l.governing_patterns["M_max"])
    # the EU set: every kind of combination appears with its kind
    eu = run(load(DEMO / DEMOS[1])).beam
    eu_text = squash(sheet_text(DEMOS[1]))
    assert {c.kind for c in eu.combinations} >= {"ULS", "SLS-characteristic", "SLS-frequent",
                                                 "SLS-quasi-permanent"}
    for combo in eu.combinations:
        assert f"{combo.name} {combo.kind} " in eu_text, combo.name
