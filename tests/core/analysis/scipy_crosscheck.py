#!/usr/bin/python3
"""Cross-check of Stridemark's circular statistics against scipy (Debian python3-scipy).

Usage: /usr/bin/python3 scipy_crosscheck.py PATH-TO-circular_probe [SEED]

Generates seeded random phase sets (cycles), including clusters that wrap round 0/1 and
near-uniform sets, feeds them to the probe and compares with scipy.stats.circmean / circstd /
circvar (scipy >= 1.8: circvar = 1 - R) to 1e-9, and the Rayleigh p-value with an independent
implementation of Zar's formula (Zar 1999 eq. 27.4, as quoted in docs/methods.md §8.1).
"""
import json
import math
import os
import subprocess
import sys

import numpy as np
from scipy import stats

TOL = 1e-9


def zar_rayleigh_p(n, rbar):
    big_r = n * rbar
    p = math.exp(math.sqrt(1 + 4 * n + 4 * (n * n - big_r * big_r)) - (1 + 2 * n))
    return min(1.0, p)


def phase_sets(rng):
    sets = []
    for _ in range(60):  # plain random sets of random size
        sets.append(rng.random(rng.integers(1, 80)))
    for _ in range(40):  # clusters straddling 0/1
        n = int(rng.integers(2, 60))
        sets.append((rng.normal(0.0, 0.05, n)) % 1.0)
    for _ in range(30):  # clusters near 0.5 and elsewhere, with outliers
        n = int(rng.integers(2, 60))
        centre = rng.random()
        sets.append(np.concatenate([(rng.normal(centre, 0.1, n)) % 1.0, rng.random(3)]))
    for _ in range(30):  # near-uniform: evenly spaced plus tiny jitter
        n = int(rng.integers(3, 40))
        sets.append((np.arange(n) / n + rng.normal(0.0, 1e-3, n) + rng.random()) % 1.0)
    for _ in range(10):  # large sets
        sets.append(rng.random(int(rng.integers(500, 3000))))
    return sets


def circ_diff(a, b):
    d = (a - b) % 1.0
    return min(d, 1.0 - d)


def main():
    probe = sys.argv[1]
    seed = int(sys.argv[2]) if len(sys.argv) > 2 else int(os.environ.get("STRIDEMARK_SEED", "20261202"))
    print(f"scipy {__import__('scipy').__version__}, seed {seed}")
    rng = np.random.default_rng(seed)
    sets = phase_sets(rng)
    text = "\n".join(" ".join(repr(float(x)) for x in s) for s in sets) + "\n"
    out = subprocess.run([probe], input=text, capture_output=True, text=True, check=True).stdout
    results = [json.loads(line) for line in out.splitlines()]
    assert len(results) == len(sets), f"probe answered {len(results)} of {len(sets)} sets"
    failures = 0
    checked = 0
    for i, (phases, ours) in enumerate(zip(sets, results)):
        n = len(phases)
        ref_var = float(stats.circvar(phases, high=1.0, low=0.0))
        r = 1.0 - ref_var
        expected = {
            "r": r,
            "circ_var": ref_var,
            "circ_sd": float(stats.circstd(phases, high=1.0, low=0.0)),
            "angular_dev": math.sqrt(2.0 * (1.0 - r)) / (2.0 * math.pi),
            "rayleigh_z": n * r * r,
            "rayleigh_p": zar_rayleigh_p(n, r),
        }
        problems = []
        if ours["n"] != n:
            problems.append(f"n {ours['n']} != {n}")
        for key, want in expected.items():
            got = ours[key]
            if got is None or abs(got - want) > TOL * max(1.0, abs(want)):
                problems.append(f"{key}: ours {got} scipy/zar {want}")
        want_mean = float(stats.circmean(phases, high=1.0, low=0.0))
        if r > 1e-6:
            if ours["mean"] is None or circ_diff(ours["mean"], want_mean) > TOL:
                problems.append(f"mean: ours {ours['mean']} scipy {want_mean}")
            if not ours["defined"]:
                problems.append("mean flagged undefined although R > 0")
        checked += 1
        if problems:
            failures += 1
            print(f"set {i} (n={n}, R={r:.3g}): " + "; ".join(problems))
    print(f"{checked} phase sets compared, {failures} mismatches (tolerance {TOL})")
    return 1 if failures else 0


if __name__ == "__main__":
    sys.exit(main())
