//! The TOML schema as read by serde, before validation. Every table refuses unknown
//! keys, so a misspelt key is an error, never silently ignored.

use serde::Deserialize;
use serde::de::{self, Deserializer, Visitor};
use toml::value::Datetime;

/// A number, or a string holding a number and a unit ("12.7 mm").
#[derive(Debug, Clone, PartialEq)]
pub enum Q {
    Num(f64),
    Text(String),
}

impl<'de> Deserialize<'de> for Q {
    fn deserialize<D: Deserializer<'de>>(d: D) -> Result<Q, D::Error> {
        struct V;
        impl Visitor<'_> for V {
            type Value = Q;
            fn expecting(&self, f: &mut std::fmt::Formatter) -> std::fmt::Result {
                f.write_str("a number, or a string with a number and a unit such as \"12.7 mm\"")
            }
            fn visit_f64<E: de::Error>(self, v: f64) -> Result<Q, E> {
                Ok(Q::Num(v))
            }
            fn visit_i64<E: de::Error>(self, v: i64) -> Result<Q, E> {
                Ok(Q::Num(v as f64))
            }
            fn visit_u64<E: de::Error>(self, v: u64) -> Result<Q, E> {
                Ok(Q::Num(v as f64))
            }
            fn visit_str<E: de::Error>(self, v: &str) -> Result<Q, E> {
                Ok(Q::Text(v.to_string()))
            }
        }
        d.deserialize_any(V)
    }
}

#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct File {
    pub format: Option<i64>,
    pub package: Option<Package>,
    #[serde(default)]
    pub member: Vec<Member>,
}

#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct Package {
    pub title: Option<String>,
    pub project: Option<String>,
    pub project_number: Option<String>,
    pub client: Option<String>,
    pub subject: Option<String>,
    pub revision: Option<String>,
    pub date: Option<Datetime>,
    pub units: Option<String>,
    pub basis: Option<String>,
    pub paper: Option<String>,
    pub notes: Option<String>,
    #[serde(default)]
    pub revisions: Vec<Revision>,
    #[serde(default)]
    pub signoff: Vec<Signoff>,
}

#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct Revision {
    pub rev: Option<String>,
    pub date: Option<Datetime>,
    pub description: Option<String>,
}

#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct Signoff {
    pub role: Option<String>,
    pub name: Option<String>,
    pub license: Option<String>,
    pub firm: Option<String>,
    pub date: Option<Datetime>,
}

#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct Member {
    pub id: Option<String>,
    pub description: Option<String>,
    pub kind: Option<String>,
    pub length: Option<Q>,
    pub span: Option<Q>,
    pub mu: Option<Q>,
    pub mnc: Option<Q>,
    pub loads: Option<Loads>,
    #[serde(default)]
    pub point_load: Vec<PointLoad>,
    #[serde(default)]
    pub location: Vec<Location>,
    pub concrete: Option<Concrete>,
    pub section: Option<Section>,
    pub topping: Option<Topping>,
    #[serde(default)]
    pub strands: Vec<Strands>,
    #[serde(default)]
    pub bars: Vec<Bars>,
    pub curve: Option<CurveOptions>,
    pub losses: Option<Losses>,
    pub stresses: Option<Stresses>,
}

/// What the stress checks at release and in service ask of the engineer.
#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct Stresses {
    pub sustained_live: Option<f64>,
    pub release_reinforcement: Option<bool>,
    pub reinforcement_fy: Option<Q>,
    pub deflection_limit: Option<String>,
    pub tension_face_spacing: Option<Q>,
}

/// Service loads on a member: area loads ("20 psf", "1.0 kPa") times the tributary
/// width, or line loads ("0.8 klf", "11.7 kN/m").
#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct Loads {
    pub superimposed_dead: Option<Q>,
    pub live: Option<Q>,
    pub roof_live: Option<Q>,
    pub snow: Option<Q>,
    pub width: Option<Q>,
    pub shored: Option<bool>,
    pub live_factor: Option<f64>,
    pub live_factor_reason: Option<String>,
}

#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct PointLoad {
    pub name: Option<String>,
    pub kind: Option<String>,
    pub load: Option<Q>,
    pub x: Option<Q>,
}

#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct Location {
    pub name: Option<String>,
    pub x: Option<Q>,
    pub mu: Option<Q>,
    pub mnc: Option<Q>,
}

#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct Concrete {
    pub fc: Option<Q>,
    pub ec: Option<Q>,
    pub density: Option<Q>,
    pub lambda: Option<f64>,
    pub fr: Option<Q>,
    pub curve: Option<String>,
    /// f'ci at release (transfer of prestress), and optionally its Eci.
    pub fci: Option<Q>,
    pub eci: Option<Q>,
}

/// How the losses of strand layers that give `jacking` alone are computed.
#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct Losses {
    pub method: Option<String>,
    pub relative_humidity: Option<f64>,
    pub volume_to_surface: Option<Q>,
}

/// The section, by shape: each shape takes its own dimensions (and a key of another
/// shape is refused as unknown, with the nearest known key). The dimensions are read as
/// optional so that a missing one is named with what the shape needs.
#[derive(Debug, Deserialize)]
#[serde(tag = "shape", rename_all = "snake_case", deny_unknown_fields)]
pub enum Section {
    Rectangle {
        width: Option<Q>,
        height: Option<Q>,
    },
    Tee {
        flange_width: Option<Q>,
        flange_thickness: Option<Q>,
        web_width: Option<Q>,
        height: Option<Q>,
    },
    InvertedTee {
        web_width: Option<Q>,
        height: Option<Q>,
        ledge_width: Option<Q>,
        ledge_height: Option<Q>,
        ledges: Option<i64>,
    },
    DoubleTee {
        flange_width: Option<Q>,
        flange_thickness: Option<Q>,
        height: Option<Q>,
        stem_spacing: Option<Q>,
        stem_width_top: Option<Q>,
        stem_width_bottom: Option<Q>,
    },
    IGirder {
        height: Option<Q>,
        top_flange_width: Option<Q>,
        top_flange_thickness: Option<Q>,
        top_taper: Option<Q>,
        web_width: Option<Q>,
        bottom_flange_width: Option<Q>,
        bottom_flange_thickness: Option<Q>,
        bottom_taper: Option<Q>,
    },
    HollowCore {
        width: Option<Q>,
        height: Option<Q>,
        void_count: Option<i64>,
        void_diameter: Option<Q>,
        void_center_height: Option<Q>,
    },
    Polygon {
        outline: Option<Vec<Vec<f64>>>,
        holes: Option<Vec<Vec<Vec<f64>>>>,
    },
}

#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct Topping {
    pub thickness: Option<Q>,
    pub width: Option<Q>,
    pub fc: Option<Q>,
    pub ec: Option<Q>,
    pub density: Option<Q>,
    pub lambda: Option<f64>,
    pub block: Option<String>,
    pub curve: Option<String>,
}

#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct Strands {
    pub depth: Option<Q>,
    pub height: Option<Q>,
    pub depth_end: Option<Q>,
    pub depth_harp: Option<Q>,
    pub height_end: Option<Q>,
    pub height_harp: Option<Q>,
    pub harp_x: Option<Q>,
    pub harp_x2: Option<Q>,
    pub count: Option<i64>,
    pub diameter: Option<Q>,
    pub area: Option<Q>,
    pub fpu: Option<Q>,
    pub fpy: Option<Q>,
    pub fse: Option<Q>,
    pub jacking: Option<f64>,
    pub losses: Option<Q>,
    pub fpi: Option<Q>,
    pub model: Option<String>,
    pub debonded_length: Option<Q>,
}

#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct Bars {
    pub depth: Option<Q>,
    pub height: Option<Q>,
    pub count: Option<i64>,
    pub size: Option<String>,
    pub diameter: Option<Q>,
    pub area: Option<Q>,
    pub fy: Option<Q>,
    pub es: Option<Q>,
}

#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct CurveOptions {
    pub crushing_strain: Option<f64>,
    pub rupture_strain: Option<f64>,
    pub points: Option<i64>,
    pub strips: Option<i64>,
    pub bar_hardening: Option<f64>,
}
