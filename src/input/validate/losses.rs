//! The concrete at release (`fci`, `eci` in `[member.concrete]`) and the method of
//! computed prestress losses (`[member.losses]`), with what the method needs of the
//! member: f'ci and the member's loads (its self-weight and superimposed dead load).

use super::*;

/// The loss methods this version knows.
const METHODS: &str = "\"zia-1979\" (Zia et al. 1979, as given in the PCI Design Handbook)";

/// f'ci and Eci, where f'ci is given: Eci by the basis's rule for Ec (with the unit
/// weight where one is given), unless given.
pub(super) fn release(
    cx: &mut Ctx,
    m: &raw::Member,
    concrete: Option<&Concrete>,
    defaults: &mut Vec<Default>,
) -> Option<Option<Release>> {
    let Some(c) = &m.concrete else { return Some(None) };
    if c.fci.is_none() {
        if c.eci.is_some() {
            cx.enter(Seg::Key("concrete"));
            cx.problem("eci", "eci is given without fci", Some("fci (f'ci at release) with it".to_string()));
            cx.leave();
            return None;
        }
        return Some(None);
    }
    let concrete = concrete?;
    let r = ranges(cx.sys);
    cx.enter(Seg::Key("concrete"));
    let fci = cx.ranged("fci", &c.fci, Dim::Stress, 0.5 * r.fc.0, concrete.fc, false);
    let eci = fci.and_then(|fci| match &c.eci {
        Some(_) => cx.ranged("eci", &c.eci, Dim::Stress, r.ec.0, r.ec.1, false).map(|v| (v, EcSource::Given)),
        // a given Ec follows no rule that Eci could follow too
        None if concrete.ec_source == EcSource::Given => {
            cx.problem(
                "eci",
                "eci is missing: Ec is given, so Eci cannot be had by the rule for Ec",
                Some(format!("Eci at release, {} to {} {}", r.ec.0, r.ec.1, cx.sys.names().stress)),
            );
            None
        }
        None => Some(match concrete.ec_source {
            EcSource::Density { wc } => (cx.basis.ec_density(fci, wc).value, EcSource::Density { wc }),
            _ => {
                defaults.push(Default {
                    key: "concrete.eci".into(),
                    text: format!("Eci from f'ci by the rule for Ec: {}", cx.basis.ec_default_text()),
                });
                (cx.basis.ec_normalweight(fci).value, EcSource::Normalweight)
            }
        }),
    });
    let (eci, eci_source) = match eci {
        Some(e) => e,
        None => {
            cx.leave();
            return None;
        }
    };
    if eci > concrete.ec {
        cx.warn(
            "eci",
            format!(
                "Eci = {} exceeds Ec = {}; confirm them",
                cx.shown(Dim::Stress, eci),
                cx.shown(Dim::Stress, concrete.ec)
            ),
        );
    }
    cx.leave();
    Some(Some(Release { fci: fci?, eci, eci_source }))
}

/// The loss method, where a strand layer takes computed losses; its needs are input
/// errors naming the key.
pub(super) fn method(
    cx: &mut Ctx,
    m: &raw::Member,
    strands: &[StrandLayer],
    release: Option<&Release>,
    has_loads: bool,
    length: Option<f64>,
) -> Option<Option<LossMethod>> {
    let computed = strands.iter().any(|s| matches!(s.fse_source, FseSource::Computed { .. }));
    let Some(l) = &m.losses else {
        if computed {
            cx.problem(
                "losses",
                "the [member.losses] table is missing: a strand layer gives jacking without fse or losses, so its losses are computed",
                Some(format!("[member.losses] with method = {METHODS} and relative_humidity")),
            );
            return None;
        }
        return Some(None);
    };
    if !computed {
        cx.warn(
            "losses",
            "[member.losses] is given, but every strand layer gives fse or losses: nothing is computed by it (a layer takes computed losses when it gives jacking alone)",
        );
        return Some(None);
    }
    let mut ok = method_applies(cx, m, strands, length);
    ok &= needs_of_the_member(cx, strands, release, has_loads);
    cx.enter(Seg::Key("losses"));
    let table = method_table(cx, l);
    cx.leave();
    let (rh, volume_to_surface) = table?;
    if !ok {
        return None;
    }
    Some(Some(LossMethod { relative_humidity: rh, volume_to_surface }))
}

/// What computed losses need of the member: every tensioned layer's jacking stress (for
/// the force before release), f'ci and the member's loads. Each missing one is a
/// problem naming its key.
fn needs_of_the_member(cx: &mut Ctx, strands: &[StrandLayer], release: Option<&Release>, has_loads: bool) -> bool {
    let mut ok = true;
    for (k, s) in strands.iter().enumerate() {
        if matches!(s.fse_source, FseSource::Given) && s.fse > 0.0 {
            cx.enter(Seg::Key("strands"));
            cx.enter(Seg::Idx(k));
            cx.problem(
                "fse",
                "fse is given on this layer while another layer's losses are computed: the force before release needs each tensioned layer's jacking stress",
                Some("jacking (with losses, or alone to have them computed) on every tensioned layer".to_string()),
            );
            cx.leave();
            cx.leave();
            ok = false;
        }
    }
    if release.is_none() {
        cx.enter(Seg::Key("concrete"));
        cx.problem(
            "fci",
            "fci is missing: computed losses need f'ci at release (elastic shortening uses Eci)",
            Some(format!("f'ci in {}", cx.sys.names().stress)),
        );
        cx.leave();
        ok = false;
    }
    if !has_loads {
        cx.problem(
            "loads",
            "the [member.loads] table is missing: computed losses take the self-weight and the superimposed dead load from the member's loads",
            Some("[member.loads] with the member's service loads, or fse or losses given on each layer".to_string()),
        );
        ok = false;
    }
    ok
}

/// The keys of `[member.losses]` (the context is inside it): the method, the relative
/// humidity and V/S where given.
fn method_table(cx: &mut Ctx, l: &raw::Losses) -> Option<(f64, Option<f64>)> {
    let mut ok = true;
    match l.method.as_deref() {
        Some("zia-1979") => {}
        Some(other) => {
            cx.problem(
                "method",
                format!("method = {other:?} is not a loss method this version knows"),
                Some(METHODS.to_string()),
            );
            ok = false;
        }
        None => {
            cx.problem("method", "method is missing", Some(METHODS.to_string()));
            ok = false;
        }
    }
    let rh = cx.ratio("relative_humidity", l.relative_humidity, 20.0, 100.0);
    if l.relative_humidity.is_none() {
        cx.problem(
            "relative_humidity",
            "relative_humidity is missing",
            Some("the average annual ambient relative humidity, percent (20 to 100)".to_string()),
        );
    }
    let r = ranges(cx.sys);
    let vs = match &l.volume_to_surface {
        Some(_) => {
            Some(cx.ranged("volume_to_surface", &l.volume_to_surface, Dim::Length, 0.0, r.dim_max / 10.0, true)?)
        }
        None => None,
    };
    let factor = match cx.sys {
        System::Us => 0.06,
        System::Si => 0.0024,
    };
    if vs.is_some_and(|v| 1.0 - factor * v <= 0.0) {
        cx.warn(
            "volume_to_surface",
            "V/S is so large that the method's shrinkage term (1 - 0.06 V/S, in) is not positive: the shrinkage loss is taken as 0; confirm V/S",
        );
    }
    if !ok {
        return None;
    }
    Some((rh?, vs))
}

/// What the method assumes of the member, each an input error naming its key: concrete
/// of normal or sand-lightweight weight (lambda at least 0.85; all-lightweight concrete
/// is outside the method's calibration, from memory), low-relaxation strand (fpy = 0.90
/// fpu: the tables used are the method's low-relaxation rows), and every layer bonded
/// and fully transferred at the middle of the length, where the losses are computed.
fn method_applies(cx: &mut Ctx, m: &raw::Member, strands: &[StrandLayer], length: Option<f64>) -> bool {
    let mut ok = true;
    if let Some(lambda) = m.concrete.as_ref().and_then(|c| c.lambda)
        && lambda < 0.85
    {
        cx.enter(Seg::Key("concrete"));
        cx.problem(
            "lambda",
            format!("lambda = {} (all-lightweight concrete) is outside the loss method's calibration", num(lambda)),
            Some("lambda 0.85 to 1.0 for computed losses, or give fse or losses".to_string()),
        );
        cx.leave();
        ok = false;
    }
    let (d1, _) = cx.basis.development_divisors();
    for (k, s) in strands.iter().enumerate() {
        let FseSource::Computed { fpj, .. } = s.fse_source else { continue };
        cx.enter(Seg::Key("strands"));
        cx.enter(Seg::Idx(k));
        if s.fpy < 0.9 * s.fpu * (1.0 - 1e-9) {
            cx.problem(
                "fpy",
                format!("fpy = {} is below 0.90 fpu: not low-relaxation strand, whose rows of the method's tables are the ones used", cx.shown(Dim::Stress, s.fpy)),
                Some("fpy = 0.90 fpu (low-relaxation strand) for computed losses, or give fse or losses".to_string()),
            );
            ok = false;
        }
        // the transfer length at fpj bounds the one at fse
        if let Some(len) = length
            && s.debonded_length + fpj / d1 * s.diameter >= len / 2.0
        {
            cx.problem(
                "debonded_length",
                format!(
                    "the layer is debonded over {} and its strand transfers over up to {} more: it is not fully bonded at the middle of the length, where computed losses are taken",
                    cx.shown(Dim::Length, s.debonded_length),
                    cx.shown(Dim::Length, fpj / d1 * s.diameter)
                ),
                Some("a debonded length that leaves the middle of the member fully bonded, or fse or losses given".to_string()),
            );
            ok = false;
        }
        cx.leave();
        cx.leave();
    }
    ok
}
