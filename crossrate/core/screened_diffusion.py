"""Debye's encounter rate under a screened (Debye-Hueckel) interaction, by numerical quadrature.

Debye's diffusion-limited rate constant for two ions (P. Debye, Trans. Electrochem. Soc. 82, 265 (1942);
citation from memory):

    k_D = 4 pi N_A (D1 + D2) / Integral_{r12}^{inf} exp(U(r) / k_B T) r^-2 dr        [m^3 mol^-1 s^-1]

with D1, D2 in m^2/s, r12 the encounter distance in m and U(r) the pair's interaction energy in J. Here U is
the Debye-Hueckel potential of an ion of contact radius r12 in its ionic atmosphere,

    U(r) = z1 z2 e^2 exp(-kappa (r - r12)) / (4 pi eps0 eps_s r (1 + kappa r12)),

which at r = r12 is the Bronsted-Debye-Hueckel work term w12 / N_A used by the cross relation. With x = r12 / r,
delta = U(r12) / k_B T = w12 / RT and b = kappa r12 the integral is J(delta, b) / r12 with

    J(delta, b) = Integral_0^1 exp(delta x exp(-b (1/x - 1))) dx,

so k_D = 4 pi N_A (D1 + D2) r12 F with the screened Debye factor F = 1 / J. Unscreened (b = 0) J is
(e^delta - 1) / delta and F the closed form delta / (e^delta - 1); that closed form with the screened w12 in
delta, used before, overstates the long-range part of the interaction (1/r instead of e^-kappa r / r).

Evaluated here by composite Gauss-Legendre quadrature (any delta and b, 1e-8 or better in ln F); for many
pairs at one set of conditions crossrate.core.screened_debye_table tabulates it.
"""

import numpy as np

from .diffusion import ln_debye_factor

#: Gauss-Legendre points per panel of the composite rule: the 16-point rule's positive nodes on [-1, 1] and
#: their weights (Abramowitz & Stegun Table 25.4, from memory), written to the last bit as
#: numpy.polynomial.legendre.leggauss(16) returns them (tested), because importing numpy.polynomial costs a
#: cold `crossrate predict` about 2 ms. The rule is symmetric: the negative nodes mirror these.
_GL_POINTS = 16
_GL_X_POSITIVE = (0.09501250983763744, 0.2816035507792589, 0.45801677765722737, 0.6178762444026438,
                  0.755404408355003, 0.8656312023878318, 0.9445750230732326, 0.9894009349916499)
_GL_W_POSITIVE = (0.18945061045506864, 0.18260341504492364, 0.16915651939500265, 0.1495959888165767,
                  0.12462897125553407, 0.0951585116824926, 0.062253523938647456, 0.027152459411754176)
_GL_X = np.array([-x for x in reversed(_GL_X_POSITIVE)] + list(_GL_X_POSITIVE))
_GL_W = np.array(list(reversed(_GL_W_POSITIVE)) + list(_GL_W_POSITIVE))
#: Elements evaluated at once (bounds the memory of the node matrix to ~elements x nodes floats).
_CHUNK = 2048
#: Above this delta (1 + b) the peak at x = 1 is narrower than the finest panel; Laplace's leading term
#: J = e^delta / (delta (1 + b)) (1 + O(1/delta)) is used, exact to ~1e-8 and beyond any physical input.
_LAPLACE_DELTA = 1e8


def _panels(levels_to_zero: int, levels_to_one: int) -> np.ndarray:
    """Panel edges on [0, 1], halving towards 1 and shrinking by 2^-1/2 towards 0 (where an attractive,
    screened integrand drops steeply: exp(-b/x) in the exponent), down to ~2^-levels at either end."""
    lo = 0.5 ** (0.5 * np.arange(2 * levels_to_zero, 1, -1))
    hi = 1.0 - 0.5 ** np.arange(2, levels_to_one + 1)
    return np.concatenate([[0.0], lo, hi, [1.0]])


def _levels(scale: float) -> int:
    # The finest panel sits ~2^-5 below the width 1/scale of the narrowest feature.
    return int(np.clip(np.ceil(np.log2(max(scale, 1.0))) + 5, 4, 60))


def _ln_J(delta: np.ndarray, b: np.ndarray) -> np.ndarray:
    """ln J(delta, b) for 1-D arrays with b > 0 and 0 < |delta| (1 + b) <= _LAPLACE_DELTA."""
    top = np.maximum(delta, 0.0)
    levels_one = _levels(float(np.max(top * (1.0 + b), initial=0.0)))
    levels_zero = _levels(float(np.max(np.maximum(-delta, 0.0), initial=0.0)))
    edges = _panels(levels_zero, levels_one)
    half = 0.5 * np.diff(edges)
    x = ((edges[:-1] + half)[:, None] + half[:, None] * _GL_X[None, :]).ravel()
    w = (half[:, None] * _GL_W[None, :]).ravel()
    inv_x_minus_1 = 1.0 / x - 1.0
    out = np.empty(delta.shape[0])
    for s in range(0, delta.shape[0], _CHUNK):
        d, bb, m = delta[s:s + _CHUNK, None], b[s:s + _CHUNK, None], top[s:s + _CHUNK, None]
        # Exponent shifted by its maximum (delta at x = 1 for repulsion, 0 at x -> 0 for attraction).
        phi = d * x * np.exp(-bb * inv_x_minus_1) - m
        out[s:s + _CHUNK] = top[s:s + _CHUNK] + np.log(np.exp(phi) @ w)
    return out


def ln_screened_debye_factor(delta, kappa_r):
    """ln F = -ln J(delta, b), the screened Debye factor (Debye 1942 integral with the Debye-Hueckel potential).

    Args:
        delta: w12 / RT, the interaction energy at contact in units of RT (dimensionless; > 0 for like charges).
        kappa_r: b = kappa r12, Debye screening parameter times the encounter distance (dimensionless, >= 0).

    Returns:
        ln F (dimensionless), broadcast shape of the arguments. b = 0 gives the closed form
        ln[delta / (e^delta - 1)] exactly; delta = 0 gives 0. NaN in, NaN out.
    """
    d, b = np.broadcast_arrays(np.asarray(delta, dtype=float), np.asarray(kappa_r, dtype=float))
    flat_d, flat_b = d.ravel(), b.ravel()
    flat_out = np.array(ln_debye_factor(flat_d), dtype=float)
    screened = (flat_b > 0.0) & (flat_d != 0.0) & np.isfinite(flat_d) & np.isfinite(flat_b)
    flat_out[np.isnan(flat_b)] = np.nan
    big = screened & (flat_d * (1.0 + flat_b) > _LAPLACE_DELTA)
    flat_out[big] = np.log(flat_d[big] * (1.0 + flat_b[big])) - flat_d[big]
    todo = np.flatnonzero(screened & ~big)
    if todo.size:
        # Pairs of one library share few (delta, b) values: integrate each distinct one once.
        key = np.stack([flat_d[todo], flat_b[todo]])
        uniq, inverse = np.unique(key, axis=1, return_inverse=True)
        flat_out[todo] = -_ln_J(uniq[0], uniq[1])[inverse.ravel()]
    return flat_out.reshape(d.shape)
