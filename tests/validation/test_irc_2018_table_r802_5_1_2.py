"""2018 International Residential Code, Table R802.5.1(2): ceiling joist spans for common lumber
species, uninhabitable attics with limited storage (live load 20 psf, dead load 10 psf, L/240).

The span search of the checker reproduces the table by the method the tables are computed with
(AWC, "how the span tables are calculated", common practice): simple span, Fb' = Fb·CF·Cr·CD with
Cr = 1.15 and CD = 1.0, bending under dead plus live load, deflection under live load only at
L/240 (the total-load deflection check is switched off for this comparison by an L/1 limit), no
self-weight beyond the tabulated dead load, compression edge braced. Every entry of the table
listed below must be reproduced within one inch.
"""


from conftest import PSF, member, run_basis

DRESSED_DEPTH = {"2x4": 3.5, "2x6": 5.5, "2x8": 7.25, "2x10": 9.25}

# spacing (in), species, grade: spans for 2x4, 2x6, 2x8, 2x10 (feet-inches), 2018 IRC Table R802.5.1(2)
TABLE = [
    (19.2, "Douglas Fir-Larch", "Select Structural", ["8-11", "14-0", "18-5", "23-7"]),
    (19.2, "Douglas Fir-Larch", "No.1", ["8-7", "12-6", "15-10", "19-5"]),
    (19.2, "Douglas Fir-Larch", "No.2", ["8-2", "11-11", "15-1", "18-5"]),
    (19.2, "Hem-Fir", "No.2", ["7-10", "11-7", "14-8", "17-10"]),
    (19.2, "Southern Pine", "No.2", ["7-4", "11-0", "13-11", "16-6"]),
    (19.2, "Spruce-Pine-Fir", "No.2", ["8-0", "11-9", "14-10", "18-2"]),
    (24, "Douglas Fir-Larch", "Select Structural", ["8-3", "13-0", "17-2", "21-3"]),
    (24, "Douglas Fir-Larch", "No.2", ["7-3", "10-8", "13-6", "16-5"]),
    (24, "Hem-Fir", "No.2", ["7-1", "10-4", "13-1", "16-0"]),
    (24, "Southern Pine", "No.2", ["6-7", "9-10", "12-6", "14-9"]),
    (24, "Spruce-Pine-Fir", "No.2", ["7-2", "10-6", "13-3", "16-3"]),
]


def _inches(feet_inches: str) -> int:
    feet, inches = feet_inches.split("-")
    return 12 * int(feet) + int(inches)


def _cases():
    for spacing, species, grade, spans in TABLE:
        for size, span in zip(DRESSED_DEPTH, spans):
            yield spacing, species, grade, size, _inches(span)


CASES = list(_cases())


def _records():
    inputs_common = {
        "DeadAreaLoad": 10 * PSF,
        "LiveAreaLoad": 20 * PSF,
        "SelfWeightIncluded": True,
        "RepetitiveMember": True,
        "ContinuouslyBraced": True,
        "LiveDeflectionLimit": 240,
        "TotalDeflectionLimit": 1,
        "BearingLength": 1.5,
    }
    return [
        member(1.5, DRESSED_DEPTH[size], 120.0,
               {**inputs_common, "TributaryWidth": spacing, "Species": species, "Grade": grade}, name=f"M{k}")
        for k, (spacing, species, grade, size, _) in enumerate(CASES)
    ]


def test_every_entry_within_one_inch():
    table = run_basis(_records())
    assert (table["status"] != "NOT_CHECKED").all(), table.loc[table["status"] == "NOT_CHECKED", "reason"].tolist()
    misses = []
    for (spacing, species, grade, size, published), found in zip(CASES, table["allowable_span"]):
        if abs(found - published) > 1.0:
            misses.append(f"{spacing} in {species} {grade} {size}: {found:.1f} in vs {published} in")
    assert not misses, misses
    assert len(CASES) == 44
