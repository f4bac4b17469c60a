"""Reference values for tests/demand.rs, from an independent structural library.

Purpose
-------
Builds the members of tests/demand.rs as frame models in PyNiteFEA (a general-purpose
finite-element frame library on PyPI: pip install PyNiteFEA==3.2.0; import Pynite) and
prints the bearing reactions and the bending moment at chosen x for each case. The
member runs from x = 0 to x = L with a pin at the left bearing and a roller at the
right one, each `a` from its end (overhangs of length a are loaded too); uniform loads
act over the whole length, point loads at their x. PyNite's Mz is negated so that
sagging is positive, as in strainsheet.

Units: kip and in (moments kip-in). Run: python3 tests/reference/beam_statics_check.py

Printed on 2026-12-03 with PyNiteFEA 3.2.0, numpy 2.x, Python 3.11.7 (the values
pinned in tests/demand.rs):

case A  L=600 a=6  w=0.1 kip/in, loads=[(12.0, 150.0)]
  RA=39.06122449  RB=32.93877551
  M(6)=-1.80000000  M(150)=4499.81632653  M(300)=5184.00000000  M(450)=3618.18367347
case B  L=480 a=0  w=0.05 kip/in, loads=[(8.0, 360.0)]
  RA=14.00000000  RB=18.00000000
  M(120)=1320.00000000  M(240)=1920.00000000  M(360)=1800.00000000
case C  L=720 a=12  w=0.08 kip/in, loads=[(5.0, 6.0)]
  RA=33.84310345  RB=28.75689655
  M(6)=-1.44000000  M(12)=-35.76000000  M(200)=3792.50344828  M(360)=4823.40000000  M(700)=214.05517241
"""

from Pynite import FEModel3D


def run(name, length, a, w, loads, xs):
    m = FEModel3D()
    nodes = sorted({0.0, a, length - a, length, *[x for _, x in loads]})
    names = {}
    for i, x in enumerate(nodes):
        names[x] = f"N{i}"
        m.add_node(names[x], x, 0, 0)
    m.add_material("C", E=4000.0, G=1600.0, nu=0.2, rho=0.0)
    m.add_section("S", A=100.0, Iy=1e4, Iz=1e4, J=1e4)
    m.add_member("M", names[0.0], names[length], "C", "S")
    m.def_support(names[a], True, True, True, True, False, False)
    m.def_support(names[length - a], False, True, True, False, False, False)
    if w:
        m.add_member_dist_load("M", "FY", -w, -w)
    for p, x in loads:
        m.add_node_load(names[x], "FY", -p)
    m.analyze_linear()
    ra = m.nodes[names[a]].RxnFY["Combo 1"]
    rb = m.nodes[names[length - a]].RxnFY["Combo 1"]
    print(f"case {name}  L={length:g} a={a:g}  w={w:g} kip/in, loads={loads}")
    print(f"  RA={ra:.8f}  RB={rb:.8f}")
    print("  " + "  ".join(f"M({x:g})={-m.members['M'].moment('Mz', x, 'Combo 1'):.8f}" for x in xs))


run("A", 600.0, 6.0, 0.1, [(12.0, 150.0)], [6.0, 150.0, 300.0, 450.0])
run("B", 480.0, 0.0, 0.05, [(8.0, 360.0)], [120.0, 240.0, 360.0])
run("C", 720.0, 12.0, 0.08, [(5.0, 6.0)], [6.0, 12.0, 200.0, 360.0, 700.0])
