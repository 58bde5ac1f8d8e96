"""The key footer of the workbench: Textual's Footer, with its keys from the first frame and rebuilt only when
the keys it shows change, at most once per refresh.

Textual's Footer starts empty and rebuilds its keys (a recompose: a few tens of milliseconds) after every
change of the active bindings, a focus change or a screen pushed or popped, even when the keys it shows stay
the same. At start-up several such changes come before the first frames; here the keys are composed with the
footer, and a change rebuilds them only when the keys differ from those on show.
"""

from textual.screen import Screen
from textual.widgets import Footer


def _shown_keys(screen: Screen) -> tuple:
    """What Footer.compose shows of the screen's active bindings (the bindings shown and the command palette's:
    each binding, whether it is enabled, its tooltip), as a value equal when the footer would look the same."""
    palette = screen.app.COMMAND_PALETTE_BINDING
    return tuple((key, b.binding, b.enabled, b.tooltip) for key, b in screen.active_bindings.items()
                 if b.binding.show or key == palette)


class QuietFooter(Footer):
    _rebuild_queued = False
    _keys_on_show: tuple | None = None

    def compose(self):
        # Footer.compose yields nothing before the first change of bindings; the screen's bindings are known
        # when the footer is composed, so its keys are in the first frame.
        self._bindings_ready = True
        self._keys_on_show = _shown_keys(self.screen)
        yield from super().compose()

    def bindings_changed(self, screen: Screen) -> None:
        """As Footer.bindings_changed (textual 8.x), but a rebuild already queued is not queued again, and the
        rebuild is skipped when the keys to show are the ones on show."""
        self._bindings_ready = True
        if not screen.app.app_focus or self._rebuild_queued:
            return
        if self.is_attached and screen is self.screen:
            self._rebuild_queued = True
            self.call_after_refresh(self._rebuild)

    async def _rebuild(self) -> None:
        # cleared first: a change of bindings during the rebuild queues one more, so the last change is shown
        self._rebuild_queued = False
        if self.is_attached and _shown_keys(self.screen) != self._keys_on_show:
            await self.recompose()
