"""The shortcuts that make a large check fast give what the plain way gives (benchmarks/README.md).

* the model's copy written by a child process while the model is checked, completed with the
  verdict sets, is byte for byte the file ``model.write`` gives (ifccheck.ifc.writer.EarlyCopy);
* the parse started on a thread before the imports (ifccheck.cli) gives the same model and the
  same errors as opening the file afterwards;
* reference values looked up once per distinct combination (ifccheck.design.nds.basis.per_distinct)
  count every NaN as one value.

Expected values are counts and bytes of the plain way, compared exactly (tolerance 0); the sample
models are described in sample_models/README.md.
"""

from __future__ import annotations

import math
import os
import shutil

import ifcopenshell
import numpy as np
import pandas as pd
import pytest

from conftest import SAMPLES
from ifccheck.checker import check_model
from ifccheck.cli import _ParseInBackground, main
from ifccheck.design.nds.basis import per_distinct
from ifccheck.errors import ModelReadError
from ifccheck.ifc import open_model
from ifccheck.ifc.writer import EarlyCopy, _can_fork, verdict_psets

IMPERIAL = SAMPLES / "quillfeather_imperial.ifc"
IFC2X3 = SAMPLES / "quillfeather_ifc2x3.ifc"

needs_fork = pytest.mark.skipif(not _can_fork(), reason="processes are not forked here")


def _checked_with_early_copy(source, target):
    """Check ``source`` as the command line does; (result, copy completed at ``target``: True/False)."""
    with EarlyCopy(target) as early:
        result = check_model(source, on_open=early.start)
        result.apply_to_model()
        return result, early.write(result.model, target)


@needs_fork
@pytest.mark.parametrize("source", [IMPERIAL, IFC2X3], ids=["IFC4 imperial", "IFC2X3"])
def test_early_copy_is_the_file_the_model_writes(tmp_path, source):
    result, completed = _checked_with_early_copy(source, tmp_path / "early.ifc")
    result.model.write(str(tmp_path / "whole.ifc"))
    assert completed
    assert (tmp_path / "early.ifc").read_bytes() == (tmp_path / "whole.ifc").read_bytes()
    # one verdict set per distinct verdict; the sample has 22 (IFC4) and 5 (IFC2X3) candidates
    checked = sum(len(rel.RelatedObjects) for rel in result.model.by_type("IfcRelDefinesByProperties")
                  if rel.RelatingPropertyDefinition.Name == "ifccheck_Verdict")
    assert checked == len(result.table) == (22 if source == IMPERIAL else 5)
    assert sorted(p.name for p in tmp_path.iterdir()) == ["early.ifc", "whole.ifc"]  # no copy left over


@needs_fork
def test_early_copy_writes_quotes_and_non_ascii_text_as_the_model_does(tmp_path):
    with EarlyCopy(tmp_path / "early.ifc") as early:
        result = check_model(IMPERIAL, on_open=early.start)
        result.table.loc[result.table.index[0], "reason"] = "l'appui à 20 °C \\ côté « nord »"
        result.apply_to_model()
        assert early.write(result.model, tmp_path / "early.ifc")
    result.model.write(str(tmp_path / "whole.ifc"))
    early_bytes, whole_bytes = (tmp_path / "early.ifc").read_bytes(), (tmp_path / "whole.ifc").read_bytes()
    assert len(early_bytes) == len(whole_bytes) and early_bytes == whole_bytes


@needs_fork
def test_a_model_with_earlier_verdicts_is_written_whole(tmp_path):
    rerun = tmp_path / "rerun.ifc"
    check_model(IMPERIAL).write_ifc(rerun)  # verdicts of a first run
    assert len(verdict_psets(ifcopenshell.open(str(rerun)))) > 0
    result, completed = _checked_with_early_copy(rerun, tmp_path / "early.ifc")
    assert not completed  # the earlier verdicts are removed, which a copy cannot show
    assert sorted(p.name for p in tmp_path.iterdir()) == ["rerun.ifc"]  # no copy left over


@needs_fork
def test_a_check_that_stops_leaves_no_copy_and_no_child(tmp_path):
    early = EarlyCopy(tmp_path / "out.ifc")
    with pytest.raises(RuntimeError), early:
        early.start(open_model(IMPERIAL))
        pid = early._pid
        raise RuntimeError("the check stopped")
    assert list(tmp_path.iterdir()) == []
    with pytest.raises(ChildProcessError):  # reaped already
        os.waitpid(pid, 0)


def test_without_fork_the_command_line_writes_the_same_model(tmp_path, monkeypatch):
    for name in ("forked", "plain"):
        shutil.copy(IMPERIAL, tmp_path / f"{name}.ifc")
    assert main(["check", str(tmp_path / "forked.ifc")]) == 1  # the sample fails on purpose
    monkeypatch.delattr(os, "fork", raising=False)
    assert main(["check", str(tmp_path / "plain.ifc")]) == 1
    forked, plain = (ifcopenshell.open(str(tmp_path / f"{n}.checked.ifc")) for n in ("forked", "plain"))
    # GlobalIds of new sets differ between runs; everything else is the same, entity for entity
    assert forked.get_max_id() == plain.get_max_id()
    differing = [i for i in range(1, plain.get_max_id() + 1)
                 if _without_global_id(forked, i) != _without_global_id(plain, i)]
    assert len(differing) == 0


def _without_global_id(model, entity_id):
    text = model.by_id(entity_id).to_string()
    return text.split(",", 1)[1] if model.by_id(entity_id).is_a("IfcRoot") else text


def test_parse_in_background_gives_the_model_and_its_errors(tmp_path):
    model, plain = open_model(IMPERIAL, _ParseInBackground(IMPERIAL)), open_model(IMPERIAL)
    assert model.get_max_id() == plain.get_max_id()
    assert model.to_string() == plain.to_string()
    assert len(model.by_type("IfcBeam")) + len(model.by_type("IfcMember")) == 25  # the sample's 25 (hand count)
    truncated = tmp_path / "truncated.ifc"
    truncated.write_bytes(IMPERIAL.read_bytes()[:5000])
    with pytest.raises(ModelReadError, match="truncated"):
        open_model(truncated, _ParseInBackground(truncated))
    missing = tmp_path / "nowhere.ifc"
    with pytest.raises(ModelReadError, match="does not exist"):
        open_model(missing, _ParseInBackground(missing))


def test_per_distinct_computes_once_per_combination_with_nan_as_one_value():
    t = pd.DataFrame({"a": [1.0, np.nan, 1.0, np.nan, 2.0], "b": ["x", "y", "x", "y", "z"]})
    calls = []

    def fn(a, b):
        calls.append((a, b))
        return f"{a}-{b}"

    assert per_distinct(t, ["a", "b"], fn) == ["1.0-x", "nan-y", "1.0-x", "nan-y", "2.0-z"]
    assert len(calls) == 3  # (1, x), (NaN, y), (2, z): hand count
    assert math.isnan(calls[1][0])  # fn is given the row's own values, NaN included
