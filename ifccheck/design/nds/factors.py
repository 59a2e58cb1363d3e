"""NDS 2018 adjustment factors, as small functions named after the standard's symbols.

Table-based factors read their numbers from rules/nds2018/*.csv; formula-based ones are written
out here with their clause. Every function accepts numpy arrays (one entry per member) and
returns arrays of the same shape. Units: inch, psi, degrees Fahrenheit, feet where a clause
says so (the volume factor's L).
"""

from __future__ import annotations

import numpy as np

from ...rules import read_table

def C_M(product: np.ndarray, prop: str, wet: np.ndarray, F_times_CF: np.ndarray | None = None) -> np.ndarray:
    """NDS Supplement 2018, Tables 4A/4B/4D/5A adjustment notes: wet service factor.

    ``product`` per member (dimension, beams_stringers, posts_timbers, glulam), ``wet`` True where
    the moisture content in service exceeds the dry limit. For dimension lumber CM stays 1.0 where
    Fb·CF ≤ 1150 psi (Fb) or Fc·CF ≤ 750 psi (Fc); pass those products as ``F_times_CF`` (psi).
    """
    rows = read_table("nds2018/wet_service.csv")
    rows = rows[rows["property"] == prop].set_index("product")
    product = np.asarray(product)
    cm = np.ones(product.shape)
    for name, row in rows.iterrows():
        hit = (product == name) & np.asarray(wet, dtype=bool)
        value = np.full(product.shape, float(row["CM"]))
        threshold = row["keep_1_if_FCF_at_most"]
        if F_times_CF is not None and np.isfinite(threshold):
            value = np.where(np.asarray(F_times_CF) <= float(threshold), 1.0, value)
        cm = np.where(hit, value, cm)
    return cm


def C_t(prop: str, temperature_F: np.ndarray, wet: np.ndarray) -> np.ndarray:
    """NDS 2018, 2.3.3 and Table 2.3.3: temperature factor for sustained exposure up to 150 °F."""
    rows = read_table("nds2018/temperature.csv")
    rows = rows[rows["property"] == prop].sort_values("T_max_F")
    temperature_F = np.asarray(temperature_F, dtype=float)
    moisture = np.where(np.asarray(wet, dtype=bool), "wet", "dry")
    ct = np.full(temperature_F.shape, np.nan)  # above the last row: outside NDS 2.3.3 scope
    for state in ("dry", "wet"):
        band = rows[rows["moisture"] == state]
        for t_max, value in zip(band["T_max_F"][::-1], band["Ct"][::-1]):
            ct = np.where((moisture == state) & (temperature_F <= float(t_max)), float(value), ct)
    return ct


def C_i(prop: str, incised: np.ndarray) -> np.ndarray:
    """NDS 2018, 4.3.8 and Table 4.3.8: incising factor for incised dimension lumber."""
    value = float(read_table("nds2018/incising.csv").set_index("property").loc[prop, "Ci"])
    return np.where(np.asarray(incised, dtype=bool), value, 1.0)


def C_F_dimension(nominal_thickness: np.ndarray, nominal_width: np.ndarray, prop: str = "Fb") -> np.ndarray:
    """NDS Supplement 2018, Table 4A adjustment factors: size factor CF of dimension lumber.

    Nominal sizes in inches (thickness = the narrow face, width = the wide face). Returns NaN where
    the table has no entry.
    """
    rows = read_table("nds2018/size_factor.csv")
    rows = rows[rows["grade_group"] == "structural"]
    t = np.asarray(nominal_thickness, dtype=float)
    w = np.asarray(nominal_width, dtype=float)
    cf = np.full(w.shape, np.nan)
    for _, row in rows.iterrows():
        in_band = (w >= row["nominal_depth_min"]) & (w <= row["nominal_depth_max"])
        if prop == "Fb":
            value = np.where(t >= 4, row["CF_Fb_thick_4"], row["CF_Fb_thick_2_3"])
        else:
            value = np.full(w.shape, float(row[f"CF_{prop}"]))
        cf = np.where(in_band, value, cf)
    return cf


def C_F_timber(d: np.ndarray) -> np.ndarray:
    """NDS 2018, 4.3.6.2: size factor of sawn timbers deeper than 12 in, CF = (12/d)^(1/9) on Fb (d in in)."""
    d = np.asarray(d, dtype=float)
    return np.where(d > 12.0, (12.0 / d) ** (1.0 / 9.0), 1.0)  # NDS 4.3.6.2


def C_fu(nominal_thickness: np.ndarray, nominal_width: np.ndarray, flat: np.ndarray) -> np.ndarray:
    """NDS Supplement 2018, Table 4A: flat use factor on Fb where dimension lumber is loaded on its wide face."""
    rows = read_table("nds2018/flat_use.csv")
    t = np.asarray(nominal_thickness, dtype=float)
    w = np.asarray(nominal_width, dtype=float)
    cfu = np.ones(w.shape)
    for _, row in rows.iterrows():
        in_band = (w >= row["nominal_width_min"]) & (w <= row["nominal_width_max"])
        value = np.where(t >= 4, row["Cfu_thick_4"], row["Cfu_thick_2_3"])
        value = np.where(np.isfinite(value), value, 1.0)
        cfu = np.where(in_band & np.asarray(flat, dtype=bool), value, cfu)
    return cfu


def C_r(repetitive: np.ndarray) -> np.ndarray:
    """NDS 2018, 4.3.9: repetitive member factor 1.15 on Fb of dimension lumber in a repetitive system."""
    return np.where(np.asarray(repetitive, dtype=bool), 1.15, 1.0)  # NDS 4.3.9


def C_V(L_ft: np.ndarray, d: np.ndarray, b: np.ndarray, x: np.ndarray) -> np.ndarray:
    """NDS 2018, 5.3.6: volume factor of glulam, CV = (21/L)^(1/x)(12/d)^(1/x)(5.125/b)^(1/x) ≤ 1.0.

    ``L_ft`` length between points of zero moment (ft), ``d`` depth (in), ``b`` width (in, capped at
    10.75 in), ``x`` 20 for Southern Pine and 10 otherwise.
    """
    b = np.minimum(np.asarray(b, dtype=float), 10.75)
    cv = ((21.0 / L_ft) * (12.0 / d) * (5.125 / b)) ** (1.0 / x)  # NDS Eq. 5.3-1
    return np.minimum(cv, 1.0)


def effective_length(lu: np.ndarray, d: np.ndarray, case: str = "single_span_uniform") -> np.ndarray:
    """NDS 2018, Table 3.3.3: effective unbraced length le from the unbraced length lu (in) and depth d (in)."""
    rows = read_table("nds2018/effective_length.csv")
    rows = rows[rows["case"] == case]
    lu = np.asarray(lu, dtype=float)
    d = np.asarray(d, dtype=float)
    ratio = lu / d
    le = np.full(lu.shape, np.nan)
    for _, row in rows.iterrows():
        in_band = (ratio >= row["lu_over_d_min"]) & (ratio < row["lu_over_d_max"])
        le = np.where(in_band, row["a"] * lu + row["b"] * d, le)
    return le


def R_B(le: np.ndarray, d: np.ndarray, b: np.ndarray) -> np.ndarray:
    """NDS 2018, Eq. 3.3-5: slenderness ratio for bending members, RB = sqrt(le·d/b²) (inches)."""
    return np.sqrt(le * d / b**2)  # NDS Eq. 3.3-5


def F_bE(E_min_prime: np.ndarray, RB: np.ndarray) -> np.ndarray:
    """NDS 2018, 3.3.3.8: critical buckling design value FbE = 1.20·E'min/RB² (psi)."""
    return 1.20 * E_min_prime / RB**2  # NDS 3.3.3.8


def C_L(F_bE_: np.ndarray, F_b_star: np.ndarray) -> np.ndarray:
    """NDS 2018, Eq. 3.3-6: beam stability factor from FbE and Fb* (Fb times all factors but Cfu, CV, CL), psi."""
    ratio = F_bE_ / F_b_star
    a = (1.0 + ratio) / 1.9
    return a - np.sqrt(a**2 - ratio / 0.95)  # NDS Eq. 3.3-6


def C_b(bearing_length: np.ndarray, distance_to_end: np.ndarray) -> np.ndarray:
    """NDS 2018, 3.10.4: bearing area factor Cb = (lb + 0.375)/lb for bearings shorter than 6 in and
    at least 3 in from the member's end; 1.0 otherwise (lengths in inches)."""
    lb = np.asarray(bearing_length, dtype=float)
    applies = (lb < 6.0) & (np.asarray(distance_to_end, dtype=float) >= 3.0)
    return np.where(applies, (lb + 0.375) / lb, 1.0)  # NDS Eq. 3.10-2


def K_cr(product: np.ndarray, wet: np.ndarray) -> np.ndarray:
    """NDS 2018, 3.5.2: creep factor on the long-term (dead) load deflection."""
    rows = read_table("nds2018/creep.csv")
    product = np.asarray(product)
    service = np.where(np.asarray(wet, dtype=bool), "wet", "dry")
    kcr = np.full(product.shape, np.nan)
    for _, row in rows.iterrows():
        kcr = np.where((product == row["product"]) & (service == row["service"]), float(row["Kcr"]), kcr)
    return kcr


def wood_density_pcf(G: np.ndarray, moisture_content: float = 15.0) -> np.ndarray:
    """NDS Supplement 2018, 3.1.3 (from memory): density of wood in lb/ft³ at a moisture content (%),
    ρ = 62.4·[G/(1 + G·0.009·m.c.)]·[1 + m.c./100], G the tabulated specific gravity."""
    G = np.asarray(G, dtype=float)
    return 62.4 * (G / (1.0 + G * 0.009 * moisture_content)) * (1.0 + moisture_content / 100.0)
