"""The project rules file: area loads and presets, member use by storey, the starter example, and
one clear message with the file line for each kind of mistake."""

import re
import shutil

import pytest

from conftest import SAMPLES
from ifccheck.cli import main
from ifccheck.errors import RulesError
from ifccheck.rules import example_text, live_load_presets, load_rules, member_use, rules_dir

PSF = 1 / 144  # psi per psf: 1 ft² = 144 in² (by definition of the foot)
KPA = 0.145038  # psi per kPa: 1000 N/m² × 0.224809 lbf/N ÷ 1550.0031 in²/m² (by hand)


def write(tmp_path, text):
    path = tmp_path / "project.toml"
    path.write_text(text, encoding="utf-8")
    return path


def message(tmp_path, text):
    with pytest.raises(RulesError) as caught:
        load_rules(write(tmp_path, text))
    return str(caught.value)


# --- area loads ------------------------------------------------------------------------------


def test_the_issue_form_loads_with_loads_in_psi(tmp_path):
    rules = load_rules(write(tmp_path, """\
[defaults]
self_weight_included = true
bearing_length = "1.5 in"

[[area_loads]]
storey = "Level 2"
dead = "10 psf"
live = "40 psf"
"""))
    assert rules["defaults"]["self_weight_included"] is True
    (entry,) = rules["area_loads"]
    assert entry["storey"] == "Level 2" and entry["preset"] is None
    assert entry["dead"] == pytest.approx(10 * PSF, rel=1e-9)  # 10/144 = 0.069444 psi
    assert entry["live"] == pytest.approx(40 * PSF, rel=1e-9)  # 40/144 = 0.277778 psi
    assert entry["roof_live"] == 0.0 and entry["snow"] == 0.0
    assert entry["line"] == 5
    assert entry["label"] == "area_loads[1] (storey 'Level 2')"


def test_metric_area_loads_convert_by_hand(tmp_path):
    rules = load_rules(write(tmp_path, '[[area_loads]]\nslab = "S1"\ndead = "1.9 kPa"\nsnow = "2 kN/m^2"\n'))
    (entry,) = rules["area_loads"]
    assert entry["dead"] == pytest.approx(1.9 * KPA, rel=1e-5)  # 0.275572 psi
    assert entry["snow"] == pytest.approx(2 * KPA, rel=1e-5)  # 1 kN/m² = 1 kPa
    assert entry["slab"] == "S1" and entry["label"] == "area_loads[1] (slab 'S1')"


def test_labels_and_lines_of_several_entries(tmp_path):
    rules = load_rules(write(tmp_path, """\
[[area_loads]]
storey = "Level 1"
live = "40 psf"

[[area_loads]]   # bedrooms
space_usage = "Bedroom"
live = "30 psf"
"""))
    assert [(e["line"], e["label"]) for e in rules["area_loads"]] == [
        (1, "area_loads[1] (storey 'Level 1')"),
        (5, "area_loads[2] (space_usage 'Bedroom')"),
    ]


def test_defaults_have_no_area_loads_and_no_storey_uses():
    rules = load_rules()
    assert rules["area_loads"] == [] and rules["member_use_by_storey"] == {}


# --- presets ---------------------------------------------------------------------------------

PRESETS = [
    # name, load key filled, psf, source of the value
    ("residential_living", "live", 40, "IRC, Table R301.5"),
    ("residential_sleeping", "live", 30, "IRC, Table R301.5"),
    ("attic_limited_storage", "live", 20, "IRC, Table R301.5"),
    ("attic_without_storage", "live", 10, "IRC, Table R301.5"),
    ("deck", "live", 40, "US residential design guide, live-load table (secondary, not a code table)"),
    ("roof_live", "roof_live", 20, "US residential design guide, live-load table (secondary, not a code table)"),
]


@pytest.mark.parametrize("name, key, psf, source", PRESETS)
def test_presets_resolve_to_their_values(tmp_path, name, key, psf, source):
    rules = load_rules(write(tmp_path, f'[[area_loads]]\nstorey = "L1"\npreset = "{name}"\n'))
    (entry,) = rules["area_loads"]
    assert entry[key] == pytest.approx(psf * PSF, rel=1e-9)  # value per `source`
    other = "live" if key == "roof_live" else "roof_live"
    assert entry[other] == 0.0 and entry["preset"] == name
    assert live_load_presets()[name][2].startswith(source.split(" (")[0])


def test_an_entry_overrides_its_preset(tmp_path):
    text = '[[area_loads]]\nspace_usage = "Bedroom"\npreset = "residential_sleeping"\nlive = "40 psf"\n'
    (entry,) = load_rules(write(tmp_path, text))["area_loads"]
    assert entry["live"] == pytest.approx(40 * PSF, rel=1e-9)  # the entry's 40 psf, not the preset's 30


def test_preset_table_rows_carry_source_and_status():
    presets = live_load_presets()
    assert len(presets) >= 6
    table = (rules_dir() / "presets" / "live_loads.csv").read_text(encoding="utf-8")
    header = next(line for line in table.splitlines() if line and not line.startswith("#"))
    assert header == "name,use,live,unit,source,status"
    rows = [line for line in table.splitlines() if line and not line.startswith("#")][1:]
    assert all(line.rsplit(",", 1)[1] in {"seen", "secondary"} for line in rows)


# --- member use by storey --------------------------------------------------------------------


def test_member_use_by_storey_comes_before_the_type(tmp_path):
    rules = load_rules(write(tmp_path, '[member_use_by_storey]\n"Roof" = "roof_no_ceiling"\n'))
    assert member_use(rules, "JOIST", "Roof") == "roof_no_ceiling"
    assert member_use(rules, "JOIST", "Level 2") == "floor"  # [member_use] JOIST default
    assert member_use(rules, "RAFTER") == "roof_nonplaster_ceiling"
    assert member_use(rules, "SOMETHING_ELSE") == "floor"


# --- mistakes: one message each, with the line -----------------------------------------------

MISTAKES = [
    # (file text, the message expected, line number in it)
    ("[defaults]\nwet_service = false\nbearing_lenght = '3 in'\n",
     "line 3: unknown key 'bearing_lenght' in [defaults]", 3),
    ("# project\n\n[defaults]\nself_weight_included = 'yes'\n", "line 4: [defaults] self_weight_included = 'yes' should be a bool", 4),
    ("[defaults]\n\nbearing_length = '0 in'\n", "line 3: [defaults] bearing_length = '0 in' must be positive", 3),
    ("[defaults]\nbearing_length = '3 kg'\n", "line 2: [defaults] bearing_length: '3 kg' is not a length", 2),
    ("[defaults]\nservice_temperature = 'warm'\n", "line 2: [defaults] service_temperature: cannot read 'warm'", 2),
    ("[defaults]\nshear_section = 'middle'\n", "line 2: [defaults] shear_section = 'middle'; expected one of", 2),
    ("[defaults]\nmax_bending_slope = 95.0\n", "line 2: [defaults] max_bending_slope = 95.0 must be between 0 and 90", 2),
    ("[defaults]\noverhang_ratio = -1.0\n", "line 2: [defaults] overhang_ratio = -1.0 must be between 0 and 10", 2),
    ("[defaults]\nslab_weight_included = 'no'\n", "line 2: [defaults] slab_weight_included = 'no' should be a bool", 2),
    ("# our loads\n\n[loads]\ndead = 1\n", "line 3: unknown section [loads]", 3),
    ("[member_use]\nJOIST = 'attic'\n", "line 2: [member_use] JOIST: member use 'attic' is not one of", 2),
    ("[member_use_by_storey]\n'Level 2' = 'floor'\n\"Attic\" = 'loft'\n",
     "line 3: [member_use_by_storey] Attic: member use 'loft' is not one of", 3),
    ("[area_loads]\nstorey = 'L1'\n", "line 1: area_loads should be a list of tables", 1),
    ("[defaults]\nself_weight_included = true\n\n[[area_loads]]\nstorey = \"Level 2\"\ndead = \"10 psf\"\nlive = \"40 kg\"\n",
     "project.toml line 7: [[area_loads]] #1 live = '40 kg' is not a pressure; expected units like psf or kPa", 7),
    ("[[area_loads]]\nstorey = 'L1'\nlive = '40'\n", "line 3: [[area_loads]] #1 live = '40' cannot be used: '40' has no unit", 3),
    ("[[area_loads]]\nstorey = 'L1'\nlive = 40\n", "line 3: [[area_loads]] #1 live = 40 should be a text with a unit", 3),
    ("[[area_loads]]\nstorey = 'L1'\ndead = '-5 psf'\n", "line 3: [[area_loads]] #1 dead = '-5 psf' must be zero or more", 3),
    ("[[area_loads]]\nstorey = 'L1'\nsnow = 'inf psf'\n", "line 3: [[area_loads]] #1 snow = 'inf psf' cannot be used: 'inf psf' is not a finite number", 3),
    ("[[area_loads]]\nstorey = 'L1'\nlive = '40 psf'\n\n[[area_loads]]\nstorey = 'L2'\nslab = 'S1'\nlive = '40 psf'\n",
     "line 7: [[area_loads]] #2 has storey and slab; expected exactly one of storey, slab, space_usage", 7),
    ("[[area_loads]]\nstorey = 'L1'\nlive = '40 psf'\n\n[[area_loads]]\nlive = '40 psf'\n",
     "line 5: [[area_loads]] #2 has none; expected exactly one of storey, slab, space_usage", 5),
    ("[[area_loads]]\nstorey = 'L1'\npreset = 'office'\n", "line 3: [[area_loads]] #1 preset = 'office' is not a preset", 3),
    ("[[area_loads]]\nstorey = 'L1'\n", "line 1: [[area_loads]] #1 gives no load; expected at least one of dead", 1),
    ("[[area_loads]]\nstorey = 'L1'\nlve = '40 psf'\n", "line 3: [[area_loads]] #1 has unknown key 'lve'", 3),
    ("[[area_loads]]\nstorey = ''\nlive = '40 psf'\n", "line 2: [[area_loads]] #1 storey = '' should be a name in quotes", 2),
]


@pytest.mark.parametrize("text, expected, line", MISTAKES, ids=[m[1].split(": ", 1)[1][:40] for m in MISTAKES])
def test_each_mistake_names_the_line_the_key_and_what_was_expected(tmp_path, text, expected, line):
    found = message(tmp_path, text)
    assert expected in found
    assert int(re.search(r"project\.toml line (\d+):", found).group(1)) == line


def test_the_line_named_holds_the_key(tmp_path):
    text = "[defaults]\nbearing_length = '1.5 in'\n\n[[area_loads]]\nstorey = 'L1'\ndead = '10 psf'\nlive = '40 kg'\n"
    number = int(re.search(r"line (\d+):", message(tmp_path, text)).group(1))
    assert text.splitlines()[number - 1].startswith("live =")


def test_a_dict_project_gets_the_same_messages_without_a_line():
    with pytest.raises(RulesError, match=r"^project rules: \[\[area_loads\]\] #1 live = '40 kg' is not a pressure"):
        load_rules({"area_loads": [{"storey": "L1", "live": "40 kg"}]})


# --- the starter example and the command line ------------------------------------------------


def test_the_example_loads_and_explains_every_key():
    text = example_text()
    path = rules_dir() / "example_project.toml"
    rules = load_rules(path)
    assert len(rules["area_loads"]) == 4
    assert {key for entry in rules["area_loads"] for key in ("storey", "slab", "space_usage") if key in entry} == {
        "storey", "slab", "space_usage"}
    keys = [*load_rules()["defaults"], "storey", "slab", "space_usage", "dead", "live", "roof_live", "snow", "preset"]
    lines = text.splitlines()
    for key in keys:
        numbers = [n for n, line in enumerate(lines) if re.match(rf"^{key} = ", line)]
        assert numbers, f"{key} missing from the example"
        # the first use of each key is explained on the line above it or at the end of its line
        n = numbers[0]
        assert lines[n - 1].startswith("#") or "#" in lines[n], key
    for section in ("[defaults]", "[member_use]", "[member_use_by_storey]", "[[area_loads]]", "[load_groups.names]"):
        assert section in text


def test_the_example_load_group_names_are_valid():
    from ifccheck.ifc.structural import load_group_rules

    group_rules = load_group_rules(load_rules(rules_dir() / "example_project.toml"))
    assert group_rules.name_label("FL") == "L"


def test_cli_prints_the_example(capsys):
    assert main(["rules", "--example"]) == 0
    assert capsys.readouterr().out == example_text()


def test_cli_writes_the_example_and_never_overwrites(tmp_path, capsys):
    target = tmp_path / "project.toml"
    assert main(["rules", "--example", "-o", str(target)]) == 0
    assert target.read_text(encoding="utf-8") == example_text()
    target.write_text("# mine\n", encoding="utf-8")
    assert main(["rules", "--example", "-o", str(target)]) == 2
    assert "already exists" in capsys.readouterr().err
    assert target.read_text(encoding="utf-8") == "# mine\n"


def test_check_with_a_bad_area_load_exits_2_naming_the_line(tmp_path, capsys):
    model = tmp_path / "studio.ifc"
    shutil.copy(SAMPLES / "quillfeather_imperial.ifc", model)
    rules = write(tmp_path, "[[area_loads]]\nstorey = 'Level 2'\n\nlive = '40 kg'\n")
    assert main(["check", str(model), "--rules", str(rules)]) == 2
    assert "project.toml line 4: [[area_loads]] #1 live = '40 kg' is not a pressure" in capsys.readouterr().err
    assert not (tmp_path / "studio.checked.ifc").exists()
