"""A text field that applies every key in the order it was typed, however fast the keys arrive.

Textual runs a widget's key bindings (backspace, delete, the cursor keys) only when the key event has bubbled
up to the app, through one message queue per ancestor, while printable characters are inserted at once by the
field itself. In a burst (a fast typist on a slow link, a paste without bracketed-paste mode) characters typed
after a backspace could then be inserted before it ran: `End`, eight backspaces and `298.15` gave `298.1` or
`2929`. Here the field runs its own bindings as it receives the key, in its own queue, so editing keys and
characters keep their order. Keys that move the focus (tab, esc) are priority bindings of the screens, so the
focus has moved before the next key is handed to a field.
"""

from textual import events
from textual.widgets import Input


class FieldInput(Input):
    """An Input whose own editing keys act in order with the typed characters."""

    async def _on_key(self, event: events.Key) -> None:
        if not event.is_printable:
            for binding in self._bindings.key_to_bindings.get(event.key, ()):
                if await self.app.run_action(binding.action, self):
                    # Handled here: stop it so the app does not run the same binding again when it bubbles up.
                    event.stop()
                    event.prevent_default()
                    return
        await super()._on_key(event)
