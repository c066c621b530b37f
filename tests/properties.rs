//! Properties that must hold for any section, checked on random ones (proptest).
//! Each property names the principle it rests on.

use geo::{Area, Centroid};
use kern::analysis::{Analysis, Options};
use kern::props::Properties;
use proptest::prelude::*;

const HEAD: &str = "format = 1\nunits = \"mm\"\n";

fn analyse(text: &str) -> Analysis {
    match kern::file::load::analyse(text, &Options::default()) {
        Ok(a) => a,
        Err(d) => panic!("{}\n{text}", d.message),
    }
}

fn close(a: f64, b: f64, rel: f64, scale: f64) -> bool {
    (a - b).abs() <= rel * scale.max(a.abs()).max(b.abs())
}

#[track_caller]
fn check(name: &str, a: f64, b: f64, rel: f64, scale: f64) {
    assert!(close(a, b, rel, scale), "{name}: {a} vs {b}");
}

/// A part of a few kinds with fillets and arcs, as TOML lines (without placement).
fn shape_strategy() -> impl Strategy<Value = String> {
    prop_oneof![
        (10.0..200.0f64, 10.0..200.0f64)
            .prop_map(|(b, h)| format!("shape = \"rect\"\nb = {b}\nh = {h}\n")),
        (10.0..200.0f64, 10.0..200.0f64, -100.0..300.0f64)
            .prop_map(|(b, h, a)| format!("shape = \"triangle\"\nb = {b}\nh = {h}\napex = {a}\n")),
        (
            100.0..400.0f64,
            0.3..1.0f64,
            0.03..0.1f64,
            0.02..0.06f64,
            0.0..0.9f64
        )
            .prop_map(|(d, bk, tfk, twk, rk)| {
                let b = d * bk;
                let (tf, tw) = (d * tfk, d * twk);
                let r = rk * ((b - tw) / 2.0).min(d / 2.0 - tf) * 0.9;
                format!("shape = \"ibeam\"\nd = {d}\nb = {b}\ntf = {tf}\ntw = {tw}\nr = {r}\n")
            }),
        (50.0..200.0f64, 50.0..200.0f64, 0.05..0.2f64, 0.0..0.8f64).prop_map(|(h, b, tk, rk)| {
            let t = tk * h.min(b);
            let r = rk * (h.min(b) - t) * 0.5;
            format!("shape = \"angle\"\nh = {h}\nb = {b}\nt = {t}\nr = {r}\n")
        }),
        (10.0..200.0f64).prop_map(|r| format!("shape = \"quarter_circle\"\nr = {r}\n")),
        (20.0..200.0f64).prop_map(|d| format!("shape = \"half_circle\"\nd = {d}\n")),
    ]
}

fn part(shape: &str, at: (f64, f64), rotate: f64) -> String {
    format!(
        "[[parts]]\n{shape}at = [{}, {}]\nrotate = {rotate}\n",
        at.0, at.1
    )
}

/// Two parts placed relative to each other, then the whole pair moved by `shift` and
/// turned by `turn` degrees about the origin (each part's `at` rotated, the same angle
/// added to its own `rotate`).
fn pair(
    s1: &str,
    s2: &str,
    offset: (f64, f64),
    r1: f64,
    r2: f64,
    turn: f64,
    shift: (f64, f64),
) -> String {
    let (c, s) = (turn.to_radians().cos(), turn.to_radians().sin());
    let place = |p: (f64, f64)| (c * p.0 - s * p.1 + shift.0, s * p.0 + c * p.1 + shift.1);
    format!(
        "{HEAD}{}{}",
        part(s1, place((0.0, 0.0)), r1 + turn),
        part(s2, place(offset), r2 + turn)
    )
}

/// Difference of two angles in degrees, modulo 180°.
fn angle_diff_mod_180(a: f64, b: f64) -> f64 {
    let d = (a - b).rem_euclid(180.0);
    d.min(180.0 - d)
}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(96))]

    /// Principal moments are invariants of the second-moment tensor under rotation
    /// (Mohr's circle; Gere & Goodno, Mechanics of Materials, §12.8), and no moment about
    /// the centroid depends on where the section sits (parallel axis theorem); area is
    /// invariant under rigid motions. The principal angle turns with the section
    /// (mod 180°) unless the two principal values coincide.
    #[test]
    fn rigid_motions_leave_invariants(
        s1 in shape_strategy(), s2 in shape_strategy(),
        offset in (-300.0..300.0f64, -300.0..300.0f64),
        r1 in -180.0..180.0f64, r2 in -180.0..180.0f64,
        turn in -360.0..360.0f64,
        shift in (-1e4..1e4f64, -1e4..1e4f64),
    ) {
        let base = analyse(&pair(&s1, &s2, offset, r1, r2, 0.0, (0.0, 0.0))).props;
        let moved = analyse(&pair(&s1, &s2, offset, r1, r2, turn, shift)).props;
        let scale = base.principal.i1;
        check("area", base.area, moved.area, 1e-9, 0.0);
        check("i1", base.principal.i1, moved.principal.i1, 1e-9, scale);
        check("i2", base.principal.i2, moved.principal.i2, 1e-9, scale);
        check("polar", base.ixx + base.iyy, moved.ixx + moved.iyy, 1e-9, scale);
        // The centroid moves with the section.
        let (c, s) = (turn.to_radians().cos(), turn.to_radians().sin());
        let size = (base.area).sqrt() + offset.0.abs() + offset.1.abs();
        let (bx, by) = (base.centroid.x, base.centroid.y);
        check("cx", c * bx - s * by + shift.0, moved.centroid.x, 1e-9, size + shift.0.abs());
        check("cy", s * bx + c * by + shift.1, moved.centroid.y, 1e-9, size + shift.1.abs());
        if base.principal.i1 - base.principal.i2 > 1e-3 * base.principal.i1 {
            let d = angle_diff_mod_180(moved.principal.angle_deg, base.principal.angle_deg + turn);
            prop_assert!(d < 1e-4, "angle {} → {} after turning {turn}", base.principal.angle_deg, moved.principal.angle_deg);
        }
        // A pure translation changes nothing about the centroid but its place.
        let slid = analyse(&pair(&s1, &s2, offset, r1, r2, 0.0, shift)).props;
        check("ixx", base.ixx, slid.ixx, 1e-9, scale);
        check("iyy", base.iyy, slid.iyy, 1e-9, scale);
        check("ixy", base.ixy, slid.ixy, 1e-9, scale);
        if let (Some(a), Some(b)) = (base.plastic, slid.plastic) {
            check("zx", a.zx, b.zx, 1e-7, 0.0);
            check("zy", a.zy, b.zy, 1e-7, 0.0);
        }
    }
}

/// A rectangle `b × h` at `(x0, y0)` cut at the given fractions into strips.
fn strips(b: f64, h: f64, x0: f64, y0: f64, cuts: &[f64], vertical: bool) -> String {
    let mut edges: Vec<f64> = cuts.to_vec();
    edges.push(0.0);
    edges.push(1.0);
    edges.sort_by(f64::total_cmp);
    edges.dedup();
    let mut t = String::from(HEAD);
    for w in edges.windows(2) {
        let (f0, f1) = (w[0], w[1]);
        let (px, py, pb, ph) = if vertical {
            (x0 + f0 * b, y0, (f1 - f0) * b, h)
        } else {
            (x0, y0 + f0 * h, b, (f1 - f0) * h)
        };
        t.push_str(&format!(
            "[[parts]]\nshape = \"rect\"\nb = {pb}\nh = {ph}\nanchor = \"bottom_left\"\nat = [{px}, {py}]\n"
        ));
    }
    t
}

fn same_properties(a: &Properties, b: &Properties, rel: f64) {
    let i = a.ixx.max(a.iyy);
    check("area", a.area, b.area, rel, 0.0);
    let size = a.area.sqrt();
    check("cx", a.centroid.x, b.centroid.x, rel, size);
    check("cy", a.centroid.y, b.centroid.y, rel, size);
    check("ixx", a.ixx, b.ixx, rel, i);
    check("iyy", a.iyy, b.iyy, rel, i);
    check("ixy", a.ixy, b.ixy, rel, i);
    let s = a.elastic.x_top.max(a.elastic.y_left);
    check("x_top", a.elastic.x_top, b.elastic.x_top, rel, s);
    check("x_bottom", a.elastic.x_bottom, b.elastic.x_bottom, rel, s);
    check("y_left", a.elastic.y_left, b.elastic.y_left, rel, s);
    check("y_right", a.elastic.y_right, b.elastic.y_right, rel, s);
}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(128))]

    /// The composite-area method: properties are additive integrals over disjoint parts,
    /// so cutting a rectangle into strips changes nothing (Gere & Goodno §12.3–12.5); the
    /// plastic modulus is `∫|y − c| dA`, additive too (Neal, ch. 1).
    #[test]
    fn strips_add_up_to_the_rectangle(
        b in 1.0..500.0f64, h in 1.0..500.0f64,
        x0 in -1e3..1e3f64, y0 in -1e3..1e3f64,
        cuts in prop::collection::vec(0.01..0.99f64, 1..5),
        vertical in any::<bool>(),
    ) {
        let whole = analyse(&strips(b, h, x0, y0, &[], vertical)).props;
        let cut = analyse(&strips(b, h, x0, y0, &cuts, vertical)).props;
        same_properties(&whole, &cut, 1e-9);
        let (pw, pc) = (whole.plastic.unwrap(), cut.plastic.unwrap());
        // Rectangle: Z = b h²/4 (Neal, The Plastic Methods of Structural Analysis).
        check("zx closed form", pw.zx, b * h * h / 4.0, 1e-9, 0.0);
        check("zx", pw.zx, pc.zx, 1e-9, 0.0);
        check("zy", pw.zy, pc.zy, 1e-9, 0.0);
        check("plastic y", pw.y, pc.y, 1e-9, h + y0.abs());
        check("plastic x", pw.x, pc.x, 1e-9, b + x0.abs());
    }

    /// Signed composition: a part plus the same part as a void is nothing, so
    /// `S + X − X` has the elastic properties of `S` (composite-area method with
    /// negative areas for holes, Gere & Goodno §12.3). X lies inside S's solid.
    #[test]
    fn a_part_and_its_void_cancel(
        s in shape_strategy(),
        at in (-100.0..100.0f64, -100.0..100.0f64),
        rot in -180.0..180.0f64,
        xd in 1.0..20.0f64,
        fx in 0.2..0.8f64, fy in 0.2..0.8f64,
    ) {
        // S: a block holding X, plus the random part beside it.
        let block = "[[parts]]\nshape = \"rect\"\nb = 100\nh = 80\nanchor = \"bottom_left\"\nat = [500, 0]\n";
        let x = format!("shape = \"circle\"\nd = {xd}\nat = [{}, {}]\n", 500.0 + 10.0 + fx * 80.0, 10.0 + fy * 60.0);
        let base = format!("{HEAD}{}{block}", part(&s, at, rot));
        let plus = format!("{base}[[parts]]\n{x}[[parts]]\n{x}void = true\n");
        let a = analyse(&base).props;
        let b = analyse(&plus).props;
        same_properties(&a, &b, 1e-9);
    }
}

/// A star-shaped polygon: radii at sorted angles around a centre.
fn star() -> impl Strategy<Value = (Vec<(f64, f64)>, bool)> {
    (
        prop::collection::vec((0.0..1.0f64, 1.0..100.0f64), 3..40),
        (-1e3..1e3f64, -1e3..1e3f64),
        any::<bool>(),
    )
        .prop_map(|(mut v, c, ccw)| {
            v.sort_by(|a, b| a.0.total_cmp(&b.0));
            v.dedup_by(|a, b| (a.0 - b.0).abs() < 1e-3);
            let mut pts: Vec<(f64, f64)> = v
                .iter()
                .map(|&(t, r)| {
                    let a = t * std::f64::consts::TAU;
                    (c.0 + r * a.cos(), c.1 + r * a.sin())
                })
                .collect();
            if !ccw {
                pts.reverse();
            }
            (pts, ccw)
        })
}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(192))]

    /// Area and centroid of a simple polygon agree with an independent implementation
    /// (the `geo` crate's shoelace area and centroid), for either winding
    /// (FORMAT.md: polygons may be given in either order).
    #[test]
    fn polygons_agree_with_geo((pts, _ccw) in star()) {
        prop_assume!(pts.len() >= 3);
        let ring: Vec<geo::Coord<f64>> = pts.iter().map(|&(x, y)| geo::Coord { x, y }).collect();
        let gp = geo::Polygon::new(geo::LineString::new(ring), vec![]);
        let ga = gp.unsigned_area();
        prop_assume!(ga > 1e-6);
        let list: Vec<String> = pts.iter().map(|(x, y)| format!("[{x}, {y}]")).collect();
        let text = format!("{HEAD}[[parts]]\nshape = \"polygon\"\npoints = [{}]\n", list.join(", "));
        let Ok(a) = kern::file::load::analyse(&text, &Options::default()) else {
            // Points from nearly equal angles can make a sliver that kern refuses as
            // crossing; geo does not check simplicity, so there is nothing to compare.
            return Ok(());
        };
        let gc = gp.centroid().unwrap();
        let size = ga.sqrt() + gc.x().abs() + gc.y().abs();
        prop_assert!(close(a.props.area, ga, 1e-9, 0.0), "{} vs {ga}", a.props.area);
        prop_assert!(close(a.props.centroid.x, gc.x(), 1e-9, size));
        prop_assert!(close(a.props.centroid.y, gc.y(), 1e-9, size));
    }

    /// The shape factor of a solid section is at least 1: `Z ≥ S_min = I / c_max`,
    /// since the fully plastic moment is the maximum over all stress distributions
    /// bounded by fy (Neal, The Plastic Methods of Structural Analysis, ch. 1). The
    /// plastic axis halves the area (Neal, ch. 1): checked by clipping the boundary,
    /// cut into fine chords, to the half-plane below (left of) the axis — an area by
    /// the shoelace formula, independent of the engine's exact arc integrals.
    #[test]
    fn plastic_moduli_exceed_elastic_and_halve_the_area(
        s in shape_strategy(),
        rot in -180.0..180.0f64,
    ) {
        let text = format!("{HEAD}{}", part(&s, (0.0, 0.0), rot));
        let a = analyse(&text);
        let p = &a.props;
        let z = p.plastic.unwrap();
        let sx = p.elastic.x_top.min(p.elastic.x_bottom);
        let sy = p.elastic.y_left.min(p.elastic.y_right);
        prop_assert!(z.zx >= sx * (1.0 - 1e-9), "Zx {} < Sx {sx}", z.zx);
        prop_assert!(z.zy >= sy * (1.0 - 1e-9), "Zy {} < Sy {sy}", z.zy);
        let loops: Vec<Vec<(f64, f64)>> = a
            .pieces
            .iter()
            .flat_map(|pc| pc.contours.iter())
            .map(|c| c.facets(1e-3).iter().map(|q| (q.x, q.y)).collect())
            .collect();
        let below: f64 = loops.iter().map(|l| clipped_area(l, |q| z.y - q.1)).sum();
        let left: f64 = loops.iter().map(|l| clipped_area(l, |q| z.x - q.0)).sum();
        // Chords of 1e-3 rad (the finest `facets` gives) miss about θ²/12 of each arc's
        // segment area, a few 1e-7 of the section: compare with 1e-6.
        let total: f64 = loops.iter().map(|l| clipped_area(l, |_| 1.0)).sum();
        check("half the area below the plastic axis", below / total, 0.5, 1e-6, 0.0);
        check("half the area left of the plastic axis", left / total, 0.5, 1e-6, 0.0);
    }
}

/// Signed area of the part of a polygon where `side(q) ≥ 0`, for a linear `side`
/// (Sutherland–Hodgman clipping against one half-plane; the shoelace formula). The
/// clipped loop may run along the cut line twice; that adds no area.
fn clipped_area(poly: &[(f64, f64)], side: impl Fn((f64, f64)) -> f64) -> f64 {
    let mut out: Vec<(f64, f64)> = Vec::new();
    for (i, &a) in poly.iter().enumerate() {
        let b = poly[(i + 1) % poly.len()];
        let (sa, sb) = (side(a), side(b));
        if sa >= 0.0 {
            out.push(a);
        }
        if (sa >= 0.0) != (sb >= 0.0) {
            let t = sa / (sa - sb);
            out.push((a.0 + t * (b.0 - a.0), a.1 + t * (b.1 - a.1)));
        }
    }
    let n = out.len();
    (0..n)
        .map(|i| {
            let (a, b) = (out[i], out[(i + 1) % n]);
            a.0 * b.1 - b.0 * a.1
        })
        .sum::<f64>()
        / 2.0
}
