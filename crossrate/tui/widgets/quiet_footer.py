"""The key footer of the workbench: Textual's Footer, rebuilt at most once per refresh.

Textual's Footer rebuilds its keys (a recompose) after every change of the active bindings: a focus change, a
screen pushed or popped. At start-up several such changes come before the first frames, and each rebuild costs
a few tens of milliseconds; the keys shown are those of the last change, so one rebuild after the refresh
shows the same as several.
"""

from textual.screen import Screen
from textual.widgets import Footer


class QuietFooter(Footer):
    _rebuild_queued = False

    def bindings_changed(self, screen: Screen) -> None:
        """As Footer.bindings_changed (textual 8.x), but a rebuild already queued is not queued again."""
        self._bindings_ready = True
        if not screen.app.app_focus or self._rebuild_queued:
            return
        if self.is_attached and screen is self.screen:
            self._rebuild_queued = True
            self.call_after_refresh(self._rebuild)

    async def _rebuild(self) -> None:
        # cleared first: a change of bindings during the rebuild queues one more, so the last change is shown
        self._rebuild_queued = False
        await self.recompose()
