"""Plain text of what the app shows (for assertions and snapshots): the same render export_screenshot uses."""

import io

from rich.console import Console


def screen_text(app) -> str:
    width, height = app.size
    console = Console(width=width, height=height, file=io.StringIO(), force_terminal=True,
                      color_system=None, record=True, legacy_windows=False, safe_box=False)
    console.print(app.screen._compositor.render_update(full=True, screen_stack=app._background_screens))
    return "\n".join(line.rstrip() for line in console.export_text().splitlines())
