"""The short console summary of a run: counts, the ten worst members, the caution."""

from __future__ import annotations

from .. import CAUTION
from .display import factor, report_system


def summary(result, outputs: "list[str]" = ()) -> str:
    """Text printed after a run (what a coordinator reads first)."""
    counts = result.counts()
    lines = [
        f"ifccheck {result.schema} model, {len(result.table)} timber bending candidates "
        f"({result.table['design_basis'].dropna().iloc[0] if result.table['design_basis'].notna().any() else 'no basis run'})",
        f"  PASS {counts['PASS']}   FAIL {counts['FAIL']}   NOT_CHECKED {counts['NOT_CHECKED']}   "
        f"skipped (not timber bending members) {counts['skipped']}",
    ]
    skipped_by = {}
    for s in result.skipped:
        skipped_by[s.category] = skipped_by.get(s.category, 0) + 1
    if skipped_by:
        lines.append("  skipped: " + ", ".join(f"{k.replace('_', ' ')} {v}" for k, v in sorted(skipped_by.items())))
    lines += _structural_lines(result.structural)
    worst = result.table[result.table["max_util"].notna()].sort_values("max_util", ascending=False).head(10)
    if len(worst):
        system = report_system(result.units, result.rules)
        length, f_len = factor(system, "length")
        lines.append("  worst members:")
        lines.append(f"    {'name':<18} {'GlobalId':<22} {'storey':<14} {'section':<16} {'grade':<26} "
                     f"{'span ' + length:>8} {'check':<17} {'util':>6}")
        for row in worst.itertuples():
            grade = f"{row.species} {row.grade}".strip()
            lines.append(
                f"    {str(row.name)[:18]:<18} {row.global_id:<22} {str(row.storey)[:14]:<14} "
                f"{str(row.nominal)[:16]:<16} {grade[:26]:<26} {row.design_span * f_len:>8.2f} "
                f"{row.governing_check:<17} {row.max_util:>6.2f}"
            )
    not_checked = result.table[result.table["status"] == "NOT_CHECKED"]
    if len(not_checked):
        lines.append(f"  data readiness: {len(not_checked)} members not checked, by what they lack:")
        for what, count in readiness(not_checked["problems"]):
            lines.append(f"    {count:>6}  {what}")
        lines.append("  first reasons:")
        for row in not_checked.head(5).itertuples():
            lines.append(f"    {str(row.name)[:18]:<18} {row.global_id:<22} {str(row.reason)[:100]}")
    for path in outputs:
        lines.append(f"  wrote {path}")
    lines.append(f"CAUTION: {CAUTION}")
    return "\n".join(lines)


def _structural_lines(found) -> list:
    """What the model's structural-analysis data gave, when it has any."""
    if found is None or not found.analysis_models:
        return []
    groups = ", ".join(f"{k} {v}" for k, v in sorted(found.groups_by_type.items())) or "none"
    lines = [
        f"  structural-analysis data: {found.analysis_models} analysis model(s), {found.curve_members} curve members; "
        f"linked {found.linked_by_relation} members by relation and {found.linked_by_geometry} by geometry, "
        f"{found.supports} supports",
        f"  load groups and cases by type: {groups}; {found.load_combinations} load combinations not read "
        f"(ASD combinations applied); {found.temperature_actions} temperature actions ignored",
    ]
    if found.unmapped_groups:
        lines.append("  load groups with no load type (map them in the rules): " + ", ".join(found.unmapped_groups[:10]))
    lines += [f"  analysis data not used: {p}" for p in found.problems]
    return lines


#: what a NOT_CHECKED reason says is missing, by words in it (first match wins)
_LACKS = (
    ("slab's weight", "the slab's weight (a slab over the member, its material's unit weight)"),
    ("the weight of", "the slab's weight (a slab over the member, its material's unit weight)"),
    ("material not identified", "material not identified"),
    ("grade", "an NDS species and grade"),
    ("species", "an NDS species and grade"),
    ("section", "a rectangular section"),
    ("span", "a span"),
    ("support", "supports"),
    ("no loads", "loads"),
    ("load group", "load types for the analysis load groups"),
    ("TributaryWidth", "a tributary width"),
    ("tributary width", "a tributary width"),
    ("carries", "the members it carries checked first"),
)


def readiness(problems) -> list:
    """(what is lacking, member count) for the members not checked, most frequent first: the list a
    coordinator sends back to the modeller. A member lacking several things counts under each."""
    counts: dict = {}
    for member_problems in problems:
        lacks = set()
        for problem in member_problems:
            what = next((label for word, label in _LACKS if word in problem), "other: " + problem.split(";")[0][:60])
            lacks.add(what)
        for what in lacks:
            counts[what] = counts.get(what, 0) + 1
    return sorted(counts.items(), key=lambda item: (-item[1], item[0]))
