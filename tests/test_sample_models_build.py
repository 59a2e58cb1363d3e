"""The shipped Quillfeather Studio sample models and the joist benchmark generator.

Checks that ``sample_models/build_samples.py`` rebuilds the committed files byte for byte, that
each model holds the hand-counted members, that the metric and IFC2X3 files carry exactly the
converted values of the imperial one, and that ``benchmarks/make_joists.py`` writes what it says.
"""

from __future__ import annotations

import math
from pathlib import Path

import ifcopenshell
import ifcopenshell.util.element
import ifcopenshell.util.placement
import ifcopenshell.util.unit
import pytest

from ifccheck.model import INPUT_PROPS, INPUT_PSET
from conftest import load_script

REPO = Path(__file__).resolve().parents[1]
SAMPLES = REPO / "sample_models"


build_samples = load_script(SAMPLES / "build_samples.py", "sample_models_build_samples")
make_joists_module = load_script(REPO / "benchmarks" / "make_joists.py", "benchmarks_make_joists")

FILES = ("quillfeather_imperial.ifc", "quillfeather_metric.ifc", "quillfeather_ifc2x3.ifc")

# exact conversions: 1 ft = 0.3048 m; 1 lbf = 0.45359237 kg x 9.80665 m/s2 = 4.4482216152605 N
LBF_N = 4.4482216152605
FOOT_M = 0.3048


@pytest.fixture(scope="module")
def models():
    return {name: ifcopenshell.open(str(SAMPLES / name)) for name in FILES}


def test_rebuild_is_byte_identical_to_the_committed_files(tmp_path):
    written = build_samples.build_all(tmp_path)
    assert sorted(p.name for p in written) == sorted(FILES)
    for name in FILES:
        assert (tmp_path / name).read_bytes() == (SAMPLES / name).read_bytes(), f"{name} differs from its rebuild"


# hand-counted from the member table of sample_models/README.md (exact counts, tolerance 0)
CLASS_COUNTS = {
    "quillfeather_imperial.ifc": {"IfcBeam": 18, "IfcMember": 7},
    "quillfeather_metric.ifc": {"IfcBeam": 18, "IfcMember": 7},
    "quillfeather_ifc2x3.ifc": {"IfcBeam": 5, "IfcMember": 1},
}
TYPE_COUNTS_IFC4 = {"JOIST": 13, "BEAM": 3, "LINTEL": 2, "RAFTER": 6, "POST": 1}


@pytest.mark.parametrize("name", FILES)
def test_member_counts_by_class(models, name):
    counts = {cls: len(models[name].by_type(cls, include_subtypes=False)) for cls in CLASS_COUNTS[name]}
    assert counts == CLASS_COUNTS[name]


@pytest.mark.parametrize("name", FILES[:2])
def test_member_counts_by_predefined_type(models, name):
    counts = {}
    for element in models[name].by_type("IfcBeam") + models[name].by_type("IfcMember"):
        kind = ifcopenshell.util.element.get_predefined_type(element)
        counts[kind] = counts.get(kind, 0) + 1
    assert counts == TYPE_COUNTS_IFC4


@pytest.mark.parametrize("name", FILES)
def test_member_names_are_unique_and_global_ids_too(models, name):
    model = models[name]
    names = [e.Name for e in model.by_type("IfcBeam") + model.by_type("IfcMember")]
    assert len(names) == len(set(names))
    global_ids = [e.GlobalId for e in model.by_type("IfcRoot")]
    assert len(global_ids) == len(set(global_ids))


def test_schemas_and_owner_histories(models):
    assert [models[n].schema for n in FILES] == ["IFC4", "IFC4", "IFC2X3"]
    assert len(models["quillfeather_imperial.ifc"].by_type("IfcOwnerHistory")) == 0
    assert len(models["quillfeather_metric.ifc"].by_type("IfcOwnerHistory")) == 0
    (history,) = models["quillfeather_ifc2x3.ifc"].by_type("IfcOwnerHistory")
    assert history.CreationDate == 1704067200  # 2024-01-01T00:00:00Z


# unit scales to SI of each model (exact conversions above; relative tolerance 1e-12)
UNIT_SCALES = {
    "quillfeather_imperial.ifc": {"LENGTHUNIT": FOOT_M, "FORCEUNIT": LBF_N,
                                  "LINEARFORCEUNIT": LBF_N / FOOT_M, "PLANARFORCEUNIT": LBF_N / FOOT_M**2},
    "quillfeather_metric.ifc": {"LENGTHUNIT": 0.001, "FORCEUNIT": 1000.0,
                                "LINEARFORCEUNIT": 1000.0, "PLANARFORCEUNIT": 1000.0},
}


@pytest.mark.parametrize("name", list(UNIT_SCALES))
def test_project_unit_scales(models, name):
    for unit_type, expected in UNIT_SCALES[name].items():
        unit = ifcopenshell.util.unit.get_project_unit(models[name], unit_type)
        assert ifcopenshell.util.unit.get_unit_scale(unit) == pytest.approx(expected, rel=1e-12), unit_type


def test_ifc2x3_assigns_metre_and_leaves_forces_at_the_si_default(models):
    model = models["quillfeather_ifc2x3.ifc"]
    assert ifcopenshell.util.unit.calculate_unit_scale(model) == 1.0
    for unit_type in ("FORCEUNIT", "LINEARFORCEUNIT", "PLANARFORCEUNIT"):
        assert ifcopenshell.util.unit.get_project_unit(model, unit_type) is None


SI_SCALE = {
    "quillfeather_imperial.ifc": UNIT_SCALES["quillfeather_imperial.ifc"],
    "quillfeather_metric.ifc": UNIT_SCALES["quillfeather_metric.ifc"],
    "quillfeather_ifc2x3.ifc": {"LENGTHUNIT": 1.0, "LINEARFORCEUNIT": 1.0, "PLANARFORCEUNIT": 1.0},
}
UNIT_OF_KIND = {"length": "LENGTHUNIT", "linear_force": "LINEARFORCEUNIT", "planar_force": "PLANARFORCEUNIT"}


def _inputs_in_si(model, name):
    """Every member's ifccheck_DesignInput (type values overridden by occurrence ones), in SI."""
    result = {}
    for element in model.by_type("IfcBeam") + model.by_type("IfcMember"):
        values = ifcopenshell.util.element.get_psets(element).get(INPUT_PSET, {})
        si = {}
        for prop, value in values.items():
            if prop == "id":
                continue
            unit_type = UNIT_OF_KIND.get(INPUT_PROPS[prop])
            si[prop] = value * SI_SCALE[name][unit_type] if unit_type else value
        result[element.Name] = si
    return result


def _geometry_in_si(model, name):
    """Each member's axis start (world) and length, its profile XDim/YDim, in metres."""
    scale = SI_SCALE[name]["LENGTHUNIT"]
    result = {}
    for element in model.by_type("IfcBeam") + model.by_type("IfcMember"):
        matrix = ifcopenshell.util.placement.get_local_placement(element.ObjectPlacement)
        solid = next(
            item for rep in element.Representation.Representations if rep.RepresentationIdentifier == "Body"
            for item in rep.Items
        )
        profile = solid.SweptArea
        if profile.is_a("IfcIShapeProfileDef"):
            width, depth = profile.OverallWidth, profile.OverallDepth
        else:  # a rectangle, or equal rectangles side by side
            plies = profile.Profiles if profile.is_a("IfcCompositeProfileDef") else [profile]
            width, depth = sum(p.XDim for p in plies), plies[0].YDim
        result[element.Name] = [*(matrix[:3, 3] * scale), solid.Depth * scale, width * scale, depth * scale]
    return result


@pytest.mark.parametrize("other", FILES[1:])
def test_values_are_exact_conversions_of_the_imperial_model(models, other):
    """Same inputs and geometry in SI, to a relative 1e-12 (converted with exact factors)."""
    imperial = "quillfeather_imperial.ifc"
    inputs, other_inputs = _inputs_in_si(models[imperial], imperial), _inputs_in_si(models[other], other)
    geometry, other_geometry = _geometry_in_si(models[imperial], imperial), _geometry_in_si(models[other], other)
    assert set(other_inputs) <= set(inputs)
    for member, values in other_inputs.items():
        expected = dict(inputs[member])
        if other.endswith("ifc2x3.ifc") and "RepetitiveMember" in values:
            # said outright in IFC2X3, which has no JOIST type
            expected.update(RepetitiveMember=True, ContinuouslyBraced=True)
        assert values.keys() == expected.keys(), member
        for prop, value in values.items():
            if isinstance(value, float):
                assert value == pytest.approx(expected[prop], rel=1e-12, abs=1e-12), (member, prop)
            else:
                assert value == expected[prop], (member, prop)
        assert other_geometry[member] == pytest.approx(geometry[member], rel=1e-12, abs=1e-12), member


def test_builder_writes_only_known_input_properties_of_the_right_kind():
    for prop, kind in build_samples.INPUT_KINDS.items():
        assert INPUT_PROPS[prop] == kind, prop


def _bending_utilization(model, name, member, fb_tabulated, cf, cr, cd):
    """fb / Fb' for a simple span under uniform load, read from the model (hand calculation):

    w = sum of loads x tributary width; M = w L^2 / 8; fb = M / S with S = b d^2 / 6;
    Fb' = Fb CD CF Cr (NDS 2018 Table 4.3.1; CL = 1, compression edge braced).
    Span L = horizontal projection of the member axis.
    """
    element = next(e for e in model.by_type("IfcBeam") + model.by_type("IfcMember") if e.Name == member)
    x0, y0, z0, length, b, d = _geometry_in_si(model, name)[member]
    direction = ifcopenshell.util.placement.get_local_placement(element.ObjectPlacement)[:3, 2]
    span_in = length * math.hypot(direction[0], direction[1]) / 0.0254
    b_in, d_in = b / 0.0254, d / 0.0254
    inputs = _inputs_in_si(model, name)[member]
    pa_to_psi, n_per_m_to_lbf_per_in = 0.0254**2 / LBF_N, 0.0254 / LBF_N
    if "TributaryWidth" in inputs:
        area_loads = sum(v for k, v in inputs.items() if k in ("DeadAreaLoad", "LiveAreaLoad", "SnowAreaLoad"))
        w = area_loads * pa_to_psi * inputs["TributaryWidth"] / 0.0254
    else:
        w = sum(v for k, v in inputs.items() if k in ("DeadLoad", "LiveLoad", "SnowLoad")) * n_per_m_to_lbf_per_in
    fb = (w * span_in**2 / 8) / (b_in * d_in**2 / 6)
    return fb / (fb_tabulated * cd * cf * cr)


# Hand calculations of sample_models/README.md (bending, the governing check of each):
# reference Fb from NDS Supplement 2018 Table 4A (DF-L No.2 900 psi, Hem-Fir No.2 850 psi),
# CF and Cr = 1.15 from its adjustment-factor tables, CD from NDS 2018 Table 2.3.2 (D+L 1.0, D+S 1.15).
# J-U-01: w = 50 psf x 16/12 ft = 66.67 plf, L = 156 in, M = 16,900 in-lb, S = 21.39 in3,
#         fb = 790.1 psi, Fb' = 900 x 1.0 x 1.1 x 1.15 = 1138.5 psi -> 0.694
# J-U-11: 2x6, L = 168 in, M = 19,600 in-lb, S = 7.5625 in3, fb = 2591.7, Fb' = 900 x 1.3 x 1.15 = 1345.5 -> 1.926
# HDR-G-02: 2-ply 2x6, w = 410 plf, L = 96 in, M = 39,360 in-lb, S = 15.125 in3, fb = 2602.3,
#         Fb' = 900 x 1.3 (no Cr) = 1170 -> 2.224
# R-R-01: w = 35 psf x 2 ft = 70 plf on plan, L = 120 in (plan), M = 10,500 in-lb, S = 13.14 in3,
#         fb = 799.0, Fb' = 850 x 1.15 x 1.2 x 1.15 = 1348.9 -> 0.592
BENDING_CASES = [
    ("J-U-01", 900, 1.1, 1.15, 1.0, 0.694),
    ("J-U-11", 900, 1.3, 1.15, 1.0, 1.926),
    ("HDR-G-02", 900, 1.3, 1.0, 1.0, 2.224),
    ("R-R-01", 850, 1.2, 1.15, 1.15, 0.592),
]


@pytest.mark.parametrize("name", FILES[:2])
@pytest.mark.parametrize("member, fb, cf, cr, cd, expected", BENDING_CASES)
def test_readme_bending_hand_calculations_match_the_model(models, name, member, fb, cf, cr, cd, expected):
    assert _bending_utilization(models[name], name, member, fb, cf, cr, cd) == pytest.approx(expected, abs=0.0005)


def test_make_joists_smoke(tmp_path):
    path = make_joists_module.make_joists(50, tmp_path / "joists_50.ifc")
    model = ifcopenshell.open(str(path))
    beams = model.by_type("IfcBeam")
    assert len(beams) == 50
    assert ifcopenshell.util.unit.calculate_unit_scale(model) == pytest.approx(0.3048, rel=1e-12)
    (joist_type,) = model.by_type("IfcBeamType")
    assert ifcopenshell.util.element.get_material(joist_type).Name == "DF-L No.2"
    inputs = ifcopenshell.util.element.get_psets(joist_type)[INPUT_PSET]
    assert inputs["DeadAreaLoad"] == pytest.approx(10.0, abs=1e-12)  # psf
    assert inputs["LiveAreaLoad"] == pytest.approx(40.0, abs=1e-12)  # psf
    assert inputs["TributaryWidth"] == pytest.approx(16 / 12, rel=1e-12)  # ft
    for beam in beams:
        assert ifcopenshell.util.element.get_type(beam) == joist_type
        reps = {r.RepresentationIdentifier: r for r in beam.Representation.Representations}
        assert set(reps) == {"Body", "Axis"}
        solid = reps["Body"].Items[0]
        assert (solid.SweptArea.XDim, solid.SweptArea.YDim) == pytest.approx((1.5 / 12, 9.25 / 12), rel=1e-12)
        assert solid.Depth == pytest.approx(13.0, rel=1e-12)  # ft
    assert len({b.GlobalId for b in beams}) == 50
    assert path.read_bytes() == make_joists_module.make_joists(50, tmp_path / "again" / "joists_50.ifc").read_bytes()
