"""Vectorised NDS 2018 checks of simply supported members under uniform load.

Every array has one entry per member (shape ``(n,)``) or one per member and load combination
(shape ``(n, m)``). Core units throughout: inch, lbf, psi, lbf/in. Nothing here loops over members.

The per-member inputs come as a :class:`SectionCapacity` whose strengths already carry every
adjustment factor that does not depend on the combination (CM, Ct, CF, Ci, Cr; Cb on bearing);
the load duration factor CD and the beam stability factor CL are applied here per combination.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from ...model import LOAD_TYPES
from . import factors

CHECKS = ("BENDING", "SHEAR", "DEFLECTION_LIVE", "DEFLECTION_TOTAL", "BEARING")
_LIVE_TYPES = [LOAD_TYPES.index(t) for t in ("L", "Lr", "S")]  # IBC Table 1604.3: L, Lr, S columns
_DEAD = LOAD_TYPES.index("D")


@dataclass
class SectionCapacity:
    """Per-member section and adjusted strengths (arrays of shape (n,), core units)."""

    b: np.ndarray  # width across the bending plane, in
    d: np.ndarray  # depth in the bending plane, in
    bearing_length: np.ndarray  # lb at each support, in
    F_b_star_noCD: np.ndarray  # Fb·CM·Ct·CF·Ci·Cr (Fb* of NDS 3.3.3.8 without CD), psi
    C_fu: np.ndarray
    glulam: np.ndarray  # bool: the volume factor applies instead of CL where smaller (NDS 5.3.6)
    volume_x: np.ndarray  # exponent x of the volume factor (10, or 20 for Southern Pine)
    F_v_noCD: np.ndarray  # Fv·CM·Ct·Ci, psi
    F_c_perp_prime: np.ndarray  # Fc⊥·CM·Ct·Ci·Cb, psi (CD does not apply)
    E_prime: np.ndarray  # E·CM·Ct·Ci, psi
    E_min_prime: np.ndarray  # Emin·CM·Ct·Ci·CT, psi
    K_cr: np.ndarray  # NDS 3.5.2 creep factor on dead-load deflection
    braced: np.ndarray  # bool: compression edge held along its length
    unbraced_length: np.ndarray  # lu, in; NaN = the design span
    n_live: np.ndarray  # n of L/n for live-type loads
    n_total: np.ndarray  # n of L/n for long-term plus live deflection
    shear_section: str = "support_face"  # or "support_centre", "d_from_face" (NDS 3.4.3.1)

    @property
    def A(self):
        return self.b * self.d

    @property
    def S(self):
        return self.b * self.d**2 / 6.0

    @property
    def I(self):
        return self.b * self.d**3 / 12.0


def load_duration_factors(loads: np.ndarray, combos: np.ndarray, cd_by_type: np.ndarray) -> np.ndarray:
    """NDS 2.3.2: CD per member and combination, the largest CD among the loads the combination carries.

    ``loads`` (n, 5) line loads by type, ``combos`` (m, 5) coefficients, ``cd_by_type`` (5,).
    """
    carried = (combos[None, :, :] > 0) & (loads[:, None, :] != 0)
    carried[:, :, _DEAD] = True  # dead load is always present
    return np.max(np.where(carried, cd_by_type[None, None, :], 0.0), axis=2)


def shear_arm(L: np.ndarray, cap: SectionCapacity) -> np.ndarray:
    """Distance from the shear section to midspan, so that V = w·arm for a uniform load (in)."""
    if cap.shear_section == "support_centre":
        return L / 2.0
    face = L / 2.0 - cap.bearing_length / 2.0
    if cap.shear_section == "d_from_face":
        return np.maximum(face - cap.d, 0.0)  # NDS 3.4.3.1(a): load within d of the face ignored
    return np.maximum(face, 0.0)


def beam_stability(L: np.ndarray, w: np.ndarray, CD: np.ndarray, cap: SectionCapacity):
    """NDS 3.3.3: CL per member and combination, and whether RB exceeds 50 (not permitted).

    Under net uplift (w < 0) the bottom edge is in compression and taken as unbraced over the span.
    """
    lu = np.where(np.isnan(cap.unbraced_length), L, cap.unbraced_length)
    le = factors.effective_length(lu, cap.d, "single_span_uniform")  # NDS Table 3.3.3
    RB = factors.R_B(le, cap.d, cap.b)
    F_bE = factors.F_bE(cap.E_min_prime, RB)[:, None]
    C_L = factors.C_L(F_bE, cap.F_b_star_noCD[:, None] * CD)
    held = (cap.braced[:, None] & (w >= 0)) | (cap.d <= cap.b)[:, None]  # NDS 3.3.3.1-3.3.3.3
    C_L = np.where(held, 1.0, C_L)
    too_slender = ~held & (RB[:, None] > 50.0)  # NDS 3.3.3.7
    return C_L, too_slender


def evaluate(L: np.ndarray, loads: np.ndarray, combos: np.ndarray, cd_by_type: np.ndarray, cap: SectionCapacity) -> dict:
    """All checks of a simple span L (in) under uniform line loads ``loads`` (n, 5) lbf/in.

    Returns arrays: per-combination utilizations ``util`` (5 checks, n, m) and the governing
    combination's stresses, factors and demands for the calculation trail.
    """
    w = loads @ combos.T  # (n, m) combined line load
    CD = load_duration_factors(loads, combos, cd_by_type)
    L2 = L[:, None]

    # bending, NDS 3.3: fb = M/S ≤ F'b = Fb·CD·CM·Ct·CL·CF·Cfu·Ci·Cr (min(CL, CV) for glulam)
    M = np.abs(w) * L2**2 / 8.0
    f_b = M / cap.S[:, None]
    C_L, too_slender = beam_stability(L, w, CD, cap)
    C_V = factors.C_V(L / 12.0, cap.d, cap.b, cap.volume_x)[:, None]
    C_L_or_V = np.where(cap.glulam[:, None], np.minimum(C_L, C_V), C_L)  # NDS 5.3.6: not cumulative
    F_b_prime = cap.F_b_star_noCD[:, None] * CD * cap.C_fu[:, None] * C_L_or_V

    # shear, NDS 3.4.2: fv = 3V/(2bd) ≤ F'v
    V = np.abs(w) * shear_arm(L, cap)[:, None]
    f_v = 1.5 * V / cap.A[:, None]
    F_v_prime = cap.F_v_noCD[:, None] * CD

    # bearing, NDS 3.10.2: fc⊥ = R/(b·lb) ≤ F'c⊥ (downward reactions)
    R = np.maximum(w, 0.0) * L2 / 2.0
    f_c_perp = R / (cap.b * cap.bearing_length)[:, None]

    # deflection, NDS 3.5: Δ = 5wL⁴/(384 E'I); long-term ΔT = Kcr·ΔLT + ΔST (NDS 3.5.2)
    unit_deflection = (5.0 * L**4 / (384.0 * cap.E_prime * cap.I))[:, None]
    live = loads[:, _LIVE_TYPES] @ combos[:, _LIVE_TYPES].T
    dead = loads[:, [_DEAD]] * combos[None, :, _DEAD]
    delta_live = unit_deflection * np.abs(live)
    delta_total = unit_deflection * np.abs(cap.K_cr[:, None] * dead + live)

    util = np.stack(
        [
            np.where(too_slender, np.inf, f_b / F_b_prime),
            f_v / F_v_prime,
            delta_live / (L2 / cap.n_live[:, None]),
            delta_total / (L2 / cap.n_total[:, None]),
            f_c_perp / cap.F_c_perp_prime[:, None],
        ]
    )
    return {
        "util": util,
        "w": w,
        "CD": CD,
        "C_L": C_L,
        "C_L_or_V": C_L_or_V,
        "too_slender": too_slender,
        "M": M,
        "V": V,
        "R": R,
        "f_b": f_b,
        "F_b_prime": F_b_prime,
        "f_v": f_v,
        "F_v_prime": F_v_prime,
        "f_c_perp": f_c_perp,
        "delta_live": delta_live,
        "delta_total": delta_total,
    }


def max_utilization(L, loads, combos, cd_by_type, cap) -> np.ndarray:
    """Largest utilization over all checks and combinations, per member."""
    return evaluate(L, loads, combos, cd_by_type, cap)["util"].max(axis=(0, 2))


def allowable_span(loads, combos, cd_by_type, cap, longest: float = 720.0, tol: float = 0.01) -> np.ndarray:
    """Longest design span (in) at which each member still passes every check: a vectorised bisection
    on the same checks (utilization rises with span). Capped at ``longest``; 0 if even 1 in fails."""
    n = loads.shape[0]
    lo = np.full(n, 1.0)
    hi = np.full(n, float(longest))
    ok_hi = max_utilization(hi, loads, combos, cd_by_type, cap) <= 1.0
    ok_lo = max_utilization(lo, loads, combos, cd_by_type, cap) <= 1.0
    while np.any(hi - lo > tol):
        mid = 0.5 * (lo + hi)
        ok = max_utilization(mid, loads, combos, cd_by_type, cap) <= 1.0
        lo = np.where(ok, mid, lo)
        hi = np.where(ok, hi, mid)
    return np.where(ok_hi, float(longest), np.where(ok_lo, lo, 0.0))
