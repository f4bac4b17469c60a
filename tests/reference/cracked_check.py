"""Reference values for the cracked transformed section, from an independent library.

Purpose
-------
Builds two sections with concreteproperties (a general concrete-section library on
PyPI) and prints, for each, the height of the cracked neutral axis above the bottom
y_cr (in) and the cracked second moment of area about that axis, transformed to the
precast concrete's modulus, Icr = (sum of E_i I_i about the cracked axis) / Ec (in^4).
Cracked means: no concrete tension, sagging bending (top in compression), no axial
force, every material linear elastic. The same two numbers are then computed again by
hand with the classical transformed-section equations, without the library, and both
are printed side by side. Units: inches and ksi throughout.

  R  rectangle 12 x 24, Ec = 57 sqrt(6000) ksi (57,000 sqrt(f'c psi) psi, f'c = 6000 psi);
     prestressing steel 1.224 in^2 at y = 7.0 (E = 28,500 ksi);
     bars 1.58 in^2 at y = 2.5 (E = 29,000 ksi).
  T  the same 12 x 24 precast rectangle (Ec = 57 sqrt(6000) ksi) under a topping 36 wide,
     3 thick (y = 24 to 27, centred), Ec_t = 57 sqrt(4000) ksi; prestressing steel
     1.224 in^2 at y = 3.0 (E = 28,500 ksi); no bars.

(y is measured up from the bottom of the precast rectangle; steel is centred
horizontally.)

How the assumptions are matched (read from the library's source, version below):

* Materials. The cracked analysis (``ConcreteSection.calculate_cracked_properties``)
  uses only each material's ``elastic_modulus``: it keeps the concrete above a trial
  axis (``split_section``), adds every reinforcement geometry whole, and finds the axis
  where sum E_i A_i (y_i - y_NA) = 0; then it sums E_i I_i. Concrete is
  ``ConcreteLinearNoTension(Ec)``; both steels are ``SteelBar`` with an elastic-plastic
  profile of the stated E (a yield stress far above anything reached, and irrelevant
  here: only E is read). The strand is a ``SteelBar`` rather than a ``SteelStrand``
  because no prestress enters this analysis (no axial force).
* Steel as a point area. Each steel area is one lumped bar (``add_bar``), a 4-point
  polygon (a square turned 45 degrees) of exactly the stated area centred at the stated
  height, so its first moment is exact. The library adds the bar's own second moment as
  that of a circle of equal area, E pi d^4 / 64 = E A^2 / (4 pi), which the classical
  equations (point areas) leave out. It is small, but not below the printed precision:
  (28,500 / Ec) 1.224^2 / (4 pi) = 0.77 in^4 and (29,000 / Ec) 1.58^2 / (4 pi) = 1.30 in^4,
  together about 4.8e-4 of Icr for R, and 2.1e-4 for T (the strand's 0.77 in^4 alone).
  The script prints the library's Icr as built, this own-inertia term, and the
  library's Icr less the term ("point areas"), which is the value to compare with the
  hand result and to pin. The term does not move the axis (a bar's first moment about
  the axis is A (y_s - y_NA) whatever its shape).
* Holes. ``add_bar`` cuts a hole of the bar's shape out of the concrete
  ((geometry - bar) + bar), so the concrete where the steel is, is absent. In both
  sections every steel area is in the tension zone, whose concrete the cracked analysis
  discards anyway, so the hole changes nothing: the script checks that the top of the
  highest hole (its top vertex, 0.78 in above the strand) lies below the cracked axis,
  and rebuilds each section without holes (the bars simply laid over the concrete) to
  show the same results. The classical equations use n A for steel in tension (no
  (n - 1)), which is the same thing. (Steel in the compression zone would differ: the
  library would count n A there too, with the concrete at its place cut out.)
* Axis and second moment. ``calculate_cracked_properties`` stops Brent's method at
  xtol = 1e-3 in and reports the second moment about the centroid of the cracked
  transformed section (``e_ixx_c_cr``), which is the neutral axis only when the first
  moment balances. The refined values re-solve the library's own balance function
  ``cracked_neutral_axis_convergence`` to 1e-12 in, recompute the library's
  ``cracked_section_properties`` there, and take the second moment about that axis
  (parallel axes from the library's global e_ixx_g_cr, e_qx_cr, e_a_cr). The refined,
  point-area values are the references.
* Coordinate rounding. The library's geometries (``CPGeom``) round every coordinate to
  6 decimal places, and ``split_section`` rounds the point on the trial axis the same
  way. Built in inches, this shortens the 4-point bars' areas by about 1e-6 in^2
  (1.224 -> 1.2239991) and puts the split on a 1e-6 in grid, which moves y_cr by about
  2e-6 in and Icr by about 7e-7 of itself. The references are therefore built with
  every length multiplied by SCALE = 1000 (thousandths of an inch; moduli unchanged),
  where the rounding is 1e-9 in, and converted back (y / 1000, I / 1000^4). The
  inch-built values are printed too, for information.
* Topping. Two concrete geometries with their own moduli; the library's E_i does the
  transformation. By hand the topping's width is multiplied by Ec_t / Ec.

The references are the lines "LIBRARY (point areas)" and "BY HAND (point areas)"; on the
run date they agreed to about 2e-9 in in y_cr and 1e-9 of Icr.

Library version used: concreteproperties 0.8.0 (with sectionproperties 3.10.2, shapely
2.2.0, numpy 2.5.5, scipy 1.18.1), Python 3.12.1. Run on 2026-12-03.

How to run
----------
    python3.12 -m venv /tmp/cpvenv
    /tmp/cpvenv/bin/pip install concreteproperties==0.8.0
    /tmp/cpvenv/bin/python tests/reference/cracked_check.py
"""

from __future__ import annotations

import math
import warnings
from importlib.metadata import version

import concreteproperties.results as cp_results
import concreteproperties.utils as cp_utils
from concreteproperties.concrete_section import ConcreteSection
from concreteproperties.material import Concrete, SteelBar
from concreteproperties.pre import add_bar
from concreteproperties.stress_strain_profile import (
    ConcreteLinearNoTension,
    RectangularStressBlock,
    SteelElasticPlastic,
)
from scipy.optimize import brentq
from sectionproperties.pre.library import circular_section_by_area, rectangular_section


def ec_of(fc_psi: float) -> float:
    """ACI 318-19 19.2.2.1(b): 57,000 sqrt(f'c psi) psi, in ksi."""
    return 57.0 * math.sqrt(fc_psi)


EC = ec_of(6000.0)  # precast concrete: the reference modulus of Icr
EC_TOP = ec_of(4000.0)  # topping
E_PS = 28_500.0  # prestressing steel
E_BAR = 29_000.0  # bars

# Each section: concrete rectangles (x_left, width, y_bottom, depth, E) and steel
# (y, total area, E, label), y up from the bottom of the precast rectangle.
SECTIONS = {
    "R": dict(
        concrete=[(0.0, 12.0, 0.0, 24.0, EC)],
        steel=[(7.0, 1.224, E_PS, "prestressing steel"), (2.5, 1.58, E_BAR, "bars")],
        x_mid=6.0),
    "T": dict(
        concrete=[(0.0, 12.0, 0.0, 24.0, EC), (-12.0, 36.0, 24.0, 3.0, EC_TOP)],
        steel=[(3.0, 1.224, E_PS, "prestressing steel")],
        x_mid=6.0),
}


# ---------------------------------------------------------------- library ----------

def concrete_material(e: float) -> Concrete:
    fc = (e / 57.0) ** 2 / 1000.0  # ksi, only for the (unused) ultimate profile
    return Concrete(
        name=f"concrete E = {e:.6g}",
        density=0.0,
        stress_strain_profile=ConcreteLinearNoTension(elastic_modulus=e),
        ultimate_stress_strain_profile=RectangularStressBlock(
            compressive_strength=fc, alpha=0.85, gamma=0.75, ultimate_strain=0.003),
        flexural_tensile_strength=0.0,
        colour="lightgrey",
    )


def steel_material(e: float, label: str) -> SteelBar:
    return SteelBar(
        name=label,
        density=0.0,
        stress_strain_profile=SteelElasticPlastic(
            yield_strength=1.0e6, elastic_modulus=e, fracture_strain=1.0e3),
        colour="black",
    )


def build(sec: dict, holes: bool = True, scale: float = 1.0) -> ConcreteSection:
    """The section in concreteproperties, every length multiplied by ``scale`` (see the
    docstring: the library rounds coordinates to 1e-6). holes=False lays the bars over
    the concrete instead of cutting them out (the library then warns of overlapping
    regions)."""
    k = scale
    geom = None
    for x0, b, y0, h, e in sec["concrete"]:
        g = rectangular_section(d=h * k, b=b * k, material=concrete_material(e))
        g = g.shift_section(x_offset=x0 * k, y_offset=y0 * k)
        geom = g if geom is None else geom + g
    for y, a, e, label in sec["steel"]:
        mat = steel_material(e, label)
        x, y, a = sec["x_mid"] * k, y * k, a * k * k
        if holes:
            geom = add_bar(geometry=geom, area=a, material=mat, x=x, y=y)
        else:
            bar = circular_section_by_area(area=a, n=4, material=mat)
            geom = geom + bar.shift_section(x_offset=x, y_offset=y)
    with warnings.catch_warnings():
        warnings.simplefilter("ignore")  # the overlap warning of holes=False
        return ConcreteSection(geom)


def library(cs: ConcreteSection, scale: float = 1.0) -> dict:
    """The library's own cracked result, and the same re-solved tightly; lengths are
    divided by ``scale`` again (second moments by scale^4), so all results are in in."""
    k = scale
    own = cs.calculate_cracked_properties(theta=0)
    own.calculate_transformed_properties(elastic_modulus=EC)
    top = max(p[1] for p in cs.compound_geometry.points)
    _, d_t = cp_utils.calculate_extreme_fibre(points=cs.compound_geometry.points, theta=0)

    fine = cp_results.CrackedResults(default_units=None, theta=0)
    d_nc = brentq(cs.cracked_neutral_axis_convergence, 1e-6 * d_t, d_t, args=(fine,),
                  xtol=1e-12 * k, rtol=1e-15, maxiter=500)
    cs.cracked_neutral_axis_convergence(d_nc, fine)  # leave the geometries at d_nc
    cs.cracked_section_properties(cracked_results=fine)
    y_na = top - d_nc
    e_i_na = fine.e_ixx_g_cr - 2.0 * y_na * fine.e_qx_cr + y_na * y_na * fine.e_a_cr
    own_term = sum(
        g.material.elastic_modulus * g.calculate_area() ** 2 / (4.0 * math.pi)
        for g in cs.reinf_geometries_lumped)
    hole_top = max(p[1] for g in cs.reinf_geometries_lumped for p in g.points)
    k4 = k ** 4
    return dict(
        y_own=(top - own.d_nc) / k, icr_own=own.ixx_c_cr / k4,
        y=y_na / k, y_centroid=fine.cy / k, icr_built=e_i_na / EC / k4,
        own_term=own_term / EC / k4, icr=(e_i_na - own_term) / EC / k4,
        hole_top=hole_top / k)


# ---------------------------------------------------------------- by hand ----------

def by_hand(sec: dict) -> tuple[float, float]:
    """Classical cracked transformed section, steel as point areas n A (n = E / Ec),
    each concrete rectangle's width times m = E_i / Ec. The axis y solves
        sum over compressed concrete of m b (first moment about y)
            = sum over steel of n A (y - y_s),
    a quadratic in y on each stretch between rectangle edges; then
        Icr = sum m b [h^3 / 12 + h (yc - y)^2] (wholly compressed rectangles)
            + sum m b (y_top - y)^3 / 3 (the rectangle the axis cuts)
            + sum n A (y - y_s)^2."""
    rects = [(b * e / EC, y0, y0 + h) for _, b, y0, h, e in sec["concrete"]]
    steel = [(e / EC * a, y) for y, a, e, _ in sec["steel"]]
    edges = sorted({y for _, y0, y1 in rects for y in (y0, y1)})
    for lo, hi in zip(edges, edges[1:]):
        # coefficients of c2 y^2 + c1 y + c0 = (first moment of the compression) - (steel)
        c2 = c1 = c0 = 0.0
        for bt, y0, y1 in rects:
            if y0 >= hi:  # wholly above the stretch: bt h (yc - y)
                h = y1 - y0
                c1 -= bt * h
                c0 += bt * h * (y0 + y1) / 2.0
            elif y1 >= hi and y0 <= lo:  # cut by the axis: bt (y1 - y)^2 / 2
                c2 += bt / 2.0
                c1 -= bt * y1
                c0 += bt * y1 * y1 / 2.0
        for na, ys in steel:
            c1 -= na
            c0 += na * ys
        if c2 == 0.0:
            roots = [-c0 / c1]
        else:
            disc = math.sqrt(c1 * c1 - 4.0 * c2 * c0)
            roots = [(-c1 + disc) / (2.0 * c2), (-c1 - disc) / (2.0 * c2)]
        found = [y for y in roots if lo <= y <= hi]
        if found:
            y = found[0]
            break
    else:
        raise RuntimeError("no neutral axis found")
    icr = 0.0
    for bt, y0, y1 in rects:
        if y0 >= y:
            h = y1 - y0
            icr += bt * (h ** 3 / 12.0 + h * ((y0 + y1) / 2.0 - y) ** 2)
        elif y1 > y:
            icr += bt * (y1 - y) ** 3 / 3.0
    for na, ys in steel:
        icr += na * (y - ys) ** 2
    return y, icr


SCALE = 1000.0  # build the references in thousandths of an inch (see the docstring)


def main() -> None:
    print(f"concreteproperties {version('concreteproperties')}, "
          f"sectionproperties {version('sectionproperties')}")
    print(f"Ec = {EC:.10g} ksi, Ec_t = {EC_TOP:.10g} ksi, Ec_t / Ec = {EC_TOP / EC:.10g}, "
          f"n_ps = {E_PS / EC:.10g}, n_bar = {E_BAR / EC:.10g}")
    for name, sec in SECTIONS.items():
        inch = library(build(sec))
        lib = library(build(sec, scale=SCALE), scale=SCALE)
        lib_nohole = library(build(sec, holes=False, scale=SCALE), scale=SCALE)
        y_hand, icr_hand = by_hand(sec)
        print(f"section {name}")
        print(f"  built in inches, as released (xtol 1e-3): y_cr = {inch['y_own']:.10g} in, "
              f"Icr (about its centroid, as built) = {inch['icr_own']:.10g} in^4")
        print(f"  built in inches, refined, point areas:    y_cr = {inch['y']:.10g} in, "
              f"Icr = {inch['icr']:.10g} in^4")
        print(f"  built in in/{SCALE:g}, refined: y_cr = {lib['y']:.10g} in "
              f"(cracked centroid {lib['y_centroid']:.10g}), "
              f"Icr as built = {lib['icr_built']:.10g} in^4")
        print(f"  steel's own second moment (circle of equal area, /Ec) = "
              f"{lib['own_term']:.10g} in^4 = {lib['own_term'] / lib['icr']:.3e} of Icr")
        print(f"  highest point of the steel holes y = {lib['hole_top']:.6g} in "
              f"(below the axis: {lib['hole_top'] < lib['y']})")
        print(f"  without holes (in/{SCALE:g}): y_cr = {lib_nohole['y']:.10g} in, "
              f"Icr point areas = {lib_nohole['icr']:.10g} in^4")
        print(f"  LIBRARY  (point areas): y_cr = {lib['y']:.10g} in, "
              f"Icr = {lib['icr']:.10g} in^4")
        print(f"  BY HAND  (point areas): y_cr = {y_hand:.10g} in, "
              f"Icr = {icr_hand:.10g} in^4")
        print(f"  difference library - hand: y {lib['y'] - y_hand:.2e} in, "
              f"Icr {lib['icr'] - icr_hand:.2e} in^4 "
              f"(relative {(lib['icr'] - icr_hand) / icr_hand:.2e})")


if __name__ == "__main__":
    main()
