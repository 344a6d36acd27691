"""Derivation check for the Tow-Thomas as-built polynomials (src/topologies/tow-thomas.ts,
`loopPolynomials` and `summedPolynomials`); writes no fixture.

It derives, with sympy, the closed forms stated in that file's header from the stage's own
nodal equations, independently of the TypeScript code:

- the nodal (KCL) equations of every Tow-Thomas stage (lowpass, bandpass, lowpass-notch,
  highpass-notch, notch, allpass), each op-amp a voltage-controlled source whose inverting
  input sits at -v_out/A, with 1/A = g0 + g1 z and z = s/w0 (capacitances are C*w0);
- the claimed node voltages v1 = -G1 D2 D3/P, v2 = G1 G4 D3/P, v3 = -G1 G4 G5/P and the
  summed output N/(P S) are substituted into those equations, which must vanish identically
  (the system has a unique solution for generic part values, so this proves the forms);
- the degrees (P: 5, P S: 6 with the summer), and the sign structure claimed for the
  accuracy statement: every coefficient (in z) of P and P S is a polynomial in the positive
  part values with only positive terms; every numerator coefficient is minus such a
  polynomial once E's constant is written as the symbol e0 = G7 G2 - G1 G8 + G7 (G1+G2+G3) g0
  and the highpass-notch's G3 G7 - G1 G10 as the symbol h0 (the two differences the
  circuit itself makes).

Run: python3 scripts/reference/topology_tow_thomas_polynomials.py (prints one line per stage,
exits non-zero on a mismatch).
"""
import sys

import sympy as sp

G1, G2, G3, G4, G5, G6, G7, G8, G9, G10 = sp.symbols("G1:11", positive=True)
c1, c2, g0, g1, z = sp.symbols("c1 c2 g0 g1 z", positive=True)
e0, h0 = sp.symbols("e0 h0")  # the two inherent differences, as free symbols
e = g0 + g1 * z  # 1/A


def all_positive(poly_expr):
    """True when the expression, expanded, is a sum of terms with positive numeric coefficients."""
    p = sp.Poly(sp.expand(poly_expr), *sorted(poly_expr.free_symbols - {z}, key=str))
    return all(c > 0 for c in p.coeffs())


def coefficients(expr):
    return sp.Poly(sp.expand(expr), z).all_coeffs()[::-1]


def check(variant):
    vin = 1
    v1, v2, v3, out, n1, n2, n3, n4 = sp.symbols("v1 v2 v3 out n1 n2 n3 n4")
    D1 = G2 + c1 * z + (G1 + G2 + G3 + c1 * z) * e
    D2 = c2 * z + (G4 + c2 * z) * e
    D3 = G6 + (G5 + G6) * e
    P = D1 * D2 * D3 + G3 * G4 * G5
    sol = {v1: -G1 * D2 * D3 / P, v2: G1 * G4 * D3 / P, v3: -G1 * G4 * G5 / P}
    eqs = [
        G1 * (vin - n1) + (G2 + c1 * z) * (v1 - n1) + G3 * (v3 - n1),
        G4 * (v1 - n2) + c2 * z * (v2 - n2),
        G5 * (v2 - n3) + G6 * (v3 - n3),
    ]
    nodes = {n1: -v1 * e, n2: -v2 * e, n3: -v3 * e}
    ok = True
    if variant == "lowpass":
        num, den, claimed = G1 * G4 * D3, P, v2
    elif variant == "bandpass":
        num, den, claimed = -G1 * D2 * D3, P, v1
    else:
        vx = {"lowpass-notch": v2, "highpass-notch": v3}.get(variant)
        g10 = G10 if vx is not None else 0
        S = G9 + (G7 + G8 + g10 + G9) * e
        E = G7 * D1 - G1 * G8
        X = {"lowpass-notch": G1 * G4 * G10 * D3, "highpass-notch": -G1 * G4 * G5 * G10}.get(variant, 0)
        num, den = -(E * D2 * D3 + G3 * G4 * G5 * G7 + X), P * S
        sol[out] = num / den
        nodes[n4] = -out * e
        kcl = G7 * (vin - n4) + G8 * (v1 - n4) + G9 * (out - n4)
        if vx is not None:
            kcl += G10 * (vx - n4)
        eqs.append(kcl)
        claimed = out
        # sign structure of the numerator with the two inherent differences as symbols
        E_sym = e0 + G7 * c1 * z + G7 * ((G1 + G2 + G3) * g1 * z + c1 * z * e)
        const = {"highpass-notch": G4 * G5 * h0}.get(variant, G3 * G4 * G5 * G7)
        X_sym = {"lowpass-notch": G1 * G4 * G10 * D3}.get(variant, 0)
        n_sym = E_sym * D2 * D3 + const + X_sym
        assert sp.expand(n_sym.subs({e0: G7 * (G2 + (G1 + G2 + G3) * g0) - G1 * G8, h0: G3 * G7 - G1 * G10}) + num) == 0
        for k, ck in enumerate(coefficients(n_sym)):
            ok &= all_positive(ck)
    residual = [sp.cancel(sp.together(q.subs(nodes).subs(sol) * den)) for q in eqs]
    ok &= all(r == 0 for r in residual)
    ok &= sp.simplify(claimed.subs(sol) - num / den) == 0
    ok &= all(all_positive(ck) for ck in coefficients(den))
    deg = sp.degree(sp.expand(den), z)
    ok &= deg == (5 if variant in ("lowpass", "bandpass") else 6)
    print(f"{variant}: denominator degree {deg}; nodal equations, degree and sign structure {'ok' if ok else 'MISMATCH'}")
    return ok


results = [check(v) for v in ("lowpass", "bandpass", "lowpass-notch", "highpass-notch", "notch", "allpass")]
sys.exit(0 if all(results) else 1)
