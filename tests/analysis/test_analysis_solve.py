"""Solving the cross relation backwards: round trips against the forward prediction, the diffusion limit,
the two potential roots, and several partners combined."""

import math

import pytest

from crossrate.errors import ConditionsError, InputFileError, ScienceError, UnknownCoupleError
from crossrate.services.conditions import Conditions
from crossrate.services.measured_csv import PartnerRow
from crossrate.services.prediction import predict
from crossrate.services.solving import solve_k_self, solve_potential
from crossrate.services.solving_several import combine, solve_several

# (oxidant, reductant, conditions): normal-region pairs with work terms of both signs, with and without
# the diffusion cap, at the couples' own and at other ionic strengths and temperatures.
PAIRS = [
    ("hl-phen", "hl-aqua", Conditions()),
    ("hl-phen", "hl-cyano", Conditions(ionic_strength_M=0.5, diffusion=False)),
    ("hl-phen", "hl-slow", Conditions()),
    ("hl-cyano", "hl-amm", Conditions(diffusion=False)),
    ("hl-slow", "hl-quin", Conditions(temperature_K=310.0)),
    ("hl-aqua", "hl-amm", Conditions(ionic_strength_M=1.0, temperature_K=288.15)),
]


def _k_obs(cs, ox, red, cond):
    return 10.0 ** predict(cs, ox, red, cond, samples=0).log10_k_obs


def _lib_log10_k_at(cs, cid, cond, partner):
    """The library k_self carried to the conditions, read off predict() (log10_k11 or log10_k22)."""
    p = predict(cs, cid, partner, cond, samples=0)
    return p.log10_k11


@pytest.mark.parametrize("ox, red, cond", PAIRS)
@pytest.mark.parametrize("unknown_is", ["oxidant", "reductant"])
def test_k_self_round_trip(analysis_set, ox, red, cond, unknown_is):
    # Forward: k12 from the library couples; backward: solve for one couple's k_self with the other as
    # partner. The solver must return the couple's own k_self (carried to these conditions) to 1e-6 in log10.
    k12 = _k_obs(analysis_set, ox, red, cond)
    unknown, partner = (ox, red) if unknown_is == "oxidant" else (red, ox)
    sol = solve_k_self(analysis_set, unknown, partner, k12, role=unknown_is, conditions=cond)
    p = predict(analysis_set, ox, red, cond, samples=0)
    expected = p.log10_k11 if unknown_is == "oxidant" else p.log10_k22
    assert sol.log10_k_self == pytest.approx(expected, abs=1e-6)
    assert sol.library_log10_k_self_at_conditions == pytest.approx(expected, abs=1e-9)
    assert sol.k_self == pytest.approx(10.0**sol.log10_k_self, rel=1e-12)
    lo, hi = sol.log10_k_self_95
    assert lo < sol.log10_k_self < hi
    assert not sol.diffusion_limited


@pytest.mark.parametrize("ox, red, cond", PAIRS)
@pytest.mark.parametrize("unknown_is", ["oxidant", "reductant"])
def test_potential_round_trip(analysis_set, ox, red, cond, unknown_is):
    # The normal-side root must be the library E (V, own scale) to 1e-6 V for these normal-region pairs.
    k12 = _k_obs(analysis_set, ox, red, cond)
    unknown, partner = (ox, red) if unknown_is == "oxidant" else (red, ox)
    sol = solve_potential(analysis_set, unknown, partner, k12, role=unknown_is, conditions=cond)
    p = predict(analysis_set, ox, red, cond, samples=0)
    assert -p.dG0_prime_kJ_per_mol < p.lambda_kJ_per_mol  # on the normal side of the maximum
    assert sol.E_V[0] == pytest.approx(analysis_set[unknown].E, abs=1e-6)
    assert sol.E_regime == ("normal", "inverted")
    assert sol.supported[0]
    if p.regime == "normal":  # far from the maximum a single rate cannot back the inverted-side root
        assert not sol.supported[1]
    assert sol.E_scale == "SHE"
    # Both roots give the same rate: ln k_act is quadratic in Delta G deg' about -Delta G deg' = lambda12.
    assert (sol.E_V[0] - sol.E_at_maximum_V) * (sol.E_V[1] - sol.E_at_maximum_V) < 0


def test_inverted_pair_returns_library_E_as_second_root(analysis_set):
    # hl-bpy + hl-viol: -Delta G deg = 1.70 eV, far past lambda12 (~0.6 eV): the library E is the inverted root.
    p = predict(analysis_set, "hl-bpy", "hl-viol", samples=0)
    assert p.regime == "inverted"
    sol = solve_potential(analysis_set, "hl-viol", "hl-bpy", 10.0**p.log10_k_obs, role="reductant")
    assert sol.E_V[1] == pytest.approx(analysis_set["hl-viol"].E, abs=1e-6)
    assert sol.E_V[0] > sol.E_at_maximum_V > sol.E_V[1]  # reductant: less driving force = higher E


def test_f12_matters_so_the_full_relation_is_solved(analysis_set):
    # With |Delta G deg| = 0.65 eV, ln f12 is far from 0; the f = 1 shortcut k11 = k12^2 / (k22 K12 W12^2)
    # would miss. The round trip above passes only with f12 inside the root.
    cond = Conditions(diffusion=False)
    p = predict(analysis_set, "hl-phen", "hl-cyano", cond, samples=0)
    assert abs(p.ln_f12) > 2.0
    sol = solve_k_self(analysis_set, "hl-cyano", "hl-phen", 10.0**p.log10_k_obs, role="reductant", conditions=cond)
    shortcut = 2 * p.log10_k_obs - p.log10_k11 - p.log10_K12 - 2 * p.ln_W12 / math.log(10)
    assert abs(shortcut - sol.log10_k_self) > 0.5
    assert sol.log10_k_self == pytest.approx(p.log10_k22, abs=1e-6)


def test_activationless_pair_has_a_second_k_self_root(analysis_set):
    # hl-bpy + hl-cyano at I = 0.5 M sits in the activationless band: lambda12 ~ -Delta G deg', so k12 is
    # near its maximum over k11 and two k_self values give the same rate; the library's lies on the far side.
    cond = Conditions(ionic_strength_M=0.5, diffusion=False)
    p = predict(analysis_set, "hl-bpy", "hl-cyano", cond, samples=0)
    assert p.regime == "activationless"
    sol = solve_k_self(analysis_set, "hl-bpy", "hl-cyano", 10.0**p.log10_k_obs, role="oxidant", conditions=cond)
    assert sol.log10_k_self_second_root == pytest.approx(p.log10_k11, abs=1e-6)
    assert sol.log10_k_self < sol.log10_k_self_second_root
    assert "second root" in sol.explanation


def test_auto_role_is_the_downhill_direction(analysis_set):
    k12 = _k_obs(analysis_set, "hl-phen", "hl-aqua", Conditions())
    sol = solve_k_self(analysis_set, "hl-aqua", "hl-phen", k12)  # E(aqua) 0.74 < E(phen) 1.05
    assert sol.role == "reductant" and "auto" in sol.role_reason


def test_diffusion_limit(analysis_set):
    p = predict(analysis_set, "hl-phen", "hl-aqua", samples=0)
    kD = 10.0**p.log10_k_diff
    with pytest.raises(ScienceError, match="at or above the diffusion limit"):
        solve_k_self(analysis_set, "hl-aqua", "hl-phen", 1.2 * kD)
    with pytest.raises(ScienceError, match="at or above the diffusion limit"):
        solve_potential(analysis_set, "hl-aqua", "hl-phen", 1.2 * kD)
    # 0.95 k_D needs k_act = 19 k_D > 10 k_D: diffusion-limited, only a lower bound on k_self.
    sol = solve_k_self(analysis_set, "hl-aqua", "hl-phen", 0.95 * kD)
    assert sol.diffusion_limited and sol.log10_k_self is None and sol.log10_k_self_95 is None
    assert "no k_self can be backed out" in sol.explanation
    # The bound solves k_act = k_obs: it must lie below the exact answer with k_act = 19 k_D.
    exact = solve_k_self(analysis_set, "hl-aqua", "hl-phen", 0.95 * kD, conditions=Conditions(diffusion=False))
    assert sol.log10_k_self_lower_bound < exact.log10_k_self


def test_rate_faster_than_any_k_self_allows(analysis_set):
    # hl-amm + hl-spin is endergonic-free but slow; 1e10 (activation-controlled, cap off) exceeds the maximum.
    with pytest.raises(ScienceError, match="faster than the cross relation allows"):
        solve_k_self(analysis_set, "hl-spin", "hl-aqua", 1e10, conditions=Conditions(diffusion=False))
    with pytest.raises(ScienceError, match="faster than the cross relation allows"):
        solve_potential(analysis_set, "hl-spin", "hl-aqua", 1e12, conditions=Conditions(diffusion=False))


def test_bad_inputs(analysis_set):
    with pytest.raises(UnknownCoupleError, match="did you mean hl-aqua"):
        solve_k_self(analysis_set, "hl-aqa", "hl-phen", 1e4)
    with pytest.raises(UnknownCoupleError):
        solve_potential(analysis_set, "hl-aqua", "hl-phn", 1e4)
    with pytest.raises(ScienceError, match="greater than 0"):
        solve_k_self(analysis_set, "hl-aqua", "hl-phen", -1.0)
    with pytest.raises(ConditionsError, match="both the unknown and the partner"):
        solve_k_self(analysis_set, "hl-aqua", "hl-aqua", 1e4)
    with pytest.raises(ScienceError, match="no k_self and no reorganization energy"):
        solve_potential(analysis_set, "hl-nok", "hl-phen", 1e4)
    with pytest.raises(ScienceError, match="partner"):
        solve_k_self(analysis_set, "hl-phen", "hl-nok", 1e4)
    with pytest.raises(ConditionsError, match="different media"):
        solve_k_self(analysis_set, "hl-acn", "hl-phen", 1e4)


def test_unknown_without_k_self_can_be_solved_for(analysis_set):
    # hl-nok has no k_self: its apparent value comes from the measurement alone.
    sol = solve_k_self(analysis_set, "hl-nok", "hl-amm", 1e4)
    assert sol.library_log10_k_self is None and math.isfinite(sol.log10_k_self)


def _rows(values):
    return [PartnerRow("partners.csv", i + 2, partner, k) for i, (partner, k) in enumerate(values)]


def test_several_partners_give_one_estimate_and_flag_the_stray_one(analysis_set):
    cond = Conditions()
    good = [(p, _k_obs(analysis_set, *((p, "hl-aqua") if p != "hl-amm" else ("hl-aqua", p)), cond))
            for p in ("hl-phen", "hl-bpy", "hl-amm")]
    stray = ("hl-quin", 1e3)  # far slower than hl-aqua's own k_self implies
    res = solve_several(analysis_set, "hl-aqua", _rows(good + [stray]))
    assert res.kind == "k_self" and res.n == 4 and res.n_used == 3
    assert res.estimate == pytest.approx(math.log10(4.0), abs=1e-5)  # hl-aqua's k_self = 4.0 M^-1 s^-1
    assert res.disagreeing == ("hl-quin (line 5)",)
    assert [p.agrees for p in res.partners] == [True, True, True, False]
    d = res.to_dict()
    assert {"log10_k_self", "k_self", "log10_k_self_95", "partners", "disagreeing"} <= set(d)
    pot = solve_several(analysis_set, "hl-aqua", _rows(good), kind="potential")
    assert pot.estimate == pytest.approx(0.74, abs=1e-5)
    assert pot.to_dict()["E_V"] == [pytest.approx(0.74, abs=1e-5)] and pot.E_scale == "SHE"


def test_several_partners_report_bad_rows_with_lines(analysis_set):
    rows = _rows([("hl-phen", 1e5), ("hl-phne", 1e5), ("hl-bpy", 1e12)])
    with pytest.raises(InputFileError) as exc:
        solve_several(analysis_set, "hl-aqua", rows)
    msg = str(exc.value)
    assert "partners.csv:3: field partner: unknown couple 'hl-phne'" in msg
    assert "partners.csv:4: partner hl-bpy: measured rate" in msg and "diffusion limit" in msg


def test_combine_weighted_mean():
    # Inverse-variance mean of 1 +- 0.1 and 2 +- 0.2: (1/0.01 + 2/0.04) / (1/0.01 + 1/0.04) = 150/125 = 1.2.
    m, se, spread, chi2, z, used = combine([1.0, 2.0], [0.1, 0.2])
    assert m == pytest.approx(1.2, rel=1e-12)
    # chi2 = 100 (0.2)^2 + 25 (0.8)^2 = 20 on 1 dof: se = sqrt(1/125) * sqrt(20).
    assert chi2 == pytest.approx(20.0, rel=1e-12)
    assert se == pytest.approx(math.sqrt(1 / 125) * math.sqrt(20.0), rel=1e-12)
    assert used.all()


def test_potential_comes_back_on_the_unknowns_own_scale_and_ground_state():
    # An unknown on the SCE scale (E vs SHE = E vs SCE + 0.241 V, crossrate's scale table) and an excited-state
    # couple (*Ox/Red: E_eff = E + E00): the solver must return the library field E on the couple's own scale.
    from crossrate.library.couple import Couple
    from crossrate.library.couple_set import CoupleSet

    common = dict(medium="water", ionic_strength=0.1, temperature=298.15, source="invented (test)", radius=4.0)
    sce = Couple(id="u-sce", name="u", charge_ox=1, charge_red=0, E=0.30, E_scale="SCE", k_self=1e6, **common)
    exc = Couple(id="u-exc", name="x", charge_ox=1, charge_red=0, E=-1.10, E_scale="SHE", k_self=1e7, E00=2.0,
                 excited_form="ox", **common)
    partner = Couple(id="p", name="p", charge_ox=1, charge_red=0, E=0.20, E_scale="SHE", k_self=1e5, **common)
    cs = CoupleSet([sce, exc, partner])
    for cid in ("u-sce", "u-exc"):
        k12 = 10.0 ** predict(cs, cid, "p", samples=0).log10_k_obs
        sol = solve_potential(cs, cid, "p", k12, role="oxidant")
        assert sol.E_scale == cs[cid].E_scale
        assert sol.E_V[0] == pytest.approx(cs[cid].E, abs=1e-6)


def _neutral_couple(cid, E, k):
    from crossrate.library.couple import Couple

    # Charges 1/0 on both couples: every work term of the cross reaction is zero (z_ox1 z_red2 = z_red1 z_ox2 = 0).
    return Couple(id=cid, name=cid, charge_ox=1, charge_red=0, E=E, E_scale="SHE", radius=4.0, medium="water",
                  ionic_strength=0.1, temperature=298.15, source="invented for a test", k_self=k, verified=True)


@pytest.mark.parametrize("E_unknown, region", [(-0.7, "reverse inverted"), (0.7, "inverted")])
def test_second_k_self_root_is_named_for_where_it_lies(E_unknown, region):
    from crossrate.library.couple_set import CoupleSet

    # lambda_ii = 4 RT ln(Z/k_ii) (no work terms): a very fast unknown (k_self 1e10, lambda 22.8 kJ/mol) and a
    # partner with k_self 1e8 (lambda 68.5 kJ/mol) give lambda12 = 45.7 kJ/mol, below |Delta G deg| = 0.7 eV =
    # 67.5 kJ/mol (Delta G deg = -F (E1 - E2), common practice). With the unknown as the oxidant at E = -0.7 V
    # the forward reaction is uphill by 0.7 eV: the library's k_self is the root where the *reverse* reaction is
    # inverted. At E = +0.7 V it is downhill by 0.7 eV and the same root lies in the forward inverted region
    # (intrinsic barrier (lambda12 + dG)^2 / 4 lambda12 = 2.6 kJ/mol > RT: past the activationless band).
    cs = CoupleSet([_neutral_couple("unk", E_unknown, 1e10), _neutral_couple("ptn", 0.0, 1e8)])
    cond = Conditions(diffusion=False)
    p = predict(cs, "unk", "ptn", cond, samples=0)
    assert abs(p.dG0_prime_kJ_per_mol) > p.lambda_kJ_per_mol
    assert p.regime == ("endergonic" if E_unknown < 0 else "inverted")
    sol = solve_k_self(cs, "unk", "ptn", 10.0**p.log10_k_obs, role="oxidant", conditions=cond)
    assert sol.log10_k_self_second_root == pytest.approx(10.0, abs=1e-6)
    assert sol.second_root_region == region
    assert sol.to_dict()["second_root_region"] == region
    if region == "reverse inverted":
        assert "reverse reaction in its inverted region" in sol.explanation
        assert "pair in the inverted region" not in sol.explanation


# ---- the SD of k_D in the solvers' intervals ---------------------------------------------------------------

def _var_k_self(cs, sd, k, cond):
    return solve_k_self(cs, "hl-cyano", "hl-amm", k, k_measured_log10_sd=sd, role="oxidant",
                        conditions=cond).log10_k_self_sd ** 2


def _var_E(cs, sd, k, cond):
    return solve_potential(cs, "hl-cyano", "hl-amm", k, k_measured_log10_sd=sd, role="oxidant",
                           conditions=cond).E_sd_V[0] ** 2


@pytest.mark.parametrize("var_of", [_var_k_self, _var_E], ids=["k_self", "potential"])
def test_k_diff_sd_enters_the_solvers_interval(analysis_set, monkeypatch, var_of):
    # Derivation: ln k_act = ln k_obs - ln(1 - x), x = k_obs/k_D, so d ln k_act/d ln k_obs = 1/(1 - x) and
    # d ln k_act/d ln k_D = -x/(1 - x): a root y moves with log10 k_D by x times as much as with log10 k_obs.
    # The k_D term of the variance is therefore (x * dy/dlog10 k_obs * 0.3)^2, with dy/dlog10 k_obs read off
    # two solves that differ only in the measurement SD (var(0.2) - var(0.1) = slope^2 (0.04 - 0.01)) and
    # 0.3 the project's SD of log10 k_D (services/uncertainty.py). First-order, so rtol 1e-3.
    import crossrate.services.solve_setup as solve_setup

    cond = Conditions()
    # hl-cyano + hl-amm: a normal-region pair with k_act near k_D (10^9.9 and 10^10.15, invented couples).
    k_D = 10.0 ** solve_k_self(analysis_set, "hl-cyano", "hl-amm", 1e6, role="oxidant",
                               conditions=cond).log10_k_diff
    x = 0.3  # far enough up the bend for k_D to matter, well below the diffusion-limited cut (k_act > 10 k_D)
    with_kd = var_of(analysis_set, 0.1, x * k_D, cond)
    slope_sq = (var_of(analysis_set, 0.2, x * k_D, cond) - with_kd) / (0.04 - 0.01)
    monkeypatch.setattr(solve_setup, "DEFAULT_K_DIFF_LOG10_SD", 0.0)
    without_kd = var_of(analysis_set, 0.1, x * k_D, cond)
    assert with_kd - without_kd == pytest.approx(slope_sq * (x * 0.3) ** 2, rel=1e-3)
    assert with_kd > without_kd


def test_no_k_diff_sd_without_the_cap(analysis_set):
    # With --no-diffusion there is no k_D to remove, so none of its spread enters (common practice).
    sol = solve_k_self(analysis_set, "hl-phen", "hl-aqua", 1e6, role="oxidant",
                       conditions=Conditions(diffusion=False))
    assert sol.log10_k_diff_sd == 0.0
    capped = solve_k_self(analysis_set, "hl-phen", "hl-aqua", 1e6, role="oxidant", conditions=Conditions())
    assert capped.log10_k_diff_sd == pytest.approx(0.3, abs=0)
