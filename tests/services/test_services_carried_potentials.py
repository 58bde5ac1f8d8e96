"""Formal potentials carried to the target conditions: predict, predict_many, screen, rate_map and solve agree."""

import math

import numpy as np
import pytest
from scipy import constants as sc

from crossrate.core.solvents import get_solvent
from crossrate.errors import ConditionsError
from crossrate.library.couple import Couple
from crossrate.library.couple_set import CoupleSet
from crossrate.services.batch_prediction import predict_many
from crossrate.services.carried_potentials import DEFAULT_DE_DT_SD_V_PER_K
from crossrate.services.conditions import Conditions
from crossrate.services.prediction import DEFAULT_SEED, predict
from crossrate.services.rate_map import rate_map
from crossrate.services.screening import screen
from crossrate.services.uncertainty import DEFAULT_E_SD_V


def _c(cid, zox, E, k, radius, medium="water", I=0.0, T=298.15, **kw):
    return Couple(id=cid, name=cid, charge_ox=zox, charge_red=zox - 1, E=E, E_scale="SHE", radius=radius,
                  medium=medium, ionic_strength=I, temperature=T, source="invented for a test", k_self=k,
                  verified=True, **kw)


@pytest.fixture
def cs():
    return CoupleSet([
        _c("tri", 3, 0.40, 1e3, 6.0),                               # 3+/2+, E at I = 0
        _c("ani", -3, 0.20, 1e4, 6.0, dE_dT=-0.5),                  # 3-/4-, E at I = 0, dE/dT given
        _c("mono", 1, 0.10, 1e5, 4.0, I=0.1, E_ionic_strength=0.5),  # E measured at 0.5 M, k_self at 0.1 M
        _c("neu", 1, -0.05, 1e6, 4.5, E_sd=0.004),
        _c("mecn", 1, 0.30, 1e6, 4.0, medium="acetonitrile"),
    ])


def _extended_dh_shift(z_ox, a_m, I1, I2, T):
    # Extended Debye-Hueckel (textbook form) with A, B from scipy.constants and the project's water permittivity;
    # dE = (RT/F) ln 10 [log10 g_ox - log10 g_red]_(I1)^(I2) for one electron (Nernst equation with activities).
    eps = float(get_solvent("water").permittivity(T))
    B = math.sqrt(2000.0 * sc.N_A * sc.e**2 / (sc.epsilon_0 * eps * sc.k * T))
    A = sc.e**2 * B / (8.0 * math.pi * sc.epsilon_0 * eps * sc.k * T * math.log(10.0))

    def ratio(I):
        s = math.sqrt(I)
        return -A * (z_ox**2 - (z_ox - 1) ** 2) * s / (1.0 + B * a_m * s)

    return sc.R * T * math.log(10.0) / sc.physical_constants["Faraday constant"][0] * (ratio(I2) - ratio(I1))


def test_ionic_strength_carries_E_and_the_driving_force(cs):
    p0 = predict(cs, "tri", "ani", Conditions(ionic_strength_M=0.0), samples=0)
    p1 = predict(cs, "tri", "ani", Conditions(ionic_strength_M=0.1), samples=0)
    d_tri = _extended_dh_shift(3, 6e-10, 0.0, 0.1, 298.15)
    d_ani = _extended_dh_shift(-3, 6e-10, 0.0, 0.1, 298.15)
    # Issue statement (from memory): about -30 mV for 3+/2+ and about +40 mV for 3-/4- from 0 to 0.1 M.
    assert -0.036 < d_tri < -0.025 and 0.035 < d_ani < 0.050
    tri, ani = p1.potentials
    assert tri.E_given_V == 0.40 and tri.E_at_conditions_V == pytest.approx(0.40 + d_tri, abs=1e-9)
    assert ani.ionic_correction_V == pytest.approx(d_ani, abs=1e-9)
    assert "extended Debye-Hueckel" in tri.basis and "a = 6 A" in tri.basis
    # Delta G deg = -F (E1 - E2): both corrections move it, by -F (d_tri - d_ani) = +6.8 kJ/mol here.
    F = sc.physical_constants["Faraday constant"][0]
    assert p1.dG0_kJ_per_mol - p0.dG0_kJ_per_mol == pytest.approx(-F * (d_tri - d_ani) / 1e3, abs=1e-6)
    assert p0.potentials[0].E_at_conditions_V == 0.40 and "as given" in p0.potentials[0].basis


def test_davies_equation_when_chosen(cs):
    # Davies equation (Davies 1938, textbook form): log10 g = -A z^2 (sqrt(I)/(1 + sqrt(I)) - 0.3 I), with A from
    # scipy.constants and the project's water permittivity (as above); no ion size. For one electron
    # dE = (RT/F) ln 10 (-A) (z_ox^2 - z_red^2) [g(I2) - g(I1)], g(I) = sqrt(I)/(1 + sqrt(I)) - 0.3 I.
    T = 298.15
    eps = float(get_solvent("water").permittivity(T))
    B = math.sqrt(2000.0 * sc.N_A * sc.e**2 / (sc.epsilon_0 * eps * sc.k * T))
    A = sc.e**2 * B / (8.0 * math.pi * sc.epsilon_0 * eps * sc.k * T * math.log(10.0))
    F = sc.physical_constants["Faraday constant"][0]

    def g(I):
        return math.sqrt(I) / (1.0 + math.sqrt(I)) - 0.3 * I

    def davies(z_ox, I1, I2):
        return sc.R * T * math.log(10.0) / F * (-A) * (z_ox**2 - (z_ox - 1) ** 2) * (g(I2) - g(I1))

    davies_cond = Conditions(ionic_strength_M=0.3, activity_model="Davies")
    p = predict(cs, "tri", "ani", davies_cond, samples=0)
    tri, ani = p.potentials
    assert tri.ionic_correction_V == pytest.approx(davies(3, 0.0, 0.3), abs=1e-9)
    assert ani.ionic_correction_V == pytest.approx(davies(-3, 0.0, 0.3), abs=1e-9)
    assert "Davies" in tri.basis and "a = " not in tri.basis
    # Within the Davies equation's range (0.5 M) no range warning; the default equation's 0.1 M is exceeded.
    assert not any("beyond the range" in w for w in p.warnings)
    dh = predict(cs, "tri", "ani", Conditions(ionic_strength_M=0.3), samples=0)
    assert any("beyond the range of the extended Debye-Hueckel" in w for w in dh.warnings)


def test_unknown_activity_model_is_refused():
    with pytest.raises(ConditionsError, match="activity model 'Guntelberg'.*expected one of"):
        Conditions(activity_model="Guntelberg")


def test_own_ionic_strength_of_E_is_used(cs):
    p = predict(cs, "mono", "neu", Conditions(ionic_strength_M=0.1), samples=0)
    mono = p.potentials[0]
    assert mono.ionic_correction_V == pytest.approx(_extended_dh_shift(1, 4e-10, 0.5, 0.1, 298.15), abs=1e-9)
    assert "I 0.5 -> 0.1 M" in mono.basis
    # 0.5 M is past the extended Debye-Hueckel range: said in a warning.
    assert any(w.startswith("mono: E carried in ionic strength beyond the range") for w in p.warnings)


def test_temperature_coefficient_and_default_uncertainty(cs):
    p = predict(cs, "tri", "ani", Conditions(temperature_K=318.15, ionic_strength_M=0.0), samples=0)
    tri, ani = p.potentials
    # dE_dT = -0.5 mV/K over +20 K: -10 mV exactly.
    assert ani.temperature_correction_V == pytest.approx(-0.010, abs=1e-12)
    assert ani.E_sd_V == pytest.approx(DEFAULT_E_SD_V)
    # No dE_dT for tri: E held, SD grows in quadrature by 1 mV/K x 20 K (project's default).
    assert tri.temperature_correction_V == 0.0
    assert tri.E_sd_V == pytest.approx(math.hypot(DEFAULT_E_SD_V, DEFAULT_DE_DT_SD_V_PER_K * 20.0), rel=1e-12)
    warn = [w for w in p.warnings if w.startswith("tri: E measured at 298.15 K, used at 318.15 K")]
    assert len(warn) == 1 and "Delta T = +20 K" in warn[0]
    assert not any(w.startswith("ani: E measured at") for w in p.warnings)
    # The interval uses the grown SD: wider than with the temperature coefficient given.
    cs2 = CoupleSet([c if c.id != "tri" else _c("tri", 3, 0.40, 1e3, 6.0, dE_dT=0.0) for c in cs])
    p2 = predict(cs2, "tri", "ani", Conditions(temperature_K=318.15, ionic_strength_M=0.0), samples=0)
    assert p.log10_k_obs == pytest.approx(p2.log10_k_obs, abs=1e-12)
    assert p.log10_k_obs_sd_linear > p2.log10_k_obs_sd_linear


def test_other_medium_is_refused_unless_allowed(cs):
    cond = Conditions(medium="water", allow_mixed_media=True, ionic_strength_M=0.1)
    with pytest.raises(ConditionsError) as err:
        predict(cs, "tri", "mecn", cond)
    msg = str(err.value)
    assert "\n" not in msg and msg.startswith("mecn: E was measured in acetonitrile and cannot be carried to water")
    assert "--allow-E-other-medium" in msg
    p = predict(cs, "tri", "mecn", cond.with_(allow_E_other_medium=True), samples=0)
    assert [x.carried for x in p.potentials] == [True, False]
    assert p.potentials[1].E_at_conditions_V == 0.30 and "not carried" in p.potentials[1].basis
    assert any(w.startswith("mecn: E was not carried") for w in p.warnings)
    # The batch path and the map refuse the pair the same way, and compute it when allowed.
    t = predict_many(cs, ["tri"], ["mecn"], cond)
    assert "another medium" in t.problem[0] and math.isnan(t.log10_k_obs[0])
    t = predict_many(cs, ["tri"], ["mecn"], cond.with_(allow_E_other_medium=True))
    assert t.log10_k_obs[0] == pytest.approx(p.log10_k_obs, abs=1e-10)
    m = rate_map(cs, conditions=cond)
    assert math.isnan(m.value("tri", "mecn")) and m.E_not_carried == ()
    m = rate_map(cs, conditions=cond.with_(allow_E_other_medium=True))
    assert m.value("tri", "mecn") == pytest.approx(p.log10_k_obs, abs=1e-10)
    assert m.E_not_carried == ("mecn",) and m.to_dict()["E_not_carried"] == ["mecn"]


@pytest.mark.parametrize("cond", [
    Conditions(ionic_strength_M=0.1, temperature_K=310.0),
    Conditions(ionic_strength_M=0.3),
    Conditions(ionic_strength_M=0.3, activity_model="Davies"),
    Conditions(temperature_K=290.0, ionic_strength_M=0.0, medium="water"),
])
def test_predict_screen_and_map_agree(cs, cond):
    ids = ["tri", "ani", "mono", "neu"]
    m = rate_map(cs, ids=ids, conditions=cond)
    s = screen(cs, "tri", "oxidant", cond)
    pairs = [(o, r) for o in ids for r in ids if o != r]
    t = predict_many(cs, [o for o, _ in pairs], [r for _, r in pairs], cond)
    for k, (o, r) in enumerate(pairs):
        p = predict(cs, o, r, cond, samples=0)
        assert m.value(o, r) == pytest.approx(p.log10_k_obs, abs=1e-9)
        assert t.log10_k_obs[k] == pytest.approx(p.log10_k_obs, abs=1e-9)
        assert t.log10_k_obs_sd_linear[k] == pytest.approx(p.log10_k_obs_sd_linear, abs=1e-6)
        if o == "tri":
            row = s.partner.index(r)
            assert s.table.log10_k_obs[row] == pytest.approx(p.log10_k_obs, abs=1e-9)


def test_per_pair_ionic_strength_batch_path_carries_E(cs):
    # No ionic strength given: each pair at its couples' common one (per-pair grouping in predict_many).
    cs2 = CoupleSet(list(cs) + [_c("tri01", 3, 0.40, 1e3, 6.0, I=0.1, E_ionic_strength=0.0),
                                _c("neu01", 1, -0.05, 1e6, 4.5, I=0.1)])
    t = predict_many(cs2, ["tri01", "tri"], ["neu01", "ani"], Conditions())
    for k, (o, r) in enumerate((("tri01", "neu01"), ("tri", "ani"))):
        p = predict(cs2, o, r, Conditions(), samples=0)
        assert t.log10_k_obs[k] == pytest.approx(p.log10_k_obs, abs=1e-9)
        assert t.log10_k_obs_sd_linear[k] == pytest.approx(p.log10_k_obs_sd_linear, abs=1e-6)
    assert predict(cs2, "tri01", "neu01", samples=0).potentials[0].ionic_correction_V == pytest.approx(
        _extended_dh_shift(3, 6e-10, 0.0, 0.1, 298.15), abs=1e-9
    )


def test_api_interval_is_seeded_by_default(cs):
    from crossrate.cli.predict_cmd import DEFAULT_SEED as CLI_SEED

    assert CLI_SEED == DEFAULT_SEED
    a = predict(cs, "tri", "ani", samples=500)
    b = predict(cs, "tri", "ani", samples=500)
    c = predict(cs, "tri", "ani", samples=500, seed=DEFAULT_SEED)
    assert a.log10_k_obs_95 == b.log10_k_obs_95 == c.log10_k_obs_95
    d = predict(cs, "tri", "ani", samples=500, seed=1)
    assert d.log10_k_obs_95 != a.log10_k_obs_95


def test_json_record_has_the_potentials(cs):
    d = predict(cs, "tri", "ani", Conditions(ionic_strength_M=0.1), samples=0).to_dict()
    keys = {"couple", "E_scale", "E_given_V", "E_at_conditions_V", "ionic_correction_V", "temperature_correction_V",
            "E_sd_V", "carried", "basis"}
    assert [set(x) for x in d["potentials"]] == [keys, keys]
    assert np.isfinite(d["potentials"][0]["E_at_conditions_V"])
