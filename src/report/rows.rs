//! The one table of results: every quantity kern reports, one line each — its group,
//! symbol, meaning, JSON path, unit dimension and accessor ([`QUANTITIES`]). The
//! `kern calc` table, the JSON of `kern calc --json`, the calculation sheet (Markdown
//! and HTML), the SVG's labels and the workbench's result panel all render from it, so
//! they always agree. Adding a result is one line in [`QUANTITIES`] (and, if it opens
//! a new group, its name in [`GROUPS`]).
//!
//! Two notations ([`Notation`]): the S/Z letters about x–y axes, and W_el/W_pl about
//! y–z axes (y horizontal along the file's x, z vertical along the file's y). A
//! quantity's symbol and meaning hold the x–y text and, after a `|` where the y–z
//! text differs, that one (`"Ixx|Iy"`).
//!
//! One rule for finite-element noise ([`fe_zero`]): a coordinate closer to zero than
//! the solve's estimated error (relative to the section's size) is zero, in every view.

use super::out::OutUnits;
use crate::analysis::Analysis;
use crate::checks::shear_flow::Flow;
use crate::geom::Pt;
use crate::numfmt::Compare;

/// The letters of the moduli and axes in the views (JSON keys never change).
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default)]
pub enum Notation {
    /// Sx, Zx, Ixx…: elastic modulus S, plastic modulus Z, axes x (horizontal) and y.
    #[default]
    Xy,
    /// Wel,y, Wpl,y, Iy…: elastic and plastic moduli W, axes y (horizontal, the file's
    /// x) and z (vertical, the file's y); here Z is no modulus but the vertical axis.
    Yz,
}

impl Notation {
    /// The names the CLI flag and the config file take.
    pub const NAMES: &'static str = "xy (S, Z about x–y) or yz (Wel, Wpl about y–z)";

    pub fn parse(s: &str) -> Option<Notation> {
        match s {
            "xy" => Some(Notation::Xy),
            "yz" => Some(Notation::Yz),
            _ => None,
        }
    }

    /// One line stating the notation and its axes, for the sheet and the table.
    pub fn note(self) -> &'static str {
        match self {
            Notation::Xy => "x horizontal, y vertical; S elastic and Z plastic moduli",
            Notation::Yz => {
                "y horizontal (the file's x), z vertical (the file's y); Wel elastic and Wpl \
plastic moduli"
            }
        }
    }

    /// The part of `text` for this notation: before a `|` for x–y, after it for y–z.
    fn pick(self, text: &'static str) -> &'static str {
        match (text.split_once('|'), self) {
            (None, _) => text,
            (Some((xy, _)), Notation::Xy) => xy,
            (Some((_, yz)), Notation::Yz) => yz,
        }
    }
}

/// What an accessor finds for one quantity.
#[derive(Debug, Clone, PartialEq)]
pub enum Cell {
    /// Not part of this analysis (torsion not run, no member): no row, no JSON key.
    Absent,
    /// Part of the analysis but not formed: a row showing "—", JSON `null`.
    Null,
    /// A value in the file's units (lengths) or SI (forces, moments, stresses, mass).
    Num(f64),
    /// Text for JSON only (the torsion method).
    Text(String),
    /// A count for JSON only (finite elements).
    Count(usize),
}

impl From<Option<f64>> for Cell {
    fn from(x: Option<f64>) -> Cell {
        x.map_or(Cell::Null, Cell::Num)
    }
}

/// The unit dimension of a quantity: how a value is converted to output units and
/// labelled.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum Dim {
    /// A file length to this power (1 length, 2 area, 4 second moment, 6 warping).
    L(i32),
    /// A length given in metres.
    Metres,
    /// Degrees.
    Deg,
    /// A fraction: JSON gives it as it stands, the views in percent.
    Fraction,
    /// A pure number.
    One,
    Mass,
    Force,
    Moment,
    Stress,
    Deflection,
    /// Not a number (text, counts, the `null` of an object not formed).
    None,
}

impl Dim {
    /// `x` in output units, as JSON gives it.
    pub fn json(self, x: f64, u: &OutUnits) -> f64 {
        match self {
            Dim::L(p) => u.geo(x, p),
            Dim::Metres => u.metres(x),
            Dim::Mass => u.mass().from_si(x),
            Dim::Force => u.force().from_si(x),
            Dim::Moment => u.moment().from_si(x),
            Dim::Stress => u.stress().from_si(x),
            Dim::Deflection => u.deflection().from_si(x),
            Dim::Deg | Dim::Fraction | Dim::One | Dim::None => x,
        }
    }
    /// `x` as the views show it.
    pub fn shown(self, x: f64, u: &OutUnits) -> f64 {
        match self {
            Dim::Fraction => 100.0 * x,
            _ => self.json(x, u),
        }
    }
    /// The unit's label in the views.
    pub fn label(self, u: &OutUnits) -> String {
        match self {
            Dim::L(p) => u.label(p),
            Dim::Metres => u.label(1),
            Dim::Deg => "°".into(),
            Dim::Fraction => "%".into(),
            Dim::One | Dim::None => String::new(),
            Dim::Mass => u.mass().name.into(),
            Dim::Force => u.force().name.into(),
            Dim::Moment => u.moment().name.into(),
            Dim::Stress => u.stress().name.into(),
            Dim::Deflection => u.deflection().name.into(),
        }
    }
}

/// One quantity of the table.
pub struct Quantity {
    pub group: &'static str,
    /// Symbol in the views, unique within a section; `""` for JSON-only entries. With
    /// a `|`, the x–y symbol then the y–z one ([`Notation`]).
    pub symbol: &'static str,
    /// What it means; with a `|`, in x–y then in y–z terms.
    pub meaning: &'static str,
    /// Dotted path in the JSON object (FORMAT.md).
    pub path: &'static str,
    pub dim: Dim,
    pub get: fn(&Analysis) -> Cell,
}

impl Quantity {
    /// Shown as a row in the views (not only in JSON).
    pub fn shown(&self) -> bool {
        !self.symbol.is_empty()
    }

    /// The symbol in notation `n`.
    pub fn symbol_in(&self, n: Notation) -> &'static str {
        n.pick(self.symbol)
    }

    /// What a table heads the result with: its symbol in notation `n`, or its JSON
    /// path when it has none.
    pub fn name_in(&self, n: Notation) -> &'static str {
        if self.shown() {
            self.symbol_in(n)
        } else {
            self.path
        }
    }

    /// The meaning in notation `n`.
    pub fn meaning_in(&self, n: Notation) -> &'static str {
        n.pick(self.meaning)
    }

    /// How its change against a baseline reads: a difference for coordinates and
    /// angles (their zero is a choice of origin), the change of magnitude for stresses
    /// (−116.9 → −99.5 MPa is a lower stress), none for the finite-element error
    /// estimate (it grades a solve, not the section), else relative.
    pub fn compare(&self) -> Compare {
        let coordinate = [
            "centroid.",
            "plastic_axis.",
            "torsion.shear_centre.",
            "stress.max_",
        ]
        .iter()
        .any(|p| self.path.starts_with(p))
            && !self.path.ends_with(".value");
        match self.dim {
            _ if self.path == "torsion.rel_error" => Compare::Omit,
            Dim::Deg => Compare::Difference,
            _ if coordinate => Compare::Difference,
            Dim::Stress => Compare::Magnitude,
            _ => Compare::Relative,
        }
    }

    /// One of the section's own properties, which the net section repeats (FORMAT.md
    /// `net`: area, centroid, inertia, principal, elastic and plastic moduli, gyration).
    pub fn in_net(&self) -> bool {
        let head = self.path.split('.').next().unwrap_or_default();
        NET_KEYS.contains(&head)
    }
}

/// The top-level JSON keys the net section repeats.
const NET_KEYS: [&str; 7] = [
    "area",
    "centroid",
    "inertia",
    "principal",
    "elastic_modulus",
    "plastic_modulus",
    "gyration",
];

/// The analysis seen through its net section (holes subtracted), when it has holes:
/// the same quantities then read the net properties.
pub fn net_view(a: &Analysis) -> Option<Analysis> {
    let n = a.net.as_ref()?;
    let mut v = a.clone();
    v.props = n.props.clone();
    Some(v)
}

/// Display order of the groups in the views.
pub const GROUPS: [&str; 15] = [
    "Area",
    "Centroid",
    "Second moments",
    "Principal axes",
    "Elastic moduli",
    "Principal moduli",
    "Plastic moduli",
    "Radii of gyration",
    "Net section",
    "Mass",
    "Torsion",
    "Stresses",
    "Member",
    "Shear",
    "Connections",
];

fn num(x: f64) -> Cell {
    Cell::Num(x)
}
/// A modulus about the principal axes, present only when they are inclined to x and y.
fn principal_modulus(a: &Analysis, f: fn(&crate::props::section::PrincipalElastic) -> f64) -> Cell {
    a.props
        .principal_elastic
        .as_ref()
        .map_or(Cell::Absent, |s| num(f(s)))
}
fn plastic(a: &Analysis, f: fn(&crate::props::Plastic) -> f64) -> Cell {
    a.props.plastic.as_ref().map_or(Cell::Absent, |z| num(f(z)))
}
fn plastic_null(a: &Analysis) -> Cell {
    if a.props.plastic.is_none() {
        Cell::Null
    } else {
        Cell::Absent
    }
}
fn torsion(a: &Analysis, f: fn(&Analysis, &crate::fe::Torsion) -> Cell) -> Cell {
    match &a.torsion {
        Some(Ok(t)) => f(a, t),
        _ => Cell::Absent,
    }
}
fn torsion_null(a: &Analysis) -> Cell {
    if matches!(a.torsion, Some(Err(_))) {
        Cell::Null
    } else {
        Cell::Absent
    }
}
fn beta(a: &Analysis, f: fn((f64, f64)) -> f64) -> Cell {
    match (&a.torsion, a.beta()) {
        (Some(Ok(_)), Some(b)) => num(f(b)),
        _ => Cell::Absent,
    }
}
fn beta_null(a: &Analysis) -> Cell {
    match (&a.torsion, a.beta()) {
        (Some(Ok(_)), None) => Cell::Null,
        _ => Cell::Absent,
    }
}
fn stress(a: &Analysis, f: fn(&crate::analysis::StressResult) -> Cell) -> Cell {
    a.stress.as_ref().map_or(Cell::Absent, f)
}
fn member(a: &Analysis, f: fn(&crate::analysis::MemberResult) -> Cell) -> Cell {
    a.member.as_ref().map_or(Cell::Absent, f)
}
/// A shear figure: absent without the flexure solution (`--no-torsion`, or it failed)
/// without the loads it needs, or left out for its error estimate (a warning says so).
fn shear(
    a: &Analysis,
    f: fn(&crate::analysis::ShearResult) -> Option<f64>,
    needs: fn(&Analysis) -> bool,
) -> Cell {
    match &a.shear {
        Some(s) if needs(a) => f(s).map_or(Cell::Absent, Cell::Num),
        _ => Cell::Absent,
    }
}
fn any_shear_action(a: &Analysis) -> bool {
    a.section
        .actions
        .is_some_and(|x| x.vx.is_some() || x.vy.is_some() || x.t.is_some())
}
fn always(_: &Analysis) -> bool {
    true
}
/// What shear deformation adds to the member's deflection: a row only when the file asks
/// for shear deformation ("—" when it could not be formed).
fn deflection_shear(a: &Analysis) -> Cell {
    match &a.section.member {
        Some(mb) if mb.shear_deformation => member(a, |m| m.deflection_shear.into()),
        _ => Cell::Absent,
    }
}
fn with_member(a: &Analysis) -> bool {
    a.member.is_some()
}

/// The shear centre with finite-element noise removed ([`fe_zero`]), when torsion
/// was solved.
pub fn shear_centre(a: &Analysis) -> Option<Pt> {
    let t = a.torsion.as_ref()?.as_ref().ok()?;
    Some(Pt::new(
        fe_zero(a, t.shear_centre.x, t.rel_error),
        fe_zero(a, t.shear_centre.y, t.rel_error),
    ))
}

/// A finite-element coordinate closer to zero than its estimated error `err`
/// (relative, taken to the section's size and never below 1e-6) is zero to the
/// figures shown: a symmetric section's shear centre, say.
pub fn fe_zero(a: &Analysis, x: f64, err: f64) -> f64 {
    let b = a.props.bounds;
    let size = (b[1] - b[0]).max(b[3] - b[2]);
    if x.abs() < err.max(1e-6) * size {
        0.0
    } else {
        x
    }
}

/// Every quantity, in JSON order (FORMAT.md); the views show the ones with a symbol,
/// grouped in [`GROUPS`] order.
#[rustfmt::skip]
pub static QUANTITIES: &[Quantity] = &[
    Quantity { group: "Area", symbol: "A", meaning: "area (voids subtracted, other materials by modular ratio)", path: "area", dim: Dim::L(2), get: |a| num(a.props.area) },
    Quantity { group: "Centroid", symbol: "x̄|ȳ", meaning: "centroid, x|centroid, y (horizontal)", path: "centroid.x", dim: Dim::L(1), get: |a| num(a.props.centroid.x) },
    Quantity { group: "Centroid", symbol: "ȳ|z̄", meaning: "centroid, y|centroid, z (vertical)", path: "centroid.y", dim: Dim::L(1), get: |a| num(a.props.centroid.y) },
    Quantity { group: "Bounds", symbol: "", meaning: "least x of the section", path: "bounds.xmin", dim: Dim::L(1), get: |a| num(a.props.bounds[0]) },
    Quantity { group: "Bounds", symbol: "", meaning: "greatest x of the section", path: "bounds.xmax", dim: Dim::L(1), get: |a| num(a.props.bounds[1]) },
    Quantity { group: "Bounds", symbol: "", meaning: "least y of the section", path: "bounds.ymin", dim: Dim::L(1), get: |a| num(a.props.bounds[2]) },
    Quantity { group: "Bounds", symbol: "", meaning: "greatest y of the section", path: "bounds.ymax", dim: Dim::L(1), get: |a| num(a.props.bounds[3]) },
    Quantity { group: "Second moments", symbol: "Ixx|Iy", meaning: "about the centroidal axis parallel to x|about the centroidal axis parallel to y (horizontal)", path: "inertia.xx", dim: Dim::L(4), get: |a| num(a.props.ixx) },
    Quantity { group: "Second moments", symbol: "Iyy|Iz", meaning: "about the centroidal axis parallel to y|about the centroidal axis parallel to z (vertical)", path: "inertia.yy", dim: Dim::L(4), get: |a| num(a.props.iyy) },
    Quantity { group: "Second moments", symbol: "Ixy|Iyz", meaning: "product of inertia about the centroid", path: "inertia.xy", dim: Dim::L(4), get: |a| num(a.props.ixy) },
    Quantity { group: "Principal axes", symbol: "I1", meaning: "major principal second moment", path: "principal.i1", dim: Dim::L(4), get: |a| num(a.props.principal.i1) },
    Quantity { group: "Principal axes", symbol: "I2", meaning: "minor principal second moment", path: "principal.i2", dim: Dim::L(4), get: |a| num(a.props.principal.i2) },
    Quantity { group: "Principal axes", symbol: "θ", meaning: "angle from +x to the major axis, counter-clockwise|angle from +y to the major axis, counter-clockwise", path: "principal.angle_deg", dim: Dim::Deg, get: |a| num(a.props.principal.angle_deg) },
    Quantity { group: "Elastic moduli", symbol: "Sx,top|Wel,y,top", meaning: "Ixx / (ymax − ȳ)|Iy / (zmax − z̄)", path: "elastic_modulus.x_top", dim: Dim::L(3), get: |a| num(a.props.elastic.x_top) },
    Quantity { group: "Elastic moduli", symbol: "Sx,bot|Wel,y,bot", meaning: "Ixx / (ȳ − ymin)|Iy / (z̄ − zmin)", path: "elastic_modulus.x_bottom", dim: Dim::L(3), get: |a| num(a.props.elastic.x_bottom) },
    Quantity { group: "Elastic moduli", symbol: "Sy,left|Wel,z,left", meaning: "Iyy / (x̄ − xmin)|Iz / (ȳ − ymin)", path: "elastic_modulus.y_left", dim: Dim::L(3), get: |a| num(a.props.elastic.y_left) },
    Quantity { group: "Elastic moduli", symbol: "Sy,right|Wel,z,right", meaning: "Iyy / (xmax − x̄)|Iz / (ymax − ȳ)", path: "elastic_modulus.y_right", dim: Dim::L(3), get: |a| num(a.props.elastic.y_right) },
    Quantity { group: "Plastic moduli", symbol: "", meaning: "no plastic moduli (not formed)", path: "plastic_modulus", dim: Dim::None, get: plastic_null },
    Quantity { group: "Plastic moduli", symbol: "Zx|Wpl,y", meaning: "plastic modulus about the axis parallel to x|plastic modulus about the axis parallel to y", path: "plastic_modulus.x", dim: Dim::L(3), get: |a| plastic(a, |z| z.zx) },
    Quantity { group: "Plastic moduli", symbol: "Zy|Wpl,z", meaning: "plastic modulus about the axis parallel to y|plastic modulus about the axis parallel to z", path: "plastic_modulus.y", dim: Dim::L(3), get: |a| plastic(a, |z| z.zy) },
    Quantity { group: "Plastic moduli", symbol: "", meaning: "no plastic neutral axes (not formed)", path: "plastic_axis", dim: Dim::None, get: plastic_null },
    Quantity { group: "Plastic moduli", symbol: "yp|zp", meaning: "height of the plastic neutral axis", path: "plastic_axis.y", dim: Dim::L(1), get: |a| plastic(a, |z| z.y) },
    Quantity { group: "Plastic moduli", symbol: "xp|yp", meaning: "position of the plastic neutral axis parallel to y|position of the plastic neutral axis parallel to z", path: "plastic_axis.x", dim: Dim::L(1), get: |a| plastic(a, |z| z.x) },
    Quantity { group: "Radii of gyration", symbol: "rx|iy", meaning: "√(Ixx/A)|√(Iy/A)", path: "gyration.x", dim: Dim::L(1), get: |a| num(a.props.gyration.x) },
    Quantity { group: "Radii of gyration", symbol: "ry|iz", meaning: "√(Iyy/A)|√(Iz/A)", path: "gyration.y", dim: Dim::L(1), get: |a| num(a.props.gyration.y) },
    Quantity { group: "Radii of gyration", symbol: "rmin|imin", meaning: "√(I2/A)", path: "gyration.min", dim: Dim::L(1), get: |a| num(a.props.gyration.min) },
    Quantity { group: "Torsion", symbol: "", meaning: "torsion failed (the warning says why)", path: "torsion", dim: Dim::None, get: torsion_null },
    Quantity { group: "Torsion", symbol: "J|IT", meaning: "Saint-Venant torsion constant", path: "torsion.j", dim: Dim::L(4), get: |a| torsion(a, |_, t| num(t.j)) },
    Quantity { group: "Torsion", symbol: "Cw|Iw", meaning: "warping constant about the shear centre", path: "torsion.cw", dim: Dim::L(6), get: |a| torsion(a, |_, t| num(t.cw)) },
    Quantity { group: "Torsion", symbol: "xs|ys", meaning: "shear centre, x|shear centre, y (horizontal)", path: "torsion.shear_centre.x", dim: Dim::L(1), get: |a| shear_centre(a).map_or(Cell::Absent, |s| num(s.x)) },
    Quantity { group: "Torsion", symbol: "ys|zs", meaning: "shear centre, y|shear centre, z (vertical)", path: "torsion.shear_centre.y", dim: Dim::L(1), get: |a| shear_centre(a).map_or(Cell::Absent, |s| num(s.y)) },
    Quantity { group: "Torsion", symbol: "", meaning: "finite-element method", path: "torsion.method", dim: Dim::None, get: |a| torsion(a, |_, t| Cell::Text(t.method.clone())) },
    Quantity { group: "Torsion", symbol: "err", meaning: "estimated relative error of J and Cw", path: "torsion.rel_error", dim: Dim::Fraction, get: |a| torsion(a, |_, t| num(t.rel_error)) },
    Quantity { group: "Torsion", symbol: "", meaning: "finite elements", path: "torsion.elements", dim: Dim::None, get: |a| torsion(a, |_, t| Cell::Count(t.elements)) },
    Quantity { group: "Torsion", symbol: "", meaning: "no monosymmetry constants", path: "torsion.beta", dim: Dim::None, get: beta_null },
    Quantity { group: "Torsion", symbol: "", meaning: "monosymmetry constant βx", path: "torsion.beta.x", dim: Dim::L(1), get: |a| beta(a, |b| b.0) },
    Quantity { group: "Torsion", symbol: "", meaning: "monosymmetry constant βy", path: "torsion.beta.y", dim: Dim::L(1), get: |a| beta(a, |b| b.1) },
    Quantity { group: "Mass", symbol: "m", meaning: "mass per length", path: "mass_per_length", dim: Dim::Mass, get: |a| a.mass_per_metre().map_or(Cell::Absent, num) },
    Quantity { group: "Stresses", symbol: "σmax", meaning: "largest normal stress (tension +)", path: "stress.max_tension.value", dim: Dim::Stress, get: |a| stress(a, |s| num(s.extremes.max_tension.value)) },
    Quantity { group: "Stresses", symbol: "", meaning: "where the largest stress is, x", path: "stress.max_tension.x", dim: Dim::L(1), get: |a| stress(a, |s| num(s.extremes.max_tension.x)) },
    Quantity { group: "Stresses", symbol: "", meaning: "where the largest stress is, y", path: "stress.max_tension.y", dim: Dim::L(1), get: |a| stress(a, |s| num(s.extremes.max_tension.y)) },
    Quantity { group: "Stresses", symbol: "σmin", meaning: "smallest normal stress (compression −)", path: "stress.max_compression.value", dim: Dim::Stress, get: |a| stress(a, |s| num(s.extremes.max_compression.value)) },
    Quantity { group: "Stresses", symbol: "", meaning: "where the smallest stress is, x", path: "stress.max_compression.x", dim: Dim::L(1), get: |a| stress(a, |s| num(s.extremes.max_compression.x)) },
    Quantity { group: "Stresses", symbol: "", meaning: "where the smallest stress is, y", path: "stress.max_compression.y", dim: Dim::L(1), get: |a| stress(a, |s| num(s.extremes.max_compression.y)) },
    Quantity { group: "Stresses", symbol: "NA", meaning: "angle of the neutral axis from +x|angle of the neutral axis from +y", path: "stress.neutral_axis_angle_deg", dim: Dim::Deg, get: |a| stress(a, |s| s.neutral_axis_angle_deg.into()) },
    Quantity { group: "Member", symbol: "Mmax", meaning: "largest bending moment", path: "member.m_max", dim: Dim::Moment, get: |a| member(a, |m| num(m.m_max)) },
    Quantity { group: "Member", symbol: "Vmax", meaning: "largest shear force", path: "member.v_max", dim: Dim::Force, get: |a| member(a, |m| num(m.v_max)) },
    Quantity { group: "Member", symbol: "δmax", meaning: "largest deflection", path: "member.deflection_max", dim: Dim::Deflection, get: |a| member(a, |m| m.deflection_max.into()) },
    Quantity { group: "Member", symbol: "δallow", meaning: "span / deflection limit", path: "member.deflection_allowed", dim: Dim::Deflection, get: |a| member(a, |m| num(m.deflection_allowed)) },
    Quantity { group: "Member", symbol: "σb", meaning: "bending stress: the largest n·Mmax·c/Ixx over the materials|bending stress: the largest n·Mmax·c/Iy over the materials", path: "member.stress_max", dim: Dim::Stress, get: |a| member(a, |m| num(m.stress_max)) },
    Quantity { group: "Member", symbol: "util", meaning: "utilisation: max(σ/fy of each material, δ/δallow)", path: "member.utilization", dim: Dim::One, get: |a| member(a, |m| m.utilization.into()) },
    Quantity { group: "Member", symbol: "Mcr", meaning: "elastic critical moment (LTB), simple span, load at the shear centre", path: "member.mcr", dim: Dim::Moment, get: |a| member(a, |m| m.mcr.into()) },
    Quantity { group: "Member", symbol: "", meaning: "monosymmetry constant βx used for Mcr", path: "member.beta_x", dim: Dim::Metres, get: |a| member(a, |m| m.beta_x.into()) },
    Quantity { group: "Member", symbol: "", meaning: "the material whose stress governs", path: "member.governing_material", dim: Dim::None, get: |a| member(a, |m| m.governing_material.clone().map_or(Cell::Absent, Cell::Text)) },
    // Not in FORMAT.md: after its keys in the JSON, beside the elastic moduli in the views.
    Quantity { group: "Principal moduli", symbol: "S1,+", meaning: "I1 / v_max: about axis 1 to the extreme fibre on the +v side (v along axis 2, at θ + 90°)", path: "principal_modulus.s1_pos", dim: Dim::L(3), get: |a| principal_modulus(a, |s| s.s1_pos) },
    Quantity { group: "Principal moduli", symbol: "S1,−", meaning: "I1 / (−v_min): about axis 1 to the extreme fibre on the −v side", path: "principal_modulus.s1_neg", dim: Dim::L(3), get: |a| principal_modulus(a, |s| s.s1_neg) },
    Quantity { group: "Principal moduli", symbol: "S2,+", meaning: "I2 / u_max: about axis 2 to the extreme fibre on the +u side (u along axis 1, at θ)", path: "principal_modulus.s2_pos", dim: Dim::L(3), get: |a| principal_modulus(a, |s| s.s2_pos) },
    Quantity { group: "Principal moduli", symbol: "S2,−", meaning: "I2 / (−u_min): about axis 2 to the extreme fibre on the −u side", path: "principal_modulus.s2_neg", dim: Dim::L(3), get: |a| principal_modulus(a, |s| s.s2_neg) },
    Quantity { group: "Member", symbol: "δshear", meaning: "what shear deformation adds to δmax (Timoshenko, G·A_s,y)", path: "member.deflection_shear", dim: Dim::Deflection, get: deflection_shear },
    Quantity { group: "Member", symbol: "τ@Vmax", meaning: "largest shear stress from Vmax (vertical shear, flexure solution)", path: "member.tau_max", dim: Dim::Stress, get: |a| shear(a, |s| s.member_tau.map(|p| p.value), with_member) },
    Quantity { group: "Shear", symbol: "Asx|Av,y", meaning: "shear area for shear along x (energy-consistent, to G of the first material)|shear area for shear along y (energy-consistent, to G of the first material)", path: "shear_area.x", dim: Dim::L(2), get: |a| shear(a, |s| s.areas.map(|v| v[0]), always) },
    Quantity { group: "Shear", symbol: "Asy|Av,z", meaning: "shear area for shear along y (energy-consistent, to G of the first material)|shear area for shear along z (energy-consistent, to G of the first material)", path: "shear_area.y", dim: Dim::L(2), get: |a| shear(a, |s| s.areas.map(|v| v[1]), always) },
    Quantity { group: "Shear", symbol: "τmax", meaning: "largest resultant shear stress from Vx, Vy and T", path: "shear.tau_max.value", dim: Dim::Stress, get: |a| shear(a, |s| s.tau_max.map(|p| p.value), any_shear_action) },
    Quantity { group: "Shear", symbol: "", meaning: "where the largest shear stress is, x", path: "shear.tau_max.x", dim: Dim::L(1), get: |a| shear(a, |s| s.tau_max.map(|p| p.at.x), any_shear_action) },
    Quantity { group: "Shear", symbol: "", meaning: "where the largest shear stress is, y", path: "shear.tau_max.y", dim: Dim::L(1), get: |a| shear(a, |s| s.tau_max.map(|p| p.at.y), any_shear_action) },
    Quantity { group: "Shear", symbol: "σvM", meaning: "largest von Mises stress √(σ² + 3τ²) with N, Mx, My", path: "shear.von_mises_max.value", dim: Dim::Stress, get: |a| shear(a, |s| s.von_mises_max.map(|p| p.value), any_shear_action) },
    Quantity { group: "Shear", symbol: "", meaning: "where the largest von Mises stress is, x", path: "shear.von_mises_max.x", dim: Dim::L(1), get: |a| shear(a, |s| s.von_mises_max.map(|p| p.at.x), any_shear_action) },
    Quantity { group: "Shear", symbol: "", meaning: "where the largest von Mises stress is, y", path: "shear.von_mises_max.y", dim: Dim::L(1), get: |a| shear(a, |s| s.von_mises_max.map(|p| p.at.y), any_shear_action) },
];

/// One result as the views show it.
#[derive(Debug, Clone, PartialEq)]
pub struct Row {
    /// The group heading the row belongs to (e.g. "Second moments").
    pub group: &'static str,
    /// Symbol, unique within a section (e.g. "Ixx"); baselines are matched by it.
    pub symbol: String,
    pub value: Option<f64>,
    pub unit: String,
    /// What the row means, in words.
    pub meaning: &'static str,
    /// How its change against a baseline reads.
    pub compare: Compare,
}

/// The rows of every shown quantity present in `a`, grouped in [`GROUPS`] order, then
/// the connections', in output units; a value that is not a finite number is `None`.
pub fn rows(a: &Analysis, u: &OutUnits) -> Vec<Row> {
    let mut out: Vec<Row> = QUANTITIES.iter().filter_map(|q| row(q, a, u)).collect();
    // With holes, the net section's own properties again, in a group of their own and
    // with symbols marked ",net" so a baseline never matches them to gross rows.
    if let Some(n) = net_view(a) {
        out.extend(
            QUANTITIES
                .iter()
                .filter(|q| q.in_net())
                .filter_map(|q| row(q, &n, u))
                .map(|r| Row {
                    group: "Net section",
                    symbol: format!("{},net", r.symbol),
                    ..r
                }),
        );
    }
    out.sort_by_key(|r| GROUPS.iter().position(|g| *g == r.group));
    out.extend(connection_rows(a, u));
    out
}

/// The row of quantity `q` of `a`, if it is shown and `a` has it.
fn row(q: &Quantity, a: &Analysis, u: &OutUnits) -> Option<Row> {
    if !q.shown() {
        return None;
    }
    let value = match (q.get)(a) {
        Cell::Num(x) => Some(q.dim.shown(x, u)),
        Cell::Null => None,
        _ => return None,
    };
    Some(Row {
        group: q.group,
        symbol: q.symbol_in(u.notation).to_string(),
        value: value.filter(|v| v.is_finite()),
        unit: q.dim.label(u),
        meaning: q.meaning_in(u.notation),
        compare: q.compare(),
    })
}

/// The rows of the joints between parts: length, and the shear flow under the actions
/// and at the member's Vmax when those are given.
fn connection_rows(a: &Analysis, u: &OutUnits) -> Vec<Row> {
    let qu = u.shear_flow();
    let shear_given = a
        .section
        .actions
        .is_some_and(|x| x.vx.is_some() || x.vy.is_some());
    let closed_note = if a.flexure().is_some() {
        "joint on a closed cell: shear flow from the finite-element flexure solution"
    } else {
        "joint on a closed cell: flow needs the finite-element flexure solution (not solved)"
    };
    let mut out = Vec::new();
    for c in &a.connections {
        let pair = format!("{}–{}", a.pieces[c.joint.a].name, a.pieces[c.joint.b].name);
        let closed = c.flow == Flow::ClosedCell;
        let row = |symbol: String, value: Option<f64>, unit: String, meaning| Row {
            group: "Connections",
            symbol,
            value: value.filter(|v| v.is_finite()),
            unit,
            meaning,
            compare: Compare::Relative,
        };
        out.push(row(
            format!("L {pair}"),
            Some(u.geo(c.joint.length, 1)),
            u.label(1),
            "length of the boundary the two parts share",
        ));
        if shear_given {
            out.push(row(
                format!("q {pair}"),
                a.connection_flow(c).map(|q| qu.from_si(q)),
                qu.name.into(),
                if closed {
                    closed_note
                } else {
                    "shear flow across the joint under Vx, Vy of [actions]"
                },
            ));
        }
        if a.member.is_some() {
            out.push(row(
                format!("q@Vmax {pair}"),
                a.connection_flow_at_vmax(c).map(|q| qu.from_si(q)),
                qu.name.into(),
                if closed {
                    closed_note
                } else {
                    "shear flow across the joint at the member's Vmax (vertical shear)"
                },
            ));
        }
    }
    out
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn the_table_is_well_formed() {
        // One quantity per JSON path and per shown symbol in each notation; every
        // group has a place.
        let mut paths: Vec<&str> = QUANTITIES.iter().map(|q| q.path).collect();
        paths.sort_unstable();
        let n = paths.len();
        paths.dedup();
        assert_eq!(paths.len(), n, "a JSON path twice");
        for notation in [Notation::Xy, Notation::Yz] {
            let mut syms: Vec<&str> = QUANTITIES
                .iter()
                .filter(|q| q.shown())
                .map(|q| q.symbol_in(notation))
                .collect();
            syms.sort_unstable();
            let n = syms.len();
            syms.dedup();
            assert_eq!(syms.len(), n, "a symbol twice in {notation:?}");
        }
        for q in QUANTITIES {
            assert!(q.symbol.matches('|').count() <= 1 && q.meaning.matches('|').count() <= 1);
        }
        for q in QUANTITIES.iter().filter(|q| q.shown()) {
            assert!(GROUPS.contains(&q.group), "{} has no place", q.group);
        }
    }

    #[test]
    fn the_yz_notation_names_the_moduli_w() {
        // EN 1993-1-1 §1.6 symbols: Wel,y / Wpl,y about the major (horizontal y) axis,
        // Iy, Iz second moments, IT and Iw the torsion and warping constants.
        let sym = |path: &str, n: Notation| {
            QUANTITIES
                .iter()
                .find(|q| q.path == path)
                .unwrap()
                .symbol_in(n)
        };
        assert_eq!(sym("elastic_modulus.x_top", Notation::Xy), "Sx,top");
        assert_eq!(sym("elastic_modulus.x_top", Notation::Yz), "Wel,y,top");
        assert_eq!(sym("plastic_modulus.x", Notation::Yz), "Wpl,y");
        assert_eq!(sym("inertia.yy", Notation::Yz), "Iz");
        assert_eq!(sym("torsion.cw", Notation::Yz), "Iw");
        assert_eq!(sym("area", Notation::Yz), "A");
    }
}
