"""`crossrate library diff`: couples added, removed and changed field by field with units, between two files or a
file and a git revision of it; with --predictions how far log10 k_obs moves, largest first."""

import json
import os
import shutil
import subprocess

import pytest
from library_helpers import BASE

from crossrate.cli.main import main
from crossrate.core.potential_scales import ScaleRegistry
from crossrate.library.couple_diff import diff_libraries
from crossrate.library.couple_set import CoupleSet
from crossrate.library.toml_reader import parse_library_text
from crossrate.services.batch_prediction import predict_many
from crossrate.services.conditions import Conditions
from crossrate.services.rate_shifts import rate_shifts

NEW = (BASE.replace("E = 0.50", "E = 0.55").replace('tags = ["aqua"]', 'tags = ["aqua", "checked"]')
       .split("# --- acetonitrile ---")[0]
       + '[couple.t-four]\nname = "test four 3+/2+"\ncharge_ox = 3\ncharge_red = 2\nE = 0.3\nk_self = 10.0\n'
       'radius = 3.4\nionic_strength = 0.1\nsource = "invented for the tests"\n')


def _files(tmp_path):
    old, new = tmp_path / "old.toml", tmp_path / "new.toml"
    old.write_text(BASE, encoding="utf-8")
    new.write_text(NEW, encoding="utf-8")
    return old, new


def _cli(*argv):
    try:
        return main(list(argv))
    except SystemExit as exc:
        return exc.code


def test_added_removed_changed_with_units():
    d = diff_libraries(parse_library_text(BASE, "old").couples, parse_library_text(NEW, "new").couples)
    assert [c.id for c in d.added] == ["t-four"] and [c.id for c in d.removed] == ["t-three"]
    (ch,) = d.changed
    assert ch.couple_id == "t-one"
    assert [(f.name, f.old, f.new, f.unit) for f in ch.changes] == [
        ("E", 0.5, 0.55, "V"), ("tags", ("aqua",), ("aqua", "checked"), "")]
    assert d.unchanged == 1


def test_cli_text_and_json(tmp_path, capsys):
    old, new = _files(tmp_path)
    assert _cli("library", "diff", str(old), str(new)) == 0
    out = capsys.readouterr().out
    assert "+ t-four  added" in out and "- t-three  removed" in out
    assert "    E: 0.5 V -> 0.55 V" in out and "    tags: aqua -> aqua, checked" in out
    assert "1 added, 1 removed, 1 changed, 1 unchanged" in out
    assert _cli("library", "diff", str(old), str(new), "--format", "json") == 0
    data = json.loads(capsys.readouterr().out)
    assert data["changed"][0]["fields"][0] == {"name": "E", "old": 0.5, "new": 0.55, "unit": "V"}
    assert data["rate_shifts"] is None


def test_predictions_move_largest_first_and_match_the_prediction_service(tmp_path, capsys):
    water = BASE.split("# --- acetonitrile ---")[0]  # t-one and t-two, both aqueous
    extra = ('[couple.t-five]\nname = "test five 1+/0"\ncharge_ox = 1\ncharge_red = 0\nE = 0.05\nk_self = 3.0e5\n'
             'radius = 5.0\nionic_strength = 0.1\nsource = "invented for the tests"\n')
    old_lf = parse_library_text(water + extra, "old")
    new_lf = parse_library_text(water.replace("E = 0.50", "E = 0.60") + extra, "new")
    old_set = CoupleSet(old_lf.couples, ScaleRegistry(old_lf.scales))
    new_set = CoupleSet(new_lf.couples, ScaleRegistry(new_lf.scales))
    cond = Conditions(ionic_strength_M=0.1)
    shifts = rate_shifts(old_set, new_set, conditions=cond)
    # only pairs with the changed couple t-one can move: 2 x 2 ordered pairs with t-two and t-five
    assert {(s.oxidant, s.reductant) for s in shifts} == {("t-one", "t-two"), ("t-two", "t-one"),
                                                          ("t-one", "t-five"), ("t-five", "t-one")}
    moves = [abs(s.shift) for s in shifts]
    assert moves == sorted(moves, reverse=True) and moves[0] > 0
    for s in shifts:  # the same numbers predict_many gives for each version (internal consistency)
        before = predict_many(old_set, [s.oxidant], [s.reductant], cond, uncertainty=False).log10_k_obs[0]
        after = predict_many(new_set, [s.oxidant], [s.reductant], cond, uncertainty=False).log10_k_obs[0]
        assert s.shift == pytest.approx(after - before, abs=1e-12)
    # t-one as oxidant gets 0.1 V more downhill: its rate with t-two rises, the reverse one falls
    by = {(s.oxidant, s.reductant): s.shift for s in shifts}
    assert by[("t-one", "t-two")] > 0 > by[("t-two", "t-one")]


def test_cli_predictions_with_chosen_pairs(tmp_path, capsys):
    old, new = _files(tmp_path)
    assert _cli("library", "diff", str(old), str(new), "--predictions", "--no-bundled", "--pair", "t-one:t-two",
                "--ionic-strength", "0.1") == 0
    out = capsys.readouterr().out
    assert "predicted rates: 1 ordered pairs compared, 1 move" in out and "t-one + t-two" in out
    assert _cli("library", "diff", str(old), str(new), "--predictions", "--no-bundled", "--pair", "t-one") == 2
    assert "expected OXIDANT:REDUCTANT" in capsys.readouterr().err


@pytest.mark.skipif(shutil.which("git") is None, reason="git is not installed")
def test_git_revision_forms(tmp_path, capsys, monkeypatch):
    env = dict(os.environ, GIT_AUTHOR_NAME="t", GIT_AUTHOR_EMAIL="t@example.invalid", GIT_COMMITTER_NAME="t",
               GIT_COMMITTER_EMAIL="t@example.invalid")
    repo = tmp_path / "repo"
    repo.mkdir()
    lib = repo / "group.toml"
    lib.write_text(BASE, encoding="utf-8")
    for argv in (["init", "-q"], ["add", "group.toml"], ["commit", "-q", "-m", "one"]):
        subprocess.run(["git", *argv], cwd=repo, env=env, check=True, capture_output=True)
    lib.write_text(NEW, encoding="utf-8")
    assert _cli("library", "diff", str(lib), "--rev", "HEAD") == 0
    out = capsys.readouterr().out
    assert f"library diff HEAD:{lib} -> {lib}" in out and "+ t-four  added" in out
    monkeypatch.chdir(repo)
    assert _cli("library", "diff", "HEAD:group.toml", "group.toml") == 0
    assert "1 added, 1 removed, 1 changed" in capsys.readouterr().out
    assert _cli("library", "diff", "HEAD~3:group.toml", "group.toml") == 2
    err = capsys.readouterr().err
    assert err.startswith("crossrate: HEAD~3:group.toml: git cannot read it") and "Traceback" not in err
