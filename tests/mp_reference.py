"""Independent high-precision reference values, computed with mpmath from the published formulas.

Nothing here imports coilplan: these are the outside references the tests compare with.
mpmath's ellipk/ellipe take the parameter m = k², as in docs/methods.md §5c.
"""

import mpmath as mp

MU0 = mp.mpf(4) * mp.pi * mp.mpf("1e-7")  # the tests compare ratios or use scipy's mu_0 where SI matters


def nagaoka(ratio, dps=40):
    """Nagaoka's K_L(D/l) by the textbook elliptic form (Nagaoka 1909; docs/methods.md §1)."""
    with mp.workdps(dps):
        x = mp.mpf(ratio)
        k2 = x * x / (1 + x * x)
        k = mp.sqrt(k2)
        kp = mp.sqrt(1 - k2)
        big_k, big_e = mp.ellipk(k2), mp.ellipe(k2)
        return 4 / (3 * mp.pi * kp) * ((kp * kp / k2) * (big_k - big_e) + big_e - k)


def rosa_epsilon(k):
    """ε_k of Rosa's km sum from its closed (GMD) form (docs/methods.md §3)."""
    k = mp.mpf(k)
    bracket = (k + 1) ** 2 * mp.log(k + 1) - 2 * k * k * mp.log(k)
    if k > 1:
        bracket += (k - 1) ** 2 * mp.log(k - 1)
    return mp.log(k) - bracket / 2 + mp.mpf(3) / 2


def rosa_km(turns, dps=30):
    """km(N) = (2/N) Σ_{k=1}^{N-1} (N-k) ε_k, summed term by term at high precision."""
    with mp.workdps(dps):
        n = int(turns)
        return 2 * mp.fsum((n - k) * rosa_epsilon(k) for k in range(1, n)) / n


def rosa_solenoid(diameter, pitch, wire_diameter, turns, mu0, dps=30):
    """Nagaoka sheet minus Rosa's corrections, L = Ls − µ0 r N (ks + km), in henry."""
    with mp.workdps(dps):
        d, p, w, n = (mp.mpf(v) for v in (diameter, pitch, wire_diameter, turns))
        length = n * p
        sheet = mu0 * mp.pi * (d / 2) ** 2 * n * n / length * nagaoka(d / length, dps)
        ks = mp.mpf(5) / 4 - mp.log(2 * p / w)
        return sheet - mu0 * (d / 2) * n * (ks + rosa_km(turns, dps))
