"""A small braille canvas: lines drawn at 2 x 4 dots per character cell, text overlaid, rendered to rich Text.

Plain Python (no numpy needed), deterministic, so pictures compare as text in tests and read with NO_COLOR.
"""

from rich.text import Text

# Dot bit of a braille character for the sub-cell position (column 0-1, row 0-3).
_DOT = ((0x01, 0x08), (0x02, 0x10), (0x04, 0x20), (0x40, 0x80))


class BrailleCanvas:
    """cols x rows cells mapping data x in [x0, x1] and y in [y0, y1] (y up).

    y_bands: each row holds an equal band (y1 - y0) / rows of y, a value lands in the row of its band, so a
    row's centre is within half a row of every value drawn in it (the rate curve reads decades off its rows).
    Otherwise y0 and y1 fall on the bottom and top dots.
    """

    def __init__(self, cols: int, rows: int, x0: float, x1: float, y0: float, y1: float, y_bands: bool = False):
        self.cols, self.rows = max(1, cols), max(1, rows)
        self.y_bands = y_bands
        self.x0, self.x1, self.y0, self.y1 = x0, x1, y0, y1
        self._bits = [[0] * self.cols for _ in range(self.rows)]
        self._style = [[""] * self.cols for _ in range(self.rows)]
        self._text: dict[tuple[int, int], tuple[str, str]] = {}

    def _px(self, x: float, y: float) -> tuple[float, float]:
        w, h = self.cols * 2, self.rows * 4
        px = (x - self.x0) / (self.x1 - self.x0) * (w - 1)
        if self.y_bands:
            # dot k covers [k, k+1) of h equal dots; the -0.5 makes round() pick that dot
            py = (self.y1 - y) / (self.y1 - self.y0) * h - 0.5
        else:
            py = (self.y1 - y) / (self.y1 - self.y0) * (h - 1)
        return px, py

    def row_centre(self, row: int) -> float:
        """The y value at the centre of a row (y_bands canvases)."""
        return self.y1 - (row + 0.5) * (self.y1 - self.y0) / self.rows

    def cell_of(self, x: float, y: float) -> tuple[int, int]:
        """(column, row) of the cell holding data point (x, y), clamped to the canvas."""
        px, py = self._px(x, y)
        return min(self.cols - 1, max(0, int(round(px)) // 2)), min(self.rows - 1, max(0, int(round(py)) // 4))

    def _dot(self, px: int, py: int, style: str) -> None:
        if 0 <= px < self.cols * 2 and 0 <= py < self.rows * 4:
            c, r = px // 2, py // 4
            self._bits[r][c] |= _DOT[py % 4][px % 2]
            if style:
                self._style[r][c] = style

    def line(self, xs, ys, style: str = "", every: int = 1) -> None:
        """A polyline through the data points; every > 1 draws a dotted line (one dot in `every`)."""
        pts = [self._px(float(x), float(y)) for x, y in zip(xs, ys, strict=True)]
        n = 0
        for (ax, ay), (bx, by) in zip(pts, pts[1:], strict=False):
            steps = int(max(abs(bx - ax), abs(by - ay))) + 1
            for k in range(steps + 1):
                t = k / steps
                n += 1
                if n % every == 0:
                    self._dot(int(round(ax + (bx - ax) * t)), int(round(ay + (by - ay) * t)), style)

    def hline(self, y: float, style: str = "", every: int = 3) -> None:
        self.line((self.x0, self.x1), (y, y), style, every)

    def vline(self, x: float, style: str = "", every: int = 3) -> None:
        self.line((x, x), (self.y0, self.y1), style, every)

    def text(self, col: int, row: int, s: str, style: str = "") -> None:
        """Overlay text starting at a cell (clipped at the right edge)."""
        for k, ch in enumerate(s):
            if 0 <= col + k < self.cols and 0 <= row < self.rows:
                self._text[(col + k, row)] = (ch, style)

    def mark(self, x: float, y: float, ch: str, style: str = "") -> tuple[int, int]:
        c, r = self.cell_of(x, y)
        self.text(c, r, ch, style)
        return c, r

    def to_lines(self) -> list[Text]:
        out = []
        for r in range(self.rows):
            t = Text(no_wrap=True)
            for c in range(self.cols):
                if (c, r) in self._text:
                    ch, st = self._text[(c, r)]
                    t.append(ch, style=st or "bold")
                else:
                    b = self._bits[r][c]
                    t.append(chr(0x2800 + b) if b else " ", style=self._style[r][c] if b else "")
            out.append(t)
        return out
