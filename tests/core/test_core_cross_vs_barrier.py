"""The Marcus cross relation and the barrier form are one model: agreement to 1e-9 in ln k12 (issue 2, item 4).

Cross relation (R. A. Marcus & N. Sutin, Biochim. Biophys. Acta 811, 265 (1985), citation from memory):
ln k12 = [ln k11 + ln k22 + ln K12 + ln f12]/2 + ln W12.
Barrier form: lambda_ii = 4 (RT ln(Z/k_ii) - w_ii), lambda12 = (lambda11 + lambda22)/2,
dG' = dG + w21 - w12, dG_act = w12 + (lambda12/4)(1 + dG'/lambda12)^2, ln k12 = ln Z - dG_act/RT.
"""

import math

import numpy as np
import pytest

from crossrate.core.constants import GAS_CONSTANT
from crossrate.core.cross_rate import cross_rate
from crossrate.core.solvents import solvent_table

N = 20000


def _inputs(seed, one_electron=True):
    rng = np.random.default_rng(seed)
    solvents = list(solvent_table().values())
    pick = rng.integers(len(solvents), size=N)
    if one_electron:
        z_ox1, z_ox2 = rng.integers(-3, 5, N), rng.integers(-3, 5, N)
        z_red1, z_red2 = z_ox1 - 1, z_ox2 - 1
    else:  # the formulas do not need z_red = z_ox - 1; any charges -4..+4
        z_ox1, z_red1, z_ox2, z_red2 = (rng.integers(-4, 5, N) for _ in range(4))
    return dict(
        E1_V=rng.uniform(-2.0, 2.0, N),
        E2_V=rng.uniform(-2.0, 2.0, N),
        z_ox1=z_ox1, z_red1=z_red1, z_ox2=z_ox2, z_red2=z_red2,
        r1_m=rng.uniform(1.0, 30.0, N) * 1e-10,
        r2_m=rng.uniform(1.0, 30.0, N) * 1e-10,
        ln_k11=rng.uniform(-10.0, 10.0, N) * math.log(10.0),  # 20 decades of k_self
        ln_k22=rng.uniform(-10.0, 10.0, N) * math.log(10.0),
        T_K=rng.uniform(200.0, 400.0, N),
        I_M=rng.uniform(0.0, 2.0, N),
        eps_r=np.array([solvents[i].eps_s for i in pick]),
        viscosity_Pa_s=np.array([solvents[i].viscosity_mPa_s * 1e-3 for i in pick]),
        ln_Z=math.log(1e11),
    )


@pytest.mark.parametrize("one_electron", [True, False])
def test_cross_relation_equals_barrier_form(one_electron):
    x = _inputs(7 if one_electron else 8, one_electron)
    res = cross_rate(**x)
    barrier_ln_k = x["ln_Z"] - res.dG_act / (GAS_CONSTANT * x["T_K"])
    # The model's domain: lambda11, lambda22 > 0 (k_ii < Z exp(-w_ii/RT)); ~3 % of random draws fall outside
    # and are left out (there lambda12 can approach 0 and both forms lose all meaning, and digits).
    ok = (res.lambda11 > 0) & (res.lambda22 > 0)
    assert ok.mean() > 0.9
    np.testing.assert_allclose(res.ln_k_act[ok], barrier_ln_k[ok], rtol=0, atol=1e-9)
    # Both are also equal in the cross_rate fields: dG' and lambda12 recomputed from their definitions.
    RT = GAS_CONSTANT * x["T_K"]
    np.testing.assert_allclose(res.dG0_prime, res.dG0 + res.w21 - res.w12, rtol=0, atol=1e-9)
    lam11 = 4 * (RT * (x["ln_Z"] - x["ln_k11"]) - res.w11)
    lam22 = 4 * (RT * (x["ln_Z"] - x["ln_k22"]) - res.w22)
    np.testing.assert_allclose(res.lambda12, 0.5 * (lam11 + lam22), rtol=1e-12, atol=1e-6)
    # The sample spans the regimes and both signs of the driving force.
    assert set(np.unique(res.regime[ok])) == {0, 1, 2, 3}
    assert (res.dG0 > 0).any() and (res.dG0 < 0).any()
