//! `kern calc` end to end, against the contract in FORMAT.md ("`calc --json`"): one
//! JSON line per file in input order with every listed key, `--units` conversion,
//! `FILE:LINE:COLUMN: message` and status 2 for an invalid file.

use serde_json::Value;
use std::path::Path;
use std::process::{Command, Output};

#[path = "support/scratch.rs"]
mod support_scratch;
use support_scratch::scratch;

fn kern(args: &[&str]) -> Output {
    Command::new(env!("CARGO_BIN_EXE_kern"))
        .args(args)
        .current_dir(env!("CARGO_MANIFEST_DIR"))
        .output()
        .expect("kern runs")
}

fn demo_files() -> Vec<String> {
    let dir = Path::new(env!("CARGO_MANIFEST_DIR")).join("sections");
    let mut v: Vec<String> = std::fs::read_dir(&dir)
        .expect("sections/")
        .filter_map(|e| e.ok())
        .map(|e| e.path())
        .filter(|p| p.extension().is_some_and(|x| x == "toml"))
        .map(|p| format!("sections/{}", p.file_name().unwrap().to_string_lossy()))
        .collect();
    v.sort();
    assert!(v.len() >= 3, "demo sections present");
    v
}

fn json_lines(out: &Output) -> Vec<Value> {
    String::from_utf8(out.stdout.clone())
        .expect("UTF-8 output")
        .lines()
        .map(|l| serde_json::from_str(l).unwrap_or_else(|e| panic!("{e}: {l}")))
        .collect()
}

fn num(v: &Value, path: &[&str]) -> f64 {
    let mut x = v;
    for k in path {
        x = &x[*k];
    }
    x.as_f64()
        .unwrap_or_else(|| panic!("{path:?} is not a number in {v}"))
}

#[test]
fn json_has_every_key_in_input_order() {
    let files = demo_files();
    let mut args = vec!["calc", "--json", "--no-torsion"];
    args.extend(files.iter().map(String::as_str));
    let out = kern(&args);
    assert_eq!(
        out.status.code(),
        Some(0),
        "{}",
        String::from_utf8_lossy(&out.stderr)
    );
    let lines = json_lines(&out);
    assert_eq!(lines.len(), files.len(), "one line per file");
    for (v, f) in lines.iter().zip(&files) {
        assert_eq!(v["file"], f.as_str(), "input order");
        let text = std::fs::read_to_string(Path::new(env!("CARGO_MANIFEST_DIR")).join(f)).unwrap();
        for k in ["title", "units"] {
            assert!(v[k].is_string(), "{f}: {k}");
        }
        for (k, sub) in [
            ("area", &[][..]),
            ("centroid", &["x", "y"][..]),
            ("bounds", &["xmin", "xmax", "ymin", "ymax"][..]),
            ("inertia", &["xx", "yy", "xy"][..]),
            ("principal", &["i1", "i2", "angle_deg"][..]),
            (
                "elastic_modulus",
                &["x_top", "x_bottom", "y_left", "y_right"][..],
            ),
            ("plastic_modulus", &["x", "y"][..]),
            ("plastic_axis", &["y", "x"][..]),
            ("gyration", &["x", "y", "min"][..]),
        ] {
            if sub.is_empty() {
                assert!(num(v, &[k]).is_finite(), "{f}: {k}");
            }
            for s in sub {
                assert!(num(v, &[k, s]).is_finite(), "{f}: {k}.{s}");
            }
        }
        // i1 ≥ i2 and the angle in (−90, 90] (FORMAT.md).
        assert!(num(v, &["principal", "i1"]) >= num(v, &["principal", "i2"]));
        let ang = num(v, &["principal", "angle_deg"]);
        assert!(ang > -90.0 && ang <= 90.0, "{f}: angle {ang}");
        for s in ["force", "moment", "stress", "deflection"] {
            assert!(
                v["quantity_units"][s].is_string(),
                "{f}: quantity_units.{s}"
            );
        }
        assert!(v["warnings"].is_array(), "{f}: warnings");
        assert!(
            v.get("torsion").is_none(),
            "{f}: --no-torsion leaves torsion out"
        );
        if text.contains("density") {
            assert!(num(v, &["mass_per_length"]) > 0.0, "{f}: mass_per_length");
        }
        if text.contains("[actions]") {
            for s in ["max_tension", "max_compression"] {
                for c in ["value", "x", "y"] {
                    assert!(num(v, &["stress", s, c]).is_finite(), "{f}: stress.{s}.{c}");
                }
            }
            assert!(v["stress"].get("neutral_axis_angle_deg").is_some());
        } else {
            assert!(v.get("stress").is_none(), "{f}: no [actions], no stress");
        }
        if text.contains("[member]") {
            let m = &v["member"];
            for s in ["m_max", "v_max", "deflection_allowed", "stress_max"] {
                assert!(num(m, &[s]) >= 0.0, "{f}: member.{s}");
            }
            for s in ["deflection_max", "utilization"] {
                assert!(m.get(s).is_some(), "{f}: member.{s}");
            }
        } else {
            assert!(v.get("member").is_none(), "{f}: no [member], no member");
        }
    }
}

#[test]
fn every_demo_section_computes_cleanly() {
    for f in demo_files() {
        let out = kern(&["calc", "--json", "--no-torsion", &f]);
        assert_eq!(
            out.status.code(),
            Some(0),
            "{f}: {}",
            String::from_utf8_lossy(&out.stderr)
        );
        assert!(
            out.stderr.is_empty(),
            "{f}: {}",
            String::from_utf8_lossy(&out.stderr)
        );
        let v = &json_lines(&out)[0];
        // The garage lintel's two angles stand apart (joined by stitch bolts along the
        // span, not in the section): the warning that no two parts share a boundary is right.
        let warnings: Vec<&Value> = v["warnings"]
            .as_array()
            .map(|w| {
                w.iter()
                    .filter(|w| {
                        !(f.ends_with("garage-lintel.toml")
                            && w.as_str().is_some_and(|s| s.contains("share a boundary")))
                    })
                    .collect()
            })
            .unwrap_or_default();
        assert!(warnings.is_empty(), "{f}: warnings {warnings:?}");
        // The table form too.
        let out = kern(&["calc", "--no-torsion", &f]);
        assert_eq!(out.status.code(), Some(0), "{f} (table)");
        assert!(!out.stdout.is_empty());
    }
}

#[test]
fn units_convert_lengths_and_quantities() {
    // 1 in = 25.4 mm exactly (NIST SP 811, B.8): lengths scale by 25.4ⁿ for length ⁿ.
    let f = "sections/mezzanine-girder.toml";
    let mm = &json_lines(&kern(&["calc", "--json", "--no-torsion", f]))[0];
    let inch = &json_lines(&kern(&[
        "calc",
        "--json",
        "--no-torsion",
        "--units",
        "in",
        f,
    ]))[0];
    assert_eq!(mm["units"], "mm");
    assert_eq!(inch["units"], "in");
    let k: f64 = 25.4;
    for (path, power) in [
        (&["area"][..], 2),
        (&["centroid", "y"][..], 1),
        (&["bounds", "ymax"][..], 1),
        (&["inertia", "xx"][..], 4),
        (&["inertia", "yy"][..], 4),
        (&["principal", "i1"][..], 4),
        (&["elastic_modulus", "x_top"][..], 3),
        (&["plastic_modulus", "x"][..], 3),
        (&["plastic_axis", "y"][..], 1),
        (&["gyration", "x"][..], 1),
    ] {
        let (a, b) = (num(mm, path), num(inch, path));
        let want = a / k.powi(power);
        assert!(
            (b - want).abs() <= 1e-9 * want.abs().max(1e-300),
            "{path:?}: {b} in vs {a} mm"
        );
    }
    assert_eq!(
        num(mm, &["principal", "angle_deg"]),
        num(inch, &["principal", "angle_deg"])
    );
    // FORMAT.md: kN, kN*m, MPa for metric files; kip, kip*ft, ksi and in for in and ft.
    assert_eq!(mm["quantity_units"]["force"], "kN");
    assert_eq!(mm["quantity_units"]["moment"], "kN*m");
    assert_eq!(mm["quantity_units"]["stress"], "MPa");
    assert_eq!(mm["quantity_units"]["deflection"], "mm");
    for u in ["in", "ft"] {
        let v = &json_lines(&kern(&["calc", "--json", "--no-torsion", "--units", u, f]))[0];
        assert_eq!(v["quantity_units"]["force"], "kip", "{u}");
        assert_eq!(v["quantity_units"]["moment"], "kip*ft", "{u}");
        assert_eq!(v["quantity_units"]["stress"], "ksi", "{u}");
        assert_eq!(v["quantity_units"]["deflection"], "in", "{u}");
    }
    // 1 ksi = 6.894757 MPa (NIST SP 811, B.8), 1 kip = 4.448222 kN.
    let (s_mpa, s_ksi) = (
        num(mm, &["stress", "max_tension", "value"]),
        num(inch, &["stress", "max_tension", "value"]),
    );
    assert!(
        (s_mpa / s_ksi - 6.894757).abs() < 1e-5,
        "{s_mpa} MPa vs {s_ksi} ksi"
    );
    let (v_kn, v_kip) = (
        num(mm, &["member", "v_max"]),
        num(inch, &["member", "v_max"]),
    );
    assert!(
        (v_kn / v_kip - 4.448222).abs() < 1e-5,
        "{v_kn} kN vs {v_kip} kip"
    );
    let cm = &json_lines(&kern(&[
        "calc",
        "--json",
        "--no-torsion",
        "--units",
        "cm",
        f,
    ]))[0];
    let (a, b) = (num(mm, &["inertia", "xx"]), num(cm, &["inertia", "xx"]));
    assert!((b - a / 1e4).abs() <= 1e-9 * b, "cm⁴");
}

#[test]
fn an_invalid_file_among_valid_ones() {
    let d = scratch("invalid");
    let bad = d.join("bad.toml");
    std::fs::write(
        &bad,
        "format = 1\nunits = \"mm\"\n[[parts]]\nshape = \"rect\"\nb = 100\nhh = 20\n",
    )
    .unwrap();
    let bad_s = bad.to_string_lossy().to_string();
    let good = demo_files();
    let out = kern(&["calc", "--json", "--no-torsion", &good[0], &bad_s, &good[1]]);
    assert_eq!(out.status.code(), Some(2));
    let lines = json_lines(&out);
    assert_eq!(lines.len(), 2, "the valid files are still printed");
    assert_eq!(lines[0]["file"], good[0].as_str());
    assert_eq!(lines[1]["file"], good[1].as_str());
    let err = String::from_utf8(out.stderr).unwrap();
    assert!(
        err.starts_with(&format!("{bad_s}:6:1: unknown key `hh`")),
        "{err}"
    );
    assert_eq!(err.lines().count(), 1, "{err}");
    let _ = std::fs::remove_dir_all(d);
}

#[test]
fn missing_and_non_utf8_files() {
    let out = kern(&["calc", "--json", "--no-torsion", "no/such/file.toml"]);
    assert_eq!(out.status.code(), Some(2));
    assert!(out.stdout.is_empty());
    let err = String::from_utf8(out.stderr).unwrap();
    assert!(
        err.starts_with("no/such/file.toml:1:1: cannot read"),
        "{err}"
    );

    let d = scratch("bytes");
    let f = d.join("latin1.toml");
    std::fs::write(&f, b"format = 1\nunits = \"mm\"\ntitle = \"Tr\xe4ger\"\n").unwrap();
    let fs = f.to_string_lossy().to_string();
    let out = kern(&["calc", "--no-torsion", &fs]);
    assert_eq!(out.status.code(), Some(2));
    let err = String::from_utf8(out.stderr).unwrap();
    assert!(err.starts_with(&format!("{fs}:3:")), "{err}");
    assert!(err.contains("UTF-8"), "{err}");
    let g = d.join("garbage.toml");
    std::fs::write(&g, [0xff, 0xfe, 0x00, 0x9f, 0x80, b'\n', 0xc3]).unwrap();
    let gs = g.to_string_lossy().to_string();
    let out = kern(&["calc", "--json", "--no-torsion", &gs]);
    assert_eq!(out.status.code(), Some(2));
    assert!(String::from_utf8(out.stderr)
        .unwrap()
        .starts_with(&format!("{gs}:1:1:")));
    let _ = std::fs::remove_dir_all(d);
}

#[test]
fn svg_takes_units_like_report_and_calc_help_names_the_format_file() {
    let mm = kern(&["svg", "sections/mezzanine-girder.toml", "--no-torsion"]);
    let cm = kern(&[
        "svg",
        "sections/mezzanine-girder.toml",
        "--no-torsion",
        "--units",
        "cm",
    ]);
    assert!(mm.status.success() && cm.status.success());
    let (mm, cm) = (
        String::from_utf8_lossy(&mm.stdout),
        String::from_utf8_lossy(&cm.stdout),
    );
    assert!(cm.contains(" cm") && !mm.contains(" cm"), "{cm}");
    let bad = kern(&[
        "svg",
        "sections/mezzanine-girder.toml",
        "--units",
        "furlong",
    ]);
    assert!(!bad.status.success());
    let help = kern(&["calc", "--help"]);
    let help = String::from_utf8_lossy(&help.stdout);
    assert!(
        help.contains("docs/format.md") && !help.contains("FORMAT.md"),
        "{help}"
    );
}

/// `--numbers` and `--notation` change how the table writes results and never the
/// JSON. The girder's area is 300·16 + 500·10 + 250·16 = 13 800 mm² (sum of its three
/// rectangles, by hand); engineering form groups it by a thin space (ISO 80000-1).
#[test]
fn numbers_and_notation_change_the_table_and_never_the_json() {
    let f = "sections/mezzanine-girder.toml";
    let text = |args: &[&str]| String::from_utf8_lossy(&kern(args).stdout).to_string();
    let eng = text(&["calc", f, "--no-torsion"]);
    assert!(
        eng.contains("13\u{202f}800 mm²") && eng.contains("687.0×10⁶ mm⁴"),
        "{eng}"
    );
    let sci = text(&["calc", f, "--no-torsion", "--numbers", "scientific"]);
    assert!(sci.contains("1.380e4 mm²"), "{sci}");
    let plain = text(&["calc", "--numbers", "plain", f, "--no-torsion"]);
    assert!(plain.contains("687000000 mm⁴"), "{plain}");
    let yz = text(&["calc", f, "--no-torsion", "--notation", "yz"]);
    assert!(
        yz.contains("Wel,y,top") && yz.contains("Wpl,y") && !yz.contains("Sx,top"),
        "{yz}"
    );
    assert!(yz.contains("z vertical"), "the table states its axes: {yz}");
    let json = text(&["calc", f, "--no-torsion", "--json"]);
    let other = text(&[
        "calc",
        f,
        "--no-torsion",
        "--json",
        "--numbers",
        "plain",
        "--notation",
        "yz",
    ]);
    assert_eq!(json, other);
    let bad = kern(&["calc", f, "--numbers", "pretty"]);
    assert_eq!(bad.status.code(), Some(2), "clap's usage error");
    assert!(String::from_utf8_lossy(&bad.stderr).contains("engineering, scientific or plain"));
}

/// `kern report FILE -o sheet.md` writes the drawing beside the sheet as sheet.svg and
/// links it; stdout keeps the mark and says where the drawing goes; HTML holds it
/// inline. A Markdown sheet named .svg is refused (it would be its own drawing).
#[test]
fn report_writes_its_drawing_beside_the_sheet() {
    let d = scratch("report-drawing");
    let md = d.join("sheet.md");
    let f = "sections/loading-bay-beam.toml";
    let out = kern(&["report", f, "--no-torsion", "-o", &md.to_string_lossy()]);
    assert!(out.status.success(), "{out:?}");
    let sheet = std::fs::read_to_string(&md).unwrap();
    let svg = std::fs::read_to_string(d.join("sheet.svg")).unwrap();
    assert!(sheet.contains("![The section drawn to scale](sheet.svg)"));
    assert!(!sheet.contains("<!-- drawing -->"));
    assert!(svg.starts_with("<svg") && svg.contains("Caution"));
    let stdout = kern(&["report", f, "--no-torsion"]);
    let stdout = String::from_utf8_lossy(&stdout.stdout);
    assert!(stdout.contains("<!-- drawing -->") && stdout.contains("-o sheet.md"));
    let html = d.join("sheet.html");
    let out = kern(&[
        "report",
        f,
        "--no-torsion",
        "--html",
        "-o",
        &html.to_string_lossy(),
    ]);
    assert!(out.status.success());
    assert!(std::fs::read_to_string(&html).unwrap().contains("<svg"));
    let bad = kern(&[
        "report",
        f,
        "--no-torsion",
        "-o",
        &d.join("x.svg").to_string_lossy(),
    ]);
    assert_eq!(bad.status.code(), Some(1));
    assert!(String::from_utf8_lossy(&bad.stderr).contains("name it .md"));
    assert!(!d.join("x.svg").exists());
    let _ = std::fs::remove_dir_all(d);
}

/// The calc table's "—" for Mcr of a propped span says why (the method is for a simple
/// span: Trahair, Flexural-Torsional Buckling of Structures, ch. 7).
#[test]
fn calc_says_why_mcr_is_missing() {
    let out = kern(&["calc", "sections/loading-bay-beam.toml"]);
    let text = String::from_utf8_lossy(&out.stdout);
    assert!(
        text.contains("note: Mcr —: not computed: the formula is for a simple span"),
        "{text}"
    );
}

#[test]
fn no_shear_solves_torsion_alone_and_leaves_the_shear_results_out() {
    // A 60 × 120 rectangle with a shear force, a member with shear deformation and a
    // torque. J by Saint-Venant's series for a rectangle b ≤ h (Timoshenko & Goodier,
    // Theory of Elasticity, §109): J = b³h/3·(1 − (192/π⁵)(b/h)·Σ_{n odd} tanh(nπh/2b)/n⁵).
    let d = scratch("no-shear");
    let f = d.join("lintel.toml");
    std::fs::write(
        &f,
        "format = 1\nunits = \"mm\"\n[[materials]]\nname = \"steel\"\nE = \"200 GPa\"\n\
         [[parts]]\nshape = \"rect\"\nb = 60\nh = 120\n[actions]\nVy = \"36 kN\"\nT = \"1 kN*m\"\n\
         [member]\nspan = \"1.2 m\"\nsupport = \"simple\"\nudl = \"50 kN/m\"\n\
         shear_deformation = true\n",
    )
    .unwrap();
    let path = f.to_string_lossy().into_owned();
    let (b, h) = (60.0f64, 120.0f64);
    let pi = std::f64::consts::PI;
    let sum: f64 = (0..50)
        .map(|k| f64::from(2 * k + 1))
        .map(|n| (n * pi * h / (2.0 * b)).tanh() / n.powi(5))
        .sum();
    let exact = b.powi(3) * h / 3.0 * (1.0 - 192.0 / pi.powi(5) * (b / h) * sum);

    let both = &json_lines(&kern(&["calc", "--json", &path]))[0];
    let alone = &json_lines(&kern(&["calc", "--json", "--no-shear", &path]))[0];
    // Torsion is there, within its own estimate of the series.
    let j = num(alone, &["torsion", "j"]);
    let est = num(alone, &["torsion", "rel_error"]);
    assert!(est <= 1e-3, "estimate {est}");
    assert!(
        (j - exact).abs() / exact <= est,
        "J = {j}, series {exact}, est {est}"
    );
    // The flexure results are left out as with --no-torsion (docs/format.md).
    assert!(
        both["shear_area"].is_object() && both["shear"].is_object(),
        "{both}"
    );
    assert!(both["member"]["tau_max"].is_number(), "{both}");
    for key in ["shear_area", "shear"] {
        assert!(alone.get(key).is_none(), "{key} in {alone}");
    }
    assert!(
        alone["member"].get("tau_max").is_none(),
        "{}",
        alone["member"]
    );
    // No shear area, so the deflection with shear deformation is refused (null), and
    // the warning says the flexure solution did not run.
    assert!(
        alone["member"]["deflection_max"].is_null(),
        "{}",
        alone["member"]
    );
    let warns = alone["warnings"].to_string();
    assert!(warns.contains("--no-shear"), "{warns}");
    // The rest is the same as with the shear.
    for key in ["area", "inertia", "plastic_modulus", "stress"] {
        assert_eq!(alone[key], both[key], "{key}");
    }
    let help = String::from_utf8(kern(&["calc", "--help"]).stdout).unwrap();
    assert!(
        help.contains("--no-shear") && help.contains("without the flexure"),
        "{help}"
    );
    let _ = std::fs::remove_dir_all(&d);
}
