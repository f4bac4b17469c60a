"""Reference check: a straightforward interpreted implementation of `strainsheet check`.

What it is
    Plain Python 3.11 (standard library only: tomllib, json, math) that reads a package
    TOML and prints, per member and per check location, the main results of the
    flexural-strength check by strain compatibility (ACI 318-19). It is the "plain
    interpreted version" that the performance section of README.md compares
    `strainsheet check --json` against, and a second, independent reading of the method.

What it mirrors
    The Rust engine as of this writing: src/input/validate.rs (units, defaults, the
    strand and bar catalogue), src/section/ (polygons with holes, exact clipping at a
    depth, the 64-gon of equal area standing for a round void), src/material/ (beta1,
    Ec, fr, the PCI two-branch and power strand curves, elastic-perfectly-plastic bars),
    src/analysis/mod.rs and solve.rs (effective prestress, eps1, decompression strain
    eps2 on the precast section alone, Whitney block clipped from the outline, displaced
    concrete deducted for steel inside the block, Brent's method on force equilibrium,
    Mn) and src/analysis/checks.rs (transfer and development of strand, 25.4.8; phi of
    Table 21.2.2 and 21.2.3; the cracking moment, with the composite form and Mnc for
    topped members; the 1.2 Mcr minimum; the approximate fps of 20.3.2.3.1).
    It does not record a trace or the iteration log, write conclusions and notes in
    words, solve the other stress-block option for comparison, draw sketches or compute
    the moment-curvature curve, and it validates input only lightly (no range checks,
    no warnings): give it packages that `strainsheet check` accepts.

How to run it
    python3 benches/reference_check.py PACKAGE.toml > results.json
    python3 benches/reference_check.py PACKAGE.toml --compare RUST.json
        (RUST.json from `strainsheet check --json PACKAGE.toml`; prints the worst
        relative difference per field instead of the results)
    python3 benches/reference_check.py PACKAGE.toml --timings > results.json
        (also prints the time of each phase on standard error)

It is not used by the program, its tests or its benchmarks; it exists for the speed
comparison and as a cross-check of the numbers.
"""

import json
import math
import sys
import time
import tomllib

EPS_CU = 0.003
CLOSURE = 1e-9
F64_EPSILON = sys.float_info.epsilon
F64_MIN_POSITIVE = sys.float_info.min
INF = math.inf

# ---------------------------------------------------------------------------- units

IN_MM = 25.4
KIP_N = 4448.2216152605
KSI_MPA = 6.894757293168361
PCF_KGM3 = 16.01846337396014

# unit spellings -> (dimension, factor to "us" coherent units, factor to "si" coherent units)
UNIT_TABLE = [
    (("in", "inch", "inches"), "length", 1.0, IN_MM),
    (("ft", "feet", "foot"), "length", 12.0, 12.0 * IN_MM),
    (("mm",), "length", 1.0 / IN_MM, 1.0),
    (("cm",), "length", 10.0 / IN_MM, 10.0),
    (("m",), "length", 1000.0 / IN_MM, 1000.0),
    (("in2", "in^2", "in²", "sq in"), "area", 1.0, IN_MM * IN_MM),
    (("mm2", "mm^2", "mm²"), "area", 1.0 / (IN_MM * IN_MM), 1.0),
    (("cm2", "cm^2", "cm²"), "area", 100.0 / (IN_MM * IN_MM), 100.0),
    (("ksi",), "stress", 1.0, KSI_MPA),
    (("psi",), "stress", 1e-3, KSI_MPA * 1e-3),
    (("mpa", "n/mm2", "n/mm^2", "n/mm²"), "stress", 1.0 / KSI_MPA, 1.0),
    (("gpa",), "stress", 1000.0 / KSI_MPA, 1000.0),
    (("kpa",), "stress", 1e-3 / KSI_MPA, 1e-3),
    (("kip", "kips", "k"), "force", 1.0, KIP_N),
    (("lb", "lbf", "lbs"), "force", 1e-3, KIP_N * 1e-3),
    (("kn",), "force", 1000.0 / KIP_N, 1000.0),
    (("n",), "force", 1.0 / KIP_N, 1.0),
    (("kip-ft", "kip·ft", "kip ft", "k-ft", "ft-kip", "kipft"), "moment", 12.0, KIP_N * 12.0 * IN_MM),
    (("kip-in", "kip·in", "kip in", "k-in", "in-kip"), "moment", 1.0, KIP_N * IN_MM),
    (("lb-ft", "lb·ft", "ft-lb"), "moment", 12e-3, KIP_N * 12e-3 * IN_MM),
    (("lb-in", "lb·in", "in-lb"), "moment", 1e-3, KIP_N * 1e-3 * IN_MM),
    (("kn-m", "kn·m", "knm", "kn m", "kn*m"), "moment", 1e6 / (KIP_N * IN_MM), 1e6),
    (("n-mm", "n·mm", "nmm", "n mm"), "moment", 1.0 / (KIP_N * IN_MM), 1.0),
    (("pcf", "lb/ft3", "lb/ft^3", "lb/ft³"), "density", 1.0, PCF_KGM3),
    (("kg/m3", "kg/m^3", "kg/m³"), "density", 1.0 / PCF_KGM3, 1.0),
]
UNITS = {}
for _names, _dim, _to_us, _to_si in UNIT_TABLE:
    for _name in _names:
        UNITS[_name] = (_dim, _to_us, _to_si)


def shown_to_coherent(system, dim):
    """What a bare input number is multiplied by to reach the engine's units."""
    if system == "us" and dim == "moment":
        return 12.0
    if system == "si" and dim == "force":
        return 1e3
    if system == "si" and dim == "moment":
        return 1e6
    return 1.0


def quantity(value, dim, system):
    """An input value (a number in the shown unit, or a string naming its unit) in the
    engine's coherent units (in, ksi, kip, kip-in; or mm, MPa, N, N-mm)."""
    if isinstance(value, (int, float)) and not isinstance(value, bool):
        return float(value) * shown_to_coherent(system, dim)
    text = str(value).strip()
    split = len(text)
    for i, ch in enumerate(text):
        if ch not in "0123456789._+-eE":
            split = i
            break
    number = float(text[:split].replace("_", ""))
    unit = text[split:].strip()
    if not unit:
        return number * shown_to_coherent(system, dim)
    found = UNITS.get(unit.lower())
    if found is None:
        raise ValueError(f"unknown unit {unit!r} in {text!r}")
    if found[0] != dim:
        raise ValueError(f"{text!r} is not a {dim}")
    return number * (found[1] if system == "us" else found[2])


class Conv:
    """Factors from coherent forces and moments to the shown units (kip, kip-ft / kN, kN-m)."""

    def __init__(self, system):
        self.kf = 1.0 / shown_to_coherent(system, "force")
        self.km = 1.0 / shown_to_coherent(system, "moment")
        self.s_div = 1.0 / self.km


# ------------------------------------------------------------------------- geometry


def ring_moments(points):
    """Area, first moments and second moment about x = 0 of a closed ring (Green's
    theorem); returns (area, qx, qy, ix), signed by the ring's orientation."""
    a2 = qx6 = qy6 = ix12 = 0.0
    n = len(points)
    for i in range(n):
        # edges in order, the last one closing the ring back to the first point
        px, py = points[i]
        qx_, qy_ = points[i + 1] if i + 1 < n else points[0]
        cross = px * qy_ - qx_ * py
        a2 += cross
        qx6 += (py + qy_) * cross
        qy6 += (px + qx_) * cross
        ix12 += (py * py + py * qy_ + qy_ * qy_) * cross
    return (a2 / 2.0, qx6 / 6.0, qy6 / 6.0, ix12 / 12.0)


def clip_above(ring, y0):
    """The ring clipped to the half-plane y >= y0 (Sutherland-Hodgman against one line,
    which is exact for the area integrals of any simple ring)."""
    out = []
    n = len(ring)
    for i in range(n):
        p = ring[i]
        q = ring[(i + 1) % n]
        p_in = p[1] >= y0
        q_in = q[1] >= y0
        if q_in:
            if not p_in:
                t = (y0 - p[1]) / (q[1] - p[1])
                out.append((p[0] + t * (q[0] - p[0]), y0))
            out.append(q)
        elif p_in:
            t = (y0 - p[1]) / (q[1] - p[1])
            out.append((p[0] + t * (q[0] - p[0]), y0))
    return out


class Region:
    """A polygon with holes: outline counter-clockwise, holes clockwise, each ring with
    its height range and full moments kept for clipping."""

    def __init__(self, outline, holes):
        outline = [tuple(p) for p in outline]
        if ring_moments(outline)[0] < 0.0:
            outline.reverse()
        fixed = []
        for h in holes:
            h = [tuple(p) for p in h]
            if ring_moments(h)[0] > 0.0:
                h.reverse()
            fixed.append(h)
        self.outline = outline
        self.holes = fixed
        self.rings = [outline] + fixed
        self.info = []
        for ring in self.rings:
            ys = [p[1] for p in ring]
            self.info.append((min(ys), max(ys), ring_moments(ring)))

    def moments(self):
        area = qx = qy = ix = 0.0
        for _, _, m in self.info:
            area += m[0]
            qx += m[1]
            qy += m[2]
            ix += m[3]
        return (area, qx, qy, ix)

    def above(self, y0):
        """Area and first moment (about y = 0) of the part with y >= y0."""
        area = qx = 0.0
        for ring, (y_min, y_max, full) in zip(self.rings, self.info):
            if y0 <= y_min:
                area += full[0]
                qx += full[1]
            elif y0 < y_max:
                m = ring_moments(clip_above(ring, y0))
                area += m[0]
                qx += m[1]
        return area, qx

    def y_top(self):
        return self.info[0][1]

    def y_bot(self):
        return self.info[0][0]

    def width_at(self, y):
        """Concrete width cut by the line at y (outline chords less hole chords)."""

        def chords(ring):
            xs = []
            n = len(ring)
            for i in range(n):
                p = ring[i]
                q = ring[(i + 1) % n]
                if (p[1] <= y) != (q[1] <= y):
                    t = (y - p[1]) / (q[1] - p[1])
                    xs.append(p[0] + t * (q[0] - p[0]))
            xs.sort()
            total = 0.0
            for k in range(0, len(xs) - 1, 2):
                total += xs[k + 1] - xs[k]
            return total

        w = chords(self.outline)
        for h in self.holes:
            w -= chords(h)
        return max(w, 0.0)

    def top_extent(self):
        top = self.y_top()
        tol = 1e-9 * max(abs(top - self.y_bot()), 1.0)
        xs = [p[0] for p in self.outline if abs(p[1] - top) <= tol]
        return min(xs), max(xs)


class Props:
    """Section properties about the centroid, from the region's moments."""

    def __init__(self, moments, y_top, y_bot):
        area, qx, _, ix = moments
        self.area = area
        self.yc = qx / area
        self.i = ix - area * self.yc * self.yc
        self.y_top = y_top
        self.y_bot = y_bot

    def cb(self):
        return self.yc - self.y_bot

    def sb(self):
        return self.i / self.cb()


VOID_SIDES = 64


def unit_void():
    """A regular 64-gon of area pi (a circle of unit radius, circumradius enlarged so the
    area is kept), first vertex at the top, counter-clockwise."""
    t = 2.0 * math.pi / VOID_SIDES
    r = math.sqrt(t / math.sin(t))
    pts = []
    for k in range(VOID_SIDES):
        a = math.pi / 2.0 + t * k
        pts.append((r * math.cos(a), r * math.sin(a)))
    return pts


UNIT_VOID = unit_void()


def void_polygon(cx, cy, d):
    r = d / 2.0
    return [(cx + r * p[0], cy + r * p[1]) for p in UNIT_VOID]


class Shape:
    """A precast shape: its name, dimensions, region, top flange (for the approximate
    method) and the name of the zone a block of a given depth reaches."""

    def __init__(self, kind, dims, region, flange):
        self.kind = kind
        self.dims = dims
        self.region = region
        self.flange = flange  # (b, hf, bw) or None

    def zone(self, depth):
        k, d = self.kind, self.dims
        if k in ("tee", "double_tee"):
            return "flange" if depth <= d["flange_thickness"] else "web"
        if k == "i_girder":
            hf = d["top_flange_thickness"]
            if depth <= hf:
                return "top flange"
            if depth <= hf + d["top_taper"]:
                return "top flange taper"
            return "web"
        if k == "inverted_tee":
            return "stem" if depth <= d["height"] - d["ledge_height"] else "ledge"
        if k == "hollow_core":
            if depth <= d["height"] - d["void_center_height"] - d["void_diameter"] / 2.0:
                return "top flange"
            return "void region"
        if k == "rectangle":
            return "rectangular section"
        return "section"


def build_shape(sec, system):
    kind = sec["shape"]

    def dim(key, default=None):
        if key not in sec:
            if default is None:
                raise ValueError(f"section: {key} is missing for shape {kind}")
            return default
        return quantity(sec[key], "length", system)

    if kind == "rectangle":
        w, h = dim("width"), dim("height")
        x = w / 2.0
        region = Region([(-x, 0.0), (x, 0.0), (x, h), (-x, h)], [])
        return Shape(kind, {"width": w, "height": h}, region, None)
    if kind == "tee":
        bf, hf, bw, h = dim("flange_width"), dim("flange_thickness"), dim("web_width"), dim("height")
        f, w, y = bf / 2.0, bw / 2.0, h - hf
        region = Region([(-w, 0.0), (w, 0.0), (w, y), (f, y), (f, h), (-f, h), (-f, y), (-w, y)], [])
        return Shape(kind, {"flange_thickness": hf}, region, (bf, hf, bw))
    if kind == "inverted_tee":
        bw, h, bl, hl = dim("web_width"), dim("height"), dim("ledge_width"), dim("ledge_height")
        ledges = int(sec.get("ledges", 2))
        w = bw / 2.0
        right = w + bl
        left = -w - bl if ledges == 2 else -w
        pts = [(left, 0.0), (right, 0.0), (right, hl), (w, hl), (w, h), (-w, h)]
        if ledges == 2:
            pts.append((-w, hl))
            pts.append((left, hl))
        return Shape(kind, {"height": h, "ledge_height": hl}, Region(pts, []), None)
    if kind == "double_tee":
        bf, hf, h = dim("flange_width"), dim("flange_thickness"), dim("height")
        s, wt, wb = dim("stem_spacing"), dim("stem_width_top"), dim("stem_width_bottom")
        f, y, c = bf / 2.0, h - hf, s / 2.0
        t, b = wt / 2.0, wb / 2.0
        pts = [(-c - b, 0.0), (-c + b, 0.0), (-c + t, y), (c - t, y), (c - b, 0.0), (c + b, 0.0),
               (c + t, y), (f, y), (f, h), (-f, h), (-f, y), (-c - t, y)]
        return Shape(kind, {"flange_thickness": hf}, Region(pts, []), (bf, hf, 2.0 * wt))
    if kind == "i_girder":
        h = dim("height")
        bt, tt, ht = dim("top_flange_width"), dim("top_flange_thickness"), dim("top_taper", 0.0)
        bw = dim("web_width")
        bb, tb, hb = dim("bottom_flange_width"), dim("bottom_flange_thickness"), dim("bottom_taper", 0.0)
        w, t, b = bw / 2.0, bt / 2.0, bb / 2.0
        pts = [(-b, 0.0), (b, 0.0), (b, tb)]
        pts.append((w, tb + hb) if hb > 0.0 and b > w else (w, tb))
        pts.append((w, h - tt - ht) if ht > 0.0 and t > w else (w, h - tt))
        pts.extend([(t, h - tt), (t, h), (-t, h), (-t, h - tt)])
        pts.append((-w, h - tt - ht) if ht > 0.0 and t > w else (-w, h - tt))
        pts.append((-w, tb + hb) if hb > 0.0 and b > w else (-w, tb))
        pts.append((-b, tb))
        # drop repeated points (a flange as wide as the web)
        kept = []
        for p in pts:
            if not kept or kept[-1] != p:
                kept.append(p)
        while len(kept) > 1 and kept[0] == kept[-1]:
            kept.pop()
        dims = {"top_flange_thickness": tt, "top_taper": ht}
        return Shape(kind, dims, Region(kept, []), (bt, tt, bw))
    if kind == "hollow_core":
        w, h = dim("width"), dim("height")
        n = int(sec["void_count"])
        d, yc = dim("void_diameter"), dim("void_center_height")
        pitch = w / n
        x = w / 2.0
        holes = [void_polygon(-x + pitch * (k + 0.5), yc, d) for k in range(n)]
        region = Region([(-x, 0.0), (x, 0.0), (x, h), (-x, h)], holes)
        dims = {"height": h, "void_diameter": d, "void_center_height": yc}
        return Shape(kind, dims, region, None)
    if kind == "polygon":
        outline = [(float(p[0]), float(p[1])) for p in sec["outline"]]
        holes = [[(float(p[0]), float(p[1])) for p in h] for h in sec.get("holes", [])]
        return Shape(kind, {}, Region(outline, holes), None)
    raise ValueError(f"unknown shape {kind!r}")


# ------------------------------------------------------------------------ materials


def beta1_of(fc, system):
    lo, hi, step = (4.0, 8.0, 1.0) if system == "us" else (28.0, 55.0, 7.0)
    if fc <= lo:
        return 0.85
    if fc >= hi:
        return 0.65
    return 0.85 - 0.05 * (fc - lo) / step


def ec_normalweight(fc, system):
    if system == "us":
        return 57000.0 * math.sqrt(fc * 1000.0) / 1000.0
    return 4700.0 * math.sqrt(fc)


def ec_from_density(fc, wc, system):
    if system == "us":
        return wc ** 1.5 * 33.0 * math.sqrt(fc * 1000.0) / 1000.0
    return wc ** 1.5 * 0.043 * math.sqrt(fc)


def fr_default(fc, lam, system):
    if system == "us":
        return 7.5 * lam * math.sqrt(fc * 1000.0) / 1000.0
    return 0.62 * lam * math.sqrt(fc)


class StrandCurve:
    """Strand stress for a total strain: the PCI handbook's two branches joined where they
    meet, or the power formula (Grade 270 only). Compression is elastic."""

    def __init__(self, model, grade, system):
        self.model = model
        self.system = system
        self.eps_modulus = 28500.0 if system == "us" else 196500.0
        if system == "us":
            fpu, k, e0, rounded = (270.0, 0.04, 0.007, 0.0086) if grade == 270 else (250.0, 0.04, 0.0064, 0.0076)
        else:
            fpu, k, e0, rounded = (1860.0, 0.276, 0.007, 0.0086) if grade == 270 else (1725.0, 0.276, 0.0064, 0.0076)
        self.fpu, self.k, self.e0 = fpu, k, e0
        a = self.eps_modulus
        b = -(self.eps_modulus * e0 + fpu)
        c = fpu * e0 + k
        disc = b * b - 4.0 * a * c
        self.join = (-b + math.sqrt(disc)) / (2.0 * a) if disc >= 0.0 else rounded

    def stress(self, eps):
        if self.model == "pci":
            if eps <= self.join:
                return self.eps_modulus * eps
            return self.fpu - self.k / (eps - self.e0)
        if eps < 0.0:
            return self.eps_modulus * eps
        f = eps * (887.0 + 27613.0 / (1.0 + (112.4 * eps) ** 7.36) ** (1.0 / 7.36))
        if self.system == "us":
            return min(f, 270.0)
        return min(f * KSI_MPA, 1860.0)


# strand sizes: (diameter, area) per grade and unit system; bars: designation -> (diameter, area)
STRANDS = {
    ("us", 270): [(0.375, 0.085), (0.4375, 0.115), (0.500, 0.153), (0.52, 0.167), (0.600, 0.217), (0.700, 0.294)],
    ("us", 250): [(0.375, 0.080), (0.4375, 0.108), (0.500, 0.144), (0.600, 0.216)],
    ("si", 270): [(9.53, 54.8), (11.11, 74.2), (12.70, 98.7), (13.21, 107.7), (15.24, 140.0), (17.78, 189.7)],
    ("si", 250): [(9.53, 51.6), (11.11, 69.7), (12.70, 92.9), (15.24, 139.4)],
}
BARS = {
    "us": {"3": (0.375, 0.11), "4": (0.500, 0.20), "5": (0.625, 0.31), "6": (0.750, 0.44), "7": (0.875, 0.60),
           "8": (1.000, 0.79), "9": (1.128, 1.00), "10": (1.270, 1.27), "11": (1.410, 1.56)},
    "si": {"10": (9.5, 71.0), "13": (12.7, 129.0), "16": (15.9, 199.0), "19": (19.1, 284.0), "22": (22.2, 387.0),
           "25": (25.4, 510.0), "29": (28.7, 645.0), "32": (32.3, 819.0), "36": (35.8, 1006.0)},
}


# ---------------------------------------------------------------------------- input


class Concrete:
    def __init__(self, table, system, topping):
        self.fc = quantity(table["fc"], "stress", system)
        self.lam = float(table.get("lambda", 1.0))
        if "ec" in table:
            self.ec = quantity(table["ec"], "stress", system)
        elif "density" in table:
            self.ec = ec_from_density(self.fc, quantity(table["density"], "density", system), system)
        else:
            self.ec = ec_normalweight(self.fc, system)
        if "fr" in table and not topping:
            self.fr = quantity(table["fr"], "stress", system)
        else:
            self.fr = fr_default(self.fc, self.lam, system)


class StrandLayer:
    def __init__(self, t, h, system):
        q = lambda key: quantity(t[key], "length", system)  # noqa: E731
        self.harped = False
        if "depth" in t:
            self.depth = q("depth")
        elif "height" in t:
            self.depth = h - q("height")
        elif "depth_end" in t:
            self.harped = True
            self.depth_end, self.depth_harp = q("depth_end"), q("depth_harp")
        else:
            self.harped = True
            self.depth_end, self.depth_harp = h - q("height_end"), h - q("height_harp")
        if self.harped:
            self.harp_x = q("harp_x")
            self.harp_x2 = q("harp_x2") if "harp_x2" in t else None
        self.count = int(t["count"])
        self.fpu = quantity(t["fpu"], "stress", system) if "fpu" in t else (270.0 if system == "us" else 1860.0)
        g250, g270 = (250.0, 270.0) if system == "us" else (1725.0, 1860.0)
        if abs(self.fpu - g270) <= 0.005 * g270:
            self.grade = 270
        elif abs(self.fpu - g250) <= 0.005 * g250:
            self.grade = 250
        else:
            raise ValueError(f"fpu = {self.fpu}: no strand model is fitted to this grade")
        self.model = t.get("model", "pci")
        self.curve = StrandCurve(self.model, self.grade, system)
        sizes = STRANDS[(system, self.grade)]
        given_area = quantity(t["area"], "area", system) if "area" in t else None
        if "diameter" in t:
            d = quantity(t["diameter"], "length", system)
            std = next((s for s in sizes if abs(s[0] - d) <= 0.01 * s[0]), None)
            if std is not None:
                self.diameter = std[0]
                self.area = given_area if given_area is not None else std[1]
            elif given_area is not None:
                self.diameter, self.area = d, given_area
            else:
                raise ValueError(f"strand diameter {d} is not a standard size; give area too")
        else:
            std = next((s for s in sizes if abs(s[1] - given_area) <= 0.02 * s[1]), None)
            if std is None:
                raise ValueError("strand area is not standard; give diameter too")
            self.diameter, self.area = std[0], given_area
        self.fpy = quantity(t["fpy"], "stress", system) if "fpy" in t else 0.9 * self.fpu
        if "fse" in t:
            self.fse = quantity(t["fse"], "stress", system)
        else:
            jacking = float(t.get("jacking", 0.75))
            self.fse = jacking * self.fpu - quantity(t["losses"], "stress", system)
        if "debonded_length" in t:
            self.debonded_length = quantity(t["debonded_length"], "length", system)
        else:
            self.debonded_length = 0.0

    def total_area(self):
        return self.area * self.count

    def depth_at(self, x, length):
        """Depth below the top of the precast unit at x from the left end of a member of
        the given length (x None: at the harp)."""
        if not self.harped:
            return self.depth
        if x is None:
            return self.depth_harp
        x2 = self.harp_x2 if self.harp_x2 is not None else length - self.harp_x
        if x < self.harp_x:
            return self.depth_end + (self.depth_harp - self.depth_end) * x / self.harp_x
        if x > x2:
            return self.depth_end + (self.depth_harp - self.depth_end) * (length - x) / (length - x2)
        return self.depth_harp


class BarLayer:
    def __init__(self, t, h, system):
        if "depth" in t:
            self.depth = quantity(t["depth"], "length", system)
        else:
            self.depth = h - quantity(t["height"], "length", system)
        self.count = int(t["count"])
        if "size" in t:
            name = t["size"].strip()
            if name.startswith("#"):
                name = name[1:]
            self.diameter, self.area = BARS[system][name]
        else:
            self.diameter = quantity(t["diameter"], "length", system)
            self.area = quantity(t["area"], "area", system)
        self.fy = quantity(t["fy"], "stress", system) if "fy" in t else (60.0 if system == "us" else 420.0)
        self.es = quantity(t["es"], "stress", system) if "es" in t else (29000.0 if system == "us" else 200000.0)

    def total_area(self):
        return self.area * self.count


class Topping:
    def __init__(self, t, region, system):
        self.thickness = quantity(t["thickness"], "length", system)
        lo, hi = region.top_extent()
        flat = hi - lo > 0.0
        if "width" in t:
            self.width = quantity(t["width"], "length", system)
        else:
            self.width = hi - lo
        self.x_center = (lo + hi) / 2.0 if flat else 0.0
        self.block = t.get("block", "topping")
        self.concrete = Concrete(t, system, topping=True)


class Location:
    def __init__(self, name, x, mu, mnc):
        self.name, self.x, self.mu, self.mnc = name, x, mu, mnc


class Member:
    def __init__(self, t, system):
        self.id = t["id"]
        self.length = quantity(t["length"], "length", system) if "length" in t else None
        self.concrete = Concrete(t["concrete"], system, topping=False)
        self.shape = build_shape(t["section"], system)
        self.region = self.shape.region
        self.kind = t.get("kind", "slab" if self.shape.kind == "hollow_core" else "beam")
        self.topping = Topping(t["topping"], self.region, system) if "topping" in t else None
        mu = quantity(t["mu"], "moment", system) if "mu" in t else None
        mnc = quantity(t["mnc"], "moment", system) if "mnc" in t else 0.0
        self.locations = []
        for k, lt in enumerate(t.get("location", [])):
            name = lt.get("name", f"location {k + 1}")
            x = quantity(lt["x"], "length", system)
            lmu = quantity(lt["mu"], "moment", system) if "mu" in lt else mu
            if "mnc" in lt:
                lmnc = quantity(lt["mnc"], "moment", system)
            elif self.length is not None and self.topping is not None:
                # the member's (midspan) Mnc scaled as for a uniformly loaded simple span
                lmnc = mnc * 4.0 * x * (self.length - x) / (self.length * self.length)
            else:
                lmnc = mnc
            self.locations.append(Location(name, x, lmu, lmnc))
        if not self.locations:
            if self.length is not None:
                self.locations.append(Location("midspan", self.length / 2.0, mu, mnc))
            else:
                self.locations.append(Location("critical section", None, mu, mnc))
        h = self.region.y_top() - self.region.y_bot()
        self.strands = [StrandLayer(s, h, system) for s in t.get("strands", [])]
        self.bars = [BarLayer(b, h, system) for b in t.get("bars", [])]

    def precast_height(self):
        return self.region.y_top() - self.region.y_bot()

    def total_height(self):
        return self.precast_height() + (self.topping.thickness if self.topping else 0.0)


def read_package(doc):
    system = doc["package"]["units"]
    if system not in ("us", "si"):
        raise ValueError(f"units = {system!r} is not a unit system")
    return system, [Member(m, system) for m in doc["member"]]


# ----------------------------------------------------------------- strength model


class Steel:
    """A steel layer as the equilibrium sees it: depth below the section top, total area,
    diameter, strain before bending, stress cap, law, and the block stress of the
    concrete it displaces when inside the block."""

    def __init__(self, d, area, db, pre, cap, curve, bar, displaced):
        self.d, self.area, self.db, self.pre, self.cap = d, area, db, pre, cap
        self.curve = curve  # StrandCurve, or None for a bar
        self.bar = bar  # (fy, es) for a bar
        self.displaced = displaced

    def eps3(self, c):
        return EPS_CU * (self.d - c) / c

    def stress_at(self, eps):
        if self.curve is not None:
            f = self.curve.stress(eps)
        else:
            fy, es = self.bar
            f = min(max(es * eps, -fy), fy)
        return min(f, self.cap)

    def inside(self, a):
        if self.displaced == 0.0:
            return 0.0
        return min(max((a - (self.d - self.db / 2.0)) / self.db, 0.0), 1.0)

    def force(self, c, a):
        eps = self.pre + self.eps3(c)
        return self.area * (self.stress_at(eps) + self.displaced * self.inside(a))


class State:
    def __init__(self, c, a, cc, dc, t):
        self.c, self.a, self.cc, self.dc, self.t = c, a, cc, dc, t
        self.residual = cc - t


class NoSolution(Exception):
    pass


class Model:
    def __init__(self, parts, steel, top, depth, beta1):
        self.parts = parts  # [(region, block stress)]
        self.steel = steel
        self.top, self.depth, self.beta1 = top, depth, beta1

    def state(self, c):
        a = min(self.beta1 * c, self.depth)
        y0 = self.top - a
        cc = q = 0.0
        for region, stress in self.parts:
            area, qx = region.above(y0)
            cc += stress * area
            q += stress * qx
        dc = self.top - q / cc if cc > 0.0 else 0.0
        t = 0.0
        for s in self.steel:
            t += s.force(c, a)
        return State(c, a, cc, dc, t)

    def solve(self):
        """Neutral-axis depth by Brent's method on C - T (bracketed from a vanishing
        compression zone to the section depth, widened if the steel still wins)."""
        h = self.depth
        lo = self.state(1e-6 * h)
        if lo.residual >= 0.0:
            if abs(lo.residual) <= CLOSURE * max(lo.cc, abs(lo.t)) and lo.cc > 0.0:
                return lo
            raise NoSolution("no equilibrium: the steel is not in net tension for any neutral-axis depth")
        hi = self.state(h)
        span = h
        while hi.residual < 0.0:
            if span > 64.0 * h:
                raise NoSolution("no equilibrium: the section is over-reinforced")
            span *= 2.0
            hi = self.state(span)

        def ok(s):
            return abs(s.residual) <= CLOSURE * max(abs(s.cc), F64_MIN_POSITIVE)

        if ok(hi):
            return hi
        pre, cur = lo, hi
        blk = pre
        spre = scur = 0.0
        xtol = 1e-15 * h
        for _ in range(200):
            if pre.residual != 0.0 and cur.residual != 0.0 and (pre.residual < 0.0) != (cur.residual < 0.0):
                blk = pre
                spre = cur.c - pre.c
                scur = spre
            if abs(blk.residual) < abs(cur.residual):
                pre = cur
                cur = blk
                blk = pre
            delta = (xtol + 4.0 * F64_EPSILON * abs(cur.c)) / 2.0
            sbis = (blk.c - cur.c) / 2.0
            if ok(cur):
                return cur
            if abs(sbis) < delta:
                raise NoSolution("the equilibrium iteration did not converge")
            if abs(spre) > delta and abs(cur.residual) < abs(pre.residual):
                if pre.c == blk.c:
                    stry = -cur.residual * (cur.c - pre.c) / (cur.residual - pre.residual)
                else:
                    dpre = (pre.residual - cur.residual) / (pre.c - cur.c)
                    dblk = (blk.residual - cur.residual) / (blk.c - cur.c)
                    stry = -cur.residual * (blk.residual * dblk - pre.residual * dpre) / (
                        dblk * dpre * (blk.residual - pre.residual))
                if 2.0 * abs(stry) < min(abs(spre), 3.0 * abs(sbis) - delta):
                    spre = scur
                    scur = stry
                else:
                    spre = sbis
                    scur = sbis
            else:
                spre = sbis
                scur = sbis
            pre = cur
            step = scur if abs(scur) > delta else math.copysign(delta, sbis)
            cur = self.state(cur.c + step)
        raise NoSolution("the equilibrium iteration did not converge in 200 trials")

    def moment(self, st):
        """Mn (coherent units): the steel forces' moments about the compression resultant."""
        mn = 0.0
        for s in self.steel:
            mn += s.force(st.c, st.a) * (s.d - st.dc)
        return mn


def brent(f, a, b, fa, fb, xtol, ftol):
    """A root of f in [a, b] (f(a), f(b) of opposite signs), as in analysis/roots.rs."""
    if fa == 0.0:
        return a
    if fb == 0.0:
        return b
    if (fa < 0.0) == (fb < 0.0) or not math.isfinite(fa) or not math.isfinite(fb):
        return None
    xpre, xcur, fpre, fcur = a, b, fa, fb
    xblk = fblk = spre = scur = 0.0
    for _ in range(200):
        if fpre != 0.0 and fcur != 0.0 and (fpre < 0.0) != (fcur < 0.0):
            xblk, fblk = xpre, fpre
            spre = scur = xcur - xpre
        if abs(fblk) < abs(fcur):
            xpre, xcur, xblk = xcur, xblk, xcur
            fpre, fcur, fblk = fcur, fblk, fcur
        delta = (xtol + 4.0 * F64_EPSILON * abs(xcur)) / 2.0
        sbis = (xblk - xcur) / 2.0
        if abs(fcur) <= ftol or abs(sbis) < delta:
            return xcur
        if abs(spre) > delta and abs(fcur) < abs(fpre):
            if xpre == xblk:
                stry = -fcur * (xcur - xpre) / (fcur - fpre)
            else:
                dpre = (fpre - fcur) / (xpre - xcur)
                dblk = (fblk - fcur) / (xblk - xcur)
                stry = -fcur * (fblk * dblk - fpre * dpre) / (dblk * dpre * (fblk - fpre))
            if 2.0 * abs(stry) < min(abs(spre), 3.0 * abs(sbis) - delta):
                spre = scur
                scur = stry
            else:
                spre = scur = sbis
        else:
            spre = scur = sbis
        xpre, fpre = xcur, fcur
        xcur += scur if abs(scur) > delta else math.copysign(delta, sbis)
        fcur = f(xcur)
        if not math.isfinite(fcur):
            return None
    return xcur


# ------------------------------------------------------------------------- analysis


class Prepared:
    """What does not change along a member: section properties, topping, beta1."""

    def __init__(self, m, system):
        self.m = m
        self.system = system
        self.cv = Conv(system)
        self.precast = Props(m.region.moments(), m.region.y_top(), m.region.y_bot())
        self.top_p = m.region.y_top()
        self.t = m.topping.thickness if m.topping else 0.0
        self.top = self.top_p + self.t
        self.composite = None
        self.topping_region = None
        fc_top = m.concrete.fc
        if m.topping is not None:
            tp = m.topping
            x0 = tp.x_center - tp.width / 2.0
            x1 = tp.x_center + tp.width / 2.0
            self.topping_region = Region(
                [(x0, self.top_p), (x1, self.top_p), (x1, self.top_p + self.t), (x0, self.top_p + self.t)], [])
            n = tp.concrete.ec / m.concrete.ec
            mp = m.region.moments()
            mt = self.topping_region.moments()
            summed = tuple(mp[k] + mt[k] * n for k in range(4))
            self.composite = Props(summed, self.top_p + self.t, m.region.y_bot())
            fc_top = tp.concrete.fc
        self.fc_top = fc_top
        self.beta1 = beta1_of(fc_top, system)

    def parts(self, block):
        m = self.m
        if m.topping is not None:
            stress_t = 0.85 * m.topping.concrete.fc
            precast = 0.85 * m.concrete.fc if block == "two_part" else stress_t
            return [(self.topping_region, stress_t), (m.region, precast)]
        return [(m.region, 0.85 * m.concrete.fc)]

    def zone(self, a):
        m = self.m
        if a >= m.total_height() * (1.0 - 1e-12):
            return "whole section"
        if m.topping is not None and a <= self.t:
            return "topping"
        z = m.shape.zone(a - self.t)
        if m.topping is None:
            return z
        return {
            "flange": "topping and flange",
            "web": "topping, flange and web",
            "top flange": "topping and top flange",
            "top flange taper": "topping, top flange and taper",
            "void region": "topping and void region",
            "stem": "topping and stem",
            "ledge": "topping, stem and ledge",
        }.get(z, "topping and precast unit")


class StrandAt:
    """A strand layer at a location: depth, prestress, strains and development."""

    def __init__(self, d, yb, fse, eps1, active, dev):
        self.d, self.yb, self.fse, self.eps1, self.active, self.dev = d, yb, fse, eps1, active, dev
        self.eps2 = 0.0


def transfer(p, s, x):
    """Effective prestress at x within the transfer length (25.4.8.1, R25.4.8.1),
    measured from the nearer member end."""
    if x is None:
        return s.fse, True, None
    d1 = 3.0 if p.system == "us" else 21.0
    ltr = s.fse / d1 * s.diameter
    x_bond = min(x, p.m.length - x) - s.debonded_length
    if x_bond <= 0.0:
        fse, active, state = 0.0, False, "debonded at this section"
    elif x_bond < ltr:
        fse, active, state = s.fse * x_bond / ltr, True, "within the transfer length"
    else:
        fse, active, state = s.fse, True, "beyond the transfer length"
    dev = {"x_bond": x_bond, "transfer_length": ltr, "development_length": None,
           "doubled": s.debonded_length > 0.0, "fse_here": fse, "fpx": None, "ratio": None,
           "phi": None, "state": state}
    return fse, active, dev


def development(p, s, fps, at):
    """Development length and, for strand not developed at x, the stress cap fpx
    (25.4.8.1 to 25.4.8.3); fps from the solution with the strand fully developed."""
    dev = at.dev
    if dev is None:
        return None
    d1, d2 = (3.0, 1.0) if p.system == "us" else (21.0, 7.0)
    fse = s.fse
    fps_d = max(fps, fse)
    factor = 2.0 if dev["doubled"] else 1.0
    ld = factor * (fse / d1 * s.diameter + (fps_d - fse) / d2 * s.diameter)
    dev["development_length"] = ld
    if not at.active:
        return None
    xb = dev["x_bond"]
    ltr = dev["transfer_length"]
    if xb >= ld:
        dev["state"] = "fully developed"
        return None
    if xb <= ltr:
        cap = fse * xb / max(ltr, F64_MIN_POSITIVE)
        dev["state"] = "within the transfer length"
        dev["ratio"] = 0.0
    else:
        cap = fse + (xb - ltr) / (ld - ltr) * (fps_d - fse)
        dev["state"] = "between the transfer and development lengths"
        dev["ratio"] = (xb - ltr) / (ld - ltr)
    dev["fpx"] = cap
    return cap


def phi_of(eps_t, eps_ty):
    """Table 21.2.2 (other than spirals)."""
    if eps_t >= eps_ty + 0.003:
        return 0.90, "tension"
    if eps_t <= eps_ty:
        return 0.65, "compression"
    return 0.65 + 0.25 * (eps_t - eps_ty) / 0.003, "transition"


def build_model(p, block, at, caps):
    m = p.m
    parts = p.parts(block)

    def displaced_at(d):
        if len(parts) == 2 and d <= p.t:
            return parts[0][1]
        return parts[-1][1]

    steel = []
    for i, s in enumerate(m.strands):
        a = at[i]
        steel.append(Steel(a.d, s.total_area() if a.active else 0.0, s.diameter, a.eps1 + a.eps2, caps[i],
                           s.curve, None, displaced_at(a.d) if a.active else 0.0))
    for b in m.bars:
        d = b.depth + p.t
        steel.append(Steel(d, b.total_area(), b.diameter, 0.0, INF, None, (b.fy, b.es), displaced_at(d)))
    return Model(parts, steel, p.top, m.total_height(), p.beta1)


def cracking(p, pe, e, mnc):
    """Mcr (shown units): bottom-fibre form, and for a topped member the composite form
    with the moment Mnc carried by the precast unit alone."""
    cv = p.cv
    area, sb = p.precast.area, p.precast.sb()
    fr = p.m.concrete.fr
    fpe = pe / area + pe * e / sb
    if p.composite is not None:
        sbc = p.composite.sb()
        mnc_shown = mnc * cv.km
        return sbc * (fr + fpe) / cv.s_div - mnc_shown * (sbc / sb - 1.0), fpe
    return sb * (fr + fpe) / cv.s_div, fpe


def approximate(p, st, at, not_developed, mn_sc):
    """fps of 20.3.2.3.1 where it applies, and the Mn it gives (block from the outline)."""
    m = p.m

    def not_applicable(reason):
        return {"applicable": False, "reason": reason}

    if not m.strands:
        return not_applicable("there is no prestressing steel")
    if not_developed:
        return not_applicable("strand is not fully developed at this location")
    counted = [not (s.fse == 0.0 and a.d <= st.c) for s, a in zip(m.strands, at)]
    for i, (s, a) in enumerate(zip(m.strands, at)):
        if not counted[i]:
            continue
        if not a.active:
            return not_applicable(f"strand layer {i + 1} is debonded here")
        if s.fse < 0.5 * s.fpu:
            return not_applicable(f"fse of strand layer {i + 1} is below 0.5 fpu (20.3.2.3)")
        if a.d <= st.c:
            return not_applicable(f"strand layer {i + 1} lies in the compression zone")
    grades = [s.fpu for s, k in zip(m.strands, counted) if k]
    if not grades:
        return not_applicable("there is no tensioned strand")
    fpu = grades[0]
    if any(g != fpu for g in grades[1:]):
        return not_applicable("the strand layers are of different grades")
    layers = [(s, a) for s, a, k in zip(m.strands, at, counted) if k]
    ratio = min(s.fpy / s.fpu for s, _ in layers)
    gamma_p = 0.28 if ratio >= 0.9 else (0.40 if ratio >= 0.85 else 0.55)
    aps = 0.0
    aps_d = 0.0
    for s, a in layers:
        aps += s.total_area()
        aps_d += s.total_area() * a.d
    dp = aps_d / aps
    h = m.total_height()
    tension_bars = [b for b in m.bars if b.depth + p.t > h / 2.0]
    as_ = 0.0
    as_d = 0.0
    fy = INF
    for b in tension_bars:
        as_ += b.total_area()
        as_d += b.total_area() * (b.depth + p.t)
        fy = min(fy, b.fy)
    d_s = as_d / as_ if as_ > 0.0 else 0.0
    if not math.isfinite(fy):
        fy = 0.0
    fc = p.fc_top
    b1 = p.beta1
    flange = m.shape.flange
    if m.topping is not None and flange is not None:
        b, hf, bw = m.topping.width, m.topping.thickness + flange[1], flange[2]
    elif m.topping is not None:
        b, hf, bw = m.topping.width, m.topping.thickness, None
    elif flange is not None:
        b, hf, bw = flange
    else:
        b, hf, bw = m.region.width_at(m.region.y_top() - 1e-9 * h), h, None

    def fps_for(width, aps_eff):
        rho_p = aps_eff / (width * dp)
        rho = as_ / (width * d_s) if as_ > 0.0 else 0.0
        bracket = rho_p * fpu / fc + (d_s / dp * fy / fc * rho if as_ > 0.0 else 0.0)
        return fpu * (1.0 - gamma_p / b1 * bracket), rho_p

    fps, rho_p = fps_for(b, aps)
    parts = [p.topping_region, m.region] if p.topping_region is not None else [m.region]

    def area_above(a):
        total = 0.0
        for r in parts:
            total += r.above(p.top - a)[0]
        return total

    def block_for(force):
        need = force / (0.85 * fc)
        g = lambda a: area_above(a) - need  # noqa: E731
        g0, gh = g(0.0), g(h)
        if gh < 0.0:
            return None
        return brent(g, 0.0, h, g0, gh, 1e-13 * h, 1e-12 * need)

    a = block_for(aps * fps + as_ * fy)
    if a is None:
        return not_applicable("the stress block would be deeper than the section")
    flanged = False
    if bw is not None and a > hf and bw < b:
        flanged = True
        apf = 0.85 * fc * (b - bw) * hf / fps
        apw = max(aps - apf, 0.0)
        fps, _ = fps_for(bw, apw)
        a = block_for(aps * fps + as_ * fy)
        if a is None:
            return not_applicable("the stress block would be deeper than the section")
    ab = 0.0
    q = 0.0
    for r in parts:
        area, qx = r.above(p.top - a)
        ab += area
        q += qx
    dc = p.top - q / ab
    mn = (aps * fps * (dp - dc) + as_ * fy * (d_s - dc)) * p.cv.km
    return {"applicable": True, "gamma_p": gamma_p, "rho_p": rho_p, "fps": fps, "a": a, "flanged": flanged,
            "mn": mn, "difference": (mn - mn_sc) / mn_sc * 100.0}


def analyse_location(p, loc):
    m = p.m
    cv = p.cv
    # strand at x: depth (harped profile), prestress after transfer, eps1
    at = []
    for s in m.strands:
        depth_p = s.depth_at(loc.x, m.length)
        y = p.top_p - depth_p
        fse, active, dev = transfer(p, s, loc.x)
        at.append(StrandAt(depth_p + p.t, p.precast.yc - y, fse, fse / s.curve.eps_modulus, active, dev))
    # effective prestress force, eccentricity, decompression strain (precast section)
    pe = 0.0
    pe_y = 0.0
    for s, a in zip(m.strands, at):
        pe += a.fse * s.total_area()
    if pe > 0.0:
        for s, a in zip(m.strands, at):
            pe_y += a.fse * s.total_area() * a.yb
        e = pe_y / pe
    else:
        e = 0.0
    area, inertia, ec = p.precast.area, p.precast.i, m.concrete.ec
    for a in at:
        a.eps2 = pe / (area * ec) + pe * e * a.yb / (inertia * ec)

    # strain compatibility, then again with fpx where strand is not developed
    block = m.topping.block if m.topping is not None else None
    caps = [INF] * len(m.strands)
    model = build_model(p, block, at, caps)
    st = model.solve()
    if loc.x is not None:
        fps_full = [s.stress_at(s.pre + s.eps3(st.c)) for s in model.steel[:len(m.strands)]]
        for i, s in enumerate(m.strands):
            cap = development(p, s, fps_full[i], at[i])
            if cap is not None:
                caps[i] = cap
        if any(math.isfinite(c) for c in caps):
            model = build_model(p, block, at, caps)
            st = model.solve()
    not_developed = loc.x is not None and any(math.isfinite(c) for c in caps)
    mn = model.moment(st) * cv.km

    # layers
    ns = len(m.strands)
    strands_out = []
    bars_out = []
    max_strand_strain = 0.0
    for j, s in enumerate(model.steel):
        eps3 = s.eps3(st.c)
        eps = s.pre + eps3
        f = s.stress_at(eps)
        active = s.area > 0.0
        row = {"depth": s.d, "eps": eps, "stress": f if active else 0.0,
               "force": s.force(st.c, st.a) * cv.kf, "eps3": eps3}
        if j < ns:
            layer = m.strands[j]
            row["area"] = layer.total_area()
            row["eps1"] = at[j].eps1
            row["eps2"] = at[j].eps2
            row["fse"] = at[j].fse
            row["active"] = active
            row["cap"] = s.cap if math.isfinite(s.cap) else None
            strands_out.append(row)
            if active and not math.isfinite(s.cap):
                max_strand_strain = max(max_strand_strain, eps)
        else:
            row["area"] = s.area
            bars_out.append(row)

    # eps_t, phi (Table 21.2.2), and 21.2.3 for strand not fully developed
    ext_j = None
    for j, s in enumerate(model.steel):
        if s.area > 0.0 and (ext_j is None or s.d >= model.steel[ext_j].d):
            ext_j = j
    if ext_j is None:
        eps_t, eps_ty, phi_f, control = 0.0, 0.002, 0.65, "compression"
    else:
        ext = model.steel[ext_j]
        eps_t = ext.eps3(st.c)
        eps_ty = 0.002 if ext.curve is not None else ext.bar[0] / ext.bar[1]
        phi_f, control = phi_of(eps_t, eps_ty)
    phi_dev = None
    for a in at:
        if not a.active or a.d <= st.c or a.dev is None or a.dev["ratio"] is None:
            continue
        ph = min(0.75 + (phi_f - 0.75) * a.dev["ratio"], max(phi_f, 0.75))
        a.dev["phi"] = ph
        phi_dev = ph if phi_dev is None else min(phi_dev, ph)
    phi = phi_dev if phi_dev is not None and phi_dev < phi_f else phi_f
    mu = loc.mu * cv.km
    phi_mn = phi * mn
    ratio = mu / phi_mn

    # cracking moment and the minimum of 9.6.2.1 / 7.6.2.1
    mcr, fpe = cracking(p, pe, e, loc.mnc)
    required = 1.2 * mcr
    min_ok = phi_mn >= required
    waiver = phi_mn >= 2.0 * mu
    approx = approximate(p, st, at, not_developed, mn)
    strength_ok = ratio <= 1.0
    rupture_risk = max_strand_strain > 0.035
    passed = strength_ok and (min_ok or waiver)
    clause = "7.6.2.1" if m.kind == "slab" else "9.6.2.1"
    return {
        "name": loc.name,
        "x": loc.x,
        "pe": pe * cv.kf,
        "e": e,
        "c": st.c,
        "a": st.a,
        "beta1": p.beta1,
        "zone": p.zone(st.a),
        "cc": st.cc * cv.kf,
        "dc": st.dc,
        "closure": abs(st.residual / st.cc),
        "eps_t": eps_t,
        "eps_ty": eps_ty,
        "phi_flexure": phi_f,
        "phi_development": phi_dev,
        "phi": phi,
        "mn": mn,
        "phi_mn": phi_mn,
        "mu": mu,
        "ratio": ratio,
        "control": control,
        "fpe": fpe,
        "mcr": mcr,
        "min_required": required,
        "min_clause": clause,
        "min_reinforcement_ok": min_ok,
        "min_reinforcement_waived": (not min_ok) and waiver,
        "max_strand_strain": max_strand_strain,
        "rupture_risk": rupture_risk,
        "pass": passed,
        "approximate": approx,
        "development": [a.dev for a in at if a.dev is not None],
        "strands": strands_out,
        "bars": bars_out,
    }


def analyse_member(m, system):
    p = Prepared(m, system)
    locations = [analyse_location(p, loc) for loc in m.locations]
    governing = 0
    for i, loc in enumerate(locations):
        if loc["ratio"] >= locations[governing]["ratio"]:
            governing = i
    return {"id": m.id, "governing": locations[governing]["name"],
            "pass": all(loc["pass"] for loc in locations), "locations": locations}


UNIT_NAMES = {
    "us": {"length": "in", "area": "in2", "stress": "ksi", "force": "kip", "moment": "kip-ft"},
    "si": {"length": "mm", "area": "mm2", "stress": "MPa", "force": "kN", "moment": "kN-m"},
}


def analyse(system, members):
    results = [analyse_member(m, system) for m in members]
    return {"format": 1, "units": UNIT_NAMES[system], "pass": all(r["pass"] for r in results),
            "members": results}


# -------------------------------------------------------------------------- compare

NUMBER_FIELDS = ["c", "a", "beta1", "mn", "phi_mn", "mcr", "phi", "eps_t", "mu", "ratio"]
LAYER_FIELDS = ["depth", "area", "eps1", "eps2", "eps3", "eps", "stress", "force", "fse"]
TEXT_FIELDS = ["zone", "control", "pass", "min_reinforcement_ok", "min_reinforcement_waived", "rupture_risk"]


def compare(ours, theirs):
    """Prints, per field, the worst relative difference between these results and the
    JSON of `strainsheet check --json`, and where it occurs. Returns whether c, Mn,
    phi Mn and Mcr agree within 1e-6 everywhere."""
    worst = {}
    mismatches = {}
    problems = []

    def rel(x, y):
        if x == y:
            return 0.0
        return abs(x - y) / max(abs(x), abs(y))

    def note(field, x, y, where):
        r = rel(x, y)
        if field not in worst or r > worst[field][0]:
            worst[field] = (r, where, x, y)

    theirs_by_id = {m["id"]: m for m in theirs["members"]}
    if len(theirs_by_id) != len(ours["members"]):
        problems.append(f"{len(ours['members'])} members here, {len(theirs_by_id)} in the JSON")
    locations = 0
    for om in ours["members"]:
        tm = theirs_by_id.get(om["id"])
        if tm is None:
            problems.append(f"member {om['id']} is missing from the JSON")
            continue
        if tm["governing"] != om["governing"]:
            mismatches.setdefault("governing", []).append(om["id"])
        if len(tm["locations"]) != len(om["locations"]):
            problems.append(f"member {om['id']}: location counts differ")
            continue
        for ol, tl in zip(om["locations"], tm["locations"]):
            locations += 1
            where = f"{om['id']} / {ol['name']}"
            if tl["name"] != ol["name"]:
                problems.append(f"{where}: location name {tl['name']!r} in the JSON")
            for f in NUMBER_FIELDS:
                note(f, ol[f], tl[f], where)
            for f in TEXT_FIELDS:
                if ol[f] != tl[f]:
                    mismatches.setdefault(f, []).append(where)
            for kind in ("strands", "bars"):
                if len(ol[kind]) != len(tl[kind]):
                    problems.append(f"{where}: {kind} counts differ")
                    continue
                for k, (ls, lt) in enumerate(zip(ol[kind], tl[kind])):
                    for f in LAYER_FIELDS:
                        if f in lt:
                            note(f"{kind}.{f}", ls[f], lt[f], f"{where} / {kind[:-1]} {k + 1}")
    print(f"compared {len(ours['members'])} members, {locations} locations")
    print(f"{'field':<16} {'worst rel. diff':>16}  {'here':>22} {'strainsheet':>22}  where")
    for f, (r, where, x, y) in worst.items():
        print(f"{f:<16} {r:16.3e}  {x!r:>22} {y!r:>22}  {where}")
    for f in TEXT_FIELDS + ["governing"]:
        bad = mismatches.get(f, [])
        print(f"{f:<28} {'same everywhere' if not bad else f'{len(bad)} differ, first: {bad[0]}'}")
    for pr in problems[:20]:
        print("problem:", pr)
    key = ["c", "mn", "phi_mn", "mcr"]
    agree = not problems and all(worst.get(f, (0.0,))[0] <= 1e-6 for f in key)
    print(f"c, Mn, phi Mn and Mcr within 1e-6 relative everywhere: {'yes' if agree else 'NO'}")
    return agree


# ----------------------------------------------------------------------------- main


def main(argv):
    args = list(argv[1:])
    compare_with = None
    timings = False
    if "--compare" in args:
        k = args.index("--compare")
        if k + 1 >= len(args):
            print("--compare needs the JSON file of `strainsheet check --json`", file=sys.stderr)
            return 2
        compare_with = args[k + 1]
        del args[k:k + 2]
    if "--timings" in args:
        timings = True
        args.remove("--timings")
    if len(args) != 1:
        print("usage: python3 benches/reference_check.py PACKAGE.toml [--compare RUST.json] [--timings]",
              file=sys.stderr)
        return 2
    t0 = time.perf_counter()
    with open(args[0], "rb") as fh:
        doc = tomllib.load(fh)
    t1 = time.perf_counter()
    system, members = read_package(doc)
    t2 = time.perf_counter()
    result = analyse(system, members)
    t3 = time.perf_counter()
    if compare_with is not None:
        with open(compare_with, encoding="utf-8") as fh:
            theirs = json.load(fh)
        return 0 if compare(result, theirs) else 1
    sys.stdout.write(json.dumps(result))
    sys.stdout.write("\n")
    t4 = time.perf_counter()
    if timings:
        print(f"parse {t1 - t0:.3f} s, read {t2 - t1:.3f} s, analysis {t3 - t2:.3f} s, "
              f"write {t4 - t3:.3f} s", file=sys.stderr)
    return 0 if result["pass"] else 1


if __name__ == "__main__":
    sys.exit(main(sys.argv))
