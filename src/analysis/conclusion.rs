//! The words of a location's result, made in one place: its status (adequate,
//! adequate on open conditions, not adequate), the open conditions and cautions, and the
//! conclusion sentence. The templates, `check` and the cover print what is decided here.

use super::LocationResult;
use super::curve::CurveResult;
use crate::trace::show;
use crate::units::{System, UnitNames};
use serde::Serialize;

/// ASTM A416: the minimum elongation of seven-wire strand at rupture (common practice
/// to compare the total strand strain at nominal strength with it).
pub const STRAND_ELONGATION: f64 = 0.035;

/// The result of a location, a member or a package.
#[derive(Debug, Clone, Copy, PartialEq, Eq, PartialOrd, Ord, Serialize)]
#[serde(rename_all = "snake_case")]
pub enum Status {
    /// Every check made here is met.
    Pass,
    /// Met only on the open conditions listed (something this package does not check).
    Conditional,
    /// A check is not met.
    Fail,
}

impl Status {
    pub fn word(self) -> &'static str {
        match self {
            Status::Pass => "pass",
            Status::Conditional => "conditional",
            Status::Fail => "FAIL",
        }
    }
    /// The worse of two results.
    pub fn and(self, other: Status) -> Status {
        self.max(other)
    }
}

/// What an open condition is about.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
#[serde(rename_all = "snake_case")]
pub enum ConditionKind {
    /// The minimum-strength requirement waived on a shear condition not checked here.
    MinimumWaived,
    /// The strand strain at nominal strength beyond its minimum elongation.
    StrandRupture,
    /// The top fibre in tension beyond fr under the prestress alone.
    TopCracksUnderPrestress,
    /// The bottom fibre's precompression beyond f'c under the prestress alone.
    Overcompressed,
    /// The precast unit cracks under the non-composite moment before the topping acts.
    CrackedBeforeComposite,
    /// Class C in service: the cracked-section stresses and crack control not checked.
    ClassC,
    /// The stresses at release not checked (f'ci or the stress after release not given).
    ReleaseNotChecked,
    /// A live-load deflection limit asked for and not checked (class T or C).
    DeflectionNotComputed,
}

impl ConditionKind {
    /// What conditions of this kind ask, in a line without numbers (the cover groups
    /// the open items by kind).
    pub fn title(self) -> &'static str {
        match self {
            ConditionKind::MinimumWaived => {
                "the waiver of the minimum flexural strength rests on a shear strength at least twice that required: shear is not checked here"
            }
            ConditionKind::StrandRupture => {
                "the strand strain at nominal strength exceeds the minimum elongation of ASTM A416: review the strand's elongation capacity"
            }
            ConditionKind::TopCracksUnderPrestress => {
                "the top fibre cracks under the prestress alone: check the stresses at release and in service"
            }
            ConditionKind::Overcompressed => {
                "the precompression under the prestress alone exceeds f'c: check the stresses at release and in service"
            }
            ConditionKind::CrackedBeforeComposite => {
                "the precast unit cracks under the non-composite moment before the topping acts: the cracking moment and the minimum strength need another method"
            }
            ConditionKind::ClassC => {
                "the member is class C in service: part of its crack control on the cracked section is left to the engineer (see the member's stress sheet)"
            }
            ConditionKind::DeflectionNotComputed => {
                "the live-load deflection of a class T or C member could not be found on the cracked section here: check it by other means"
            }
            ConditionKind::ReleaseNotChecked => {
                "the stresses at release are not checked: give f'ci and the stress just after release of each tensioned layer"
            }
        }
    }
}

/// An open condition or caution: the result holds only if it is settled elsewhere.
#[derive(Debug, Clone, Serialize)]
pub struct Condition {
    pub kind: ConditionKind,
    /// One line for the cover's open items.
    pub short: String,
    pub text: String,
}

/// What the moment-curvature analysis of a section says of strand rupture.
pub enum RuptureCheck<'a> {
    /// No strand strain beyond the elongation: nothing to ask.
    NotAsked,
    /// The curve of this section.
    Curve(&'a CurveResult),
    /// The curve could not be found (why).
    Failed(String),
}

/// Settles a location's conditions, status and conclusion from its results.
/// `stresses_checked`: the member's stresses at release and in service are checked (its
/// stress table), which settles what the prestress alone would leave open.
pub fn settle(l: &mut LocationResult, sys: System, rupture: RuptureCheck, stresses_checked: bool) {
    // a conclusion is never written over a number that is not one
    if let Some(conclusion) = not_finite(l) {
        l.status = Status::Fail;
        l.pass = false;
        l.conditions = Vec::new();
        l.conclusion = conclusion;
        return;
    }
    let u = sys.names();
    let mut conditions = Vec::new();
    let min_ok = l.min_reinforcement.ok || l.min_reinforcement.waiver_flexure;
    let pass = l.strength_ok && min_ok;
    if pass && !l.min_reinforcement.ok && l.min_reinforcement.waiver_flexure {
        conditions.push(minimum_waived(l, &u));
    }
    if l.rupture_risk {
        strand_rupture(l, &u, rupture, &mut conditions);
    }
    if l.capped_strain > STRAND_ELONGATION {
        l.notes.push(format!(
            "The strand strain of up to {} % here is that of strand not fully developed at this location: its stress is held at fpx and it would slip before it ruptures, so the strain is not compared with the {} % elongation of ASTM A416.",
            show(l.capped_strain * 100.0),
            show(STRAND_ELONGATION * 100.0)
        ));
    }
    if stresses_checked {
        checked_stresses_note(l, &u);
        conditions
            .extend(unchecked_stresses(l, &u).into_iter().filter(|c| c.kind == ConditionKind::CrackedBeforeComposite));
    } else {
        conditions.extend(unchecked_stresses(l, &u));
    }
    l.status = if !pass {
        Status::Fail
    } else if conditions.is_empty() {
        Status::Pass
    } else {
        Status::Conditional
    };
    l.pass = pass;
    l.conditions = conditions;
    l.conclusion = sentence(l, sys, pass);
}

/// The conclusion of a location where a number it rests on is not finite, if any is not.
fn not_finite(l: &LocationResult) -> Option<String> {
    let numbers = [l.mu, l.mn, l.phi_mn, l.mcr, l.min_reinforcement.required];
    let bad = numbers.iter().position(|v| !v.is_finite())?;
    let names = ["Mu", "Mn", "φMn", "Mcr", "1.2 Mcr"];
    Some(format!(
        "No conclusion at {}: {} could not be computed as a finite number from this input. Check the input's magnitudes.",
        l.name, names[bad]
    ))
}

/// The minimum strength waived on the condition of a shear strength not checked here.
fn minimum_waived(l: &LocationResult, u: &UnitNames) -> Condition {
    Condition {
        kind: ConditionKind::MinimumWaived,
        short: format!(
            "shear strength at least twice that required, on which the waiver of the minimum strength ({}) rests: not checked here",
            l.min_reinforcement.waiver_clause
        ),
        text: format!(
            "φMn = {} is less than 1.2 Mcr = {} {}; the minimum-strength requirement ({}) is waived by {} because φMn ≥ 2 Mu, on the condition that the shear strength is also at least twice that required. Shear is not checked in this package: show it elsewhere.",
            show(l.phi_mn),
            show(l.min_reinforcement.required),
            u.moment,
            l.min_reinforcement.clause,
            l.min_reinforcement.waiver_clause
        ),
    }
}

/// A strand strain beyond the minimum elongation: a note where the section's
/// moment-curvature analysis settles it, else an open condition.
fn strand_rupture(l: &mut LocationResult, u: &UnitNames, rupture: RuptureCheck, conditions: &mut Vec<Condition>) {
    let strain = format!(
        "The total strand strain at nominal strength, {} %, exceeds the {} % minimum elongation of ASTM A416",
        show(l.max_strand_strain * 100.0),
        show(STRAND_ELONGATION * 100.0)
    );
    let text = match rupture {
        RuptureCheck::Curve(c) if c.ended_by == "concrete crushing" => {
            l.notes.push(format!(
                "{strain}, but the moment-curvature analysis of this section (fibres, {}) ends by concrete crushing at M = {} {} with the extreme strand strain at {} %: the strand does not reach its rupture strain first.",
                c.concrete_model,
                show(c.ultimate.moment),
                u.moment,
                show(c.points.last().map_or(0.0, |p| p.strand_strain) * 100.0),
            ));
            return;
        }
        RuptureCheck::Curve(c) if c.ended_by == "strand rupture" && l.phi * c.ultimate.moment >= l.mu => {
            l.notes.push(format!(
                "{strain}. The moment-curvature analysis of this section reaches strand rupture at a moment of {} {}; φ times that, {} {}, is at least Mu = {} {}: the demand is carried before the strand ruptures.{}",
                show(c.ultimate.moment),
                u.moment,
                show(l.phi * c.ultimate.moment),
                u.moment,
                show(l.mu),
                u.moment,
                if c.ultimate.moment < l.mn {
                    format!(" The stress-block Mn = {} {} is not reached before rupture; the demand is met by the lower moment.", show(l.mn), u.moment)
                } else {
                    String::new()
                }
            ));
            return;
        }
        RuptureCheck::Curve(c) => format!(
            "{strain}, and the moment-curvature analysis of this section ends by {} at a moment of {} {} (φ times that: {} {}, against Mu = {} {}): the strand may rupture before the section reaches its strength. Review the strand's elongation capacity.",
            c.ended_by,
            show(c.ultimate.moment),
            u.moment,
            show(l.phi * c.ultimate.moment),
            u.moment,
            show(l.mu),
            u.moment
        ),
        RuptureCheck::Failed(why) => format!(
            "{strain}, so the strand may rupture before the concrete reaches its crushing strain; the moment-curvature analysis that could settle it failed ({why}). Review the strand's elongation capacity."
        ),
        RuptureCheck::NotAsked => format!(
            "{strain}, so the strand may rupture before the concrete reaches its crushing strain. Review the strand's elongation capacity."
        ),
    };
    conditions.push(Condition { kind: ConditionKind::StrandRupture, short: rupture_short(l), text });
}

/// Where the member's stresses are checked, what the prestress alone does here is a
/// note pointing to them, not an open condition.
fn checked_stresses_note(l: &mut LocationResult, u: &UnitNames) {
    let alone = &l.prestress_alone;
    if alone.top_cracks {
        l.notes.push(format!(
            "Under the effective prestress alone the top fibre of the precast unit is in tension, {} {}, beyond fr = {} {}. The member's stresses at release and in service are checked along the member (its stress table): they settle this.",
            show(alone.top),
            u.stress,
            show(alone.fr),
            u.stress
        ));
    }
    if alone.over_compressed {
        l.notes.push(format!(
            "Under the effective prestress alone the bottom fibre's precompression, {} {}, exceeds f'c = {} {}. The member's stresses at release and in service are checked along the member (its stress table): they settle this.",
            show(-alone.bottom),
            u.stress,
            show(alone.fc),
            u.stress
        ));
    }
}

/// The open conditions of stresses this package does not check: the top fibre cracking
/// or the precompression beyond f'c under the prestress alone, and the precast unit
/// cracking before the topping acts.
fn unchecked_stresses(l: &LocationResult, u: &UnitNames) -> Vec<Condition> {
    let alone = &l.prestress_alone;
    let mut conditions = Vec::new();
    if alone.top_cracks {
        conditions.push(Condition {
            kind: ConditionKind::TopCracksUnderPrestress,
            short: format!(
                "top fibre cracks under the prestress alone ({} > fr = {} {}): release and service stresses to be checked",
                show(alone.top),
                show(alone.fr),
                u.stress
            ),
            text: format!(
                "Under the effective prestress alone the top fibre of the precast unit is in tension, {} {}, beyond fr = {} {}: it cracks before any load acts (at release, with the higher stress then, more so). The stresses at release are not checked for this member (they need its loads, f'ci and the stress just after release of each layer): check them, and provide top reinforcement or change the strand pattern.",
                show(alone.top),
                u.stress,
                show(alone.fr),
                u.stress
            ),
        });
    }
    if alone.over_compressed {
        conditions.push(Condition {
            kind: ConditionKind::Overcompressed,
            short: format!(
                "precompression {} {} beyond f'c under the prestress alone: release and service stresses to be checked",
                show(-alone.bottom),
                u.stress
            ),
            text: format!(
                "Under the effective prestress alone the bottom fibre's precompression, {} {}, exceeds f'c = {} {}. The stresses at release are not checked for this member (they need its loads, f'ci and the stress just after release of each layer): check them.",
                show(-alone.bottom),
                u.stress,
                show(alone.fc),
                u.stress
            ),
        });
    }
    if l.cracked_before_composite {
        conditions.push(Condition {
            kind: ConditionKind::CrackedBeforeComposite,
            short: "the precast unit cracks under the non-composite moment: Mcr and the minimum strength to be settled otherwise".into(),
            text: format!(
                "The non-composite moment Mnc exceeds the moment that cracks the precast unit alone, Sb (fr + fpe): it cracks before the topping acts. The composite cracking moment shown ({} {}) and the minimum-strength check built on it do not then apply; settle both by another method, or check the non-composite moment.",
                show(l.mcr),
                u.moment
            ),
        });
    }
    conditions
}

fn rupture_short(l: &LocationResult) -> String {
    format!(
        "strand strain {} % beyond the {} % elongation of ASTM A416: the strand's elongation capacity to be reviewed",
        show(l.max_strand_strain * 100.0),
        show(STRAND_ELONGATION * 100.0)
    )
}

/// The first sentence of the boxed conclusion.
fn sentence(l: &LocationResult, sys: System, pass: bool) -> String {
    let u = sys.names();
    let at_x = match l.x {
        Some(x) => format!("at x = {} {} from the left end ({})", show(x), u.length, l.name),
        None => format!("at the {} (strands fully developed)", l.name),
    };
    if pass {
        let open = if l.conditions.is_empty() {
            String::new()
        } else {
            format!(
                " This holds only on the {} open condition{} below.",
                l.conditions.len(),
                if l.conditions.len() == 1 { "" } else { "s" }
            )
        };
        format!(
            "Flexural strength adequate {at_x}: Mu = {} ≤ φMn = {} {} (ratio {}).{open}",
            show(l.mu),
            show(l.phi_mn),
            u.moment,
            crate::trace::ratio_text(l.ratio)
        )
    } else {
        let mut why = Vec::new();
        if !l.strength_ok {
            why.push(format!("Mu = {} exceeds φMn = {} {}", show(l.mu), show(l.phi_mn), u.moment));
        }
        if !(l.min_reinforcement.ok || l.min_reinforcement.waiver_flexure) {
            why.push(format!(
                "φMn = {} is less than 1.2 Mcr = {} {} ({})",
                show(l.phi_mn),
                show(l.min_reinforcement.required),
                u.moment,
                l.min_reinforcement.clause
            ));
        }
        format!("Flexural strength NOT adequate {at_x}: {}.", why.join("; "))
    }
}
