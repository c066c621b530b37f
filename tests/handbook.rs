//! Section properties against published closed forms and rolled-section tables.
//!
//! Each check names its source. Table values are quoted to the figures the tables
//! print, so the tolerance is half a unit in the last printed digit or a little more.

use kern::analysis::{Analysis, Options};
use std::f64::consts::PI;

fn calc(body: &str) -> Analysis {
    let text = format!("format = 1\nunits = \"mm\"\n{body}");
    match kern::file::load::analyse(&text, &Options::default()) {
        Ok(a) => a,
        Err(d) => panic!("{}: {}", d.message, text),
    }
}

#[track_caller]
fn close(got: f64, want: f64, rel: f64) {
    let err = (got - want).abs() / want.abs().max(1e-300);
    assert!(
        err <= rel,
        "got {got}, want {want} (relative error {err:.2e} > {rel:.0e})"
    );
}

#[track_caller]
fn small(got: f64, scale: f64) {
    assert!(
        got.abs() <= 1e-12 * scale,
        "got {got}, expected 0 (scale {scale})"
    );
}

// --- Closed forms for every shape -------------------------------------------------
// Gere & Goodno, Mechanics of Materials (any recent edition), Appendix E, "Properties
// of plane areas"; Beer & Johnston, Mechanics of Materials, inside back cover.

#[test]
fn rectangle_about_centroid_and_base() {
    // I = bh³/12 about the centroid; bh³/3 about the base (Gere & Goodno, App. E case 1).
    let (b, h) = (120.0, 300.0);
    let a = calc("[[parts]]\nshape = \"rect\"\nb = 120\nh = 300\nanchor = \"bottom_left\"");
    close(a.props.area, b * h, 1e-14);
    close(a.props.ixx, b * h.powi(3) / 12.0, 1e-12);
    close(a.props.iyy, h * b.powi(3) / 12.0, 1e-12);
    small(a.props.ixy, a.props.ixx);
    // Parallel axis theorem: I_base = I_c + A·ȳ² (Gere & Goodno §12.5).
    close(
        a.props.ixx + a.props.area * a.props.centroid.y.powi(2),
        b * h.powi(3) / 3.0,
        1e-12,
    );
    close(a.props.elastic.x_top, b * h * h / 6.0, 1e-12);
    // Z = bh²/4 (Neal, The Plastic Methods of Structural Analysis, §1.3).
    let z = a.props.plastic.unwrap();
    close(z.zx, b * h * h / 4.0, 1e-12);
    close(z.y, h / 2.0, 1e-12);
    close(a.props.gyration.x, h / 12f64.sqrt(), 1e-12);
}

#[test]
fn triangle_with_apex_anywhere() {
    // Ix = bh³/36, Iy = bh(b² − bc + c²)/36 with the apex at c (Gere & Goodno, App. E
    // case 7); a right triangle (c = 0) has Ixy = −b²h²/72 about its centroid (case 6).
    let (b, h) = (90.0, 60.0);
    for c in [0.0, 30.0, 45.0, 130.0, -20.0] {
        let a = calc(&format!(
            "[[parts]]\nshape = \"triangle\"\nb = {b}\nh = {h}\napex = {c}"
        ));
        close(a.props.area, b * h / 2.0, 1e-13);
        close(a.props.ixx, b * h.powi(3) / 36.0, 1e-12);
        close(a.props.iyy, b * h * (b * b - b * c + c * c) / 36.0, 1e-12);
        // The general product follows from the case-6 value by a shear of the triangle:
        // Ixy = bh²(2c − b)/72 (derived; it gives −b²h²/72 at c = 0 and 0 at c = b/2).
        let ixy = b * h * h * (2.0 * c - b) / 72.0;
        assert!(
            (a.props.ixy - ixy).abs() <= 1e-12 * a.props.ixx,
            "c = {c}: {} vs {ixy}",
            a.props.ixy
        );
    }
}

#[test]
fn circle_half_and_quarter_circle() {
    let d: f64 = 80.0;
    let r = d / 2.0;
    // Circle: A = πd²/4, I = πd⁴/64 (App. E case 9); Z = d³/6, S = πd³/32.
    let a = calc("[[parts]]\nshape = \"circle\"\nd = 80\nat = [300, -200]");
    close(a.props.area, PI * d * d / 4.0, 1e-13);
    close(a.props.ixx, PI * d.powi(4) / 64.0, 1e-12);
    close(a.props.iyy, PI * d.powi(4) / 64.0, 1e-12);
    close(a.props.elastic.x_top, PI * d.powi(3) / 32.0, 1e-12);
    close(a.props.plastic.unwrap().zx, d.powi(3) / 6.0, 1e-10);
    close(a.props.centroid.x, 300.0, 1e-14);
    // Half circle, flat side down: ȳ = 4r/3π, Ix = (π/8 − 8/9π)r⁴, Iy = πr⁴/8 (case 10).
    let a = calc("[[parts]]\nshape = \"half_circle\"\nd = 80\nanchor = \"bottom_left\"");
    close(a.props.area, PI * r * r / 2.0, 1e-13);
    close(a.props.centroid.y, 4.0 * r / (3.0 * PI), 1e-12);
    close(
        a.props.ixx,
        (PI / 8.0 - 8.0 / (9.0 * PI)) * r.powi(4),
        1e-11,
    );
    close(a.props.iyy, PI * r.powi(4) / 8.0, 1e-12);
    // Quarter circle at the origin: x̄ = ȳ = 4r/3π, Ix = (π/16 − 4/9π)r⁴, and about the
    // corner axes Ixy = r⁴/8, so about the centroid (1/8 − 4/9π)r⁴ (case 12).
    let a = calc("[[parts]]\nshape = \"quarter_circle\"\nr = 40\nanchor = \"origin\"");
    close(a.props.area, PI * r * r / 4.0, 1e-13);
    close(a.props.centroid.x, 4.0 * r / (3.0 * PI), 1e-12);
    close(
        a.props.ixx,
        (PI / 16.0 - 4.0 / (9.0 * PI)) * r.powi(4),
        1e-11,
    );
    close(
        a.props.ixy,
        (1.0 / 8.0 - 4.0 / (9.0 * PI)) * r.powi(4),
        1e-10,
    );
    // Ixy < 0 about the centroid puts the major axis on the diagonal, at +45°.
    close(a.props.principal.angle_deg, 45.0, 1e-12);
}

#[test]
fn hollow_circle_and_hollow_rectangle() {
    // Tube: I = π(D⁴ − d⁴)/64 (App. E case 9 by subtraction); box: (BH³ − bh³)/12.
    let a = calc("[[parts]]\nshape = \"pipe\"\nd = 168.3\nt = 7.1");
    let (dd, di) = (168.3f64, 168.3 - 14.2);
    close(a.props.area, PI * (dd * dd - di * di) / 4.0, 1e-12);
    close(a.props.ixx, PI * (dd.powi(4) - di.powi(4)) / 64.0, 1e-11);
    let a = calc("[[parts]]\nshape = \"box\"\nh = 200\nb = 100\nt = 10");
    close(
        a.props.ixx,
        (100.0 * 200f64.powi(3) - 80.0 * 180f64.powi(3)) / 12.0,
        1e-12,
    );
    close(
        a.props.iyy,
        (200.0 * 100f64.powi(3) - 180.0 * 80f64.powi(3)) / 12.0,
        1e-12,
    );
    // The same hollow rectangle as a solid with a void gives the same numbers.
    let b = calc("[[parts]]\nshape = \"rect\"\nb = 100\nh = 200\n[[parts]]\nshape = \"rect\"\nb = 80\nh = 180\nvoid = true");
    close(b.props.ixx, a.props.ixx, 1e-13);
    close(
        b.props.plastic.unwrap().zx,
        a.props.plastic.unwrap().zx,
        1e-10,
    );
    // Z of a box = BH²/4 − bh²/4 (Neal §1.3, by subtraction).
    close(
        a.props.plastic.unwrap().zx,
        (100.0 * 200f64.powi(2) - 80.0 * 180f64.powi(2)) / 4.0,
        1e-10,
    );
}

#[test]
fn box_with_rounded_corners_by_hand_composite() {
    // Outer b×h with corner radius R = a central cross of rectangles plus four quarter
    // circles (App. E cases 1 and 12, parallel axis theorem); inner likewise with
    // radius R − t. Computed by hand here, independently of the arc integrals.
    let rounded = |b: f64, h: f64, r: f64| -> (f64, f64) {
        let c = 4.0 * r / (3.0 * PI);
        let aq = PI * r * r / 4.0;
        let iq = (PI / 16.0 - 4.0 / (9.0 * PI)) * r.powi(4);
        let yq = h / 2.0 - r + c;
        let area = b * (h - 2.0 * r) + 2.0 * (b - 2.0 * r) * r + 4.0 * aq;
        let ix = b * (h - 2.0 * r).powi(3) / 12.0
            + 2.0
                * ((b - 2.0 * r) * r.powi(3) / 12.0
                    + (b - 2.0 * r) * r * (h / 2.0 - r / 2.0).powi(2))
            + 4.0 * (iq + aq * yq * yq);
        (area, ix)
    };
    let (b, h, t, ro) = (150.0, 250.0, 8.0, 16.0);
    let (ao, io) = rounded(b, h, ro);
    let (ai, ii) = rounded(b - 2.0 * t, h - 2.0 * t, ro - t);
    let a = calc("[[parts]]\nshape = \"box\"\nh = 250\nb = 150\nt = 8\nro = 16");
    close(a.props.area, ao - ai, 1e-12);
    close(a.props.ixx, io - ii, 1e-11);
}

#[test]
fn parallel_axis_theorem_for_a_tee_of_two_plates() {
    // Flange 200×20 on a 10×180 stem: ȳ = ΣAy/ΣA, I = Σ(I_own + A·d²) (Gere & Goodno
    // §12.5, worked by hand here).
    let a = calc(
        "[[parts]]\nshape = \"rect\"\nb = 200\nh = 20\nanchor = \"bottom\"\nat = [0, 180]\n\
         [[parts]]\nshape = \"rect\"\nb = 10\nh = 180\nanchor = \"bottom\"",
    );
    let (a1, y1, i1) = (4000.0, 190.0, 200.0 * 20f64.powi(3) / 12.0);
    let (a2, y2, i2) = (1800.0, 90.0, 10.0 * 180f64.powi(3) / 12.0);
    let yb = (a1 * y1 + a2 * y2) / (a1 + a2);
    close(a.props.centroid.y, yb, 1e-13);
    close(
        a.props.ixx,
        i1 + a1 * (y1 - yb).powi(2) + i2 + a2 * (y2 - yb).powi(2),
        1e-12,
    );
    // Plastic axis: half the area (2900) above; the flange alone has 4000, so the axis
    // is in the flange at 200 − 2900/200 = 185.5; Z = Σ A_i·|y_i − y_p|.
    let z = a.props.plastic.unwrap();
    close(z.y, 185.5, 1e-12);
    let zx = 200.0 * 14.5 * 14.5 / 2.0 + 200.0 * 5.5 * 5.5 / 2.0 + 1800.0 * (185.5 - 90.0);
    close(z.zx, zx, 1e-12);
}

#[test]
fn tee_shape_matches_its_plates_and_fillets() {
    // The `tee` shape equals the flange and stem plates it is made of (Gere & Goodno
    // §12.5); with root fillets it gains two spandrels of (1 − π/4)r² each, whose
    // centroid lies (10 − 3π)r/(12 − 3π) from the square's corner along each leg (the
    // complement of App. E case 12 within its square).
    let plates = calc(
        "[[parts]]\nshape = \"rect\"\nb = 200\nh = 20\nanchor = \"bottom\"\nat = [0, 180]\n\
         [[parts]]\nshape = \"rect\"\nb = 10\nh = 180\nanchor = \"bottom\"",
    );
    let tee =
        calc("[[parts]]\nshape = \"tee\"\nd = 200\nb = 200\ntf = 20\ntw = 10\nanchor = \"bottom\"");
    close(tee.props.area, plates.props.area, 1e-14);
    close(tee.props.centroid.y, plates.props.centroid.y, 1e-13);
    close(tee.props.ixx, plates.props.ixx, 1e-12);
    close(tee.props.iyy, plates.props.iyy, 1e-12);
    close(
        tee.props.plastic.unwrap().zx,
        plates.props.plastic.unwrap().zx,
        1e-10,
    );
    let r: f64 = 12.0;
    let f = calc("[[parts]]\nshape = \"tee\"\nd = 200\nb = 200\ntf = 20\ntw = 10\nr = 12\nanchor = \"bottom\"");
    let spandrel = (1.0 - PI / 4.0) * r * r;
    close(f.props.area, plates.props.area + 2.0 * spandrel, 1e-13);
    // First moment about the base: the spandrels sit under the flange, their centroid
    // e = (10 − 3π)r/(12 − 3π) below its underside.
    let e = (10.0 - 3.0 * PI) * r / (12.0 - 3.0 * PI);
    let q = plates.props.area * plates.props.centroid.y + 2.0 * spandrel * (180.0 - e);
    close(f.props.centroid.y, q / f.props.area, 1e-12);
}

#[test]
fn transformed_section_with_modular_ratio() {
    // Flitch beam: timber 2×(75×300) with a 10×300 steel plate, n = 210/11; the
    // transformed area is A_t + n·A_s and I = I_t + n·I_s (Gere & Goodno §6.3).
    let a = calc(
        "[[materials]]\nname = \"timber\"\nE = \"11 GPa\"\n[[materials]]\nname = \"steel\"\nE = \"210 GPa\"\n\
         [[parts]]\nshape = \"rect\"\nb = 150\nh = 300\nmaterial = \"timber\"\n\
         [[parts]]\nshape = \"rect\"\nb = 10\nh = 300\nanchor = \"left\"\nat = [75, 0]\nmaterial = \"steel\"",
    );
    let n = 210.0 / 11.0;
    close(a.props.area, 150.0 * 300.0 + n * 3000.0, 1e-13);
    let ybar_x = (n * 3000.0 * 80.0) / (45000.0 + n * 3000.0);
    close(a.props.centroid.x, ybar_x, 1e-12);
    close(
        a.props.ixx,
        (150.0 + n * 10.0) * 300f64.powi(3) / 12.0,
        1e-12,
    );
}

#[test]
fn plate_with_bolt_holes_net_section() {
    // A 200×12 plate with two 22 mm holes through its thickness (a net section across
    // the bolts): A_net = A_gross − Σ d·t (AISC 360 §B4.3 / EN 1993-1-1 §6.2.2.2).
    let a = calc(
        "[[parts]]\nshape = \"rect\"\nb = 200\nh = 12\n\
         [[parts]]\nshape = \"rect\"\nb = 22\nh = 12\nat = [-50, 0]\nvoid = true\n\
         [[parts]]\nshape = \"rect\"\nb = 22\nh = 12\nat = [50, 0]\nvoid = true",
    );
    close(a.props.area, 200.0 * 12.0 - 2.0 * 22.0 * 12.0, 1e-13);
    close(
        a.props.iyy,
        12.0 * 200f64.powi(3) / 12.0 - 2.0 * (12.0 * 22f64.powi(3) / 12.0 + 264.0 * 2500.0),
        1e-12,
    );
    assert!(a.warnings.is_empty(), "{:?}", a.warnings);
}

// --- Rolled sections with root fillets ---------------------------------------------
// Values from the European section tables (ArcelorMittal, "Sales programme: sections
// and merchant bars", IPE and UPE series; EN 10365 dimensions), quoted from memory and
// confirmed by their agreement with the exact geometry to the printed figures.

#[test]
fn ipe_300_matches_the_table() {
    let a = calc("[[parts]]\nshape = \"ibeam\"\nd = 300\nb = 150\ntf = 10.7\ntw = 7.1\nr = 15");
    let p = &a.props;
    close(p.area / 1e2, 53.81, 2e-4); // cm²
    close(p.ixx / 1e4, 8356.0, 1e-4); // Iy, cm⁴
    close(p.iyy / 1e4, 603.8, 2e-4); // Iz, cm⁴
    close(p.elastic.x_top / 1e3, 557.1, 2e-4); // Wel,y, cm³
    close(p.plastic.unwrap().zx / 1e3, 628.4, 2e-4); // Wpl,y, cm³
    close(p.plastic.unwrap().zy / 1e3, 125.2, 4e-4); // Wpl,z, cm³
    close(p.gyration.x / 10.0, 12.46, 4e-4); // iy, cm
    close(p.gyration.y / 10.0, 3.35, 2e-3); // iz, cm
}

#[test]
fn ipe_200_matches_the_table() {
    let a = calc("[[parts]]\nshape = \"ibeam\"\nd = 200\nb = 100\ntf = 8.5\ntw = 5.6\nr = 12");
    let p = &a.props;
    close(p.area / 1e2, 28.48, 2e-4);
    close(p.ixx / 1e4, 1943.0, 3e-4);
    close(p.iyy / 1e4, 142.4, 4e-4);
    close(p.elastic.x_top / 1e3, 194.3, 3e-4);
    close(p.plastic.unwrap().zx / 1e3, 220.6, 3e-4);
    close(p.plastic.unwrap().zy / 1e3, 44.61, 3e-4);
}

#[test]
fn upe_200_channel_matches_the_table() {
    // UPE 200 (parallel flanges): A = 29.0 cm², Iy = 1910 cm⁴, Iz = 187 cm⁴.
    let a = calc("[[parts]]\nshape = \"channel\"\nd = 200\nb = 80\ntf = 11\ntw = 6\nr = 13");
    let p = &a.props;
    close(p.area / 1e2, 29.0, 2e-3);
    close(p.ixx / 1e4, 1910.0, 2e-3);
    close(p.iyy / 1e4, 187.0, 3e-3);
}

#[test]
fn equal_angle_100x100x10_with_toe_radii_matches_the_table() {
    // L 100×100×10, root radius 12, toe radius 6 (EN 10056-1): A = 19.2 cm²,
    // Iy = Iz = 177 cm⁴, centroid 2.82 cm from the heel, Iu = 281 cm⁴, Iv = 72.7 cm⁴
    // (ArcelorMittal tables, from memory). The toe rounding is modelled exactly: a
    // square void at each toe with a quarter circle put back.
    let toe = |x: f64, y: f64| {
        format!(
            "[[parts]]\nshape = \"rect\"\nb = 6\nh = 6\nanchor = \"top_right\"\nat = [{x}, {y}]\nvoid = true\n\
             [[parts]]\nshape = \"quarter_circle\"\nr = 6\nanchor = \"origin\"\nat = [{}, {}]\n",
            x - 6.0,
            y - 6.0
        )
    };
    let body = format!(
        "[[parts]]\nshape = \"angle\"\nh = 100\nb = 100\nt = 10\nr = 12\nanchor = \"origin\"\n{}{}",
        toe(100.0, 10.0),
        toe(10.0, 100.0)
    );
    let a = calc(&body);
    let p = &a.props;
    close(p.area / 1e2, 19.2, 3e-3);
    close(p.ixx / 1e4, 177.0, 3e-3);
    close(p.centroid.x / 10.0, 2.82, 2e-3);
    close(p.principal.i1 / 1e4, 281.0, 3e-3);
    close(p.principal.i2 / 1e4, 72.7, 5e-3);
    close(p.principal.angle_deg, 45.0, 1e-12);
}

#[test]
fn unequal_angle_principal_axes_match_the_table() {
    // L6×4×1/2 (AISC Steel Construction Manual, 15th ed., Table 1-7, from memory):
    // Ix = 17.4 in⁴, Iy = 6.27 in⁴, tan α = 0.440, rz = 0.864 in. AISC's shapes have
    // rounded toes that kern's `angle` omits, hence a tolerance near 1.5%.
    let text =
        "format = 1\nunits = \"in\"\n[[parts]]\nshape = \"angle\"\nh = 6\nb = 4\nt = 0.5\nr = 0.5";
    let a = kern::file::load::analyse(text, &Options::default()).unwrap();
    let p = &a.props;
    close(p.ixx, 17.4, 1e-2);
    close(p.iyy, 6.27, 1e-2);
    // The minor principal axis is at α from the y axis: the major axis at α from x,
    // tilted clockwise for a long leg along +y and short leg along +x.
    let alpha = p.principal.angle_deg.to_radians();
    close(alpha.tan(), 0.440, 1.5e-2);
    close(p.gyration.min, 0.864, 1.5e-2);
}

// --- Torsion of rolled sections -------------------------------------------------------
// It and Iw from the European section tables (ArcelorMittal sales programme), quoted
// from memory. The tables take It from an approximate fillet formula and Iw from thin-
// walled theory, Iz·(h − tf)²/4; kern solves the real region by finite elements, which
// lands within about 3% of both.

fn torsion_of(body: &str) -> kern::fe::Torsion {
    let text = format!("format = 1\nunits = \"mm\"\n{body}");
    let opts = Options {
        torsion: Some(kern::fe::TorsionOptions::default()),
        ..Options::default()
    };
    match kern::file::load::analyse(&text, &opts).map(|a| a.torsion) {
        Ok(Some(Ok(t))) => t,
        other => panic!("no torsion: {other:?}"),
    }
}

#[test]
fn rolled_i_sections_torsion_and_warping_constants() {
    // (d, b, tf, tw, r, It cm⁴, Iw 10³ cm⁶)
    let table = [
        ("IPE 200", 200.0, 100.0, 8.5, 5.6, 12.0, 6.98, 12.99),
        ("IPE 300", 300.0, 150.0, 10.7, 7.1, 15.0, 20.12, 125.9),
        ("HEA 200", 190.0, 200.0, 10.0, 6.5, 18.0, 20.98, 108.0),
    ];
    for (name, d, b, tf, tw, r, it, iw) in table {
        let t = torsion_of(&format!(
            "[[parts]]\nshape = \"ibeam\"\nd = {d}\nb = {b}\ntf = {tf}\ntw = {tw}\nr = {r}"
        ));
        assert!(t.rel_error <= 1e-3, "{name}: {}", t.rel_error);
        let (j, cw) = (t.j / 1e4, t.cw / 1e9);
        assert!((j - it).abs() / it < 0.03, "{name}: J = {j} cm⁴ vs {it}");
        assert!(
            (cw - iw).abs() / iw < 0.03,
            "{name}: Cw = {cw}e3 cm⁶ vs {iw}e3"
        );
        // Doubly symmetric: the shear centre is the centroid.
        assert!(t.shear_centre.x.abs() < 1e-4 * d && t.shear_centre.y.abs() < 1e-4 * d);
    }
}

#[test]
fn zed_against_its_three_rectangles_and_fillet_spandrels() {
    // Sharp zed, d × b with flanges tf and web tw, in its own frame: the web over the
    // full depth and two flange outstands o = b − tw wide. The centroid is the centre of
    // symmetry (b − tw/2, d/2); each outstand's centroid sits (±b/2, ±(d − tf)/2) from
    // it (the top one up and to +x, the bottom one down and to −x). Parallel axis
    // theorem over the three rectangles (Gere & Goodno, Mechanics of Materials, §12.5
    // and §12.7 for the product of inertia):
    //   A   = tw·d + 2·o·tf
    //   Ixx = tw·d³/12 + 2·(o·tf³/12 + o·tf·((d − tf)/2)²)
    //   Iyy = d·tw³/12 + 2·(tf·o³/12 + o·tf·(b/2)²)
    //   Ixy = 2·o·tf·(b/2)·((d − tf)/2)      (the web adds nothing)
    // and the principal axis from tan 2θ = −2Ixy/(Ixx − Iyy) (ibid. §12.8).
    let (d, b, tf, tw): (f64, f64, f64, f64) = (200.0, 75.0, 8.0, 6.0);
    let o = b - tw;
    let z = calc(&format!(
        "[[parts]]\nshape = \"zed\"\nd = {d}\nb = {b}\ntf = {tf}\ntw = {tw}\nanchor = \"origin\""
    ));
    let p = &z.props;
    let area = tw * d + 2.0 * o * tf;
    let (dy, dx) = ((d - tf) / 2.0, b / 2.0);
    let ixx = tw * d.powi(3) / 12.0 + 2.0 * (o * tf.powi(3) / 12.0 + o * tf * dy * dy);
    let iyy = d * tw.powi(3) / 12.0 + 2.0 * (tf * o.powi(3) / 12.0 + o * tf * dx * dx);
    let ixy = 2.0 * o * tf * dx * dy;
    close(p.area, area, 1e-14);
    close(p.centroid.x, b - tw / 2.0, 1e-13);
    close(p.centroid.y, d / 2.0, 1e-13);
    close(p.ixx, ixx, 1e-12);
    close(p.iyy, iyy, 1e-12);
    close(p.ixy, ixy, 1e-12);
    let theta = (-2.0 * ixy).atan2(ixx - iyy).to_degrees() / 2.0;
    assert!(
        theta < 0.0,
        "the top flange points to +x, so the major axis turns clockwise"
    );
    close(p.principal.angle_deg, theta, 1e-11);

    // With root fillets r the zed gains a spandrel (a square r × r less a quarter
    // circle) in each inside corner; the two are symmetric through the centroid, so it
    // stays put and each adds the same to Ixx, Iyy and Ixy. In a spandrel's own
    // coordinates u, v ≥ 0 measured from its corner away from the flange and the web
    // (square minus quarter disc; quarter-disc moments from Gere & Goodno App. E
    // case 10): ∫dA = (1 − π/4)r², ∫u dA = ∫v dA = (5/6 − π/4)r³,
    // ∫u² dA = ∫v² dA = (1 − 5π/16)r⁴, ∫uv dA = (19/24 − π/4)r⁴. The top corner is
    // at (b, d − tf), with u along +x and v along −y.
    let r: f64 = 10.0;
    let f = calc(&format!(
        "[[parts]]\nshape = \"zed\"\nd = {d}\nb = {b}\ntf = {tf}\ntw = {tw}\nr = {r}\nanchor = \"origin\""
    ));
    let (a_s, s1) = ((1.0 - PI / 4.0) * r * r, (5.0 / 6.0 - PI / 4.0) * r.powi(3));
    let (s2, suv) = (
        (1.0 - 5.0 * PI / 16.0) * r.powi(4),
        (19.0 / 24.0 - PI / 4.0) * r.powi(4),
    );
    let (cx, cy) = (b - tw / 2.0, d / 2.0);
    let (ex, ey) = (b - cx, d - tf - cy);
    let sxx = a_s * ey * ey - 2.0 * ey * s1 + s2;
    let syy = a_s * ex * ex + 2.0 * ex * s1 + s2;
    let sxy = a_s * ex * ey + ey * s1 - ex * s1 - suv;
    let q = &f.props;
    close(q.area, area + 2.0 * a_s, 1e-13);
    close(q.centroid.x, cx, 1e-13);
    close(q.centroid.y, cy, 1e-13);
    close(q.ixx, ixx + 2.0 * sxx, 1e-12);
    close(q.iyy, iyy + 2.0 * syy, 1e-12);
    close(q.ixy, ixy + 2.0 * sxy, 1e-12);
    let theta = (-2.0 * q.ixy).atan2(q.ixx - q.iyy).to_degrees() / 2.0;
    close(q.principal.angle_deg, theta, 1e-11);
}

// --- Moduli about the principal axes ------------------------------------------------
// In the principal frame the product of inertia vanishes and the flexure formula is
// σ = M·v/I about each axis (Gere & Goodno, Mechanics of Materials, §6.5), so the
// modulus to a fibre is I/(its distance from the axis); the distances below are
// derived by hand from the outline.

#[test]
fn principal_moduli_of_a_rotated_rectangle() {
    // b = 200, h = 100 turned 30°: the principal axes turn with it, I1 = h·b³/12 about
    // the axis across the long side (at 120°, reported as −60°), the extreme fibres at
    // b/2 from it; I2 = b·h³/12 with fibres at h/2. So S1 = h·b²/6 and S2 = b·h²/6 on
    // either side.
    let a = calc("[[parts]]\nshape = \"rect\"\nb = 200\nh = 100\nrotate = 30\n");
    let p = &a.props;
    close(p.principal.angle_deg, -60.0, 1e-12);
    let s = p.principal_elastic.expect("inclined axes");
    for (got, want) in [
        (s.s1_pos, 100.0 * 200.0 * 200.0 / 6.0),
        (s.s1_neg, 100.0 * 200.0 * 200.0 / 6.0),
        (s.s2_pos, 200.0 * 100.0 * 100.0 / 6.0),
        (s.s2_neg, 200.0 * 100.0 * 100.0 / 6.0),
    ] {
        close(got, want, 1e-12);
    }
    // Not turned: the principal axes are x and y, and the moduli are Sx and Sy.
    let a = calc("[[parts]]\nshape = \"rect\"\nb = 200\nh = 100\n");
    assert!(a.props.principal_elastic.is_none());
}

#[test]
fn principal_moduli_of_an_equal_angle() {
    // L 100×100×10 without a root radius. The centroid is at c = (b² + bt − t²)/(2(2b − t))
    // from each back (first moments of the two legs). Axis 1 is the axis of symmetry
    // (45°): Ixy < 0, so I(45°) = avg + |Ixy| is the largest. With u along 45° and v
    // along 135° from the centroid, the toes (b, 0) and (0, b) are at v = ∓b/√2, the
    // heel at u = −√2·c and the toe tips (b, t), (t, b) at u = (b + t − 2c)/√2.
    let (b, t) = (100.0_f64, 10.0_f64);
    let a = calc(&format!(
        "[[parts]]\nshape = \"angle\"\nh = {b}\nb = {b}\nt = {t}\nanchor = \"origin\"\n"
    ));
    let p = &a.props;
    close(p.principal.angle_deg, 45.0, 1e-12);
    let c = (b * b + b * t - t * t) / (2.0 * (2.0 * b - t));
    close(p.centroid.x, c, 1e-12);
    let s = p.principal_elastic.expect("inclined axes");
    let r2 = 2f64.sqrt();
    close(s.s1_pos, p.principal.i1 / (b / r2), 1e-12);
    close(s.s1_neg, p.principal.i1 / (b / r2), 1e-12);
    close(s.s2_pos, p.principal.i2 / ((b + t - 2.0 * c) / r2), 1e-12);
    close(s.s2_neg, p.principal.i2 / (r2 * c), 1e-12);
}
