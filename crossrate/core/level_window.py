"""Where the terms of a Marcus–Levich–Jortner level sum peak, pair by pair: the window of vibrational levels that
crossrate.core.level_sum sums (its edges are checked there, and a window found short is widened).

The terms are w_n exp(-(x + lambda_s + n hbar omega)^2 / (4 lambda_s)) (RT units), w_n the Skellam weight of a
net change of n quanta; log-concave in n, so one peak. A cold mode: the peak by Newton steps on the continuous
form of d ln(term)/dn, the width from the curvature there; a warm mode: the weight taken as a Gaussian.
"""

import math

import numpy as np

#: Half-width of a window of levels: sigmas of the terms' local Gaussian shape, plus a margin in levels.
_WINDOW_SIGMAS = 4.5
_WINDOW_MARGIN = 1.0
#: Below this many thermal quanta the mode counts as cold for the window estimate (hbar omega > ~3 RT).
COLD_NU = 0.05
_NEWTON_STEPS = 2
_LN_HALF = math.log(0.5)
#: Levels kept past n = 0 on the far side of a cold mode's peak.
_ACROSS_ZERO = 7.0


def level_window(x, p):
    """(first level, number of levels) per pair, floats, around the peak of the terms of the level sum at
    Delta G deg' / RT = x; p: the per-pair quantities of crossrate.core.level_sum (lambda_s, hbar omega, nu, S,
    ln mu1, ln mu2; RT units). A warm mode: where the
    weight, taken as a Gaussian (mean S, variance S(2 nu + 1)), meets the exponential (centre -(x + lambda_s) /
    hbar omega, variance 2 lambda_s / hbar omega^2), symmetric. A cold one (nu < COLD_NU): the peak of
    mu^|n| / |n|! times the exponential, by Newton steps, and on each side the width from the curvature
    there (the weight's, 1/(m + 1/2) at m = |n|, grows towards n = 0 and the exponential's b is everywhere);
    past n = 0 the weight drops by the factor nu / (nu + 1) per level."""
    cold = p.nu < COLD_NU
    start = np.empty(x.shape)
    count = np.empty(x.shape)
    if not np.all(cold):
        k = ~cold
        var_p = p.S[k] * (2.0 * p.nu[k] + 1.0)
        var_g = 2.0 * p.ls[k] / (p.hw[k] * p.hw[k])
        tot = var_p + var_g
        centre = (p.S[k] * var_g - (x[k] + p.ls[k]) / p.hw[k] * var_p) / tot
        half = np.ceil(_WINDOW_SIGMAS * np.sqrt(var_p * var_g / tot) + _WINDOW_MARGIN)
        start[k] = np.rint(centre) - half
        count[k] = 2.0 * half + 1.0
    if np.any(cold):
        # d ln(term)/dm along m = |n|: ln(mu / (m + 1/2)) -/+ (x + lambda_s -/+ m hbar omega) a, decreasing and
        # convex in m, so Newton steps from m = 0 rise monotonically towards the root (u = m + 1/2 below).
        k = cold if not np.all(cold) else slice(None)
        hw = p.hw[k]
        a = hw / (2.0 * p.ls[k])
        e = (x[k] + p.ls[k]) * a
        up = p.ln_mu1[k] - _LN_HALF - e > 0.0  # the terms still rise past n = 0: the peak lies above it
        g = np.where(up, p.ln_mu1[k] - e, p.ln_mu2[k] + e)
        b = hw * a
        g += 0.5 * b  # ln mu -/+ e - b (u - 1/2) = g - b u
        u = np.full(g.shape, 0.5)
        for _ in range(_NEWTON_STEPS):
            f = g - np.log(u)
            f -= b * u
            # u + f / (1/u + b) = u (1 + f / (1 + b u))
            f /= 1.0 + b * u
            f += 1.0
            u *= f
            np.maximum(u, 0.5, out=u)
        mc = np.rint(u - 0.5)
        s55 = _WINDOW_SIGMAS
        inner = np.ceil(s55 / np.sqrt(1.0 / (mc + 0.5) + b) + _WINDOW_MARGIN)
        outer = np.ceil(s55 / np.sqrt(1.0 / (mc + 1.5 + 1.0 / np.sqrt(b)) + b) + _WINDOW_MARGIN)
        # Towards n = 0 and past it: at most mc levels to 0, then a few across it (the weight falls by
        # (nu + 1) / nu per level on the other side).
        np.minimum(inner, mc + _ACROSS_ZERO, out=inner)
        start[k] = np.where(up, mc - inner, -mc - outer)
        count[k] = inner + outer + 1.0
    return start, count
