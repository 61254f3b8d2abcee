#!/usr/bin/python3
"""Golden values for the recurrence and ordinal partition networks of
tracesift, from NetworkX.

Run once (Debian package python3-networkx; /usr/bin/python3):

    cd testdata/networks && /usr/bin/python3 make_golden_rn_opn.py

It (1) writes the extra series file series_ar_1500.csv if missing
(deterministic: Python's random.Random with a fixed seed, values written
with repr()), (2) builds each network with its own construction, independent
of the Go code:

  - recurrence networks from the definition: delay vectors of the raw
    series, maximum-norm distances in exact rational arithmetic
    (fractions.Fraction; the order of maximum-norm distances does not change
    under the standardisation the Go code applies), all eligible pairs
    sorted by (distance, i, j), and the floor(rate*P + 0.5) first linked;
    the script checks that the last linked and the first unlinked
    distances are equal (exact ties, broken by (i, j) in Go too) or differ
    by more than 1e-9 relative, so rounding cannot swap them;
  - ordinal partition networks: patterns by stable ranking (equal values
    ranked by position), Lehmer codes, transitions between successive
    windows with their counts;

and (3) writes golden_rn_opn.json with the edge lists and NetworkX's
degree histogram, density, average clustering, transitivity, degree
assortativity, the mean shortest-path length over reachable ordered pairs
and the largest finite distance (from all_pairs_shortest_path_length), the
modularity of a fixed partition (blocks of consecutive nodes) and of
NetworkX's Louvain partition (seed 1, and the least and greatest over seeds
1-40 and two insertion orders: the spread of the heuristic itself); for ordinal networks also the
directed out-degree histogram (nx.DiGraph, self-loops counted), the
self-loop share of the steps, the global transition entropy and the
admissible transitions. The Go test reads the JSON (CI has no Python).
"""

import json
import math
import os
import random
from fractions import Fraction

import networkx as nx

HERE = os.path.dirname(os.path.abspath(__file__))


def read_series(name):
    with open(os.path.join(HERE, name)) as f:
        lines = f.read().split("\n")
    return [float(s) for s in lines[1:] if s.strip()]


def make_ar():
    name = "series_ar_1500.csv"
    path = os.path.join(HERE, name)
    if not os.path.exists(path):
        r = random.Random(1500)
        v, xs = 0.0, []
        for _ in range(1500):
            v = 0.7 * v + r.gauss(0.0, 1.0)
            xs.append(v)
        with open(path, "w") as f:
            f.write("value\n")
            for v in xs:
                f.write(repr(v) + "\n")
    return name


def recurrence_edges(x, dim, delay, theiler, rate):
    q = [Fraction(v) for v in x]
    n = len(x) - (dim - 1) * delay
    pairs = []
    for i in range(n):
        for j in range(i + theiler + 1, n):
            d = max(abs(q[i + c * delay] - q[j + c * delay]) for c in range(dim))
            pairs.append((d, i, j))
    pairs.sort()
    p = len(pairs)
    k = int(math.floor(rate * p + 0.5))
    last, first_out = pairs[k - 1][0], pairs[k][0]
    # Exact ties are common under the maximum norm (successive pairs of
    # delay vectors share coordinate differences) and are linked in order of
    # (i, j), as the Go code does; a near tie could be swapped by rounding.
    assert first_out == last or first_out - last > Fraction(1, 10**9) * last, "near tie at the rate's threshold"
    return n, p, sorted((i, j) for _, i, j in pairs[:k]), float(last)


def pattern(w):
    ranks = [sum(1 for j, u in enumerate(w) if u < v or (u == v and j < i)) for i, v in enumerate(w)]
    code = 0
    for j in range(len(ranks) - 1):
        c = sum(1 for k in range(j + 1, len(ranks)) if ranks[k] < ranks[j])
        code = code * (len(ranks) - j) + c
    return code


def shape(r):
    """Lehmer code of the relative order of a rank list."""
    return pattern([float(v) for v in r])


def decode(code, d):
    digits = [0] * d
    for j in range(d - 1, -1, -1):
        base = d - j
        digits[j] = code % base
        code //= base
    avail = list(range(d))
    out = []
    for c in digits:
        out.append(avail.pop(c))
    return out


def undirected_metrics(g):
    n = g.number_of_nodes()
    tot, cnt, diam = 0, 0, 0
    for s, dist in nx.all_pairs_shortest_path_length(g):
        for t, l in dist.items():
            if t != s:
                tot += l
                cnt += 1
                diam = max(diam, l)
    block = max(2, n // 10)
    blocks = [set(range(s, min(s + block, n))) for s in range(0, n, block)]
    louv = nx.community.louvain_communities(g, seed=1)
    # The heuristic's own spread: seeds 1-40, on the graph as built and on
    # the same graph with its nodes and edges inserted in reverse order.
    rev = nx.Graph()
    rev.add_nodes_from(reversed(list(g.nodes())))
    rev.add_edges_from(reversed(list(g.edges())))
    spread = [nx.community.modularity(h, nx.community.louvain_communities(h, seed=s)) for h in (g, rev) for s in range(1, 41)] if g.number_of_edges() else [None]
    try:
        assort = nx.degree_assortativity_coefficient(g)
    except Exception:
        assort = None
    if assort is not None and math.isnan(assort):
        assort = None
    return {
        "n": n,
        "edges": [list(e) for e in sorted(tuple(sorted(e)) for e in g.edges())],
        "degree_histogram": nx.degree_histogram(g),
        "density": nx.density(g),
        "average_clustering": nx.average_clustering(g),
        "transitivity": nx.transitivity(g),
        "degree_assortativity": assort,
        "average_reachable_path_length": tot / cnt if cnt else None,
        "largest_distance": diam,
        "block_size": block,
        "block_modularity": nx.community.modularity(g, blocks) if g.number_of_edges() else None,
        "louvain_modularity_networkx": nx.community.modularity(g, louv) if g.number_of_edges() else None,
        "louvain_modularity_networkx_min80": min(spread) if g.number_of_edges() else None,
        "louvain_modularity_networkx_max80": max(spread) if g.number_of_edges() else None,
    }


def rn_record(name, x, dim, delay, theiler, rate):
    n, p, edges, eps = recurrence_edges(x, dim, delay, theiler, rate)
    g = nx.Graph()
    g.add_nodes_from(range(n))
    g.add_edges_from(edges)
    rec = {"series": name, "kind": "rn", "dim": dim, "delay": delay, "theiler": theiler, "rate": rate, "pairs": p}
    rec.update(undirected_metrics(g))
    return rec


def opn_record(name, x, d, delay):
    span = (d - 1) * delay
    codes = [pattern([x[i + c * delay] for c in range(d)]) for i in range(len(x) - span)]
    seen = sorted(set(codes))
    node = {c: k for k, c in enumerate(seen)}
    trans = {}
    for a, b in zip(codes, codes[1:]):
        trans[(node[a], node[b])] = trans.get((node[a], node[b]), 0) + 1
    dg = nx.DiGraph()
    dg.add_nodes_from(range(len(seen)))
    dg.add_edges_from(trans)
    steps = sum(trans.values())
    out = {}
    for (a, b), w in trans.items():
        out[a] = out.get(a, 0) + w
    h = 0.0
    for (a, b), w in trans.items():
        pcond = w / out[a]
        h -= (out[a] / steps) * pcond * math.log(pcond)
    if delay == 1:
        admissible = 0
        for c in seen:
            tail = shape(decode(c, d)[1:])
            admissible += sum(1 for c2 in range(math.factorial(d)) if shape(decode(c2, d)[:-1]) == tail)
    else:
        admissible = len(seen) * math.factorial(d)
    outdeg = [0] * (max(dict(dg.out_degree()).values()) + 1)
    for _, k in dg.out_degree():
        outdeg[k] += 1
    g = nx.Graph()
    g.add_nodes_from(range(len(seen)))
    g.add_edges_from((a, b) for (a, b) in trans if a != b)
    rec = {
        "series": name, "kind": "opn", "order": d, "delay": delay,
        "patterns": seen,
        "transitions": [[a, b, w] for (a, b), w in sorted(trans.items())],
        "steps": steps,
        "self_loop_fraction": sum(w for (a, b), w in trans.items() if a == b) / steps,
        "transition_entropy": h,
        "admissible": admissible,
        "out_degree_histogram": outdeg,
    }
    rec.update(undirected_metrics(g))
    return rec


def main():
    ar = make_ar()
    graphs = [
        rn_record("series_gauss_200.csv", read_series("series_gauss_200.csv"), 2, 1, 0, 0.1),
        rn_record("series_logistic_200.csv", read_series("series_logistic_200.csv"), 2, 1, 2, 0.05),
        rn_record("series_walk_120.csv", read_series("series_walk_120.csv"), 3, 2, 0, 0.08),
        rn_record(ar, read_series(ar)[:400], 3, 1, 4, 0.02),
        opn_record("series_logistic_200.csv", read_series("series_logistic_200.csv"), 4, 1),
        opn_record("series_int_150.csv", read_series("series_int_150.csv"), 3, 1),
        opn_record("series_walk_120.csv", read_series("series_walk_120.csv"), 3, 2),
        opn_record(ar, read_series(ar), 5, 1),
        opn_record(ar, read_series(ar), 4, 3),
    ]
    doc = {
        "generator": "testdata/networks/make_golden_rn_opn.py",
        "networkx_version": nx.__version__,
        "graphs": graphs,
    }
    with open(os.path.join(HERE, "golden_rn_opn.json"), "w") as f:
        f.write("{\n")
        f.write(' "generator": %s,\n' % json.dumps(doc["generator"]))
        f.write(' "networkx_version": %s,\n' % json.dumps(doc["networkx_version"]))
        f.write(' "graphs": [\n  ')
        f.write(",\n  ".join(json.dumps(g) for g in graphs))
        f.write("\n ]\n}\n")


if __name__ == "__main__":
    main()
