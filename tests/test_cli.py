"""The command line: outputs, exit codes, atomic writing, the input left alone, bad input."""

import csv
import shutil

import pytest

from conftest import SAMPLES
from ifccheck.cli import main

IMPERIAL = SAMPLES / "quillfeather_imperial.ifc"


@pytest.fixture
def sample(tmp_path):
    path = tmp_path / "studio.ifc"
    shutil.copy(IMPERIAL, path)
    return path


def test_check_writes_both_outputs_and_exits_1_on_fail(sample, capsys):
    before = sample.read_bytes()
    assert main(["check", str(sample)]) == 1  # the sample has members that fail on purpose
    assert sample.read_bytes() == before  # the input is never modified without --in-place
    assert (sample.parent / "studio.checked.ifc").is_file()
    rows = list(csv.DictReader(open(sample.parent / "studio.exceptions.csv", encoding="utf-8")))
    assert sorted(r["name"] for r in rows) == ["HDR-G-02", "J-U-11", "J-U-12", "TJ-U-01"]
    assert "design_span_ft" in rows[0] and "dead_load_plf" in rows[0]
    out = capsys.readouterr().out
    assert "PASS 18" in out and "FAIL 2" in out and "NOT_CHECKED 2" in out and "skipped" in out
    assert "licensed engineer" in out
    # data readiness (sample_models/README.md): J-U-12 lacks a known grade, TJ-U-01 its loads
    assert "data readiness: 2 members not checked" in out
    assert "     1  an NDS species and grade" in out and "     1  loads" in out
    assert sorted(p.name for p in sample.parent.iterdir()) == ["studio.checked.ifc", "studio.exceptions.csv", "studio.ifc"]


def test_output_names_and_in_place(sample, tmp_path):
    out, table = tmp_path / "a.ifc", tmp_path / "b.csv"
    assert main(["check", str(sample), "-o", str(out), "--csv", str(table)]) == 1
    assert out.is_file() and table.is_file()
    before = sample.read_bytes()
    assert main(["check", str(sample), "--in-place"]) == 1
    assert sample.read_bytes() != before and b"ifccheck_Verdict" in sample.read_bytes()


def test_metric_model_reports_metric_columns(tmp_path):
    path = tmp_path / "m.ifc"
    shutil.copy(SAMPLES / "quillfeather_metric.ifc", path)
    main(["check", str(path)])
    header = open(tmp_path / "m.exceptions.csv", encoding="utf-8").readline()
    assert "design_span_m" in header and "dead_load_kN_per_m" in header


BAD_FILES = {
    "empty.ifc": b"",
    "notes.ifc": b"this is a text file, not a model\n",
    "truncated.ifc": IMPERIAL.read_bytes()[:5000],
    "schema.ifc": b"ISO-10303-21;\nHEADER;\nFILE_DESCRIPTION((''),'2;1');\nFILE_NAME('','',(''),(''),'','','');\n"
    b"FILE_SCHEMA(('IFC9X9'));\nENDSEC;\nDATA;\nENDSEC;\nEND-ISO-10303-21;\n",
}


@pytest.mark.parametrize("name", sorted(BAD_FILES))
def test_unusable_model_exits_2_with_one_line_and_writes_nothing(tmp_path, capsys, name):
    path = tmp_path / name
    path.write_bytes(BAD_FILES[name])
    assert main(["check", str(path)]) == 2
    err = capsys.readouterr().err.strip()
    assert err.startswith("ifccheck: cannot run:") and "\n" not in err
    assert sorted(p.name for p in tmp_path.iterdir()) == [name]


def test_missing_model_exits_2(tmp_path, capsys):
    assert main(["check", str(tmp_path / "nowhere.ifc")]) == 2
    assert "does not exist" in capsys.readouterr().err


@pytest.mark.parametrize(
    "text, expected",
    [
        ("[defaults\nbearing_length = 3", "not valid TOML"),
        ("[defaults]\nbearing_lenght = '3 in'\n", "unknown key 'bearing_lenght'"),
        ("[loads]\ndead = 1\n", "unknown section [loads]"),
        ("[defaults]\nself_weight_included = 'yes'\n", "should be a bool"),
        ("[defaults]\nbearing_length = '3 kg'\n", "not a length"),
        ("[defaults]\nbearing_length = '-3 in'\n", "positive"),
        ("[defaults]\nshear_section = 'middle'\n", "shear_section"),
        ("[member_use]\nJOIST = 'attic'\n", "member use 'attic'"),
    ],
)
def test_bad_rules_file_exits_2_and_names_the_problem(sample, tmp_path, capsys, text, expected):
    rules = tmp_path / "project.toml"
    rules.write_text(text)
    assert main(["check", str(sample), "--rules", str(rules)]) == 2
    assert expected in capsys.readouterr().err
    assert not (sample.parent / "studio.checked.ifc").exists()


def test_project_rules_file_changes_the_defaults(sample, tmp_path):
    rules = tmp_path / "project.toml"
    rules.write_text('[defaults]\nbearing_length = "3 in"\n')
    assert main(["check", str(sample), "--rules", str(rules)]) == 1
    text = open(sample.parent / "studio.exceptions.csv", encoding="utf-8").read()
    assert "bearing length 3 in (rules default)" in text
