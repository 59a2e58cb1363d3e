"""Direct sizing relations of a simply supported member under uniform load (common practice):
with w in plf, L in ft and stresses in psi, A >= 0.75 wL/F'v (in²), S >= 1.5 wL²/F'b (in³) and
I >= 450 wL³/E' for L/240 (in⁴), scaled by 360/240 for L/360 and 180/240 for L/180.

The checker's required properties for the governing case must equal these relations.
"""

import pytest

from conftest import PLF, member, run_basis

W_PLF, L_FT = 120.0, 14.0


def _checked(n_live):
    # live load only, no self-weight, braced, dry, 70 F: F'b = Fb·CF·Cr, F'v = Fv, E' = E (CD 1.0)
    inputs = {
        "LiveLoad": W_PLF * PLF,
        "SelfWeightIncluded": True,
        "ContinuouslyBraced": True,
        "RepetitiveMember": False,
        "BearingLength": 1.5,
        "LiveDeflectionLimit": n_live,
        "TotalDeflectionLimit": n_live,
        "Species": "DF-L",
        "Grade": "No.2",
    }
    # a clear span of L - 1.5 in gives the design span L (NDS 3.2.1)
    rules = {"defaults": {"shear_section": "support_centre"}}
    return run_basis([member(1.5, 11.25, L_FT * 12 - 1.5, inputs, clear=True)], rules).iloc[0]


def test_required_area_section_modulus_and_inertia_L_240():
    row = _checked(240)
    assert row.design_span == pytest.approx(L_FT * 12)
    F_v, F_b, E = 180.0, 900.0 * 1.0, 1_600_000.0  # DF-L No.2, CF 1.0 for 2x12, Cr 1.0
    assert row.required_A == pytest.approx(0.75 * W_PLF * L_FT / F_v, rel=1e-9)
    assert row.required_S == pytest.approx(1.5 * W_PLF * L_FT**2 / F_b, rel=1e-9)
    assert row.required_I == pytest.approx(450 * W_PLF * L_FT**3 / E, rel=1e-9)


@pytest.mark.parametrize("n", [360, 180])
def test_required_inertia_scales_with_the_limit(n):
    row = _checked(n)
    assert row.required_I == pytest.approx(450 * W_PLF * L_FT**3 / 1_600_000.0 * n / 240, rel=1e-9)
