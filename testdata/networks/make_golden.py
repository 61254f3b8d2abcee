#!/usr/bin/python3
"""Golden values for the visibility-graph tests of tracesift, from NetworkX.

Run once (Debian package python3-networkx; /usr/bin/python3):

    cd testdata/networks && /usr/bin/python3 make_golden.py

It (1) writes the small series files series_*.csv if they are missing
(deterministic: Python's random.Random with fixed seeds; values written with
repr(), which round-trips exactly to float64), (2) builds the natural and
horizontal visibility graphs of each series with its own naive construction
(the definitions checked pair by pair in exact rational arithmetic with
fractions.Fraction, independent of the Go code), and (3) writes golden.json
with the edge lists and NetworkX's degree histogram, average clustering,
transitivity, degree assortativity, average shortest-path length, diameter,
the modularity of a fixed partition (consecutive blocks of 20 nodes) and of
NetworkX's own Louvain partition (seed 1). The Go tests read golden.json (CI
has no Python).
"""

import json
import os
import random
from fractions import Fraction

import networkx as nx

HERE = os.path.dirname(os.path.abspath(__file__))
BLOCK = 20


def make_series():
    """Return {file name: list of floats}, writing missing files."""
    specs = {}
    r = random.Random(20240601)
    specs["series_gauss_200.csv"] = [r.gauss(0.0, 1.0) for _ in range(200)]
    r = random.Random(7)
    specs["series_int_150.csv"] = [float(r.randrange(6)) for _ in range(150)]
    r = random.Random(11)
    x, xs = r.uniform(0.05, 0.95), []
    for _ in range(100):  # transient
        x = 4.0 * x * (1.0 - x)
    for _ in range(200):
        xs.append(x)
        x = 4.0 * x * (1.0 - x)
    specs["series_logistic_200.csv"] = xs
    r = random.Random(3)
    v, walk = 0.0, []
    for _ in range(120):
        v += r.choice((-1.0, 1.0))
        walk.append(v)
    specs["series_walk_120.csv"] = walk
    out = {}
    for name, vals in specs.items():
        path = os.path.join(HERE, name)
        if not os.path.exists(path):
            with open(path, "w") as f:
                f.write("value\n")
                for v in vals:
                    f.write(repr(v) + "\n")
        with open(path) as f:
            lines = f.read().split("\n")
        out[name] = [float(s) for s in lines[1:] if s.strip()]
    return out


def nvg_edges(x):
    """Natural visibility (Lacasa et al. 2008): every c between strictly
    below the line through (a, x_a) and (b, x_b); exact rationals."""
    q = [Fraction(v) for v in x]
    n = len(x)
    edges = []
    for a in range(n):
        for b in range(a + 1, n):
            ok = True
            for c in range(a + 1, b):
                # x_c < x_a + (x_b - x_a)(c - a)/(b - a)
                if not (q[c] - q[a]) * (b - a) < (q[b] - q[a]) * (c - a):
                    ok = False
                    break
            if ok:
                edges.append((a, b))
    return edges


def hvg_edges(x):
    """Horizontal visibility (Luque et al. 2009): every c between strictly
    lower than both ends."""
    n = len(x)
    edges = []
    for a in range(n):
        for b in range(a + 1, n):
            lim = min(x[a], x[b])
            if all(x[c] < lim for c in range(a + 1, b)):
                edges.append((a, b))
    return edges


def measure(n, edges):
    g = nx.Graph()
    g.add_nodes_from(range(n))
    g.add_edges_from(edges)
    blocks = [set(range(s, min(s + BLOCK, n))) for s in range(0, n, BLOCK)]
    louv = nx.community.louvain_communities(g, seed=1)
    return {
        "n": n,
        "edges": [list(e) for e in sorted(edges)],
        "degree_histogram": nx.degree_histogram(g),
        "average_clustering": nx.average_clustering(g),
        "transitivity": nx.transitivity(g),
        "degree_assortativity": nx.degree_assortativity_coefficient(g),
        "average_shortest_path_length": nx.average_shortest_path_length(g),
        "diameter": nx.diameter(g),
        "block_size": BLOCK,
        "block_modularity": nx.community.modularity(g, blocks),
        "louvain_modularity_networkx": nx.community.modularity(g, louv),
        "louvain_communities_networkx": len(louv),
    }


def main():
    series = make_series()
    graphs = []
    for name in sorted(series):
        x = series[name]
        for kind, build in (("nvg", nvg_edges), ("hvg", hvg_edges)):
            rec = {"series": name, "kind": kind}
            rec.update(measure(len(x), build(x)))
            graphs.append(rec)
    doc = {
        "generator": "testdata/networks/make_golden.py",
        "networkx_version": nx.__version__,
        "graphs": graphs,
    }
    with open(os.path.join(HERE, "golden.json"), "w") as f:
        # One graph per line keeps the file small and diffs readable.
        f.write("{\n")
        f.write(' "generator": %s,\n' % json.dumps(doc["generator"]))
        f.write(' "networkx_version": %s,\n' % json.dumps(doc["networkx_version"]))
        f.write(' "graphs": [\n  ')
        f.write(",\n  ".join(json.dumps(g) for g in graphs))
        f.write("\n ]\n}\n")


if __name__ == "__main__":
    main()
