//! The shapes of format 1, each drawn in its own frame (docs/format.md, "Shapes") as
//! exact boundaries: straight edges and circular arcs, no facets.
//!
//! Outlines run counter-clockwise; the bore of a pipe and the inside of a box run
//! clockwise, so that summing over a shape's contours gives its net properties.
//! The names, keys and rules of the shapes are [`crate::model::schema`]; here each kind
//! gets its boundary.

use super::contour::{Builder, Contour, Pt, Seg};
use crate::model::schema::{Dims, ShapeKind};
use std::f64::consts::{FRAC_PI_2, PI, TAU};

/// A shape with its dimensions, in the file's length unit.
#[derive(Debug, Clone, PartialEq)]
pub enum Shape {
    Rect {
        b: f64,
        h: f64,
    },
    Triangle {
        b: f64,
        h: f64,
        apex: f64,
    },
    Circle {
        d: f64,
    },
    HalfCircle {
        d: f64,
    },
    QuarterCircle {
        r: f64,
    },
    Polygon {
        points: Vec<Pt>,
    },
    IBeam {
        d: f64,
        b: f64,
        tf: f64,
        tw: f64,
        r: f64,
    },
    Channel {
        d: f64,
        b: f64,
        tf: f64,
        tw: f64,
        r: f64,
    },
    Angle {
        h: f64,
        b: f64,
        t: f64,
        r: f64,
    },
    Tee {
        d: f64,
        b: f64,
        tf: f64,
        tw: f64,
        r: f64,
    },
    Box {
        h: f64,
        b: f64,
        t: f64,
        ro: f64,
    },
    Pipe {
        d: f64,
        t: f64,
    },
    Zed {
        d: f64,
        b: f64,
        tf: f64,
        tw: f64,
        r: f64,
    },
}

impl Shape {
    /// Builds a shape of `kind` from its resolved dimensions (every key of the kind's
    /// spec, defaults applied), checking that they make a real shape. Errors are
    /// `(key, message)`: they name the offending key and say how to fix it.
    pub fn build(kind: ShapeKind, dims: &Dims, points: Vec<Pt>) -> Result<Shape, (String, String)> {
        let dim = |k: &str| {
            dims.get(k)
                .ok_or_else(|| (k.to_string(), format!("a {kind} needs `{k}`")))
        };
        let s = match kind {
            ShapeKind::Rect => Shape::Rect {
                b: dim("b")?,
                h: dim("h")?,
            },
            ShapeKind::Triangle => Shape::Triangle {
                b: dim("b")?,
                h: dim("h")?,
                apex: dim("apex")?,
            },
            ShapeKind::Circle => Shape::Circle { d: dim("d")? },
            ShapeKind::HalfCircle => Shape::HalfCircle { d: dim("d")? },
            ShapeKind::QuarterCircle => Shape::QuarterCircle { r: dim("r")? },
            ShapeKind::Polygon => Shape::Polygon { points },
            ShapeKind::IBeam | ShapeKind::Channel | ShapeKind::Tee | ShapeKind::Zed => {
                let (d, b, tf, tw, r) = (dim("d")?, dim("b")?, dim("tf")?, dim("tw")?, dim("r")?);
                match kind {
                    ShapeKind::IBeam => Shape::IBeam { d, b, tf, tw, r },
                    ShapeKind::Channel => Shape::Channel { d, b, tf, tw, r },
                    ShapeKind::Zed => Shape::Zed { d, b, tf, tw, r },
                    _ => Shape::Tee { d, b, tf, tw, r },
                }
            }
            ShapeKind::Angle => Shape::Angle {
                h: dim("h")?,
                b: dim("b")?,
                t: dim("t")?,
                r: dim("r")?,
            },
            ShapeKind::Box => Shape::Box {
                h: dim("h")?,
                b: dim("b")?,
                t: dim("t")?,
                ro: dim("ro")?,
            },
            ShapeKind::Pipe => Shape::Pipe {
                d: dim("d")?,
                t: dim("t")?,
            },
        };
        s.check()?;
        Ok(s)
    }

    /// Checks that the dimensions fit together; the error is `(key, message)`.
    fn check(&self) -> Result<(), (String, String)> {
        let fail = |k: &str, m: String| Err((k.to_string(), m));
        match *self {
            Shape::IBeam { d, b, tf, tw, r } | Shape::Tee { d, b, tf, tw, r } => {
                let flanges = if matches!(self, Shape::IBeam { .. }) {
                    2.0
                } else {
                    1.0
                };
                if tw >= b {
                    return fail(
                        "tw",
                        format!(
                            "web thickness tw = {tw} must be less than the flange width b = {b}"
                        ),
                    );
                }
                if flanges * tf >= d {
                    return fail(
                        "tf",
                        format!("flange thickness tf = {tf} leaves no web in depth d = {d}"),
                    );
                }
                if r > (b - tw) / 2.0 {
                    return fail(
                        "r",
                        format!(
                            "root radius r = {r} is wider than the flange outstand (b − tw)/2 = {}",
                            (b - tw) / 2.0
                        ),
                    );
                }
                if flanges * (tf + r) > d {
                    return fail(
                        "r",
                        format!("root radius r = {r} does not fit in the web depth"),
                    );
                }
            }
            Shape::Channel { d, b, tf, tw, r } | Shape::Zed { d, b, tf, tw, r } => {
                if tw >= b {
                    return fail(
                        "tw",
                        format!(
                            "web thickness tw = {tw} must be less than the flange width b = {b}"
                        ),
                    );
                }
                if 2.0 * tf >= d {
                    return fail(
                        "tf",
                        format!("flange thickness tf = {tf} leaves no web in depth d = {d}"),
                    );
                }
                // A channel's two fillets face each other across the web's inner face;
                // a zed's lie on opposite faces, each spanning at most the web's depth
                // below (or above) its flange.
                let fits = if matches!(self, Shape::Zed { .. }) {
                    tf + r <= d - tf
                } else {
                    2.0 * (tf + r) <= d
                };
                if r > b - tw || !fits {
                    return fail(
                        "r",
                        format!("root radius r = {r} does not fit between web and flanges"),
                    );
                }
            }
            Shape::Angle { h, b, t, r } => {
                if t >= h.min(b) {
                    return fail(
                        "t",
                        format!("thickness t = {t} must be less than both legs ({h}, {b})"),
                    );
                }
                if t + r > h.min(b) {
                    return fail("r", format!("root radius r = {r} does not fit on the legs"));
                }
            }
            Shape::Box { h, b, t, ro } => {
                if 2.0 * t >= h.min(b) {
                    return fail("t", format!("wall t = {t} leaves no hollow in a {b} × {h} box; use a rect for a solid bar"));
                }
                if 2.0 * ro > h.min(b) {
                    return fail(
                        "ro",
                        format!("corner radius ro = {ro} is more than half the smaller side"),
                    );
                }
            }
            Shape::Pipe { d, t } if 2.0 * t >= d => {
                return fail("t", format!("wall t = {t} leaves no bore in diameter d = {d}; use a circle for a solid bar"));
            }
            Shape::Polygon { ref points } => {
                if points.len() < 3 {
                    return fail(
                        "points",
                        format!(
                            "a polygon needs 3 or more points, this one has {}",
                            points.len()
                        ),
                    );
                }
                if let Some((i, j)) = super::simple::first_crossing(points) {
                    return fail("points", format!("the polygon crosses itself: edge {} meets edge {}; reorder the points so the outline does not cross", i + 1, j + 1));
                }
            }
            _ => {}
        }
        Ok(())
    }

    /// The kind of the shape.
    pub fn kind(&self) -> ShapeKind {
        match self {
            Shape::Rect { .. } => ShapeKind::Rect,
            Shape::Triangle { .. } => ShapeKind::Triangle,
            Shape::Circle { .. } => ShapeKind::Circle,
            Shape::HalfCircle { .. } => ShapeKind::HalfCircle,
            Shape::QuarterCircle { .. } => ShapeKind::QuarterCircle,
            Shape::Polygon { .. } => ShapeKind::Polygon,
            Shape::IBeam { .. } => ShapeKind::IBeam,
            Shape::Channel { .. } => ShapeKind::Channel,
            Shape::Angle { .. } => ShapeKind::Angle,
            Shape::Tee { .. } => ShapeKind::Tee,
            Shape::Box { .. } => ShapeKind::Box,
            Shape::Pipe { .. } => ShapeKind::Pipe,
            Shape::Zed { .. } => ShapeKind::Zed,
        }
    }

    /// The dimensions, `(key, value)` in the order of the kind's keys (none for a
    /// polygon).
    pub fn dims(&self) -> Vec<(&'static str, f64)> {
        match *self {
            Shape::Rect { b, h } => vec![("b", b), ("h", h)],
            Shape::Triangle { b, h, apex } => vec![("b", b), ("h", h), ("apex", apex)],
            Shape::Circle { d } | Shape::HalfCircle { d } => vec![("d", d)],
            Shape::QuarterCircle { r } => vec![("r", r)],
            Shape::Polygon { .. } => Vec::new(),
            Shape::IBeam { d, b, tf, tw, r }
            | Shape::Channel { d, b, tf, tw, r }
            | Shape::Tee { d, b, tf, tw, r }
            | Shape::Zed { d, b, tf, tw, r } => {
                vec![("d", d), ("b", b), ("tf", tf), ("tw", tw), ("r", r)]
            }
            Shape::Angle { h, b, t, r } => vec![("h", h), ("b", b), ("t", t), ("r", r)],
            Shape::Box { h, b, t, ro } => vec![("h", h), ("b", b), ("t", t), ("ro", ro)],
            Shape::Pipe { d, t } => vec![("d", d), ("t", t)],
        }
    }

    /// The boundaries of the shape in its own frame: outlines counter-clockwise, bores
    /// clockwise.
    pub fn contours(&self) -> Vec<Contour> {
        let p = Pt::new;
        match *self {
            Shape::Rect { b, h } => vec![Contour::rounded_rect(0.0, 0.0, b, h, 0.0)],
            Shape::Triangle { b, h, apex } => {
                vec![Contour::polygon(&[p(0.0, 0.0), p(b, 0.0), p(apex, h)])]
            }
            Shape::Circle { d } => vec![Contour::circle(p(d / 2.0, d / 2.0), d / 2.0)],
            Shape::HalfCircle { d } => {
                let mut c = Builder::start(p(0.0, 0.0));
                c.line(p(d, 0.0));
                c.seg(Seg::arc(p(d / 2.0, 0.0), d / 2.0, 0.0, PI));
                vec![c.close()]
            }
            Shape::QuarterCircle { r } => {
                let mut c = Builder::start(p(0.0, 0.0));
                c.line(p(r, 0.0));
                c.seg(Seg::arc(p(0.0, 0.0), r, 0.0, FRAC_PI_2));
                vec![c.close()]
            }
            Shape::Polygon { ref points } => {
                let c = Contour::polygon(points);
                if super::simple::signed_area(points) < 0.0 {
                    vec![c.reversed()]
                } else {
                    vec![c]
                }
            }
            Shape::IBeam { d, b, tf, tw, r } => vec![ibeam(d, b, tf, tw, r)],
            Shape::Channel { d, b, tf, tw, r } => vec![channel(d, b, tf, tw, r)],
            Shape::Angle { h, b, t, r } => {
                let mut c = Builder::start(p(0.0, 0.0));
                c.line(p(b, 0.0));
                c.line(p(b, t));
                c.line(p(t + r, t));
                c.seg(fillet(p(t + r, t + r), r, -FRAC_PI_2));
                c.line(p(t, h));
                c.line(p(0.0, h));
                vec![c.close()]
            }
            Shape::Tee { d, b, tf, tw, r } => {
                let (x1, x2) = ((b - tw) / 2.0, (b + tw) / 2.0);
                let yf = d - tf;
                let mut c = Builder::start(p(x1, 0.0));
                c.line(p(x2, 0.0));
                c.line(p(x2, yf - r));
                c.seg(fillet(p(x2 + r, yf - r), r, PI));
                c.line(p(b, yf));
                c.line(p(b, d));
                c.line(p(0.0, d));
                c.line(p(0.0, yf));
                c.line(p(x1 - r, yf));
                c.seg(fillet(p(x1 - r, yf - r), r, FRAC_PI_2));
                vec![c.close()]
            }
            Shape::Box { h, b, t, ro } => vec![
                Contour::rounded_rect(0.0, 0.0, b, h, ro),
                Contour::rounded_rect(t, t, b - t, h - t, (ro - t).max(0.0)).reversed(),
            ],
            Shape::Zed { d, b, tf, tw, r } => vec![zed(d, b, tf, tw, r)],
            Shape::Pipe { d, t } => {
                let c = p(d / 2.0, d / 2.0);
                vec![
                    Contour::circle(c, d / 2.0),
                    Contour {
                        segs: vec![Seg::arc(c, d / 2.0 - t, TAU, 0.0)],
                    },
                ]
            }
        }
    }
}

/// A concave root fillet of radius `r` about centre `c`, travelled clockwise through a
/// quarter turn starting at angle `a0`.
fn fillet(c: Pt, r: f64, a0: f64) -> Seg {
    Seg::arc(c, r, a0, a0 - FRAC_PI_2)
}

/// The right-hand side of a web between two flanges, as seen from inside the web:
/// from the tip of the bottom flange's outstand at `x_tip`, along its top face, round
/// the lower root fillet, up the web face at `x_web`, round the upper fillet and out
/// along the top flange's underside to `x_tip` again.
fn web_face(c: &mut Builder, x_web: f64, x_tip: f64, yb: f64, yt: f64, r: f64) {
    let p = Pt::new;
    c.line(p(x_tip, yb));
    c.line(p(x_web + r, yb));
    c.seg(fillet(p(x_web + r, yb + r), r, -FRAC_PI_2));
    c.line(p(x_web, yt - r));
    c.seg(fillet(p(x_web + r, yt - r), r, PI));
    c.line(p(x_tip, yt));
}

/// Doubly symmetric I: web centred, flanges `tf` thick, four root fillets.
fn ibeam(d: f64, b: f64, tf: f64, tw: f64, r: f64) -> Contour {
    let p = Pt::new;
    let (x1, x2) = ((b - tw) / 2.0, (b + tw) / 2.0);
    let (yb, yt) = (tf, d - tf);
    let mut c = Builder::start(p(0.0, 0.0));
    c.line(p(b, 0.0));
    web_face(&mut c, x2, b, yb, yt, r);
    c.line(p(b, d));
    c.line(p(0.0, d));
    c.line(p(0.0, yt));
    c.line(p(x1 - r, yt));
    c.seg(fillet(p(x1 - r, yt - r), r, FRAC_PI_2));
    c.line(p(x1, yb + r));
    c.seg(fillet(p(x1 - r, yb + r), r, 0.0));
    c.line(p(0.0, yb));
    c.close()
}

/// Channel: back of the web on x = 0, parallel flanges toward +x, two root fillets.
fn channel(d: f64, b: f64, tf: f64, tw: f64, r: f64) -> Contour {
    let p = Pt::new;
    let mut c = Builder::start(p(0.0, 0.0));
    c.line(p(b, 0.0));
    web_face(&mut c, tw, b, tf, d - tf, r);
    c.line(p(b, d));
    c.line(p(0.0, d));
    c.close()
}

/// Zed: web from x = b − tw to b over the full depth, the top flange toward +x, the
/// bottom flange toward −x, a root fillet in each of the two inside corners. Symmetric
/// through the centre (b − tw/2, d/2).
fn zed(d: f64, b: f64, tf: f64, tw: f64, r: f64) -> Contour {
    let p = Pt::new;
    let x1 = b - tw;
    let yt = d - tf;
    let mut c = Builder::start(p(0.0, 0.0));
    c.line(p(b, 0.0));
    c.line(p(b, yt - r));
    c.seg(fillet(p(b + r, yt - r), r, PI));
    c.line(p(b + x1, yt));
    c.line(p(b + x1, d));
    c.line(p(x1, d));
    c.line(p(x1, tf + r));
    c.seg(fillet(p(x1 - r, tf + r), r, 0.0));
    c.line(p(0.0, tf));
    c.close()
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::model::schema::{Dims, SPECS};

    /// Every kind of the schema builds from its keys alone (no key read as a silent
    /// 0), and gives its dimensions back under the same keys in the same order.
    #[test]
    fn every_kind_builds_from_its_keys() {
        let tri = vec![Pt::new(0.0, 0.0), Pt::new(1.0, 0.0), Pt::new(0.0, 1.0)];
        for s in SPECS {
            let dims = Dims(
                s.keys
                    .iter()
                    .map(|k| (k.key, k.default.unwrap_or(k.new_mm)))
                    .collect(),
            );
            let shape = Shape::build(s.kind, &dims, tri.clone()).unwrap();
            assert_eq!(shape.kind(), s.kind);
            assert_eq!(shape.dims(), dims.0, "{}", s.name);
            let short = Dims(dims.0.iter().skip(1).copied().collect());
            if !s.keys.is_empty() {
                assert!(
                    Shape::build(s.kind, &short, Vec::new()).is_err(),
                    "{}",
                    s.name
                );
            }
        }
    }
}
