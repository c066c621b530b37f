//! The shapes of format 1, each drawn in its own frame (FORMAT.md, "Shapes and their
//! own frame") as exact boundaries: straight edges and circular arcs, no facets.
//!
//! Outlines run counter-clockwise; the bore of a pipe and the inside of a box run
//! clockwise, so that summing over a shape's contours gives its net properties.

use super::contour::{Builder, Contour, Pt, Seg};
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
}

/// A shape's file name, its required dimension keys, and its optional keys with defaults.
pub type ShapeKeys = (
    &'static str,
    &'static [&'static str],
    &'static [(&'static str, f64)],
);

/// The name of each shape in the file, with its dimension keys (required ones first,
/// then optional ones with their defaults). The reader, the picker in the workbench and
/// the documentation all take the list from here.
pub const SHAPES: &[ShapeKeys] = &[
    ("rect", &["b", "h"], &[]),
    ("triangle", &["b", "h"], &[("apex", 0.0)]),
    ("circle", &["d"], &[]),
    ("half_circle", &["d"], &[]),
    ("quarter_circle", &["r"], &[]),
    ("polygon", &[], &[]),
    ("ibeam", &["d", "b", "tf", "tw"], &[("r", 0.0)]),
    ("channel", &["d", "b", "tf", "tw"], &[("r", 0.0)]),
    ("angle", &["h", "b", "t"], &[("r", 0.0)]),
    ("tee", &["d", "b", "tf", "tw"], &[("r", 0.0)]),
    ("box", &["h", "b", "t"], &[("ro", 0.0)]),
    ("pipe", &["d", "t"], &[]),
];

impl Shape {
    /// Builds a shape from its file name and dimension values, checking that the
    /// dimensions make a real shape. `dim(key)` returns the value of a key (defaults
    /// already applied). Errors name the offending key and say how to fix it.
    pub fn build(
        kind: &str,
        dim: &dyn Fn(&str) -> f64,
        points: Vec<Pt>,
    ) -> Result<Shape, (String, String)> {
        let s = match kind {
            "rect" => Shape::Rect {
                b: dim("b"),
                h: dim("h"),
            },
            "triangle" => Shape::Triangle {
                b: dim("b"),
                h: dim("h"),
                apex: dim("apex"),
            },
            "circle" => Shape::Circle { d: dim("d") },
            "half_circle" => Shape::HalfCircle { d: dim("d") },
            "quarter_circle" => Shape::QuarterCircle { r: dim("r") },
            "polygon" => Shape::Polygon { points },
            "ibeam" | "channel" | "tee" => {
                let (d, b, tf, tw, r) = (dim("d"), dim("b"), dim("tf"), dim("tw"), dim("r"));
                match kind {
                    "ibeam" => Shape::IBeam { d, b, tf, tw, r },
                    "channel" => Shape::Channel { d, b, tf, tw, r },
                    _ => Shape::Tee { d, b, tf, tw, r },
                }
            }
            "angle" => Shape::Angle {
                h: dim("h"),
                b: dim("b"),
                t: dim("t"),
                r: dim("r"),
            },
            "box" => Shape::Box {
                h: dim("h"),
                b: dim("b"),
                t: dim("t"),
                ro: dim("ro"),
            },
            "pipe" => Shape::Pipe {
                d: dim("d"),
                t: dim("t"),
            },
            other => {
                return Err((
                    "shape".into(),
                    format!("unknown shape `{other}`; use one of {}", shape_names()),
                ))
            }
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
            Shape::Channel { d, b, tf, tw, r } => {
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
                if r > b - tw || 2.0 * (tf + r) > d {
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

    /// The file name of the shape.
    pub fn kind(&self) -> &'static str {
        match self {
            Shape::Rect { .. } => "rect",
            Shape::Triangle { .. } => "triangle",
            Shape::Circle { .. } => "circle",
            Shape::HalfCircle { .. } => "half_circle",
            Shape::QuarterCircle { .. } => "quarter_circle",
            Shape::Polygon { .. } => "polygon",
            Shape::IBeam { .. } => "ibeam",
            Shape::Channel { .. } => "channel",
            Shape::Angle { .. } => "angle",
            Shape::Tee { .. } => "tee",
            Shape::Box { .. } => "box",
            Shape::Pipe { .. } => "pipe",
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

/// The dimension names of every shape, for error messages.
pub fn shape_names() -> String {
    SHAPES.iter().map(|s| s.0).collect::<Vec<_>>().join(", ")
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
