"""A straightforward interpreted implementation of the same strength solution, for the
speed comparison in README.md (not used by the program or its tests).

The member of the `solve` benchmark in benches/engine.rs: a 12-vertex polygon, three
strand layers, PCI two-branch curve, decompression strain, Whitney block clipped from the
outline, Brent's method on the neutral-axis depth. Run:  python3 benches/reference_solve.py
"""
import math
import timeit

OUTLINE = [(-24.0, 30.0), (-24.0, 26.0), (-5.0, 24.0), (-4.0, 6.0), (-12.0, 4.0), (-12.0, 0.0),
           (12.0, 0.0), (12.0, 4.0), (4.0, 6.0), (5.0, 24.0), (24.0, 26.0), (24.0, 30.0)]
LAYERS = [(2.0, 8 * 0.153, 165.0), (4.0, 6 * 0.153, 165.0), (28.0, 2 * 0.153, 0.0)]  # height, area, fse
FC, EPS_CU, EPS_MOD = 6.0, 0.003, 28500.0


def shoelace(pts):
    a = qx = ix = 0.0
    n = len(pts)
    for i in range(n):
        (x0, y0), (x1, y1) = pts[i], pts[(i + 1) % n]
        c = x0 * y1 - x1 * y0
        a += c
        qx += (y0 + y1) * c
        ix += (y0 * y0 + y0 * y1 + y1 * y1) * c
    return a / 2, qx / 6, ix / 12


def clip_above(pts, y0):
    out = []
    n = len(pts)
    for i in range(n):
        p, q = pts[i], pts[(i + 1) % n]
        pin, qin = p[1] >= y0, q[1] >= y0
        if qin:
            if not pin:
                t = (y0 - p[1]) / (q[1] - p[1])
                out.append((p[0] + t * (q[0] - p[0]), y0))
            out.append(q)
        elif pin:
            t = (y0 - p[1]) / (q[1] - p[1])
            out.append((p[0] + t * (q[0] - p[0]), y0))
    return out


def pci(eps):
    if eps <= 0.008592:
        return EPS_MOD * eps
    return 270.0 - 0.04 / (eps - 0.007)


def solve():
    a_, qx, ix = shoelace(OUTLINE)
    if a_ < 0:
        a_, qx, ix = -a_, -qx, -ix
    yc = qx / a_
    inertia = ix - a_ * yc * yc
    top = max(p[1] for p in OUTLINE)
    h = top - min(p[1] for p in OUTLINE)
    ec = 57000 * math.sqrt(FC * 1000) / 1000
    pe = sum(ar * f for _, ar, f in LAYERS)
    e = sum(ar * f * (yc - y) for y, ar, f in LAYERS) / pe
    pre = [f / EPS_MOD + pe / (a_ * ec) + pe * e * (yc - y) / (inertia * ec) for y, ar, f in LAYERS]
    beta1 = 0.85 - 0.05 * (FC - 4.0)

    def residual(c):
        a = min(beta1 * c, h)
        ca, cq, _ = shoelace(clip_above(OUTLINE, top - a)) if a > 0 else (0.0, 0.0, 0.0)
        cc = 0.85 * FC * abs(ca)
        t = 0.0
        for (y, ar, _), p in zip(LAYERS, pre):
            d = top - y
            share = min(max((a - (d - 0.25)) / 0.5, 0.0), 1.0)  # concrete displaced by steel in the block
            t += ar * (pci(p + EPS_CU * (d - c) / c) + 0.85 * FC * share)
        return cc - t

    # Brent's method, as usually written
    a, b = 1e-6 * h, h
    fa, fb = residual(a), residual(b)
    while fb < 0:
        b *= 2
        fb = residual(b)
    c, fc_ = a, fa
    d = e_ = b - a
    for _ in range(200):
        if fb * fc_ > 0:
            c, fc_ = a, fa
            d = e_ = b - a
        if abs(fc_) < abs(fb):
            a, b, c = b, c, b
            fa, fb, fc_ = fb, fc_, fb
        tol = 2e-16 * abs(b) + 1e-15 * h
        m = 0.5 * (c - b)
        if abs(m) <= tol or abs(fb) <= 1e-9 * 0.85 * FC * a_:
            return b
        if abs(e_) >= tol and abs(fa) > abs(fb):
            s = fb / fa
            if a == c:
                p, q = 2 * m * s, 1 - s
            else:
                q_, r = fa / fc_, fb / fc_
                p = s * (2 * m * q_ * (q_ - r) - (b - a) * (r - 1))
                q = (q_ - 1) * (r - 1) * (s - 1)
            if p > 0:
                q = -q
            p = abs(p)
            if 2 * p < min(3 * m * q - abs(tol * q), abs(e_ * q)):
                e_, d = d, p / q
            else:
                d = e_ = m
        else:
            d = e_ = m
        a, fa = b, fb
        b += d if abs(d) > tol else math.copysign(tol, m)
        fb = residual(b)
    return b


if __name__ == "__main__":
    n = 2000
    t = timeit.timeit(solve, number=n) / n
    print(f"c = {solve():.6f} in; one solve in {t * 1e6:.1f} microseconds (pure Python)")
