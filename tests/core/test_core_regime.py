"""Regime of a pair on the Marcus curve, the activationless band and the diffusion-control flag."""

import math

import numpy as np
import pytest

from crossrate.core.constants import GAS_CONSTANT
from crossrate.core.cross_rate import cross_rate
from crossrate.core.regime import (
    ACTIVATIONLESS,
    ACTIVATIONLESS_BAND_RT,
    DIFFUSION_CONTROL_RATIO,
    ENDERGONIC,
    INVERTED,
    NORMAL,
    REGIME_NAMES,
    classify_regime,
    diffusion_controlled,
    regime_name,
)

T = 298.15
RT = GAS_CONSTANT * T
LAM = 100e3  # J/mol
# Activationless band: intrinsic barrier (lambda/4)(1 + x/lambda)^2 <= band x RT  <=>  |x + lambda| <= 2 sqrt(band lambda RT).
HALF_WIDTH = 2.0 * math.sqrt(ACTIVATIONLESS_BAND_RT * LAM * RT)


def _code(x, lam=LAM, **kw):
    return int(classify_regime(x, lam, T, **kw))


def test_codes_and_names():
    assert (ENDERGONIC, NORMAL, ACTIVATIONLESS, INVERTED) == (0, 1, 2, 3)  # rate_grid's int8 arithmetic needs ENDERGONIC == 0
    assert [regime_name(c) for c in range(4)] == list(REGIME_NAMES)
    assert regime_name(np.int8(2)) == "activationless"


def test_regions_of_the_curve():
    assert _code(+5e3) == ENDERGONIC  # Delta G deg' > 0
    assert _code(-0.3 * LAM) == NORMAL  # 0 < -dG' < lambda, outside the band
    assert _code(-LAM) == ACTIVATIONLESS  # -dG' = lambda
    assert _code(-1.8 * LAM) == INVERTED  # -dG' > lambda, outside the band
    assert _code(0.0) == NORMAL  # dG' = 0 is not endergonic


def test_activationless_band_edges():
    # Band half-width 2 sqrt(lambda RT) = 2 sqrt(1e5 x 2478.96) = 31.49 kJ/mol for 1 RT.
    assert HALF_WIDTH == pytest.approx(31488.0, rel=1e-3)
    inside, outside = 0.999 * HALF_WIDTH, 1.001 * HALF_WIDTH
    assert _code(-LAM + inside) == ACTIVATIONLESS
    assert _code(-LAM - inside) == ACTIVATIONLESS
    assert _code(-LAM + outside) == NORMAL
    assert _code(-LAM - outside) == INVERTED
    # The band is stated in RT units: a wider band takes in more of the curve.
    assert _code(-LAM + outside, band_RT=2.0) == ACTIVATIONLESS


def test_small_lambda_endergonic_wins_over_band():
    # With lambda < 4 RT the band reaches dG' > 0; such pairs are still called endergonic.
    lam = 2.0 * RT
    assert _code(+0.1 * RT, lam) == ENDERGONIC
    assert _code(-0.1 * RT, lam) == ACTIVATIONLESS


def test_broadcast_and_dtype():
    x = np.array([[1e3, -0.2 * LAM], [-LAM, -2.5 * LAM]])
    codes = classify_regime(x, LAM, T)
    assert codes.dtype == np.int8
    np.testing.assert_array_equal(codes, [[ENDERGONIC, NORMAL], [ACTIVATIONLESS, INVERTED]])


def test_diffusion_controlled_rule():
    # Rule: flagged when k_act > DIFFUSION_CONTROL_RATIO x k_D (10 x).
    ln_kD = math.log(5e9)
    assert DIFFUSION_CONTROL_RATIO == 10.0
    assert diffusion_controlled(ln_kD + math.log(10.0) + 1e-9, ln_kD)
    assert not diffusion_controlled(ln_kD + math.log(10.0) - 1e-9, ln_kD)
    assert not diffusion_controlled(ln_kD, ln_kD)
    np.testing.assert_array_equal(diffusion_controlled(np.array([30.0, 20.0]), 22.0), [True, False])


def test_cross_rate_flags_and_regimes():
    # Two neutral couples (no work): k11 = k22 = 1e5 -> lambda12 = 4 RT ln(1e6) = 137.0 kJ/mol.
    lnk = math.log(1e5)
    lam12 = 4 * RT * (math.log(1e11) - lnk)
    E1 = np.array([-0.2, 0.4, lam12 / 96485.33212, 2.6])  # endergonic, normal, activationless, inverted
    res = cross_rate(E1, 0.0, 0, 0, 0, 0, 4e-10, 4e-10, lnk, lnk, T, 0.1, 78.36, 0.89e-3, math.log(1e11))
    np.testing.assert_array_equal(res.regime, [ENDERGONIC, NORMAL, ACTIVATIONLESS, INVERTED])
    # Only the activationless pair has k_act (~Z = 1e11) above 10 k_D (7.4e9).
    np.testing.assert_array_equal(res.diffusion_controlled, [False, False, True, False])
    off = cross_rate(E1, 0.0, 0, 0, 0, 0, 4e-10, 4e-10, lnk, lnk, T, 0.1, 78.36, 0.89e-3, math.log(1e11),
                     diffusion=False)
    assert not off.diffusion_controlled.any()
    np.testing.assert_array_equal(off.regime, res.regime)
