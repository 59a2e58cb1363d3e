"""Shared test helpers: members built in memory (no IFC file) and run through the design basis."""

from __future__ import annotations

import importlib.util
import sys
from pathlib import Path

import pytest

from ifccheck.design import get_basis
from ifccheck.design.inputs import design_inputs
from ifccheck.model import MaterialInfo, MemberRecord, Section
from ifccheck.rules import load_rules
from ifccheck.units import Q_

REPO = Path(__file__).resolve().parents[1]
SAMPLES = REPO / "sample_models"
REAL_MODELS = REPO.parent / "shared" / "real_models"

PSF = float(Q_(1, "psf").to("psi").magnitude)  # 1 psf in psi (1/144)
PLF = float(Q_(1, "plf").to("lbf/inch").magnitude)  # 1 plf in lbf/in (1/12)


def load_script(path: Path, name: str):
    """Import a script of the project that is not part of the package (sample builders, benchmarks)."""
    spec = importlib.util.spec_from_file_location(name, path)
    module = importlib.util.module_from_spec(spec)
    sys.modules[name] = module  # dataclasses look their module up here
    spec.loader.exec_module(module)
    return module


def member(b, d, span_in, inputs, ptype="JOIST", name="M1", material="", clear=False, plies=1):
    """A candidate member as the reader would hand it over (core units: in, lbf, psi)."""
    return MemberRecord(
        global_id=f"guid-{name}",
        name=name,
        ifc_class="IfcBeam",
        predefined_type=ptype,
        storey="Test",
        material=MaterialInfo(name=material, kind="timber"),
        section=Section(width=b, depth=d, plies=plies, source="test"),
        span=span_in,
        span_source="test",
        span_is_clear=clear,
        inputs=dict(inputs),
    )


def run_basis(records, rules=None, elements=None):
    """Design inputs and NDS verdicts for in-memory members (and ElementBox ``elements``), joined in one table."""
    merged = load_rules(rules)
    inputs = design_inputs(records, merged, elements)
    verdicts = get_basis(merged["defaults"]["design_basis"]).check(inputs, merged)
    return inputs.drop(columns=[c for c in verdicts.columns if c in inputs.columns]).join(verdicts)


@pytest.fixture
def real_models_dir():
    if not REAL_MODELS.is_dir():
        pytest.skip("../shared/real_models is absent")
    return REAL_MODELS
