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
    cx.leave();
    let (eci, eci_source) = eci?;
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
    let mut ok = true;
    // the force before release needs every tensioned layer's jacking stress
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
    cx.enter(Seg::Key("losses"));
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
    let vs = l
        .volume_to_surface
        .as_ref()
        .map(|_| cx.ranged("volume_to_surface", &l.volume_to_surface, Dim::Length, 0.0, r.dim_max / 10.0, true));
    cx.leave();
    let volume_to_surface = match vs {
        Some(v) => Some(v?),
        None => None,
    };
    if !ok {
        return None;
    }
    Some(Some(LossMethod { relative_humidity: rh?, volume_to_surface }))
}
