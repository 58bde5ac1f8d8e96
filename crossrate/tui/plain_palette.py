"""Textual's command palette with a plain search mark ('>') instead of an emoji, readable in any terminal."""

from textual.command import CommandPalette, SearchIcon

SEARCH_MARK = ">"


class PlainPalette(CommandPalette):
    def on_mount(self) -> None:
        self.query_one(SearchIcon).icon = SEARCH_MARK
