#!/usr/bin/env python3
"""Reference values for Fieldbound's special functions and adiabatic potentials.

Writes shared/test/fixtures/special-oracle.json: every value to 25 significant digits,
computed with mpmath at 50 decimal digits. Every input is a float64 number (written in
JSON as such) converted exactly to mpmath, so tests compare against the value of the
function at the very double they pass.

Run from the repository root:  python3 shared/scripts/oracle/make_special_oracle.py
"""
import json
import math
import os
import sys

import mpmath as mp

mp.mp.dps = 50
D = 25


def s(v):
    return mp.nstr(mp.mpf(v), D, min_fixed=-1, max_fixed=-1) if mp.isfinite(v) else str(v)


def logspace(lo, hi, n):
    return [float(10 ** (lo + (hi - lo) * i / (n - 1))) for i in range(n)]


def uniq(xs):
    return sorted(set(float(x) for x in xs))


out = {
    'generator': 'shared/scripts/oracle/make_special_oracle.py',
    'versions': {'mpmath': mp.__version__, 'python': sys.version.split()[0]},
    'precision': 'mp.dps = 50, values printed with %d significant digits' % D,
    'source': 'mpmath (F. Johansson et al., mpmath: a Python library for arbitrary-precision floating-point arithmetic)',
}

# ---- Gamma, ln Gamma ----
gx = uniq([0.5, 1.5, 2.5, 3, 7, 10.1, 20.5, 33.3, 50.5, 64.5, 100.25, 170.5, 171.5, 0.001, 1e-10, 0.25,
           0.75, 1.25, 1.75, -0.5, -1.5, -2.5, -7.25, -63.5, -64.5, 1 / 3, 4.9, 12.7])
out['gamma'] = [[x, s(mp.gamma(mp.mpf(x)))] for x in gx]
lx = uniq([0.5, 1.5, 3.7, 10, 19.9, 20.1, 30, 100, 1000, 1e5, 1e10, 1e100, 1e300, 0.001, 2.5, -0.5, -1.5, -63.5])
out['lnGamma'] = [[x, s(mp.log(abs(mp.gamma(mp.mpf(x)))))] for x in lx]

# ---- erfc, erfcx ----
ex = uniq([-6, -3, -1.5, -0.5, -1e-5, 0, 1e-20, 1e-8, 1e-3, 0.1, 0.3, 0.5, 0.8, 1, 1.3, 1.7, 1.9, 1.99, 2, 2.01,
           2.2, 2.5, 3, 4, 5, 7, 10, 15, 20, 25, 26.5])
out['erfc'] = [[x, s(mp.erfc(mp.mpf(x)))] for x in ex]
xx = uniq(ex[:-1] + [30, 50, 100, 1e3, 1e5, 1e7, 1e8, 2e8, 1e10, 1e15, 1e50, 1e300])
def erfcx_ref(x):
    X = mp.mpf(x)
    if x <= 1e3:
        return mp.exp(X ** 2) * mp.erfc(X)
    return mp.hyperu(mp.mpf(1) / 2, mp.mpf(1) / 2, X ** 2) / mp.sqrt(mp.pi)  # DLMF 13.6.7


out['erfcx'] = [[x, s(erfcx_ref(x))] for x in xx if x >= -6]

# ---- E_n(x) scaled: e^x E_n(x) ----
ns = [0, 1, 2, 3, 5, 10, 20, 40, 64, 65]
xs = uniq(logspace(-30, 30, 31) + [0.5, 0.9, 0.999, 1.0, 1.001, 1.5, 2, 3, 5, 7, 20, 50, 100, 300, 700])


def expn_scaled_ref(n, x):
    # e^x E_n(x) = U(1, 2-n, x) (DLMF 8.19.1, 13.6.6 with Kummer 13.2.40). mpmath.expint(n, x)
    # alone is unreliable for large n and x at this precision (expint(65, 300) returns
    # -6.97e6), so it is only used as a cross-check at 150 digits.
    X = mp.mpf(x)
    a = mp.hyperu(1, 2 - n, X) if n > 0 else 1 / X
    with mp.workdps(150):
        b = mp.exp(X) * mp.expint(n, X)
    assert abs(a - b) <= mp.mpf(10) ** -30 * abs(a), (n, x, a, b)
    return a


out['expnScaled'] = [[n, x, s(expn_scaled_ref(n, x))] for n in ns for x in xs]
out['expn'] = [[n, x, s(mp.exp(-mp.mpf(x)) * expn_scaled_ref(n, x))] for n in [1, 2, 5, 64] for x in [1e-10, 0.3, 1, 2.5, 10, 100, 700]]

# ---- Tricomi U(2, 2-m, x) and U(3/2, 3/2-m, s) ----
ms = [0, 1, 2, 3, 4, 5, 7, 10, 16, 20, 32, 48, 63, 64]
base = logspace(-30, 30, 61)
u2 = []
u32 = []
for m in ms:
    sw = 30 + 2 * m  # route switch in the implementation (asymptotic series)
    pts = uniq(base + [0.25, 0.5, 0.75, 0.99, 1.0, 1.01, 1.5, 2, 3, 5, 8, 12, 17, 25, 40, 60, 90, 130, 200,
                       sw * 0.99, sw, sw * 1.01, sw * 1.5, sw * 2, sw * 3])
    for x in pts:
        X = mp.mpf(x)
        u2.append([m, x, s(mp.hyperu(2, 2 - m, X))])
        u32.append([m, x, s(mp.hyperu(mp.mpf(3) / 2, mp.mpf(3) / 2 - m, X))])
out['tricomiU2'] = {'definition': 'U(2, 2-m, x), mpmath.hyperu (DLMF 13.2.6)', 'rows [m, x, value]': u2}
out['tricomiU32'] = {'definition': 'U(3/2, 3/2-m, s), mpmath.hyperu (DLMF 13.2.6)', 'rows [m, s, value]': u32}


# ---- adiabatic potential by direct transverse average (independent of U) ----
def w_direct(m, zeta, rhoc):
    """w_m = <phi_m| -1/(2 (rho^2 + zeta^2 + rhoc^2)^2) |phi_m> in units l = 1, B = 1.
    |phi_m|^2 2 pi rho d rho = u^m e^-u / m! du, rho^2 = 2u."""
    D2 = mp.mpf(zeta) ** 2 + mp.mpf(rhoc) ** 2
    f = lambda u: u ** m * mp.exp(-u) / mp.factorial(m) * (-1 / (2 * (2 * u + D2) ** 2))
    pts = [0, mp.mpf(m) + 1, 4 * (mp.mpf(m) + 1), mp.inf] if D2 > 0 else [0, mp.mpf(m) + 1, mp.inf]
    if 0 < D2 < 1:
        pts = [0, D2 / 4, D2, 1] + pts[1:]
    return mp.quad(f, sorted(set(pts), key=lambda v: float(v)))


pot = []
for m in [0, 1, 2, 5, 12, 30]:
    for rhoc in [0.01, 0.3, 1.0, 3.0]:
        for zeta in [0.0, 0.05, 0.5, 1.0, 2.0, 5.0, 20.0]:
            pot.append([m, zeta, rhoc, s(w_direct(m, zeta, rhoc))])
out['scaledPotentialDirect'] = {
    'definition': 'w_m(zeta; rho_c) = transverse average of -1/(2(rho^2+zeta^2+rho_c^2)^2) over |phi_m|^2 '
                  '(units l = B^-1/2, energy B, alpha = 1), by mpmath.quad (tanh-sinh) of the u-integral',
    'rows [m, zeta, rhoC, value]': pot}

root = os.path.abspath(os.path.join(os.path.dirname(__file__), '..', '..'))
path = os.path.join(root, 'test', 'fixtures', 'special-oracle.json')
with open(path, 'w') as fh:
    json.dump(out, fh, separators=(',', ':'))
    fh.write('\n')
print('wrote', path, os.path.getsize(path), 'bytes')
