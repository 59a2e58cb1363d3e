"""End to end on the shipped sample models (sample_models/README.md lists every member with its
expected status and the hand calculation behind it).

Also the unit round trip: the same building modelled in feet (lbf/ft, psf) and in millimetres
(kN/m, kPa) must give the same verdicts and the same numbers.
"""

from collections import Counter

import ifcopenshell
import ifcopenshell.util.element as element
import pytest

import ifccheck
from conftest import SAMPLES
from ifccheck.model import VERDICT_PSET

IMPERIAL = SAMPLES / "quillfeather_imperial.ifc"
METRIC = SAMPLES / "quillfeather_metric.ifc"
IFC2X3 = SAMPLES / "quillfeather_ifc2x3.ifc"

# sample_models/README.md, "Members and expected verdicts"
EXPECTED = {
    **{f"J-U-{k:02d}": "PASS" for k in range(1, 11)},
    "FB-U-01": "PASS",
    "HDR-G-01": "PASS",
    **{f"R-R-{k:02d}": "PASS" for k in range(1, 7)},
    "J-U-11": "FAIL",
    "HDR-G-02": "FAIL",
    "J-U-12": "NOT_CHECKED",
    "TJ-U-01": "NOT_CHECKED",
}
SKIPPED = {"SB-G-01": "non_timber", "P-G-01": "not_bending", "FW-G-01": "not_load_bearing"}


@pytest.fixture(scope="module")
def imperial():
    return ifccheck.check_model(IMPERIAL)


@pytest.fixture(scope="module")
def metric():
    return ifccheck.check_model(METRIC)


def _statuses(result):
    return dict(zip(result.table["name"], result.table["status"]))


@pytest.mark.parametrize("which", ["imperial", "metric"])
def test_every_member_gets_its_expected_status(which, request):
    result = request.getfixturevalue(which)
    assert _statuses(result) == EXPECTED
    assert {s.name: s.category for s in result.skipped} == SKIPPED
    assert result.counts() == {"PASS": 18, "FAIL": 2, "NOT_CHECKED": 2, "skipped": 3}


def test_not_checked_reasons_name_what_is_missing(imperial):
    reasons = dict(zip(imperial.table["name"], imperial.table["reason"]))
    assert "Premium Select X" in reasons["J-U-12"] and "grade" in reasons["J-U-12"].lower()
    assert "no loads found" in reasons["TJ-U-01"]


def test_hand_calculation_of_a_floor_joist(imperial):
    # sample_models/README.md: J-U-07, 2x10 DF-L No.2, 66.67 plf, D+L: fb/F'b 0.69 at L = 156 in;
    # the checker's design span is 156 - 1.5 = 154.5 in (NDS 3.2.1), so by hand
    # M = 66.67/12 * 154.5² / 8 = 16,577 in-lb, fb = 775.0 psi, F'b = 900·1.0·1.1·1.15 = 1138.5 psi
    row = imperial.table.set_index("name").loc["J-U-07"]
    assert row.design_span == pytest.approx(154.5, abs=1e-6)
    assert row.util_bending == pytest.approx(775.0 / 1138.5, rel=2e-3)
    assert row.governing_check == "BENDING" and row.comb_bending == "D+L"


def test_feet_and_millimetres_give_the_same_verdicts(imperial, metric):
    a = imperial.table.set_index("name").sort_index()
    b = metric.table.set_index("name").sort_index()
    assert list(a.index) == list(b.index)
    assert (a["status"] == b["status"]).all()
    assert (a["governing_check"] == b["governing_check"]).all()
    for column in ["max_util", "util_bending", "util_shear", "util_deflection_live", "util_deflection_total",
                   "util_bearing", "design_span", "allowable_span", "required_S", "w_D", "w_L", "w_S"]:
        assert a[column].to_numpy() == pytest.approx(b[column].to_numpy(), rel=1e-6, nan_ok=True), column


def test_verdicts_are_written_in_the_models_own_units(tmp_path, imperial, metric):
    # the design span of J-U-07 is 154.5 in = 12.875 ft = 3924.3 mm
    for result, expected in ((imperial, 12.875), (metric, 3924.3)):
        out = result.write_ifc(tmp_path / "out.ifc")
        model = ifcopenshell.open(str(out))
        beam = next(b for b in model.by_type("IfcBeam") if b.Name == "J-U-07")
        verdict = element.get_psets(beam)[VERDICT_PSET]
        assert verdict["Status"] == "PASS"
        assert verdict["DesignSpan"] == pytest.approx(expected, rel=1e-6)
        assert verdict["DesignBasis"].startswith("NDS 2018")


def test_ifc2x3_sample():
    result = ifccheck.check_model(IFC2X3)
    assert _statuses(result) == {"J-U-01": "PASS", "J-U-02": "PASS", "J-U-07": "PASS", "R-R-01": "PASS",
                                 "J-U-11": "FAIL"}
    assert [s.name for s in result.skipped] == ["SB-G-01"]


def test_in_memory_model_is_not_changed_and_nothing_is_written(tmp_path, monkeypatch):
    monkeypatch.chdir(tmp_path)
    model = ifcopenshell.open(str(IMPERIAL))
    before = Counter(e.is_a() for e in model)
    result = ifccheck.check_model(model)
    result.write_ifc(tmp_path / "copy.ifc")
    assert Counter(e.is_a() for e in model) == before  # the host's model is untouched
    assert sorted(p.name for p in tmp_path.iterdir()) == ["copy.ifc"]
    result.apply_to_model()  # the host asks for the verdicts in its own model
    with_verdict = {
        obj.GlobalId
        for rel in model.by_type("IfcRelDefinesByProperties")
        if rel.RelatingPropertyDefinition.Name == VERDICT_PSET
        for obj in rel.RelatedObjects
    }
    assert with_verdict == set(result.table["global_id"])


def test_annex_with_structural_analysis_model():
    # sample_models/README.md, annex section: hand calculations of the two-span joist (governing the
    # negative moment at the interior support, 0.62), the girder on point loads, one of them the
    # reaction of joist J-A-02 framing into it (0.69), the balcony joist with its overhang (0.58),
    # the header under a post load (1.58, fails) and J-A-02 itself (0.29)
    result = ifccheck.check_model(SAMPLES / "quillfeather_annex_structural.ifc")
    t = result.table.set_index("name")
    assert dict(t["status"]) == {"J-A-01": "PASS", "G-A-01": "PASS", "BJ-A-01": "PASS", "HDR-A-01": "FAIL",
                                 "J-A-02": "PASS"}
    expected = {"J-A-01": 0.62, "G-A-01": 0.69, "BJ-A-01": 0.58, "HDR-A-01": 1.58, "J-A-02": 0.29}
    for name, util in expected.items():
        assert t.loc[name, "max_util"] == pytest.approx(util, abs=0.01), name
    assert t.loc["J-A-01", "support_count"] == 3 and t.loc["J-A-01", "bending_edge"] == "bottom"
    assert t.loc["J-A-01", "governing_location"] == pytest.approx(144.0, abs=0.01)  # the interior support
    assert "structural-analysis data" in t.loc["HDR-A-01", "load_sources"]
    assert "reactions of the members bearing on it" in t.loc["G-A-01", "load_sources"]
    assert result.structural.linked_by_relation == 5 and result.structural.supports == 11
