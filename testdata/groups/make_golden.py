#!/usr/bin/python3
"""Golden values for the group-comparison statistics of tracesift (package
groups), from SciPy and statsmodels.

Run once (Debian packages python3-scipy and python3-statsmodels; use
/usr/bin/python3, not a pyenv interpreter):

    cd testdata/groups && /usr/bin/python3 make_golden.py

It (1) writes datasets.json if it is missing: small samples drawn with
Python's random.Random and fixed seeds (floats are written with repr(), which
round-trips exactly to float64), and (2) writes golden.json with, for each
data set, the reference library's answer:

  - scipy.stats.ks_2samp(a, b, method="exact") and method="asymp"
    (two-sided), plus scipy.stats.kstwo.sf(d, N) and kstwobign.sf(x) on a
    grid, for the Kolmogorov distribution itself;
  - scipy.stats.mannwhitneyu(a, b, method="exact") when there are no ties and
    method="asymptotic" (continuity and tie correction) always;
  - scipy.stats.spearmanr;
  - numpy.percentile (linear, Hyndman & Fan type 7), scipy.stats.iqr and
    scipy.stats.median_abs_deviation(scale="normal");
  - the Hodges-Lehmann shift as numpy.median of all pairwise differences
    and Cliff's delta as the mean sign of all pairwise differences (brute
    force, independent of the Go code's O(n log n) methods);
  - statsmodels.stats.multitest.multipletests(method="holm" / "fdr_bh").

The Go tests read golden.json (CI has no Python). The versions used are
recorded in golden.json under "versions".
"""

import json
import math
import os
import random

import numpy as np
import scipy
import scipy.stats as st
import statsmodels
from statsmodels.stats.multitest import multipletests

HERE = os.path.dirname(os.path.abspath(__file__))


def make_datasets():
    """Return the list of data sets: {name, a, b} (and x, y for Spearman)."""
    ds = []

    def normal(r, n, mu=0.0, sd=1.0):
        return [r.gauss(mu, sd) for _ in range(n)]

    r = random.Random(20240611)
    # Two-sample data without ties, sizes chosen to exercise equal and
    # unequal sizes, gcd > 1 and coprime sizes, small and moderate n*m.
    for (n, m, shift) in [(5, 7, 0.0), (10, 10, 0.8), (8, 13, 0.3),
                          (20, 20, 1.0), (25, 40, 0.4), (3, 50, 0.0),
                          (60, 80, 0.5), (100, 100, 0.2), (30, 45, 2.5),
                          (1, 9, 0.0), (12, 18, -0.6)]:
        ds.append({"name": "normal_%d_%d" % (n, m),
                   "a": normal(r, n), "b": normal(r, m, shift)})
    # Complete separation: the smallest possible p-values.
    ds.append({"name": "separated_30_30",
               "a": [float(i) for i in range(30)],
               "b": [float(i) + 100.0 for i in range(30)]})
    # Heavy ties (integer data), for the tie-corrected normal approximation.
    r = random.Random(7)
    for (n, m) in [(15, 20), (30, 40), (9, 6)]:
        ds.append({"name": "ties_%d_%d" % (n, m),
                   "a": [float(r.randrange(6)) for _ in range(n)],
                   "b": [float(r.randrange(7)) for _ in range(m)]})
    # Larger samples for the asymptotic KS and MW modes.
    r = random.Random(99)
    for (n, m, shift) in [(200, 300, 0.15), (1000, 1500, 0.08),
                          (40, 3000, 0.3)]:
        ds.append({"name": "large_%d_%d" % (n, m),
                   "a": normal(r, n), "b": normal(r, m, shift)})
    return ds


def make_spearman():
    r = random.Random(5)
    out = []
    x = [float(v) for v in range(1, 13)]
    y = [v + r.gauss(0, 3) for v in x]
    out.append({"name": "noisy_line_12", "x": x, "y": y})
    # Ties in x (bias levels) and in y.
    x = [-1.0, -1.0, -1.0, -0.5, -0.5, -0.5, 0.0, 0.0, 0.0, 0.5, 0.5, 0.5]
    y = [3.0, 2.0, 4.0, 2.0, 2.0, 1.0, 1.0, 0.5, 1.0, 0.0, 0.5, -1.0]
    out.append({"name": "levels_ties_12", "x": x, "y": y})
    x = [r.gauss(0, 1) for _ in range(40)]
    y = [r.gauss(0, 1) for _ in range(40)]
    out.append({"name": "independent_40", "x": x, "y": y})
    return out


def make_pvalues():
    r = random.Random(3)
    sets = []
    # Benjamini & Hochberg (1995), section 4 (memory): 15 p-values.
    sets.append({"name": "bh1995_15", "p": [
        0.0001, 0.0004, 0.0019, 0.0095, 0.0201, 0.0278, 0.0298, 0.0344,
        0.0459, 0.3240, 0.4262, 0.5719, 0.6528, 0.7590, 1.000]})
    sets.append({"name": "unsorted_ties_8", "p": [
        0.04, 0.01, 0.03, 0.01, 0.5, 0.002, 0.04, 0.2]})
    sets.append({"name": "random_25", "p": [r.random() ** 3 for _ in range(25)]})
    return sets


def ks(a, b, method):
    res = st.ks_2samp(a, b, alternative="two-sided", method=method)
    return {"d": float(res.statistic), "p": float(res.pvalue)}


def main():
    dpath = os.path.join(HERE, "datasets.json")
    if not os.path.exists(dpath):
        data = {"two_sample": make_datasets(), "spearman": make_spearman(),
                "pvalues": make_pvalues()}
        with open(dpath, "w") as f:
            json.dump(data, f, indent=1)
            f.write("\n")
    with open(dpath) as f:
        data = json.load(f)

    two = []
    for d in data["two_sample"]:
        a, b = np.array(d["a"]), np.array(d["b"])
        n, m = len(a), len(b)
        ties = len(np.unique(np.concatenate([a, b]))) < n + m
        g = {"name": d["name"], "n": n, "m": m, "ties": bool(ties)}
        if n * m <= 200000:
            g["ks_exact"] = ks(a, b, "exact")
        g["ks_asymp"] = ks(a, b, "asymp")
        if not ties and n * m <= 2500:
            res = st.mannwhitneyu(a, b, alternative="two-sided", method="exact")
            g["mw_exact"] = {"u": float(res.statistic), "p": float(res.pvalue)}
        res = st.mannwhitneyu(a, b, alternative="two-sided", method="asymptotic",
                              use_continuity=True)
        g["mw_asymp"] = {"u": float(res.statistic), "p": float(res.pvalue)}
        diffs = np.subtract.outer(b, a).ravel()
        g["hodges_lehmann"] = float(np.median(diffs))
        g["cliff_delta"] = float(np.mean(np.sign(diffs)))
        for key, x in (("summary_a", a), ("summary_b", b)):
            g[key] = {
                "median": float(np.median(x)),
                "q1": float(np.percentile(x, 25)),
                "q3": float(np.percentile(x, 75)),
                "iqr": float(st.iqr(x)),
                "mad": float(st.median_abs_deviation(x, scale="normal")),
            }
        two.append(g)

    sp = []
    for d in data["spearman"]:
        res = st.spearmanr(d["x"], d["y"])
        sp.append({"name": d["name"], "rho": float(res.correlation),
                   "p": float(res.pvalue)})

    adj = []
    for d in data["pvalues"]:
        _, holm, _, _ = multipletests(d["p"], alpha=0.05, method="holm")
        rej_h, _, _, _ = multipletests(d["p"], alpha=0.05, method="holm")
        rej_b, bh, _, _ = multipletests(d["p"], alpha=0.05, method="fdr_bh")
        adj.append({"name": d["name"], "holm": [float(v) for v in holm],
                    "bh": [float(v) for v in bh],
                    "holm_reject_05": int(rej_h.sum()),
                    "bh_reject_05": int(rej_b.sum())})

    # The Kolmogorov distribution itself: finite-N (kstwo, Simard &
    # L'Ecuyer's algorithm in SciPy) and the limit (kstwobign).
    kol = []
    pts = [(N, d) for N in [1, 2, 5, 10, 37, 100, 500, 2000]
           for d in [0.01, 0.05, 0.1, 0.2, 0.3, 0.5, 0.8]]
    # Large N, small d: the central region of the limit distribution.
    pts += [(5000, 0.015), (5000, 0.02), (20000, 0.005), (20000, 0.01),
            (100000, 0.003), (100000, 0.004), (300000, 0.0025)]
    for N, d in pts:
        kol.append({"n": N, "d": d, "sf": float(st.kstwo.sf(d, N))})
    lim = []
    for x in [0.2, 0.4, 0.6, 0.8, 1.0, 1.2, 1.358, 1.5, 2.0, 3.0, 5.0]:
        lim.append({"x": x, "sf": float(st.kstwobign.sf(x)),
                    "cdf": float(st.kstwobign.cdf(x))})

    out = {
        "versions": {"scipy": scipy.__version__, "numpy": np.__version__,
                     "statsmodels": statsmodels.__version__},
        "two_sample": two, "spearman": sp, "adjust": adj,
        "kolmogorov_finite": kol, "kolmogorov_limit": lim,
    }
    with open(os.path.join(HERE, "golden.json"), "w") as f:
        json.dump(out, f, indent=1)
        f.write("\n")


if __name__ == "__main__":
    main()
