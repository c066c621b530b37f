//! The whole calculation for one section: text → document → resolved section →
//! placed pieces → properties, torsion and checks. Everything a view shows comes from
//! an [`Analysis`]; nothing here prints or touches files.

use crate::checks::kern::kern_polygon;
use crate::checks::member::{self, Beam, BeamResult, PointLoad, Support};
use crate::checks::shear_flow::{self, Connection};
use crate::checks::stress::{extremes, Actions as StressActions, Extremes, StressField};
use crate::fe::{torsion, Torsion, TorsionOptions};
use crate::geom::{joints, Piece, Pt, Seg};
use crate::model::{Diagnostic, Document, Resolved};
use crate::props::overlap::warnings;
use crate::props::Properties;

/// Standard acceleration of gravity, m/s² (NIST SP 811), for self-weight.
pub const GRAVITY: f64 = 9.80665;
/// Poisson's ratio assumed for the shear modulus `G = E/(2(1+ν))` in the
/// lateral-torsional buckling estimate (structural steel; stated in every output).
pub const POISSON: f64 = 0.3;

/// What to compute; `torsion: None` skips the finite-element solve.
#[derive(Debug, Clone, Default)]
pub struct Options {
    pub torsion: Option<TorsionOptions>,
}

/// Stresses under `[actions]`, in Pa at points in the file's frame.
#[derive(Debug, Clone)]
pub struct StressResult {
    /// σ(x, y) in Pa, x and y in the file's unit, for the reference material.
    pub field: StressField,
    pub extremes: Extremes,
    pub neutral_axis_angle_deg: Option<f64>,
    /// Extremes per material (σ × modular ratio) when there are several.
    pub per_material: Vec<(String, Extremes)>,
}

/// The single-span check, SI (N, N·m, m, Pa).
#[derive(Debug, Clone)]
pub struct MemberResult {
    pub beam: Beam,
    pub result: Option<BeamResult>,
    pub m_max: f64,
    pub v_max: f64,
    /// `None` without a modulus of elasticity.
    pub deflection_max: Option<f64>,
    pub deflection_allowed: f64,
    pub stress_max: f64,
    /// `max(stress/fy, δ/δ_allowed)` over the ratios that can be formed.
    pub utilization: Option<f64>,
    /// Elastic critical moment for lateral-torsional buckling (simple span only).
    pub mcr: Option<f64>,
    /// Self-weight added to the uniform load, N/m.
    pub self_weight: f64,
}

/// Everything known about one section.
#[derive(Debug, Clone)]
pub struct Analysis {
    pub document: Document,
    pub section: Resolved,
    pub pieces: Vec<Piece>,
    pub props: Properties,
    /// `None` when skipped; `Some(Err)` when the solve failed (the message says why).
    pub torsion: Option<Result<Torsion, String>>,
    pub stress: Option<StressResult>,
    pub member: Option<MemberResult>,
    /// The kern: where an axial compressive load leaves no fibre in tension
    /// (counter-clockwise polygon in the file frame; empty if it cannot be formed).
    pub kern: Vec<(f64, f64)>,
    /// Joints between solid parts, in file order of the pairs, with what statics says
    /// about the flow across each.
    pub connections: Vec<Connection>,
    pub warnings: Vec<String>,
}

impl Analysis {
    /// Reads and computes a section from its file text.
    pub fn of_text(text: &str, opts: &Options) -> Result<Analysis, Diagnostic> {
        let document = crate::file::parse(text)?;
        Analysis::of_document(document, opts)
    }

    /// Computes a section from a document.
    pub fn of_document(document: Document, opts: &Options) -> Result<Analysis, Diagnostic> {
        let section = Resolved::resolve(&document)?;
        let pieces = section.pieces();
        let props = Properties::compute(&pieces).map_err(|m| {
            // Point at the first void: that is where the area went (else the top).
            let span = pieces
                .iter()
                .find(|p| p.void)
                .and_then(|p| document.parts.get(p.part))
                .map_or(0..1, |p| p.span.clone());
            Diagnostic::new(span, m)
        })?;
        let contacts = joints::contacts(&pieces);
        let connections = shear_flow::connections(&pieces, &contacts, &props.centroidal());
        let shear_given = section
            .actions
            .is_some_and(|a| a.vx.is_some() || a.vy.is_some());
        let mut notes = warnings(&pieces);
        notes.extend(shear_flow::warnings(
            &pieces,
            &contacts,
            &connections,
            shear_given,
        ));
        let mut a = Analysis {
            warnings: notes,
            connections,
            kern: kern_polygon(&props.centroidal(), &outline_points(&pieces)),
            document,
            section,
            pieces,
            props,
            torsion: None,
            stress: None,
            member: None,
        };
        a.stress = a.stresses();
        a.member = a.member_check();
        a.warnings.extend(a.member_notes());
        if let Some(o) = &opts.torsion {
            a.set_torsion(torsion(&a.pieces, o));
        }
        Ok(a)
    }

    /// Adds a torsion result solved separately (the workbench solves off the UI
    /// thread), with its warnings and the member check that depends on it.
    pub fn set_torsion(&mut self, t: Result<Torsion, String>) {
        match &t {
            Ok(t) => self.warnings.extend(t.warnings.iter().cloned()),
            Err(e) => self.warnings.push(format!("torsion not computed: {e}")),
        }
        self.torsion = Some(t);
        self.member = self.member_check();
    }

    /// Metres per length unit of the file.
    fn m(&self) -> f64 {
        self.section.units.metres()
    }

    fn stresses(&self) -> Option<StressResult> {
        let act = self.section.actions?;
        let m = self.m();
        // Consistent units: N and file lengths; then N/unit² → Pa.
        let sa = StressActions {
            n: act.n,
            mx: act.mx / m,
            my: act.my / m,
        };
        let field = StressField::new(&self.props.centroidal(), &sa)?.scaled(1.0 / (m * m));
        let candidates = extreme_candidates(&self.pieces, &field, None);
        let ext = extremes(&field, &candidates)?;
        let mats: Vec<usize> = {
            let mut v: Vec<usize> = self.pieces.iter().filter_map(|p| p.material).collect();
            v.sort_unstable();
            v.dedup();
            v
        };
        let per_material = if mats.len() > 1 {
            mats.iter()
                .filter_map(|&mi| {
                    let n = self.pieces.iter().find(|p| p.material == Some(mi))?.n;
                    let f = field.scaled(n);
                    let pts = extreme_candidates(&self.pieces, &f, Some(mi));
                    Some((
                        self.section.materials.get(mi)?.name.clone(),
                        extremes(&f, &pts)?,
                    ))
                })
                .collect()
        } else {
            Vec::new()
        };
        Some(StressResult {
            neutral_axis_angle_deg: field.neutral_axis_angle_deg(),
            field,
            extremes: ext,
            per_material,
        })
    }

    /// The longitudinal shear flow across connection `c` in N/m under the shears of
    /// `[actions]`; `None` without Vx or Vy, or where statics does not give it.
    pub fn connection_flow(&self, c: &Connection) -> Option<f64> {
        let act = self.section.actions?;
        if act.vx.is_none() && act.vy.is_none() {
            return None;
        }
        let (vx, vy) = (act.vx.unwrap_or(0.0), act.vy.unwrap_or(0.0));
        c.q(&self.props.centroidal(), vx, vy).map(|q| q / self.m())
    }

    /// The flow across connection `c` in N/m at the member's largest shear force
    /// (vertical, `Vy = Vmax`, as the member check bends about x).
    pub fn connection_flow_at_vmax(&self, c: &Connection) -> Option<f64> {
        let v = self.member.as_ref()?.v_max;
        c.q(&self.props.centroidal(), 0.0, v).map(|q| q / self.m())
    }

    /// Mass per metre in kg/m, when every part has a density.
    pub fn mass_per_metre(&self) -> Option<f64> {
        self.props.mass_area.map(|ma| ma * self.m() * self.m())
    }

    /// What the member check had to leave out, in words.
    fn member_notes(&self) -> Vec<String> {
        let Some(mb) = &self.section.member else {
            return Vec::new();
        };
        let mut notes = Vec::new();
        if mb.self_weight && self.mass_per_metre().is_none() {
            notes.push("self_weight is on but not every part has a material with a density; self-weight left out".to_string());
        }
        if self.section.materials.is_empty() {
            notes.push("the member check has no modulus of elasticity: add [[materials]] with E for deflections".to_string());
        }
        notes
    }

    fn member_check(&self) -> Option<MemberResult> {
        let mb = self.section.member.as_ref()?;
        let m = self.m();
        let e = self.section.materials.first().map(|mat| mat.e);
        let fy = self.section.materials.first().and_then(|mat| mat.fy);
        let self_weight = if mb.self_weight {
            self.mass_per_metre().unwrap_or(0.0) * GRAVITY
        } else {
            0.0
        };
        let i = self.props.ixx * m.powi(4);
        let beam = Beam {
            span: mb.length,
            support: mb.support,
            udl: mb.udl + self_weight,
            points: mb.points.iter().map(|&(p, a)| PointLoad { p, a }).collect(),
            // Without E the forces are still right (they do not depend on EI); the
            // deflection is not reported.
            ei: e.unwrap_or(1.0) * i,
        };
        let result = member::analyse(&beam).ok();
        let (m_max, v_max) = result
            .as_ref()
            .map_or((f64::NAN, f64::NAN), |r| (r.m_max, r.v_max));
        let deflection_max = e.and(result.as_ref().map(|r| r.deflection_max));
        let deflection_allowed = mb.length / mb.deflection_limit;
        let s_min = self.props.elastic.x_top.min(self.props.elastic.x_bottom) * m.powi(3);
        let stress_max = m_max / s_min;
        let ratios = [
            fy.map(|f| stress_max / f),
            deflection_max.map(|d| d / deflection_allowed),
        ];
        let utilization = ratios.iter().flatten().copied().reduce(f64::max);
        let mcr = match (mb.support, e, &self.torsion) {
            (Support::Simple, Some(e), Some(Ok(t))) => member::mcr_uniform_moment(
                e,
                e / (2.0 * (1.0 + POISSON)),
                self.props.iyy * m.powi(4),
                t.j * m.powi(4),
                t.cw * m.powi(6),
                mb.length,
            ),
            _ => None,
        };
        Some(MemberResult {
            beam,
            result,
            m_max,
            v_max,
            deflection_max,
            deflection_allowed,
            stress_max,
            utilization,
            mcr,
            self_weight,
        })
    }
}

/// Points where a linear stress field can take its extremes over the solid parts
/// (of material `only`, if given): every vertex, and on each arc the points where the
/// field's gradient is normal to the circle, if they lie on the arc.
pub fn extreme_candidates(
    pieces: &[Piece],
    field: &StressField,
    only: Option<usize>,
) -> Vec<(f64, f64)> {
    let dir = Pt::new(field.a, field.b);
    let len = dir.x.hypot(dir.y);
    let mut out = Vec::new();
    for p in pieces
        .iter()
        .filter(|p| !p.void && only.is_none_or(|m| p.material == Some(m)))
    {
        for c in &p.contours {
            for s in &c.segs {
                let q = s.start();
                out.push((q.x, q.y));
                if let (Seg::Arc { c, r, a0, a1 }, true) = (*s, len > 0.0) {
                    let t = dir.y.atan2(dir.x);
                    for cand in [t, t + std::f64::consts::PI] {
                        if angle_in_sweep(cand, a0, a1) {
                            out.push((c.x + r * cand.cos(), c.y + r * cand.sin()));
                        }
                    }
                }
            }
        }
    }
    out
}

/// Points on the outline of the solid parts, arcs cut into chords of at most 1°
/// (for the convex hull behind the kern).
pub fn outline_points(pieces: &[Piece]) -> Vec<(f64, f64)> {
    pieces
        .iter()
        .filter(|p| !p.void)
        .flat_map(|p| p.contours.iter())
        .flat_map(|c| c.facets(1f64.to_radians()))
        .map(|q| (q.x, q.y))
        .collect()
}

/// Is angle `t` (any turn) within the sweep from `a0` to `a1`?
fn angle_in_sweep(t: f64, a0: f64, a1: f64) -> bool {
    let (lo, hi) = (a0.min(a1), a0.max(a1));
    let tau = std::f64::consts::TAU;
    let k = ((lo - t) / tau).ceil();
    let t = t + k * tau;
    t >= lo && t <= hi
}
