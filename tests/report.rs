//! The calculation sheet (`kern report`), its HTML page and the drawing (`kern svg`):
//! snapshots of two sections, the composite-area table's own check, and the caution.

use kern::analysis::{Analysis, Options};
use kern::report::composite::{terms, totals};
use kern::report::out::OutUnits;
use kern::report::{html, markdown, svg, CAUTION};

/// The three sections: the mezzanine girder (three plates), a lintel with two round
/// cores (voids with arcs) and a disabled part, and the loading bay's door head beam
/// (a rolled I with root fillets and a cover plate, a propped span, and a `[sheet]`
/// header with two fields left blank).
const FILES: [&str; 3] = [
    "sections/mezzanine-girder.toml",
    "tests/fixtures/cored-lintel.toml",
    "sections/loading-bay-beam.toml",
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
        let page = html::page("t", &markdown::blocks(f, &a, &u), &drawing);
        assert_eq!(
            md.matches(CAUTION).count(),
            2,
            "{f}: top and bottom of the sheet"
        );
        assert!(drawing.contains(CAUTION), "{f}: svg");
        // Once in the drawing, twice in the sheet around it, once in the printed
        // pages' footer.
        assert_eq!(page.matches(CAUTION).count(), 4, "{f}: html");
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
    let page = html::page("t", &markdown::blocks(file, &a, &u), &svg::drawing(&a, &u));
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

/// Analysed with the torsion solve at its default tolerance.
fn analyse_with_torsion(file: &str) -> Analysis {
    let path = std::path::Path::new(env!("CARGO_MANIFEST_DIR")).join(file);
    let text = std::fs::read_to_string(&path).expect("fixture readable");
    let opts = Options {
        torsion: Some(kern::fe::TorsionOptions::default()),
        ..Options::default()
    };
    kern::file::load::analyse(&text, &opts).expect("fixture valid")
}

/// The Torsion and Member rows (J, Cw, shear centre, Mcr…) of the results table, to 3
/// significant figures so the snapshot does not follow the solver's last digits.
fn torsion_rows(a: &Analysis) -> String {
    kern::report::rows::rows(a, &units(a))
        .iter()
        .filter(|r| r.group == "Torsion" || r.group == "Member")
        .map(|r| {
            let v = r.value.map_or("—".into(), |v| kern::numfmt::sig(v, 3));
            format!("{:<8} {:<7} {v} {}\n", r.group, r.symbol, r.unit)
        })
        .collect()
}

/// The torsion results of two demo sections as every view shows them: the
/// mezzanine girder (a monosymmetric I) and the crane runway.
#[test]
fn torsion_rows_snapshot() {
    for f in [
        "sections/mezzanine-girder.toml",
        "sections/crane-runway.toml",
    ] {
        let a = analyse_with_torsion(f);
        insta::assert_snapshot!(format!("{}.torsion", snap_name(f)), torsion_rows(&a));
    }
}

/// The mezzanine girder's torsion rows against thin-walled closed forms for a
/// monosymmetric I with flanges b1 × tf (top), b2 × tf (bottom) and web hw × tw,
/// h = hw + tf between flange centroids, If = tf·b³/12 of each flange (Trahair,
/// Flexural-Torsional Buckling of Structures, ch. 7; Timoshenko & Gere, Theory of
/// Elastic Stability, §5.9): Cw = h²·I1·I2/(I1 + I2); shear centre on the web, at
/// h·I2/(I1 + I2) below the top flange's centroid; J ≈ Σ b·t³/3, which overstates J
/// a little (free flange ends), so within 3 %. And by symmetry xs is exactly 0 in
/// every view — table, JSON and drawing — not FE noise.
#[test]
fn girder_torsion_rows_match_thin_walled_closed_forms() {
    let a = analyse_with_torsion("sections/mezzanine-girder.toml");
    let u = units(&a);
    let get = |s: &str| {
        kern::report::rows::rows(&a, &u)
            .into_iter()
            .find(|r| r.symbol == s)
            .and_then(|r| r.value)
            .expect("row present")
    };
    let (b1, b2, tf, hw, tw) = (300.0f64, 250.0f64, 16.0f64, 500.0f64, 10.0f64);
    let h = hw + tf;
    let (i1, i2) = (tf * b1.powi(3) / 12.0, tf * b2.powi(3) / 12.0);
    let cw = h * h * i1 * i2 / (i1 + i2);
    assert!(
        (get("Cw") - cw).abs() < 0.01 * cw,
        "Cw {} vs {cw}",
        get("Cw")
    );
    let ys = hw + tf / 2.0 - h * i2 / (i1 + i2);
    assert!(
        (get("ys") - ys).abs() < 0.01 * h,
        "ys {} vs {ys}",
        get("ys")
    );
    let j = (b1 + b2) * tf.powi(3) / 3.0 + hw * tw.powi(3) / 3.0;
    assert!(get("J") < j && get("J") > 0.97 * j, "J {} vs {j}", get("J"));
    assert_eq!(get("xs"), 0.0);
    let json = serde_json::from_str::<serde_json::Value>(&kern::report::json::to_json("g", &a, &u))
        .expect("JSON");
    assert_eq!(json["torsion"]["shear_centre"]["x"], 0.0);
    assert!(svg::drawing(&a, &u).contains(">S (0, "));
}

/// The HTML page of the mezzanine girder's sheet, version redacted.
#[test]
fn html_sheet_snapshot() {
    let f = "sections/mezzanine-girder.toml";
    let a = analyse(f);
    let u = units(&a);
    let page = html::page("t", &markdown::blocks(f, &a, &u), &svg::drawing(&a, &u));
    insta::assert_snapshot!(
        "mezzanine-girder.html",
        page.replace(env!("CARGO_PKG_VERSION"), "[version]")
    );
}

/// A `**` or a backtick in a part name is text in both writers: the page gains no
/// bold or code from it, and the Markdown escapes it.
#[test]
fn markup_in_names_stays_text() {
    let text = std::fs::read_to_string(
        std::path::Path::new(env!("CARGO_MANIFEST_DIR")).join("sections/mezzanine-girder.toml"),
    )
    .expect("fixture readable")
    .replace("name = \"web\"", "name = \"**web** `x`\"");
    let a = kern::file::load::analyse(&text, &Options::default()).expect("valid");
    let u = units(&a);
    let b = markdown::blocks("g", &a, &u);
    let page = html::page("t", &b, "");
    assert!(page.contains("**web** `x`"), "name shown as written");
    assert!(!page.contains("<strong>web"));
    assert!(kern::report::blocks::markdown(&b).contains("\\*\\*web\\*\\* \\`x\\`"));
}

/// The header from `[sheet]`: given fields as written, missing ones a line to fill in
/// by hand, in both writers; markup in a field stays text (escaped in Markdown and
/// HTML alike).
#[test]
fn the_sheet_opens_with_its_header() {
    let text = std::fs::read_to_string(
        std::path::Path::new(env!("CARGO_MANIFEST_DIR")).join("sections/loading-bay-beam.toml"),
    )
    .expect("fixture readable")
    .replace("Door head beam DH1", "<b>DH1</b> | **x**\\u001b[31m");
    let a = kern::file::load::analyse(&text, &Options::default()).expect("valid");
    let u = units(&a);
    let b = markdown::blocks("bay", &a, &u);
    let md = kern::report::blocks::markdown(&b);
    let head: Vec<&str> = md.lines().take(5).collect();
    assert_eq!(
        head[0], "| **Project** | Loading bay, unit 4 | **Job no.** | 2026-014 |",
        "{md}"
    );
    assert!(
        head[2].contains("&lt;b&gt;DH1&lt;/b&gt; \\| \\*\\*x\\*\\*"),
        "{}",
        head[2]
    );
    assert!(!md.contains('\u{1b}'));
    assert!(
        head[2].contains("**Revision** | \\_\\_"),
        "blank: {}",
        head[2]
    );
    assert!(
        head[3].contains("**Checked** | \\_\\_"),
        "blank: {}",
        head[3]
    );
    assert!(
        head[4].starts_with("| **Date** | 2026-12-02 |"),
        "{}",
        head[4]
    );
    let page = html::page("t", &b, "");
    assert!(page.contains("<th>Element</th><td>&lt;b&gt;DH1&lt;/b&gt; | **x**"));
    assert!(page.contains("<th>Checked</th><td class=\"fill\"></td>"));
    assert!(!page.contains("<b>") && !page.contains('\u{1b}'));
    // A file without [sheet] gets every line blank.
    let a = analyse("tests/fixtures/cored-lintel.toml");
    let md = markdown::sheet("l", &a, &units(&a));
    assert_eq!(md.lines().next().unwrap().matches(" | \\_").count(), 2);
}

/// The moduli about the principal axes reach every view of an inclined section (the
/// JSON under `principal_modulus`, the rows every table renders from) and none of a
/// section whose principal axes are x and y.
#[test]
fn principal_moduli_in_every_view() {
    let text =
        "format = 1\nunits = \"mm\"\n[[parts]]\nshape = \"angle\"\nh = 150\nb = 90\nt = 10\n";
    let a = kern::file::load::analyse(text, &Options::default()).expect("valid");
    let u = units(&a);
    let j = serde_json::from_str::<serde_json::Value>(&kern::report::json::to_json("l", &a, &u))
        .expect("JSON");
    let s = &a.props.principal_elastic.expect("inclined");
    // The JSON gives the core's value unchanged in the file's unit.
    assert_eq!(j["principal_modulus"]["s2_neg"].as_f64(), Some(s.s2_neg));
    let rows = kern::report::rows::rows(&a, &u);
    let syms: Vec<&str> = rows.iter().map(|r| r.symbol.as_str()).collect();
    let at = syms.iter().position(|s| *s == "S1,+").expect("row S1,+");
    assert_eq!(&syms[at..at + 4], ["S1,+", "S1,−", "S2,+", "S2,−"]);
    assert_eq!(
        rows[at - 1].group,
        "Elastic moduli",
        "beside the elastic moduli"
    );
    assert!(kern::report::table::to_table("l", &a, &u).contains("S2,−"));
    assert!(markdown::sheet("l", &a, &u).contains("S2,−"));
    let g = analyse("sections/mezzanine-girder.toml");
    let j = serde_json::from_str::<serde_json::Value>(&kern::report::json::to_json(
        "g",
        &g,
        &units(&g),
    ))
    .expect("JSON");
    assert!(j.get("principal_modulus").is_none());
}
