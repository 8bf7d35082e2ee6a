#!/usr/bin/env python3
"""Runs the lacuna tool to write certificates of textbook spaces, of every kind, over Z and
Z/2, and checks them with both checkers: the C++ certificate_check and its Python twin
(tests/python/certificate_check.py).

    certificate_twin_test.py valid|mutations LACUNA CERTIFICATE_CHECK DATA_DIR

valid:      both checkers say valid, print the same groups, and the groups are the textbook
            ones named beside each space.
mutations:  certificates edited in five ways (a torsion factor changed, a generator dropped, a
            generator replaced by a boundary, a cocycle coefficient perturbed, a pivot of a rank
            witness moved onto a zero entry) are refused by both (exit status 1), and both name
            the same group, or the same map for a rank witness.

Ends with the line "N passed, N failed"; exit status 1 when something failed.
"""

import copy
import json
import os
import re
import subprocess
import sys
import tempfile

HERE = os.path.dirname(os.path.abspath(__file__))
sys.dont_write_bytecode = True  # the source tree is not written to
sys.path.insert(0, HERE)
import certificate_check as twin  # noqa: E402

TWIN = os.path.join(HERE, "certificate_check.py")

# Spaces written here (the others are files of tests/data/cli).
INLINE = {
    # The five-vertex Möbius band (triangles {i, i+1, i+2} mod 5) and its boundary circle.
    "moebius.facets": "0 1 2\n1 2 3\n2 3 4\n3 4 0\n4 0 1\n",
    "moebius_rim.facets": "0 2\n2 4\n4 1\n1 3\n3 0\n",
    # A disk, the cone over a hexagon, and its rim.
    "disk.facets": "o 1 2\no 2 3\no 3 4\no 4 5\no 5 6\no 6 1\n",
    "disk_rim.facets": "1 2\n2 3\n3 4\n4 5\n5 6\n6 1\n",
    # One vertex of the six-vertex RP^2.
    "rp2_vertex.facets": "1\n",
    # A lens space L(3, 1) as a CW complex: one cell in each dimension 0..3, the 2-cell
    # attached by degree 3, the 3-cell by degree 0 (Hatcher 2002, Example 2.43, from memory).
    "lens3.cells": "0 v\n1 e : v - v\n2 f : 3*e\n3 c : f - f\n",
}


def g(*groups):
    """Expected group lines from (rank, torsion...) tuples, degree 0 upward."""
    out = []
    for rank, *torsion in groups:
        out.append((rank, list(torsion)))
    return out


# (file, SUB or None, kind, coefficients, expected groups, source of the expected groups).
CASES = [
    ("projective_plane.cells", None, "absolute", "Z", g((1,), (0, 2), (0,)),
     "RP^2: H_1 = Z/2, H_2 = 0 (Hatcher 2002, Example 2.42, from memory)"),
    ("projective_plane.cells", None, "absolute", "Z/2", g((1,), (1,), (1,)),
     "RP^2 over Z/2: the universal coefficient theorem from H_*(RP^2; Z)"),
    ("projective_plane.cells", None, "reduced", "Z", g((0,), (0, 2), (0,)),
     "reduced homology: H~_0 has rank b_0 - 1, H~_k = H_k above (Hatcher 2002, §2.1, from memory)"),
    ("projective_plane.cells", None, "cohomology", "Z", g((1,), (0,), (0, 2)),
     "H^*(RP^2; Z) = Z, 0, Z/2 by the universal coefficient theorem (Ext(Z/2, Z) = Z/2)"),
    ("projective_plane.cells", None, "cohomology", "Z/2", g((1,), (1,), (1,)),
     "H^*(RP^2; Z/2) = Z/2 in each degree (Hatcher 2002, Theorem 3.12 context, from memory)"),
    ("rp2_6.facets", None, "absolute", "Z", g((1,), (0, 2), (0,)),
     "the six-vertex RP^2: H_1 = Z/2 (Munkres 1984, §6, from memory)"),
    ("rp2_6.facets", None, "absolute", "Z/2", g((1,), (1,), (1,)),
     "RP^2 over Z/2: Z/2 in each degree (universal coefficients)"),
    ("rp2_6.facets", None, "cohomology", "Z/2", g((1,), (1,), (1,)),
     "H^*(RP^2; Z/2): Z/2 in each degree (universal coefficients)"),
    ("rp2_6.facets", None, "reduced", "Z/2", g((0,), (1,), (1,)),
     "reduced homology over Z/2 of RP^2: 0, Z/2, Z/2 (universal coefficients)"),
    ("rp2_6.facets", None, "cohomology", "Z", g((1,), (0,), (0, 2)),
     "H^*(RP^2; Z) by the universal coefficient theorem"),
    ("rp2_6.facets", "rp2_vertex.facets", "relative", "Z", g((0,), (0, 2), (0,)),
     "H_k(X, point) = H~_k(X) (Hatcher 2002, §2.1, from memory)"),
    ("torus.cells", None, "absolute", "Z", g((1,), (2,), (1,)),
     "the torus: Z, Z^2, Z (Hatcher 2002, Example 2.36, from memory)"),
    ("torus.cells", None, "absolute", "Z/2", g((1,), (2,), (1,)),
     "the torus over Z/2: free homology, so the same ranks (universal coefficients)"),
    ("torus.cells", None, "reduced", "Z", g((0,), (2,), (1,)),
     "reduced homology of the torus: 0, Z^2, Z"),
    ("torus.cells", None, "cohomology", "Z", g((1,), (2,), (1,)),
     "H^*(T^2; Z) = Z, Z^2, Z (universal coefficients, free homology)"),
    ("torus.cells", None, "cohomology", "Z/2", g((1,), (2,), (1,)),
     "H^*(T^2; Z/2) (universal coefficients)"),
    ("klein_bottle.cells", None, "absolute", "Z", g((1,), (1, 2), (0,)),
     "the Klein bottle: H_1 = Z + Z/2, H_2 = 0 (Hatcher 2002, Example 2.37, from memory)"),
    ("klein_bottle.cells", None, "absolute", "Z/2", g((1,), (2,), (1,)),
     "the Klein bottle over Z/2: 1, 2, 1 (universal coefficients)"),
    ("klein_bottle.cells", None, "reduced", "Z/2", g((0,), (2,), (1,)),
     "reduced homology of the Klein bottle over Z/2: 0, 2, 1"),
    ("klein_bottle.cells", None, "cohomology", "Z", g((1,), (1,), (0, 2)),
     "H^*(K; Z) = Z, Z, Z/2 (universal coefficients: Ext(Z + Z/2, Z) = Z/2)"),
    ("klein_bottle.cells", None, "cohomology", "Z/2", g((1,), (2,), (1,)),
     "H^*(K; Z/2) = 1, 2, 1 (universal coefficients)"),
    ("torsion_mix.cells", None, "absolute", "Z", g((1,), (0, 2, 2, 12), (0,)),
     "Z/6 + Z/4 + Z/2 has invariant factors 2 | 2 | 12 (structure theorem, Chinese remainders)"),
    ("torsion_mix.cells", None, "reduced", "Z", g((0,), (0, 2, 2, 12), (0,)),
     "reduced homology of the wedge of Moore spaces"),
    ("torsion_mix.cells", None, "cohomology", "Z", g((1,), (0,), (0, 2, 2, 12)),
     "H^2 = Ext(H_1, Z) = Z/2 + Z/2 + Z/12 (universal coefficients)"),
    ("torsion_mix.cells", None, "absolute", "Z/2", g((1,), (3,), (3,)),
     "over Z/2: H_1 = H_1 ⊗ Z/2 = (Z/2)^3, H_2 = Tor(H_1, Z/2) = (Z/2)^3 (universal coefficients)"),
    ("lens3.cells", None, "absolute", "Z", g((1,), (0, 3), (0,), (1,)),
     "L(3, 1): Z, Z/3, 0, Z (Hatcher 2002, Example 2.43, from memory)"),
    ("lens3.cells", None, "cohomology", "Z", g((1,), (0,), (0, 3), (1,)),
     "H^*(L(3, 1); Z) = Z, 0, Z/3, Z (universal coefficients, or Poincaré duality)"),
    ("lens3.cells", None, "absolute", "Z/2", g((1,), (0,), (0,), (1,)),
     "L(3, 1) over Z/2: 3 is a unit, so only H_0 and H_3 (universal coefficients)"),
    ("moebius.facets", "moebius_rim.facets", "relative", "Z", g((0,), (0, 2), (0,)),
     "the Möbius band rel its boundary circle: 0, Z/2, 0 (long exact sequence: the rim wraps twice)"),
    ("moebius.facets", "moebius_rim.facets", "relative", "Z/2", g((0,), (1,), (1,)),
     "the same over Z/2: 0, Z/2, Z/2 (long exact sequence, multiplication by 2 is zero)"),
    ("disk.facets", "disk_rim.facets", "relative", "Z", g((0,), (0,), (1,)),
     "H_n(D^n, S^{n-1}) = Z in degree n, 0 elsewhere (Hatcher 2002, §2.1, from memory)"),
]

GROUP_WORD = {"absolute": "H_{}", "reduced": "H~_{}", "relative": "H_{}(X, A)", "cohomology": "H^{}"}

SUBJECT = re.compile(r"(H̃_\d+|H_\d+\(X, A\)|H_\d+|H\^\d+|ε|δ_\d+|∂_\d+ of C\(X\)/C\(A\)|∂_\d+)")


class Run:
    def __init__(self, lacuna, checker, data, work):
        self.lacuna, self.checker, self.data, self.work = lacuna, checker, data, work
        self.passed = self.failed = 0

    def path(self, name):
        if name in INLINE:
            p = os.path.join(self.work, name)
            if not os.path.exists(p):
                with open(p, "w") as f:
                    f.write(INLINE[name])
            return p
        return os.path.join(self.data, "cli", name)

    def expect(self, condition, what):
        if condition:
            self.passed += 1
        else:
            self.failed += 1
            print("FAILED:", what)

    def certificate(self, case):
        file, sub, kind, coefficients = case[:4]
        out = os.path.join(self.work, f"{file}.{sub}.{kind}.{coefficients.replace('/', '')}.json")
        args = [self.lacuna, "cohomology" if kind == "cohomology" else "homology", "--quiet",
                "--coefficients", coefficients, "--certificate", out]
        if kind == "reduced":
            args.append("--reduced")
        if kind == "relative":
            args += ["--relative", self.path(sub)]
        args.append(self.path(file))
        r = subprocess.run(args, capture_output=True, text=True)
        if r.returncode != 0:
            raise RuntimeError(f"{' '.join(args)} failed: {r.stderr}")
        return out

    def both(self, case, cert):
        file, sub = case[0], case[1]
        args = [self.path(file), cert] + ([self.path(sub)] if sub else [])
        c = subprocess.run([self.checker] + args, capture_output=True, text=True)
        p = subprocess.run([sys.executable, TWIN] + args, capture_output=True, text=True)
        return c, p

    def valid(self):
        for case in CASES:
            file, sub, kind, coefficients, expected, source = case
            name = f"{file} {kind} over {coefficients}"
            cert = self.certificate(case)
            c, p = self.both(case, cert)
            self.expect(c.returncode == 0 and c.stdout.startswith("valid"), f"{name}: certificate_check: {c.stdout}{c.stderr}")
            self.expect(p.returncode == 0 and p.stdout.startswith("valid ("), f"{name}: twin: {p.stdout}{p.stderr}")
            cg = c.stdout.splitlines()[1:]
            pg = p.stdout.splitlines()[1:]
            self.expect(cg == pg, f"{name}: the checkers print different groups:\n{c.stdout}\n{p.stdout}")
            want = []
            for k, (rank, torsion) in enumerate(expected):
                line = GROUP_WORD[kind].format(k) + f": rank {rank}"
                if torsion:
                    line += ", torsion " + " ".join(map(str, torsion))
                want.append(line)
            self.expect(pg == want, f"{name}: {source}: expected {want}, the twin proved {pg}")

    def mutations(self):
        covered = set()
        for case in CASES:
            file, sub, kind, coefficients = case[:4]
            cert_path = self.certificate(case)
            with open(cert_path) as f:
                cert = json.load(f)
            x = twin.read_complex(self.path(file))
            marks = None
            if sub:
                marks = twin.read_marks(x, self.path(file), self.path(sub))
            d = twin.Derived(x, kind, marks)
            for what, mutated in mutate(cert, d, coefficients):
                name = f"{file} {kind} over {coefficients}, {what}"
                out = os.path.join(self.work, "mutated.json")
                with open(out, "w") as f:
                    json.dump(mutated, f, indent=1)
                covered.add((kind, kind_of(what)))
                c, p = self.both(case, out)
                self.expect(c.returncode == 1 and c.stdout.startswith("invalid: "),
                            f"{name}: certificate_check did not refuse it: {c.stdout}{c.stderr}")
                self.expect(p.returncode == 1 and p.stdout.startswith("invalid: "),
                            f"{name}: the twin did not refuse it: {p.stdout}{p.stderr}")
                sc, sp = SUBJECT.search(c.stdout), SUBJECT.search(p.stdout)
                self.expect(sc is not None and sp is not None and sc.group(1) == sp.group(1),
                            f"{name}: the checkers name different groups:\n  {c.stdout.strip()}\n  {p.stdout.strip()}")
        # Every kind of certificate meets every mutation somewhere among the spaces.
        for kind in GROUP_WORD:
            for what in MUTATIONS:
                self.expect((kind, what) in covered, f"no {kind} certificate was mutated by: {what}")


MUTATIONS = ("torsion factor", "dropped", "boundary", "cocycle", "pivot")


def kind_of(what):
    return next(m for m in MUTATIONS if m in what)


def names_of(d, degree, chain):
    return [[c, d.cells[degree][i]] for i, c in sorted(chain.items())]


def mutate(cert, d, coefficients):
    """Yields (description, mutated certificate); each mutation is built to be wrong."""
    groups = cert["groups"]
    z2 = coefficients == "Z/2"
    # A torsion factor changed: order t claimed as 2t (also in the generator's "order").
    for k, grp in enumerate(groups):
        if grp["torsion"]:
            m = copy.deepcopy(cert)
            i = len(grp["torsion"]) - 1
            t = m["groups"][k]["torsion"][i] * 2
            m["groups"][k]["torsion"][i] = t
            m["groups"][k]["generators"][grp["rank"] + i]["order"] = t
            yield f"{d.group(k)} torsion factor {i} doubled", m
            break
    # A free generator dropped (with the rank lowered to match).
    for k, grp in enumerate(groups):
        if grp["rank"] > 0:
            m = copy.deepcopy(cert)
            m["groups"][k]["rank"] -= 1
            del m["groups"][k]["generators"][0]
            yield f"{d.group(k)} generator 0 dropped", m
            break
    # A free generator replaced by a boundary of D (a coboundary, for cohomology).
    done = False
    for k, grp in enumerate(groups):
        in_m = d.in_map(k)
        if grp["rank"] == 0 or in_m is None or done:
            continue
        for col in in_m.columns:
            b = twin.reduce(dict(col), 2 if z2 else None)
            if b:
                m = copy.deepcopy(cert)
                m["groups"][k]["generators"][0]["chain"] = names_of(d, k, b)
                yield f"{d.group(k)} generator 0 replaced by a boundary", m
                done = True
                break
    # A cocycle coefficient perturbed on a cell where the generator is not zero.
    for k, grp in enumerate(groups):
        if grp["rank"] == 0:
            continue
        gen = grp["generators"][0]
        support = {name for _, name in gen["chain"]}
        terms = gen["cocycle"]
        at = next((i for i, (_, name) in enumerate(terms) if name in support), None)
        if at is None:
            continue
        m = copy.deepcopy(cert)
        t = m["groups"][k]["generators"][0]["cocycle"]
        if z2:
            del t[at]
        else:
            t[at][0] += 1 if t[at][0] != -1 else 2
        yield f"{d.group(k)} generator 0: cocycle coefficient perturbed", m
        break
    # A pivot of a rank witness moved onto a zero entry of its map.
    for w_at, w in enumerate(cert["rank_witnesses"]):
        if not w["pivots"]:
            continue
        mp = d.maps[w["dimension"]]
        rows = {r for r, _ in w["pivots"]}
        r0, c0 = w["pivots"][0]
        col = mp.columns[d.position[mp.source][c0]]
        p = w["prime"]
        other = next((r for i, r in enumerate(d.cells[mp.target]) if r not in rows and col.get(i, 0) % p == 0), None)
        if other is not None:
            m = copy.deepcopy(cert)
            m["rank_witnesses"][w_at]["pivots"][0] = [other, c0]
            yield f"{mp.name}: first pivot moved to row {other}", m
            break
        # No such row: move it to a column that is zero on its row instead.
        columns = {c for _, c in w["pivots"]}
        row = mp.rows[d.position[mp.target][r0]]
        other = next((c for j, c in enumerate(d.cells[mp.source]) if c not in columns and row.get(j, 0) % p == 0), None)
        if other is not None:
            m = copy.deepcopy(cert)
            m["rank_witnesses"][w_at]["pivots"][0] = [r0, other]
            yield f"{mp.name}: first pivot moved to column {other}", m
            break


def main(argv):
    if len(argv) != 5 or argv[1] not in ("valid", "mutations"):
        print(__doc__, file=sys.stderr)
        return 2
    with tempfile.TemporaryDirectory() as work:
        run = Run(argv[2], argv[3], argv[4], work)
        getattr(run, argv[1])()
    print(f"{run.passed} passed, {run.failed} failed")
    return 0 if run.failed == 0 and run.passed > 0 else 1


if __name__ == "__main__":
    sys.exit(main(sys.argv))
