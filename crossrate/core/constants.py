"""Physical constants (SI, CODATA via scipy.constants) and unit conversions used by the core."""

from scipy import constants as _c

#: Faraday constant, C/mol.
FARADAY = _c.physical_constants["Faraday constant"][0]
#: Molar gas constant, J/(mol K).
GAS_CONSTANT = _c.R
#: Avogadro constant, 1/mol.
AVOGADRO = _c.N_A
#: Elementary charge, C.
ELEMENTARY_CHARGE = _c.e
#: Vacuum electric permittivity, F/m.
VACUUM_PERMITTIVITY = _c.epsilon_0
#: Boltzmann constant, J/K.
BOLTZMANN = _c.k
#: Planck constant, J s.
PLANCK = _c.h

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
