//! A concrete (precast or topping): f'c, λ, Ec and fr (given, or by the design basis),
//! the curve of the fibre analysis.

use super::*;

/// The concrete keys of a table (`[member.concrete]` or `[member.topping]`).
pub(super) struct ConcreteKeys<'a> {
    pub fc: &'a Option<Q>,
    pub ec: &'a Option<Q>,
    pub density: &'a Option<Q>,
    pub lambda: Option<f64>,
    pub fr: &'a Option<Q>,
    pub curve: &'a Option<String>,
}

pub(super) fn concrete_of(
    cx: &mut Ctx,
    k: ConcreteKeys,
    defaults: &mut Vec<Default>,
    prefix: &str,
) -> Option<Concrete> {
    let ConcreteKeys { fc, ec, density, lambda, fr, curve } = k;
    let r = ranges(cx.sys);
    let names = cx.sys.names();
    let fc = cx.ranged("fc", fc, Dim::Stress, r.fc.0, r.fc.1, false);
    let fc = match fc {
        Some(v) => v,
        None => cx.required("fc", fc, &format!("f'c, {} to {} {}", r.fc.0, r.fc.1, names.stress))?,
    };
    if fc < r.fc_usual.0 || fc > r.fc_usual.1 {
        cx.warn(
            "fc",
            format!(
                "f'c = {} {} is outside the usual range {} to {} {}; confirm it",
                num(fc),
                names.stress,
                r.fc_usual.0,
                r.fc_usual.1,
                names.stress
            ),
        );
    }
    let lambda_v = match lambda {
        Some(_) => cx.ratio("lambda", lambda, 0.75, 1.0)?,
        None => {
            defaults.push(Default { key: format!("{prefix}lambda"), text: "λ = 1.0 (normalweight concrete)".into() });
            1.0
        }
    };
    let wc = cx.ranged("density", density, Dim::Density, r.density.0, r.density.1, false);
    if density.is_some() && wc.is_none() {
        return None;
    }
    let (ec_v, ec_source) = match cx.ranged("ec", ec, Dim::Stress, r.ec.0, r.ec.1, false) {
        Some(v) => (v, EcSource::Given),
        None if ec.is_some() => return None,
        None => match wc {
            Some(wc) => (cx.basis.ec_density(fc, wc).value, EcSource::Density { wc }),
            None => {
                defaults.push(Default { key: format!("{prefix}ec"), text: cx.basis.ec_default_text() });
                (cx.basis.ec_normalweight(fc).value, EcSource::Normalweight)
            }
        },
    };
    let fr_max = fc * 0.3;
    let (fr_v, fr_given) = match cx.ranged("fr", fr, Dim::Stress, 0.0, fr_max, true) {
        Some(v) => (v, true),
        None if fr.is_some() => return None,
        None => {
            defaults.push(Default { key: format!("{prefix}fr"), text: cx.basis.fr_default_text() });
            (cx.basis.modulus_of_rupture(fc, lambda_v).value, false)
        }
    };
    let curve = match curve.as_deref() {
        None => ConcreteCurve::Hognestad,
        Some("hognestad") => ConcreteCurve::Hognestad,
        Some("popovics") => ConcreteCurve::Popovics,
        Some(other) => {
            cx.problem(
                "curve",
                format!("curve = {other:?} is not a concrete curve this version knows"),
                Some("\"hognestad\" or \"popovics\"".to_string()),
            );
            return None;
        }
    };
    Some(Concrete { fc, ec: ec_v, ec_source, lambda: lambda_v, fr: fr_v, fr_given, curve })
}
