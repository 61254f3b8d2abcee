#!/usr/bin/python3
"""Reference run for `tracesift graph`: the natural visibility graph (NVG) of
a trace built with numpy by a plain max-slope sweep, and its average
clustering computed by NetworkX.

    /usr/bin/python3 scripts/bench/nvg_networkx.py TRACE.csv [--check TRACESIFT]

TRACE.csv is what `tracesift generate` writes (header t,value; the last
column is the series). Needs numpy and networkx (Debian: apt-get install
python3-numpy python3-networkx; measured with numpy 1.24.2, networkx 2.8.8).

The sweep: from each sample a, the slopes (x_b - x_a)/(b - a) to the later
samples b; b is visible from a iff its slope exceeds every slope before it
(Lacasa et al., PNAS 105 (2008) 4972: every sample between lies strictly
below the line from a to b). It is O(n^2), vectorised over b. Slopes are
rounded, so samples exactly on a line of sight (quantised data) may be
judged differently from tracesift's exact predicate; on continuous-valued
data both give the same graph, which --check confirms through the edge count
and the clustering.

Output (stdout), one "key: value" per line: samples, edges, the average
clustering (nx.average_clustering, repr: every digit), and the seconds spent
reading, building and in NetworkX (graph construction plus clustering),
measured inside the process. Time the whole process with /usr/bin/time.

Manual reference check (documented; CI has no Python): with --check PATH,
the script also runs `PATH graph TRACE.csv --format json` and compares its
edge count and metrics.clustering_mean with the values above, printing
"check: MATCH" or "check: DIFFER" (exit status 1). Both compute the mean of
the local coefficients 2T_i/(k_i(k_i - 1)) (0 for k_i < 2) summed in node
order, so on the same graph the two numbers are equal to the last bit.
networks/visibility/compare_test.go holds the values this script printed
for `tracesift generate white|brownian --n 20000 --seed 1` and checks them.
"""

import json
import subprocess
import sys
import time

import networkx as nx
import numpy as np


def read_series(path):
    with open(path) as f:
        header = f.readline()
    ncol = header.count(",") + 1
    return np.loadtxt(path, delimiter=",", skiprows=1, usecols=ncol - 1, ndmin=1)


def nvg_edges(x):
    """Edges (a, b), a < b, of the NVG of x by the max-slope sweep."""
    n = len(x)
    src, dst = [], []
    for a in range(n - 1):
        s = (x[a + 1:] - x[a]) / np.arange(1, n - a)
        vis = np.empty(len(s), dtype=bool)
        vis[0] = True
        vis[1:] = s[1:] > np.maximum.accumulate(s)[:-1]
        b = np.flatnonzero(vis) + (a + 1)
        src.append(np.full(len(b), a))
        dst.append(b)
    if not src:
        return np.empty(0, int), np.empty(0, int)
    return np.concatenate(src), np.concatenate(dst)


def main(argv):
    if len(argv) not in (2, 4) or (len(argv) == 4 and argv[2] != "--check"):
        print("usage: nvg_networkx.py TRACE.csv [--check TRACESIFT]", file=sys.stderr)
        return 2
    path = argv[1]
    t0 = time.perf_counter()
    x = read_series(path)
    t1 = time.perf_counter()
    a, b = nvg_edges(x)
    t2 = time.perf_counter()
    g = nx.Graph()
    g.add_nodes_from(range(len(x)))
    g.add_edges_from(zip(a.tolist(), b.tolist()))
    clustering = nx.average_clustering(g)
    t3 = time.perf_counter()
    print(f"samples: {len(x)}")
    print(f"edges: {g.number_of_edges()}")
    print(f"average_clustering: {clustering!r}")
    print(f"numpy: {np.__version__}")
    print(f"networkx: {nx.__version__}")
    print(f"seconds_read: {t1 - t0:.4f}")
    print(f"seconds_build: {t2 - t1:.4f}")
    print(f"seconds_networkx: {t3 - t2:.4f}")
    if len(argv) == 4:
        out = subprocess.run([argv[3], "graph", path, "--format", "json"],
                             check=True, capture_output=True, text=True).stdout
        m = json.loads(out)["metrics"]
        ours = m["clustering_mean"]
        same = m["edges"] == g.number_of_edges() and ours == clustering
        print(f"tracesift_edges: {m['edges']}")
        print(f"tracesift_clustering_mean: {ours!r}")
        print("check: " + ("MATCH" if same else "DIFFER"))
        if not same:
            return 1
    return 0


if __name__ == "__main__":
    sys.exit(main(sys.argv))
