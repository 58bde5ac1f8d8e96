"""Monte Carlo and first-order (linear) propagation agree where the model is near-linear; defaults are used
(and said) for couples without uncertainties."""

from dataclasses import replace

import pytest

from crossrate.library.couple_set import CoupleSet
from crossrate.services.prediction import predict
from crossrate.services.self_exchange import DEFAULT_K_SELF_LOG10_SD
from crossrate.services.uncertainty import DEFAULT_E_SD_V


def _pair_with_sds(direct_set, E_sd, k_sd):
    ox = replace(direct_set["hl-iron-a"], E_sd=E_sd, k_self_log10_sd=k_sd)
    red = replace(direct_set["hl-ru-b"], E_sd=E_sd, k_self_log10_sd=k_sd)
    return CoupleSet([ox, red], scales=direct_set.scales)


def test_monte_carlo_and_linear_agree_for_small_spreads(direct_set):
    # 1 mV and 0.02 log10 units: over this spread ln k_obs is linear in the inputs to well under 1 %
    # (the curvature term of the Marcus quadratic, (F dE)^2 / (8 lambda RT), is ~1e-4 of the linear one).
    cs = _pair_with_sds(direct_set, 0.001, 0.02)
    p = predict(cs, "hl-iron-a", "hl-ru-b", samples=20000, seed=7)
    assert p.log10_k_obs_sd_mc == pytest.approx(p.log10_k_obs_sd_linear, rel=0.03)
    lo, hi = p.log10_k_obs_95
    # Normal 95 % interval from the linear SD: log10 k_obs +- 1.96 SD (standard normal quantile).
    assert lo == pytest.approx(p.log10_k_obs - 1.96 * p.log10_k_obs_sd_linear, abs=0.03 * p.log10_k_obs_sd_linear * 2)
    assert hi == pytest.approx(p.log10_k_obs + 1.96 * p.log10_k_obs_sd_linear, abs=0.03 * p.log10_k_obs_sd_linear * 2)


def test_linear_sd_by_hand_for_small_spreads(direct_set):
    # Derivatives of the Marcus cross relation ln k12 = (ln k11 + ln k22 + ln K12 + ln f12)/2 + ln W12 when
    # w12 = w21 (both couples 3+/2+): with ln f12 = ln K12^2 / (4 L), L = -lambda12/(2RT) and x = dG0'/lambda12,
    # d ln k12 / d E1 = (F/RT)(1 + x)/2 (E2: the same magnitude) and d ln k12 / d ln k11 = (1 - x^2)/2.
    # The linear SD is then the root-sum-square with the input SDs; checked within 2 % of the
    # finite-difference value (the diffusion cap factor k_obs/k_act ~ 1 here).
    cs = _pair_with_sds(direct_set, 0.001, 0.02)
    p = predict(cs, "hl-iron-a", "hl-ru-b", samples=0)
    F_RT = 96485.33212 / (8.314462618 * 298.15)  # F/RT, 1/V (CODATA 2018 F and R)
    x = p.dG0_prime_kJ_per_mol / p.lambda_kJ_per_mol
    dE = 0.5 * F_RT * (1 + x)  # per V of E1 (and the same magnitude for E2)
    dk = 0.5 * (1 - x * x)  # per unit ln k11 (and ln k22)
    ln10 = 2.302585092994046
    cap = 10 ** (p.log10_k_obs - p.log10_k_act)
    sd_ln = cap * ((dE * 0.001) ** 2 * 2 + (dk * 0.02 * ln10) ** 2 * 2) ** 0.5
    assert p.log10_k_obs_sd_linear == pytest.approx(sd_ln / ln10, rel=0.02)


def test_defaults_used_and_reported(direct_set):
    bare = _pair_with_sds(direct_set, None, None)
    explicit = _pair_with_sds(direct_set, DEFAULT_E_SD_V, DEFAULT_K_SELF_LOG10_SD)
    p_bare = predict(bare, "hl-iron-a", "hl-ru-b", samples=2000, seed=3)
    p_explicit = predict(explicit, "hl-iron-a", "hl-ru-b", samples=2000, seed=3)
    # The documented defaults (10 mV, 0.3 in log10) give exactly the spread of stating them.
    assert p_bare.log10_k_obs_sd_linear == pytest.approx(p_explicit.log10_k_obs_sd_linear, rel=1e-12)
    assert p_bare.log10_k_obs_95 == pytest.approx(p_explicit.log10_k_obs_95, rel=1e-12)
    text = " ".join(p_bare.warnings)
    assert "default used for" in text and "E of hl-iron-a" in text and "k_self of hl-ru-b" in text
    assert not any("default used for" in w for w in p_explicit.warnings)
    assert DEFAULT_E_SD_V == 0.010 and DEFAULT_K_SELF_LOG10_SD == 0.3  # the values the README documents


def test_monte_carlo_is_reproducible_with_a_seed(couple_set):
    a = predict(couple_set, "hl-iron-a", "hl-ru-b", samples=5000, seed=11)
    b = predict(couple_set, "hl-iron-a", "hl-ru-b", samples=5000, seed=11)
    c = predict(couple_set, "hl-iron-a", "hl-ru-b", samples=5000, seed=12)
    assert a.log10_k_obs_95 == b.log10_k_obs_95
    assert a.log10_k_obs_95 != c.log10_k_obs_95
