"""Hypothesis property tests of the core over its documented input range.

Documented range (issue 2 / library schema): k_self 1e-15..1e12 M^-1 s^-1, E -5..+5 V, charges -4..+4,
radius 1-30 angstrom, ionic strength 0-2 M, temperature 200-400 K, every solvent of the table, Z = 1e11.
Within it, the Marcus model applies where lambda_ii > 0, i.e. k_ii < Z exp(-w_ii/RT); draws outside that
domain are discarded with `assume` (services refuse such couples before they reach the core).
"""

import math

import mpmath as mp
import numpy as np
from hypothesis import HealthCheck, assume, given, settings
from hypothesis import strategies as st

from crossrate.core.constants import FARADAY
from crossrate.core.cross_rate import cross_rate
from crossrate.core.diffusion import ln_debye_factor
from crossrate.core.solvents import solvent_table

SETTINGS = settings(max_examples=200, deadline=None, suppress_health_check=[HealthCheck.filter_too_much])
LN10 = math.log(10.0)
SOLVENT_KEYS = sorted(solvent_table())

charge = st.integers(min_value=-4, max_value=4)


@st.composite
def pairs(draw):
    """Keyword arguments of cross_rate for one pair drawn from the documented range."""
    solvent = solvent_table()[draw(st.sampled_from(SOLVENT_KEYS))]
    T = draw(st.floats(200.0, 400.0))
    return dict(
        E1_V=draw(st.floats(-5.0, 5.0)),
        E2_V=draw(st.floats(-5.0, 5.0)),
        z_ox1=draw(charge), z_red1=draw(charge), z_ox2=draw(charge), z_red2=draw(charge),
        r1_m=draw(st.floats(1.0, 30.0)) * 1e-10,
        r2_m=draw(st.floats(1.0, 30.0)) * 1e-10,
        ln_k11=draw(st.floats(-15.0, 12.0)) * LN10,
        ln_k22=draw(st.floats(-15.0, 12.0)) * LN10,
        T_K=T,
        I_M=draw(st.floats(0.0, 2.0)),
        eps_r=float(solvent.permittivity(T)),
        viscosity_Pa_s=float(solvent.viscosity_Pa_s(T)),
        ln_Z=math.log(1e11),
    )


def _in_domain(res):
    return bool(res.lambda11 > 0) and bool(res.lambda22 > 0)


@SETTINGS
@given(pairs(), st.booleans())
def test_no_nan_or_inf_in_documented_range(kw, diffusion):
    with np.errstate(all="ignore"):
        assume(_in_domain(cross_rate(**kw)))
    with np.errstate(over="raise", divide="raise", invalid="raise"):  # no overflow, 0-division, invalid op
        res = cross_rate(**kw, diffusion=diffusion)
    for name, value in res._asdict().items():
        assert np.all(np.isfinite(np.asarray(value, dtype=float))), name


@SETTINGS
@given(pairs(), st.floats(0.0, 1.0), st.floats(0.0, 1.0))
def test_normal_region_larger_driving_force_never_lowers_k_act(kw, fa, fb):
    # Common practice: on the normal side of the Marcus curve (0 <= -dG' <= lambda12) ln k_act rises with
    # the driving force. Place both pairs there by choosing E1 so that -dG' = f lambda12:
    # dG' = -F (E1 - E2) + w21 - w12 = -f lambda12  =>  E1 = E2 + (f lambda12 + w21 - w12) / F.
    base = cross_rate(**kw, diffusion=False)
    assume(_in_domain(base))
    lo, hi = sorted((fa, fb))
    lam, shift = float(base.lambda12), float(base.w21 - base.w12)
    E_lo = kw["E2_V"] + (lo * lam + shift) / FARADAY
    E_hi = kw["E2_V"] + (hi * lam + shift) / FARADAY
    k_lo = float(cross_rate(**{**kw, "E1_V": E_lo}, diffusion=False).ln_k_act)
    k_hi = float(cross_rate(**{**kw, "E1_V": E_hi}, diffusion=False).ln_k_act)
    assert k_hi >= k_lo - 1e-9 * max(1.0, abs(k_lo))


@SETTINGS
@given(pairs())
def test_observed_rate_below_both_activation_and_diffusion(kw):
    # 1/k_obs = 1/k_act + 1/k_D  =>  k_obs <= min(k_act, k_D) (tolerance: rounding, 1e-12 relative).
    res = cross_rate(**kw)
    assume(_in_domain(res))
    ln_min = min(float(res.ln_k_act), float(res.ln_k_diff))
    assert float(res.ln_k_obs) <= ln_min + 1e-12 * max(1.0, abs(ln_min))
    # ... and never more than a factor 2 below the smaller one (the harmonic-sum bound, ln 2).
    assert float(res.ln_k_obs) >= ln_min - math.log(2.0) - 1e-12 * max(1.0, abs(ln_min))


def _mp_ln_debye(delta):
    with mp.workdps(40):
        d = mp.mpf(delta)
        return 0.0 if delta == 0.0 else float(mp.log(d / mp.expm1(d)))


@SETTINGS
@given(st.floats(-1e300, 1e300, allow_nan=False, allow_infinity=False))
def test_ln_debye_factor_finite_and_exact_everywhere(delta):
    # Reference: mpmath at 40 digits of ln[delta/(e^delta - 1)] (Debye 1942). No overflow for huge |delta|.
    with np.errstate(over="raise", divide="raise", invalid="raise"):
        got = float(ln_debye_factor(delta))
    assert math.isfinite(got)
    expected = _mp_ln_debye(delta)
    # Absolute accuracy is what matters (it adds to ln k_D): a few ulp of ln|delta| near 0, 4e-16 relative far out.
    assert abs(got - expected) <= 5e-15 + 4e-16 * abs(expected)


@SETTINGS
@given(st.floats(-1e-4, 1e-4, allow_nan=False))
def test_ln_debye_factor_continuous_near_zero(delta):
    # Around delta = 0 the code switches from the series -delta/2 - delta^2/24 to the closed form at
    # |delta| = 1e-6; both sides must follow the function (mpmath, 40 digits) to ~ a few ulp of ln(|delta|),
    # so the switch leaves no visible step.
    assert abs(float(ln_debye_factor(delta)) - _mp_ln_debye(delta)) <= 5e-15


def test_ln_debye_factor_step_at_the_switch_is_below_1e_14():
    # The two sides of the switch point, one ulp apart: difference ~ slope (-1/2) x spacing, nothing more.
    for edge in (1e-6, -1e-6):
        below, above = np.nextafter(edge, 0.0), edge
        step = float(ln_debye_factor(above) - ln_debye_factor(below))
        assert abs(step + 0.5 * (above - below)) < 1e-14


def test_ln_debye_factor_limits():
    # delta -> 0: factor 1; delta >> 1: ln(delta) - delta; delta << -1: ln|delta| (Debye 1942 limits).
    assert ln_debye_factor(0.0) == 0.0
    assert float(ln_debye_factor(1e300)) == -1e300
    assert float(ln_debye_factor(-1e300)) == math.log(1e300)
    np.testing.assert_allclose(ln_debye_factor(np.array([50.0, -50.0])), [math.log(50.0) - 50.0, math.log(50.0)],
                               rtol=1e-15)
