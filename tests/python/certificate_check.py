#!/usr/bin/env python3
"""A second checker of lacuna's homology certificates, written apart from the C++ one.

    python3 certificate_check.py FILE CERTIFICATE.json [SUB]

Written from docs/certificates.md (what a certificate holds and what its check proves) and
docs/formats.md (the input files) alone, with Python's standard library only: Python's
integers are exact at any size, so no arithmetic here can overflow or round.

Reads FILE in the cell-list format (.cells) or the simplicial facets format (.facets) -- the
two formats named in docs/formats.md that give a complex cell by cell; images, volumes and
meshes are not read here. Cells are matched with the certificate by name, as the file names
them (a simplex by its labels in vertex order, joined by single spaces), so nothing depends on
how either program numbers cells.

Every kind of certificate is the homology of a chain complex D built here from FILE (absolute:
D = X; reduced: the augmented complex, one cell "*" in degree -1; relative: the quotient
C(X)/C(A), A read from SUB and checked to be closed under faces; cohomology: the dual complex,
delta_k = transpose of the boundary d_{k+1}). The checks are then the same for every kind:

  0. every composite of two maps of D is zero;
  1. counts of generators and cocycles, orders neither zero nor units and each dividing the next;
  2. every generator is a cycle of D (exactly; over Z/2 modulo 2);
  3. the bounding chain of a torsion generator of order d has boundary d times it;
  4. every cocycle vanishes on boundaries (modulo d for a torsion generator of order d);
  5. the pairing of cocycles and generators is the identity (modulo d on a torsion row);
  6. rank witnesses: Gaussian elimination modulo p of the square minor at the given pivots,
     in the given order, meets no zero pivot, so the minor is invertible mod p and the rank of
     the map is at least the number of pivots;
  7. free rank: cells - (pivots of the map out) - (pivots of the map in) = claimed rank;
  8. torsion witnesses (over Z): the given pivots are eliminated exactly, each +-1 when its
     turn comes; the determinants of the Schur complements on the blocks, by fraction-free
     elimination (Bareiss 1968), have as gcd the product of the claimed torsion factors.

docs/certificates.md, "What a passing check proves", says why these prove the groups.

Prints "valid (N checks)" and the groups (exit status 0), "invalid: " and the first failure,
naming the group (or the map) and the generator (exit status 1), one line on standard error
for a file that cannot be read (exit status 2), or "incomplete: " for a certificate over Z
without torsion witnesses that passes every other check (exit status 3).

Witness forms: a rank witness is checked by the function RANK_WITNESS_FORMS names for the
first of its keys found there; a new optional form is one more function in that table.
"""

import json
import math
import os
import re
import sys

VERSION = "lacuna homology certificate 1"


class Unreadable(Exception):
    """A file that cannot be read as what it should be (exit status 2)."""


class Invalid(Exception):
    """The first failed check (exit status 1)."""


class Incomplete(Exception):
    """A certificate over Z without torsion witnesses, otherwise valid (exit status 3)."""


# ---- the input files ------------------------------------------------------------------------


class Complex:
    """A finite complex: names[k] lists the k-cells by name, index[k] maps a name to its
    position, bd[k][i] is the boundary of k-cell i as {position of a (k-1)-cell: integer}."""

    def __init__(self):
        self.names = []
        self.index = []
        self.bd = []

    def top(self):
        return len(self.names) - 1

    def add(self, k, name, boundary):
        while len(self.names) <= k:
            self.names.append([])
            self.index.append({})
            self.bd.append([])
        self.index[k][name] = len(self.names[k])
        self.names[k].append(name)
        self.bd[k].append(boundary)


def text_lines(path):
    try:
        with open(path, "rb") as f:
            data = f.read()
    except OSError as e:
        raise Unreadable(f"{path}: cannot be read ({e.strerror})")
    if data.startswith(b"\xef\xbb\xbf"):
        data = data[3:]
    try:
        text = data.decode("utf-8")
    except UnicodeDecodeError:
        raise Unreadable(f"{path}: not UTF-8 text")
    out = []
    for number, line in enumerate(text.split("\n"), start=1):
        if line.endswith("\r"):
            line = line[:-1]
        if "\r" in line:
            raise Unreadable(f"{path}:{number}: a carriage return inside a line")
        line = line.split("#", 1)[0]
        if line.strip():
            out.append((number, line))
    return out


NAME = r"[A-Za-z_][A-Za-z0-9_.']*"
TERM = re.compile(r"\s*([+-])?\s*(?:([0-9]+)\s*\*\s*)?(" + NAME + r")\s*")


def read_cells(path):
    """A cell list (docs/formats.md, "Cell lists"): `0 NAME` or `DIM NAME : CHAIN`."""
    cx = Complex()
    declared = {}
    for number, line in text_lines(path):
        where = f"{path}:{number}"
        head, colon, chain_text = line.partition(":")
        parts = head.split()
        if len(parts) != 2 or not re.fullmatch(r"[0-9]+", parts[0]) or not re.fullmatch(NAME, parts[1]):
            raise Unreadable(f"{where}: expected `DIM NAME` or `DIM NAME : CHAIN`")
        k, name = int(parts[0]), parts[1]
        if name in declared:
            raise Unreadable(f"{where}: cell {name} is declared twice")
        if k == 0:
            if colon:
                raise Unreadable(f"{where}: a 0-cell has no boundary")
            boundary = {}
        else:
            if not colon:
                raise Unreadable(f"{where}: a {k}-cell needs `: CHAIN`")
            if k - 1 >= len(cx.names):
                raise Unreadable(f"{where}: no cells of dimension {k - 1} before this {k}-cell")
            boundary = {}
            s = chain_text.strip()
            if s != "0":
                pos, first = 0, True
                while pos < len(s):
                    m = TERM.match(s, pos)
                    if not m or (not first and m.group(1) is None) or m.end() == pos:
                        raise Unreadable(f"{where}: cannot read the chain `{s}`")
                    sign = -1 if m.group(1) == "-" else 1
                    coefficient = int(m.group(2)) if m.group(2) is not None else 1
                    if coefficient == 0:
                        raise Unreadable(f"{where}: a zero coefficient")
                    face = m.group(3)
                    if face not in cx.index[k - 1]:
                        raise Unreadable(f"{where}: {face} is not a {k - 1}-cell declared before")
                    i = cx.index[k - 1][face]
                    boundary[i] = boundary.get(i, 0) + sign * coefficient
                    pos, first = m.end(), False
                boundary = {i: c for i, c in boundary.items() if c != 0}
        declared[name] = k
        cx.add(k, name, boundary)
    return cx


def read_facets(path):
    """A facet list (docs/formats.md, "Facet lists"): the closure of the simplices listed,
    vertices numbered by first appearance, each simplex oriented by increasing number and
    named by its labels in that order joined by one space."""
    number_of = {}
    label_of = []
    simplices = set()
    for number, line in text_lines(path):
        labels = line.split()
        if len(set(labels)) != len(labels):
            raise Unreadable(f"{path}:{number}: a label written twice")
        for a in labels:
            if a not in number_of:
                number_of[a] = len(label_of)
                label_of.append(a)
        simplices.add(tuple(sorted(number_of[a] for a in labels)))
    closure = set()
    for s in simplices:
        for mask in range(1, 1 << len(s)):
            closure.add(tuple(v for i, v in enumerate(s) if mask >> i & 1))
    cx = Complex()
    top = max((len(s) - 1 for s in closure), default=-1)
    for k in range(top + 1):
        for s in sorted(c for c in closure if len(c) == k + 1):
            boundary = {}
            if k > 0:
                for i in range(len(s)):
                    face = " ".join(label_of[v] for v in s[:i] + s[i + 1:])
                    boundary[cx.index[k - 1][face]] = (-1) ** i
            cx.add(k, " ".join(label_of[v] for v in s), boundary)
    return cx


def read_complex(path):
    ext = os.path.splitext(path)[1].lower()
    if ext == ".cells":
        return read_cells(path)
    if ext == ".facets":
        return read_facets(path)
    raise Unreadable(f"{path}: this checker reads .cells and .facets files only")


# ---- the derived complex D ------------------------------------------------------------------


class Map:
    """A map of D from degree `source` to degree `target`, by columns and by rows."""

    def __init__(self, name, source, target, columns, n_rows):
        self.name = name
        self.source = source
        self.target = target
        self.columns = columns  # columns[j] = {row: value}
        self.rows = [dict() for _ in range(n_rows)]
        for j, col in enumerate(columns):
            for i, v in col.items():
                self.rows[i][j] = v

    def apply(self, chain):
        out = {}
        for j, c in chain.items():
            for i, v in self.columns[j].items():
                out[i] = out.get(i, 0) + c * v
        return out

    def pull(self, cochain):
        """The cochain cochain∘M on the source degree."""
        out = {}
        for i, c in cochain.items():
            for j, v in self.rows[i].items():
                out[j] = out.get(j, 0) + c * v
        return out


class Derived:
    """D for a certificate's kind: cells[deg] names, maps by the certificate's "dimension"."""

    def __init__(self, x, kind, marks):
        self.kind = kind
        self.x = x
        top = x.top()
        self.top = top
        self.cells = {}  # degree -> list of X-names (the cells of D of that degree)
        self.position = {}  # degree -> {name: position in D}
        self.dropped = {}  # degree -> names of X that are zero in D (relative: the cells of A)
        self.maps = {}
        keep = {}
        for k in range(top + 1):
            keep[k] = [i for i in range(len(x.names[k])) if not (marks and x.names[k][i] in marks[k])]
            self.cells[k] = [x.names[k][i] for i in keep[k]]
            self.position[k] = {n: p for p, n in enumerate(self.cells[k])}
            self.dropped[k] = set(marks[k]) if marks else set()
        if kind == "reduced":
            self.cells[-1] = ["*"]
            self.position[-1] = {"*": 0}
            self.dropped[-1] = set()
        if kind == "cohomology":
            for k in range(top):
                rows = len(self.cells[k + 1])
                columns = [dict() for _ in self.cells[k]]
                for j, b in enumerate(x.bd[k + 1]):
                    for i, v in b.items():
                        columns[i][j] = v
                self.maps[k] = Map(f"δ_{k}", k, k + 1, columns, rows)
        else:
            for k in range(1, top + 1):
                new_row = {old: p for p, old in enumerate(keep[k - 1])}
                columns = []
                for old in keep[k]:
                    columns.append({new_row[i]: v for i, v in x.bd[k][old].items() if i in new_row})
                name = f"∂_{k} of C(X)/C(A)" if kind == "relative" else f"∂_{k}"
                self.maps[k] = Map(name, k, k - 1, columns, len(keep[k - 1]))
            if kind == "reduced" and top >= 0:
                self.maps[0] = Map("ε (the augmentation)", 0, -1, [{0: 1} for _ in self.cells[0]], 1)

    def group(self, g):
        if self.kind == "reduced":
            return f"H̃_{g}"
        if self.kind == "relative":
            return f"H_{g}(X, A)"
        if self.kind == "cohomology":
            return f"H^{g}"
        return f"H_{g}"

    def printed_group(self, g):
        return self.group(g).replace("H̃", "H~")

    def out_map(self, g):
        return self.maps.get(g)

    def in_map(self, g):
        return self.maps.get(g - 1 if self.kind == "cohomology" else g + 1)

    def count(self, g):
        return len(self.cells.get(g, []))


def read_marks(x, x_path, sub_path):
    """The cells of SUB found in X by name: marks[k] = set of names."""
    sub = read_complex(sub_path)
    if os.path.splitext(sub_path)[1].lower() != os.path.splitext(x_path)[1].lower():
        raise Unreadable(f"{sub_path}: SUB must be in FILE's format")
    facets = os.path.splitext(sub_path)[1].lower() == ".facets"

    def key(name):  # a simplex is found by its set of labels, a cell of a cell list by its name
        return frozenset(name.split(" ")) if facets else name

    in_x = [{key(n): n for n in names} for names in x.names]
    marks = [set() for _ in range(x.top() + 1)]
    for k, names in enumerate(sub.names):
        for name in names:
            if k > x.top() or key(name) not in in_x[k]:
                raise Unreadable(f"{sub_path}: the {k}-cell {name} is not a cell of {x_path}")
            marks[k].add(in_x[k][key(name)])
    return marks


# ---- the certificate ------------------------------------------------------------------------


def load_certificate(path):
    try:
        with open(path, "rb") as f:
            data = json.loads(f.read().decode("utf-8"))
    except OSError as e:
        raise Unreadable(f"{path}: cannot be read ({e.strerror})")
    except (UnicodeDecodeError, json.JSONDecodeError) as e:
        raise Unreadable(f"{path}: not JSON ({e})")
    if not isinstance(data, dict) or data.get("certificate") != VERSION:
        raise Unreadable(f"{path}: not a certificate (\"certificate\" must be \"{VERSION}\")")
    if data.get("coefficients") not in ("Z", "Z/2"):
        raise Unreadable(f"{path}: \"coefficients\" must be \"Z\" or \"Z/2\"")
    kind = data.get("kind", "absolute")
    if kind not in ("absolute", "reduced", "relative", "cohomology"):
        raise Unreadable(f"{path}: unknown kind {kind!r}")
    for key in ("cells", "groups", "rank_witnesses"):
        if not isinstance(data.get(key), list):
            raise Unreadable(f"{path}: \"{key}\" must be a list")
    return data


def is_int(v):
    return isinstance(v, int) and not isinstance(v, bool)


class Reader:
    """Turns the certificate's named chains into {position in D: coefficient}."""

    def __init__(self, d, path, modulus):
        self.d = d
        self.path = path
        self.modulus = modulus

    def chain(self, terms, degree, what):
        if not isinstance(terms, list):
            raise Unreadable(f"{self.path}: {what} is not a list of terms")
        out, seen = {}, set()
        known = self.d.position.get(degree, {})
        for t in terms:
            if not (isinstance(t, list) and len(t) == 2 and is_int(t[0]) and isinstance(t[1], str)):
                raise Unreadable(f"{self.path}: {what}: a term must be [integer, \"cell\"]")
            c, name = t
            if c == 0 or (self.modulus == 2 and c != 1):
                raise Unreadable(f"{self.path}: {what}: coefficient {c} on {name}")
            if name in seen:
                raise Unreadable(f"{self.path}: {what}: cell {name} named twice")
            seen.add(name)
            if name in known:
                out[known[name]] = c
            elif name not in self.d.dropped.get(degree, ()):
                raise Unreadable(f"{self.path}: {what}: {name} is not a {degree}-cell of the input")
        return out

    def cell(self, name, degree, what):
        known = self.d.position.get(degree, {})
        if not isinstance(name, str):
            raise Unreadable(f"{self.path}: {what}: a cell is named by a string")
        if name in known:
            return known[name]
        if name in self.d.dropped.get(degree, ()):
            return None  # a cell of A: not a row or column of the quotient
        raise Unreadable(f"{self.path}: {what}: {name} is not a {degree}-cell of the input")


# ---- arithmetic -----------------------------------------------------------------------------


def reduce(chain, modulus):
    if modulus:
        return {i: c % modulus for i, c in chain.items() if c % modulus}
    return {i: c for i, c in chain.items() if c}


def is_prime(p):
    if p < 2:
        return False
    f = 2
    while f * f <= p:
        if p % f == 0:
            return False
        f += 1
    return True


def eliminate(columns_of, pivots, modulus, unimodular, extra_columns=(), extra_rows=()):
    """Gaussian elimination of the minor at `pivots` [(row, column), ...] in the order given:
    each column is reduced by the earlier pivot columns in pivot order (left-looking), over
    F_modulus, or over Z when modulus is None, where every pivot must be +-1 (unimodular).
    Returns (None, reduced extra columns restricted to extra_rows) or (index, value) of the
    first pivot that fails."""
    rows = {r for r, _ in pivots} | set(extra_rows)
    reduced = []
    for n, (r, c) in enumerate(pivots):
        v = {i: x for i, x in columns_of(c).items() if i in rows}
        for (rj, _), (uj, pj) in zip(pivots[:n], reduced):
            a = v.get(rj, 0)
            if a:
                f = a * pow(pj, -1, modulus) % modulus if modulus else a * pj  # pj = +-1: 1/pj = pj
                for i, x in uj.items():
                    v[i] = v.get(i, 0) - f * x
                v = reduce(v, modulus)
        p = v.get(r, 0)
        if modulus:
            p %= modulus
        if p == 0 or (unimodular and p not in (1, -1)):
            return (n, p), None
        reduced.append((v, p))
    out = []
    for c in extra_columns:
        v = {i: x for i, x in columns_of(c).items() if i in rows}
        for (rj, _), (uj, pj) in zip(pivots, reduced):
            a = v.get(rj, 0)
            if a:
                f = a * pj
                for i, x in uj.items():
                    v[i] = v.get(i, 0) - f * x
                v = reduce(v, modulus)
        out.append(v)
    return None, out


def bareiss_determinant(m):
    """The determinant of a square integer matrix by fraction-free elimination (Bareiss 1968):
    every division is exact, so the numbers stay integers."""
    n = len(m)
    if n == 0:
        return 1
    a = [row[:] for row in m]
    sign, previous = 1, 1
    for k in range(n - 1):
        if a[k][k] == 0:
            swap = next((i for i in range(k + 1, n) if a[i][k] != 0), None)
            if swap is None:
                return 0
            a[k], a[swap] = a[swap], a[k]
            sign = -sign
        for i in range(k + 1, n):
            for j in range(k + 1, n):
                a[i][j] = (a[i][j] * a[k][k] - a[i][k] * a[k][j]) // previous
        previous = a[k][k]
    return sign * a[n - 1][n - 1]


# ---- the checks -----------------------------------------------------------------------------


class Checker:
    def __init__(self, x, cert, path, marks):
        self.cert = cert
        self.path = path
        self.kind = cert.get("kind", "absolute")
        self.modulus = 2 if cert["coefficients"] == "Z/2" else None
        if self.kind == "relative" and marks is None:
            raise Unreadable("a certificate of relative homology needs SUB, the subcomplex")
        if self.kind != "relative" and marks is not None:
            raise Unreadable(f"SUB is given but the certificate's kind is {self.kind}")
        self.x = x
        self.marks = marks
        self.d = Derived(x, self.kind, marks)
        self.read = Reader(self.d, path, self.modulus)
        self.checks = 0

    def ok(self, condition, message):
        self.checks += 1
        if not condition:
            raise Invalid(message)

    def run(self):
        x, d, cert = self.x, self.d, self.cert
        counts = [len(n) for n in x.names]
        if cert["cells"] != counts:  # a certificate of another file (the C++ reader also refuses it)
            raise Unreadable(f"{self.path}: the certificate counts cells {cert['cells']}, the input has {counts}")
        if self.kind == "reduced":
            self.ok(x.top() >= 0, "the reduced homology of the empty complex is not certified")
        if self.kind == "relative":
            self.check_closed_under_faces()
        self.check_chain_complex()
        groups = cert["groups"]
        self.ok(len(groups) == x.top() + 1,
                f"the certificate has {len(groups)} groups for a complex of dimension {x.top()}")
        parsed = [self.check_group(g, groups[g]) for g in range(len(groups))]
        rho = self.check_rank_witnesses()
        for g, (rank, _) in enumerate(parsed):
            bound = d.count(g) - rho.get(g, 0) - rho.get(self.in_key(g), 0)
            self.ok(bound == rank, f"{d.group(g)}: the rank witnesses bound the free rank by {bound}, "
                    f"not the claimed rank {rank}")
        if self.kind == "reduced":
            # H~_{-1} = H_{-1}(D) = 0: one cell, and epsilon of rank 1 (its witness has one pivot).
            self.ok(1 - rho.get(0, 0) == 0, "H̃_-1: ε is not witnessed of rank 1")
        self.check_torsion(parsed, rho)
        return parsed

    def in_key(self, g):
        return g - 1 if self.kind == "cohomology" else g + 1

    def check_closed_under_faces(self):
        x = self.x
        for k in range(1, x.top() + 1):
            for i, b in enumerate(x.bd[k]):
                if x.names[k][i] in self.marks[k]:
                    for f, v in b.items():
                        self.ok(x.names[k - 1][f] in self.marks[k - 1],
                                f"A is not a subcomplex: {k}-cell {x.names[k][i]} is in A, its face "
                                f"{x.names[k - 1][f]} is not")

    def check_chain_complex(self):
        for key, m in sorted(self.d.maps.items()):
            after = self.d.maps.get(key + 1 if self.kind == "cohomology" else key - 1)
            if after is None:
                continue
            for j, col in enumerate(m.columns):
                image = reduce(after.apply(col), self.modulus)
                self.ok(not image, f"the complex is not a chain complex: {after.name} ∘ {m.name} is not zero "
                        f"on the {m.source}-cell {self.d.cells[m.source][j]}")

    def check_group(self, g, obj):
        d, rd, mod = self.d, self.read, self.modulus
        H = d.group(g)
        if not isinstance(obj, dict) or obj.get("dimension") != g:
            raise Unreadable(f"{self.path}: group {g} is not labelled \"dimension\": {g}")
        rank, torsion, gens = obj.get("rank"), obj.get("torsion"), obj.get("generators")
        if not (is_int(rank) and rank >= 0 and isinstance(torsion, list) and all(is_int(t) for t in torsion)
                and isinstance(gens, list)):
            raise Unreadable(f"{self.path}: {H}: \"rank\", \"torsion\" and \"generators\" are malformed")
        self.ok(len(gens) == rank + len(torsion),
                f"{H}: {len(gens)} generators for rank {rank} and {len(torsion)} torsion factors")
        orders = [0] * rank + list(torsion)
        for j, gen in enumerate(gens):
            if not isinstance(gen, dict) or gen.get("order") != orders[j]:
                raise Unreadable(f"{self.path}: {H}: generator {j} has an order that disagrees with \"torsion\"")
        for i, t in enumerate(torsion):
            label = f"{H} torsion factor {i} (order {t})"
            # Over Z/2 every element is zero or a unit: a field has no torsion.
            self.ok(mod is None and t not in (0, 1, -1), f"{label}: an order must be neither zero nor a unit")
            if i + 1 < len(torsion):
                self.ok(torsion[i + 1] % t == 0, f"{label}: does not divide the next factor {torsion[i + 1]}")

        def which(j):
            return f"generator {j}" if j < rank else f"torsion factor {j - rank} (order {orders[j]})"

        def label(j):
            return f"{H} {which(j)}"

        out_m, in_m = d.out_map(g), d.in_map(g)
        z, phi = [], []
        for j, gen in enumerate(gens):
            z.append(rd.chain(gen.get("chain"), g, f"{label(j)}: chain"))
            phi.append(rd.chain(gen.get("cocycle"), g, f"{label(j)}: cocycle"))
        for j in range(len(gens)):
            self.ok(bool(reduce(z[j], mod)), f"{label(j)}: the generator is the zero chain")
            if out_m is not None:
                self.ok(not reduce(out_m.apply(z[j]), mod), f"{label(j)}: the generator is not a cycle of D "
                        f"({out_m.name} of it is not zero)")
        for j in range(rank, len(gens)):
            t = orders[j]
            if "bounding_chain" not in gens[j]:
                raise Unreadable(f"{self.path}: {label(j)}: no \"bounding_chain\"")
            source = in_m.source if in_m is not None else None
            w = rd.chain(gens[j]["bounding_chain"], source, f"{label(j)}: bounding chain") if in_m else {}
            image = in_m.apply(w) if in_m is not None else {}
            want = {i: t * c for i, c in z[j].items()}
            diff = reduce({i: image.get(i, 0) - want.get(i, 0) for i in set(image) | set(want)}, mod)
            self.ok(not diff, f"{label(j)}: the boundary of its bounding chain is not {t} times the generator")
        for j in range(len(gens)):
            m = orders[j] if j >= rank else mod
            if in_m is not None:
                self.ok(not reduce(in_m.pull(phi[j]), m),
                        f"{label(j)}: its cocycle does not vanish on boundaries" + (f" modulo {m}" if m else ""))
        # The pairing as a sparse product: for each generator, the cocycles met on its cells.
        on_cell = {}
        for j, f in enumerate(phi):
            for i, c in f.items():
                on_cell.setdefault(i, []).append((j, c))
        for l, zl in enumerate(z):
            pairing = {}
            for i, c in zl.items():
                for j, v in on_cell.get(i, ()):
                    pairing[j] = pairing.get(j, 0) + v * c
            for j in range(len(gens)):
                m = orders[j] if j >= rank else mod
                value = pairing.get(j, 0) % m if m else pairing.get(j, 0)
                self.ok(value == (1 if j == l else 0),
                        f"{label(l)}: the cocycle of {which(j)} pairs with it to {value}, not {1 if j == l else 0}"
                        + (f" modulo {m}" if m else ""))
        return rank, list(torsion)

    def check_rank_witnesses(self):
        """rho[key] = the number of pivots witnessed for each map of D."""
        rho, seen = {}, set()
        for w in self.cert["rank_witnesses"]:
            if not isinstance(w, dict) or not is_int(w.get("dimension")):
                raise Unreadable(f"{self.path}: a rank witness without an integer \"dimension\"")
            key = w["dimension"]
            if key not in self.d.maps:
                raise Unreadable(f"{self.path}: a rank witness for a map this kind of complex does not have ({key})")
            if key in seen:
                raise Unreadable(f"{self.path}: two rank witnesses of dimension {key}")
            seen.add(key)
            form = next((f for f in RANK_WITNESS_FORMS if f in w), None)
            if form is None:
                raise Unreadable(f"{self.path}: a rank witness of a form this checker does not know")
            rho[key] = RANK_WITNESS_FORMS[form](self, self.d.maps[key], w)
        for key, m in self.d.maps.items():
            self.ok(key in seen, f"{m.name}: no rank witness")
        return rho

    def pivot_list(self, m, pairs, what):
        if not isinstance(pairs, list):
            raise Unreadable(f"{self.path}: {what} is not a list")
        out = []
        for p in pairs:
            if not (isinstance(p, list) and len(p) == 2):
                raise Unreadable(f"{self.path}: {what}: a pivot is [row, column]")
            r = self.read.cell(p[0], m.target, what)
            c = self.read.cell(p[1], m.source, what)
            self.ok(r is not None and c is not None, f"{m.name}: {what} names a cell of A")
            out.append((r, c))
        return out

    def check_torsion(self, parsed, rho):
        tw = self.cert.get("torsion_witnesses")
        if self.modulus:
            return
        if tw is None:
            raise Incomplete("the certificate has no torsion witnesses, so it proves each group only up to a "
                             "finite summand that may hold torsion left out")
        if not isinstance(tw, list):
            raise Unreadable(f"{self.path}: \"torsion_witnesses\" must be a list")
        by_key = {}
        for w in tw:
            if not isinstance(w, dict) or not is_int(w.get("dimension")) or w["dimension"] not in self.d.maps:
                raise Unreadable(f"{self.path}: a torsion witness without the \"dimension\" of a map")
            if w["dimension"] in by_key:
                raise Unreadable(f"{self.path}: two torsion witnesses of dimension {w['dimension']}")
            by_key[w["dimension"]] = w
        for key in sorted(self.d.maps):
            m = self.d.maps[key]
            g = m.target
            P = math.prod(parsed[g][1]) if 0 <= g < len(parsed) else 1
            H = self.d.group(g)
            n = rho.get(key, 0)
            if n == 0:
                self.ok(P == 1, f"{H}: {m.name} is zero, so {H} has no torsion")
                continue
            if key not in by_key:
                if self.kind == "reduced" and key == 0:
                    continue  # ε: its 1x1 minor at the rank witness's pivot is 1 (built, not stored)
                self.ok(False, f"{H}: no torsion witness for {m.name}")
            w = by_key[key]
            pivots = self.pivot_list(m, w.get("pivots"), "a torsion witness's pivots")
            minors = w.get("minors")
            self.ok(isinstance(minors, list) and len(minors) > 0, f"{H}: the torsion witness of {m.name} has no minor")
            blocks = []
            for b in minors:
                if not (isinstance(b, dict) and isinstance(b.get("rows"), list) and isinstance(b.get("columns"), list)):
                    raise Unreadable(f"{self.path}: a minor needs \"rows\" and \"columns\"")
                rows = [self.read.cell(r, m.target, "a minor's rows") for r in b["rows"]]
                cols = [self.read.cell(c, m.source, "a minor's columns") for c in b["columns"]]
                self.ok(None not in rows and None not in cols, f"{H}: a minor of {m.name} names a cell of A")
                all_rows = [r for r, _ in pivots] + rows
                all_cols = [c for _, c in pivots] + cols
                self.ok(len(all_rows) == n and len(all_cols) == n,
                        f"{H}: a minor is not of size ρ = {n} = rank {m.name}")
                self.ok(len(set(all_rows)) == n and len(set(all_cols)) == n,
                        f"{H}: a minor of {m.name} names a cell twice")
                blocks.append((rows, cols))
            union_rows = sorted({r for rows, _ in blocks for r in rows})
            union_cols = sorted({c for _, cols in blocks for c in cols})
            failed, schur = eliminate(lambda c: m.columns[c], pivots, None, True, union_cols, union_rows)
            if failed is not None:
                n_at, value = failed
                self.ok(False, f"{H}: pivot {n_at} of the torsion witness of {m.name} is {value} when its turn "
                        f"comes, not ±1")
            S = dict(zip(union_cols, schur))
            g_det = 0
            for rows, cols in blocks:
                det = bareiss_determinant([[S[c].get(r, 0) for c in cols] for r in rows])
                g_det = math.gcd(g_det, det)
            self.ok(g_det == abs(P), f"{H}: the gcd of the determinants of the {len(blocks)} minors is {g_det}, "
                    f"the claimed torsion factors multiply to {P}")


def rank_by_pivots(checker, m, w):
    """A rank witness {"prime": p, "pivots": [[row, column], ...]}: elimination of the minor
    modulo p along the pivots in order meets no zero pivot, so its determinant is the product
    of the pivots, non-zero mod p, and rank m >= len(pivots) over Q (and over F_p)."""
    p = w.get("prime")
    if not is_int(p):
        raise Unreadable(f"{checker.path}: the rank witness of {m.name} has no integer \"prime\"")
    checker.ok(is_prime(p) and p < 2 ** 32, f"{m.name}: {p} is not a prime below 2^32")
    if checker.modulus:
        checker.ok(p == checker.modulus, f"{m.name}: works modulo {p}, not the characteristic {checker.modulus}")
    pivots = checker.pivot_list(m, w["pivots"], "a rank witness's pivots")
    checker.ok(len({r for r, _ in pivots}) == len(pivots) and len({c for _, c in pivots}) == len(pivots),
               f"{m.name}: rows or columns repeated")
    failed, _ = eliminate(lambda c: m.columns[c], pivots, p, False)
    if failed is not None:
        checker.ok(False, f"{m.name}: pivot {failed[0]} of the rank witness is zero modulo {p} when its turn comes")
    return len(pivots)


# Rank witness forms, by the key that tells them apart: a new form is one function here.
RANK_WITNESS_FORMS = {"pivots": rank_by_pivots}


def main(argv):
    if len(argv) not in (3, 4):
        print("usage: certificate_check.py FILE CERTIFICATE.json [SUB]", file=sys.stderr)
        return 2
    try:
        x = read_complex(argv[1])
        cert = load_certificate(argv[2])
        marks = read_marks(x, argv[1], argv[3]) if len(argv) == 4 else None
        checker = Checker(x, cert, argv[2], marks)
        try:
            groups = checker.run()
        except Incomplete as e:
            print(f"incomplete: {e}")
            return 3
    except Unreadable as e:
        print(str(e), file=sys.stderr)
        return 2
    except Invalid as e:
        print(f"invalid: {e}")
        return 1
    print(f"valid ({checker.checks} checks)")
    for g, (rank, torsion) in enumerate(groups):
        line = f"{checker.d.printed_group(g)}: rank {rank}"
        if torsion:
            line += ", torsion " + " ".join(str(t) for t in torsion)
        print(line)
    return 0


if __name__ == "__main__":
    sys.exit(main(sys.argv))
