"""Independent 40-digit evaluation (mpmath) of the cross relation with work terms and of the diffusion limit.

The reference below is written from the published formulas, not from crossrate's functions:
* work term, Debye-Hueckel-Brønsted form: w = z1 z2 e^2 N_A / (4 pi eps0 eps r (1 + kappa r)),
  kappa^2 = 2 N_A e^2 I 1000 / (eps0 eps k_B T) (issue 2, item 2);
* Marcus cross relation with work terms (R. A. Marcus & N. Sutin, Biochim. Biophys. Acta 811, 265 (1985); citations here from memory):
  k12 = (k11 k22 K12 f12)^(1/2) W12, ln f12 = [ln K12 + (w12 - w21)/RT]^2 / (4 [ln(k11 k22/Z^2) + (w11 + w22)/RT]),
  W12 = exp[-(w12 + w21 - w11 - w22)/2RT];
* Debye's encounter rate (P. Debye, Trans. Electrochem. Soc. 82, 265 (1942)) with Stokes-Einstein
  D = k_B T/(6 pi eta a): k_D = 4 pi N_A (D1 + D2) r12 / J, J = Integral_0^1 exp(delta x e^{-b (1/x - 1)}) dx
  for the screened (Debye-Hueckel) potential, delta = w12/RT, b = kappa r12 (J = (e^delta - 1)/delta at b = 0);
  J by mpmath quadrature (20 digits) on a sample of the cases, as it costs ~0.1 s a case;
* 1/k_obs = 1/k_act + 1/k_D.
Constants: scipy.constants (CODATA), taken as exact binary values into mpmath.
"""

import math

import mpmath as mp
import numpy as np
import pytest
import scipy.constants as sc

from crossrate.core.cross_rate import cross_rate
from crossrate.core.solvents import solvent_table

N_CASES = 300
TOL_LN_K = 1e-9
TOL_LN_KD = 1e-8
N_KD_SAMPLE = 16


def _mp_reference(c):
    """(ln k_act, ln k_D, ln k_obs, lambda12 in J/mol) at 40 digits for one case (dict of floats)."""
    with mp.workdps(40):
        f = mp.mpf
        e, NA, kB, eps0, R = f(sc.e), f(sc.N_A), f(sc.k), f(sc.epsilon_0), f(sc.R)
        F = e * NA
        T, I, eps, eta, lnZ = f(c["T"]), f(c["I"]), f(c["eps"]), f(c["eta"]), f(c["lnZ"])
        r1, r2 = f(c["r1"]), f(c["r2"])
        RT = R * T
        kappa = mp.sqrt(2 * NA * e**2 * I * 1000 / (eps0 * eps * kB * T))

        def w(za, zb, r):
            return f(za) * f(zb) * e**2 * NA / (4 * mp.pi * eps0 * eps * r * (1 + kappa * r))

        r12 = r1 + r2
        w11, w22 = w(c["zo1"], c["zr1"], 2 * r1), w(c["zo2"], c["zr2"], 2 * r2)
        w12, w21 = w(c["zo1"], c["zr2"], r12), w(c["zr1"], c["zo2"], r12)
        lk11, lk22 = f(c["lk11"]), f(c["lk22"])
        lnK = F * (f(c["E1"]) - f(c["E2"])) / RT
        lnf = (lnK + (w12 - w21) / RT) ** 2 / (4 * (lk11 + lk22 - 2 * lnZ + (w11 + w22) / RT))
        lnW = -(w12 + w21 - w11 - w22) / (2 * RT)
        ln_act = (lk11 + lk22 + lnK + lnf) / 2 + lnW
        D1, D2 = kB * T / (6 * mp.pi * eta * r1), kB * T / (6 * mp.pi * eta * r2)
        delta, b = w12 / RT, kappa * r12
        ln_prefactor = mp.log(4 * mp.pi * NA * 1000 * (D1 + D2) * r12)
        lam11 = 4 * (RT * (lnZ - lk11) - w11)
        lam22 = 4 * (RT * (lnZ - lk22) - w22)
        return (float(ln_act), float(ln_prefactor), float(delta), float(b), float((lam11 + lam22) / 2),
                float(lam11), float(lam22))


def _mp_ln_kD(ln_prefactor, delta, b):
    """ln k_D = ln prefactor - ln J(delta, b), J by mpmath quadrature at 20 digits (split towards both ends)."""
    with mp.workdps(20):
        d, bb = mp.mpf(delta), mp.mpf(b)

        def f(x):
            return mp.exp(d * x * mp.exp(-bb * (1 / x - 1))) if x > 0 else mp.mpf(1)

        pts = [mp.mpf(0)] + [mp.mpf(2) ** -k for k in range(24, 0, -1)]
        pts += [1 - mp.mpf(2) ** -k for k in range(2, 25)] + [mp.mpf(1)]
        return float(ln_prefactor - mp.log(mp.quad(f, pts)))


def _random_cases(seed, n):
    rng = np.random.default_rng(seed)
    solvents = list(solvent_table().values())
    cases = []
    while len(cases) < n:
        s = solvents[rng.integers(len(solvents))]
        T = float(rng.uniform(200.0, 400.0))
        zo1, zo2 = int(rng.integers(-3, 5)), int(rng.integers(-3, 5))
        c = dict(
            E1=float(rng.uniform(-5.0, 5.0)), E2=float(rng.uniform(-5.0, 5.0)),
            zo1=zo1, zr1=zo1 - 1, zo2=zo2, zr2=zo2 - 1,  # one-electron couples, charges in -4..+4
            r1=float(rng.uniform(1.0, 30.0)) * 1e-10, r2=float(rng.uniform(1.0, 30.0)) * 1e-10,
            lk11=float(rng.uniform(-15.0, 12.0)) * math.log(10.0), lk22=float(rng.uniform(-15.0, 12.0)) * math.log(10.0),
            T=T, I=float(rng.uniform(0.0, 2.0)), eps=float(s.eps_s), eta=float(s.viscosity_mPa_s) * 1e-3,
            lnZ=math.log(float(10.0 ** rng.uniform(10.0, 12.0))),
        )
        ref = _mp_reference(c)
        # The documented input range (k_self 1e-15..1e12, E +-5 V, charges -4..+4, radius 1-30 angstrom,
        # I 0-2 M, T 200-400 K, every solvent, Z 1e10-1e12), restricted to the model's domain lambda_ii > 0,
        # i.e. k_ii < Z exp(-w_ii/RT): a self-exchange faster than the collision limit allows has no Marcus
        # barrier (crossrate's services must refuse such couples). Judged by the mpmath reference itself.
        if ref[5] > 0.0 and ref[6] > 0.0:
            cases.append((c, ref))
    return cases


CASES = _random_cases(20240601, N_CASES)


def _columns(cases):
    keys = cases[0][0].keys()
    return {k: np.array([c[k] for c, _ in cases], dtype=float) for k in keys}


def test_cross_rate_matches_mpmath_reference():
    x = _columns(CASES)
    ref = np.array([r for _, r in CASES])
    res = cross_rate(
        x["E1"], x["E2"], x["zo1"], x["zr1"], x["zo2"], x["zr2"], x["r1"], x["r2"], x["lk11"], x["lk22"],
        x["T"], x["I"], x["eps"], x["eta"], x["lnZ"],
    )
    # Agreement to 1e-9 in ln k (absolute) for k_act; k_D to 1e-8 (the stated accuracy of crossrate's
    # quadrature) on a sample of N_KD_SAMPLE cases; k_obs = 1/(1/k_act + 1/k_D) from the reference k_act.
    np.testing.assert_allclose(res.ln_k_act, ref[:, 0], rtol=0, atol=TOL_LN_K)
    sample = range(N_KD_SAMPLE)
    kd_ref = np.array([_mp_ln_kD(ref[i, 1], ref[i, 2], ref[i, 3]) for i in sample])
    np.testing.assert_allclose(res.ln_k_diff[:N_KD_SAMPLE], kd_ref, rtol=0, atol=TOL_LN_KD)
    with mp.workdps(40):
        obs_ref = [float(-mp.log(mp.exp(-mp.mpf(a)) + mp.exp(-mp.mpf(float(d))))) for a, d in zip(ref[:, 0], res.ln_k_diff, strict=True)]
    np.testing.assert_allclose(res.ln_k_obs, obs_ref, rtol=0, atol=TOL_LN_K)
    np.testing.assert_allclose(res.lambda12, ref[:, 4], rtol=1e-12)
    # The sample spans what it should: both signs of work, diffusion-capped and activation-controlled pairs.
    assert (res.w12 > 0).any() and (res.w12 < 0).any() and (res.w12 == 0).any()
    assert res.diffusion_controlled.any() and (~res.diffusion_controlled).any()
    assert set(np.unique(res.regime)) == {0, 1, 2, 3}


def test_cases_are_a_few_hundred_and_span_the_range():
    x = _columns(CASES)
    assert len(CASES) == N_CASES
    span = x["lk11"].max() - x["lk11"].min()
    assert span / math.log(10.0) > 20  # k_self sampled over more than 20 decades
    assert x["I"].min() < 0.05 and x["I"].max() > 1.9


@pytest.mark.parametrize("delta", [0.0, 1e-12, -1e-7, 3e-6, 0.01, -0.5, 2.0, -40.0, 300.0, -700.0])
def test_debye_smoluchowski_factor_matches_mpmath(delta):
    # ln[delta/(e^delta - 1)] (Debye 1942) at 40 digits vs crossrate's ln k_D for a pair whose w12 = delta RT.
    from crossrate.core.diffusion import ln_debye_factor

    with mp.workdps(40):
        d = mp.mpf(delta)
        expected = 0.0 if delta == 0.0 else float(mp.log(d / mp.expm1(d)))
    assert float(ln_debye_factor(delta)) == pytest.approx(expected, abs=1e-15, rel=1e-15)
