"""The pre-commit hook definition (.pre-commit-hooks.yaml) runs `crossrate library validate` on the staged
TOML files of a group repository, for real: a local git repository with `pre-commit install`, commits that
pass and one that is refused. Offline: the hooks repository is a local git repository (file://) and the
system-language hook uses the crossrate on the PATH (the language: python hook would pip-install crossrate
into an environment of its own, which needs the package index; it has the same entry and file pattern)."""

import os
import shutil
import subprocess
import sys
from pathlib import Path

import pytest
import yaml
from library_helpers import BASE, line_of

ROOT = Path(__file__).resolve().parents[2]

pytestmark = pytest.mark.skipif(shutil.which("git") is None, reason="git is not installed")


def _run(argv, cwd, env, check=True):
    done = subprocess.run(argv, cwd=cwd, env=env, capture_output=True, text=True, timeout=120)
    if check and done.returncode != 0:
        raise AssertionError(f"{argv} failed ({done.returncode}):\n{done.stdout}\n{done.stderr}")
    return done


def test_hook_definitions_share_entry_and_files():
    hooks = {h["id"]: h for h in yaml.safe_load((ROOT / ".pre-commit-hooks.yaml").read_text(encoding="utf-8"))}
    assert set(hooks) == {"crossrate-validate", "crossrate-validate-system"}
    for h in hooks.values():
        assert h["entry"] == "crossrate library validate" and h["files"] == r"\.toml$"
    assert hooks["crossrate-validate"]["language"] == "python"
    assert hooks["crossrate-validate-system"]["language"] == "system"


def test_commit_of_a_broken_library_file_is_refused(tmp_path):
    env = {k: v for k, v in os.environ.items() if not k.startswith(("CROSSRATE_", "GIT_", "PRE_COMMIT"))}
    env.update(HOME=str(tmp_path / "home"), XDG_CONFIG_HOME=str(tmp_path / "config"),
               XDG_CACHE_HOME=str(tmp_path / "cache"), PRE_COMMIT_HOME=str(tmp_path / "pre-commit"),
               PATH=os.pathsep.join([str(Path(sys.executable).parent), env.get("PATH", "")]),
               PYTHONPATH=os.pathsep.join(filter(None, [str(ROOT), env.get("PYTHONPATH", "")])),
               GIT_AUTHOR_NAME="Halden Lake", GIT_AUTHOR_EMAIL="lab@example.invalid",
               GIT_COMMITTER_NAME="Halden Lake", GIT_COMMITTER_EMAIL="lab@example.invalid", NO_COLOR="1")
    (tmp_path / "home").mkdir()
    hooks = tmp_path / "hooks"
    hooks.mkdir()
    shutil.copy(ROOT / ".pre-commit-hooks.yaml", hooks / ".pre-commit-hooks.yaml")
    _run(["git", "init", "-q"], hooks, env)
    _run(["git", "add", "."], hooks, env)
    _run(["git", "commit", "-q", "-m", "hooks"], hooks, env)
    sha = _run(["git", "rev-parse", "HEAD"], hooks, env).stdout.strip()

    group = tmp_path / "group"
    group.mkdir()
    _run(["git", "init", "-q"], group, env)
    (group / ".pre-commit-config.yaml").write_text(
        f"repos:\n- repo: file://{hooks}\n  rev: {sha}\n  hooks:\n  - id: crossrate-validate-system\n",
        encoding="utf-8")
    _run([sys.executable, "-m", "pre_commit", "install"], group, env)
    (group / "group.toml").write_text(BASE, encoding="utf-8")
    (group / "notes.txt").write_text("radius = -1 is not a library\n", encoding="utf-8")
    _run(["git", "add", "."], group, env)
    done = _run(["git", "commit", "-m", "first couples"], group, env)
    assert "crossrate library validate" in done.stdout + done.stderr

    bad = BASE.replace("radius = 4.0", "radius = 40.0")
    (group / "group.toml").write_text(bad, encoding="utf-8")
    _run(["git", "add", "group.toml"], group, env)
    done = _run(["git", "commit", "-m", "a typo"], group, env, check=False)
    assert done.returncode != 0
    out = done.stdout + done.stderr
    line = line_of(bad, "radius = 40.0")
    assert f"group.toml:{line}: couple t-two: field radius: got 40 angstrom" in out
    commits = _run(["git", "rev-list", "--count", "HEAD"], group, env).stdout.strip()
    assert commits == "1"  # the broken version was not committed
