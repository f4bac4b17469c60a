//! The sections the engine checks, each with its demand: the locations the input names,
//! and, for a member with loads, the stations along the span (the ends of every
//! transfer and development length from both ends, the debond and harp points, the
//! tenth points of the span, midspan and each point load).

use super::demand::MomentsAt;
use crate::input::model::{Along, Location, Member};

/// A section checked, with its demand resolved (coherent units).
#[derive(Debug, Clone)]
pub struct Station {
    pub name: String,
    /// From the left end; `None` where the input gives no x (strands then fully developed).
    pub x: Option<f64>,
    pub mu: f64,
    pub mnc: f64,
    /// Whether `mnc` was scaled from the member's midspan value (hand-given moments).
    pub mnc_scaled: bool,
    /// The moments derived from the member's loads here (`None`: the demand was given).
    pub moments: Option<MomentsAt>,
}

impl Station {
    /// A section at x with no demand: for what depends on the section alone (its
    /// strand states, its strength).
    pub fn without_demand(name: String, x: f64) -> Station {
        Station { name, x: Some(x), mu: 0.0, mnc: 0.0, mnc_scaled: false, moments: None }
    }

    /// Its place along a member of known length.
    pub fn along(&self, length: Option<f64>) -> Option<Along> {
        match (self.x, length) {
            (Some(x), Some(length)) => Some(Along { x, length }),
            _ => None,
        }
    }

    /// A location the input names: its own moments where it gives them, else those of
    /// the member's loads at its x.
    pub fn of_location(l: &Location, demand: Option<&super::demand::Demand>) -> Option<Station> {
        let moments = match (demand, l.x) {
            (Some(d), Some(x)) if l.mu.is_none() || l.mnc.is_none() => Some(d.at(x)),
            _ => None,
        };
        let mu = l.mu.or(moments.as_ref().map(|m| m.mu))?;
        let mnc = l.mnc.or(moments.as_ref().map(|m| m.mnc))?;
        // where the location gives mu itself, its demand is the given one
        let moments = if l.mu.is_some() { None } else { moments };
        Some(Station { name: l.name.clone(), x: l.x, mu, mnc, mnc_scaled: l.mnc_scaled, moments })
    }
}

/// Where the stations of a member lie, each with why: (x, reasons), sorted by x and
/// merged where they coincide. `lengths` gives each strand layer's transfer and
/// development lengths (from a first solution at midspan).
pub fn positions(
    m: &Member,
    span: f64,
    bearing: f64,
    lengths: &[(f64, f64)],
    points: &[f64],
) -> Vec<(f64, Vec<String>)> {
    let Some(len) = m.length else { return Vec::new() };
    let mut xs: Vec<(f64, String)> = Vec::new();
    let both = |x: f64, why: String, xs: &mut Vec<(f64, String)>| {
        xs.push((x, format!("{why}, left end")));
        xs.push((len - x, format!("{why}, right end")));
    };
    for (i, s) in m.strands.iter().enumerate() {
        let k = i + 1;
        let db = s.debonded_length;
        if db > 0.0 {
            both(db, format!("debond point, layer {k}"), &mut xs);
        }
        if let Some(&(ltr, ld)) = lengths.get(i) {
            let start = if db > 0.0 { "past the debond point" } else { "from the end" };
            both(db + ltr, format!("end of transfer ({start}), layer {k}"), &mut xs);
            both(db + ld, format!("end of development ({start}), layer {k}"), &mut xs);
        }
        if let crate::input::model::Profile::Harped { harp_x, harp_x2, .. } = s.profile {
            xs.push((harp_x, format!("harp point, layer {k}")));
            xs.push((harp_x2.unwrap_or(len - harp_x), format!("harp point, layer {k}")));
        }
    }
    for t in 0..=10 {
        let x = bearing + span * t as f64 / 10.0;
        let why = match t {
            0 => "left bearing".to_string(),
            5 => "midspan".to_string(),
            10 => "right bearing".to_string(),
            t => format!("{}/10 of the span", t),
        };
        xs.push((x, why));
    }
    xs.push((len / 2.0, "middle of the member".into()));
    for (j, &x) in points.iter().enumerate() {
        xs.push((x, format!("point load {}", j + 1)));
    }
    // inside the member, not at its very ends (no section to check there)
    let tol = 1e-9 * len;
    xs.retain(|(x, _)| x.is_finite() && *x > tol && *x < len - tol);
    xs.sort_by(|a, b| a.0.total_cmp(&b.0));
    // points closer than 1e-6 L are one station: of such a cluster, the point nearest
    // its nearer end of the member (the lower strength where a transfer or development
    // length ends), the middle itself where the cluster holds it, so that a symmetric
    // member's stations are symmetric too
    let near = 1e-6 * len;
    let mut clusters: Vec<(Vec<f64>, Vec<String>)> = Vec::new();
    for (x, why) in xs {
        match clusters.last_mut() {
            Some((pts, whys)) if x - pts[pts.len() - 1] <= near => {
                pts.push(x);
                if !whys.contains(&why) {
                    whys.push(why);
                }
            }
            _ => clusters.push((vec![x], vec![why])),
        }
    }
    let middle = len / 2.0;
    let from_end = |x: f64| x.min(len - x);
    clusters
        .into_iter()
        .map(|(pts, whys)| {
            let x = if pts.contains(&middle) {
                middle
            } else {
                pts.iter().copied().min_by(|a, b| from_end(*a).total_cmp(&from_end(*b))).unwrap_or(pts[0])
            };
            (x, whys)
        })
        .collect()
}
