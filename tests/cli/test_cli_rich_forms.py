"""On a colour terminal the Rich forms show the same numbers as the plain forms."""

import io

import pytest

from crossrate.cli.render_prediction import print_prediction
from crossrate.cli.render_screen import print_screen
from crossrate.services.prediction import predict
from crossrate.services.screening import screen


class FakeTerminal(io.StringIO):
    encoding = "utf-8"

    def isatty(self):
        return True


@pytest.fixture
def colour(monkeypatch):
    monkeypatch.delenv("NO_COLOR", raising=False)
    monkeypatch.setenv("TERM", "xterm-256color")
    monkeypatch.setenv("COLUMNS", "160")


def test_rich_prediction(couple_set, colour):
    p = predict(couple_set, "hl-iron-a", "hl-ru-b", samples=2000, seed=1)
    out = FakeTerminal()
    print_prediction(p, out)
    text = out.getvalue()
    assert "\x1b[" in text  # styled
    assert f"{p.log10_k_obs:.3f}" in text and "λ12" in text and "Estimate only" in text


def test_no_color_gives_plain_text_even_on_a_terminal(couple_set, monkeypatch):
    monkeypatch.setenv("NO_COLOR", "1")
    out = FakeTerminal()
    print_prediction(predict(couple_set, "hl-iron-a", "hl-ru-b", samples=0), out)
    assert "\x1b[" not in out.getvalue()


def test_rich_screen(couple_set, colour):
    r = screen(couple_set, "hl-iron-a", "oxidant")
    out = FakeTerminal()
    print_screen(r, out)
    text = out.getvalue()
    assert all(p in text for p in r.partner)
    assert f"{r.table.log10_k_obs[0]:.2f}" in text


def test_map_progress_bar_only_on_a_terminal():
    from crossrate.cli.render_map import progress_bar

    with progress_bar(io.StringIO()) as callback:
        assert callback is None  # a pipe or file: no bar
    term = FakeTerminal()
    with progress_bar(term) as callback:
        callback(0, 4)
        callback(4, 4)
    assert "rate map" in term.getvalue()
