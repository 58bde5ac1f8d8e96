"""A checkbox whose state reads in plain text ([x] / [ ]), so it is clear with NO_COLOR too."""

from textual.content import Content
from textual.widgets import Checkbox


class PlainCheckbox(Checkbox):
    @property
    def _button(self) -> Content:
        return Content("[x]" if self.value else "[ ]")
