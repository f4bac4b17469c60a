//! A member's service loads and its bearings: the input of the demand stage. Area loads
//! ("20 psf", "1.0 kPa") are multiplied by the tributary width; line loads ("0.8 klf",
//! "11.7 kN/m") are taken as given; the self-weight and the topping's weight are added
//! by the demand stage, from the section.

use super::*;

/// The largest area load accepted (a bound far above any floor or roof load).
const AREA_LOAD_MAX_KSI: f64 = 10.0 / 144.0; // 10 ksf
/// The largest line load accepted, kip/in (1000 klf).
const LINE_LOAD_MAX_KIP_IN: f64 = 1000.0 / 12.0;
/// The largest point load accepted, kip.
const POINT_LOAD_MAX_KIP: f64 = 100_000.0;

/// Whether the member takes its demand from loads (a `[member.loads]` table or a point
/// load is given).
pub(super) fn has_loads(m: &raw::Member) -> bool {
    m.loads.is_some() || !m.point_load.is_empty()
}

/// The member's loads (`None` where it has none, or where they are refused: the problem
/// is then recorded).
pub(super) fn loads(
    cx: &mut Ctx,
    m: &raw::Member,
    length: Option<f64>,
    region: Option<&Region>,
    topping: Option<&Topping>,
    concrete: Option<&Concrete>,
    defaults: &mut Vec<Default>,
) -> Option<Loads> {
    if !has_loads(m) {
        if m.span.is_some() {
            cx.problem(
                "span",
                "span is given but the member has no loads, so it would be used by nothing",
                Some("give [member.loads] (and any [[member.point_load]]) to derive the demand from the span, or remove span".to_string()),
            );
        }
        return None;
    }
    refuse_moments_with_loads(cx, m);
    let Some(length) = length else {
        cx.problem(
            "length",
            "length is missing: the member has loads, and the demand along the span needs the member's length",
            Some("the member's length, end to end".to_string()),
        );
        return None;
    };
    let span = span(cx, m, length, defaults)?;
    let sys = cx.sys;
    let empty = raw::Loads {
        superimposed_dead: None,
        live: None,
        roof_live: None,
        snow: None,
        width: None,
        shored: None,
        live_factor: None,
        live_factor_reason: None,
    };
    let l = m.loads.as_ref().unwrap_or(&empty);
    cx.enter(Seg::Key("loads"));
    let width = tributary_width(cx, l, region, topping, defaults);
    let uniform = uniform_loads(cx, l, width);
    let shored = shored(cx, l, topping, defaults);
    let (live_factor, live_factor_reason) = live_factor(cx, l, uniform.iter().any(|u| u.kind == LoadKind::Live));
    cx.leave();
    let points = point_loads(cx, m, length);
    let density = density_of(sys, concrete, "concrete.density", "the precast concrete", defaults);
    let topping_density =
        topping.map(|t| density_of(sys, Some(&t.concrete), "topping.density", "the topping", defaults));
    let bearing = (length - span) / 2.0;
    Some(Loads {
        span,
        bearing,
        width: width?,
        density,
        topping_density,
        shored,
        uniform,
        points: points?,
        live_factor: live_factor?,
        live_factor_reason,
    })
}

/// A member with loads takes its moments from them: a member-level mu or mnc beside
/// them is refused.
fn refuse_moments_with_loads(cx: &mut Ctx, m: &raw::Member) {
    for (key, given) in [("mu", m.mu.is_some()), ("mnc", m.mnc.is_some())] {
        if given {
            cx.problem(
                key,
                format!("the member gives both {key} and loads ([member.loads] or [[member.point_load]])"),
                Some(format!(
                    "either loads, from which the demand is derived along the span, or {key} by hand: not both (a location may still give its own mu)"
                )),
            );
        }
    }
}

/// The span between the centres of the bearings: given (within half the length and the
/// length), or the member's length.
fn span(cx: &mut Ctx, m: &raw::Member, length: f64, defaults: &mut Vec<Default>) -> Option<f64> {
    Some(match &m.span {
        // bearings within the quarter points: longer overhangs carry hogging moments
        // this version shows but does not check
        Some(_) => cx.ranged("span", &m.span, Dim::Length, 0.5 * length, length, false)?,
        None => {
            defaults.push(Default {
                key: "span".into(),
                text: "span between the centres of the bearings = the member's length (bearings at the ends)".into(),
            });
            length
        }
    })
}

/// The area (or line) loads of `[member.loads]`, each as a line load over the tributary
/// width.
fn uniform_loads(cx: &mut Ctx, l: &raw::Loads, width: Option<f64>) -> Vec<LineLoad> {
    let mut uniform = Vec::new();
    for (key, kind, q) in [
        ("superimposed_dead", LoadKind::Dead, &l.superimposed_dead),
        ("live", LoadKind::Live, &l.live),
        ("roof_live", LoadKind::RoofLive, &l.roof_live),
        ("snow", LoadKind::Snow, &l.snow),
    ] {
        if let (Some(q), Some(width)) = (q, width)
            && let Some((area_load, w)) = load_value(cx, key, q, width)
        {
            uniform.push(LineLoad { kind, source: format!("loads.{key}"), area_load, w, precast_only: false });
        }
    }
    uniform
}

/// Whether the topping is cast on a shored member (only with a topping; unshored, the
/// default, is stated).
fn shored(cx: &mut Ctx, l: &raw::Loads, topping: Option<&Topping>, defaults: &mut Vec<Default>) -> bool {
    let shored = l.shored.unwrap_or(false);
    if l.shored.is_some() && topping.is_none() {
        cx.problem(
            "shored",
            "shored is given but the member has no topping",
            Some(
                "shored = true says the topping is cast on a shored member: give it only with a [member.topping]"
                    .to_string(),
            ),
        );
    }
    if topping.is_some() && l.shored.is_none() {
        defaults.push(Default {
            key: "loads.shored".into(),
            text: "unshored construction: the self-weight and the topping's weight are carried by the precast unit alone; the other loads by the composite section".into(),
        });
    }
    shored
}

/// The tributary width: given, or the widest top of the section (the topping's width
/// where there is one).
fn tributary_width(
    cx: &mut Ctx,
    l: &raw::Loads,
    region: Option<&Region>,
    topping: Option<&Topping>,
    defaults: &mut Vec<Default>,
) -> Option<f64> {
    if l.width.is_some() {
        return cx.dim_len("width", &l.width);
    }
    let area_given = [&l.superimposed_dead, &l.live, &l.roof_live, &l.snow].iter().any(|q| q.is_some());
    let width = match (topping, region) {
        (Some(t), _) => t.width,
        (None, Some(r)) => r.x_max() - r.x_min(),
        (None, None) => return None,
    };
    if area_given {
        defaults.push(Default {
            key: "loads.width".into(),
            text: format!(
                "tributary width of the area loads = the widest top of the section, {} {}",
                crate::trace::show(width),
                cx.sys.names().length
            ),
        });
    }
    Some(width)
}

/// A load given as an area load (times the width) or a line load: the area load if
/// any, and the line load in coherent units.
fn load_value(cx: &mut Ctx, key: &'static str, q: &Q, width: f64) -> Option<(Option<f64>, f64)> {
    let text = match q {
        Q::Text(t) => t,
        Q::Num(v) => {
            let (a, l) = match cx.sys {
                System::Us => ("psf", "klf"),
                System::Si => ("kPa", "kN/m"),
            };
            cx.problem(
                key,
                format!("{key} = {} has no unit, so it could be an area load or a line load", num(*v)),
                Some(format!(
                    "a string with its unit: an area load such as \"{} {a}\" or a line load such as \"{} {l}\"",
                    num(*v),
                    num(*v)
                )),
            );
            return None;
        }
    };
    let area = cx.sys.parse(Dim::Stress, text);
    let (area_load, w) = match area {
        Ok(p) => (Some(p), p * width),
        Err(QuantityError::WrongDimension { found: Dim::LineLoad, .. }) => {
            let w = cx.quantity(key, &Some(q.clone()), Dim::LineLoad)?;
            (None, w)
        }
        Err(e) => {
            let why = match e {
                QuantityError::NoNumber => "does not start with a number".to_string(),
                QuantityError::UnknownUnit(u) => format!("has the unknown unit {u:?}"),
                QuantityError::WrongDimension { unit, found } => format!("is in {unit:?}, {}", found.name()),
            };
            cx.problem(
                key,
                format!("{key} = {} {why}", written(q)),
                Some(format!(
                    "an area load ({}) or a line load ({})",
                    System::accepted(Dim::Stress),
                    System::accepted(Dim::LineLoad)
                )),
            );
            return None;
        }
    };
    let max = System::Us.convert(cx.sys, Dim::Stress, AREA_LOAD_MAX_KSI);
    let wmax = System::Us.convert(cx.sys, Dim::LineLoad, LINE_LOAD_MAX_KIP_IN);
    if !(area_load.is_none_or(|p| (0.0..=max).contains(&p)) && (0.0..=wmax).contains(&w) && w.is_finite()) {
        let allowed = match cx.sys {
            System::Us => "0 <= area load <= 10 ksf; 0 <= line load <= 1000 klf",
            System::Si => "0 <= area load <= 478.8 kPa; 0 <= line load <= 14 594 kN/m",
        };
        cx.problem(key, format!("{key} = {} is out of range", written(q)), Some(allowed.to_string()));
        return None;
    }
    Some((area_load, w))
}

/// The live-load factor of the combination where live load accompanies roof live load
/// or snow: 1.0, or the reduced factor the basis permits, with the reason.
fn live_factor(cx: &mut Ctx, l: &raw::Loads, has_live: bool) -> (Option<f64>, Option<String>) {
    let reason = cx.text("live_factor_reason", &l.live_factor_reason, limits::SHORT_TEXT);
    let (reduced, clause) = cx.basis.reduced_live_factor();
    match l.live_factor {
        None | Some(1.0) => {
            if l.live_factor_reason.is_some() {
                cx.problem(
                    "live_factor_reason",
                    "live_factor_reason is given but the live-load factor is not reduced",
                    Some(format!("give it with live_factor = {reduced}")),
                );
            }
            (Some(1.0), None)
        }
        Some(f) if f == reduced => {
            if !has_live {
                cx.warn("live_factor", "live_factor is given but the member has no live load");
            }
            match reason {
                Some(r) if !r.trim().is_empty() => (Some(f), Some(r)),
                _ => {
                    cx.problem(
                        "live_factor_reason",
                        format!("live_factor = {f} needs live_factor_reason"),
                        Some(format!("why {} permits the reduced factor here (not a garage, not public assembly, live load at most 100 psf)", clause)),
                    );
                    (None, None)
                }
            }
        }
        Some(f) => {
            cx.problem(
                "live_factor",
                format!("live_factor = {} is not a live-load factor the design basis knows", num(f)),
                Some(format!("1.0 (the default) or {reduced} ({clause})")),
            );
            (None, None)
        }
    }
}

/// The concentrated loads.
fn point_loads(cx: &mut Ctx, m: &raw::Member, length: f64) -> Option<Vec<PointLoad>> {
    if m.point_load.len() > limits::LOCATIONS {
        cx.problem(
            "point_load",
            format!("{} point loads", m.point_load.len()),
            Some(format!("at most {}", limits::LOCATIONS)),
        );
        return None;
    }
    let pmax = System::Us.convert(cx.sys, Dim::Force, POINT_LOAD_MAX_KIP);
    let mut out = Vec::new();
    let mut ok = true;
    for (k, p) in m.point_load.iter().enumerate() {
        cx.enter(Seg::Key("point_load"));
        cx.enter(Seg::Idx(k));
        let name = cx.text("name", &p.name, 40).unwrap_or_else(|| format!("P{}", k + 1));
        let kind = match p.kind.as_deref() {
            Some("dead") => Some(LoadKind::Dead),
            Some("live") => Some(LoadKind::Live),
            Some("roof_live") => Some(LoadKind::RoofLive),
            Some("snow") => Some(LoadKind::Snow),
            Some(other) => {
                cx.problem(
                    "kind",
                    format!("kind = {other:?} is not a load kind"),
                    Some("\"dead\", \"live\", \"roof_live\" or \"snow\"".to_string()),
                );
                None
            }
            None => {
                cx.problem(
                    "kind",
                    "kind is missing",
                    Some("\"dead\", \"live\", \"roof_live\" or \"snow\"".to_string()),
                );
                None
            }
        };
        let load = cx.ranged("load", &p.load, Dim::Force, 0.0, pmax, false);
        let load = cx.required("load", load, "the concentrated service load");
        let x = cx.ranged("x", &p.x, Dim::Length, 0.0, length, false);
        let x = cx.required("x", x, "where the load acts, from the left end of the member");
        match (kind, load, x) {
            (Some(kind), Some(p), Some(x)) => out.push(PointLoad { kind, name, p, x }),
            _ => ok = false,
        }
        cx.leave();
        cx.leave();
    }
    ok.then_some(out)
}

/// The density whose weight the demand stage takes: the concrete's, where given (the
/// same density its Ec is taken from), or the common default.
fn density_of(sys: System, c: Option<&Concrete>, key: &str, what: &str, defaults: &mut Vec<Default>) -> f64 {
    if let Some(Concrete { ec_source: EcSource::Density { wc }, .. }) = c {
        return *wc;
    }
    let (v, text) = match sys {
        System::Us => (150.0, "150 pcf"),
        System::Si => (2400.0, "2400 kg/m³"),
    };
    defaults.push(Default {
        key: key.to_string(),
        text: format!("the weight of {what} from a density of {text}, reinforcement included (common practice)"),
    });
    v
}
