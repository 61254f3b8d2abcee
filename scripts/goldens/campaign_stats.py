#!/usr/bin/python3
"""Golden values for the paired and trend statistics of tracesift's campaign
analysis (groups.SignedRank, groups.Spearman, groups.TheilSen), from SciPy.

Run with Debian's interpreter and package (python3-scipy; the PyPI index is
not reachable from the build machines):

    /usr/bin/python3 scripts/goldens/campaign_stats.py > /tmp/golden.go.txt

It prints Go composite literals (data and SciPy's answers, floats written
with repr(), which round-trips exactly to float64) that are pasted into
groups/signedrank_golden_test.go; the test names this script and the SciPy
version printed in the first line. Data sets are drawn with Python's
random.Random and fixed seeds, so a rerun prints the same text.

  - scipy.stats.wilcoxon(d, method="exact") on data without ties or zeros,
    and method="approx" (zero_method="wilcox", correction=False, the
    defaults) on every data set;
  - scipy.stats.spearmanr(x, y);
  - scipy.stats.theilslopes(y, x, alpha=0.95) (method="separate").
"""

import json
import random
import warnings

import numpy as np
import scipy
import scipy.stats as st

warnings.simplefilter("ignore")


def golist(v):
    return "[]float64{" + ", ".join(repr(float(a)) for a in v) + "}"


def gofloat(v):
    v = float(v)
    if np.isnan(v):
        return "math.NaN()"
    return repr(v)


def signed_rank_sets():
    r = random.Random(20260801)
    out = []
    # Continuous differences: no ties, no zeros.
    for n, shift in [(6, 0.9), (6, 0.0), (10, 0.5), (20, 0.3), (35, -0.4), (50, 0.2), (60, 0.25)]:
        out.append(("normal_%d" % n + ("_null" if shift == 0 else ""), [r.gauss(shift, 1.0) for _ in range(n)]))
    out.append(("all_positive_6", [abs(r.gauss(0, 1)) + 0.01 for _ in range(6)]))
    # Ties in |d| (values on a grid of 0.5) and zeros.
    out.append(("ties_25", [round(r.gauss(0.4, 1.5) * 2) / 2 + 0.25 for _ in range(25)]))
    out.append(("zeros_15", [float(round(r.gauss(0.5, 1.2))) for _ in range(15)]))
    out.append(("ties_sign_12", [1.0, -1.0, 2.0, 2.0, -2.0, 3.0, 3.0, 3.0, -0.5, 4.0, 5.0, -5.0]))
    return out


def trend_sets():
    r = random.Random(20260802)
    out = []
    levels = [0.6, 0.9, 1.2]
    # Campaign-like: 6 traces at each of 3 levels, a rising metric.
    x = [v for v in levels for _ in range(6)]
    out.append(("levels_rising", x, [2.0 + 1.5 * v + r.gauss(0, 0.4) for v in x]))
    out.append(("levels_null", x, [r.gauss(0, 1) for v in x]))
    out.append(("levels_falling_ties", x, [round(3 - 2 * v + r.gauss(0, 0.3), 1) for v in x]))
    x2 = [float(i) for i in range(25)]
    out.append(("index_25", x2, [0.3 * v + r.gauss(0, 2) for v in x2]))
    x3 = [r.uniform(0, 10) for _ in range(40)]
    out.append(("uniform_40", x3, [-0.7 * v + r.gauss(0, 3) for v in x3]))
    x4 = [1.0, 1.0, 2.0, 2.0, 3.0, 3.0, 4.0, 4.0]
    out.append(("pairs_8", x4, [1.0, 2.0, 2.0, 4.0, 3.0, 5.0, 7.0, 6.0]))
    return out


def main():
    print("// SciPy %s, NumPy %s (scripts/goldens/campaign_stats.py)" % (scipy.__version__, np.__version__))
    print("var signedRankGolden = []signedRankCase{")
    for name, d in signed_rank_sets():
        arr = np.array(d)
        exact = "nil"
        if np.all(arr != 0) and len(np.unique(np.abs(arr))) == len(arr) and len(arr) <= 50:
            e = st.wilcoxon(arr, method="exact")
            exact = "&[2]float64{%s, %s}" % (gofloat(e.statistic), gofloat(e.pvalue))
        a = st.wilcoxon(arr, method="approx")
        print("\t{name: %s, d: %s, exact: %s, approxT: %s, approxP: %s}," % (
            json.dumps(name), golist(d), exact, gofloat(a.statistic), gofloat(a.pvalue)))
    print("}")
    print()
    print("var trendGolden = []trendCase{")
    for name, x, y in trend_sets():
        rho, p = st.spearmanr(x, y)
        ts = st.theilslopes(y, x, alpha=0.95)
        print("\t{name: %s, x: %s, y: %s, rho: %s, p: %s, slope: %s, intercept: %s, low: %s, high: %s}," % (
            json.dumps(name), golist(x), golist(y), gofloat(rho), gofloat(p), gofloat(ts[0]), gofloat(ts[1]), gofloat(ts[2]), gofloat(ts[3])))
    print("}")


if __name__ == "__main__":
    main()
