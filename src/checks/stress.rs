//! Normal stresses under axial force and biaxial bending (the generalised flexure formula
//! for unsymmetric sections), where they peak, where the neutral axis lies, and the convex
//! hull the peaks are searched on.
//!
//! Sign conventions (the section file's `[actions]`): σ positive is tension, `n` positive is
//! tension, positive `mx` compresses the fibres on the +y side, positive `my` compresses the
//! fibres on the +x side.
//!
//! Units: the section stays in its file's length unit (one unit = `unit_m` metres) and the
//! [`Actions`] are SI (N, N·m). [`StressField::new`] is the one place the two meet: it
//! works in N and the section's unit (moments N·m / `unit_m`) and turns N/unit² into Pa,
//! so a field gives Pa at points written in the section's unit.

/// Centroidal properties the stress calculation needs (the section's own, from
/// [`crate::props`]): area, centroid in the file frame, `ixx = ∫(y−cy)² dA`,
/// `iyy = ∫(x−cx)² dA`, `ixy = ∫(x−cx)(y−cy) dA`.
pub use crate::props::Centroidal;

use crate::geom::contour::clip_line;
use crate::geom::Pt;
use std::cmp::Ordering;

/// `D = Ixx·Iyy − Ixy²`, positive for every real section (Cauchy–Schwarz).
pub(crate) fn det(sec: &Centroidal) -> f64 {
    sec.ixx * sec.iyy - sec.ixy * sec.ixy
}

pub use crate::model::loads::Actions;

/// A linear normal-stress field `σ(x, y) = σ0 + a·(x − cx) + b·(y − cy)`: σ in Pa, `a` and
/// `b` in Pa per length unit of the section, `cx`, `cy` in that unit.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct StressField {
    pub sigma0: f64,
    pub a: f64,
    pub b: f64,
    pub cx: f64,
    pub cy: f64,
}

impl StressField {
    /// The generalised flexure formula: `σ0 = N/A` and `a`, `b` from the resultant conditions
    /// `∫σ·x dA = −My` and `∫σ·y dA = −Mx` (coordinates about the centroid), i.e.
    ///
    /// ```text
    /// a·Iyy + b·Ixy = −My        a = (Mx·Ixy − My·Ixx)/D
    /// a·Ixy + b·Ixx = −Mx   ⇒    b = (My·Ixy − Mx·Iyy)/D,   D = Ixx·Iyy − Ixy²
    /// ```
    ///
    /// For a doubly symmetric section this is `σ = N/A − Mx·y/Ixx − My·x/Iyy` (Gere & Goodno,
    /// Mechanics of Materials, "doubly symmetric beams with inclined loads"; "unsymmetric beams").
    ///
    /// `sec` is in a length unit of `unit_m` metres and `act` in N and N·m; the formula runs
    /// in N and the section's unit (`M / unit_m` in N·unit) and the result is scaled by
    /// `1/unit_m²` from N/unit² to Pa. With `unit_m = 1` every value is taken as it is (any
    /// consistent units). `None` when `area ≤ 0`, `D ≤ 0` or a value is not finite.
    ///
    /// ```
    /// use kern::checks::stress::{Actions, Centroidal, StressField};
    /// // 100 × 200 mm rectangle centred on the origin, Mx = 1 kN·m:
    /// // σ_top = −6·Mx/(b·h²) = −6·1e3 N·m / (0.1 m · 0.04 m²) = −1.5 MPa
    /// let sec = Centroidal { area: 20_000.0, cx: 0.0, cy: 0.0,
    ///                        ixx: 100.0 * 200f64.powi(3) / 12.0, iyy: 200.0 * 100f64.powi(3) / 12.0, ixy: 0.0 };
    /// let act = Actions { mx: 1e3, ..Default::default() };
    /// let f = StressField::new(&sec, &act, 0.001).unwrap();
    /// assert!((f.at(0.0, 100.0) + 1.5e6).abs() < 1e-6);
    /// ```
    pub fn new(sec: &Centroidal, act: &Actions, unit_m: f64) -> Option<StressField> {
        let d = det(sec);
        if !(sec.area > 0.0 && d > 0.0) {
            return None;
        }
        let (mx, my) = (act.mx / unit_m, act.my / unit_m);
        let field = StressField {
            sigma0: act.n / sec.area,
            a: (mx * sec.ixy - my * sec.ixx) / d,
            b: (my * sec.ixy - mx * sec.iyy) / d,
            cx: sec.cx,
            cy: sec.cy,
        }
        .scaled(1.0 / (unit_m * unit_m));
        let values = [field.sigma0, field.a, field.b, field.cx, field.cy];
        values.iter().all(|v| v.is_finite()).then_some(field)
    }

    /// σ at the point (x, y) of the file frame.
    pub fn at(&self, x: f64, y: f64) -> f64 {
        self.sigma0 + self.a * (x - self.cx) + self.b * (y - self.cy)
    }

    /// The field multiplied by `n`: the stress in a material whose modular ratio to the
    /// reference material is `n` (transformed-section method; Gere & Goodno, "composite beams").
    pub fn scaled(&self, n: f64) -> StressField {
        StressField {
            sigma0: self.sigma0 * n,
            a: self.a * n,
            b: self.b * n,
            ..*self
        }
    }

    /// Angle of the zero-stress line from +x, counter-clockwise, in degrees in (−90, 90].
    /// The line runs perpendicular to the gradient (a, b). `None` under pure axial force
    /// (a = b = 0), when there is no such line.
    pub fn neutral_axis_angle_deg(&self) -> Option<f64> {
        if self.a == 0.0 && self.b == 0.0 {
            return None;
        }
        let deg = self.a.atan2(-self.b).to_degrees();
        let deg = if deg > 90.0 {
            deg - 180.0
        } else if deg <= -90.0 {
            deg + 180.0
        } else {
            deg
        };
        deg.is_finite().then_some(deg)
    }

    /// The two ends of the neutral axis (σ = 0) clipped to the box [xmin, xmax] × [ymin, ymax],
    /// for drawing. `None` under pure axial force, for an empty or non-finite box, or when the
    /// line misses the box. Clipping is the parametric (Liang–Barsky) method.
    pub fn neutral_axis_in_box(
        &self,
        xmin: f64,
        xmax: f64,
        ymin: f64,
        ymax: f64,
    ) -> Option<[(f64, f64); 2]> {
        let bounds = [xmin, xmax, ymin, ymax];
        if !bounds.iter().all(|v| v.is_finite()) || xmin > xmax || ymin > ymax {
            return None;
        }
        let g2 = self.a * self.a + self.b * self.b;
        if !(g2 > 0.0 && g2.is_finite()) {
            return None;
        }
        // Foot of the perpendicular from the centroid, and a unit direction along the line.
        let g = g2.sqrt();
        let p = (
            self.cx - self.sigma0 * self.a / g2,
            self.cy - self.sigma0 * self.b / g2,
        );
        let d = Pt::new(-self.b / g, self.a / g);
        let (a, b) = clip_line(Pt::new(p.0, p.1), d, bounds)?;
        Some([(a.x, a.y), (b.x, b.y)])
    }
}

/// A stress value and where it occurs.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct StressPoint {
    pub value: f64,
    pub x: f64,
    pub y: f64,
}

/// The largest and the smallest σ over a set of points.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Extremes {
    /// The point of largest σ (negative when the whole section is in compression).
    pub max_tension: StressPoint,
    /// The point of smallest σ (positive when the whole section is in tension).
    pub max_compression: StressPoint,
}

/// Extremes of a linear field over `points`, normally the vertices of the convex hull of the
/// section: a linear function on a convex polygon peaks at its vertices. The first of equal
/// values wins. `None` when no point gives a finite σ.
pub fn extremes(field: &StressField, points: &[(f64, f64)]) -> Option<Extremes> {
    let mut found: Option<Extremes> = None;
    for &(x, y) in points {
        let value = field.at(x, y);
        if !value.is_finite() {
            continue;
        }
        let here = StressPoint { value, x, y };
        found = Some(match found {
            None => Extremes {
                max_tension: here,
                max_compression: here,
            },
            Some(mut e) => {
                if value > e.max_tension.value {
                    e.max_tension = here;
                }
                if value < e.max_compression.value {
                    e.max_compression = here;
                }
                e
            }
        });
    }
    found
}

/// Convex hull by Andrew's monotone chain (A. M. Andrew, "Another efficient algorithm for
/// convex hulls in two dimensions", Information Processing Letters 9, 1979).
/// Counter-clockwise, starting from the lowest-x (then lowest-y) point, without collinear or
/// repeated points. Non-finite points are ignored; with fewer than three distinct points the
/// distinct points are returned (sorted), and a collinear set gives its two ends.
///
/// The sort is most of the cost: for a large set, leave out the points well inside its
/// [`Octagon`] first (they cannot be on the hull, so the result is the same).
pub fn convex_hull(points: &[(f64, f64)]) -> Vec<(f64, f64)> {
    let mut pts: Vec<(f64, f64)> = Vec::with_capacity(points.len());
    pts.extend(
        points
            .iter()
            .copied()
            .filter(|p| p.0.is_finite() && p.1.is_finite()),
    );
    pts.sort_by(|p, q| p.0.total_cmp(&q.0).then(p.1.total_cmp(&q.1)));
    pts.dedup();
    if pts.len() < 3 {
        return pts;
    }
    // Lower chain left to right, then upper chain right to left; each keeps only strict left
    // turns, and each chain's last point is dropped because it starts the other chain.
    let mut hull: Vec<(f64, f64)> = Vec::with_capacity(2 * pts.len());
    let add = |hull: &mut Vec<(f64, f64)>, chain_start: usize, p: (f64, f64)| {
        while let [.., o, a] = hull[chain_start..] {
            if cross(o, a, p) > 0.0 {
                break;
            }
            hull.pop();
        }
        hull.push(p);
    };
    for &p in &pts {
        add(&mut hull, 0, p);
    }
    hull.pop();
    let upper = hull.len();
    for &p in pts.iter().rev() {
        add(&mut hull, upper, p);
    }
    hull.pop();
    hull
}

/// `(a − o) × (b − o)`: positive when o → a → b turns left.
fn cross(o: (f64, f64), a: (f64, f64), b: (f64, f64)) -> f64 {
    (a.0 - o.0) * (b.1 - o.1) - (a.1 - o.1) * (b.0 - o.0)
}

/// The convex polygon of a point set's extreme points in the directions −x, −x−y, −y,
/// x−y, x, x+y, y, y−x (counter-clockwise; coincident neighbours merged). It lies in
/// the set's convex hull, so a point well inside it (by more than the rounding of the
/// hull's turn tests) is not a vertex of the hull, of this set or of any set that holds
/// the corners: leaving such points out before [`convex_hull`] gives the same hull
/// (Akl and Toussaint, "A fast convex hull algorithm", Information Processing Letters 7,
/// 1978).
#[derive(Debug, Clone, Copy)]
pub struct Octagon {
    /// Edges as start point a, direction `d = b − a` and `|d|`; the first `len` are used.
    edges: [Edge; 8],
    len: usize,
    /// How far inside an edge (as the cross product `d × (p − a)`) a point must be to
    /// count as inside: far above the rounding of the cross products.
    margin: f64,
}

type Edge = ((f64, f64), (f64, f64), f64);

impl Octagon {
    /// The extreme octagon of the finite points; `None` with fewer than three distinct
    /// corners (nothing is strictly inside).
    pub fn of(points: &[(f64, f64)]) -> Option<Octagon> {
        let mut best = [f64::NEG_INFINITY; 8];
        let mut at = [0; 8];
        for (j, &(x, y)) in points.iter().enumerate() {
            if !(x.is_finite() && y.is_finite()) {
                continue;
            }
            let keys = [-x, -x - y, -y, x - y, x, x + y, y, y - x];
            for i in 0..8 {
                if keys[i] > best[i] {
                    best[i] = keys[i];
                    at[i] = j;
                }
            }
        }
        // Every key finite: a corner in each direction (none without finite points).
        if !best.iter().all(|k| k.is_finite()) {
            return None;
        }
        let corners = at.map(|j| points[j]);
        let mut edges = [((0.0, 0.0), (0.0, 0.0), 0.0); 8];
        let mut len = 0;
        for i in 0..8 {
            let (a, b) = (corners[i], corners[(i + 1) % 8]);
            if a != b {
                let d = (b.0 - a.0, b.1 - a.1);
                edges[len] = (a, d, d.0.hypot(d.1));
                len += 1;
            }
        }
        if len < 3 {
            return None;
        }
        let (w, h) = (corners[4].0 - corners[0].0, corners[6].1 - corners[2].1);
        let size = w.max(h);
        Some(Octagon {
            edges,
            len,
            margin: 1e-9 * size * size,
        })
    }

    /// Is `p` inside every edge by more than the margin (so inside the hull, not on it)?
    pub fn holds(&self, p: (f64, f64)) -> bool {
        self.edges[..self.len]
            .iter()
            .all(|&(a, d, _)| d.0 * (p.1 - a.1) - d.1 * (p.0 - a.0) > self.margin)
    }

    /// The octagon's edges that a point within `reach` of `c` may fail [`Octagon::holds`]
    /// at: for an edge from a in direction d, such a point is at most `|d|·reach` nearer
    /// the edge's line (as a cross product) than c, so the edges that c is inside by more
    /// than the margin plus that are left out. For those points its `holds` is the
    /// octagon's; with no edge left ([`Octagon::is_open`]) every such point holds.
    pub fn near(&self, c: (f64, f64), reach: f64) -> Octagon {
        let mut near = Octagon { len: 0, ..*self };
        for &(a, d, len) in &self.edges[..self.len] {
            // Kept unless surely clear (a NaN keeps it: no ordering).
            let inside = d.0 * (c.1 - a.1) - d.1 * (c.0 - a.0);
            if inside.partial_cmp(&(self.margin + len * reach)) != Some(Ordering::Greater) {
                near.edges[near.len] = (a, d, len);
                near.len += 1;
            }
        }
        near
    }

    /// The corners (the ends of the edges), counter-clockwise.
    pub fn corners(&self) -> impl Iterator<Item = (f64, f64)> + '_ {
        self.edges[..self.len].iter().map(|e| e.0)
    }

    /// No edge to test: every point holds.
    pub fn is_open(&self) -> bool {
        self.len == 0
    }
}

#[cfg(test)]
pub(crate) mod test_support {
    //! Section properties of a simple polygon, for tests only (the project's own property
    //! code lives in `props`): the shoelace-type sums of Steger, "On the calculation of
    //! arbitrary moments of polygons" (1996), moved to the centroid by the parallel-axis theorem.
    use super::Centroidal;

    pub(crate) fn polygon_centroidal(pts: &[(f64, f64)]) -> Centroidal {
        let (mut a, mut sx, mut sy, mut ixx, mut iyy, mut ixy) = (0.0, 0.0, 0.0, 0.0, 0.0, 0.0);
        for (i, &(x0, y0)) in pts.iter().enumerate() {
            let (x1, y1) = pts[(i + 1) % pts.len()];
            let c = x0 * y1 - x1 * y0;
            a += c / 2.0;
            sx += (x0 + x1) * c / 6.0;
            sy += (y0 + y1) * c / 6.0;
            ixx += (y0 * y0 + y0 * y1 + y1 * y1) * c / 12.0;
            iyy += (x0 * x0 + x0 * x1 + x1 * x1) * c / 12.0;
            ixy += (x0 * y1 + 2.0 * x0 * y0 + 2.0 * x1 * y1 + x1 * y0) * c / 24.0;
        }
        let (cx, cy) = (sx / a, sy / a);
        Centroidal {
            area: a,
            cx,
            cy,
            ixx: ixx - a * cy * cy,
            iyy: iyy - a * cx * cx,
            ixy: ixy - a * cx * cy,
        }
    }

    /// Corners (CCW) of a b × h rectangle centred on (cx, cy), turned by `deg` about its centre.
    pub(crate) fn rectangle(b: f64, h: f64, cx: f64, cy: f64, deg: f64) -> Vec<(f64, f64)> {
        let (s, c) = deg.to_radians().sin_cos();
        [(-b, -h), (b, -h), (b, h), (-b, h)]
            .iter()
            .map(|&(u, v)| {
                let (u, v) = (u / 2.0, v / 2.0);
                (cx + u * c - v * s, cy + u * s + v * c)
            })
            .collect()
    }
}

#[cfg(test)]
mod tests {
    use super::test_support::{polygon_centroidal, rectangle};
    use super::*;

    fn close(a: f64, b: f64, rel: f64) -> bool {
        (a - b).abs() <= rel * a.abs().max(b.abs()).max(1e-300)
    }

    #[test]
    fn rectangle_flexure_formula_signs() {
        // Flexure formula σ = −M·y/I with the file's signs (Gere & Goodno, Mechanics of
        // Materials, "normal stresses in beams"): positive Mx compresses +y, positive My +x.
        let (b, h) = (300.0, 500.0);
        let sec = polygon_centroidal(&rectangle(b, h, 40.0, -20.0, 0.0));
        let ixx = b * h.powi(3) / 12.0;
        let iyy = h * b.powi(3) / 12.0;
        assert!(close(sec.ixx, ixx, 1e-12) && close(sec.iyy, iyy, 1e-12));
        let mx = StressField::new(
            &sec,
            &Actions {
                n: 0.0,
                mx: 2e8,
                my: 0.0,
                ..Default::default()
            },
            1.0,
        )
        .unwrap();
        let top = mx.at(40.0, -20.0 + h / 2.0);
        assert!(close(top, -2e8 * (h / 2.0) / ixx, 1e-12));
        assert!(top < 0.0);
        let my = StressField::new(
            &sec,
            &Actions {
                n: 0.0,
                mx: 0.0,
                my: 5e7,
                ..Default::default()
            },
            1.0,
        )
        .unwrap();
        let right = my.at(40.0 + b / 2.0, -20.0);
        assert!(close(right, -5e7 * (b / 2.0) / iyy, 1e-12));
        assert!(right < 0.0);
        assert!(mx.neutral_axis_angle_deg().unwrap().abs() < 1e-12);
        assert!(close(my.neutral_axis_angle_deg().unwrap(), 90.0, 1e-12));
    }

    #[test]
    fn eccentric_axial_load_corner_stresses() {
        // Rectangular column under N with biaxial bending: corner stresses
        // σ = N/A ± Mx/Sx ± My/Sy (Gere & Goodno, Mechanics of Materials, "eccentric axial loads").
        let (b, h) = (400.0, 600.0);
        let pts = rectangle(b, h, 0.0, 0.0, 0.0);
        let sec = polygon_centroidal(&pts);
        let act = Actions {
            n: -1.2e6,
            mx: 9e7,
            my: -3e7,
            ..Default::default()
        };
        let f = StressField::new(&sec, &act, 1.0).unwrap();
        let (area, sx, sy) = (b * h, b * h * h / 6.0, h * b * b / 6.0);
        let e = extremes(&f, &pts).unwrap();
        // Mx > 0 puts tension at −y; My < 0 puts compression at −x, tension at +x.
        let tension = act.n / area + act.mx / sx - act.my / sy;
        let compression = act.n / area - act.mx / sx + act.my / sy;
        assert!(close(e.max_tension.value, tension, 1e-12));
        assert_eq!((e.max_tension.x, e.max_tension.y), (b / 2.0, -h / 2.0));
        assert!(close(e.max_compression.value, compression, 1e-12));
        assert_eq!(
            (e.max_compression.x, e.max_compression.y),
            (-b / 2.0, h / 2.0)
        );
    }

    #[test]
    fn unsymmetric_section_agrees_with_principal_axis_method() {
        // Unequal-leg angle 150 × 90 × 12 (our own dimensions). The textbook route for
        // unsymmetric bending resolves the moment on the principal axes and applies the
        // flexure formula about each (Gere & Goodno, "bending of unsymmetric beams").
        let l_shape = [
            (0.0, 0.0),
            (90.0, 0.0),
            (90.0, 12.0),
            (12.0, 12.0),
            (12.0, 150.0),
            (0.0, 150.0),
        ];
        let sec = polygon_centroidal(&l_shape);
        assert!(sec.ixy.abs() > 0.1 * sec.ixx.min(sec.iyy));
        let act = Actions {
            n: 5e4,
            mx: 3e6,
            my: -1e6,
            ..Default::default()
        };
        let f = StressField::new(&sec, &act, 1.0).unwrap();

        // Principal axes (Mohr's circle): u at θ from +x.
        let theta = 0.5 * (-2.0 * sec.ixy).atan2(sec.ixx - sec.iyy);
        let (s, c) = theta.sin_cos();
        let i_about_u = sec.ixx * c * c + sec.iyy * s * s - 2.0 * sec.ixy * s * c; // ∫v² dA
        let i_about_v = sec.ixx * s * s + sec.iyy * c * c + 2.0 * sec.ixy * s * c; // ∫u² dA
                                                                                   // The pair (My, Mx) is conjugate to (x, y) and turns with the axes.
        let m_u = act.my * c + act.mx * s; // conjugate to u
        let m_v = -act.my * s + act.mx * c; // conjugate to v
        for &(x, y) in &l_shape {
            let (xr, yr) = (x - sec.cx, y - sec.cy);
            let u = xr * c + yr * s;
            let v = -xr * s + yr * c;
            let expected = act.n / sec.area - m_u * u / i_about_v - m_v * v / i_about_u;
            assert!(close(f.at(x, y), expected, 1e-10), "at ({x}, {y})");
        }
    }

    #[test]
    fn neutral_axis_clipped_to_box() {
        // Mx with axial tension on a 200 × 400 rectangle: σ = N/A − Mx·y/Ixx is zero at
        // y = N·Ixx/(A·Mx) (flexure formula), a horizontal line across the box.
        let sec = polygon_centroidal(&rectangle(200.0, 400.0, 0.0, 0.0, 0.0));
        let act = Actions {
            n: 4e5,
            mx: 1e8,
            my: 0.0,
            ..Default::default()
        };
        let f = StressField::new(&sec, &act, 1.0).unwrap();
        let y0 = act.n * sec.ixx / (sec.area * act.mx);
        let [p, q] = f.neutral_axis_in_box(-100.0, 100.0, -200.0, 200.0).unwrap();
        assert!(close(p.1, y0, 1e-12) && close(q.1, y0, 1e-12));
        assert!(close((p.0 - q.0).abs(), 200.0, 1e-12));
        // A box wholly above the line is missed.
        assert!(f.neutral_axis_in_box(-100.0, 100.0, 150.0, 200.0).is_none());
        // Biaxial case: both ends on the box boundary with σ = 0.
        let g = StressField::new(
            &sec,
            &Actions {
                n: 1e5,
                mx: 1e8,
                my: 2e7,
                ..Default::default()
            },
            1.0,
        )
        .unwrap();
        let ends = g.neutral_axis_in_box(-100.0, 100.0, -200.0, 200.0).unwrap();
        for (x, y) in ends {
            assert!(g.at(x, y).abs() < 1e-12);
            let on_edge = [x + 100.0, x - 100.0, y + 200.0, y - 200.0]
                .iter()
                .any(|d| d.abs() < 1e-9);
            assert!(on_edge);
        }
        let pure = StressField::new(
            &sec,
            &Actions {
                n: 1e5,
                ..Actions::default()
            },
            1.0,
        )
        .unwrap();
        assert!(pure.neutral_axis_angle_deg().is_none());
        assert!(pure.neutral_axis_in_box(-1.0, 1.0, -1.0, 1.0).is_none());
        assert!(g.neutral_axis_in_box(1.0, -1.0, 0.0, 1.0).is_none());
        assert!(g.neutral_axis_in_box(f64::NAN, 1.0, 0.0, 1.0).is_none());
    }

    #[test]
    fn neutral_axis_angle_of_rotated_rectangle() {
        // A rectangle turned by 30° bent about its own major axis: the neutral axis is that axis
        // (flexure formula in the rectangle's principal frame), so it lies at 30°.
        // Also turned by −60°: the same bending about its own long axis, now at −60°.
        for turn in [30.0, -60.0] {
            let sec = polygon_centroidal(&rectangle(200.0, 500.0, 0.0, 0.0, turn));
            let (s, c) = f64::to_radians(turn).sin_cos();
            // Moment conjugate to the rectangle's own v axis: (My, Mx) = M·(−sin, cos).
            let m = 1e7;
            let act = Actions {
                n: 0.0,
                mx: m * c,
                my: -m * s,
                ..Default::default()
            };
            let f = StressField::new(&sec, &act, 1.0).unwrap();
            assert!(close(f.neutral_axis_angle_deg().unwrap(), turn, 1e-10));
        }
    }

    #[test]
    fn scaled_field_and_invalid_sections() {
        let sec = polygon_centroidal(&rectangle(100.0, 100.0, 0.0, 0.0, 0.0));
        let f = StressField::new(
            &sec,
            &Actions {
                n: 1e4,
                mx: 1e6,
                my: 2e6,
                ..Default::default()
            },
            1.0,
        )
        .unwrap();
        // Transformed section: stress in a material with modular ratio n is n·σ.
        let g = f.scaled(15.0);
        assert!(close(g.at(30.0, -10.0), 15.0 * f.at(30.0, -10.0), 1e-14));
        let bad = Centroidal { ixy: 1e9, ..sec };
        assert!(StressField::new(&bad, &Actions::default(), 1.0).is_none());
        let bad = Centroidal { area: 0.0, ..sec };
        assert!(StressField::new(&bad, &Actions::default(), 1.0).is_none());
        let bad = Centroidal {
            ixx: f64::NAN,
            ..sec
        };
        assert!(StressField::new(&bad, &Actions::default(), 1.0).is_none());
        assert!(extremes(&f, &[]).is_none());
    }

    #[test]
    fn si_actions_on_a_section_in_any_unit() {
        // 100 × 200 mm rectangle under Mx = 10 kN·m and N = 20 kN, written in mm, cm, m and
        // in: σ = N/A − Mx·y/Ixx gives at the top fibre 1 MPa − 6·Mx/(b·h²) = 1 − 15 MPa
        // (flexure formula, Gere & Goodno, "normal stresses in beams"). The same Pa from
        // every unit: a wrong power of the unit would scale it by 10 to 10⁹.
        let act = Actions {
            n: 2e4,
            mx: 1e4,
            my: 0.0,
            ..Default::default()
        };
        for unit_m in [0.001, 0.01, 1.0, 0.0254] {
            let k = 0.001 / unit_m;
            let (b, h) = (100.0 * k, 200.0 * k);
            let sec = polygon_centroidal(&rectangle(b, h, 0.0, 0.0, 0.0));
            let f = StressField::new(&sec, &act, unit_m).unwrap();
            assert!(close(f.at(0.0, h / 2.0), -14e6, 1e-12), "{unit_m}");
            assert!(close(f.at(0.0, -h / 2.0), 16e6, 1e-12), "{unit_m}");
            assert!(close(f.at(b / 2.0, 0.0), 1e6, 1e-12), "{unit_m}");
        }
    }

    #[test]
    fn hull_of_awkward_point_sets() {
        let square = [(0.0, 0.0), (1.0, 0.0), (1.0, 1.0), (0.0, 1.0)];
        let mut pts = square.to_vec();
        pts.extend([(0.5, 0.5), (0.5, 0.0), (1.0, 0.5), (0.0, 0.0), (0.2, 0.9)]);
        pts.push((f64::NAN, 3.0));
        assert_eq!(convex_hull(&pts), square.to_vec());
        assert_eq!(convex_hull(&[]), Vec::<(f64, f64)>::new());
        assert_eq!(convex_hull(&[(1.0, 2.0), (1.0, 2.0)]), vec![(1.0, 2.0)]);
        assert_eq!(
            convex_hull(&[(2.0, 2.0), (0.0, 0.0), (1.0, 1.0), (3.0, 3.0)]),
            vec![(0.0, 0.0), (3.0, 3.0)]
        );
        // Clockwise input comes back counter-clockwise (positive shoelace area).
        let cw: Vec<_> = square.iter().rev().copied().collect();
        let hull = convex_hull(&cw);
        assert!(polygon_centroidal(&hull).area > 0.0);
    }

    /// The points of `pts` the octagon of `pts` does not hold.
    fn prefiltered(pts: &[(f64, f64)]) -> Vec<(f64, f64)> {
        match Octagon::of(pts) {
            Some(o) => pts.iter().copied().filter(|&p| !o.holds(p)).collect(),
            None => pts.to_vec(),
        }
    }

    #[test]
    fn hull_of_a_circles_points_is_all_of_them() {
        // Every point of a circle is extreme, so the hull of n points on it is the regular
        // n-gon through them, of area (n/2)·r²·sin(2π/n) (n isosceles triangles).
        let (n, r, c) = (360, 75.0, (12.0, -40.0));
        let pts: Vec<(f64, f64)> = (0..n)
            .map(|k| {
                let t = std::f64::consts::TAU * k as f64 / n as f64;
                (c.0 + r * t.cos(), c.1 + r * t.sin())
            })
            .collect();
        let hull = convex_hull(&pts);
        assert_eq!(hull.len(), n);
        let want = n as f64 / 2.0 * r * r * (std::f64::consts::TAU / n as f64).sin();
        assert!(close(polygon_centroidal(&hull).area, want, 1e-12));
        // The octagon (the points at 0°, 45°, … 315°) leaves out none of them.
        assert_eq!(prefiltered(&pts).len(), n);
    }

    #[test]
    fn hull_of_a_rectangle_with_a_hole_is_its_corners() {
        // A 300 × 200 plate with a round hole and a square hole: the hull of a set is the
        // hull of its extreme points, here the plate's four corners (counter-clockwise from
        // the lowest x, then lowest y).
        let mut pts = rectangle(300.0, 200.0, 150.0, 100.0, 0.0);
        pts.extend((0..72).map(|k| {
            let t = std::f64::consts::TAU * k as f64 / 72.0;
            (90.0 + 40.0 * t.cos(), 100.0 + 40.0 * t.sin())
        }));
        pts.extend(rectangle(60.0, 60.0, 220.0, 100.0, 0.0));
        let corners = vec![(0.0, 0.0), (300.0, 0.0), (300.0, 200.0), (0.0, 200.0)];
        assert_eq!(convex_hull(&pts), corners);
        assert_eq!(prefiltered(&pts), corners);
    }

    /// Random sets from a linear congruential generator (Knuth's MMIX constants): points
    /// in a square, on circles (as outline points of arcs are), on the edges of a
    /// rectangle (collinear runs), with repeats and a few non-finite points.
    fn awkward_set(round: usize, seed: &mut u64) -> Vec<(f64, f64)> {
        let mut next = || {
            *seed = seed
                .wrapping_mul(6364136223846793005)
                .wrapping_add(1442695040888963407);
            (*seed >> 11) as f64 / (1u64 << 53) as f64
        };
        let n = 1 + round % 97 * 7;
        let scale = 10f64.powi(round as i32 % 7 - 3);
        (0..n)
            .map(|k| {
                let (u, v) = (next(), next());
                match (round + k) % 5 {
                    0 => (scale * u, scale * v),
                    1 => {
                        let t = std::f64::consts::TAU * u;
                        (scale * (0.5 + 0.5 * t.cos()), scale * (0.5 + 0.5 * t.sin()))
                    }
                    2 => (scale * (u * 4.0).floor() / 4.0, scale * v),
                    3 if k % 11 == 0 => (f64::NAN, v),
                    _ => (
                        scale * (u * 3.0).round() / 3.0,
                        scale * (v * 3.0).round() / 3.0,
                    ),
                }
            })
            .collect()
    }

    #[test]
    fn prefiltered_hull_matches_the_whole_sets_on_awkward_sets() {
        // Leaving out the points the extreme octagon holds changes nothing (Akl and
        // Toussaint 1978): the monotone chain over all points is the reference.
        let mut seed = 2024u64;
        for round in 0..300 {
            let pts = awkward_set(round, &mut seed);
            assert_eq!(
                convex_hull(&prefiltered(&pts)),
                convex_hull(&pts),
                "round {round}"
            );
        }
    }

    fn point_set() -> impl proptest::strategy::Strategy<Value = Vec<(f64, f64)>> {
        use proptest::prelude::*;
        // Points in a box, and points on a circle (as outline points of arcs are).
        let free = (-1e3f64..1e3, -1e3f64..1e3);
        let on_circle = (0.0f64..std::f64::consts::TAU, 1e-3f64..1e3, -1e3f64..1e3)
            .prop_map(|(t, r, x)| (x + r * t.cos(), r * t.sin()));
        proptest::collection::vec(prop_oneof![free, on_circle], 0..400)
    }

    proptest::proptest! {
        #[test]
        fn prefilter_leaves_the_hull_alone(pts in point_set()) {
            proptest::prop_assert_eq!(convex_hull(&prefiltered(&pts)), convex_hull(&pts));
        }

        #[test]
        fn near_edges_decide_as_the_octagon_does(
            pts in point_set(),
            c in (-1.2e3f64..1.2e3, -1.2e3f64..1.2e3),
            reach in 0.0f64..500.0,
            offsets in proptest::collection::vec((0.0f64..0.99, 0.0f64..std::f64::consts::TAU), 1..50),
        ) {
            // Within `reach` of c the octagon's nearby edges give its own answer, and
            // with none left every such point is held.
            if let Some(o) = Octagon::of(&pts) {
                let near = o.near(c, reach);
                for (f, t) in offsets {
                    let p = (c.0 + f * reach * t.cos(), c.1 + f * reach * t.sin());
                    proptest::prop_assert_eq!(near.holds(p), o.holds(p));
                    proptest::prop_assert!(!near.is_open() || o.holds(p));
                }
            }
        }
    }
}
