"""Whole-screen snapshots at 80x24 and 120x40, compared as plain screen text (not SVG, whose ids change).

The golden files live in tests/tui/snapshots/. After an intended change of the screens, regenerate them with
`CROSSRATE_UPDATE_SNAPSHOTS=1 pytest tests/tui/test_tui_snapshots.py` and review the diff.
"""

import difflib
import os
from pathlib import Path

import pytest
from tui_fixtures import run_async, small_couples
from tui_screen_text import screen_text

from crossrate.library.couple_set import CoupleSet
from crossrate.tui.app import CrossrateApp
from crossrate.tui.screens.workbench import WorkbenchScreen

SNAPSHOTS = Path(__file__).parent / "snapshots"
UPDATE = os.environ.get("CROSSRATE_UPDATE_SNAPSHOTS") == "1"

CASES = [
    ("couples_80x24", (80, 24), []),
    ("couples_120x40", (120, 40), []),
    ("prediction_80x24", (80, 24), ["2"]),
    ("prediction_120x40", (120, 40), ["2"]),
    ("rate_curve_80x24", (80, 24), ["3"]),
    ("energy_120x40", (120, 40), ["u", "4"]),
    ("map_80x24", (80, 24), ["6"]),
]


async def _shot(size, keys) -> str:
    app = CrossrateApp(couple_set=CoupleSet(small_couples()))
    async with app.run_test(size=size) as pilot:
        for _ in range(50):
            await pilot.pause(0.02)
            if isinstance(app.screen, WorkbenchScreen) and app.screen.couple_set is not None:
                break
        await pilot.press("o", *["down"] * 5, "r", *keys)
        while any(not w.is_finished for w in app.workers):
            await pilot.pause(0.01)
        await pilot.pause()
        return screen_text(app)


@pytest.mark.parametrize("name,size,keys", CASES, ids=[c[0] for c in CASES])
@run_async
async def test_screen_matches_snapshot(name, size, keys):
    text = await _shot(size, keys)
    path = SNAPSHOTS / f"{name}.txt"
    if UPDATE or not path.exists():
        path.write_text(text + "\n", encoding="utf-8")
        if not UPDATE:
            pytest.skip(f"snapshot {path.name} written; review it and run again")
    expected = path.read_text(encoding="utf-8").rstrip("\n")
    diff = "\n".join(difflib.unified_diff(expected.splitlines(), text.splitlines(), "expected", "shown", lineterm=""))
    assert text == expected, f"{name} differs from its snapshot:\n{diff}"
    lines = text.splitlines()
    assert len(lines) <= size[1] and all(len(line) <= size[0] for line in lines)
