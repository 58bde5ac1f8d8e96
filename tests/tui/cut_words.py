"""A detector of words cut at the edge of a widget: every word the app shows must be one it means to show.

The vocabulary is built from the full texts behind the screen (each Static and Label rendered 1000 columns
wide, input values and placeholders, footer keys, the couple set's ids and names, and whatever else a test
adds, such as a plot drawn wide). A word on the screen that is not in the vocabulary but is the start of a
word that is ('hel' of 'help', 'k_sel' of 'k_self') was cut. A deliberate cut is marked '…' and is allowed.
"""

import io
import re

from rich.console import Console

#: Characters that separate words on screen: white space, box drawing, braille, block elements.
SPLIT = re.compile(r"[\s\u2500-\u257f\u2580-\u259f\u2800-\u28ff▏▕]+")
STRIP = "()[]{},;:.'\"!?"


def words(text: str) -> set[str]:
    return {w.strip(STRIP) for w in SPLIT.split(text) if w.strip(STRIP)}


def full_text(renderable) -> str:
    """A Rich renderable (or Textual Content, or str) as plain text 1000 columns wide (no wrapping)."""
    if isinstance(renderable, str):
        return renderable
    if type(renderable).__name__ == "Content":
        return str(renderable)
    console = Console(width=1000, file=io.StringIO(), color_system=None, legacy_windows=False)
    with console.capture() as cap:
        console.print(renderable)
    return cap.get()


def screen_vocabulary(app) -> set[str]:
    """Words of everything the current screen holds (not only what fits on it)."""
    from textual.widgets import Button, Input, Label, Static
    from textual.widgets._footer import FooterKey
    from textual.widgets._toggle_button import ToggleButton

    vocab: set[str] = set()
    # every screen of the stack: a dialog shows the screen under it
    for screen in app.screen_stack:
        for w in screen.query("*"):
            if isinstance(w, FooterKey):
                vocab |= words(f"{w.key_display} {w.description}")
            elif isinstance(w, Input):
                vocab |= words(f"{w.value} {w.placeholder}")
            elif isinstance(w, (ToggleButton, Button)):
                vocab |= words(str(w.label))
            elif isinstance(w, (Static, Label)):
                vocab |= words(full_text(w.content))
    vocab |= words("palette")  # the footer's command palette key
    for screen in app.screen_stack:
        for cmd in app.get_system_commands(screen):
            vocab |= words(f"{cmd.title} {cmd.help}")
    return vocab


def cut_words(screen: str, vocab: set[str]) -> list[str]:
    """Words on the screen that are a cut start of a vocabulary word (with the word they were cut from)."""
    out = []
    for w in sorted(words(screen)):
        if w in vocab or "…" in w or len(w) < 2 or not any(ch.isalpha() for ch in w):
            continue
        whole = next((v for v in vocab if v.startswith(w) and v != w), None)
        if whole is not None:
            out.append(f"{w!r} (cut from {whole!r})")
    return out
