"""The README's "## From Python" example runs as written, so it cannot go stale."""

import os
import re
from pathlib import Path

import pytest

README = Path(os.environ.get("CROSSRATE_README", Path(__file__).resolve().parents[2] / "README.md"))
HEADING = "## From Python"


def _fenced_blocks(text: str) -> list[tuple[str, str]]:
    """(language, body) of the fenced blocks between the "## From Python" heading and the next heading of
    level 1 or 2 (lines inside fenced code never count as headings: a Python comment starts with '#' too)."""
    blocks, current, in_section, fence = [], None, False, None
    for line in text.splitlines(keepends=True):
        stripped = line.rstrip("\n")
        if fence is None and stripped.startswith("```"):
            fence = stripped[3:].strip()
            current = [] if in_section else None
            continue
        if fence is not None and stripped.startswith("```"):
            if current is not None:
                blocks.append((fence.split()[0] if fence else "", "".join(current)))
            fence, current = None, None
            continue
        if fence is not None:
            if current is not None:
                current.append(line)
            continue
        if stripped == HEADING:
            in_section = True
        elif in_section and re.match(r"#{1,2} ", stripped):
            break
    return blocks


def _python_blocks(text: str) -> list[str]:
    return [body for lang, body in _fenced_blocks(text) if lang == "python"]


def test_from_python_section_runs(tmp_path, monkeypatch, capsys):
    if not README.exists():
        pytest.skip(f"{README} does not exist yet (the lead merges the README)")
    text = README.read_text(encoding="utf-8")
    if HEADING not in text:
        pytest.skip(f"README has no {HEADING!r} heading yet (the lead merges /work/plan/readme/predict.md)")
    blocks = _fenced_blocks(text)
    assert any(lang == "python" for lang, _ in blocks), f"the {HEADING!r} section has no ```python block"
    # Only the bundled libraries: keep the user's own layers out of the example.
    for name in ("CROSSRATE_GROUP_LIBRARY", "CROSSRATE_PERSONAL_LIBRARY"):
        monkeypatch.delenv(name, raising=False)
    monkeypatch.setenv("HOME", str(tmp_path))
    monkeypatch.setenv("XDG_CONFIG_HOME", str(tmp_path / "config"))
    monkeypatch.chdir(tmp_path)
    namespace: dict = {"__name__": "readme_example"}
    for k, (lang, code) in enumerate(blocks):
        if lang != "python":
            continue
        capsys.readouterr()
        exec(compile(code, str(README) + " (From Python)", "exec"), namespace)  # noqa: S102
        printed = capsys.readouterr().out
        # A ```text block right after the code is its printed output: it must still be what the code prints.
        if k + 1 < len(blocks) and blocks[k + 1][0] == "text":
            assert printed.rstrip() == blocks[k + 1][1].rstrip()


def test_block_extraction():
    text = (
        "intro\n```python\nw = 0\n```\n## From Python\nsome words\n```python\n# comment\nx = 1\n```\n"
        "```text\n# not code\n```\n### sub\n```python\ny = 2\n```\n## Next\n```python\nz = 3\n```\n"
    )
    assert _python_blocks(text) == ["# comment\nx = 1\n", "y = 2\n"]
    assert [lang for lang, _ in _fenced_blocks(text)] == ["python", "text", "python"]
