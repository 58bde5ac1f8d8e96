"""Regenerate the workbench screenshots (SVG) in this folder from the demo library.

    .venv/bin/python screenshots/make_screenshots.py

Each picture is taken headlessly inside App.run_test(size=...): the keys a user would press, then
pilot.pause() and app.save_screenshot(). The pictures read the invented demo library alone, as `crossrate
--demo --no-starter` would (every couple in them is marked invented); the editor picture only opens the form,
so libraries/demo.toml is never written.
"""

import asyncio
import sys
from pathlib import Path

HERE = Path(__file__).resolve().parent
ROOT = HERE.parent
if str(ROOT) not in sys.path:  # run from a checkout without `pip install -e .`
    sys.path.insert(0, str(ROOT))

from crossrate.tui.app import CrossrateApp  # noqa: E402
from crossrate.tui.screens.workbench import WorkbenchScreen  # noqa: E402

DEMO = ROOT / "libraries" / "demo.toml"
#: The layers of `crossrate --demo --no-starter`, without the machine's group and personal libraries.
ONLY_DEMO = {"demo": True, "starter": False, "group": False, "personal": False}

#: (file name, terminal size, keys after the pair hl-med3 + hl-co-amine is set)
SHOTS = (
    ("main_80x24.svg", (80, 24), ["2"]),
    ("main_120x36.svg", (120, 36), []),
    ("prediction_100x34.svg", (100, 34), ["2"]),
    ("rate_curve_100x30.svg", (100, 30), ["3"]),
    ("energy_curves_100x30.svg", (100, 30), ["4"]),
    ("rate_map_80x24.svg", (80, 24), ["6"]),
    ("electrode_100x30.svg", (100, 30), ["7"]),
    ("help_100x34.svg", (100, 34), ["question_mark"]),
    ("editor_100x34.svg", (100, 34), ["1", "e"]),
)


async def _ready(pilot) -> WorkbenchScreen:
    for _ in range(200):
        await pilot.pause(0.02)
        s = pilot.app.screen
        # the services follow the rows (the detail's λ breakdown): conditions are set when they are ready
        if isinstance(s, WorkbenchScreen) and s.couple_set is not None and s.conditions is not None:
            return s
    raise RuntimeError("the demo library did not load")


async def shoot(name: str, size, keys) -> Path:
    app = CrossrateApp(layers=ONLY_DEMO)
    async with app.run_test(size=size) as pilot:
        screen = await _ready(pilot)
        table = screen.query_one("#table")
        table.select_id("hl-med3")
        await pilot.press("o")
        table.select_id("hl-co-amine")
        await pilot.press("r")
        for k in keys:
            await pilot.press(k)
        while any(not w.is_finished for w in app.workers):
            await pilot.pause(0.02)
        await pilot.pause(0.1)
        out = app.save_screenshot(name, path=str(HERE))
    return Path(out)


async def main() -> int:
    if not DEMO.exists():
        print(f"missing {DEMO}", file=sys.stderr)
        return 1
    for name, size, keys in SHOTS:
        path = await shoot(name, size, keys)
        print(f"wrote {path.relative_to(ROOT)}")
    return 0


if __name__ == "__main__":
    sys.exit(asyncio.run(main()))
