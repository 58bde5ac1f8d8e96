"""Solvent table (crossrate/core/data/solvents.csv) and water's temperature correlations vs outside references."""

import math
import warnings

import numpy as np
import pytest

from crossrate.core.solvents import WATER_CORRELATION_RANGE_K, Solvent, get_solvent, solvent_table

with warnings.catch_warnings():
    # chemicals/pandas may warn on import about optional accelerators; irrelevant here.
    warnings.simplefilter("ignore")
    from chemicals.dippr import EQ101
    from chemicals.iapws import iapws95_rho, iapws95_rhol_sat
    from chemicals.permittivity import permittivity_CRC, permittivity_data_CRC, permittivity_IAPWS
    from chemicals.refractivity import RI, RI_IAPWS
    from chemicals.viscosity import mu_data_Perrys_8E_2_313, mu_IAPWS

T25 = 298.15
#: CAS numbers, to look the solvents up in `chemicals`.
CAS = {
    "water": "7732-18-5",
    "acetonitrile": "75-05-8",
    "dmf": "68-12-2",
    "dmso": "67-68-5",
    "methanol": "67-56-1",
    "dichloromethane": "75-09-2",
    "propylene_carbonate": "108-32-7",
    "acetone": "67-64-1",
}
REQUIRED = ("water", "acetonitrile", "dmf", "dmso", "methanol", "dichloromethane", "propylene_carbonate")
ORGANIC = [k for k in CAS if k != "water"]

# Stated tolerances (relative): the csv carries 25 degC handbook values, the references are fits.
EPS_RTOL_CRC = 0.02  # CRC polynomial fits (via chemicals) scatter by ~1-1.5 % from direct 25 degC readings
VISC_RTOL_PERRY = 0.02  # Perry's DIPPR-101 fits (via chemicals) scatter by ~1-2 % from direct readings
WATER_RTOL_25C = 0.005  # water at 25 degC vs IAPWS formulations: 0.5 %

#: Refractive index n_D at 20 degC. Source: CRC Handbook of Chemistry and Physics, "Physical Constants of
#: Organic Compounds" (from memory); water 1.3330 from the same handbook's water tables (from memory).
CRC_N_D_20C = {
    "water": 1.3330,
    "acetonitrile": 1.3442,
    "dmf": 1.4305,
    "dmso": 1.4793,
    "methanol": 1.3288,
    "dichloromethane": 1.4242,
    "propylene_carbonate": 1.4189,
    "acetone": 1.3588,
}


def _water_rho(T):
    """Liquid water density, kg/m^3, from the IAPWS-95 formulation in `chemicals` (1 atm below 373 K)."""
    return iapws95_rho(T, 101325.0) if T < 373.0 else iapws95_rhol_sat(T)


def test_required_solvents_present_with_sources():
    table = solvent_table()
    for key in REQUIRED:
        assert key in table, key
    for s in table.values():
        assert isinstance(s, Solvent)
        assert s.source.strip(), f"{s.key}: every row must name its source"
        assert 1.0 < s.eps_s < 200.0 and 1.2 < s.n_D < 1.8 and 0.1 < s.viscosity_mPa_s < 100.0, s.key


@pytest.mark.parametrize("key", ORGANIC)
def test_permittivity_vs_chemicals_CRC(key):
    # Source: `chemicals` permittivity_data_CRC + permittivity_CRC (CRC Handbook, polynomial
    # eps = A + B T + C T^2 + D T^3 in T/K), evaluated at 298.15 K; tolerance EPS_RTOL_CRC.
    row = permittivity_data_CRC.loc[CAS[key]]
    d = 0.0 if math.isnan(row.D) else row.D
    expected = permittivity_CRC(T25, row.A, row.B, row.C, d)
    assert get_solvent(key).eps_s == pytest.approx(expected, rel=EPS_RTOL_CRC)


def test_water_permittivity_25C_vs_IAPWS():
    # Source: `chemicals` permittivity_IAPWS (IAPWS 1997 release on the static dielectric constant of water),
    # at 298.15 K and the IAPWS-95 density at 1 atm (78.41); tolerance 0.5 %.
    expected = permittivity_IAPWS(T25, _water_rho(T25))
    assert get_solvent("water").eps_s == pytest.approx(expected, rel=WATER_RTOL_25C)


@pytest.mark.parametrize("key", [k for k in ORGANIC if CAS[k] in mu_data_Perrys_8E_2_313.index])
def test_viscosity_vs_chemicals_Perry(key):
    # Source: `chemicals` mu_data_Perrys_8E_2_313 (Perry's Chemical Engineers' Handbook 8th ed., table 2-313,
    # DIPPR equation 101: mu = exp(C1 + C2/T + C3 ln T + C4 T^C5) in Pa s) at 298.15 K; tolerance VISC_RTOL_PERRY.
    row = mu_data_Perrys_8E_2_313.loc[CAS[key]]
    expected_mPa_s = EQ101(T25, row.C1, row.C2, row.C3, row.C4, row.C5) * 1e3
    assert get_solvent(key).viscosity_mPa_s == pytest.approx(expected_mPa_s, rel=VISC_RTOL_PERRY)


def test_propylene_carbonate_viscosity_vs_handbook():
    # `chemicals` has no liquid-viscosity data for propylene carbonate (CAS 108-32-7), so a literature table:
    # Source: K. Xu, Chem. Rev. 104, 4303 (2004), table of electrolyte solvents: PC 2.53 cP at 25 degC
    # (from memory). Tolerance 3 %.
    assert CAS["propylene_carbonate"] not in mu_data_Perrys_8E_2_313.index
    assert get_solvent("propylene_carbonate").viscosity_mPa_s == pytest.approx(2.53, rel=0.03)


def test_water_viscosity_25C_vs_IAPWS():
    # Source: `chemicals` mu_IAPWS (IAPWS 2008 viscosity formulation, 0.8900 mPa s at 25 degC, 1 atm).
    expected_mPa_s = mu_IAPWS(T25, _water_rho(T25)) * 1e3
    assert get_solvent("water").viscosity_mPa_s == pytest.approx(expected_mPa_s, rel=WATER_RTOL_25C)


@pytest.mark.parametrize("key", list(CAS))
def test_refractive_index_vs_CRC_handbook(key):
    # Source: CRC Handbook n_D at 20 degC (table CRC_N_D_20C above, from memory). The csv holds 25 degC values;
    # a liquid's n_D falls with temperature by about 1e-4 (water) to 6e-4 (organics) per K (common practice),
    # so n_D(25 degC) must lie between n_D(20 degC) - 5 K x 6e-4 - 0.001 and n_D(20 degC) + 0.0005 (reading
    # tolerance).
    n20 = CRC_N_D_20C[key]
    n25 = get_solvent(key).n_D
    assert n20 - 0.004 <= n25 <= n20 + 0.0005


@pytest.mark.parametrize("key", ORGANIC)
def test_from_memory_refractive_indices_match_chemicals_CRC_table(key):
    # Source: `chemicals` RI(CAS, method="CRC") (CRC Handbook organic refractive indices), a second reading of
    # the from-memory table used above; agreement to 2e-4.
    n, _T = RI(CAS[key], method="CRC")
    assert CRC_N_D_20C[key] == pytest.approx(n, abs=2e-4)


def test_water_refractive_index_vs_IAPWS():
    # Source: `chemicals` RI_IAPWS (IAPWS 1997 release on the refractive index of water) at 298.15 K, 589.3 nm
    # (sodium D line), IAPWS-95 density: 1.33286; tolerance 5e-4.
    expected = RI_IAPWS(T25, _water_rho(T25), 589.3e-9)
    assert get_solvent("water").n_D == pytest.approx(expected, abs=5e-4)


def test_water_permittivity_correlation_vs_IAPWS_273_to_373K():
    # Malmberg-Maryott correlation (crossrate) vs `chemicals` permittivity_IAPWS (IAPWS 1997) at IAPWS-95
    # liquid densities, 0-100 degC. Largest gap seen: 0.35 % at 100 degC; stated tolerance 0.5 %.
    water = get_solvent("water")
    lo, hi = WATER_CORRELATION_RANGE_K
    for T in np.linspace(lo, hi, 21):
        expected = permittivity_IAPWS(T, _water_rho(T))
        assert float(water.permittivity(T)) == pytest.approx(expected, rel=0.005), T


def test_water_viscosity_correlation_vs_IAPWS_273_to_373K():
    # Vogel equation (crossrate) vs `chemicals` mu_IAPWS (IAPWS 2008) at IAPWS-95 liquid densities, 0-100 degC.
    # Largest gap seen: 0.96 % at 0 degC; stated tolerance 1.2 %.
    water = get_solvent("water")
    lo, hi = WATER_CORRELATION_RANGE_K
    for T in np.linspace(lo, hi, 21):
        expected = mu_IAPWS(T, _water_rho(T))
        assert float(water.viscosity_Pa_s(T)) == pytest.approx(expected, rel=0.012), T


def test_water_correlations_broadcast_and_non_water_constant():
    water, mecn = get_solvent("water"), get_solvent("acetonitrile")
    T = np.array([280.0, 298.15, 330.0])
    assert water.permittivity(T).shape == (3,) and water.viscosity_Pa_s(T).shape == (3,)
    # Permittivity and viscosity of water fall with temperature (common practice).
    assert np.all(np.diff(water.permittivity(T)) < 0) and np.all(np.diff(water.viscosity_Pa_s(T)) < 0)
    # Other solvents are held at their 25 degC values, in the units the docstrings state (mPa s -> Pa s).
    np.testing.assert_allclose(mecn.permittivity(T), mecn.eps_s, rtol=0, atol=0)
    np.testing.assert_allclose(mecn.viscosity_Pa_s(T), mecn.viscosity_mPa_s * 1e-3, rtol=1e-15)
    assert mecn.permittivity(300.0) == mecn.eps_s


def test_pekar_factor():
    # Pekar factor 1/n^2 - 1/eps_s; acetonitrile: 1/1.3416^2 - 1/35.94 = 0.55558 - 0.02782 = 0.5278.
    mecn = get_solvent("acetonitrile")
    assert mecn.pekar_factor() == pytest.approx(1 / mecn.n_D**2 - 1 / mecn.eps_s, rel=1e-14)
    assert mecn.pekar_factor() == pytest.approx(0.5278, abs=2e-4)


def test_unknown_solvent_names_the_known_ones():
    with pytest.raises(KeyError) as exc:
        get_solvent("watr")
    msg = str(exc.value)
    assert "watr" in msg and "water" in msg and "acetonitrile" in msg
