//! The whole calculation for one section: text → document → resolved section →
//! placed pieces → properties, torsion and checks. Everything a view shows comes from
//! an [`Analysis`]; nothing here prints or touches files.
//!
//! Units: this is where the section meets SI. Geometry, properties and torsion results
//! stay in the file's length unit; actions, materials and the member are SI from
//! [`crate::geom::resolve`]. The member check takes each property into SI with
//! [`to_si`](crate::model::units::LengthUnit::to_si) and its [`Dim`]; the stresses are formed by
//! [`StressField::new`], which takes the file unit's size in metres and gives Pa.

use crate::checks::kern::kern_polygon;
use crate::checks::ltb::{self, Buckling, Compressed};
use crate::checks::member::{self, Beam, BeamResult, PointLoad, Support};
use crate::checks::shear_flow::{self, Connection, Flow};
use crate::checks::stress::{extremes, Extremes, Octagon, StressField};
use crate::fe::flexure::{Flexure, JointFlow, Load, Peak};
use crate::fe::{torsion, Torsion, TorsionOptions};
use crate::geom::{corner, joints, solid_bounds, Piece, Pt, Seg};
use crate::geom::{LoadHeight, Resolved};
use crate::model::units::Dim;
use crate::model::warning::{McrRefusal, ShearCause, ShearFigure};
use crate::model::{Diagnostic, Document, Warning};
use crate::props::overlap::warnings;
use crate::props::Properties;

/// Standard acceleration of gravity, m/s², for self-weight (defined with the units).
pub use crate::model::units::GRAVITY;

/// What to compute; `torsion: None` skips the finite-element solve.
#[derive(Debug, Clone)]
pub struct Options {
    pub torsion: Option<TorsionOptions>,
    /// With torsion, also solve the flexure (shear) problem on its meshes (the
    /// default): the shear areas, shear stresses, the flow across joints on a closed
    /// cell and a deflection with shear deformation come from it. `false` (`kern calc
    /// --no-shear`) solves torsion alone; those results are then left out as with
    /// `--no-torsion`, and the mesh does not follow the boundaries parts share.
    pub shear: bool,
}

impl Default for Options {
    fn default() -> Self {
        Options {
            torsion: None,
            shear: true,
        }
    }
}

/// Which stages of the analysis run besides the section's properties (which every
/// result needs, with the net section when there are holes, so a file that fails
/// fails the same way). [`Scope::FULL`] is the whole analysis; reading one result
/// asks for what that result depends on (`iterate::vary::scope_for` decides), and
/// the stages left out are `None` or empty in the [`Analysis`]: its warnings, kern
/// and connections then are not the section's. The torsion solve, when asked for,
/// always comes with the full analysis (the member and shear results it feeds).
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub struct Scope {
    /// The plastic moduli and axes (of the gross and the net section); without them
    /// `Properties::plastic` is `None`.
    pub plastic: bool,
    /// Stresses under `[actions]`.
    pub stress: bool,
    /// The member check.
    pub member: bool,
    /// Everything else: overlap and joint warnings, the connections and their shear
    /// flow, the kern, and the member check's notes.
    pub rest: bool,
}

impl Scope {
    /// The whole analysis.
    pub const FULL: Scope = Scope {
        plastic: true,
        stress: true,
        member: true,
        rest: true,
    };
    /// The section's properties alone (area, centroid, second moments, elastic
    /// moduli, gyration, mass), without the plastic moduli.
    pub const PROPERTIES: Scope = Scope {
        plastic: false,
        stress: false,
        member: false,
        rest: false,
    };

    /// The stages of both.
    pub fn and(self, other: Scope) -> Scope {
        Scope {
            plastic: self.plastic || other.plastic,
            stress: self.stress || other.stress,
            member: self.member || other.member,
            rest: self.rest || other.rest,
        }
    }
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
    /// The largest deflection, m, with the shear deformation when `[member]
    /// shear_deformation` is on; `None` without a modulus of elasticity, or with shear
    /// deformation asked for but no shear area (see `shear_deflection_note`).
    pub deflection_max: Option<f64>,
    /// With shear deformation: how much it adds to the largest deflection, m — the
    /// Timoshenko beam's largest deflection less the Euler–Bernoulli one.
    pub deflection_shear: Option<f64>,
    /// Why shear deformation was asked for and the deflection is withheld.
    pub shear_deflection_note: Option<Warning>,
    pub deflection_allowed: f64,
    /// The largest bending stress over the materials, `n_i·M·c_i/Ixx` (net section).
    pub stress_max: f64,
    /// The bending stress of each material in use, in file order of the materials.
    pub fibres: Vec<FibreStress>,
    /// `max(σ_i/fy_i, δ/δ_allowed)` over the ratios that can be formed.
    pub utilization: Option<f64>,
    /// The material whose ratio decides the utilization (or, without fy, that has the
    /// largest stress), when there are several materials.
    pub governing_material: Option<String>,
    /// Elastic critical moment for lateral-torsional buckling (simple span only), N·m.
    pub mcr: Option<f64>,
    /// The monosymmetry constant βx used for `mcr`, m; present when the section
    /// qualifies (symmetric about an axis parallel to y, one piece, torsion solved).
    pub beta_x: Option<f64>,
    /// The side in compression that `mcr` was formed for; `None` when the moment
    /// takes both signs (or none) along the span and the lower of the two is given.
    pub mcr_side: Option<Compressed>,
    /// Why there is no `mcr`.
    pub mcr_note: Option<McrRefusal>,
    /// Self-weight added to the uniform load, N/m.
    pub self_weight: f64,
}

impl MemberResult {
    /// The warning for a missing Mcr, when the reason is one the user should hear of.
    pub fn mcr_warning(&self) -> Option<Warning> {
        (self.mcr_note.clone())
            .filter(McrRefusal::warns)
            .map(Warning::McrNotComputed)
    }
}

/// Shear stresses from the flexure solution, in Pa at points of the file frame; a
/// figure whose estimated error is above the tolerance is `None` (and warned of).
#[derive(Debug, Clone, PartialEq)]
pub struct ShearResult {
    /// Shear areas for shear along x and y (file length²), transformed to G_ref.
    pub areas: Option<[f64; 2]>,
    /// With Vx, Vy or T in `[actions]`: the largest √(τzx² + τzy²) from all three.
    pub tau_max: Option<Peak>,
    /// With Vx, Vy or T: the largest √(σ² + 3τ²), σ from N, Mx, My (net section).
    pub von_mises_max: Option<Peak>,
    /// With `[member]`: the largest shear stress from Vy = Vmax alone.
    pub member_tau: Option<Peak>,
    /// Where `tau_max` is withheld for a sharp re-entrant corner: the largest
    /// √(τzx² + τzy²) away from the corners ([`Flexure::peaks_away`]), when that is
    /// within the tolerance. Not the section's τmax (the stress at the corners is
    /// unbounded in the elastic model): it scales the shading only.
    pub tau_away: Option<Peak>,
    /// The same for `von_mises_max`.
    pub von_mises_away: Option<Peak>,
}

/// Stresses under `[actions]` at the flexure samples (file frame), in Pa; a stress
/// whose peak is not within the tolerance is `None` (a figure not to be trusted).
#[derive(Debug, Clone, PartialEq)]
pub struct StressSamples {
    pub at: Vec<Pt>,
    /// √(τzx² + τzy²) at each point.
    pub tau: Option<Vec<f64>>,
    /// √(σ² + 3τ²) at each point.
    pub von_mises: Option<Vec<f64>>,
}

/// The net section (FORMAT.md "Gross and net"): the enabled pieces with the holes
/// subtracted, and its properties. Stresses under `[actions]` and the member's bending
/// stress use it; everything else uses the gross section.
#[derive(Debug, Clone)]
pub struct NetSection {
    pub pieces: Vec<Piece>,
    pub props: Properties,
}

/// One material's bending stress in the member check: `σ_i = n_i·M·c_i/Ixx`, with
/// `c_i` the distance from the neutral axis to that material's own farthest fibre
/// (either side) and Ixx of the transformed (net) section (Gere & Goodno, Mechanics of
/// Materials, composite beams: the transformed-section method).
#[derive(Debug, Clone, PartialEq)]
pub struct FibreStress {
    /// Material name; `None` for a section without materials.
    pub material: Option<String>,
    /// Pa.
    pub stress: f64,
    /// Pa, when the material gives one.
    pub fy: Option<f64>,
}

/// Everything known about one section.
#[derive(Debug, Clone)]
pub struct Analysis {
    pub document: Document,
    pub section: Resolved,
    /// The gross section's pieces: holes left out.
    pub pieces: Vec<Piece>,
    /// The gross section's properties (the only section when there are no holes).
    pub props: Properties,
    /// The net section, present only when a part has `hole = true`.
    pub net: Option<NetSection>,
    /// `None` when skipped; `Some(Err)` when the solve failed (the message says why).
    pub torsion: Option<Result<Torsion, Warning>>,
    pub stress: Option<StressResult>,
    pub member: Option<MemberResult>,
    /// The kern: where an axial compressive load leaves no fibre in tension
    /// (counter-clockwise polygon in the file frame; empty if it cannot be formed).
    pub kern: Vec<(f64, f64)>,
    /// Joints between solid parts, in file order of the pairs, with what statics says
    /// about the flow across each.
    pub connections: Vec<Connection>,
    /// Shear stresses and shear areas, when the flexure solution ran with torsion.
    pub shear: Option<ShearResult>,
    pub warnings: Vec<Warning>,
}

impl Analysis {
    /// Computes a section from a document: the whole analysis.
    pub fn of_document(document: Document, opts: &Options) -> Result<Analysis, Diagnostic> {
        Analysis::of_document_in(document, opts, Scope::FULL)
    }

    /// Computes the stages of `scope` of a section (all of them with torsion); the
    /// results it covers are those of the whole analysis, bit for bit.
    pub fn of_document_in(
        document: Document,
        opts: &Options,
        scope: Scope,
    ) -> Result<Analysis, Diagnostic> {
        let section = Resolved::resolve(&document)?;
        Analysis::of_resolved_in(document, section, opts, scope)
    }

    /// [`Analysis::of_document_in`] of a document already resolved: `section` must be
    /// `Resolved::resolve(&document)` (or its equal, `Resolved::resolve_varying`).
    pub fn of_resolved_in(
        document: Document,
        section: Resolved,
        opts: &Options,
        scope: Scope,
    ) -> Result<Analysis, Diagnostic> {
        let scope = if opts.torsion.is_some() {
            Scope::FULL
        } else {
            scope
        };
        let all = section.pieces();
        let is_hole = |p: &Piece| section.parts.get(p.part).is_some_and(|q| q.hole);
        let pieces: Vec<Piece> = all.iter().filter(|p| !is_hole(p)).cloned().collect();
        // Point at the first void (or hole): that is where the area went (else the top).
        let compute = |pieces: &[Piece], first: &dyn Fn(&Piece) -> bool| {
            Properties::compute_with(pieces, scope.plastic).map_err(|m| {
                let span = pieces
                    .iter()
                    .find(|p| first(p))
                    .and_then(|p| document.parts.get(p.part))
                    .map_or(0..1, |p| p.span.clone());
                Diagnostic::new(span, m)
            })
        };
        let props = compute(&pieces, &|p| p.void)?;
        let net = if all.iter().any(is_hole) {
            let props = compute(&all, &is_hole)?;
            Some(NetSection {
                pieces: all.clone(),
                props,
            })
        } else {
            None
        };
        let (mut notes, mut connections, mut kern) = (Vec::new(), Vec::new(), Vec::new());
        if scope.rest {
            let contacts = joints::contacts(&pieces);
            connections = shear_flow::connections(&pieces, &contacts, &props.centroidal());
            let shear_given = section
                .actions
                .is_some_and(|a| a.vx.is_some() || a.vy.is_some());
            // Overlaps and voids outside solid material, holes included.
            notes = warnings(&all);
            notes.extend(shear_flow::warnings(
                &pieces,
                &contacts,
                &connections,
                shear_given,
            ));
            kern = kern_polygon(&props.centroidal(), &outline_points(&pieces));
        }
        let mut a = Analysis {
            warnings: notes,
            connections,
            kern,
            document,
            section,
            pieces,
            props,
            net,
            torsion: None,
            stress: None,
            member: None,
            shear: None,
        };
        if scope.stress {
            a.stress = a.stresses();
        }
        if scope.member {
            a.member = a.member_check();
        }
        if scope.rest {
            a.warnings.extend(a.member_notes());
            a.warnings.extend(a.cell_flow_notes());
        }
        if let Some(o) = &opts.torsion {
            let o = a.torsion_options(o.tol, o.cancel.clone(), opts.shear);
            a.set_torsion(torsion(&a.pieces, &o));
        }
        Ok(a)
    }

    /// The options of this section's torsion solve, here and in the workbench: with
    /// `shear` (`Options::shear`), the flexure solution (ν of the first material) and
    /// the mesh following the boundaries parts share when a joint is on a closed cell
    /// (its flow needs it); without, torsion alone.
    pub fn torsion_options(
        &self,
        tol: f64,
        cancel: Option<std::sync::Arc<std::sync::atomic::AtomicBool>>,
        shear: bool,
    ) -> TorsionOptions {
        TorsionOptions {
            tol,
            cancel,
            flexure: shear.then(|| nu_ref(&self.section)),
            joints: shear && (self.connections.iter()).any(|c| c.flow == Flow::ClosedCell),
        }
    }

    /// Adds a torsion result solved separately (the workbench solves off the UI
    /// thread), with its warnings and the member check that depends on it.
    pub fn set_torsion(&mut self, t: Result<Torsion, Warning>) {
        match &t {
            Ok(t) => {
                self.warnings.extend(t.warnings.iter().cloned());
            }
            Err(e) => self.warnings.push(Warning::NoTorsion(Box::new(e.clone()))),
        }
        self.torsion = Some(t);
        self.member = self.member_check();
        // The member's note on shear deformation depends on the flexure solution: renewed.
        self.warnings
            .retain(|w| !matches!(w, Warning::ShearDeflectionWithheld { .. }));
        let note = (self.member.as_ref()).and_then(|m| m.shear_deflection_note.clone());
        self.warnings.extend(note);
        self.shear = self.shear_result();
        self.warnings.retain(|w| {
            !matches!(
                w,
                Warning::ClosedCellFlow { .. }
                    | Warning::CellFlowWithheld { .. }
                    | Warning::LoopJointFlow { .. }
            )
        });
        let notes = self.cell_flow_notes();
        self.warnings.extend(notes);
        let warning = (self.member.as_ref()).and_then(MemberResult::mcr_warning);
        if let Some(w) = warning.filter(|w| !self.warnings.contains(w)) {
            self.warnings.push(w);
        }
    }

    /// The flexure solution that came with torsion, if it was solved.
    pub fn flexure(&self) -> Option<&Flexure> {
        let t = self.torsion.as_ref()?.as_ref().ok()?;
        t.flexure.as_ref()?.as_ref().ok()
    }

    /// The shear areas (file length², to G of the first material) when the flexure
    /// solution gave them within its tolerance.
    fn shear_areas(&self) -> Option<[f64; 2]> {
        let flex = self.flexure()?;
        (flex.shear_area_error <= flex.tol).then_some(flex.shear_area)
    }

    /// Shear areas and stresses from the flexure solution, keeping only figures within
    /// the tolerance; the warnings for the ones left out are added.
    fn shear_result(&mut self) -> Option<ShearResult> {
        let t = self.torsion.as_ref()?.as_ref().ok()?;
        let flex = match t.flexure.as_ref()? {
            Ok(f) => f,
            Err(w) => {
                let w = Warning::NoShear(Box::new(w.clone()));
                if !self.warnings.contains(&w) {
                    self.warnings.push(w);
                }
                return None;
            }
        };
        let tol = flex.tol;
        let pieces = &self.pieces;
        let mut notes = Vec::new();
        // A figure within the tolerance is kept; one that is not is noted with its cause:
        // a sharp re-entrant corner when its peak is at one, or when the same stress away
        // from the corners is within the tolerance (`away_ok`), so that the corners' term
        // is what keeps the estimate above it.
        let mut within = |figure, error: f64, at: Option<Pt>, away_ok: bool| {
            let ok = error <= tol;
            if !ok {
                let cause = match at {
                    Some(p) if corner::is_reentrant(pieces, p) => ShearCause::SharpCorner,
                    _ if away_ok => ShearCause::SharpCorner,
                    _ => ShearCause::NotSettled,
                };
                notes.push((figure, cause));
            }
            ok
        };
        within(ShearFigure::Areas, flex.shear_area_error, None, false);
        let areas = self.shear_areas();
        let u = self.section.units.metres();
        let zero = |_: Pt| 0.0;
        let mut out = ShearResult {
            areas,
            tau_max: None,
            von_mises_max: None,
            member_tau: None,
            tau_away: None,
            von_mises_away: None,
        };
        let trusted = |p: Peak| (p.rel_error <= tol).then_some(p);
        let both = |load: &Load| flex.peaks(load).map(|p| (p, flex.peaks_away(load)));
        if let Some(((tau, vm), away)) = self.under_actions(both).flatten() {
            let (tau_away, vm_away) = (
                away.and_then(|a| trusted(a.0)),
                away.and_then(|a| trusted(a.1)),
            );
            let fig = |p: Peak| (p.rel_error, Some(p.at));
            let (e, at) = fig(tau);
            out.tau_max = within(ShearFigure::TauMax, e, at, tau_away.is_some()).then_some(tau);
            let (e, at) = fig(vm);
            out.von_mises_max =
                within(ShearFigure::VonMises, e, at, vm_away.is_some()).then_some(vm);
            // Withheld, with the stress away from the corners within the tolerance: that
            // stress scales the shading (and is printed as nothing else).
            out.tau_away = tau_away.filter(|_| out.tau_max.is_none());
            out.von_mises_away = vm_away.filter(|_| out.von_mises_max.is_none());
        }
        if let Some(m) = &self.member {
            let load = Load {
                vx: 0.0,
                vy: m.v_max / (u * u),
                t: 0.0,
                sigma: &zero,
            };
            if let Some((tau, _)) = flex.peaks(&load).filter(|_| m.v_max.is_finite()) {
                let away_ok = flex.peaks_away(&load).and_then(|a| trusted(a.0)).is_some();
                out.member_tau =
                    within(ShearFigure::MemberTau, tau.rel_error, Some(tau.at), away_ok)
                        .then_some(tau);
            }
        }
        for cause in [ShearCause::SharpCorner, ShearCause::NotSettled] {
            let figures: Vec<ShearFigure> = (notes.iter())
                .filter(|n| n.1 == cause)
                .map(|n| n.0)
                .collect();
            if figures.is_empty() {
                continue;
            }
            let w = Warning::ShearAboveTolerance { figures, cause };
            if !self.warnings.contains(&w) {
                self.warnings.push(w);
            }
        }
        Some(out)
    }

    /// `f` applied to the flexure load of `[actions]`: Vx, Vy, T in N and N·m over the
    /// file's unit (τ in Pa), σ of the reference material from N, Mx, My on the net
    /// section; `None` without Vx, Vy or T.
    fn under_actions<R>(&self, f: impl FnOnce(&Load) -> R) -> Option<R> {
        let act = self.section.actions?;
        if act.vx.is_none() && act.vy.is_none() && act.t.is_none() {
            return None;
        }
        let u = self.section.units.metres();
        let field = self.stress.as_ref().map(|s| s.field);
        let sigma = |p: Pt| field.map_or(0.0, |f| f.at(p.x, p.y));
        let load = Load {
            vx: act.vx.unwrap_or(0.0) / (u * u),
            vy: act.vy.unwrap_or(0.0) / (u * u),
            t: act.t.unwrap_or(0.0) / (u * u * u),
            sigma: &sigma,
        };
        Some(f(&load))
    }

    /// The resultant shear stress and the von Mises stress (Pa) under `[actions]` at
    /// every sample of the flexure solution's finest mesh, where its peak, or its peak
    /// away from the sharp re-entrant corners, is within the tolerance (`None` for a
    /// figure left out, see [`ShearResult`]); `None` without
    /// the flexure solution or without Vx, Vy or T.
    pub fn stress_samples(&self) -> Option<StressSamples> {
        let flex = self.flexure()?;
        let shear = self.shear.as_ref()?;
        self.under_actions(|load| {
            let all = flex.samples().iter().map(|s| {
                let (tau, vm) = s.stresses(load);
                (s.at, tau, vm)
            });
            let tau = shear.tau_max.or(shear.tau_away);
            let vm = shear.von_mises_max.or(shear.von_mises_away);
            StressSamples {
                at: all.clone().map(|s| s.0).collect(),
                tau: tau.map(|_| all.clone().map(|s| s.1).collect()),
                von_mises: vm.map(|_| all.map(|s| s.2).collect()),
            }
        })
    }

    /// A property of dimension `dim` in the file's unit, in SI.
    fn si(&self, value: f64, dim: Dim) -> f64 {
        self.section.units.to_si(value, dim)
    }

    /// The section stresses are taken on: the net one when there are holes, else the
    /// (only) gross one.
    pub fn stress_section(&self) -> (&[Piece], &Properties) {
        match &self.net {
            Some(n) => (&n.pieces, &n.props),
            None => (&self.pieces, &self.props),
        }
    }

    /// Every enabled piece, holes included (for drawings).
    pub fn all_pieces(&self) -> &[Piece] {
        self.stress_section().0
    }

    fn stresses(&self) -> Option<StressResult> {
        let act = self.section.actions?;
        let (_, props) = self.stress_section();
        let field = StressField::new(&props.centroidal(), &act, self.section.units.metres())?;
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
    /// `[actions]`; `None` without Vx or Vy, or where it is not given (see
    /// [`Analysis::flow_under`]).
    pub fn connection_flow(&self, c: &Connection) -> Option<f64> {
        let (vx, vy) = self.action_shears()?;
        self.flow_under(c, vx, vy)
    }

    /// The flow across connection `c` in N/m at the member's largest shear force
    /// (vertical, `Vy = Vmax`, as the member check bends about x).
    pub fn connection_flow_at_vmax(&self, c: &Connection) -> Option<f64> {
        let v = self.member.as_ref()?.v_max;
        self.flow_under(c, 0.0, v)
    }

    /// Whether a flow across connection `c` can be given: always for a joint whose cut
    /// separates the section; for a joint on a closed cell once the flexure solution
    /// gives it within its tolerance (the drawing's joint marks).
    pub fn flow_known(&self, c: &Connection) -> bool {
        self.flow_under(c, 1.0, 1.0).is_some()
    }

    /// `(Vx, Vy)` of `[actions]` in N (a missing one is zero), when either is given.
    fn action_shears(&self) -> Option<(f64, f64)> {
        let act = self.section.actions?;
        if act.vx.is_none() && act.vy.is_none() {
            return None;
        }
        Some((act.vx.unwrap_or(0.0), act.vy.unwrap_or(0.0)))
    }

    /// The flow across connection `c` in N/m under shears `vx`, `vy` (N): exact from
    /// first moments for a joint whose cut separates the section; for a joint on a
    /// closed cell from the flexure solution, when that is solved and within its
    /// tolerance (not for a shared boundary that closes on itself); else `None`.
    fn flow_under(&self, c: &Connection, vx: f64, vy: f64) -> Option<f64> {
        let q = match c.flow {
            Flow::ClosedCell => {
                let tol = self.flexure()?.tol;
                let j = self.cell_flow(c, vx, vy)?;
                (!j.closed && j.rel_error <= tol).then_some(j.value)?
            }
            _ => c.q(&self.props.centroidal(), vx, vy)?,
        };
        Some(self.si(q, Dim::PerLength))
    }

    /// The flow across a closed-cell joint under shears `vx`, `vy` (N) from the flexure
    /// solution, in N per file length unit, with its estimated error, whatever that is;
    /// `None` for another joint, without the flexure solution, or when the mesh does
    /// not follow the shared boundary (its edges between the two parts are not within
    /// 1 % of the joint's length: a jagged line where parts overlap, whose flux is not
    /// the joint's).
    pub fn cell_flow(&self, c: &Connection, vx: f64, vy: f64) -> Option<JointFlow> {
        if c.flow != Flow::ClosedCell {
            return None;
        }
        let j = self.flexure()?.joint_flow(c.joint.a, c.joint.b, vx, vy)?;
        ((j.length - c.joint.length).abs() <= 0.01 * c.joint.length).then_some(j)
    }

    /// The flow across connection `c` under the shears of `[actions]` from the flexure
    /// solution, with its estimate (for the report's method column).
    pub fn cell_flow_under_actions(&self, c: &Connection) -> Option<JointFlow> {
        let (vx, vy) = self.action_shears()?;
        self.cell_flow(c, vx, vy)
    }

    /// What the views must say about joints on a closed cell whose flow is asked for
    /// (under `[actions]` or at the member's Vmax): that the flexure solution is not
    /// there, or for each joint left out, why (estimate above the tolerance, a loop).
    fn cell_flow_notes(&self) -> Vec<Warning> {
        let cells: Vec<&Connection> = (self.connections.iter())
            .filter(|c| c.flow == Flow::ClosedCell)
            .collect();
        let vmax = self.member.as_ref().map(|m| (0.0, m.v_max));
        let loads: Vec<(f64, f64)> = self.action_shears().into_iter().chain(vmax).collect();
        if cells.is_empty() || loads.is_empty() {
            return Vec::new();
        }
        let name = |i: usize| self.pieces[i].name.clone();
        let Some(flex) = self.flexure() else {
            let joints = cells.iter().map(|c| (name(c.joint.a), name(c.joint.b)));
            return vec![Warning::ClosedCellFlow {
                joints: joints.collect(),
            }];
        };
        let mut out = Vec::new();
        for c in cells {
            let (a, b) = (name(c.joint.a), name(c.joint.b));
            let flows: Vec<Option<JointFlow>> = (loads.iter())
                .map(|&(vx, vy)| self.cell_flow(c, vx, vy))
                .collect();
            if flows.iter().flatten().any(|j| j.closed) {
                out.push(Warning::LoopJointFlow { a, b });
                continue;
            }
            let error = (flows.iter())
                .map(|j| j.map_or(f64::INFINITY, |j| j.rel_error))
                .fold(0.0, f64::max);
            if error > flex.tol {
                out.push(Warning::CellFlowWithheld {
                    a,
                    b,
                    error,
                    tol: flex.tol,
                });
            }
        }
        out
    }

    /// Mass per metre in kg/m, when every part has a density.
    pub fn mass_per_metre(&self) -> Option<f64> {
        // Σ A·ρ in unit²·kg/m³ into kg/m: the area's two lengths taken to metres one at a
        // time, (ΣAρ·m)·m, the order these figures have always been computed in.
        let length = |x| self.si(x, Dim::Length);
        self.props.mass_area.map(|ma| length(length(ma)))
    }

    /// What the member check had to leave out, in words.
    fn member_notes(&self) -> Vec<Warning> {
        let Some(mb) = &self.section.member else {
            return Vec::new();
        };
        let mut notes = Vec::new();
        if mb.self_weight && self.mass_per_metre().is_none() {
            notes.push(Warning::SelfWeightNoDensity);
        }
        if self.section.materials.is_empty() {
            notes.push(Warning::MemberNoModulus);
        }
        if let Some(m) = &self.member {
            if m.fibres.iter().any(|f| f.fy.is_some()) {
                notes.extend(m.fibres.iter().filter(|f| f.fy.is_none()).map(|f| {
                    Warning::MaterialNoFy {
                        material: f.material.clone(),
                    }
                }));
            }
        }
        notes.extend(self.member.as_ref().and_then(MemberResult::mcr_warning));
        notes.extend((self.member.as_ref()).and_then(|m| m.shear_deflection_note.clone()));
        notes
    }

    /// The monosymmetry constants (βx, βy) in the file's length unit, with the
    /// finite-element shear centre (docs/format.md `torsion.beta`); `None` without torsion.
    pub fn beta(&self) -> Option<(f64, f64)> {
        let t = self.torsion.as_ref()?.as_ref().ok()?;
        let p = &self.props;
        Some(ltb::beta(
            &p.cubic,
            p.ixx,
            p.iyy,
            p.centroid,
            t.shear_centre,
        ))
    }

    /// Mcr of the member in N·m with βx in m and the side in compression, or why there
    /// is none. The moment diagram decides the side: sagging compresses +y (s = −1),
    /// hogging −y (s = +1); a diagram of both signs (or none) takes the lower value.
    fn critical_moment(&self, beam: &Beam) -> Result<(f64, f64, Option<Compressed>), McrRefusal> {
        let mb = self.section.member.as_ref().ok_or(McrRefusal::NoMember)?;
        if mb.support != Support::Simple {
            return Err(McrRefusal::NotSimpleSpan);
        }
        if mb.load_height != LoadHeight::ShearCentre {
            return Err(McrRefusal::LoadHeight {
                top: mb.load_height == LoadHeight::Top,
            });
        }
        let Some(mat) = self.section.materials.first() else {
            return Err(McrRefusal::NoModulus);
        };
        let t = match &self.torsion {
            None => return Err(McrRefusal::NoTorsion),
            Some(Err(_)) => return Err(McrRefusal::TorsionFailed),
            Some(Ok(t)) => t,
        };
        // The torsion solve's base mesh counted the separate pieces (and said so).
        let pieces = t
            .warnings
            .iter()
            .find_map(|w| match w {
                Warning::SeparatePieces { count } => Some(*count),
                _ => None,
            })
            .unwrap_or(1);
        if pieces > 1 {
            return Err(McrRefusal::SeparatePieces { count: pieces });
        }
        let p = &self.props;
        if p.ixy.abs() > 1e-9 * (p.ixx * p.iyy).sqrt() {
            return Err(McrRefusal::Asymmetric);
        }
        let size = (p.bounds[1] - p.bounds[0]).max(p.bounds[3] - p.bounds[2]);
        if (t.shear_centre.x - p.centroid.x).abs() > t.rel_error.max(1e-9) * size {
            return Err(McrRefusal::ShearCentreOff);
        }
        let (beta_x, _) = self.beta().ok_or(McrRefusal::NoTorsionResults)?;
        let b = Buckling {
            e: mat.e,
            g: mat.g,
            iy: self.si(p.iyy, Dim::SecondMoment),
            j: self.si(t.j, Dim::SecondMoment),
            cw: self.si(t.cw, Dim::Warping),
            beta_x: self.si(beta_x, Dim::Length),
            l: mb.length,
            c1: mb.c1,
        };
        let (sag, hog) = moment_signs(beam);
        let side = match (sag, hog) {
            (true, false) => Some(Compressed::PlusY),
            (false, true) => Some(Compressed::MinusY),
            _ => None,
        };
        let mcr = match side {
            Some(s) => ltb::mcr(&b, s),
            None => ltb::mcr(&b, Compressed::PlusY)
                .zip(ltb::mcr(&b, Compressed::MinusY))
                .map(|(a, c)| a.min(c)),
        };
        match mcr {
            Some(x) => Ok((x, b.beta_x, side)),
            None => Err(McrRefusal::NoFiniteValue),
        }
    }

    /// The bending stress `n_i·M·c_i/Ixx` of each material in use under moment `m` (N·m),
    /// on the net section, c_i to the material's own farthest fibre on either side.
    fn fibre_stresses(&self, m: f64) -> Vec<FibreStress> {
        let (pieces, props) = self.stress_section();
        let mut groups: Vec<Option<usize>> = pieces
            .iter()
            .filter(|p| !p.void)
            .map(|p| p.material)
            .collect();
        groups.sort_unstable();
        groups.dedup();
        let i = self.si(props.ixx, Dim::SecondMoment);
        groups
            .into_iter()
            .filter_map(|g| {
                let own = pieces.iter().filter(|p| !p.void && p.material == g);
                let n = own.clone().next()?.n;
                let [_, _, ymin, ymax] = solid_bounds(&own.cloned().collect::<Vec<_>>())?;
                let c = (ymax - props.centroid.y).max(props.centroid.y - ymin);
                let mat = g.and_then(|k| self.section.materials.get(k));
                Some(FibreStress {
                    material: mat.map(|m| m.name.clone()),
                    stress: n * m * self.si(c, Dim::Length) / i,
                    fy: mat.and_then(|m| m.fy),
                })
            })
            .collect()
    }

    fn member_check(&self) -> Option<MemberResult> {
        let mb = self.section.member.as_ref()?;
        let e = self.section.materials.first().map(|mat| mat.e);
        let self_weight = if mb.self_weight {
            self.mass_per_metre().unwrap_or(0.0) * GRAVITY
        } else {
            0.0
        };
        let i = self.si(self.props.ixx, Dim::SecondMoment);
        let beam = Beam {
            span: mb.length,
            support: mb.support,
            udl: mb.udl + self_weight,
            points: mb.points.iter().map(|&(p, a)| PointLoad { p, a }).collect(),
            // Without E the forces are still right (they do not depend on EI); the
            // deflection is not reported.
            ei: e.unwrap_or(1.0) * i,
            shear_rigidity: None,
        };
        // Shear deformation: G·A_s,y with A_s,y transformed to G of the first material.
        let shear_rigidity = match (mb.shear_deformation, self.section.materials.first()) {
            (true, Some(mat)) => Some(self.shear_areas().map(|a| mat.g * self.si(a[1], Dim::Area))),
            _ => None,
        };
        let bending = member::analyse(&beam).ok();
        let (beam, result, deflection_shear, shear_deflection_note) = match shear_rigidity {
            None => (beam, bending, None, None),
            Some(None) => {
                // Not run: torsion skipped (or still solving), or torsion alone.
                let solved = match &self.torsion {
                    None => false,
                    Some(Ok(t)) => t.flexure.is_some(),
                    Some(Err(_)) => true,
                };
                (
                    beam,
                    bending,
                    None,
                    Some(Warning::ShearDeflectionWithheld { solved }),
                )
            }
            Some(Some(ga)) => {
                let beam = Beam {
                    shear_rigidity: Some(ga),
                    ..beam
                };
                let result = member::analyse(&beam).ok();
                let added = (result.as_ref().zip(bending.as_ref()))
                    .map(|(t, b)| t.deflection_max - b.deflection_max);
                (beam, result, added, None)
            }
        };
        let (m_max, v_max) = result
            .as_ref()
            .map_or((f64::NAN, f64::NAN), |r| (r.m_max, r.v_max));
        let deflection_max = e
            .and(result.as_ref().map(|r| r.deflection_max))
            .filter(|_| shear_deflection_note.is_none());
        let deflection_allowed = mb.length / mb.deflection_limit;
        let fibres = self.fibre_stresses(m_max);
        let stress_max = fibres.iter().map(|f| f.stress).fold(f64::NAN, f64::max);
        let ratio = |f: &FibreStress| f.fy.map(|fy| f.stress / fy);
        let governing = fibres
            .iter()
            .filter_map(|f| ratio(f).map(|r| (r, f)))
            .reduce(|a, b| if b.0 > a.0 { b } else { a });
        let ratios = [
            governing.map(|g| g.0),
            deflection_max.map(|d| d / deflection_allowed),
        ];
        let utilization = ratios.iter().flatten().copied().reduce(f64::max);
        let governing_material = if fibres.len() > 1 {
            governing
                .map(|g| g.1)
                .or_else(|| {
                    fibres
                        .iter()
                        .reduce(|a, b| if b.stress > a.stress { b } else { a })
                })
                .and_then(|f| f.material.clone())
        } else {
            None
        };
        let mut out = MemberResult {
            beam,
            result,
            m_max,
            v_max,
            deflection_max,
            deflection_shear,
            shear_deflection_note,
            deflection_allowed,
            stress_max,
            fibres,
            utilization,
            governing_material,
            mcr: None,
            beta_x: None,
            mcr_side: None,
            mcr_note: None,
            self_weight,
        };
        match self.critical_moment(&out.beam) {
            Ok((mcr, beta_x, side)) => {
                out.mcr = Some(mcr);
                out.beta_x = Some(beta_x);
                out.mcr_side = side;
            }
            Err(r) => out.mcr_note = Some(r),
        }
        Some(out)
    }
}

/// Poisson's ratio of the reference (first) material, ν = E/(2G) − 1 (isotropic
/// elasticity), or the default ν without materials (docs/format.md "Materials"): the one
/// the flexure solution is solved with, here and in the workbench's background solve.
pub fn nu_ref(section: &Resolved) -> f64 {
    section
        .materials
        .first()
        .map_or(crate::geom::resolve::DEFAULT_NU, |m| {
            m.e / (2.0 * m.g) - 1.0
        })
}

/// Whether the bending moment sags (compresses +y) and whether it hogs (−y) anywhere
/// along the span, beyond rounding (256 intervals; M is quadratic between loads, so a
/// stretch of the other sign narrower than that can be missed only where |M| is tiny).
fn moment_signs(beam: &Beam) -> (bool, bool) {
    let Ok(d) = member::diagrams(beam, 256) else {
        return (false, false);
    };
    let peak = d.iter().map(|r| r.2.abs()).fold(0.0, f64::max);
    let tol = 1e-9 * peak;
    (
        peak > 0.0 && d.iter().any(|r| r.2 > tol),
        peak > 0.0 && d.iter().any(|r| r.2 < -tol),
    )
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
/// ([`Seg::sample_points`]), for the convex hull behind the kern: those that may be
/// vertices of the hull of all of them. Points well inside the [`Octagon`] of the
/// segments' starts and every eighth chord point are left out (each arc's against the
/// octagon's edges near it, [`Octagon::near`]); an arc whose whole
/// [`Seg::sample_disc`] lies well inside the octagon of the starts alone (a root fillet,
/// the inner edge of a tube) is not cut at all.
pub fn outline_points(pieces: &[Piece]) -> Vec<(f64, f64)> {
    let segs: Vec<&Seg> = pieces
        .iter()
        .filter(|p| !p.void)
        .flat_map(|p| p.contours.iter())
        .flat_map(|c| c.segs.iter())
        .collect();
    let starts: Vec<(f64, f64)> = segs
        .iter()
        .map(|s| {
            let q = s.start();
            (q.x, q.y)
        })
        .collect();
    let first = Octagon::of(&starts);
    // The chord points of the arcs that may reach the hull, with each arc's disc and the
    // end of its run.
    let mut chords = Vec::new();
    let mut runs = Vec::new();
    for s in segs {
        let Some((c, reach)) = s.sample_disc() else {
            continue;
        };
        if first.is_some_and(|o| o.near((c.x, c.y), reach).is_open()) {
            continue;
        }
        s.sample_points(1f64.to_radians(), &mut chords);
        runs.push(((c.x, c.y), reach, chords.len()));
    }
    // The extremes of the starts are the first octagon's corners.
    let mut corners: Vec<(f64, f64)> = match &first {
        Some(o) => o.corners().collect(),
        None => starts.clone(),
    };
    corners.extend(chords.iter().step_by(8).map(|q| (q.x, q.y)));
    let Some(inner) = Octagon::of(&corners) else {
        let mut pts = starts;
        pts.extend(chords.iter().map(|q| (q.x, q.y)));
        return pts;
    };
    let mut pts: Vec<(f64, f64)> = starts.into_iter().filter(|&p| !inner.holds(p)).collect();
    let mut from = 0;
    for (c, reach, to) in runs {
        let near = inner.near(c, reach);
        let run = chords[from..to].iter().map(|q| (q.x, q.y));
        pts.extend(run.filter(|&p| !near.holds(p)));
        from = to;
    }
    pts
}

/// Is angle `t` (any turn) within the sweep from `a0` to `a1`?
fn angle_in_sweep(t: f64, a0: f64, a1: f64) -> bool {
    let (lo, hi) = (a0.min(a1), a0.max(a1));
    let tau = std::f64::consts::TAU;
    let k = ((lo - t) / tau).ceil();
    let t = t + k * tau;
    t >= lo && t <= hi
}
