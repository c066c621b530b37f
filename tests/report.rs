//! The calculation sheet (`kern report`), its HTML page and the drawing (`kern svg`):
//! snapshots of two sections, the composite-area table's own check, and the caution.

use kern::analysis::{Analysis, Options};
use kern::report::composite::{terms, totals};
use kern::report::out::OutUnits;
use kern::report::{html, markdown, svg, CAUTION};

/// The two sections: the mezzanine girder (three plates) and a lintel with two round
/// cores (voids with arcs) and a disabled part.
const FILES: [&str; 2] = [
    "sections/mezzanine-girder.toml",
    "tests/fixtures/cored-lintel.toml",
];

/// Analysed without the torsion solve, so every output is deterministic.
fn analyse(file: &str) -> Analysis {
    let path = std::path::Path::new(env!("CARGO_MANIFEST_DIR")).join(file);
    let text = std::fs::read_to_string(&path).expect("fixture readable");
    kern::file::load::analyse(&text, &Options::default()).expect("fixture valid")
}

fn units(a: &Analysis) -> OutUnits {
    OutUnits::new(a.section.units, None)
}

/// The sheet with the version redacted, so snapshots survive a release.
fn sheet(file: &str, a: &Analysis) -> String {
    markdown::sheet(file, a, &units(a)).replace(env!("CARGO_PKG_VERSION"), "[version]")
}

fn snap_name(file: &str) -> String {
    std::path::Path::new(file)
        .file_stem()
        .map(|s| s.to_string_lossy().into_owned())
        .unwrap_or_default()
}

#[test]
fn markdown_sheets() {
    for f in FILES {
        let a = analyse(f);
        insta::assert_snapshot!(format!("{}.md", snap_name(f)), sheet(f, &a));
    }
}

#[test]
fn svg_drawings() {
    for f in FILES {
        let a = analyse(f);
        insta::assert_snapshot!(
            format!("{}.svg", snap_name(f)),
            svg::drawing(&a, &units(&a))
        );
    }
}

#[test]
fn composite_table_sums_to_the_section_second_moments() {
    // Parallel axis theorem, I = Σ(I_own + A·d²) (Gere & Goodno, Mechanics of Materials,
    // §12.5); the section's own values come from the boundary integrals in `props`.
    for f in FILES {
        let a = analyse(f);
        let t = totals(&terms(&a));
        let rel = |x: f64, y: f64| (x - y).abs() / y.abs();
        assert!(
            rel(t.ixx(), a.props.ixx) < 1e-9,
            "{f}: Ixx {} vs {}",
            t.ixx(),
            a.props.ixx
        );
        assert!(
            rel(t.iyy(), a.props.iyy) < 1e-9,
            "{f}: Iyy {} vs {}",
            t.iyy(),
            a.props.iyy
        );
        assert!(rel(t.a, a.props.area) < 1e-12, "{f}: A");
        assert!(rel(t.ay / t.a, a.props.centroid.y) < 1e-12, "{f}: ȳ");
    }
}

#[test]
fn lintel_cores_by_hand() {
    // Rectangle b·h³/12 and circle πd⁴/64 about their own centroids (Gere & Goodno,
    // Mechanics of Materials, Appendix E, cases 1 and 9), combined by hand.
    let a = analyse(FILES[1]);
    let (b, h, d, yc) = (240.0_f64, 300.0_f64, 80.0_f64, 110.0_f64);
    let pi = std::f64::consts::PI;
    let (ar, ac) = (b * h, pi * d * d / 4.0);
    let area = ar - 2.0 * ac;
    let ybar = (ar * h / 2.0 - 2.0 * ac * yc) / area;
    let ixx = b * h.powi(3) / 12.0 + ar * (h / 2.0 - ybar).powi(2)
        - 2.0 * (pi * d.powi(4) / 64.0 + ac * (yc - ybar).powi(2));
    let t = totals(&terms(&a));
    assert!((t.a - area).abs() < 1e-9 * area);
    assert!((t.ixx() - ixx).abs() < 1e-9 * ixx);
}

#[test]
fn the_caution_is_in_every_output() {
    for f in FILES {
        let a = analyse(f);
        let u = units(&a);
        let md = markdown::sheet(f, &a, &u);
        let drawing = svg::drawing(&a, &u);
        let page = html::page("t", &md, &drawing);
        assert_eq!(
            md.matches(CAUTION).count(),
            2,
            "{f}: top and bottom of the sheet"
        );
        assert!(drawing.contains(CAUTION), "{f}: svg");
        // Once in the drawing, twice in the sheet around it.
        assert_eq!(page.matches(CAUTION).count(), 3, "{f}: html");
        assert!(page.contains("<svg") && !page.contains(markdown::DRAWING_MARK));
    }
}

/// Raw HTML in names and the title (tests/hostile/html-in-names.toml) stays text: the
/// sheet has no tag from the file, and the page shows the names escaped.
#[test]
fn names_cannot_inject_html() {
    let file = "tests/hostile/html-in-names.toml";
    let a = analyse(file);
    let u = units(&a);
    let md = markdown::sheet(file, &a, &u);
    for tag in ["<script", "<img"] {
        assert!(!md.contains(tag), "sheet holds {tag}:\n{md}");
    }
    assert!(md.contains("&lt;script&gt;alert(3)&lt;/script&gt;"), "{md}");
    // A `|` in a name is escaped, so table rows keep their column count.
    assert!(md.contains("a \\| b \\*\\* c"), "{md}");
    let page = html::page("t", &md, &svg::drawing(&a, &u));
    assert!(
        !page.contains("<script") && !page.contains("<img"),
        "{page}"
    );
    assert!(page.contains("&lt;script&gt;alert(3)&lt;/script&gt;"));
    assert!(
        page.contains("a | b ** c"),
        "the page shows the name as written"
    );
}

/// XML 1.0 (W3C, 5th edition, section 2.2) allows no C0 control but tab, LF and CR,
/// not even as a reference: the drawing of tests/hostile/control-chars-in-names.toml
/// holds none.
#[test]
fn the_drawing_has_no_control_characters() {
    let a = analyse("tests/hostile/control-chars-in-names.toml");
    let s = svg::drawing(&a, &units(&a));
    assert!(!s.chars().any(|c| c.is_control() && c != '\n' && c != '\t'));
    assert!(!s.contains("&#1;") && !s.contains("&#x1;"));
    assert!(s.contains("mezzanine  edge"), "the title is kept, cleaned");
}
