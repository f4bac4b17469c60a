//! The options of the stress checks at release and in service (`[member.stresses]`):
//! the sustained share of the live load and the bonded reinforcement of the tension zone
//! at release.

use super::*;

/// The options, each defaulted where not given (the defaults are shown in the design
/// basis only where the member's stresses are checked: a member with loads).
pub(super) fn options(cx: &mut Ctx, m: &raw::Member, has_loads: bool) -> Option<StressOptions> {
    let fy_default = match cx.sys {
        System::Us => 60.0,
        System::Si => 420.0,
    };
    let Some(t) = &m.stresses else {
        return Some(StressOptions { sustained_live: 0.0, release_reinforcement: false, reinforcement_fy: fy_default });
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
    cx.leave();
    Some(StressOptions {
        sustained_live: sustained?,
        release_reinforcement: t.release_reinforcement.unwrap_or(false),
        reinforcement_fy: fy?,
    })
}
