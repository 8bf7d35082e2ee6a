#!/usr/bin/python3
"""H_0 of a point cloud two ways, in one run: `lacuna persistence --max-dimension 0` (Prim's
minimum spanning forest, include/lacuna/persistence/implicit_rips.hpp) against the data
analyst's single-linkage clustering, scipy.cluster.hierarchy.linkage(points, "single") (Debian's
python3-scipy), on the same points (docs/performance.md, "Vietoris–Rips without building the
complex").

Makes N random points, uniform in the unit cube of R^3 (numpy's default_rng(SEED)), writes them
as a .points file with 17 significant digits (they read back as the same doubles), then
alternates ROUNDS times: scipy's linkage on the points in memory, and the tool as a whole
process (file read included). Prints each time, then the best of each and their ratio; checks
that the tool's H_0 deaths, sorted, are scipy's merge heights (the deaths of single linkage,
Gower & Ross 1969), to 1e-12 relative (the two compute a distance in their own order of
operations), and that one class never dies.

    /usr/bin/python3 benchmarks/single_linkage_recipe.py build/bin/lacuna [N [ROUNDS [SEED]]]
"""
import json
import os
import subprocess
import sys
import tempfile
import time

import numpy as np
from scipy.cluster.hierarchy import linkage


def main():
    if len(sys.argv) < 2:
        sys.exit(__doc__)
    tool = sys.argv[1]
    n = int(sys.argv[2]) if len(sys.argv) > 2 else 20000
    rounds = int(sys.argv[3]) if len(sys.argv) > 3 else 3
    seed = int(sys.argv[4]) if len(sys.argv) > 4 else 20
    points = np.random.default_rng(seed).random((n, 3))
    with tempfile.TemporaryDirectory() as d:
        path = os.path.join(d, "cloud.points")
        with open(path, "w") as f:
            for p in points:
                f.write(" ".join(repr(float(x)) for x in p) + "\n")
        scipy_times, tool_times = [], []
        heights, deaths = None, None
        for _ in range(rounds):
            t = time.perf_counter()
            z = linkage(points, "single")
            scipy_times.append(time.perf_counter() - t)
            heights = np.sort(z[:, 2])
            t = time.perf_counter()
            out = subprocess.run([tool, "persistence", "--quiet", "--json", "--max-dimension", "0", path],
                                 check=True, capture_output=True, text=True).stdout
            tool_times.append(time.perf_counter() - t)
            pairs = json.loads(out)["diagrams"][0]["pairs"]
            deaths = np.sort([p[1] for p in pairs if p[1] is not None])
            if sum(1 for p in pairs if p[1] is None) != 1:
                sys.exit("lacuna: not exactly one class that never dies")
        if len(deaths) != len(heights):
            sys.exit(f"{len(deaths)} finite deaths, but {len(heights)} merges")
        worst = float(np.max(np.abs(deaths - heights) / np.maximum(heights, 1e-300)))
        if worst > 1e-12:
            sys.exit(f"the deaths differ from the merge heights by up to {worst:.3g} (relative)")
        print(f"{n} points, {rounds} rounds")
        print("scipy linkage(single), s:", " ".join(f"{t:.2f}" for t in scipy_times))
        print("lacuna persistence -D 0, s:", " ".join(f"{t:.2f}" for t in tool_times))
        print(f"best: scipy {min(scipy_times):.2f} s, lacuna {min(tool_times):.2f} s, "
              f"ratio lacuna/scipy {min(tool_times) / min(scipy_times):.2f}; "
              f"deaths = merge heights (largest relative difference {worst:.2g})")


if __name__ == "__main__":
    main()
