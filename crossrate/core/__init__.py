"""Pure computational core: Marcus-theory equations on numpy arrays, SI units, no I/O.

Energies are J/mol, distances m, temperatures K, ionic strengths mol/L, rate constants are
carried as natural logarithms of values in M^-1 s^-1 so that 1e-15 or 1e80 neither under- nor overflows.
"""
