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
    // A peak not within the tolerance: square plates welded into a box, whose inside
    // corners are sharp (the elastic peak there is singular).
    let tee = "format = 1\nunits = \"mm\"\n\
[[parts]]\nname = \"flange\"\nshape = \"rect\"\nb = 200\nh = 12\nat = [0, 106]\n\
[[parts]]\nname = \"web\"\nshape = \"rect\"\nb = 10\nh = 200\nat = [0, 0]\n\
[actions]\nVy = \"80 kN\"\n";
    let s = why(&mut app(tee, Solver::Inline));
    assert!(
        s.contains("|τ| not shaded: its peak is at a sharp re-entrant")
            && s.contains("corner (see the warnings)"),
        "{s}"
    );
    // Not shaded means not shaded: no level glyph on the drawing.
    assert!(!s.contains('█') && !s.contains('◆'), "{s}");
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
