"""The public results are frozen: assigning to any field raises (the project's design)."""

from __future__ import annotations

import dataclasses

import pytest

from plystack.core.io.project_file import loads
from plystack.core.io.resources import demo_text
from plystack.core.pipeline import run


@pytest.fixture(scope="module")
def analysis():
    return run(loads(demo_text("porch-header")))


def _instances(a):
    yield a
    yield a.section
    yield a.beam
    yield a.beam.combinations[0]
    yield a.checks[0]
    yield a.project


@pytest.mark.parametrize("index", range(6))
def test_every_field_of_the_results_is_frozen(analysis, index):
    obj = list(_instances(analysis))[index]
    for f in dataclasses.fields(obj):
        with pytest.raises(dataclasses.FrozenInstanceError):
            setattr(obj, f.name, getattr(obj, f.name))


def test_run_has_no_speed_parameters():
    import inspect

    params = list(inspect.signature(run).parameters)
    assert params == ["project", "reference"]
