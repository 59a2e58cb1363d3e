"""The span search: the exact scaling for span-independent capacities agrees with a bisection on
the full checks, and at the span found the governing utilization is 1.0 (common practice)."""

import numpy as np
import pytest

from conftest import PLF
from ifccheck.design.nds import checks
from ifccheck.design.nds.basis import cd_by_load_type, combinations
from ifccheck.rules import load_rules


def test_exact_scaling_matches_bisection_on_the_same_checks():
    rules = load_rules()
    combos, _ = combinations()
    cd = cd_by_load_type()
    n = 30
    rng = np.random.default_rng(5)
    d = rng.choice([5.5, 7.25, 9.25, 11.25], n)
    cap = checks.SectionCapacity(
        b=np.full(n, 1.5), d=d, bearing_length=rng.uniform(1.5, 4, n), F_b_star_noCD=np.full(n, 1138.5),
        F_b_star_neg_noCD=np.full(n, 1138.5), C_fu=np.ones(n), glulam=np.zeros(n, bool), volume_x=np.full(n, 10.0),
        F_v_noCD=np.full(n, 180.0), F_c_perp_prime=np.full(n, 625.0), E_prime=np.full(n, 1.6e6),
        E_min_prime=np.full(n, 5.8e5), K_cr=np.full(n, 1.5), braced=np.ones(n, bool),
        unbraced_length=np.full(n, np.nan), n_live=np.full(n, 360.0), n_total=np.full(n, 240.0),
        shear_section=rules["defaults"]["shear_section"],
    )
    loads = np.zeros((n, 5))
    loads[:, 0] = rng.uniform(5, 30, n) * PLF
    loads[:, 1] = rng.uniform(20, 300, n) * PLF
    L = rng.uniform(60, 240, n)
    checked = checks.evaluate(L, loads, combos, cd, cap)
    exact = checks.allowable_span(L, loads, combos, cd, cap, checked)
    bisected = checks._bisected_spans(loads, combos, cd, cap, 720.0)
    assert exact == pytest.approx(bisected, abs=0.02)
    governing = checks.max_utilization(exact, loads, combos, cd, cap)
    assert governing == pytest.approx(np.ones(n), abs=1e-9)
