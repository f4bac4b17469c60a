//! Commented starter inputs written by `strainsheet new`.

/// A starter in US units: one untopped double tee.
pub const US: &str = r#"# strainsheet input: flexural strength of pretensioned members.
# Bare numbers are in the package's units (us: in, in2, ksi, kip, kip-ft);
# a string may name its own unit: "12.7 mm", "5200 kip-in", "6000 psi".
format = 1

[package]
title = "Flexural strength of pretensioned members"
project = "Example project"
project_number = "0000"
client = "Example client"
revision = "0"
date = 2026-12-01          # the report date (the program never reads the clock)
units = "us"
basis = "ACI 318-19"

[[package.signoff]]        # roles: prepared, checked (required), approved (optional)
role = "prepared"
name = "Preparer name"
license = "PE 00000"
# date = 2026-12-01        # undated sign-offs keep the package marked DRAFT

[[package.signoff]]
role = "checked"
name = "Checker name"

[[member]]
id = "DT-1"
description = "Untopped double tee, 10 ft wide, 24 in deep"
length = 720.0             # end to end, in; locations are measured from the left end

[member.concrete]
fc = 6.0                   # ksi; Ec and fr follow ACI 318-19 19.2.2.1(b) and 19.2.3.1

[member.section]
shape = "double_tee"
flange_width = 120.0
flange_thickness = 4.0
height = 24.0
stem_spacing = 60.0
stem_width_top = 7.75
stem_width_bottom = 5.75

[[member.strands]]         # one layer: 4 strands per stem
height = 3.0               # from the bottom (or depth = ... from the top)
count = 8
diameter = 0.5             # area from the ASTM A416 table
jacking = 0.75             # fraction of fpu
losses = 35.0              # total prestress losses, ksi (no default: give fse or losses,
                           # or leave both out to have them computed: fci in
                           # [member.concrete], [member.losses] with method = "zia-1979"
                           # and relative_humidity, and the member's [member.loads])

[[member.location]]        # check locations: name, x from the left end, mu there
name = "midspan"
x = 360.0
mu = 420.0                 # factored moment, kip-ft
"#;

/// A starter in SI units: one hollow-core plank.
pub const SI: &str = r#"# strainsheet input: flexural strength of pretensioned members.
# Bare numbers are in the package's units (si: mm, mm2, MPa, kN, kN-m);
# a string may name its own unit: "0.5 in", "450 kN-m", "45 MPa".
format = 1

[package]
title = "Flexural strength of pretensioned members"
project = "Example project"
project_number = "0000"
client = "Example client"
revision = "0"
date = 2026-12-01
units = "si"
basis = "ACI 318M-19"

[[package.signoff]]
role = "prepared"
name = "Preparer name"

[[package.signoff]]
role = "checked"
name = "Checker name"

[[member]]
id = "HC-1"
description = "Hollow-core plank, 1200 mm wide, 250 mm deep"
length = 9000.0
mu = 160.0                 # kN-m

[member.concrete]
fc = 45.0                  # MPa

[member.section]
shape = "hollow_core"
width = 1200.0
height = 250.0
void_count = 6
void_diameter = 170.0
void_center_height = 125.0

[[member.strands]]
height = 40.0
count = 6
diameter = 12.7
fse = 1100.0               # effective prestress after all losses, MPa
"#;
