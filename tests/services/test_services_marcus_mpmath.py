"""predict() against the Marcus barrier form evaluated independently with mpmath at 40 digits.

Formula source: Marcus cross relation with work terms, R. A. Marcus & N. Sutin, Biochim. Biophys. Acta 811,
265 (1985): lambda_ii = 4 (RT ln(Z/k_ii) - w_ii); lambda12 = (lambda11 + lambda22)/2;
Delta G deg' = Delta G deg + w21 - w12; Delta G double-dagger = w12 + (lambda12/4)(1 + Delta G deg'/lambda12)^2;
k_act = Z exp(-Delta G double-dagger / RT). Work terms: screened Coulomb (Debye-Hueckel-Brønsted)
w = z1 z2 e^2 N_A / (4 pi eps0 eps_r r (1 + kappa r)), kappa^2 = 2 N_A e^2 I 1000 / (eps0 eps_r k_B T).
Diffusion: Stokes-Einstein D = k_B T / (6 pi eta a) and Debye's rate (P. Debye, Trans. Electrochem. Soc. 82, 265
(1942); from memory) with the screened (Debye-Hueckel) potential: k_D = 4 pi N_A (D1 + D2) r12 1000 / J,
J = Integral_0^1 exp(delta x exp(-kappa r12 (1/x - 1))) dx, delta = w12/RT (J = (e^delta - 1)/delta at I = 0),
J by mpmath quadrature; 1/k_obs = 1/k_act + 1/k_D.
Constants: CODATA values from scipy.constants (the same source the core uses; the check is on the equations).
"""

import mpmath as mp
import pytest
from scipy import constants as sc

from crossrate.services.conditions import Conditions
from crossrate.services.prediction import predict

mp.mp.dps = 40
E_CH = mp.mpf(repr(sc.e))
N_A = mp.mpf(repr(sc.N_A))
K_B = mp.mpf(repr(sc.k))
EPS0 = mp.mpf(repr(sc.epsilon_0))
R = N_A * K_B
F = N_A * E_CH


def _barrier_form(c1, c2, T, I, eps_r, eta_mPa_s, Z, lambda11=None, lambda22=None):
    """log10 k_act, log10 k_obs, Delta G double-dagger (kJ/mol) and lambda12 (kJ/mol) at 40 digits."""
    T, I, eps_r, Z = (mp.mpf(repr(x)) for x in (T, I, eps_r, Z))
    eta = mp.mpf(repr(eta_mPa_s)) / 1000
    RT = R * T
    kappa = mp.sqrt(2 * N_A * E_CH**2 * I * 1000 / (EPS0 * eps_r * K_B * T))

    def w(z1, z2, r):
        return z1 * z2 * E_CH**2 * N_A / (4 * mp.pi * EPS0 * eps_r * r * (1 + kappa * r))

    r1 = mp.mpf(repr(c1.radius)) * mp.mpf("1e-10")
    r2 = mp.mpf(repr(c2.radius)) * mp.mpf("1e-10")
    r12 = r1 + r2
    w11 = w(c1.charge_ox, c1.charge_red, 2 * r1)
    w22 = w(c2.charge_ox, c2.charge_red, 2 * r2)
    w12 = w(c1.charge_ox, c2.charge_red, r12)
    w21 = w(c1.charge_red, c2.charge_ox, r12)
    lam11 = mp.mpf(lambda11) if lambda11 is not None else 4 * (RT * mp.log(Z / mp.mpf(repr(c1.k_self))) - w11)
    lam22 = mp.mpf(lambda22) if lambda22 is not None else 4 * (RT * mp.log(Z / mp.mpf(repr(c2.k_self))) - w22)
    lam12 = (lam11 + lam22) / 2
    dG0 = -F * (mp.mpf(repr(c1.E)) - mp.mpf(repr(c2.E)))
    dG0p = dG0 + w21 - w12
    dG_act = w12 + lam12 / 4 * (1 + dG0p / lam12) ** 2
    k_act = Z * mp.exp(-dG_act / RT)
    D1 = K_B * T / (6 * mp.pi * eta * r1)
    D2 = K_B * T / (6 * mp.pi * eta * r2)
    delta, b = w12 / RT, kappa * r12
    pts = [mp.mpf(0)] + [mp.mpf(2) ** -k for k in range(24, 0, -1)] + [1 - mp.mpf(2) ** -k for k in range(2, 25)]
    with mp.workdps(20):  # the integral to 20 digits is plenty for a 1e-8 check, and 40 would be slow
        J = mp.quad(lambda x: mp.exp(delta * x * mp.exp(-b * (1 / x - 1))) if x > 0 else mp.mpf(1), [*pts, 1])
    k_D = 4 * mp.pi * N_A * (D1 + D2) * r12 * 1000 / J
    k_obs = 1 / (1 / k_act + 1 / k_D)
    return float(mp.log10(k_act)), float(mp.log10(k_obs)), float(dG_act / 1000), float(lam12 / 1000)


@pytest.mark.parametrize(
    "ox, red, lambdas",
    [
        ("hl-iron-a", "hl-ru-b", (None, None)),  # both from k_self; 3+/2+ with 3+/2+ (w12 = w21)
        # hl-quinone-e gives lambda_total = 80 kJ/mol (so lambda11 = 80 kJ/mol exactly); 0/-1 with 3+/2+, so
        # w12 = 0 and w21 is attractive: exercises the work-term corrections of Delta G deg'.
        ("hl-quinone-e", "hl-co-c", ("80000", None)),
        ("hl-co-c", "hl-quinone-e", (None, "80000")),
    ],
)
@pytest.mark.parametrize("ionic_strength", [None, 0.1])
def test_predict_matches_marcus_barrier_form(couple_set, ox, red, lambdas, ionic_strength):
    # Same ionic strength and temperature as the couples' measurements, so no condition carrying is involved.
    p = predict(couple_set, ox, red, Conditions(ionic_strength_M=ionic_strength), samples=0)
    c = p.conditions
    log_act, log_obs, dG_act, lam12 = _barrier_form(
        couple_set[ox], couple_set[red], c.temperature_K, c.ionic_strength_M, c.relative_permittivity,
        c.viscosity_mPa_s, c.Z, *lambdas,
    )
    # predict() takes k_act from the cross relation (f12, W12); the barrier form is its algebraic equivalent,
    # so agreement to double-precision rounding (atol 1e-9 in log10 k) checks f12, W12 and the work terms;
    # k_obs carries crossrate's quadrature of Debye's integral, stated good to 1e-8 in ln k_D.
    assert p.log10_k_act == pytest.approx(log_act, abs=1e-9)
    assert p.log10_k_obs == pytest.approx(log_obs, abs=1e-8)
    assert p.dG_act_kJ_per_mol == pytest.approx(dG_act, rel=1e-10, abs=1e-9)
    assert p.lambda_kJ_per_mol == pytest.approx(lam12, rel=1e-10)


def test_barrier_form_check_is_sensitive(couple_set):
    # The reference must disagree when an input changes (here Z by 10 %): the check above cannot pass vacuously.
    p = predict(couple_set, "hl-iron-a", "hl-ru-b", samples=0)
    c = p.conditions
    log_act, _, _, _ = _barrier_form(
        couple_set["hl-iron-a"], couple_set["hl-ru-b"], c.temperature_K, c.ionic_strength_M,
        c.relative_permittivity, c.viscosity_mPa_s, c.Z * 1.1,
    )
    assert abs(p.log10_k_act - log_act) > 1e-3
