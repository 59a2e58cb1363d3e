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
    F_b_star_neg_noCD: np.ndarray  # the same for negative moment (glulam Fbx−; sawn lumber as above)
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

    def subset(self, mask: np.ndarray) -> "SectionCapacity":
        """The capacities of the members selected by a boolean mask."""
        return SectionCapacity(**{
            name: (value[mask] if isinstance(value, np.ndarray) else value) for name, value in vars(self).items()
        })

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


def shear_offset(cap: SectionCapacity) -> np.ndarray:
    """Distance from a support's centreline to the section where shear is taken (in)."""
    if cap.shear_section == "support_centre":
        return np.zeros_like(cap.d)
    if cap.shear_section == "d_from_face":
        return cap.bearing_length / 2.0 + cap.d  # NDS 3.4.3.1(a): load within d of the face ignored
    return cap.bearing_length / 2.0


def shear_arm(L: np.ndarray, cap: SectionCapacity) -> np.ndarray:
    """Distance from the shear section to midspan, so that V = w·arm for a uniform load (in)."""
    return np.maximum(L / 2.0 - shear_offset(cap), 0.0)


@dataclass
class Demands:
    """Load effects per member and combination (arrays (n, m)), from closed-form formulas or from
    the beam analysis; positions ``x_*`` in inches from the member's start.

    ``le_pos`` / ``le_neg``: effective unbraced length (NDS Table 3.3.3) of the edge in compression
    under positive / negative moment, NaN where that edge is held (CL = 1.0). ``bearing``: the
    largest bearing utilization over the supports (CD does not apply to Fc⊥). ``deflection_live``
    and ``deflection_total``: deflection over its allowed value, largest over spans and cantilevers.
    ``uplift``: the smallest reaction (negative = uplift), lbf.
    """

    M_pos: np.ndarray
    x_pos: np.ndarray
    le_pos: np.ndarray
    lu_pos: np.ndarray  # the unbraced length behind le_pos (NaN where held), in
    M_neg: np.ndarray
    x_neg: np.ndarray
    le_neg: np.ndarray
    lu_neg: np.ndarray
    V: np.ndarray
    x_V: np.ndarray
    R: np.ndarray
    bearing: np.ndarray
    x_bearing: np.ndarray
    deflection_live: np.ndarray
    x_deflection_live: np.ndarray
    deflection_total: np.ndarray
    x_deflection_total: np.ndarray
    uplift: np.ndarray
    x_uplift: np.ndarray
    zero_moment_length: np.ndarray  # length between points of zero moment for CV (n, m), in


def beam_stability(le: np.ndarray, F_b_star: np.ndarray, cap: SectionCapacity):
    """NDS 3.3.3: CL per member and combination from the effective length le (n, m; NaN = edge held),
    whether RB exceeds 50 (not permitted, NDS 3.3.3.7), and RB and FbE (NaN where the edge is held)."""
    held = np.isnan(le) | (cap.d <= cap.b)[:, None]  # NDS 3.3.3.1-3.3.3.3
    RB = factors.R_B(np.where(held, 1.0, le), cap.d[:, None], cap.b[:, None])
    F_bE = factors.F_bE(cap.E_min_prime[:, None], RB)
    C_L = factors.C_L(F_bE, F_b_star)
    return np.where(held, 1.0, C_L), ~held & (RB > 50.0), np.where(held, np.nan, RB), np.where(held, np.nan, F_bE)


def utilizations(dem: Demands, CD: np.ndarray, cap: SectionCapacity) -> dict:
    """NDS 2018 ASD checks of given demands: utilizations ``util`` (5 checks, n, m) with the
    stresses and factors of the calculation trail. CD (n, m) per member and combination."""
    S = cap.S[:, None]
    C_V = factors.C_V(dem.zero_moment_length / 12.0, cap.d[:, None], cap.b[:, None], cap.volume_x[:, None])

    def bending(M, le, F_b_star_noCD):
        # NDS 3.3: fb = M/S ≤ F'b = Fb·CD·CM·Ct·CL·CF·Cfu·Ci·Cr; glulam: min(CL, CV) (NDS 5.3.6)
        F_b_star = F_b_star_noCD[:, None] * CD
        C_L, slender, RB, F_bE = beam_stability(le, F_b_star, cap)
        C_L_or_V = np.where(cap.glulam[:, None], np.minimum(C_L, C_V), C_L)
        F_b_prime = F_b_star * cap.C_fu[:, None] * C_L_or_V
        return M / S, F_b_prime, C_L, slender, RB, F_bE

    f_pos, F_pos, CL_pos, slender_pos, RB_pos, FbE_pos = bending(dem.M_pos, dem.le_pos, cap.F_b_star_noCD)
    f_neg, F_neg, CL_neg, slender_neg, RB_neg, FbE_neg = bending(dem.M_neg, dem.le_neg, cap.F_b_star_neg_noCD)
    u_pos = np.where(slender_pos & (dem.M_pos > 0), np.inf, f_pos / F_pos)
    u_neg = np.where(slender_neg & (dem.M_neg > 0), np.inf, f_neg / F_neg)
    negative = u_neg > u_pos
    f_v = 1.5 * dem.V / cap.A[:, None]  # NDS 3.4.2: fv = 3V/(2bd)
    F_v_prime = cap.F_v_noCD[:, None] * CD
    util = np.stack([np.maximum(u_pos, u_neg), f_v / F_v_prime, dem.deflection_live, dem.deflection_total,
                     dem.bearing])
    pick = lambda a, b: np.where(negative, b, a)  # noqa: E731 - the edge that governs bending
    return {
        "util": util,
        "CD": CD,
        "C_L": pick(CL_pos, CL_neg),
        "R_B": pick(RB_pos, RB_neg),
        "F_bE": pick(FbE_pos, FbE_neg),
        "too_slender": pick(slender_pos, slender_neg),
        "bending_edge": np.where(negative, "bottom", "top"),
        "x_bending": pick(dem.x_pos, dem.x_neg),
        "le_bending": pick(dem.le_pos, dem.le_neg),
        "lu_bending": pick(dem.lu_pos, dem.lu_neg),
        "f_b": pick(f_pos, f_neg),
        "F_b_prime": pick(F_pos, F_neg),
        "f_v": f_v,
        "F_v_prime": F_v_prime,
        "uplift": dem.uplift,
    }


def closed_form_demands(L: np.ndarray, loads: np.ndarray, combos: np.ndarray, cap: SectionCapacity) -> Demands:
    """Demands on simple spans L (in) under uniform line loads ``loads`` (n, 5) lbf/in; the member's
    start is taken at the outer edge of its first bearing (support centre at lb/2)."""
    w = loads @ combos.T  # (n, m) combined line load
    L2 = L[:, None]
    lb = cap.bearing_length[:, None]
    shape = w.shape
    M = w * L2**2 / 8.0  # common practice: M = wL²/8
    # the top edge is in compression under downward load; under net uplift the bottom edge, unbraced
    lu = np.where(np.isnan(cap.unbraced_length), L, cap.unbraced_length)
    le = np.broadcast_to(factors.effective_length(lu, cap.d, "single_span_uniform")[:, None], shape)  # NDS Table 3.3.3
    le_top = np.where(cap.braced[:, None], np.nan, le)
    lu_top = np.where(cap.braced[:, None], np.nan, np.broadcast_to(lu[:, None], shape))
    le_bottom = np.broadcast_to(factors.effective_length(L, cap.d, "single_span_uniform")[:, None], shape)
    midspan = np.broadcast_to(lb / 2.0 + L2 / 2.0, shape)
    R = w * L2 / 2.0
    # deflection, NDS 3.5: Δ = 5wL⁴/(384 E'I); long-term ΔT = Kcr·ΔLT + ΔST (NDS 3.5.2)
    unit_deflection = (5.0 * L**4 / (384.0 * cap.E_prime * cap.I))[:, None]
    live = loads[:, _LIVE_TYPES] @ combos[:, _LIVE_TYPES].T
    dead = loads[:, [_DEAD]] * combos[None, :, _DEAD]
    return Demands(
        M_pos=np.maximum(M, 0.0), x_pos=midspan, le_pos=le_top, lu_pos=lu_top,
        M_neg=np.maximum(-M, 0.0), x_neg=midspan, le_neg=le_bottom, lu_neg=np.broadcast_to(L2, shape),
        V=np.abs(w) * shear_arm(L, cap)[:, None],
        x_V=np.broadcast_to(lb / 2.0 + shear_offset(cap)[:, None], shape),
        R=np.maximum(R, 0.0),
        bearing=np.maximum(R, 0.0) / (cap.b * cap.bearing_length * cap.F_c_perp_prime)[:, None],  # NDS 3.10.2
        x_bearing=np.broadcast_to(lb / 2.0, shape),
        deflection_live=unit_deflection * np.abs(live) / (L2 / cap.n_live[:, None]),
        x_deflection_live=midspan,
        deflection_total=unit_deflection * np.abs(cap.K_cr[:, None] * dead + live) / (L2 / cap.n_total[:, None]),
        x_deflection_total=midspan,
        uplift=np.minimum(R, 0.0),
        x_uplift=np.broadcast_to(lb / 2.0, shape),
        zero_moment_length=np.broadcast_to(L2, shape),
    )


def evaluate(L: np.ndarray, loads: np.ndarray, combos: np.ndarray, cd_by_type: np.ndarray, cap: SectionCapacity) -> dict:
    """All checks of simple spans L (in) under uniform line loads ``loads`` (n, 5) lbf/in."""
    dem = closed_form_demands(L, loads, combos, cap)
    result = utilizations(dem, load_duration_factors(loads, combos, cd_by_type), cap)
    result["demands"] = dem
    return result


def max_utilization(L, loads, combos, cd_by_type, cap) -> np.ndarray:
    """Largest utilization over all checks and combinations, per member."""
    return evaluate(L, loads, combos, cd_by_type, cap)["util"].max(axis=(0, 2))


def allowable_span(L: np.ndarray, loads, combos, cd_by_type, cap, checked: dict, longest: float = 720.0) -> np.ndarray:
    """Longest design span (in) at which each member still passes every check, capped at ``longest``.

    ``checked`` is :func:`evaluate` at the spans L. Where no capacity depends on the span (CL = 1 or
    a fixed unbraced length, no volume factor, no net uplift) each check scales with a power of the
    span and the answer is exact (:func:`_scaled_spans`); elsewhere a vectorised bisection runs on
    the same checks.
    """
    span = np.minimum(_scaled_spans(L, checked["util"], cap), longest)
    dem = checked["demands"]
    fixed_lu = cap.braced | (cap.d <= cap.b) | np.isfinite(cap.unbraced_length)
    scalable = fixed_lu & ~cap.glulam & ~(dem.M_neg > 0).any(axis=1)
    if not scalable.all():
        rest = ~scalable
        span[rest] = _bisected_spans(loads[rest], combos, cd_by_type, cap.subset(rest), longest)
    return span


def _scaled_spans(L: np.ndarray, util: np.ndarray, cap: SectionCapacity) -> np.ndarray:
    """Span at which the first check reaches 1.0 when utilizations scale as: bending L², shear
    (L/2 − offset) for V at a section ``offset`` from the support, deflection L³ (Δ ∝ L⁴ against
    L/n), bearing L (common practice, simple span under uniform load)."""
    L0 = L[:, None]
    offset = shear_offset(cap)[:, None]
    with np.errstate(divide="ignore", invalid="ignore"):
        spans = np.stack([
            L0 * util[0] ** -0.5,
            2.0 * (offset + (L0 / 2.0 - offset) / util[1]),
            L0 * util[2] ** (-1.0 / 3.0),
            L0 * util[3] ** (-1.0 / 3.0),
            L0 / util[4],
        ])
    spans = np.where(np.isnan(spans), np.inf, spans)
    return spans.min(axis=(0, 2))


def _bisected_spans(loads, combos, cd_by_type, cap, longest: float, tol: float = 0.01) -> np.ndarray:
    """Longest span passing every check by bisection between 1 in and ``longest`` (utilization rises
    with span); ``longest`` if that passes, 0 if even 1 in fails."""
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
