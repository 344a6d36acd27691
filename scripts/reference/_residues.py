"""Shared by tf_fixtures.py and tf_step_figures.py: residues of a zpk at its poles in mpmath.

For H(s) = k prod(s - z_i) / prod(s - p_j) with simple poles, the residue at p_i
is k prod(p_i - z) / prod_{j != i}(p_i - p_j) (partial fractions; the step and
impulse responses are then sums of exponentials). A helper module, not a
fixture script (all.sh skips files starting with an underscore).
"""
import mpmath as mp


def residues(z, p, k):
    """Return z, p (as mpc), k (as mpf) and the residues at the simple poles p."""
    z = [mp.mpc(v) for v in z]
    p = [mp.mpc(v) for v in p]
    k = mp.mpf(k)
    res = []
    for i, pi in enumerate(p):
        num = k
        for zj in z:
            num *= pi - zj
        den = mp.mpf(1)
        for j, pj in enumerate(p):
            if j != i:
                den *= pi - pj
        res.append(num / den)
    return z, p, k, res
