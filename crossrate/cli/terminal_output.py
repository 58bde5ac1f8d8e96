"""Text read from files reaches the terminal escaped: a couple name holding an escape sequence must not
retitle the window, move the cursor or hide the lines before it.

On a terminal, main() wraps stdout and stderr in TerminalStream, which writes every control character
(but newline and tab) as a visible escape (errors.printable). Rich output goes to the real stream through
console_for(), a Console that escapes the text of each segment and keeps only its own styling codes.
Output that is not a terminal (pipes, files: CSV, JSON) is left byte for byte as it is.
"""

import sys

from ..errors import printable


class TerminalStream:
    """A text stream that escapes control characters in everything written to it (see module docstring)."""

    def __init__(self, stream):
        self.raw_stream = stream

    def write(self, text: str) -> int:
        self.raw_stream.write(printable(text))
        return len(text)

    def writelines(self, lines) -> None:
        for line in lines:
            self.write(line)

    def __getattr__(self, name):  # flush, isatty, encoding, fileno... of the real stream
        return getattr(self.raw_stream, name)


def raw_stream(stream):
    """The real stream under a TerminalStream (the stream itself otherwise)."""
    return getattr(stream, "raw_stream", stream) if isinstance(stream, TerminalStream) else stream


def guard_terminal_streams():
    """Wrap sys.stdout and sys.stderr in TerminalStream when they are terminals; returns a function that
    puts the previous streams back."""
    old = sys.stdout, sys.stderr
    for name in ("stdout", "stderr"):
        stream = getattr(sys, name)
        isatty = getattr(stream, "isatty", None)
        if not isinstance(stream, TerminalStream) and isatty is not None and isatty():
            setattr(sys, name, TerminalStream(stream))

    def restore() -> None:
        sys.stdout, sys.stderr = old

    return restore


def console_for(stream=None, **kwargs):
    """A Rich Console on the real stream under `stream` (default stderr) whose text is escaped like
    TerminalStream's, while its own colour and cursor codes pass."""
    from rich.console import Console
    from rich.segment import Segment

    class SafeConsole(Console):
        def _render_buffer(self, buffer):
            return super()._render_buffer(
                seg if seg.control or not seg.text else Segment(printable(seg.text), seg.style, seg.control)
                for seg in buffer)

    return SafeConsole(file=raw_stream(stream if stream is not None else sys.stderr), **kwargs)
