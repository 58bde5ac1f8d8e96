"""Publication figures (`--plot FILE.svg|png`) drawn with matplotlib, an optional extra (`pip install crossrate[plot]`).

matplotlib is imported only when a figure is drawn, always with the non-interactive Agg backend.
"""
