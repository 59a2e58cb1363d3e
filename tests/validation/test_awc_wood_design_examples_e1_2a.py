"""AWC, *NDS Structural Wood Design Examples 2015/2018*, Example E1.2a: beam stability of a
4x16 Douglas Fir-Larch Select Structural beam, 20 ft simple span, concentrated load at midspan,
no lateral support between the ends.

Published: le 375 in (= 1.37·240 + 3·15.25), RB 21.6, FbE 1776 psi, CL 0.876, F'b 1313 psi,
with CD = CM = Ct = Ci = Cr = 1.0 and CF = 1.0 (4 in thick, 14 in and wider).
The example's load is concentrated; this foundation issue's member analysis is uniform-load only,
so the example is checked through the clause functions and the rules tables (effective-length
row for a concentrated load at centre, size factor row, reference values) that the checker uses.
"""

import numpy as np
import pytest

from ifccheck.design.nds import factors, values

B, D, LU = 3.5, 15.25, 240.0  # example's section (in) and unbraced length (in)


def test_reference_values_used_by_the_example():
    # NDS Supplement 2018, Table 4A, DF-L Select Structural, as listed in Example E1.2a (exact)
    row = values.reference_values("Douglas Fir-Larch", "Select Structural", "dimension", 16)
    assert (row["Fb"], row["E"], row["Emin"], row["Fc_perp"], row["Fv"]) == (1500, 1_900_000, 690_000, 625, 180)


def test_dressed_size_of_4x16():
    # Example E1.2a: a 4x16 is 3.5 x 15.25 in (within 0.001 in)
    assert values.nominal_size(3.5) == (4.0, True)
    assert values.nominal_size(15.25) == (16.0, True)


def test_size_factor_is_one_for_4x16():
    # NDS Supplement 2018, Table 4A: 4 in thick, 14 in and wider -> CF 1.0 (as used in E1.2a)
    assert factors.C_F_dimension(np.array([4.0]), np.array([16.0]))[0] == pytest.approx(1.0, abs=1e-12)


def test_effective_length_375_in():
    le = factors.effective_length(np.array([LU]), np.array([D]), "single_span_point_centre")[0]
    assert le == pytest.approx(375.0, abs=0.5)  # published: 375 in (rounded)


def test_slenderness_fbe_cl_and_allowable_bending_stress():
    le = factors.effective_length(np.array([LU]), np.array([D]), "single_span_point_centre")
    RB = factors.R_B(le, np.array([D]), np.array([B]))
    assert RB[0] == pytest.approx(21.6, abs=0.05)  # published 21.6
    FbE = factors.F_bE(np.array([690000.0]), RB)
    assert FbE[0] == pytest.approx(1776, abs=1.0)  # published 1776 psi
    Fb_star = 1500.0 * 1.0  # Fb·CD·CM·Ct·CF·Ci·Cr, all factors 1.0 in the example
    CL = factors.C_L(FbE, np.array([Fb_star]))
    assert CL[0] == pytest.approx(0.876, abs=0.0005)  # published 0.876
    assert Fb_star * CL[0] == pytest.approx(1313, abs=1.0)  # published F'b 1313 psi
