#!/usr/bin/env python3
"""Reference energies of exactly solvable 1D wells, for the bound-state solver's tests.

Writes shared/test/fixtures/exact-1d-oracle.json with 25 significant digits, computed with mpmath
at 50 decimal digits (pinned: mpmath 1.3.0 on CPython 3.11.7, as in README.md here):

- Poschl-Teller  -lambda(lambda+1)/(2 cosh^2 x): E_n = -(lambda - n)^2 / 2, n < lambda
  (L. D. Landau, E. M. Lifshitz, Quantum Mechanics, sec. 23; F. Cooper, A. Khare, U. Sukhatme,
  Phys. Rep. 251, 267 (1995)).
- Finite square well -V0 on |x| < a (hbar = m = 1): with k = sqrt(2(V0 - eps)), q = sqrt(2 eps),
  even states k tan(k a) = q, odd states -k cot(k a) = q (any quantum-mechanics text), each root
  bracketed in its own branch of tan, where the condition is monotone, and bisected to 50 digits.

Run from the repository root:  python3 shared/scripts/oracle/make_exact_1d_oracle.py
"""
import json
import os

import mpmath as mp

mp.mp.dps = 50
D = 25


def s(v):
    return mp.nstr(mp.mpf(v), D, min_fixed=-1, max_fixed=-1)


def level(v):
    return {"str": s(v), "f64": float(v)}


def poschl_teller(lam):
    lam = mp.mpf(lam)
    n = 0
    out = []
    while n < lam:
        out.append(level(-((lam - n) ** 2) / 2))
        n += 1
    return out


def bisect(f, lo, hi):
    # f increases through zero on (lo, hi): z tan z and -z cot z increase, sqrt(z0^2 - z^2) decreases.
    eps = mp.mpf('1e-45')
    lo, hi = lo + eps, hi - eps
    for _ in range(400):
        mid = (lo + hi) / 2
        if f(mid) > 0:
            hi = mid
        else:
            lo = mid
    return (lo + hi) / 2


def square_well(V0, a):
    V0, a = mp.mpf(V0), mp.mpf(a)
    z0 = a * mp.sqrt(2 * V0)  # z = k a ranges over (0, z0)
    levels = []
    j = 0
    # Branch j of the matching condition lives in z in (j pi/2, (j+1) pi/2); even for even j.
    while j * mp.pi / 2 < z0:
        lo = j * mp.pi / 2
        hi = min((j + 1) * mp.pi / 2, z0)
        if j % 2 == 0:
            f = lambda z: z * mp.tan(z) - mp.sqrt(z0 ** 2 - z ** 2)
        else:
            f = lambda z: -z / mp.tan(z) - mp.sqrt(z0 ** 2 - z ** 2)
        z = bisect(f, lo, hi)
        k = z / a
        levels.append(level(-(V0 - k ** 2 / 2)))
        j += 1
    return levels


def main():
    root = os.path.dirname(os.path.abspath(__file__))
    out = os.path.join(root, '..', '..', 'test', 'fixtures', 'exact-1d-oracle.json')
    data = {
        "generator": "shared/scripts/oracle/make_exact_1d_oracle.py",
        "mpmath": mp.__version__,
        "energies": "E (negative: bound), hbar = m = 1",
        "poschl_teller": {"lambda": "2.5", "levels": poschl_teller('2.5')},
        "finite_square_well": {
            "cases": [
                {"V0": V0, "a": a, "levels": square_well(V0, a)}
                for V0, a in [("1", "1"), ("1", "2"), ("0.5", "3"), ("20", "1.5"), ("3", "0.4")]
            ]
        },
    }
    with open(out, 'w') as fh:
        json.dump(data, fh, indent=1)
        fh.write('\n')
    print(f"wrote {out}")


if __name__ == '__main__':
    main()
