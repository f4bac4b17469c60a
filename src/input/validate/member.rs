//! A member: its id, length, concrete, section, topping, moments, check locations,
//! steel and curve options, each read by its own part of the validation.

use super::*;

pub(super) fn member(cx: &mut Ctx, m: &raw::Member) -> Option<Member> {
    let sys = cx.sys;
    let r = ranges(sys);
    let mut defaults = Vec::new();
    let id = cx.text("id", &m.id, 16);
    let id = cx.required("id", id, "a short unique name for the member, e.g. \"DT-1\"");
    if let Some(id) = &id
        && id.trim().is_empty()
    {
        cx.problem("id", "id is empty", Some("a short unique name for the member".to_string()));
    }
    let description = cx.text("description", &m.description, limits::TEXT).unwrap_or_default();
    let length = match &m.length {
        Some(_) => Some(cx.ranged("length", &m.length, Dim::Length, 0.0, r.length_max, true)?),
        None => None,
    };

    let concrete = precast_concrete(cx, m, &mut defaults);
    let (shape, region) = section(cx, m);
    let kind = kind(cx, m, shape.as_ref());
    let topping = topping(cx, m, region.as_ref(), &mut defaults)?;
    let with_loads = loads::has_loads(m);
    let (mu, mnc) = moments(cx, m, with_loads, &mut defaults)?;
    let mm = MemberMoments { length, mu, mnc, with_loads };
    let locations = locations(cx, m, mm, &mut defaults)?;
    let loads = loads::loads(cx, m, length, region.as_ref(), topping.as_ref(), concrete.as_ref(), &mut defaults);
    if with_loads && loads.is_none() {
        return None;
    }
    let release = losses::release(cx, m, concrete.as_ref(), &mut defaults);
    let region = region?;
    let (strands, bars) = steel(cx, m, &region, length, &mut defaults)?;
    let release = release?;
    let member_length = length.or(loads.as_ref().map(|l| l.span));
    let losses = losses::method(cx, m, &strands, release.as_ref(), loads.is_some(), member_length)?;
    let curve = curve_options(cx, m)?;
    let stresses = stresses::options(cx, m, loads.is_some())?;
    // dedup defaults (several layers may take the same one)
    let mut seen: Vec<Default> = Vec::new();
    for d in defaults {
        if !seen.contains(&d) {
            seen.push(d);
        }
    }
    Some(Member {
        id: id?,
        description,
        kind,
        length,
        mnc,
        locations,
        loads,
        concrete: concrete?,
        shape: shape?,
        region,
        topping,
        strands,
        bars,
        curve,
        defaults: seen,
        release,
        losses,
        stresses,
    })
}

/// The member's factored moment `mu` (if given) and its non-composite moment `mnc` (0
/// when not given).
fn moments(cx: &mut Ctx, m: &raw::Member, with_loads: bool, defaults: &mut Vec<Default>) -> Option<(Option<f64>, f64)> {
    let r = ranges(cx.sys);
    let mu = match &m.mu {
        Some(_) => Some(cx.ranged("mu", &m.mu, Dim::Moment, 0.0, r.moment_max, true)?),
        None => None,
    };
    let mnc = match &m.mnc {
        Some(_) => {
            let v = cx.ranged("mnc", &m.mnc, Dim::Moment, 0.0, r.moment_max, false)?;
            if m.topping.is_none() {
                cx.warn("mnc", "mnc is used only for members with a topping; it is ignored here");
            }
            v
        }
        None => {
            if m.topping.is_some() && !with_loads {
                defaults.push(Default { key: "mnc".into(), text: "non-composite moment Mnc = 0 (not given)".into() });
            }
            0.0
        }
    };
    Some((mu, mnc))
}

/// The member's check locations: those given, each read by [`location`], or (without
/// loads) one at midspan from the member's moments.
fn locations(cx: &mut Ctx, m: &raw::Member, mm: MemberMoments, defaults: &mut Vec<Default>) -> Option<Vec<Location>> {
    let MemberMoments { length, mu, mnc, with_loads } = mm;
    if m.location.len() > limits::LOCATIONS {
        cx.problem(
            "location",
            format!("{} check locations", m.location.len()),
            Some(format!("at most {}", limits::LOCATIONS)),
        );
        return None;
    }
    let mut locations = Vec::new();
    for (k, l) in m.location.iter().enumerate() {
        cx.enter(Seg::Key("location"));
        cx.enter(Seg::Idx(k));
        let read = location(cx, m, l, (k, &locations), mm, defaults);
        locations.extend(read);
        cx.leave();
        cx.leave();
    }
    // the member's mu and mnc are the values of the locations that give none: where
    // every location gives its own, a member value would be used nowhere
    if !m.location.is_empty() {
        for (key, member_given, all_own) in [
            ("mu", m.mu.is_some(), m.location.iter().all(|l| l.mu.is_some())),
            ("mnc", m.mnc.is_some() && m.topping.is_some(), m.location.iter().all(|l| l.mnc.is_some())),
        ] {
            if member_given && all_own {
                cx.problem(
                    key,
                    format!("{key} is given for the member and for every [[member.location]], so the member's {key} would be used by no location"),
                    Some(format!("the member's {key} applies to the locations that give none: remove it, or remove {key} from the locations that should take it")),
                );
            }
        }
    }
    // with loads, the stations along the span are the member's sections (the demand stage)
    if m.location.is_empty() && !with_loads {
        let (mu, mnc) = (mu.map(Some), Some(mnc));
        match mu {
            Some(mu) => match length {
                Some(l) => {
                    locations.push(Location { name: "midspan".into(), x: Some(l / 2.0), mu, mnc, mnc_scaled: false })
                }
                None => {
                    locations.push(Location { name: "critical section".into(), x: None, mu, mnc, mnc_scaled: false })
                }
            },
            None => cx.problem(
                "mu",
                "mu is missing",
                Some("the factored moment, or [[member.location]] tables with x and mu".to_string()),
            ),
        }
    }

    Some(locations)
}

/// The moments a location takes: the member's own (`mu`, `mnc`) where the location gives
/// none, or derived from the loads (None) where the member has loads.
#[derive(Clone, Copy)]
struct MemberMoments {
    length: Option<f64>,
    mu: Option<f64>,
    mnc: f64,
    with_loads: bool,
}

/// One [[member.location]] (the k-th); `before` holds the locations read so far, whose
/// names it must not repeat.
fn location(
    cx: &mut Ctx,
    m: &raw::Member,
    l: &raw::Location,
    (k, before): (usize, &[Location]),
    mm: MemberMoments,
    defaults: &mut Vec<Default>,
) -> Option<Location> {
    let MemberMoments { length, mu, mnc, with_loads } = mm;
    let r = ranges(cx.sys);
    let name = cx.text("name", &l.name, 40).unwrap_or_else(|| format!("location {}", k + 1));
    if before.iter().any(|x| x.name == name) {
        cx.problem(
            "name",
            format!("name = {name:?} is used twice in this member"),
            Some("a unique name per location".to_string()),
        );
    }
    let x = match (&l.x, length) {
        (Some(_), Some(len)) => match cx.quantity("x", &l.x, Dim::Length) {
            Some(x) if (0.0..=len).contains(&x) => Some(x),
            Some(x) => {
                cx.problem(
                    "x",
                    format!(
                        "x = {} lies outside the member, whose length is {}",
                        cx.shown(Dim::Length, x),
                        cx.shown(Dim::Length, len)
                    ),
                    Some(format!("0 <= x <= {} (x from the left end)", cx.shown(Dim::Length, len))),
                );
                None
            }
            None => None,
        },
        (Some(_), None) => {
            cx.problem(
                "x",
                "x is given but the member has no length, so x cannot be measured from its ends",
                Some("give the member's length (end to end) in [[member]]; x then runs from 0 at the left end to the length".to_string()),
            );
            None
        }
        (None, _) => None,
    };
    let lmu = match &l.mu {
        Some(_) => cx.ranged("mu", &l.mu, Dim::Moment, 0.0, r.moment_max, true).map(Some),
        // derived from the member's loads at x
        None if with_loads => Some(None),
        None => {
            if mu.is_none() {
                cx.problem(
                    "mu",
                    "mu is missing (neither the location nor the member gives it)",
                    Some("the factored moment at the location".to_string()),
                );
            }
            mu.map(Some)
        }
    };
    if l.x.is_none() {
        cx.problem("x", "x is missing", Some("the location's distance from the member end".to_string()));
    }
    let mnc_scaled = !with_loads && l.mnc.is_none() && length.is_some() && x.is_some() && m.topping.is_some();
    let lmnc = match &l.mnc {
        Some(_) => cx.ranged("mnc", &l.mnc, Dim::Moment, 0.0, r.moment_max, false).map(Some),
        None if with_loads => Some(None),
        None => match (length, x) {
            (Some(len), Some(x)) if m.topping.is_some() => {
                if mnc > 0.0 {
                    defaults.push(Default {
                        key: "location.mnc".into(),
                        text: "where a location gives no mnc, the member's mnc (at midspan) is scaled by 4x(L - x)/L², as for a uniformly loaded simple span".into(),
                    });
                }
                Some(Some(mnc * 4.0 * x * (len - x) / (len * len)))
            }
            _ => Some(Some(mnc)),
        },
    };
    match (lmu, x, lmnc) {
        (Some(lmu), Some(x), Some(lmnc)) => Some(Location { name, x: Some(x), mu: lmu, mnc: lmnc, mnc_scaled }),
        _ => None,
    }
}

/// The precast concrete.
fn precast_concrete(cx: &mut Ctx, m: &raw::Member, defaults: &mut Vec<Default>) -> Option<Concrete> {
    match &m.concrete {
        Some(c) => {
            cx.enter(Seg::Key("concrete"));
            let v = concrete_of(
                cx,
                ConcreteKeys {
                    fc: &c.fc,
                    ec: &c.ec,
                    density: &c.density,
                    lambda: c.lambda,
                    fr: &c.fr,
                    curve: &c.curve,
                },
                defaults,
                "concrete.",
            );
            cx.leave();
            v
        }
        None => {
            cx.problem(
                "concrete",
                "the [member.concrete] table is missing",
                Some("a table with fc (and optionally ec, density, lambda, fr)".to_string()),
            );
            None
        }
    }
}

/// The section: its shape and the region built from it.
fn section(cx: &mut Ctx, m: &raw::Member) -> (Option<Shape>, Option<Region>) {
    match &m.section {
        Some(s) => {
            cx.enter(Seg::Key("section"));
            let built = shape(cx, s).and_then(|sh| match sh.build() {
                Ok(region) => Some((sh, region)),
                Err(ShapeError { key, value, allowed }) => {
                    cx.problem(key, format!("{key} = {} does not fit the shape", num(value)), Some(allowed));
                    None
                }
            });
            cx.leave();
            match built {
                Some(b) => (Some(b.0), Some(b.1)),
                None => (None, None),
            }
        }
        None => {
            cx.problem(
                "section",
                "the [member.section] table is missing",
                Some(format!("a table with shape = {SHAPES} and its dimensions")),
            );
            (None, None)
        }
    }
}

/// The member kind for the code's chapters: given, or a one-way slab for a plank.
fn kind(cx: &mut Ctx, m: &raw::Member, shape: Option<&Shape>) -> Kind {
    match m.kind.as_deref() {
        None => {
            if shape.is_some_and(|s| s.is_slab()) {
                Kind::OneWaySlab
            } else {
                Kind::Beam
            }
        }
        Some("beam") => Kind::Beam,
        Some("slab") => Kind::OneWaySlab,
        Some(other) => {
            cx.problem(
                "kind",
                format!("kind = {other:?} is not a member kind"),
                Some("\"beam\" or \"slab\" (one-way slab)".to_string()),
            );
            Kind::Beam
        }
    }
}

/// The cast-in-place topping, if any (`None`: refused).
fn topping(
    cx: &mut Ctx,
    m: &raw::Member,
    region: Option<&Region>,
    defaults: &mut Vec<Default>,
) -> Option<Option<Topping>> {
    let r = ranges(cx.sys);
    let topping = match (&m.topping, region) {
        (Some(t), Some(region)) => {
            cx.enter(Seg::Key("topping"));
            let thickness = cx.ranged("thickness", &t.thickness, Dim::Length, 0.0, r.dim_max / 10.0, true);
            let thickness = cx.required("thickness", thickness, "the topping thickness");
            let (lo, hi) = region.top_extent();
            let flat = hi - lo > 0.0 && lo.is_finite() && hi.is_finite();
            let width = match &t.width {
                Some(_) => cx.dim_len("width", &t.width),
                None if flat => Some(hi - lo),
                None => {
                    cx.problem(
                        "width",
                        "width is missing and the top of the precast unit is not flat",
                        Some("the topping width".to_string()),
                    );
                    None
                }
            };
            let block = match t.block.as_deref() {
                None => {
                    defaults.push(Default {
                        key: "topping.block".into(),
                        text: "where the stress block is deeper than the topping, the topping's f'c and β1 are used over the whole block".into(),
                    });
                    Some(BlockMode::Topping)
                }
                Some("topping") => Some(BlockMode::Topping),
                Some("two_part") => Some(BlockMode::TwoPart),
                Some(other) => {
                    cx.problem(
                        "block",
                        format!("block = {other:?} is not a stress-block option"),
                        Some("\"topping\" or \"two_part\"".to_string()),
                    );
                    None
                }
            };
            let c = concrete_of(
                cx,
                ConcreteKeys {
                    fc: &t.fc,
                    ec: &t.ec,
                    density: &t.density,
                    lambda: t.lambda,
                    fr: &None,
                    curve: &t.curve,
                },
                defaults,
                "topping.",
            );
            cx.leave();
            match (thickness, width, block, c) {
                (Some(thickness), Some(width), Some(block), Some(concrete)) => Some(Topping {
                    thickness,
                    width,
                    x_center: if flat { (lo + hi) / 2.0 } else { 0.0 },
                    concrete,
                    block,
                }),
                _ => return None,
            }
        }
        (Some(_), None) => return None,
        (None, _) => None,
    };

    Some(topping)
}

/// The strand and bar layers, each placed in the region (`None`: too many layers).
#[allow(clippy::type_complexity)]
fn steel(
    cx: &mut Ctx,
    m: &raw::Member,
    region: &Region,
    length: Option<f64>,
    defaults: &mut Vec<Default>,
) -> Option<(Vec<StrandLayer>, Vec<BarLayer>)> {
    if m.strands.is_empty() {
        cx.problem(
            "strands",
            "the member has no strand layers",
            Some("at least one [[member.strands]] table".to_string()),
        );
    }
    if m.strands.len() > limits::LAYERS || m.bars.len() > limits::LAYERS {
        cx.problem(
            "strands",
            format!("{} strand and {} bar layers", m.strands.len(), m.bars.len()),
            Some(format!("at most {} of each", limits::LAYERS)),
        );
        return None;
    }
    let mut strands = Vec::new();
    for (k, s) in m.strands.iter().enumerate() {
        cx.enter(Seg::Key("strands"));
        cx.enter(Seg::Idx(k));
        if let Some(layer) = strand_layer(cx, s, region, length, defaults) {
            strands.push(layer);
        }
        cx.leave();
        cx.leave();
    }
    if !strands.is_empty()
        && strands.iter().all(|s| s.fse == 0.0 && !matches!(s.fse_source, FseSource::Computed { .. }))
    {
        cx.warn("strands", "no strand layer is tensioned (every fse is 0)");
    }
    let mut bars = Vec::new();
    for (k, b) in m.bars.iter().enumerate() {
        cx.enter(Seg::Key("bars"));
        cx.enter(Seg::Idx(k));
        if let Some(layer) = bar_layer(cx, b, region, defaults) {
            bars.push(layer);
        }
        cx.leave();
        cx.leave();
    }
    Some((strands, bars))
}

/// The options of the moment-curvature analysis.
fn curve_options(cx: &mut Ctx, m: &raw::Member) -> Option<CurveOptions> {
    let curve = match &m.curve {
        Some(c) => {
            cx.enter(Seg::Key("curve"));
            let o = (
                c.crushing_strain.map_or(Some(0.003), |v| cx.ratio("crushing_strain", Some(v), 0.002, 0.006)),
                c.rupture_strain.map_or(Some(0.035), |v| cx.ratio("rupture_strain", Some(v), 0.01, 0.1)),
                c.points
                    .map_or(Some(200), |v| cx.count("points", Some(v), 20, limits::CURVE_POINTS).map(|n| n as usize)),
                c.strips
                    .map_or(Some(200), |v| cx.count("strips", Some(v), 200, limits::CURVE_STRIPS).map(|n| n as usize)),
                c.bar_hardening.map_or(Some(0.0), |v| cx.ratio("bar_hardening", Some(v), 0.0, 0.1)),
            );
            cx.leave();
            match o {
                (Some(crushing_strain), Some(rupture_strain), Some(points), Some(strips), Some(bar_hardening)) => {
                    CurveOptions { crushing_strain, rupture_strain, points, strips, bar_hardening }
                }
                _ => return None,
            }
        }
        None => {
            CurveOptions { crushing_strain: 0.003, rupture_strain: 0.035, points: 200, strips: 200, bar_hardening: 0.0 }
        }
    };
    Some(curve)
}
