//! Points, segments (lines and circular arcs) and closed contours, with the affine
//! maps a part's placement needs.

use std::f64::consts::{FRAC_PI_2, PI, TAU};

/// A point or a vector in the plane.
#[derive(Debug, Clone, Copy, PartialEq, Default)]
pub struct Pt {
    pub x: f64,
    pub y: f64,
}

impl Pt {
    pub const fn new(x: f64, y: f64) -> Pt {
        Pt { x, y }
    }
    #[allow(clippy::should_implement_trait)]
    pub fn add(self, o: Pt) -> Pt {
        Pt::new(self.x + o.x, self.y + o.y)
    }
    #[allow(clippy::should_implement_trait)]
    pub fn sub(self, o: Pt) -> Pt {
        Pt::new(self.x - o.x, self.y - o.y)
    }
    pub fn scale(self, k: f64) -> Pt {
        Pt::new(self.x * k, self.y * k)
    }
    /// Rotated counter-clockwise by `angle` radians about the origin.
    pub fn rotated(self, angle: f64) -> Pt {
        let (s, c) = angle.sin_cos();
        Pt::new(c * self.x - s * self.y, s * self.x + c * self.y)
    }
    pub fn cross(self, o: Pt) -> f64 {
        self.x * o.y - self.y * o.x
    }
    pub fn dist(self, o: Pt) -> f64 {
        (self.x - o.x).hypot(self.y - o.y)
    }
    /// The point of the segment `a`–`b` nearest to this one: `a + t·(b − a)` with
    /// `t = (p − a)·(b − a) / |b − a|²` clamped to [0, 1] (the foot of the
    /// perpendicular, or the nearer end); `a` itself for a segment of no length.
    pub fn nearest_on_segment(self, a: Pt, b: Pt) -> Pt {
        a.add(b.sub(a).scale(self.param_on_segment(a, b)))
    }

    /// The `t` of [`Pt::nearest_on_segment`]: `(p − a)·(b − a) / |b − a|²` clamped to
    /// [0, 1], 0 for a segment of no length.
    pub fn param_on_segment(self, a: Pt, b: Pt) -> f64 {
        let d = b.sub(a);
        let len2 = d.x * d.x + d.y * d.y;
        if len2 > 0.0 {
            ((self.sub(a).x * d.x + self.sub(a).y * d.y) / len2).clamp(0.0, 1.0)
        } else {
            0.0
        }
    }
    /// Distance to the segment `a`–`b` (to its nearest point, [`Pt::nearest_on_segment`]).
    pub fn dist_to_segment(self, a: Pt, b: Pt) -> f64 {
        self.dist(self.nearest_on_segment(a, b))
    }
}

impl std::ops::Add for Pt {
    type Output = Pt;
    fn add(self, o: Pt) -> Pt {
        Pt::new(self.x + o.x, self.y + o.y)
    }
}

impl std::ops::Sub for Pt {
    type Output = Pt;
    fn sub(self, o: Pt) -> Pt {
        Pt::new(self.x - o.x, self.y - o.y)
    }
}

/// A rotation about the origin with its sine and cosine worked out once; quarter turns
/// are exact (a part rotated by 90° has no rounding in its coordinates).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Turn {
    /// Radians, counter-clockwise.
    pub angle: f64,
    sin: f64,
    cos: f64,
}

impl Turn {
    /// No rotation.
    pub const NONE: Turn = Turn {
        angle: 0.0,
        sin: 0.0,
        cos: 1.0,
    };

    /// A rotation by `deg` degrees, counter-clockwise.
    pub fn degrees(deg: f64) -> Turn {
        // Reduced once, exactly (fmod is exact), so a huge angle is an ordinary one
        // and every angle after this is in [0°, 360°).
        let deg = if deg.is_finite() {
            deg.rem_euclid(360.0)
        } else {
            0.0
        };
        let quarter = deg / 90.0;
        let (sin, cos) = if quarter.fract() == 0.0 && quarter.abs() < 1e15 {
            match quarter.rem_euclid(4.0) as i64 {
                0 => (0.0, 1.0),
                1 => (1.0, 0.0),
                2 => (0.0, -1.0),
                _ => (-1.0, 0.0),
            }
        } else {
            deg.to_radians().sin_cos()
        };
        Turn {
            angle: deg.to_radians(),
            sin,
            cos,
        }
    }

    /// `p` turned about the origin.
    pub fn apply(self, p: Pt) -> Pt {
        Pt::new(
            self.cos * p.x - self.sin * p.y,
            self.sin * p.x + self.cos * p.y,
        )
    }
}

/// One piece of a boundary: a straight line or a circular arc.
///
/// An arc runs from angle `a0` to `a1` (radians, measured from +x about the centre
/// `c`); `a1 > a0` is counter-clockwise travel, `a1 < a0` clockwise (a concave fillet
/// on a counter-clockwise outline). `|a1 − a0| ≤ 2π`.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum Seg {
    Line(Pt, Pt),
    Arc { c: Pt, r: f64, a0: f64, a1: f64 },
}

impl Seg {
    pub fn arc(c: Pt, r: f64, a0: f64, a1: f64) -> Seg {
        Seg::Arc { c, r, a0, a1 }
    }

    pub fn start(&self) -> Pt {
        match *self {
            Seg::Line(a, _) => a,
            Seg::Arc { c, r, a0, .. } => c.add(Pt::new(r * a0.cos(), r * a0.sin())),
        }
    }

    pub fn end(&self) -> Pt {
        match *self {
            Seg::Line(_, b) => b,
            Seg::Arc { c, r, a1, .. } => c.add(Pt::new(r * a1.cos(), r * a1.sin())),
        }
    }

    /// The same segment traversed the other way.
    pub fn reversed(&self) -> Seg {
        match *self {
            Seg::Line(a, b) => Seg::Line(b, a),
            Seg::Arc { c, r, a0, a1 } => Seg::Arc {
                c,
                r,
                a0: a1,
                a1: a0,
            },
        }
    }

    /// The image under `p ↦ origin + R(angle)·p` (rotation, then translation).
    pub fn moved(&self, turn: Turn, origin: Pt) -> Seg {
        let f = |p: Pt| turn.apply(p).add(origin);
        match *self {
            Seg::Line(a, b) => Seg::Line(f(a), f(b)),
            Seg::Arc { c, r, a0, a1 } => Seg::Arc {
                c: f(c),
                r,
                a0: a0 + turn.angle,
                a1: a1 + turn.angle,
            },
        }
    }

    /// The segment shifted by `d`.
    pub fn shifted(&self, d: Pt) -> Seg {
        self.moved(Turn::NONE, d)
    }

    /// The mirror image under `x ↦ −x` (if `mx`) and `y ↦ −y` (if `my`), same direction of travel.
    pub fn mirrored(&self, mx: bool, my: bool) -> Seg {
        let f = |p: Pt| Pt::new(if mx { -p.x } else { p.x }, if my { -p.y } else { p.y });
        let g = |t: f64| {
            let t = if mx { PI - t } else { t };
            if my {
                -t
            } else {
                t
            }
        };
        match *self {
            Seg::Line(a, b) => Seg::Line(f(a), f(b)),
            Seg::Arc { c, r, a0, a1 } => Seg::Arc {
                c: f(c),
                r,
                a0: g(a0),
                a1: g(a1),
            },
        }
    }

    /// The image under a quarter turn clockwise, `(x, y) ↦ (y, −x)`, exact (no sin/cos).
    pub fn quarter_turn_cw(&self) -> Seg {
        let f = |p: Pt| Pt::new(p.y, -p.x);
        match *self {
            Seg::Line(a, b) => Seg::Line(f(a), f(b)),
            Seg::Arc { c, r, a0, a1 } => Seg::Arc {
                c: f(c),
                r,
                a0: a0 - FRAC_PI_2,
                a1: a1 - FRAC_PI_2,
            },
        }
    }

    /// Extent of the segment: `[xmin, xmax, ymin, ymax]`, exact for arcs.
    pub fn bounds(&self) -> [f64; 4] {
        self.bounds_between(self.start(), self.end())
    }

    /// [`Seg::bounds`] given the segment's own `start()` and `end()` (an arc's ends
    /// cost a sine and cosine each: a caller that has them passes them on).
    pub fn bounds_between(&self, p: Pt, q: Pt) -> [f64; 4] {
        let mut b = [p.x.min(q.x), p.x.max(q.x), p.y.min(q.y), p.y.max(q.y)];
        if let Seg::Arc { c, r, a0, a1 } = *self {
            let (lo, hi) = (a0.min(a1), a0.max(a1));
            // Every multiple of π/2 inside the sweep is an extreme point of the circle:
            // at most five of them in a sweep of a full turn, counted by an integer
            // (a float counter stops counting beyond 2^53).
            let first = (lo / FRAC_PI_2).ceil();
            let quarters = ((hi - lo) / FRAC_PI_2).min(4.0);
            if first.is_finite() && quarters.is_finite() {
                for i in 0..=(quarters as usize) {
                    let t = (first + i as f64) * FRAC_PI_2;
                    if t > hi {
                        break;
                    }
                    let (cos, sin) = quarter_cos_sin(first + i as f64, t);
                    let e = c.add(Pt::new(r * cos, r * sin));
                    b = [b[0].min(e.x), b[1].max(e.x), b[2].min(e.y), b[3].max(e.y)];
                }
            }
        }
        b
    }

    /// Points along the segment, excluding its end point: the start for a line; for an
    /// arc, the start and interior points with at most `max_angle` radians between them.
    pub fn facet_points(&self, max_angle: f64, out: &mut Vec<Pt>) {
        match *self {
            Seg::Line(a, _) => out.push(a),
            Seg::Arc { c, r, a0, a1 } => {
                out.extend(arc_offsets(r, a0, a1, max_angle).map(|v| c.add(v)))
            }
        }
    }

    /// [`Seg::facet_points`], with an arc's points about its centre taken from `memo`
    /// when an arc of the same radius and angles was cut before (the same numbers: a
    /// point is the centre plus its offset either way).
    pub fn facet_points_in(&self, max_angle: f64, memo: &mut ArcOffsets, out: &mut Vec<Pt>) {
        match *self {
            Seg::Line(a, _) => out.push(a),
            Seg::Arc { c, r, a0, a1 } => {
                out.extend(memo.offsets(r, a0, a1, max_angle).iter().map(|&v| c.add(v)));
            }
        }
    }

    /// The points of [`Seg::facet_points`], an arc's turned one from the next by a
    /// fixed rotation (one sine and cosine an arc): each within a few rounding errors
    /// of the facet point, for point sets whose last digits do not matter (the hull
    /// behind the kern).
    pub fn sample_points(&self, max_angle: f64, out: &mut Vec<Pt>) {
        match *self {
            Seg::Line(a, _) => out.push(a),
            Seg::Arc { c, r, a0, a1 } => {
                let sweep = a1 - a0;
                let n = chords(sweep, max_angle);
                let (s, k) = (sweep / n as f64).sin_cos();
                let mut v = Pt::new(r * a0.cos(), r * a0.sin());
                out.reserve(n);
                for _ in 0..n {
                    out.push(c.add(v));
                    v = Pt::new(k * v.x - s * v.y, s * v.x + k * v.y);
                }
            }
        }
    }

    /// For an arc, its centre and a radius about it within which all its
    /// [`Seg::sample_points`] lie: `|r|·(1 + 10⁻⁹) + 10⁻¹⁵·(|cx| + |cy|)`. The rotation's
    /// rounding changes the length of the offset by a few parts in 10¹⁶ a step (at most
    /// 4,096 steps, below 10⁻¹¹ of r) and adding the centre rounds each coordinate by half
    /// a unit in the last place (below 1.2·10⁻¹⁶ of |c| + r). `None` for a line.
    pub fn sample_disc(&self) -> Option<(Pt, f64)> {
        match *self {
            Seg::Line(..) => None,
            Seg::Arc { c, r, .. } => {
                Some((c, r.abs() * (1.0 + 1e-9) + 1e-15 * (c.x.abs() + c.y.abs())))
            }
        }
    }
}

/// `(cos t, sin t)` at `t = q·(π/2)` (`q` a whole number, `t` the product as rounded):
/// from a table worked out once by the same functions for the `q` of the first few
/// turns either way, else directly (the same numbers either way).
fn quarter_cos_sin(q: f64, t: f64) -> (f64, f64) {
    const LAST: i32 = 16;
    static TABLE: std::sync::OnceLock<[(f64, f64); 2 * LAST as usize + 1]> =
        std::sync::OnceLock::new();
    if q.abs() > f64::from(LAST) {
        return (t.cos(), t.sin());
    }
    let table = TABLE.get_or_init(|| {
        std::array::from_fn(|k| {
            let t = f64::from(k as i32 - LAST) * FRAC_PI_2;
            (t.cos(), t.sin())
        })
    });
    table[(q as i32 + LAST) as usize]
}

/// The facet points of an arc of radius `r` from `a0` to `a1` about its centre: its start
/// and interior points at most `max_angle` apart (the end excluded).
fn arc_offsets(r: f64, a0: f64, a1: f64, max_angle: f64) -> impl Iterator<Item = Pt> {
    let sweep = a1 - a0;
    let n = chords(sweep, max_angle);
    (0..n).map(move |i| {
        let t = a0 + sweep * i as f64 / n as f64;
        Pt::new(r * t.cos(), r * t.sin())
    })
}

/// The points of arcs about their centres by radius, angles and chord angle, for
/// [`Seg::facet_points_in`]: the several bolt holes, bars or fillets of one size in a
/// section (or in a batch of sections, when one is kept from one to the next) are cut
/// once. At most [`ArcOffsets::POINTS`] points are kept: past that it starts afresh.
#[derive(Debug, Default)]
pub struct ArcOffsets {
    arcs: std::collections::HashMap<[u64; 4], Vec<Pt>>,
    points: usize,
}

impl ArcOffsets {
    /// The most points kept (16 MiB).
    pub const POINTS: usize = 1 << 20;

    /// The facet points about its centre of the arc of radius `r` from `a0` to `a1`,
    /// chords of at most `max_angle` ([`arc_offsets`]), cut the first time.
    fn offsets(&mut self, r: f64, a0: f64, a1: f64, max_angle: f64) -> &[Pt] {
        // An arc has at most 4,096 points: this keeps fewer than `POINTS` + 4,096.
        if self.points >= Self::POINTS {
            self.arcs.clear();
            self.points = 0;
        }
        let key = [r, a0, a1, max_angle].map(f64::to_bits);
        let points = &mut self.points;
        self.arcs.entry(key).or_insert_with(|| {
            let pts: Vec<Pt> = arc_offsets(r, a0, a1, max_angle).collect();
            *points += pts.len();
            pts
        })
    }
}

/// Chords of at most `max_angle` radians on an arc of `sweep` (1 to 4,096).
fn chords(sweep: f64, max_angle: f64) -> usize {
    ((sweep.abs() / max_angle.max(1e-3)).ceil() as usize).clamp(1, 4096)
}

/// A closed loop of segments, each starting where the previous one ends.
#[derive(Debug, Clone, PartialEq, Default)]
pub struct Contour {
    pub segs: Vec<Seg>,
}

impl Contour {
    /// A straight-sided loop through `pts` (closed back to the first point).
    pub fn polygon(pts: &[Pt]) -> Contour {
        let n = pts.len();
        Contour {
            segs: (0..n)
                .map(|i| Seg::Line(pts[i], pts[(i + 1) % n]))
                .collect(),
        }
    }

    /// A full circle, counter-clockwise.
    pub fn circle(c: Pt, r: f64) -> Contour {
        Contour {
            segs: vec![Seg::arc(c, r, 0.0, TAU)],
        }
    }

    /// An axis-aligned rectangle `x0..x1 × y0..y1` with corner radius `r` (0 for sharp
    /// corners), counter-clockwise.
    pub fn rounded_rect(x0: f64, y0: f64, x1: f64, y1: f64, r: f64) -> Contour {
        if r <= 0.0 {
            return Contour::polygon(&[
                Pt::new(x0, y0),
                Pt::new(x1, y0),
                Pt::new(x1, y1),
                Pt::new(x0, y1),
            ]);
        }
        let corner = |cx: f64, cy: f64, a: f64| Seg::arc(Pt::new(cx, cy), r, a, a + FRAC_PI_2);
        let mut b = Builder::start(Pt::new(x0 + r, y0));
        b.line(Pt::new(x1 - r, y0));
        b.seg(corner(x1 - r, y0 + r, -FRAC_PI_2));
        b.line(Pt::new(x1, y1 - r));
        b.seg(corner(x1 - r, y1 - r, 0.0));
        b.line(Pt::new(x0 + r, y1));
        b.seg(corner(x0 + r, y1 - r, FRAC_PI_2));
        b.line(Pt::new(x0, y0 + r));
        b.seg(corner(x0 + r, y0 + r, PI));
        b.close()
    }

    /// The loop traversed the other way (a solid outline becomes a hole).
    pub fn reversed(&self) -> Contour {
        Contour {
            segs: self.segs.iter().rev().map(Seg::reversed).collect(),
        }
    }

    /// Extent `[xmin, xmax, ymin, ymax]`; `None` for an empty contour.
    pub fn bounds(&self) -> Option<[f64; 4]> {
        self.segs.iter().map(Seg::bounds).reduce(union_bounds)
    }

    /// The number of points of [`Contour::facets`]: one a line, an arc's chords.
    fn facet_count(&self, max_angle: f64) -> usize {
        (self.segs.iter())
            .map(|s| match *s {
                Seg::Line(..) => 1,
                Seg::Arc { a0, a1, .. } => chords(a1 - a0, max_angle),
            })
            .sum()
    }

    /// The loop as a polygon, arcs cut into chords of at most `max_angle` radians.
    pub fn facets(&self, max_angle: f64) -> Vec<Pt> {
        let mut out = Vec::with_capacity(self.facet_count(max_angle));
        for s in &self.segs {
            s.facet_points(max_angle, &mut out);
        }
        out
    }

    /// [`Contour::facets`], with arcs cut before taken from `memo`.
    pub fn facets_in(&self, max_angle: f64, memo: &mut ArcOffsets) -> Vec<Pt> {
        let mut out = Vec::with_capacity(self.facet_count(max_angle));
        for s in &self.segs {
            s.facet_points_in(max_angle, memo, &mut out);
        }
        out
    }
}

/// The part of the line through `p` along `d` inside the box `[xmin, xmax, ymin, ymax]`
/// (parametric clipping, Liang & Barsky, "A new concept and method for line
/// clipping", 1984); `None` when it misses the box.
pub fn clip_line(p: Pt, d: Pt, b: [f64; 4]) -> Option<(Pt, Pt)> {
    let (mut t0, mut t1) = (f64::NEG_INFINITY, f64::INFINITY);
    for (p, d, lo, hi) in [(p.x, d.x, b[0], b[1]), (p.y, d.y, b[2], b[3])] {
        if d.abs() < 1e-12 {
            if p < lo || p > hi {
                return None;
            }
        } else {
            let (ta, tb) = ((lo - p) / d, (hi - p) / d);
            t0 = t0.max(ta.min(tb));
            t1 = t1.min(ta.max(tb));
        }
    }
    (t0 <= t1 && t0.is_finite() && t1.is_finite()).then(|| (p.add(d.scale(t0)), p.add(d.scale(t1))))
}

/// The smallest box holding both boxes.
pub fn union_bounds(a: [f64; 4], b: [f64; 4]) -> [f64; 4] {
    [
        a[0].min(b[0]),
        a[1].max(b[1]),
        a[2].min(b[2]),
        a[3].max(b[3]),
    ]
}

/// Builds a contour segment by segment, joining lines from the current point.
pub struct Builder {
    first: Pt,
    cur: Pt,
    segs: Vec<Seg>,
}

impl Builder {
    pub fn start(p: Pt) -> Builder {
        Builder {
            first: p,
            cur: p,
            segs: Vec::new(),
        }
    }
    /// A straight line from the current point to `p` (skipped if of zero length).
    pub fn line(&mut self, p: Pt) {
        if p != self.cur {
            self.segs.push(Seg::Line(self.cur, p));
        }
        self.cur = p;
    }
    /// An arc or other segment; a line joins the current point to its start if needed.
    /// Zero-radius arcs are skipped (a fillet of radius 0 is a sharp corner).
    pub fn seg(&mut self, s: Seg) {
        if let Seg::Arc { r, .. } = s {
            if r <= 0.0 {
                return;
            }
        }
        let (a, b) = (s.start(), s.end());
        // Arc ends come from sin/cos and miss exact corners by rounding; do not add slivers.
        let scale = a.x.abs() + a.y.abs() + self.cur.x.abs() + self.cur.y.abs();
        if a.dist(self.cur) > 1e-12 * scale {
            self.segs.push(Seg::Line(self.cur, a));
        }
        self.segs.push(s);
        self.cur = b;
    }
    pub fn close(mut self) -> Contour {
        let first = self.first;
        let scale = first.x.abs() + first.y.abs() + self.cur.x.abs() + self.cur.y.abs();
        if first.dist(self.cur) > 1e-12 * scale {
            self.line(first);
        }
        Contour { segs: self.segs }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn quarter_turns_from_the_table_are_the_functions_values() {
        // The table holds cos and sin of q·(π/2) as the library works them out: compared
        // bit for bit with calling them, inside the table and past it.
        for q in -40..=40 {
            let t = f64::from(q) * FRAC_PI_2;
            let (c, s) = quarter_cos_sin(f64::from(q), t);
            assert_eq!(c.to_bits(), t.cos().to_bits(), "{q}");
            assert_eq!(s.to_bits(), t.sin().to_bits(), "{q}");
        }
    }

    #[test]
    fn circle_extent_is_centre_plus_and_minus_the_radius() {
        // The extreme points of a circle lie a radius from its centre along each axis;
        // within rounding of cos(π/2) ≈ 6e-17 in the cross direction.
        let (c, r) = (Pt::new(3.0, -2.0), 1.5);
        let b = Contour::circle(c, r).bounds().unwrap();
        let want = [c.x - r, c.x + r, c.y - r, c.y + r];
        for (got, w) in b.iter().zip(want) {
            assert!((got - w).abs() < 1e-15, "{b:?}");
        }
    }

    #[test]
    fn remembered_arcs_give_the_facets_cut_afresh() {
        // Two holes of one size and a third of another, through one memo and twice over:
        // the same points as `Contour::facets`.
        let mut memo = ArcOffsets::default();
        let holes = [
            Contour::circle(Pt::new(0.0, 0.0), 2.0),
            Contour::circle(Pt::new(5.0, 1.0), 2.0),
            Contour::circle(Pt::new(5.0, 1.0), 3.0).reversed(),
        ];
        for _ in 0..2 {
            for h in &holes {
                assert_eq!(h.facets_in(0.1, &mut memo), h.facets(0.1));
            }
        }
        assert_eq!(memo.arcs.len(), 2);
    }
}
