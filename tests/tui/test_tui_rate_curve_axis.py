"""The rate curve's axis: whole decades on evenly spaced rows, and the pair's point read off within half a row
of its value, at every size."""

import pytest
from tui_fixtures import small_couples

from crossrate.library.couple_set import CoupleSet
from crossrate.services.conditions import Conditions
from crossrate.services.curves import driving_force_curve
from crossrate.services.prediction import predict
from crossrate.tui.widgets.rate_curve_plot import curve_lines, decade_axis

UNSUPER = str.maketrans("⁰¹²³⁴⁵⁶⁷⁸⁹⁻", "0123456789-")
SIZES = [(80, 24), (80, 30), (100, 30), (120, 40), (60, 18), (200, 60), (80, 12)]
PAIRS = [("hl-osmium", "hl-vanadium"), ("hl-osmium", "hl-iron"), ("hl-ruthenium", "hl-cobalt"),
         ("hl-zinc-porph", "hl-quinone"), ("hl-iron", "hl-vanadium")]


def _axis(text: str):
    """(tick rows {row: decade}, row of ●) from the drawn curve; rows counted from the plot's first row."""
    lines = text.splitlines()[2:]  # title and region names
    ticks, dot = {}, None
    for r, ln in enumerate(lines):
        if "┤" not in ln and "│" not in ln:
            break
        head, _, body = ln.partition("┤") if "┤" in ln else ln.partition("│")
        if head.strip():
            ticks[r] = int(head.strip().translate(UNSUPER).removeprefix("10"))
        if "●" in body:
            dot = r
    return ticks, dot


@pytest.mark.parametrize("size", SIZES, ids=[f"{w}x{h}" for w, h in SIZES])
def test_ticks_even_and_the_pair_within_half_a_row(size):
    cs = CoupleSet(small_couples())
    width, height = size
    for ox, red in PAIRS:
        p = predict(cs, ox, red, Conditions(), samples=0)
        text = str(curve_lines(driving_force_curve(p), width, height, "kJ/mol", None))
        ticks, dot = _axis(text)
        rows = sorted(ticks)
        assert len(rows) >= 2 and dot is not None, text
        row_steps = {b - a for a, b in zip(rows, rows[1:], strict=False)}
        value_steps = {ticks[a] - ticks[b] for a, b in zip(rows, rows[1:], strict=False)}
        assert len(row_steps) == 1 and len(value_steps) == 1, (size, ticks)  # evenly spaced, whole decades
        per_row = value_steps.pop() / row_steps.pop()  # decades per row
        # the value at the centre of the ●'s row, read off the ticks, is within half a row of the pair's
        read = ticks[rows[0]] - (dot - rows[0]) * per_row
        assert abs(read - p.log10_k_obs) <= per_row / 2 + 1e-9, (size, ox, red, read, p.log10_k_obs)


def test_axis_covers_the_range_and_is_the_finest_that_fits():
    # 10 down to -4 on 13 rows, top tick 10 at row 0: the lowest row's centre 10 - 12 d must be <= -4, so
    # d >= 14/12 = 1.17 decades per row; of the steps offered (step decades every `per` rows: 1, 1/2, ...,
    # 5/4, 3/2, 2, ...) the finest that reaches is 5/4 = 1.25 (a tick every 4 rows, 5 decades apart).
    lo, hi, ticks = decade_axis(-4, 10, 13)
    per_row = (hi - lo) / 13
    assert per_row == pytest.approx(1.25, abs=1e-12)
    assert ticks == {0: 10, 4: 5, 8: 0, 12: -5}
    # plenty of rows: one decade every two rows
    lo, hi, ticks = decade_axis(0, 10, 40)
    assert (hi - lo) / 40 <= 0.5
