#!/usr/bin/python3
"""The job of `govern run --quiet --json` on a frame `govern new` writes,
done with numpy and scipy, for the side-by-side timing of docs/performance.md.

    /usr/bin/python3 docs/perf/envelope.py MODEL.toml OUT.json

MODEL.toml is a starting model of `govern new` without column faces and
service combination (docs/perf/model.sh writes one). The script reads its
grid, sections, loads and spacing; it assumes the rest of that model:
fixed bases, dead load (self weight and an area load on every beam), floor
live and roof live loads placed span by span ("exact"), wind at line A,
the ASCE/SEI 7-16 strength combinations (below), 11 stations, variable
loads only where adverse, pieces at or below 1e-9 of the member's largest
effect left off. It does what govern does: one banded Cholesky
factorization (LAPACK dpbtrf) and one multi-column solve (dpbtrs) of every
load column, every member's end forces from its displacements, N, V and M
at every station by statics, the envelope over the combinations with the
forces acting with each extreme, the number of pieces loaded and the 16
most influential (each at least 1 % of the largest), the reactions'
envelope, the statics check of every case, and the JSON file. It is not
run by the tests; it is vectorised over members, stations and columns.
"""

import json
import sys
import time
import tomllib

import numpy as np
from scipy.linalg import cho_solve_banded, cholesky_banded

# ASCE/SEI 7-16 2.3.1 as govern expands it for cases D, L, Lr, W (W
# reversible): factors of D, L, Lr, W.
COMBOS = [
    ("2.3.1-1 1.4D", 1.4, 0, 0, 0),
    ("2.3.1-2 1.2D+1.6L+0.5Lr", 1.2, 1.6, 0.5, 0),
    ("2.3.1-3 1.2D+1.6Lr+1.0L", 1.2, 1.0, 1.6, 0),
    ("2.3.1-3 1.2D+1.6Lr+0.5W", 1.2, 0, 1.6, 0.5),
    ("2.3.1-3 1.2D+1.6Lr-0.5W", 1.2, 0, 1.6, -0.5),
    ("2.3.1-4 1.2D+1.0W+1.0L+0.5Lr", 1.2, 1.0, 0.5, 1.0),
    ("2.3.1-4 1.2D-1.0W+1.0L+0.5Lr", 1.2, 1.0, 0.5, -1.0),
    ("2.3.1-5 0.9D+1.0W", 0.9, 0, 0, 1.0),
    ("2.3.1-5 0.9D-1.0W", 0.9, 0, 0, -1.0),
]
STATIONS, ROUNDOFF, SHARE, LISTED = 11, 1e-9, 0.01, 16


def line(i):
    s = ""
    i += 1
    while i:
        i, r = divmod(i - 1, 26)
        s = chr(65 + r) + s
    return s


def main(model, out):
    t0 = time.perf_counter()
    m = tomllib.load(open(model, "rb"))
    g = m["grid"]
    bays, storeys, spacing = g["bays"], g["storeys"], g.get("spacing", 6.0)
    sec = {s["name"]: s for s in m["section"]}
    col, beam = sec[g["column"]], sec[g["beam"]]
    cases = {c["name"]: c for c in m["case"]}
    qd = sum(l["q"] for l in cases["D"]["load"] if l["type"] == "area") * spacing
    ql = cases["L"]["load"][0]["q"] * spacing
    qr = cases["Lr"]["load"][0]["q"] * spacing
    wind = {int(l["node"][1:]): l["fx"] for l in cases["W"]["load"] if l["type"] == "node"}
    B, S = len(bays), len(storeys)
    xs = np.concatenate([[0], np.cumsum(bays)])
    ys = np.concatenate([[0], np.cumsum(storeys)])

    # Members in govern's order: each storey's columns, then its beams.
    start, end, name, isbeam = [], [], [], []
    for j in range(1, S + 1):
        for i in range(B + 1):
            start.append((i, j - 1)); end.append((i, j)); isbeam.append(False)
            name.append(f"{line(i)}{j-1}-{line(i)}{j}")
        for i in range(1, B + 1):
            start.append((i - 1, j)); end.append((i, j)); isbeam.append(True)
            name.append(f"{line(i-1)}{j}-{line(i)}{j}")
    isbeam = np.array(isbeam)
    nm = len(name)
    x0 = np.array([xs[a[0]] for a in start]); y0 = np.array([ys[a[1]] for a in start])
    x1 = np.array([xs[a[0]] for a in end]); y1 = np.array([ys[a[1]] for a in end])
    L = np.hypot(x1 - x0, y1 - y0); c = (x1 - x0) / L; s = (y1 - y0) / L
    E = np.where(isbeam, beam["E"], col["E"]); A = np.where(isbeam, beam["A"], col["A"])
    I = np.where(isbeam, beam["I"], col["I"]); wself = np.where(isbeam, beam["weight"], col["weight"])

    # Equations: three a node above the base, level by level.
    def dofs(n):
        i, j = n
        return [-1] * 3 if j == 0 else [3 * ((j - 1) * (B + 1) + i) + d for d in range(3)]
    code = np.array([dofs(a) + dofs(b) for a, b in zip(start, end)])
    neq = 3 * (B + 1) * S

    k = np.zeros((nm, 6, 6))
    ea, ei = E * A / L, E * I / L
    for a, b in ((0, 0), (3, 3)):
        k[:, a, b] = ea
    k[:, 0, 3] = k[:, 3, 0] = -ea
    k[:, 1, 1] = k[:, 4, 4] = 12 * ei / L**2; k[:, 1, 4] = k[:, 4, 1] = -12 * ei / L**2
    k[:, 1, 2] = k[:, 2, 1] = k[:, 1, 5] = k[:, 5, 1] = 6 * ei / L
    k[:, 4, 2] = k[:, 2, 4] = k[:, 4, 5] = k[:, 5, 4] = -6 * ei / L
    k[:, 2, 2] = k[:, 5, 5] = 4 * ei; k[:, 2, 5] = k[:, 5, 2] = 2 * ei
    T = np.zeros((nm, 6, 6))
    for o in (0, 3):
        T[:, o, o] = c; T[:, o, o + 1] = s; T[:, o + 1, o] = -s; T[:, o + 1, o + 1] = c; T[:, o + 2, o + 2] = 1
    kg = np.einsum("mji,mjk,mkl->mil", T, k, T)

    kb = int(max(code.max(1) - np.where(code >= 0, code, 10**9).min(1)))
    ab = np.zeros((kb + 1, neq))
    for a in range(6):
        for b in range(6):
            ia, ib = code[:, a], code[:, b]
            ok = (ia >= 0) & (ib >= ia)
            np.add.at(ab, (kb + ia[ok] - ib[ok], ib[ok]), kg[ok, a, b])

    # Load columns: D, W, the L pieces (floor beams), the Lr pieces (roof).
    lpieces = np.where(isbeam & (np.arange(nm) < nm - B))[0]
    rpieces = np.where(isbeam & (np.arange(nm) >= nm - B))[0]
    pieces = np.concatenate([lpieces, rpieces])
    nl, nr = len(lpieces), len(rpieces)
    nc = 2 + len(pieces)
    # Gravity q (down) on each member in each column: local components.
    qD = wself + np.where(isbeam, qd, 0.0)
    qP = np.where(np.isin(pieces, lpieces), ql, qr)

    def fem(q, mm):  # fixed-end forces the nodes exert, local, gravity q
        qx, qy = -s[mm] * q, -c[mm] * q
        l = L[mm]
        return np.stack([-qx * l / 2, -qy * l / 2, -qy * l * l / 12, -qx * l / 2, -qy * l / 2, qy * l * l / 12], -1)
    femD = fem(qD, np.arange(nm))
    femP = fem(qP, pieces)
    rhs = np.zeros((neq + 1, nc))  # row neq: the held directions
    gD = np.einsum("mji,mj->mi", T, femD)
    for a in range(6):
        np.add.at(rhs, (np.where(code[:, a] >= 0, code[:, a], neq), 0), -gD[:, a])
    gP = np.einsum("mji,mj->mi", T[pieces], femP)
    for a in range(6):
        np.add.at(rhs, (np.where(code[pieces, a] >= 0, code[pieces, a], neq), 2 + np.arange(len(pieces))), -gP[:, a])
    for j, fx in wind.items():
        rhs[3 * ((j - 1) * (B + 1)), 1] += fx
    t1 = time.perf_counter()
    u = np.zeros((neq + 1, nc))
    u[:neq] = cho_solve_banded((cholesky_banded(ab, lower=False), False), rhs[:neq])
    t2 = time.perf_counter()

    F = np.array([x[1:] for x in COMBOS])  # (k, 4): D, L, Lr, W
    ownP = np.full(nm, -1); ownP[pieces] = 2 + np.arange(len(pieces))
    pl = slice(2, 2 + nl); pr = slice(2 + nl, nc)
    pnames = [f"L/{name[p]}" for p in lpieces] + [f"Lr/{name[p]}" for p in rpieces]
    qnames = np.array([json.dumps(n) for n in pnames])
    cnames = np.array([json.dumps(cb[0]) for cb in COMBOS])

    def envelope(v):
        """v: (3, m, ns, nc) effects of every column. Returns, per effect,
        max/min with combination, acting forces, pieces listed and loaded."""
        big = np.abs(v).max(axis=(2, 3)) * ROUNDOFF  # (3, m)
        noise = big[:, :, None, None]
        res = []
        sums = []  # per patterned case: pos, zero sums (j, q, m, ns) and counts
        for sl in (pl, pr):
            vv = v[..., sl]
            pos = vv > noise
            neg = vv < -noise
            fpos, fzero = pos.astype(float), (~(pos | neg)).astype(float)
            tot = vv.sum(-1)
            sp = np.stack([np.einsum("qmsp,msp->qms", vv, fpos[j]) for j in range(3)])
            sz = np.stack([np.einsum("qmsp,msp->qms", vv, fzero[j]) for j in range(3)])
            sums.append((sp, tot[None] - sp - sz, pos.sum(-1), neg.sum(-1), pos, neg, vv))
        D, W = v[..., 0], v[..., 1]
        for j in range(3):
            best = []
            for hi in (True, False):
                vals = []
                for kk in range(len(COMBOS)):
                    fd, fl, fr, fw = F[kk]
                    t = fd * D
                    a = fw * W[j]
                    if fw:
                        t = t + np.where((a > 0) if hi else (a < 0), fw * W, 0)
                    for f, sm in ((fl, sums[0]), (fr, sums[1])):
                        if f:
                            sp, sn = sm[0][j], sm[1][j]
                            t = t + f * (sp if hi == (f >= 0) else sn)
                    vals.append(t)
                vals = np.stack(vals)  # (k, 3, m, ns)
                kstar = np.argmax(vals[:, j], 0) if hi else np.argmin(vals[:, j], 0)
                with_ = np.take_along_axis(vals, kstar[None, None], 0)[0]
                # Pieces loaded and listed, ranked by factored size.
                loaded = np.zeros(kstar.shape, int)
                ranked = []
                for ci, (sm, col) in enumerate(((sums[0], 1), (sums[1], 2))):
                    f = F[kstar, col]
                    side = np.where(hi == (f >= 0), 0, 1)
                    cnt = np.where(side == 0, sm[2][j], sm[3][j])
                    loaded += np.where(f != 0, cnt, 0)
                    mask = np.where(side[..., None] == 0, sm[4][j], sm[5][j]) & (f[..., None] != 0)
                    a = np.where(mask, np.abs(sm[6][j]), 0.0)
                    cut = SHARE * a.max(-1, keepdims=True)
                    ranked.append(np.where((a >= cut) & mask, a * np.abs(f)[..., None], 0.0))
                r = np.concatenate(ranked, -1)
                kk_ = min(LISTED, r.shape[-1])
                top = np.argpartition(-r, kk_ - 1, -1)[..., :kk_]
                order = np.argsort(-np.take_along_axis(r, top, -1), -1, kind="stable")
                top = np.take_along_axis(top, order, -1)
                keep = np.take_along_axis(r, top, -1) > 0
                best.append((np.take_along_axis(vals[:, j], kstar[None], 0)[0], kstar, with_, top, keep, loaded))
            res.append(best)
        return res

    def num(x):
        return "%.10g" % (0.0 if x == 0 else x)

    o = open(out, "w")
    o.write('{\n "title": %s,\n "members": [' % json.dumps(m.get("title", "")))
    chunk = 128
    xs_rel = np.linspace(0, 1, STATIONS)
    for m0 in range(0, nm, chunk):
        mm = np.arange(m0, min(nm, m0 + chunk))
        ug = u[np.where(code[mm] >= 0, code[mm], neq)]  # (m, 6, nc)
        ul = np.einsum("mij,mjc->mic", T[mm], ug)
        f = np.einsum("mij,mjc->mic", k[mm], ul)
        f[:, :, 0] += femD[mm]
        own = ownP[mm]
        has = own >= 0
        f[np.where(has)[0], :, own[has]] += femP[own[has] - 2]
        x = L[mm, None] * xs_rel[None]  # (m, ns)
        N = np.broadcast_to(-f[:, None, 0, :], (len(mm), STATIONS, nc)).copy()
        V = np.broadcast_to(f[:, None, 1, :], (len(mm), STATIONS, nc)).copy()
        M = -f[:, None, 2, :] + x[..., None] * f[:, None, 1, :]
        # The members' own loads, exactly: dead load in column 0, a piece
        # in its own column.
        for q, cols, rows in ((qD[mm], np.zeros(len(mm), int), np.arange(len(mm))), (qP[own[has] - 2], own[has], np.where(has)[0])):
            qx, qy = -s[mm][rows] * q, -c[mm][rows] * q
            N[rows, :, cols] -= qx[:, None] * x[rows]
            V[rows, :, cols] += qy[:, None] * x[rows]
            M[rows, :, cols] += qy[:, None] * x[rows] ** 2 / 2
        env = envelope(np.stack([N, V, M]))
        # Every number of the chunk formatted at once (adding 0 turns -0
        # into 0), the lists of pieces joined station by station.
        fmt = lambda a: np.char.mod("%.10g", np.asarray(a) + 0.0)
        sx = fmt(x)
        parts = []
        for j in range(3):
            for val, kstar, with_, top, keep, loaded in env[j]:
                spans = [["[" + ", ".join(qnames[t[k]]) + "]" for t, k in zip(tr, kr)] for tr, kr in zip(top, keep)]
                parts.append((fmt(val), cnames[kstar], spans, loaded, fmt(with_[0]), fmt(with_[1]), fmt(with_[2])))
        for li, mi in enumerate(mm):
            o.write(',' if mi else '')
            o.write('\n  {"name": "%s", "stations": [' % name[mi])
            for si in range(STATIONS):
                o.write(',' if si else '')
                e = []
                for j, eff in enumerate("NVM"):
                    h, l = parts[2 * j], parts[2 * j + 1]
                    e.append(f'"{eff}": {{"max": {h[0][li, si]}, "max_by": {h[1][li, si]}, "max_spans": {h[2][li][si]}, "max_loaded": {h[3][li, si]}, '
                             f'"max_with": {{"N": {h[4][li, si]}, "V": {h[5][li, si]}, "M": {h[6][li, si]}}}, '
                             f'"min": {l[0][li, si]}, "min_by": {l[1][li, si]}, "min_spans": {l[2][li][si]}, "min_loaded": {l[3][li, si]}, '
                             f'"min_with": {{"N": {l[4][li, si]}, "V": {l[5][li, si]}, "M": {l[6][li, si]}}}}}')
                o.write('\n   {"x": %s, %s}' % (sx[li, si], ", ".join(e)))
            o.write('\n  ]}')
    o.write('\n ],\n "reactions": [')
    # Reactions: what the base nodes exert on the columns, global.
    base = np.where(y0 == 0)[0]
    ug = u[np.where(code[base] >= 0, code[base], neq)]
    fl = np.einsum("mij,mjc->mic", k[base], np.einsum("mij,mjc->mic", T[base], ug))
    fl[:, :, 0] += femD[base]
    fgl = np.einsum("mji,mjc->mic", T[base], fl)[:, :3]  # (m, 3, nc)
    renv = envelope(np.transpose(fgl, (1, 0, 2))[:, :, None, :])
    for bi, mi in enumerate(base):
        o.write('%s\n  {"node": "%s"' % ("," if bi else "", name[mi].split("-")[0]))
        for j, eff in enumerate(("Fx", "Fy", "M")):
            (vmax, kmax, _, _, _, lmax), (vmin, kmin, _, _, _, lmin) = renv[j]
            o.write(', "%s": {"max": %s, "max_by": "%s", "max_loaded": %d, "min": %s, "min_by": "%s", "min_loaded": %d}' % (
                eff, num(vmax[bi, 0]), COMBOS[kmax[bi, 0]][0], lmax[bi, 0], num(vmin[bi, 0]), COMBOS[kmin[bi, 0]][0], lmin[bi, 0]))
        o.write('}')
    # Statics of every case: the loads against the reactions.
    applied_fy = np.concatenate([[-(qD * L).sum()], [0.0], -qP * L[pieces]])
    applied_fx = np.zeros(nc); applied_fx[1] = sum(wind.values())
    rx, ry = fgl[:, 0].sum(0), fgl[:, 1].sum(0)
    size = np.abs(applied_fy) + np.abs(applied_fx)
    rel = (np.abs(rx + applied_fx) + np.abs(ry + applied_fy)) / size
    case_rel = [rel[0], rel[1], rel[pl].max(), rel[pr].max()]
    o.write('\n ],\n "statics": %s\n}\n' % json.dumps([{"case": n, "relative": float(r), "ok": bool(r < 1e-6)} for n, r in zip(("D", "W", "L", "Lr"), case_rel)]))
    o.close()
    t3 = time.perf_counter()
    print("equations %d, half-bandwidth %d, load columns %d; read and assemble %.2f s, factor and solve %.2f s, envelope and file %.2f s"
          % (neq, kb, nc, t1 - t0, t2 - t1, t3 - t2), file=sys.stderr)


if __name__ == "__main__":
    main(sys.argv[1], sys.argv[2])
