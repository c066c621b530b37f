//! The drawing shaded by a stress (key `d`): off, |τ| and von Mises at 80×24 in
//! Unicode and ASCII, the mark of the peak, and the reasons a stress is not shaded.
//! Solved inline, so every screen is deterministic.

use kern::tui::app::{App, Solver};
use kern::tui::commands::run;
use kern::tui::config::Config;
use kern::tui::keys::Cmd;
use kern::tui::views;
use ratatui::backend::TestBackend;
use ratatui::Terminal;

/// Our own garage lintel: a 60 × 120 mm steel bar, ν = 0, under Vy = 36 kN and
/// Mx = 4 kN·m. Closed forms: τmax = 1.5·V/A = 7.50 MPa on the neutral axis (Timoshenko &
/// Goodier, Theory of Elasticity, §124, exact for ν = 0), σ = M·c/I = 27.8 MPa at the
/// extreme fibres, where τ = 0 and so von Mises = |σ|.
const LINTEL: &str = "format = 1\nunits = \"mm\"\ntitle = \"Garage lintel\"\n\
[[materials]]\nname = \"steel\"\nE = \"200 GPa\"\nnu = 0\n\
[[parts]]\nname = \"lintel\"\nshape = \"rect\"\nb = 60\nh = 120\n\
[actions]\nVy = \"36 kN\"\nMx = \"4 kN*m\"\n";

fn app(text: &str, solver: Solver) -> App {
    App::new(text.to_string(), None, Config::default(), solver).expect("valid section")
}

fn screen(app: &App, w: u16, h: u16) -> String {
    let mut t = Terminal::new(TestBackend::new(w, h)).expect("test terminal");
    t.draw(|f| views::render(app, f.area(), f.buffer_mut()))
        .expect("draw");
    t.backend().to_string()
}

#[test]
fn snapshots_of_the_shading_cycle_in_unicode_and_ascii() {
    let mut a = app(LINTEL, Solver::Inline);
    for ascii in [false, true] {
        if ascii {
            run(&mut a, Cmd::ToggleAscii);
        }
        let mode = if ascii { "-ascii" } else { "" };
        for name in ["off", "tau", "von-mises"] {
            let s = screen(&a, 80, 24);
            insta::assert_snapshot!(format!("shade-{name}{mode}-80x24"), s);
            if ascii {
                assert!(s.is_ascii(), "ASCII mode draws only ASCII");
            }
            run(&mut a, Cmd::Shade);
        }
        // Back to off after von Mises.
        assert!(screen(&a, 80, 24).contains(if ascii { ". axes" } else { "┄ axes" }));
    }
}

#[test]
fn the_legend_gives_each_level_its_range_and_the_peak_its_value_and_place() {
    let mut a = app(LINTEL, Solver::Inline);
    run(&mut a, Cmd::Shade);
    let s = screen(&a, 80, 24);
    // τmax = 1.5·36 kN / 7200 mm² = 7.50 MPa (Timoshenko & Goodier §124), split in four.
    for part in [
        "|τ| in MPa:",
        "░ 0–1.88",
        "▒ 1.88–3.75",
        "▓ 3.75–5.63",
        "█ 5.63–7.50",
    ] {
        assert!(s.contains(part), "{part}: {s}");
    }
    assert!(s.contains("◆ max 7.50 MPa at ("), "{s}");
    assert_eq!(
        s.matches('◆').count(),
        2,
        "one mark on the drawing, one in the legend"
    );
    run(&mut a, Cmd::Shade);
    let s = screen(&a, 80, 24);
    // von Mises peaks at an extreme fibre, |σ| = M·c/I = 4e6·60/8.64e6 = 27.8 MPa.
    assert!(s.contains("◆ max 27.8 MPa at (0, "), "{s}");
}

#[test]
fn each_reason_for_not_shading_is_said() {
    let why = |a: &mut App| {
        run(a, Cmd::Shade);
        screen(a, 80, 24)
    };
    // No shear action: the girder demo has Mx only.
    let girder = include_str!("../sections/mezzanine-girder.toml");
    let s = why(&mut app(girder, Solver::Inline));
    insta::assert_snapshot!("shade-why-not-80x24", s);
    assert!(
        s.contains("|τ| not shaded: no Vx, Vy or T in [actions]"),
        "{s}"
    );
    // The finite elements off, and a solve still running.
    let mut off = app(LINTEL, Solver::Off);
    assert!(why(&mut off).contains("the finite-element solve is off"));
    off.solving = true;
    // (The legend breaks the words over its lines.)
    let s = screen(&off, 80, 24);
    assert!(
        s.contains("|τ| not shaded: the finite-element solve is") && s.contains("│running"),
        "{s}"
    );
    // No shear solution: two separate bars share no shear flow.
    let apart = LINTEL.replace(
        "[actions]",
        "[[parts]]\nname = \"bar\"\nshape = \"rect\"\nb = 60\nh = 120\nat = [100, 0]\n[actions]",
    );
    let s = why(&mut app(&apart, Solver::Inline));
    assert!(s.contains("no shear solution (see the warnings)"), "{s}");
    // A peak singular at sharp re-entrant corners with the stress away from them not
    // within the tolerance either: a tolerance coarser meshes cannot meet.
    let mut tight = app(TEE, Solver::Inline);
    tight.analysis.warnings.clear();
    if let Some(sh) = tight.analysis.shear.as_mut() {
        sh.tau_away = None;
    }
    tight
        .analysis
        .warnings
        .push(kern::model::Warning::ShearAboveTolerance {
            figures: vec![kern::model::warning::ShearFigure::TauMax],
            cause: kern::model::warning::ShearCause::SharpCorner,
        });
    let s = why(&mut tight);
    assert!(
        s.contains("|τ| not shaded: its peak is at a sharp re-entrant"),
        "{s}"
    );
    // Not shaded means not shaded: no level glyph on the drawing.
    assert!(
        !s.contains('█') && !s.contains('◆') && !s.contains('∞'),
        "{s}"
    );
}

/// Our own mezzanine trimmer: a 200 × 12 mm flange welded on a 10 × 200 mm web (a tee),
/// under Vy = 80 kN. Its two inside corners at the weld are sharp: the elastic shear
/// stress there is singular.
const TEE: &str = "format = 1\nunits = \"mm\"\ntitle = \"Mezzanine trimmer\"\n\
[[parts]]\nname = \"flange\"\nshape = \"rect\"\nb = 200\nh = 12\nat = [0, 106]\n\
[[parts]]\nname = \"web\"\nshape = \"rect\"\nb = 10\nh = 200\nat = [0, 0]\n\
[actions]\nVy = \"80 kN\"\n";

#[test]
fn a_welded_tee_is_shaded_to_its_largest_stress_away_from_the_singular_corners() {
    let mut a = app(TEE, Solver::Inline);
    let sh = a.analysis.shear.clone().expect("flexure solved");
    // τmax itself stays withheld: the corners are singular (Williams 1952).
    assert!(sh.tau_max.is_none(), "{sh:?}");
    let away = sh
        .tau_away
        .expect("the stress away from the corners is within 1e-3");
    // Away from the corners the largest τ is in the web at the neutral axis, near the
    // elementary V·Q/(I·t) (Gere & Goodno, Mechanics of Materials, the shear formula;
    // for a web 20 times as tall as it is wide the elementary value holds to a few
    // per cent, common practice for thin walls). y from the web's mid-height; parallel
    // axes for I, Q of the part above the neutral axis.
    let (af, yf, aw) = (200.0_f64 * 12.0, 106.0_f64, 10.0_f64 * 200.0);
    let ybar = af * yf / (af + aw);
    let i = 200.0 * 12f64.powi(3) / 12.0
        + af * (yf - ybar).powi(2)
        + 10.0 * 200f64.powi(3) / 12.0
        + aw * ybar.powi(2);
    // Q of the part above the neutral axis: the flange and the web from ȳ to 100.
    let q = af * (yf - ybar) + 10.0 * (100.0 - ybar) * (100.0 - ybar) / 2.0;
    let hand = 80e3 * q / (i * 10.0) * 1e6; // Pa
    let e = (away.value - hand).abs() / hand;
    assert!(e < 0.03, "{} vs V·Q/(I·t) {hand}: {e:.3}", away.value);
    assert!((away.at.y - ybar).abs() < 10.0, "{:?}", away.at);
    run(&mut a, Cmd::Shade);
    assert_eq!(
        a.message.as_ref().map(|m| m.0.as_str()),
        Some("shaded by |τ| away from the sharp corners (singular at the marked ones)")
    );
    for (w, h) in [(120, 40), (80, 24), (40, 12)] {
        let s = screen(&a, w, h);
        insta::assert_snapshot!(format!("shade-tee-away-{w}x{h}"), s);
    }
    let s = screen(&a, 120, 40);
    assert!(s.contains("◆ max away from the sharp corners"), "{s}");
    assert!(s.contains("∞ sharp re-entrant corner: singular"), "{s}");
    // Both weld corners marked on the drawing, and once in the legend.
    assert_eq!(s.matches('∞').count(), 3, "{s}");
    // No number is given as the section's τmax anywhere.
    assert!(!s.contains("τmax"), "{s}");
    run(&mut a, Cmd::ToggleAscii);
    let s = screen(&a, 120, 40);
    assert!(s.is_ascii(), "{s}");
    assert!(s.contains("! sharp re-entrant corner: singular"), "{s}");
    // Two corners and the legend, and the warning's own sign.
    assert_eq!(s.matches('!').count(), 4, "{s}");
}

#[test]
fn every_joint_is_marked_with_its_kind_in_the_legend() {
    // Our own mezzanine edge box: four plates welded into a closed cell (its corner
    // joints are statically indeterminate, flow not given) and a cover plate on top (a
    // bridge joint, flow V·Q/I).
    let boxed = "format = 1\nunits = \"mm\"\n\
[[parts]]\nname = \"top\"\nshape = \"rect\"\nb = 200\nh = 12\nat = [0, 144]\n\
[[parts]]\nname = \"bottom\"\nshape = \"rect\"\nb = 200\nh = 12\nat = [0, -144]\n\
[[parts]]\nname = \"left\"\nshape = \"rect\"\nb = 10\nh = 276\nat = [-95, 0]\n\
[[parts]]\nname = \"right\"\nshape = \"rect\"\nb = 10\nh = 276\nat = [95, 0]\n\
[[parts]]\nname = \"cover\"\nshape = \"rect\"\nb = 120\nh = 10\nat = [0, 155]\n";
    let a = app(boxed, Solver::Off);
    assert_eq!(a.analysis.connections.len(), 5);
    for (w, h) in [(80, 24), (120, 40)] {
        let s = screen(&a, w, h);
        assert!(
            s.contains("× joint") && s.contains("⊗ joint, flow not given"),
            "{s}"
        );
        // The four corners of the cell, each its own mark, and the cover plate's.
        let drawing: String = s.lines().filter(|l| !l.contains("joint")).collect();
        assert_eq!(drawing.matches('⊗').count(), 4, "{s}");
        // (× also writes the panel's powers of ten, 687.0×10⁶.)
        let marks = drawing.matches('×').count() - drawing.matches("×10").count();
        assert_eq!(marks, 1, "{s}");
    }
}

#[test]
fn a_section_with_holes_says_its_shading_is_of_the_gross_section() {
    // The flexure solution is of the gross section (holes count in the net section's
    // bending stresses only): the legend says so. Our own lintel with a 20 mm service
    // hole on its axis.
    let holed = LINTEL.replace(
        "[actions]",
        "[[parts]]\nname = \"service hole\"\nshape = \"circle\"\nd = 20\nvoid = true\nhole = true\n[actions]",
    );
    let mut a = app(&holed, Solver::Inline);
    assert!(a.analysis.net.is_some());
    run(&mut a, Cmd::Shade);
    let s = screen(&a, 80, 24);
    assert!(s.contains("|τ| (gross section) in MPa:"), "{s}");
}
