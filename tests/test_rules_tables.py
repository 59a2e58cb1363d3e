"""Structure of the design-data tables in rules/: headers, sources, status flags and aliases.

No published values are checked here (those are in tests/validation/); this module checks that
every table can be read as the package reads it and that the alias tables are unambiguous.
"""

import re
from itertools import product
from pathlib import Path

import pandas as pd
import pytest

RULES = Path(__file__).resolve().parents[1] / "rules"
STATUSES = {"seen", "derived", "memory"}
PROPERTIES = {"Fb", "Ft", "Fv", "Fc_perp", "Fc", "E", "Emin"}
PRODUCTS = {"dimension", "beams_stringers", "posts_timbers", "glulam"}
SPECIES = {"Douglas Fir-Larch", "Hem-Fir", "Spruce-Pine-Fir", "Southern Pine"}
GRADES = {"Select Structural", "No.1 & Btr", "No.1", "No.2", "24F-V4", "24F-1.8E"}

HEADERS = {
    "nds2018/reference_values.csv": "species,grade,product,nominal_depth,Fb,Fb_neg,Ft,Fv,Fc_perp,Fc,E,Emin,G,source,status,notes",
    "nds2018/species_aliases.csv": "alias,species",
    "nds2018/grade_aliases.csv": "alias,grade",
    "nds2018/size_factor.csv": "grade_group,nominal_depth_min,nominal_depth_max,CF_Fb_thick_2_3,CF_Fb_thick_4,CF_Ft,CF_Fc,source,status",
    "nds2018/flat_use.csv": "nominal_width_min,nominal_width_max,Cfu_thick_2_3,Cfu_thick_4,source,status",
    "nds2018/load_duration.csv": "load_type,duration,CD,source,status",
    "nds2018/wet_service.csv": "product,property,CM,keep_1_if_FCF_at_most,source,status",
    "nds2018/temperature.csv": "property,moisture,T_max_F,Ct,source,status",
    "nds2018/incising.csv": "property,Ci,source,status",
    "nds2018/effective_length.csv": "case,lu_over_d_min,lu_over_d_max,a,b,source,status",
    "nds2018/creep.csv": "product,service,Kcr,source,status,notes",
    "nds2018/nominal_sizes.csv": "nominal,dressed_in,applies_to,source,status",
    "asce7_16/asd_combinations.csv": "name,D,L,Lr,S,W,source,status",
    "ibc2018/deflection_limits.csv": "member_use,live_n,total_n,source,status",
    "materials/densities.csv": "word,unit_weight,unit,source,status",
}
SOURCED = [name for name, header in HEADERS.items() if header.endswith(("status", "status,notes"))]
# regional NDS species groups with values of their own: aliased to themselves (no reference rows), so a
# lookup fails instead of falling back to the main group
REGIONAL_GROUPS = {
    "douglas fir larch north": "Douglas Fir-Larch (North)",
    "douglas fir south": "Douglas Fir-South",
    "hem fir north": "Hem-Fir (North)",
    "spruce pine fir south": "Spruce-Pine-Fir (South)",
}
REGIONAL_WORDS = {"north", "south"}


def read_rules(relpath):
    return pd.read_csv(RULES / relpath, comment="#", skipinitialspace=True, keep_default_na=False, na_values=[""])


def normalise(text):
    """The alias rule: lowercase, each run of characters other than a-z and 0-9 -> one space, stripped."""
    return re.sub(r"[^a-z0-9]+", " ", text.lower()).strip()


def aliases(kind):
    table = read_rules(f"nds2018/{kind}_aliases.csv")
    return dict(zip(table["alias"], table[kind]))


def data_lines(relpath):
    lines = (RULES / relpath).read_text(encoding="utf-8").splitlines()
    return [line for line in lines if line.strip() and not line.startswith("#")]


@pytest.mark.parametrize("relpath", sorted(HEADERS))
def test_header_and_row_count(relpath):
    lines = data_lines(relpath)
    assert lines[0] == HEADERS[relpath]
    # a "#" inside a data line would silently cut it: every data line must come through as one row
    assert all("#" not in line for line in lines)
    table = read_rules(relpath)
    assert list(table.columns) == HEADERS[relpath].split(",")
    assert len(table) == len(lines) - 1 > 0


@pytest.mark.parametrize("relpath", SOURCED)
def test_every_row_has_source_and_valid_status(relpath):
    table = read_rules(relpath)
    assert table["source"].notna().all() and (table["source"].str.strip() != "").all()
    assert set(table["status"]) <= STATUSES


def test_reference_values_keys():
    table = read_rules("nds2018/reference_values.csv")
    assert set(table.species) <= SPECIES | {"*"}
    assert set(table.grade) <= GRADES
    assert set(table["product"]) <= PRODUCTS
    assert all(depth == "*" or depth.isdigit() for depth in table.nominal_depth)
    assert not table.duplicated(["species", "grade", "product", "nominal_depth"]).any()
    assert (table.loc[table.species == "*", "product"] == "glulam").all()


def test_reference_values_numeric_and_fb_neg_only_for_glulam():
    table = read_rules("nds2018/reference_values.csv")
    for column in ("Fb", "Fb_neg", "Ft", "Fv", "Fc_perp", "Fc", "E", "Emin", "G"):
        assert pd.api.types.is_numeric_dtype(table[column]), column
    assert table.loc[table["product"] != "glulam", "Fb_neg"].isna().all()
    assert table.loc[table["product"] == "glulam", "Fb_neg"].notna().all()
    assert table[["Fb", "Fv", "E", "Emin"]].notna().all().all()  # needed by every bending check
    assert (table.G.dropna().between(0.3, 0.7)).all()


def test_weaker_rows_say_why():
    table = read_rules("nds2018/reference_values.csv")
    weaker = table[table.status != "seen"]
    assert weaker["notes"].notna().all()
    assert (table.loc[table["product"] == "glulam", "status"] == "memory").all()


@pytest.mark.parametrize("kind", ["species", "grade"])
def test_aliases_are_normalised_and_unique(kind):
    table = read_rules(f"nds2018/{kind}_aliases.csv")
    assert all(normalise(alias) == alias for alias in table["alias"])
    assert not table["alias"].duplicated().any()


@pytest.mark.parametrize("kind", ["species", "grade"])
def test_every_canonical_name_is_its_own_alias(kind):
    canon = set(read_rules("nds2018/reference_values.csv")[kind]) - {"*"}
    mapping = aliases(kind)
    regional = set(REGIONAL_GROUPS.values()) if kind == "species" else set()
    assert set(mapping.values()) <= canon | regional
    for name in canon:
        assert mapping.get(normalise(name)) == name


def test_examples_of_the_alias_rule():
    species, grade = aliases("species"), aliases("grade")
    for text, name in [("DF-L", "Douglas Fir-Larch"), ("Douglas fir-larch", "Douglas Fir-Larch"),
                       ("D.Fir-L", "Douglas Fir-Larch"), ("S-P-F", "Spruce-Pine-Fir"),
                       ("Pine (Southern)", "Southern Pine"), ("SYP", "Southern Pine")]:
        assert species[normalise(text)] == name
    for text, name in [("No. 2", "No.2"), ("#2", "No.2"), ("N°2", "No.2"), ("Nr 2", "No.2"),
                       ("No.1 & Btr", "No.1 & Btr"), ("#1 & Better", "No.1 & Btr"), ("SS", "Select Structural"),
                       ("Sel Str", "Select Structural"), ("24F-V4", "24F-V4"), ("24F-1.8E", "24F-1.8E")]:
        assert grade[normalise(text)] == name


def test_regional_species_groups_map_to_themselves_and_have_no_values():
    species = aliases("species")
    for alias, group in REGIONAL_GROUPS.items():
        assert species[alias] == group
    assert not set(REGIONAL_GROUPS.values()) & set(read_rules("nds2018/reference_values.csv").species)


def _is_word_prefix(short, long):
    return long.startswith(short + " ")


def _is_word_suffix(short, long):
    return long.endswith(" " + short)


def test_no_species_alias_leads_or_ends_another_species_alias():
    # only exception: a regional group, which is the main group's alias plus the word north or south
    species = aliases("species")
    for short, long in product(species, repeat=2):
        if species[short] != species[long] and (_is_word_prefix(short, long) or _is_word_suffix(short, long)):
            base, _, last = long.rpartition(" ")
            assert species[long] in REGIONAL_GROUPS.values(), f"'{short}' is part of '{long}'"
            assert last in REGIONAL_WORDS and base in species, f"'{long}' is not a main alias + north/south"


def _readings(text, species, grade):
    """Every (species, grade) reading of a combined text split into two whole aliases, either order."""
    words = text.split()
    found = set()
    for cut in range(1, len(words)):
        head, tail = " ".join(words[:cut]), " ".join(words[cut:])
        if head in species and tail in grade:
            found.add((species[head], grade[tail]))
        if head in grade and tail in species:
            found.add((species[tail], grade[head]))
    return found


def _longest_run(tokens, mapping):
    """The longest alias found as a contiguous run of tokens: (target, start, end) or None."""
    for size in range(len(tokens), 0, -1):
        for start in range(len(tokens) - size + 1):
            alias = " ".join(tokens[start:start + size])
            if alias in mapping:
                return mapping[alias], start, start + size
    return None


def _longest_run_reading(text, species, grade):
    """Reading by longest alias run: species first, its words removed, then grade."""
    tokens = text.split()
    found_species = _longest_run(tokens, species)
    if found_species:
        tokens = tokens[:found_species[1]] + tokens[found_species[2]:]
    found_grade = _longest_run(tokens, grade)
    return (found_species and found_species[0], found_grade and found_grade[0])


def test_every_species_grade_combination_reads_one_way():
    species, grade = aliases("species"), aliases("grade")
    for s, g in product(species, grade):
        expected = (species[s], grade[g])
        for text in (f"{s} {g}", f"{g} {s}"):
            assert _readings(text, species, grade) == {expected}, f"'{text}' split into two aliases"
            assert _longest_run_reading(text, species, grade) == expected, f"'{text}' by longest alias run"


@pytest.mark.parametrize(("text", "expected"), [
    ("DF-L No.2", ("Douglas Fir-Larch", "No.2")),
    ("SPF #2", ("Spruce-Pine-Fir", "No.2")),
    ("Hem-Fir No. 1", ("Hem-Fir", "No.1")),
    ("SYP No.1", ("Southern Pine", "No.1")),
    ("Douglas Fir-Larch No.1 & Btr", ("Douglas Fir-Larch", "No.1 & Btr")),
    ("Select Structural Southern Pine", ("Southern Pine", "Select Structural")),
    ("HF N°2", ("Hem-Fir", "No.2")),
    ("SPF S.S.", ("Spruce-Pine-Fir", "Select Structural")),
    ("Spruce-Pine-Fir (South) No.2", ("Spruce-Pine-Fir (South)", "No.2")),
    ("Douglas Fir-South No.1", ("Douglas Fir-South", "No.1")),
])
def test_combined_texts(text, expected):
    species, grade = aliases("species"), aliases("grade")
    assert _readings(normalise(text), species, grade) == {expected}
    assert _longest_run_reading(normalise(text), species, grade) == expected


def test_ranges_do_not_overlap():
    size = read_rules("nds2018/size_factor.csv")
    for _, group in size.groupby("grade_group"):
        group = group.sort_values("nominal_depth_min")
        assert (group.nominal_depth_min.iloc[1:].values > group.nominal_depth_max.iloc[:-1].values).all()
    flat = read_rules("nds2018/flat_use.csv").sort_values("nominal_width_min")
    assert (flat.nominal_width_min.iloc[1:].values > flat.nominal_width_max.iloc[:-1].values).all()


def test_factor_tables_cover_products_and_properties():
    wet = read_rules("nds2018/wet_service.csv")
    assert set(zip(wet["product"], wet.property)) == set(product(PRODUCTS, PROPERTIES))
    temperature = read_rules("nds2018/temperature.csv")
    assert set(zip(temperature.property, temperature.moisture, temperature.T_max_F)) == set(
        product(PROPERTIES, ("dry", "wet"), (100, 125, 150)))
    assert set(read_rules("nds2018/incising.csv").property) == PROPERTIES
    creep = read_rules("nds2018/creep.csv")
    assert set(zip(creep["product"], creep.service)) == set(product(PRODUCTS, ("dry", "wet")))
    assert set(read_rules("nds2018/load_duration.csv").load_type) == {"D", "L", "Lr", "S", "W"}


def test_nominal_sizes_keys():
    sizes = read_rules("nds2018/nominal_sizes.csv")
    assert set(sizes.applies_to) == {"dimension", "timber"}
    assert not sizes.duplicated(["nominal", "applies_to"]).any()
    assert (sizes.dressed_in < sizes.nominal).all()
