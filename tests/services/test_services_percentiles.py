"""The Monte Carlo interval's percentiles are numpy's, to the last bit (the cold start avoids np.percentile
only because it imports numpy.ma)."""

import numpy as np
from hypothesis import given, settings
from hypothesis import strategies as st
from hypothesis.extra.numpy import arrays

from crossrate.services.uncertainty import percentiles_linear

_VALUES = st.floats(allow_nan=True, allow_infinity=True, width=64)


@settings(max_examples=300, deadline=None)
@given(arrays(np.float64, st.integers(1, 60), elements=_VALUES),
       st.lists(st.floats(0, 100), min_size=1, max_size=4))
def test_same_as_numpy_percentile(x, percents):
    # Reference: numpy.percentile with its default "linear" method (Hyndman and Fan definition 7).
    with np.errstate(invalid="ignore", over="ignore"):
        expected = np.percentile(x, percents)
        got = percentiles_linear(x, percents)
    np.testing.assert_array_equal(got, expected)  # exact: NaN where numpy gives NaN, same bits elsewhere


def test_same_as_numpy_on_a_monte_carlo_sized_sample():
    x = np.random.default_rng(20261201).standard_normal(20000) * 0.3 + 6.0
    np.testing.assert_array_equal(percentiles_linear(x, (2.5, 97.5)), np.percentile(x, [2.5, 97.5]))
