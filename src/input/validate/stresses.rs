//! The options of the stress checks at release and in service (`[member.stresses]`):
//! the sustained share of the live load, the bonded reinforcement of the tension zone
//! at release, the live-load deflection limit and the spacing of the reinforcement
//! closest to the tension face (crack control of a class C member).

use super::*;

/// The options, each defaulted where not given (the defaults are shown in the design
/// basis only where the member's stresses are checked: a member with loads).
pub(super) fn options(cx: &mut Ctx, m: &raw::Member, has_loads: bool) -> Option<StressOptions> {
    let fy_default = match cx.sys {
        System::Us => 60.0,
        System::Si => 420.0,
    };
    let Some(t) = &m.stresses else {
        return Some(StressOptions {
            sustained_live: 0.0,
            release_reinforcement: false,
            reinforcement_fy: fy_default,
            deflection_limit: None,
            tension_face_spacing: None,
        });
    };
    if !has_loads {
        cx.warn(
            "stresses",
            "[member.stresses] is given, but the member has no [member.loads]: its stresses are not checked (they need the moments along the member)",
        );
    }
    cx.enter(Seg::Key("stresses"));
    let sustained = match t.sustained_live {
        Some(v) => cx.ratio("sustained_live", Some(v), 0.0, 1.0),
        None => Some(0.0),
    };
    let fy = match &t.reinforcement_fy {
        Some(_) => {
            let (lo, hi) = match cx.sys {
                System::Us => (40.0, 80.0),
                System::Si => (280.0, 550.0),
            };
            cx.ranged("reinforcement_fy", &t.reinforcement_fy, Dim::Stress, lo, hi, false)
        }
        None => Some(fy_default),
    };
    let limit = match &t.deflection_limit {
        Some(text) => Some(deflection_limit(cx, text)?),
        None => None,
    };
    let spacing = match &t.tension_face_spacing {
        Some(_) => {
            let hi = match cx.sys {
                System::Us => 48.0,
                System::Si => 1200.0,
            };
            Some(cx.ranged("tension_face_spacing", &t.tension_face_spacing, Dim::Length, 0.0, hi, true)?)
        }
        None => None,
    };
    cx.leave();
    Some(StressOptions {
        sustained_live: sustained?,
        release_reinforcement: t.release_reinforcement.unwrap_or(false),
        reinforcement_fy: fy?,
        deflection_limit: limit,
        tension_face_spacing: spacing,
    })
}

/// "L/360" or "L/180": the limits of ACI 318-19 Table 24.2.2 on the immediate
/// deflection of the live load (its L/480 and L/240 rows limit the deflection after the
/// attachment of nonstructural elements, long-term, which this version does not compute).
fn deflection_limit(cx: &mut Ctx, text: &str) -> Option<f64> {
    let n = text
        .trim()
        .strip_prefix(['L', 'l'])
        .and_then(|r| r.trim_start().strip_prefix('/'))
        .and_then(|r| r.trim().parse::<f64>().ok())
        .filter(|n| *n == 180.0 || *n == 360.0);
    if n.is_none() {
        cx.problem(
            "deflection_limit",
            format!("deflection_limit = {text:?} is not a limit this version reads"),
            Some(
                "\"L/360\" (floors) or \"L/180\" (flat roofs): the limits of ACI 318-19 Table 24.2.2 on the immediate live-load deflection; its L/480 and L/240 rows limit the deflection after attachment of nonstructural elements, which this version does not compute"
                    .to_string(),
            ),
        );
    }
    n
}
