"""The connector keys of the design object: read, written back, and bad values named by
their field (the project's file rules; EN 1995-1-1 Annex B bounds the varying spacing to
at most 4 times the smallest, from memory).
"""

from __future__ import annotations

import pytest

from plystack.core.io.project_file import dumps, from_dict, loads
from plystack.core.model.design import Connector
from plystack.core.model.errors import ProjectError


def data(connector: dict, basis: str = "EU-LSD") -> dict:
    return {
        "format": "plystack", "version": 1, "title": "c", "display_units": "SI",
        "plies": [{"name": "web", "material": "C24", "x": "0 mm", "y": "0 mm",
                   "width": "50 mm", "height": "200 mm"}],
        "design": {"basis": basis, "connector": connector}}


def problems_of(connector: dict) -> list[tuple[str, str]]:
    with pytest.raises(ProjectError) as info:
        from_dict(data(connector))
    return [(p.path, p.message) for p in info.value.problems]


def test_new_keys_are_read_in_si():
    p = from_dict(data({"type": "nail", "allowable": "1 kN", "rows": 2, "diameter": "3.1 mm",
                        "spacing": "50 mm", "spacing_max": "150 mm", "predrilled": True}))
    assert p.design is not None
    c = p.design.connector
    assert (c.type, c.allowable, c.rows, c.predrilled) == ("nail", 1000.0, 2, True)
    assert (c.spacing, c.diameter, c.spacing_max) == pytest.approx((0.05, 0.0031, 0.15),
                                                                   rel=1e-15)
    assert p.design.connector.slips


@pytest.mark.parametrize("kind", ["screw", "bolt", "nail", "lag-screw", "glue"])
def test_every_type_round_trips(kind):
    conn = {"type": kind, "rows": 1, "spacing": "100 mm"}
    if kind != "glue":
        conn["diameter"] = "6 mm"
    p = from_dict(data(conn))
    assert loads(dumps(p)) == p
    assert p.design is not None and p.design.connector.type == kind
    assert p.design.connector.slips == (kind != "glue")


def test_old_connector_is_unchanged():
    p = from_dict(data({"type": "screw", "allowable": "2 kN", "rows": 1}))
    assert p.design is not None
    assert p.design.connector == Connector("screw", 2000.0, 1, None)
    assert not p.design.connector.slips


@pytest.mark.parametrize(("connector", "path", "words"), [
    ({"type": "staple"}, "design.connector.type", "must be one of screw, bolt, nail, "
     "lag-screw, glue"),
    ({"type": "screw", "diameter": "-3 mm"}, "design.connector.diameter", "greater than zero"),
    ({"type": "screw", "diameter": "6 kg"}, "design.connector.diameter", ""),
    ({"type": "screw", "diameter": "40 mm"}, "design.connector.diameter", "at most 30 mm"),
    ({"type": "screw", "predrilled": "yes"}, "design.connector.predrilled", "true or false"),
    ({"type": "screw", "predrilled": True}, "design.connector.predrilled", "nails only"),
    ({"type": "glue", "diameter": "6 mm"}, "design.connector.diameter", "glued"),
    ({"type": "nail", "spacing_max": "100 mm"}, "design.connector.spacing_max",
     '"spacing"'),
    ({"type": "nail", "spacing": "50 mm", "spacing_max": "250 mm"},
     "design.connector.spacing_max", "4 times"),
    ({"type": "nail", "spacing": "50 mm", "spacing_max": "40 mm"},
     "design.connector.spacing_max", "between"),
    ({"type": "nail", "diameter": "3 mm", "depth": "2 mm"}, "design.connector.depth",
     "not a known key"),
])
def test_bad_values_name_their_field(connector, path, words):
    found = problems_of(connector)
    assert any(p == path and words in m for p, m in found), found
    for _, message in found:
        assert "Error" not in message and "float" not in message and "NoneType" not in message
