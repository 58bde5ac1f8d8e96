"""Physical constants (SI, CODATA 2022 as shipped in scipy.constants) and unit conversions used by the core.

The values are written here rather than imported from scipy.constants because importing scipy costs
about 0.1 s, more than the whole rest of a `crossrate predict` run; tests/core/test_core_constants.py
checks them against scipy.constants. Since the 2019 SI, e, N_A, k and h are exact by definition (so
are F = e N_A and R = N_A k); only the vacuum permittivity is a measured value (CODATA 2022).
"""

#: Avogadro constant, 1/mol (exact, 2019 SI).
AVOGADRO = 6.02214076e23
#: Elementary charge, C (exact, 2019 SI).
ELEMENTARY_CHARGE = 1.602176634e-19
#: Boltzmann constant, J/K (exact, 2019 SI).
BOLTZMANN = 1.380649e-23
#: Planck constant, J s (exact, 2019 SI).
PLANCK = 6.62607015e-34
#: Faraday constant, C/mol: F = e N_A (the same float scipy.constants gives).
FARADAY = ELEMENTARY_CHARGE * AVOGADRO
#: Molar gas constant, J/(mol K): R = N_A k (the same float as scipy.constants.R).
GAS_CONSTANT = AVOGADRO * BOLTZMANN
#: Vacuum electric permittivity, F/m (CODATA 2022, as scipy.constants.epsilon_0 from scipy 1.15 on).
VACUUM_PERMITTIVITY = 8.8541878188e-12

#: Metres per angstrom.
ANGSTROM = 1e-10
#: J/mol per kJ/mol.
KJ = 1e3
#: J/mol per kcal/mol (thermochemical calorie, 4.184 J exactly).
KCAL = 4184.0
#: J/mol per eV (one electron per molecule): e N_A.
EV = ELEMENTARY_CHARGE * AVOGADRO
#: Litres per cubic metre; converts m^3 mol^-1 s^-1 to M^-1 s^-1.
LITRES_PER_M3 = 1e3
#: Default pre-exponential (collision) factor Z, M^-1 s^-1 (common practice for bimolecular outer-sphere steps).
DEFAULT_Z = 1e11
#: 298.15 K.
STANDARD_TEMPERATURE = 298.15
