//! The workbench driven without a terminal: commands on the app state (edit, step,
//! undo and redo, add and delete, save keeping comments), and whole screens drawn on a
//! `TestBackend` as snapshots. Torsion is not solved here, so every screen is
//! deterministic.

use crossterm::event::{KeyCode, KeyEvent, KeyModifiers};
use kern::file::git::Commit;
use kern::tui::app::{App, Focus, Mode, Picker, Solver};
use kern::tui::columns::Col;
use kern::tui::commands::compare::Revisions;
use kern::tui::commands::{self, run};
use kern::tui::config::Config;
use kern::tui::handle_key;
use kern::tui::keys::{markdown, Cmd};
use kern::tui::views;
use ratatui::backend::TestBackend;
use ratatui::layout::Rect;
use ratatui::Terminal;
use std::f64::consts::PI;
use std::path::{Path, PathBuf};

#[path = "support/scratch.rs"]
mod support_scratch;
use support_scratch::scratch;

const GIRDER: &str = include_str!("../sections/mezzanine-girder.toml");

fn app(text: &str) -> App {
    App::new(text.to_string(), None, Config::default(), Solver::Off).expect("valid section")
}

/// Runs `cmd` `n` times, as a user pressing its key.
fn repeat(a: &mut App, cmd: Cmd, n: usize) {
    for _ in 0..n {
        run(a, cmd);
    }
}

fn section(name: &str) -> String {
    let p = Path::new(env!("CARGO_MANIFEST_DIR"))
        .join("sections")
        .join(name);
    std::fs::read_to_string(p).expect("demo section readable")
}

fn key(app: &mut App, code: KeyCode) {
    handle_key(app, &KeyEvent::new(code, KeyModifiers::NONE));
}

fn typed(app: &mut App, s: &str) {
    for c in s.chars() {
        key(app, KeyCode::Char(c));
    }
}

/// Lines that differ between two texts of the same length in lines.
fn diff_lines(a: &str, b: &str) -> Vec<(String, String)> {
    a.lines()
        .zip(b.lines())
        .filter(|(x, y)| x != y)
        .map(|(x, y)| (x.to_string(), y.to_string()))
        .collect()
}

fn screen(app: &App, w: u16, h: u16) -> String {
    let mut t = Terminal::new(TestBackend::new(w, h)).expect("test terminal");
    t.draw(|f| views::render(app, f.area(), f.buffer_mut()))
        .expect("draw");
    t.backend().to_string()
}

#[test]
fn typing_a_param_changes_one_line_and_the_results() {
    let mut a = app(GIRDER);
    let ixx = a.analysis.props.ixx;
    run(&mut a, Cmd::SwitchList);
    assert_eq!(a.focus, Focus::Params);
    run(&mut a, Cmd::Edit);
    for _ in 0..3 {
        key(&mut a, KeyCode::Backspace);
    }
    typed(&mut a, "300");
    key(&mut a, KeyCode::Enter);
    // The same value typed again: nothing changes.
    assert!(diff_lines(GIRDER, &a.text).is_empty());
    run(&mut a, Cmd::Down);
    run(&mut a, Cmd::Edit);
    for _ in 0..3 {
        key(&mut a, KeyCode::Backspace);
    }
    typed(&mut a, "300");
    key(&mut a, KeyCode::Enter);
    assert_eq!(
        diff_lines(GIRDER, &a.text),
        vec![(
            "bf_bot = 250   # bottom flange width".to_string(),
            "bf_bot = 300   # bottom flange width".to_string()
        )]
    );
    assert!(a.analysis.props.ixx > ixx);
    assert!(a.modified());
}

#[test]
fn an_invalid_entry_is_refused_with_the_reason() {
    let mut a = app(GIRDER);
    // The web's height (column h) of part 2.
    run(&mut a, Cmd::Down);
    repeat(&mut a, Cmd::Right, 4);
    run(&mut a, Cmd::Edit);
    key(&mut a, KeyCode::End);
    typed(&mut a, " - hw");
    key(&mut a, KeyCode::Enter);
    assert_eq!(a.text, GIRDER, "nothing changed");
    assert!(
        matches!(a.mode, Mode::Typing { .. }),
        "the entry stays to be fixed"
    );
    let (msg, err) = a.message.clone().unwrap();
    assert!(err && msg.starts_with("refused"), "{msg}");
    key(&mut a, KeyCode::Esc);
    assert_eq!(a.mode, Mode::Main);
}

#[test]
fn steps_numbers_and_bare_params_but_not_expressions() {
    let mut a = app(GIRDER);
    // Top flange, column b holds "bf_top": the step goes to the param.
    run(&mut a, Cmd::Right);
    run(&mut a, Cmd::Right);
    run(&mut a, Cmd::Right);
    run(&mut a, Cmd::StepUp);
    assert!(
        a.text.contains("bf_top = 310   # top flange width"),
        "5 % of 300 is 15, stepped by 10"
    );
    run(&mut a, Cmd::CoarseDown);
    assert!(
        a.text.contains("bf_top = 250   #"),
        "25 % of 310 is 77.5: a step of 50, to a multiple of 50"
    );
    run(&mut a, Cmd::FineUp);
    assert!(
        a.text.contains("bf_top = 252   #"),
        "1 % of 250 is 2.5: a step of 2"
    );
    // at y of the top flange is "hw + tf/2": refused.
    run(&mut a, Cmd::Right);
    run(&mut a, Cmd::Right);
    run(&mut a, Cmd::Right);
    let before = a.text.clone();
    run(&mut a, Cmd::StepUp);
    assert_eq!(a.text, before);
    assert!(a.message.as_ref().unwrap().1);
}

#[test]
fn undo_and_redo_walk_the_history() {
    let mut a = app(GIRDER);
    run(&mut a, Cmd::ToggleVoid);
    run(&mut a, Cmd::ToggleEnabled);
    let after = a.text.clone();
    assert!(after.contains("void = true") && after.contains("enabled = false"));
    run(&mut a, Cmd::Undo);
    run(&mut a, Cmd::Undo);
    assert_eq!(a.text, GIRDER);
    assert!(!a.modified());
    run(&mut a, Cmd::Redo);
    run(&mut a, Cmd::Redo);
    assert_eq!(a.text, after);
    run(&mut a, Cmd::Undo);
    run(&mut a, Cmd::ToggleVoid);
    assert!(a.redo.is_empty(), "a new edit forgets what could be redone");
}

#[test]
fn marks_a_void_as_a_hole_and_back() {
    // A hole counts only for the net section (FORMAT.md "Gross and net"): the gross
    // area is the plain part's again, the net one keeps the hole subtracted.
    let mut a = app(GIRDER);
    run(&mut a, Cmd::AddPart);
    repeat(&mut a, Cmd::Down, 11);
    run(&mut a, Cmd::Commit);
    let pipe = PI / 4.0 * (100.0f64.powi(2) - 90.0f64.powi(2));
    run(&mut a, Cmd::ToggleVoid);
    run(&mut a, Cmd::ToggleHole);
    assert!(a.text.contains("hole = true"), "{}", a.text);
    assert!((a.analysis.props.area - 13800.0).abs() < 1e-6);
    let net = a.analysis.net.as_ref().expect("a net section");
    assert!((net.props.area - (13800.0 - pipe)).abs() < 1e-6);
    run(&mut a, Cmd::ToggleHole);
    assert!(a.analysis.net.is_none());
    assert!((a.analysis.props.area - (13800.0 - pipe)).abs() < 1e-6);
}

#[test]
fn adds_copies_moves_and_deletes_parts() {
    let mut a = app(GIRDER);
    run(&mut a, Cmd::AddPart);
    repeat(&mut a, Cmd::Down, 11);
    run(&mut a, Cmd::Commit);
    let parts = &a.analysis.document.parts;
    assert_eq!(parts.len(), 4);
    assert_eq!(parts[3].shape, "pipe");
    assert_eq!(a.part, 3);
    // A pipe of 100 × 5 mm at the origin: area π/4 (100² − 90²) added.
    let pipe = PI / 4.0 * (100.0f64.powi(2) - 90.0f64.powi(2));
    assert!((a.analysis.props.area - (13800.0 + pipe)).abs() < 1e-6);
    run(&mut a, Cmd::ToggleVoid);
    assert!((a.analysis.props.area - (13800.0 - pipe)).abs() < 1e-6);
    run(&mut a, Cmd::CopyPart);
    assert_eq!(a.analysis.document.parts.len(), 5);
    run(&mut a, Cmd::MoveUp);
    assert_eq!(a.part, 3);
    run(&mut a, Cmd::First);
    run(&mut a, Cmd::DeletePart);
    let names: Vec<_> = a
        .analysis
        .document
        .parts
        .iter()
        .map(|p| p.name.clone().unwrap())
        .collect();
    // The copy is numbered, not a second "pipe 4".
    assert_eq!(names, ["web", "bottom flange", "pipe 5", "pipe 4"]);
    // The comment at the top of the file survives all of it.
    assert!(a.text.starts_with("# Mezzanine bay 3, edge girder"));
}

/// Selects the column `col` of the parts table.
fn to_column(a: &mut App, col: Col) {
    a.col = a
        .columns()
        .iter()
        .position(|c| *c == col)
        .expect("the table has that column");
}

/// The last message, which must be an error.
fn refusal(a: &App) -> String {
    let (msg, err) = a.message.clone().expect("a message");
    assert!(err && msg.starts_with("refused"), "{msg}");
    msg
}

#[test]
fn changing_a_shape_keeps_the_part_in_place_in_one_undoable_edit() {
    let mut a = app(GIRDER);
    run(&mut a, Cmd::FlipX);
    let flipped = a.text.clone();
    // The top flange (300 × 16) becomes a pipe: its height becomes the diameter, the
    // wall comes at
    // the add-part sizes (100 × 5), where the flange was.
    run(&mut a, Cmd::ChangeShape);
    assert_eq!(
        a.mode,
        Mode::Choosing(Picker {
            row: 0,
            change: Some(0)
        }),
        "the picker opens on the part's own shape"
    );
    insta::assert_snapshot!("picker-change-80x24", screen(&a, 80, 24));
    repeat(&mut a, Cmd::Down, 11);
    run(&mut a, Cmd::Commit);
    let p = &a.analysis.document.parts[0];
    assert_eq!(
        (p.shape.as_str(), p.name.as_deref()),
        ("pipe", Some("top flange"))
    );
    assert!(p.flip_x && p.at.as_ref().unwrap()[1].value.text() == "hw + tf/2");
    // The flange's height carries over as the pipe's diameter (d = tf = 16).
    assert!(
        a.text
            .contains("shape = \"pipe\"\nd = \"tf\"\nt = 5\nat = [0, \"hw + tf/2\"]"),
        "{}",
        a.text
    );
    // Annulus: A = π/4 (D² − d²).
    let pipe = PI / 4.0 * (16.0f64.powi(2) - 6.0f64.powi(2));
    assert!((a.analysis.props.area - (13800.0 - 4800.0 + pipe)).abs() < 1e-6);
    run(&mut a, Cmd::Undo);
    assert_eq!(a.text, flipped, "one undo takes the whole change back");

    // The bottom flange (250 × 16) becomes an angle: b and h stay, t comes at 10.
    run(&mut a, Cmd::Last);
    to_column(&mut a, Col::Shape);
    run(&mut a, Cmd::Edit);
    assert!(matches!(
        a.mode,
        Mode::Choosing(Picker {
            change: Some(2),
            ..
        })
    ));
    repeat(&mut a, Cmd::Down, 8);
    run(&mut a, Cmd::Commit);
    let p = &a.analysis.document.parts[2];
    assert_eq!(p.shape, "angle");
    assert!(a
        .text
        .contains("shape = \"angle\"\nh = \"tf\"\nb = \"bf_bot\"\nt = 10\nat"));
    // Equal-thickness angle without root radius: A = t (b + h − t).
    let angle = 10.0 * (250.0 + 16.0 - 10.0);
    assert!((a.analysis.props.area - (13800.0 - 4000.0 + angle)).abs() < 1e-6);

    // The web (10 wide) as a box with 8 mm walls has no hollow: refused, nothing changes.
    let before = a.text.clone();
    a.part = 1;
    run(&mut a, Cmd::ChangeShape);
    run(&mut a, Cmd::Down);
    repeat(&mut a, Cmd::Down, 9);
    run(&mut a, Cmd::Commit);
    assert_eq!(a.text, before);
    assert!(refusal(&a).contains("hollow"));
    assert_eq!(a.mode, Mode::Main);
}

const NOSING: &str = include_str!("../sections/dock-nosing.toml");

#[test]
fn polygon_points_are_typed_as_a_list_and_written_in_place() {
    let mut a = app(NOSING);
    let area = a.analysis.props.area;
    to_column(&mut a, Col::Points);
    run(&mut a, Cmd::Edit);
    let Mode::Typing { line, .. } = &a.mode else {
        panic!("typing the points")
    };
    assert_eq!(
        line.text,
        "[[0, 0], [200, 0], [200, \"t\"], [\"t\", \"t\"], [\"t\", 150], [0, 150]]"
    );
    // Nonsense first: an unquoted name, then two points only. Each is refused with the
    // reason, and the line stays to be fixed.
    let set = |a: &mut App, s: &str| {
        if let Mode::Typing { line, .. } = &mut a.mode {
            *line = kern::tui::app::LineEdit::new(s);
        }
        key(a, KeyCode::Enter);
    };
    set(&mut a, "[[0, 0], [200, 0], [200, t]]");
    assert!(
        refusal(&a).contains("column 26: invalid string"),
        "{:?}",
        a.message
    );
    set(&mut a, "[[0, 0], [200, 0]]");
    assert!(
        refusal(&a).starts_with("refused: part `bent plate`: a polygon needs 3 or more points"),
        "{:?}",
        a.message
    );
    assert_eq!(a.text, NOSING);
    assert!(matches!(a.mode, Mode::Typing { .. }));
    // The plate without its upstand: a 200 × t strip.
    set(&mut a, "[[0, 0], [200, 0], [200, \"t\"], [0, \"t\"]]");
    assert_eq!(
        diff_lines(NOSING, &a.text),
        vec![(
            "points = [[0, 0], [200, 0], [200, \"t\"], [\"t\", \"t\"], [\"t\", 150], [0, 150]]"
                .to_string(),
            "points = [[0, 0], [200, 0], [200, \"t\"], [0, \"t\"]]".to_string()
        )]
    );
    // Shoelace area of the L it was: 200·12 + 12·138; of the strip: 200·12.
    assert!((area - a.analysis.props.area - 12.0 * 138.0).abs() < 1e-6);
}

#[test]
fn anchors_cycle_or_are_typed_and_flips_toggle() {
    let tri = "format = 1\nunits = \"mm\"\n\n[[parts]]\nshape = \"triangle\"\nb = 60\nh = 60\nanchor = \"origin\"\n";
    let mut a = app(tri);
    let c = |a: &App| (a.analysis.props.centroid.x, a.analysis.props.centroid.y);
    // Right triangle (0,0) (60,0) (0,60): centroid at the mean of the corners, (20, 20).
    assert!((c(&a).0 - 20.0).abs() < 1e-9 && (c(&a).1 - 20.0).abs() < 1e-9);
    run(&mut a, Cmd::FlipX);
    assert!((c(&a).0 + 20.0).abs() < 1e-9, "mirrored in x: {:?}", c(&a));
    run(&mut a, Cmd::FlipY);
    assert!((c(&a).1 + 20.0).abs() < 1e-9, "mirrored in y: {:?}", c(&a));
    to_column(&mut a, Col::Flip);
    assert!(screen(&a, 100, 20).contains("xy"));
    run(&mut a, Cmd::FlipX);
    assert!(a.text.contains("flip_x = false\nflip_y = true"));
    // Next after origin is bottom_left: the mirrored box (−60…0)×(−60…0) moves up by 60.
    run(&mut a, Cmd::FlipX);
    run(&mut a, Cmd::NextAnchor);
    assert!(a.text.contains("anchor = \"bottom_left\"\n"));
    assert!((c(&a).0 - 40.0).abs() < 1e-9 && (c(&a).1 - 40.0).abs() < 1e-9);
    run(&mut a, Cmd::PrevAnchor);
    run(&mut a, Cmd::PrevAnchor);
    assert!(a.text.contains("anchor = \"centroid\"\n"));
    assert!(c(&a).0.abs() < 1e-9 && c(&a).1.abs() < 1e-9);
    // Typed: a name from the list, or a wrong one refused with the list.
    to_column(&mut a, Col::Anchor);
    run(&mut a, Cmd::Edit);
    for _ in 0.."centroid".len() {
        key(&mut a, KeyCode::Backspace);
    }
    typed(&mut a, "middle");
    key(&mut a, KeyCode::Enter);
    assert!(refusal(&a).contains("top_right"));
    key(&mut a, KeyCode::Esc);
    run(&mut a, Cmd::Edit);
    for _ in 0.."centroid".len() {
        key(&mut a, KeyCode::Backspace);
    }
    typed(&mut a, "top_right");
    key(&mut a, KeyCode::Enter);
    assert!(a.text.contains("anchor = \"top_right\"\n"), "{}", a.text);
    // The same cell steps through the anchors with + and -.
    run(&mut a, Cmd::StepDown);
    assert!(a.text.contains("anchor = \"top\"\n"));
}

/// The help screen at `w`×`h`, scrolled line by line from the top until every one of
/// `needles` is in view.
fn help_showing(a: &mut App, w: u16, h: u16, needles: &[&str]) -> String {
    run(a, Cmd::First);
    for _ in 0..200 {
        let s = screen(a, w, h);
        if needles.iter().all(|n| s.contains(n)) {
            return s;
        }
        run(a, Cmd::Down);
    }
    panic!("{needles:?} never in view together:\n{}", screen(a, w, h))
}

#[test]
fn help_descriptions_wrap_in_their_own_column_and_scroll() {
    let mut a = app(GIRDER);
    run(&mut a, Cmd::Help);
    // The quit line and the one it wraps onto.
    let s = help_showing(&mut a, 120, 40, &["quit (asks", "changes)"]);
    let rows: Vec<Vec<char>> = s.lines().map(|l| l.chars().collect()).collect();
    let (r, c) = rows
        .iter()
        .enumerate()
        .find_map(|(r, l)| {
            let t: String = l.iter().collect();
            t.find("quit (asks").map(|b| (r, t[..b].chars().count()))
        })
        .expect("the quit key in the help");
    let next = &rows[r + 1];
    assert!(
        next[c - 18..c].iter().all(|ch| *ch == ' ') && next[c].is_alphabetic(),
        "the rest of the line stands under the description: {:?}",
        next.iter().collect::<String>()
    );
    // 80 × 24 holds one column: it scrolls, to the end and no further.
    a.screen = Rect::new(0, 0, 80, 24);
    run(&mut a, Cmd::Last);
    let Mode::Help(end) = a.mode else {
        panic!("help open")
    };
    assert!(end > 0);
    insta::assert_snapshot!("help-end-80x24", screen(&a, 80, 24));
    run(&mut a, Cmd::Up);
    assert_eq!(
        a.mode,
        Mode::Help(end - 1),
        "one line back from the end shows"
    );
    run(&mut a, Cmd::First);
    run(&mut a, Cmd::PageDown);
    let page = views::help::page_height(a.screen);
    assert_eq!(a.mode, Mode::Help(page.min(end)));
}

#[test]
fn save_round_trip_keeps_comments_and_notices_changes_on_disk() {
    let dir = scratch("save");
    let file = dir.join("girder.toml");
    std::fs::write(&file, GIRDER).unwrap();
    let mut a = App::new(
        GIRDER.into(),
        Some(file.clone()),
        Config::default(),
        Solver::Off,
    )
    .unwrap();
    run(&mut a, Cmd::SwitchList);
    run(&mut a, Cmd::StepUp);
    run(&mut a, Cmd::Save);
    let saved = std::fs::read_to_string(&file).unwrap();
    assert_eq!(saved, a.text);
    assert_eq!(
        diff_lines(GIRDER, &saved),
        vec![(
            "bf_top = 300   # top flange width".to_string(),
            "bf_top = 310   # top flange width".to_string()
        )]
    );
    assert!(!a.modified());
    // Someone else edits the file: the next save asks first.
    std::fs::write(&file, format!("{saved}\n# edited elsewhere\n")).unwrap();
    run(&mut a, Cmd::StepUp);
    run(&mut a, Cmd::Save);
    assert!(matches!(a.mode, Mode::AskOverwrite(_)));
    run(&mut a, Cmd::Cancel);
    assert!(std::fs::read_to_string(&file)
        .unwrap()
        .contains("edited elsewhere"));
    run(&mut a, Cmd::Save);
    run(&mut a, Cmd::Yes);
    assert_eq!(std::fs::read_to_string(&file).unwrap(), a.text);
    std::fs::remove_dir_all(&dir).unwrap();
}

#[test]
fn the_demo_saves_under_a_new_name_and_quitting_asks_first() {
    let dir = scratch("demo");
    let mut a = app(GIRDER);
    run(&mut a, Cmd::ToggleVoid);
    run(&mut a, Cmd::Quit);
    assert_eq!(a.mode, Mode::AskQuit);
    run(&mut a, Cmd::SaveAndQuit);
    assert!(
        matches!(a.mode, Mode::Typing { .. }),
        "the demo asks for a file name"
    );
    let name = dir.join("mine.toml");
    typed(&mut a, &name.display().to_string());
    key(&mut a, KeyCode::Enter);
    assert!(a.quit);
    assert_eq!(std::fs::read_to_string(&name).unwrap(), a.text);
    std::fs::remove_dir_all(&dir).unwrap();
}

#[test]
fn the_baseline_can_be_moved_and_reset() {
    let mut a = app(GIRDER);
    run(&mut a, Cmd::SwitchList);
    run(&mut a, Cmd::StepUp);
    // `b` asks first: a name typed in the wrong mode does not lose the baseline.
    run(&mut a, Cmd::SetBaseline);
    assert_eq!(a.mode, Mode::AskBaseline);
    run(&mut a, Cmd::Cancel);
    assert!(a.baseline.props.ixx < a.analysis.props.ixx, "unchanged");
    run(&mut a, Cmd::SetBaseline);
    run(&mut a, Cmd::Yes);
    assert_eq!(a.baseline.props.ixx, a.analysis.props.ixx);
    run(&mut a, Cmd::ResetBaseline);
    assert!(a.baseline.props.ixx < a.analysis.props.ixx);
}

#[test]
fn every_size_draws_without_panicking() {
    let mut a = app(GIRDER);
    for (w, h) in [
        (1, 1),
        (5, 3),
        (39, 11),
        (40, 12),
        (41, 30),
        (200, 12),
        (40, 80),
    ] {
        let s = screen(&a, w, h);
        assert_eq!(s.contains("Parts (3)"), w >= 40 && h >= 12, "{w}×{h}");
    }
    run(&mut a, Cmd::Help);
    screen(&a, 40, 12);
    a.mode = Mode::Choosing(Picker {
        row: 11,
        change: Some(2),
    });
    screen(&a, 40, 12);
}

#[test]
fn names_from_the_file_are_drawn_without_escape_sequences() {
    let text = GIRDER
        .replace("Edge girder, mezzanine bay 3", "Edge\\u001b[2J girder")
        .replace("name = \"web\"", "name = \"we\\u001b]0;x\\u0007b\"");
    let a = app(&text);
    let s = screen(&a, 120, 40);
    assert!(!s.contains('\u{1b}') && s.contains("Edge girder") && s.contains("web"));
}

#[test]
fn readme_key_list_is_generated_from_the_key_table() {
    let readme =
        std::fs::read_to_string(Path::new(env!("CARGO_MANIFEST_DIR")).join("README.md")).unwrap();
    let start = "<!-- keys:start -->\n";
    let (_, rest) = readme
        .split_once(start)
        .expect("README has the keys:start marker");
    let (listed, _) = rest
        .split_once("<!-- keys:end -->")
        .expect("keys:end marker");
    assert_eq!(
        listed,
        markdown(),
        "README key list is stale: paste `kern keys` between the markers"
    );
}

/// Sections shown in the snapshots (demo files of `sections/`).
const SNAP_SECTIONS: [&str; 4] = [
    "mezzanine-girder",
    "garage-lintel",
    "cored-plank",
    "crane-runway",
];

#[test]
fn snapshots_of_the_main_screen() {
    for name in SNAP_SECTIONS {
        let a = app(&section(&format!("{name}.toml")));
        insta::assert_snapshot!(format!("{name}-80x24"), screen(&a, 80, 24));
        insta::assert_snapshot!(format!("{name}-120x40"), screen(&a, 120, 40));
    }
}

#[test]
fn snapshots_of_help_picker_error_and_ascii() {
    let mut a = app(GIRDER);
    run(&mut a, Cmd::Help);
    insta::assert_snapshot!("help-80x24", screen(&a, 80, 24));
    insta::assert_snapshot!("help-120x40", screen(&a, 120, 40));
    run(&mut a, Cmd::Cancel);
    run(&mut a, Cmd::AddPart);
    insta::assert_snapshot!("picker-80x24", screen(&a, 80, 24));
    run(&mut a, Cmd::Cancel);
    // An error: a web with no height.
    run(&mut a, Cmd::Down);
    repeat(&mut a, Cmd::Right, 4);
    run(&mut a, Cmd::Edit);
    key(&mut a, KeyCode::End);
    typed(&mut a, " - hw");
    key(&mut a, KeyCode::Enter);
    insta::assert_snapshot!("refused-entry-80x24", screen(&a, 80, 24));
    commands::cancel(&mut a);
    run(&mut a, Cmd::ToggleAscii);
    insta::assert_snapshot!("ascii-80x24", screen(&a, 80, 24));
    let s = screen(&a, 80, 24);
    assert!(s.is_ascii(), "ASCII mode draws only ASCII");
}

#[test]
fn scrolling_the_results_back_up_answers_at_once() {
    let mut a = app(GIRDER);
    repeat(&mut a, Cmd::PageDown, 50);
    let far = a.results_scroll;
    assert!(
        far < 100,
        "scrolling stops near the end of the results, not at {far}"
    );
    run(&mut a, Cmd::PageUp);
    assert!(a.results_scroll < far);
}

#[test]
fn a_file_that_does_not_exist_starts_a_new_section() {
    let dir = scratch("new");
    let file = dir.join("cap-plate.toml");
    let text = kern::tui::starter(&file);
    let mut a = App::new(
        text.clone(),
        Some(file.clone()),
        Config::default(),
        Solver::Off,
    )
    .expect("the starter computes");
    assert_eq!(a.analysis.section.title.as_deref(), Some("cap-plate"));
    // A 200 × 20 plate: A = bh (Gere & Goodno, App. E case 1).
    assert_eq!(a.analysis.props.area, 4000.0);
    assert!(!file.exists(), "nothing is written before a save");
    run(&mut a, Cmd::Save);
    assert_eq!(std::fs::read_to_string(&file).unwrap(), text);
    std::fs::remove_dir_all(&dir).unwrap();
}

#[test]
fn a_refused_edit_leaves_the_kept_document_as_the_text() {
    use kern::file::edit::{Edit, Flag, Slot};
    let mut a = app(GIRDER);
    let before = a.text.clone();
    let bad = Edit::SetValue {
        part: 0,
        slot: Slot::Key("b".into()),
        entry: "no_such_param".into(),
    };
    assert!(!a.edit(bad), "an unknown param does not compute");
    assert_eq!(a.text, before);
    assert!(a.message.as_ref().is_some_and(|m| m.1));
    // The next edit starts from the text as it was, not from the refused one.
    let flip = Edit::Toggle {
        part: 1,
        flag: Flag::FlipY,
    };
    let want = flip.apply_to_text(&before).unwrap();
    assert!(a.edit(flip));
    assert_eq!(a.text, want);
    assert!(!a.text.contains("no_such_param"));
}

fn chord(app: &mut App, c: char, m: KeyModifiers) {
    handle_key(app, &KeyEvent::new(KeyCode::Char(c), m));
}

fn line_text(a: &App) -> String {
    match &a.mode {
        Mode::Typing { line, .. } => line.text.clone(),
        m => panic!("not typing: {m:?}"),
    }
}

#[test]
fn control_chords_edit_the_line_and_never_type_their_letter() {
    let ctrl = KeyModifiers::CONTROL;
    let mut a = app(GIRDER);
    run(&mut a, Cmd::SwitchList);
    run(&mut a, Cmd::Edit);
    let start = line_text(&a);
    // Chords without a meaning while typing do nothing at all.
    for c in ['t', 'g', 'x', 'v'] {
        chord(&mut a, c, ctrl);
    }
    chord(&mut a, 'q', KeyModifiers::ALT);
    assert_eq!(line_text(&a), start);
    // Ctrl-u deletes back to the start, Ctrl-k to the end.
    typed(&mut a, "12");
    chord(&mut a, 'b', ctrl);
    chord(&mut a, 'u', ctrl);
    assert_eq!(line_text(&a), "2");
    chord(&mut a, 'a', ctrl);
    chord(&mut a, 'k', ctrl);
    assert_eq!(line_text(&a), "");
    typed(&mut a, "bf + 2*tw");
    // Ctrl-w deletes the word before the cursor; Ctrl-h is a backspace.
    chord(&mut a, 'w', ctrl);
    assert_eq!(line_text(&a), "bf + 2*");
    chord(&mut a, 'h', ctrl);
    assert_eq!(line_text(&a), "bf + 2");
    // Alt-b, Alt-f move by words; Ctrl-f, Ctrl-d move and delete forward.
    chord(&mut a, 'b', KeyModifiers::ALT);
    chord(&mut a, 'b', KeyModifiers::ALT);
    chord(&mut a, 'd', ctrl);
    assert_eq!(line_text(&a), "f + 2");
    chord(&mut a, 'f', KeyModifiers::ALT);
    chord(&mut a, 'f', ctrl);
    typed(&mut a, "x");
    assert_eq!(line_text(&a), "f x+ 2");
    chord(&mut a, 'e', ctrl);
    typed(&mut a, "u");
    assert_eq!(line_text(&a), "f x+ 2u");
}

#[test]
fn the_help_never_splits_a_group_from_its_heading() {
    let mut a = app(GIRDER);
    run(&mut a, Cmd::Help);
    let heading = "History, baseline and file";
    let s = help_showing(&mut a, 120, 40, &[heading, "quit (asks"]);
    // The history group: its heading and every key of it in one column, in view.
    let col_of = |needle: &str| {
        s.lines()
            .enumerate()
            .find_map(|(r, l)| l.find(needle).map(|b| (r, l[..b].chars().count())))
            .unwrap_or_else(|| panic!("{needle} in view:\n{s}"))
    };
    let (hr, hc) = col_of(heading);
    for key in ["undo", "redo", "quit (asks"] {
        let (r, c) = col_of(key);
        assert!(r > hr && c == hc + 18, "{key} under its heading:\n{s}");
    }
}

#[test]
fn saving_onto_another_file_asks_plainly_and_a_new_name_asks_nothing() {
    let dir = scratch("save-as");
    let other = dir.join("other.toml");
    std::fs::write(&other, "# someone's file\n").unwrap();
    let mut a = app(GIRDER);
    run(&mut a, Cmd::SaveAs);
    typed(&mut a, &other.display().to_string());
    key(&mut a, KeyCode::Enter);
    assert!(matches!(a.mode, Mode::AskOverwrite(_)));
    let s = screen(&a, 120, 40);
    assert!(
        // The path's length (the test's pid) decides where the line wraps.
        s.contains("other.toml exists;") && s.contains("overwrite?") && s.contains("y/n"),
        "{s}"
    );
    assert!(!s.contains("changed on disk"), "{s}");
    run(&mut a, Cmd::Cancel);
    let fresh = dir.join("fresh.toml");
    run(&mut a, Cmd::SaveAs);
    typed(&mut a, &fresh.display().to_string());
    key(&mut a, KeyCode::Enter);
    assert_eq!(a.mode, Mode::Main, "a new name is simply written");
    assert_eq!(std::fs::read_to_string(&fresh).unwrap(), a.text);
    // The file itself changed by someone else: that is what the question says.
    std::fs::write(&fresh, "# edited elsewhere\n").unwrap();
    run(&mut a, Cmd::Save);
    let s = screen(&a, 120, 40);
    assert!(
        s.contains("has changed on") && !s.contains("exists;"),
        "{s}"
    );
    std::fs::remove_dir_all(&dir).unwrap();
}

#[test]
fn a_refused_value_says_what_is_wrong_not_where_in_the_file() {
    let mut a = app(GIRDER);
    to_column(&mut a, Col::Dim("h"));
    run(&mut a, Cmd::Edit);
    chord(&mut a, 'u', KeyModifiers::CONTROL);
    typed(&mut a, "0");
    key(&mut a, KeyCode::Enter);
    let (msg, err) = a.message.clone().unwrap();
    assert!(err, "{msg}");
    assert_eq!(msg, "refused: `h` must be greater than 0, but it is 0");
}

#[test]
fn up_and_down_steps_reverse_each_other() {
    // The web height `hw` is a bare param, stepped through the params list.
    let mut a = app(GIRDER);
    run(&mut a, Cmd::SwitchList);
    repeat(&mut a, Cmd::Down, 3);
    let hw = |a: &App| a.analysis.section.params["hw"];
    // 350 → 400 → 350 (not 300) with the coarse 25 % step. Values on the grid of their
    // step; one off it (210) is first put on it, by design (round numbers).
    for start in [350.0, 400.0, 1000.0, 16.0, 200.0, 250.0, 3.0, 0.8] {
        for (cmd, back) in [
            (Cmd::CoarseUp, Cmd::CoarseDown),
            (Cmd::CoarseDown, Cmd::CoarseUp),
            (Cmd::StepUp, Cmd::StepDown),
            (Cmd::StepDown, Cmd::StepUp),
            (Cmd::FineUp, Cmd::FineDown),
            (Cmd::FineDown, Cmd::FineUp),
        ] {
            run(&mut a, Cmd::Edit);
            chord(&mut a, 'u', KeyModifiers::CONTROL);
            typed(&mut a, &start.to_string());
            key(&mut a, KeyCode::Enter);
            assert_eq!(hw(&a), start);
            run(&mut a, cmd);
            assert_ne!(hw(&a), start, "{cmd:?} moved {start}");
            run(&mut a, back);
            assert_eq!(hw(&a), start, "{start}: {cmd:?} then {back:?}");
        }
    }
    run(&mut a, Cmd::Edit);
    chord(&mut a, 'u', KeyModifiers::CONTROL);
    typed(&mut a, "350");
    key(&mut a, KeyCode::Enter);
    run(&mut a, Cmd::CoarseUp);
    assert_eq!(hw(&a), 400.0);
}

/// Changes the selected part's shape to `name` through the picker.
fn change_to(a: &mut App, name: &str) {
    run(a, Cmd::ChangeShape);
    let row = kern::model::schema::SPECS
        .iter()
        .position(|s| s.name == name)
        .expect("a shape of that name");
    if let Mode::Choosing(p) = &mut a.mode {
        p.row = row;
    }
    run(a, Cmd::Commit);
}

#[test]
fn home_and_end_move_columns_and_the_column_is_kept_by_its_key() {
    let mut a = app(GIRDER);
    run(&mut a, Cmd::Down);
    run(&mut a, Cmd::LastColumn);
    assert_eq!(a.col, a.columns().len() - 1);
    assert_eq!(a.part, 1, "End stays on the row");
    run(&mut a, Cmd::FirstColumn);
    assert_eq!(a.col, 0);
    // The web becomes a circle: the table's columns change, the cursor stays on `at y`.
    to_column(&mut a, Col::AtY);
    change_to(&mut a, "circle");
    assert_eq!(a.column(), Col::AtY);
    // On `b` of the top flange, moving to the circle (no `b`) lands on its `d`, and
    // back on the flange keeps `d`'s neighbour rule: the flange has no `d`, so `b`.
    run(&mut a, Cmd::Up);
    to_column(&mut a, Col::Dim("b"));
    run(&mut a, Cmd::Down);
    assert_eq!(a.column(), Col::Dim("d"));
    run(&mut a, Cmd::Up);
    assert_eq!(a.column(), Col::Dim("b"));
}

#[test]
fn copies_are_numbered_and_a_new_shape_keeps_the_overall_size() {
    let mut a = app(GIRDER);
    run(&mut a, Cmd::CopyPart);
    run(&mut a, Cmd::CopyPart);
    let names: Vec<_> = a
        .analysis
        .document
        .parts
        .iter()
        .map(|p| p.name.clone().unwrap_or_default())
        .collect();
    assert_eq!(
        names[..3],
        ["top flange", "top flange 2", "top flange 3"],
        "{names:?}"
    );
    run(&mut a, Cmd::Undo);
    assert_eq!(a.analysis.document.parts.len(), 4, "one undo per copy");
    // A circle of d = 120 becomes a 120 × 120 rectangle, not 100 × 50.
    let mut a = app(GIRDER);
    change_to(&mut a, "circle");
    to_column(&mut a, Col::Dim("d"));
    run(&mut a, Cmd::Edit);
    chord(&mut a, 'u', KeyModifiers::CONTROL);
    typed(&mut a, "120");
    key(&mut a, KeyCode::Enter);
    change_to(&mut a, "rect");
    let p = &a.analysis.document.parts[0];
    assert_eq!(p.dim("b").map(|v| v.value.text()).as_deref(), Some("120"));
    assert_eq!(p.dim("h").map(|v| v.value.text()).as_deref(), Some("120"));
}

#[test]
fn copy_names_take_the_next_free_number() {
    use kern::tui::commands::parts::copy_name;
    assert_eq!(copy_name("bolt hole", &["bolt hole"]), "bolt hole 2");
    assert_eq!(
        copy_name("bolt hole", &["bolt hole", "bolt hole 2"]),
        "bolt hole 3"
    );
    assert_eq!(copy_name("web 2", &["web 2"]), "web 3");
}

#[test]
fn enter_on_the_sign_cell_asks_solid_or_void() {
    let mut a = app(GIRDER);
    to_column(&mut a, Col::Sign);
    key(&mut a, KeyCode::Enter);
    assert_eq!(a.mode, Mode::AskVoid(0), "a choice, not a silent toggle");
    assert_eq!(a.text, GIRDER);
    let s = screen(&a, 120, 40);
    assert!(s.contains("top flange is solid. Make it a void"), "{s}");
    key(&mut a, KeyCode::Esc);
    assert_eq!(a.text, GIRDER);
    key(&mut a, KeyCode::Enter);
    key(&mut a, KeyCode::Char('y'));
    assert!(a.analysis.document.parts[0].void);
}

#[test]
fn the_results_page_by_their_height_and_mark_only_what_is_hidden() {
    let mut a = app(GIRDER);
    a.screen = Rect::new(0, 0, 80, 24);
    let s = screen(&a, 80, 24);
    assert!(s.contains("PgDn ▾") && !s.contains("PgUp ▴"), "{s}");
    run(&mut a, Cmd::PageDown);
    let page = a.results_scroll;
    assert_eq!(page, kern::tui::views::results_page(&a));
    assert!(page > 5, "a page, not a few lines: {page}");
    repeat(&mut a, Cmd::PageDown, 20);
    let s = screen(&a, 80, 24);
    assert!(s.contains("PgUp ▴") && !s.contains("PgDn ▾"), "{s}");
}

#[test]
fn the_caution_takes_one_line_at_80_columns_and_stays() {
    let a = app(GIRDER);
    let s = screen(&a, 80, 24);
    let last: Vec<&str> = s.lines().rev().take(2).collect();
    assert!(last[0].contains("Caution: mechanics only"), "{s}");
    assert!(last[0].contains("licensed engineer decides"), "{s}");
    assert!(!last[1].contains("Caution"), "one line: {s}");
}

/// At the smallest window (40×12) a value is shown whole with its unit or as `…`, never
/// cut into another unit: `352.0 mm` must not show as `352.0 m`. There is no room for
/// a drawing there: the parts table takes the column and one line says so, rather than
/// an empty pane.
#[test]
fn the_smallest_window_never_cuts_a_unit() {
    let a = app(&section("mezzanine-girder.toml"));
    let s = screen(&a, 40, 12);
    assert!(!s.contains(" m│"), "a millimetre value cut to metres:\n{s}");
    assert!(s.contains("drawing needs more room"), "{s}");
    assert!(!s.contains("Section to scale"), "{s}");
    insta::assert_snapshot!("mezzanine-girder-40x12", s);
}

#[test]
fn the_baseline_gets_its_torsion_when_edited_before_the_first_solve_ends() {
    // An edit right after opening cancels the solve of the file as opened; the
    // baseline is then solved after the current section, so the change column of J,
    // Cw and the shear centre has both sides.
    let solver = Solver::Thread(kern::tui::worker::Worker::spawn());
    let mut a = App::new(GIRDER.to_string(), None, Config::default(), solver).expect("valid");
    run(&mut a, Cmd::StepUp);
    let t0 = std::time::Instant::now();
    while (a.analysis.torsion.is_none() || a.baseline.torsion.is_none())
        && t0.elapsed() < std::time::Duration::from_secs(120)
    {
        a.poll_solver();
        std::thread::sleep(std::time::Duration::from_millis(20));
    }
    assert!(matches!(a.baseline.torsion, Some(Ok(_))));
    assert!(matches!(a.analysis.torsion, Some(Ok(_))));
}

/// At 80 columns the legend wraps onto the lines it needs, so every mark drawn is
/// explained: the neutral axis under `[actions]` and the void outline included.
#[test]
fn the_legend_explains_every_mark_at_80_columns() {
    let girder = screen(&app(&section("mezzanine-girder.toml")), 80, 24);
    for key in [
        "centroid",
        "axes",
        "kern",
        "T C extreme fibres",
        "neutral axis",
    ] {
        assert!(girder.contains(key), "{key} missing:\n{girder}");
    }
    let plank = screen(&app(&section("cored-plank.toml")), 80, 24);
    assert!(plank.contains("╌ void"), "{plank}");
}

/// In ASCII mode (one character a cell) the bolt holes of the hanger's flange still
/// show in the void's character, not hidden under the flange's outline.
#[test]
fn ascii_mode_draws_holes_and_voids() {
    for name in ["canopy-hanger.toml", "cored-plank.toml"] {
        let mut a = app(&section(name));
        run(&mut a, Cmd::ToggleAscii);
        let s = screen(&a, 80, 24);
        // The drawing pane's rows, less its legend.
        let drawing: String = s
            .lines()
            .skip_while(|l| !l.contains("Section to scale"))
            .skip(1)
            .take_while(|l| !l.starts_with("\"+-"))
            .filter(|l| !l.contains("centroid") && !l.contains("void"))
            .map(|l| l.chars().skip(2).take(43).collect::<String>())
            .collect();
        assert!(!drawing.is_empty(), "{name}: no drawing:\n{s}");
        assert!(drawing.contains('o'), "{name}: no void drawn:\n{s}");
        assert!(s.contains("o void"), "{name}: legend\n{s}");
    }
}

/// The change column reads the right way. A wider top flange takes compression off
/// the girder's top fibre, so σmin (negative) rises towards zero: its magnitude is
/// lower, shown `↓` although the signed value went up. J, Cw, the shear centre and
/// Mcr keep a change (the baseline's torsion is solved too); the finite-element
/// error estimate has none; a coordinate that stays at zero reads `=`.
#[test]
fn changes_read_as_magnitudes_for_stresses_and_every_result_keeps_one() {
    let mut a = App::new(GIRDER.to_string(), None, Config::default(), Solver::Inline)
        .expect("valid section");
    let before = a
        .analysis
        .stress
        .as_ref()
        .unwrap()
        .extremes
        .max_compression
        .value;
    run(&mut a, Cmd::SwitchList);
    repeat(&mut a, Cmd::StepUp, 4);
    let after = a
        .analysis
        .stress
        .as_ref()
        .unwrap()
        .extremes
        .max_compression
        .value;
    assert!(before < after && after < 0.0, "{before} → {after}");
    let s = screen(&a, 120, 90);
    let line = |sym: &str| {
        s.lines()
            .find_map(|l| {
                let panel = l.split("││").nth(1)?;
                panel
                    .starts_with(&format!("{sym} "))
                    .then(|| panel.to_string())
            })
            .unwrap_or_else(|| panic!("no row {sym}:\n{s}"))
    };
    assert!(line("σmin").contains('↓'), "{}", line("σmin"));
    for sym in ["J", "Cw", "ys", "Mcr", "Sx,top"] {
        let l = line(sym);
        assert!(l.contains('↑') || l.contains('↓'), "{sym}: {l}");
    }
    assert!(line("xs").contains(" ="), "{}", line("xs"));
    let err = line("err");
    assert!(
        !err.contains('↑') && !err.contains('↓') && !err.contains(" ="),
        "{err}"
    );
    assert!(s.contains("↑ higher ↓ lower"), "the legend: {s}");
}

/// The results pane's title fits its border at 80 columns (it was cut to
/// "(change vs file as ope"), and says it all where there is room.
#[test]
fn the_results_title_fits_at_80_columns() {
    let a = app(GIRDER);
    let s = screen(&a, 80, 24);
    assert!(s.contains("Results  (vs file as opened)"), "{s}");
    let s = screen(&a, 120, 40);
    assert!(s.contains("Results  (change vs file as opened)"), "{s}");
}

/// With `notation = "yz"` the panel names the moduli W and the axes y–z, from the
/// same table as the calc table and the sheet.
#[test]
fn the_panel_takes_the_notation_and_number_form_of_the_config() {
    let config = kern::tui::config::Config::parse("notation = \"yz\"\nnumbers = \"scientific\"")
        .expect("valid config");
    let a = App::new(GIRDER.to_string(), None, config, Solver::Off).expect("valid section");
    let s = screen(&a, 120, 40);
    assert!(
        s.contains("Wel,y,top") && s.contains("Iz ") && !s.contains("Sx,top"),
        "{s}"
    );
    assert!(s.contains("6.870e8"), "{s}");
}

/// Opens the window of the file's keys on the row that reads `text` (the first one).
fn to_row(a: &mut App, text: &str) {
    use kern::tui::commands::tables::{rows, Row};
    run(a, Cmd::OpenTables);
    let all = rows(a.doc());
    let at = all
        .iter()
        .position(|r| match r {
            Row::Key(_, k, v) => format!("{k} = {v}") == text,
            Row::Head(p, _) => p.label() == text,
            Row::NewMaterial => text == "new material",
        })
        .unwrap_or_else(|| panic!("no row {text}: {all:?}"));
    a.tables = Some(at);
}

#[test]
fn the_title_units_materials_actions_and_member_are_edited_in_place() {
    let lintel = section("garage-lintel.toml");
    let mut a = app(&lintel);
    to_row(
        &mut a,
        "title = \"Garage lintel, 2 angles 6 x 3-1/2 x 5/16\"",
    );
    run(&mut a, Cmd::Edit);
    run(&mut a, Cmd::KillToStart);
    typed(&mut a, "Garage lintel, door 2");
    key(&mut a, KeyCode::Enter);
    assert_eq!(
        diff_lines(&lintel, &a.text),
        vec![(
            "title = \"Garage lintel, 2 angles 6 x 3-1/2 x 5/16\"".to_string(),
            "title = \"Garage lintel, door 2\"".to_string()
        )]
    );
    assert!(a.tables.is_some(), "the window stays open for the next key");
    // A material's modulus: the deflection 5wL⁴/(384EI) goes as 1/E (Gere & Goodno,
    // Mechanics of Materials, App. G, simple beam under a uniform load).
    let defl = a.analysis.member.as_ref().unwrap().deflection_max.unwrap();
    to_row(&mut a, "E = \"29000 ksi\"");
    run(&mut a, Cmd::Edit);
    run(&mut a, Cmd::KillToStart);
    typed(&mut a, "14500 ksi");
    key(&mut a, KeyCode::Enter);
    let now = a.analysis.member.as_ref().unwrap().deflection_max.unwrap();
    assert!(
        (now / defl - 2.0).abs() < 1e-9,
        "half E, twice the deflection: {defl} → {now}"
    );
    // The member's span: a key that is not there is refused with the reader's hint.
    to_row(&mut a, "[member]");
    run(&mut a, Cmd::AddKey);
    typed(&mut a, "spam = 3");
    key(&mut a, KeyCode::Enter);
    assert!(refusal(&a).contains("span"), "{}", refusal(&a));
    key(&mut a, KeyCode::Esc);
    // [actions] is made when the file has none, after the member.
    to_row(&mut a, "[actions]");
    run(&mut a, Cmd::AddKey);
    typed(&mut a, "Mx = 20 kip*ft");
    key(&mut a, KeyCode::Enter);
    assert!(a.text.trim_end().ends_with("[actions]\nMx = \"20 kip*ft\""));
    assert!(a.analysis.stress.is_some());
    // Removing the member takes the whole table; u brings it back.
    to_row(&mut a, "[member]");
    run(&mut a, Cmd::RemoveKey);
    assert!(!a.text.contains("[member]") && a.analysis.member.is_none());
    run(&mut a, Cmd::Undo);
    assert!(a.text.contains("[member]\nspan = \"9 ft\""));
    // A second material, typed as key = value pairs, ahead of nothing else changing.
    to_row(&mut a, "new material");
    run(&mut a, Cmd::Edit);
    typed(&mut a, "timber");
    key(&mut a, KeyCode::End);
    typed(&mut a, "11 GPa");
    key(&mut a, KeyCode::Enter);
    assert!(
        a.text
            .contains("[[materials]]\nname = \"timber\"\nE = \"11 GPa\"\n"),
        "{}",
        a.text
    );
    assert!(a.text.contains("# root radius"), "comments stay");
    // Units: the numbers stay as written (the message line says so in the window).
    to_row(&mut a, "units = \"in\"");
    run(&mut a, Cmd::Edit);
    run(&mut a, Cmd::KillToStart);
    typed(&mut a, "mm");
    key(&mut a, KeyCode::Enter);
    assert_eq!(a.analysis.section.units.name(), "mm");
    run(&mut a, Cmd::Cancel);
    assert!(a.tables.is_none());
}

#[test]
fn params_are_added_renamed_with_every_use_and_removed_only_when_unused() {
    let lintel = section("garage-lintel.toml");
    let mut a = app(&lintel);
    run(&mut a, Cmd::SwitchList);
    // `t` is used by both angles: removing it is refused, naming where.
    run(&mut a, Cmd::Down);
    run(&mut a, Cmd::DeletePart);
    let m = refusal(&a);
    assert!(m.contains("part 1 t") && m.contains("part 2 t"), "{m}");
    assert_eq!(a.text, lintel);
    // Renamed (in the window of the file's keys), every use follows, and the results
    // are the same.
    let ixx = a.analysis.props.ixx;
    to_row(&mut a, "t = 0.3125");
    run(&mut a, Cmd::Rename);
    run(&mut a, Cmd::KillToStart);
    typed(&mut a, "t_leg");
    key(&mut a, KeyCode::Enter);
    assert_eq!(a.text.matches("t = \"t_leg\"").count(), 2);
    assert!(a.text.contains("t_leg = 0.3125     # leg thickness"));
    assert_eq!(a.analysis.props.ixx, ixx);
    // A name already taken is refused.
    run(&mut a, Cmd::Rename);
    run(&mut a, Cmd::KillToStart);
    typed(&mut a, "gap");
    key(&mut a, KeyCode::Enter);
    assert!(refusal(&a).contains("already"), "{}", refusal(&a));
    key(&mut a, KeyCode::Esc);
    run(&mut a, Cmd::Cancel);
    // Added from the params list, then removed (nothing uses it).
    run(&mut a, Cmd::AddPart);
    typed(&mut a, "lap = 2*t_leg");
    key(&mut a, KeyCode::Enter);
    assert!(a.text.contains("lap = \"2*t_leg\""));
    run(&mut a, Cmd::Last);
    run(&mut a, Cmd::DeletePart);
    assert!(!a.text.contains("lap"));
    run(&mut a, Cmd::Undo);
    run(&mut a, Cmd::Undo);
    run(&mut a, Cmd::Undo);
    assert_eq!(a.text, lintel);
}

#[test]
fn snapshots_of_the_keys_window() {
    let mut a = app(&section("garage-lintel.toml"));
    to_row(&mut a, "fy = \"36 ksi\"");
    insta::assert_snapshot!("keys-80x24", screen(&a, 80, 24));
    insta::assert_snapshot!("keys-40x12", screen(&a, 40, 12));
    run(&mut a, Cmd::Edit);
    insta::assert_snapshot!("keys-typing-80x24", screen(&a, 80, 24));
}

#[test]
fn the_open_file_is_followed_on_disk() {
    let dir = scratch("watch");
    let file = dir.join("lintel.toml");
    let lintel = section("garage-lintel.toml");
    std::fs::write(&file, &lintel).unwrap();
    let mut a = App::new(
        lintel.clone(),
        Some(file.clone()),
        Config::default(),
        Solver::Off,
    )
    .unwrap();
    run(&mut a, Cmd::Down);
    let baseline = a.baseline.props.ixx;
    commands::follow_disk(&mut a);
    assert_eq!(a.text, lintel, "nothing changed yet");
    // Edited elsewhere, no unsaved edits here: taken, selection and baseline kept.
    let thicker = lintel.replace("t = 0.3125", "t = 0.375");
    std::fs::write(&file, &thicker).unwrap();
    commands::follow_disk(&mut a);
    assert_eq!(a.text, thicker);
    assert!(!a.modified());
    assert_eq!(a.part, 1);
    assert_eq!(a.baseline.props.ixx, baseline, "the baseline stays");
    assert!(a.analysis.props.ixx > baseline);
    // A text that does not compute is not taken, and the message says where it is wrong.
    std::fs::write(&file, thicker.replace("h = 6 ", "h = -6 ")).unwrap();
    commands::follow_disk(&mut a);
    assert_eq!(a.text, thicker);
    let (m, err) = a.message.clone().unwrap();
    assert!(err && m.contains("lintel.toml:"), "{m}");
    // With unsaved edits it asks: keep mine, then take the disk's.
    std::fs::write(&file, &lintel).unwrap();
    commands::follow_disk(&mut a);
    run(&mut a, Cmd::FlipX);
    assert!(a.modified());
    let mine = a.text.clone();
    std::fs::write(&file, format!("{lintel}# edited elsewhere\n")).unwrap();
    commands::follow_disk(&mut a);
    assert!(matches!(a.mode, Mode::AskDisk(_)));
    let real = a.path.replace(PathBuf::from("lintel.toml"));
    insta::assert_snapshot!("disk-changed-80x24", screen(&a, 80, 24));
    a.path = real;
    key(&mut a, KeyCode::Char('n'));
    assert_eq!(a.text, mine);
    run(&mut a, Cmd::Save);
    assert!(matches!(a.mode, Mode::AskOverwrite(_)), "saving asks first");
    run(&mut a, Cmd::Cancel);
    std::fs::write(&file, format!("{lintel}# edited again\n")).unwrap();
    commands::follow_disk(&mut a);
    key(&mut a, KeyCode::Char('y'));
    assert!(a.text.ends_with("# edited again\n"));
    run(&mut a, Cmd::Undo);
    assert_eq!(a.text, mine, "my edits are one undo away");
    std::fs::remove_dir_all(&dir).unwrap();
}

const PLATE: &str = "format = 1\nunits = \"mm\"\n\n[params]\nb = 100\nh = 200   # depth\n\n[[parts]]\nname = \"plate\"\nshape = \"rect\"\nb = \"b\"\nh = \"h\"\n";

#[test]
fn seek_finds_the_depth_a_hand_calculation_gives_and_applies_it_as_one_edit() {
    let mut a = app(PLATE);
    run(&mut a, Cmd::SwitchList);
    run(&mut a, Cmd::Down);
    run(&mut a, Cmd::Seek);
    typed(&mut a, "Ixx = 1e8");
    key(&mut a, KeyCode::Enter);
    let Mode::AskSeek(found) = a.mode.clone() else {
        panic!("asks before taking: {:?} {:?}", a.mode, a.message)
    };
    // A rectangle: Ixx = b·h³/12, so h = (12·Ixx/b)^(1/3) (Gere & Goodno, App. E case 1).
    let h = (12.0 * 1e8 / 100.0f64).cbrt();
    assert!((found.value - h).abs() < 1e-6 * h, "{} vs {h}", found.value);
    insta::assert_snapshot!("seek-80x24", screen(&a, 80, 24));
    assert_eq!(a.text, PLATE, "nothing changes before the yes");
    key(&mut a, KeyCode::Char('y'));
    assert_eq!(
        diff_lines(PLATE, &a.text),
        vec![(
            "h = 200   # depth".to_string(),
            "h = 228.943   # depth".to_string()
        )]
    );
    assert!((a.analysis.props.ixx / 1e8 - 1.0).abs() < 1e-5);
    run(&mut a, Cmd::Undo);
    assert_eq!(a.text, PLATE);
    // No value of h gives a negative Ixx: refused, with the range Ixx runs over.
    run(&mut a, Cmd::Seek);
    typed(&mut a, "Ixx = -5");
    key(&mut a, KeyCode::Enter);
    let m = refusal(&a);
    assert!(
        m.contains("no value of h") && m.contains("runs from"),
        "{m}"
    );
    key(&mut a, KeyCode::Esc);
    // An unknown result names the nearest key.
    run(&mut a, Cmd::Seek);
    typed(&mut a, "inertia.xy2 = 3");
    key(&mut a, KeyCode::Enter);
    assert!(refusal(&a).contains("did you mean"), "{}", refusal(&a));
}

#[test]
fn params_are_ranked_by_what_they_buy() {
    let text = PLATE.replace(
        "\n[[parts]]",
        "\n[[materials]]\nname = \"steel\"\nE = \"200 GPa\"\ndensity = \"7850 kg/m3\"\n\n[[parts]]",
    );
    let mut a = app(&text);
    run(&mut a, Cmd::Rates);
    key(&mut a, KeyCode::Enter);
    let Mode::Rates(r) = a.mode.clone() else {
        panic!("the window opens: {:?} {:?}", a.mode, a.message)
    };
    // Ixx = b·h³/12 and m = ρ·b·h: per kg/m, h buys (b·h²/4)/(ρ·b) and b buys
    // (h³/12)/(ρ·h), three times less (Gere & Goodno, App. E case 1), so h ranks first.
    let h = r.lines.iter().position(|l| l.starts_with("h:")).unwrap();
    let b = r.lines.iter().position(|l| l.starts_with("b:")).unwrap();
    assert!(h < b, "{:?}", r.lines);
    insta::assert_snapshot!("rates-80x24", screen(&a, 80, 24));
    insta::assert_snapshot!("rates-40x12", screen(&a, 40, 12));
    run(&mut a, Cmd::Cancel);
    assert_eq!(a.mode, Mode::Main);
}

#[test]
fn a_sweep_plots_ixx_over_the_depth_and_marks_the_current_value() {
    let mut a = app(PLATE);
    run(&mut a, Cmd::SwitchList);
    run(&mut a, Cmd::Down);
    run(&mut a, Cmd::Sweep);
    key(&mut a, KeyCode::Enter);
    let Mode::Sweep(s) = a.mode.clone() else {
        panic!("the overlay opens: {:?} {:?}", a.mode, a.message)
    };
    // By default ±50 % of h = 200 in 21 points: 100 to 300 in steps of 10.
    assert_eq!(s.samples.len(), 21);
    assert_eq!(s.samples[0].value, 100.0);
    assert_eq!(s.samples[20].value, 300.0);
    assert_eq!(s.marked, Some(10));
    // A rectangle: Ixx = b·h³/12 (Gere & Goodno, App. E case 1) at every point, so
    // rising with h.
    for p in &s.samples {
        let want = 100.0 * p.value.powi(3) / 12.0;
        let got = *p.result.as_ref().unwrap();
        assert!(
            (got - want).abs() < 1e-9 * want,
            "h = {}: {got} vs {want}",
            p.value
        );
    }
    insta::assert_snapshot!("sweep-80x24", screen(&a, 80, 24));
    insta::assert_snapshot!("sweep-40x12", screen(&a, 40, 12));
    a.theme.ascii = true;
    insta::assert_snapshot!("sweep-ascii-80x24", screen(&a, 80, 24));
    a.theme.ascii = false;
    key(&mut a, KeyCode::Esc);
    assert_eq!(a.mode, Mode::Main);
    assert_eq!(a.text, PLATE, "a sweep changes nothing");
    // A typed range and number of points.
    run(&mut a, Cmd::Sweep);
    typed(&mut a, "Ixx 150 250 5");
    key(&mut a, KeyCode::Enter);
    let Mode::Sweep(s) = a.mode.clone() else {
        panic!("the overlay opens: {:?} {:?}", a.mode, a.message)
    };
    let hs: Vec<f64> = s.samples.iter().map(|p| p.value).collect();
    assert_eq!(hs, [150.0, 175.0, 200.0, 225.0, 250.0]);
    key(&mut a, KeyCode::Esc);
    // Values that do not compute are listed as such, the line broken there.
    run(&mut a, Cmd::Sweep);
    typed(&mut a, "Ixx -100 300 5");
    key(&mut a, KeyCode::Enter);
    let Mode::Sweep(s) = a.mode.clone() else {
        panic!("the overlay opens: {:?} {:?}", a.mode, a.message)
    };
    assert!(s.samples[0].result.is_err() && s.samples[4].result.is_ok());
    assert!(screen(&a, 80, 24).contains("do not compute"));
}

/// Runs git in `dir` (name and e-mail for this repository only); whether it succeeded.
fn git_in(dir: &Path, args: &[&str]) -> bool {
    std::process::Command::new("git")
        .arg("-C")
        .arg(dir)
        .args([
            "-c",
            "user.name=kern test",
            "-c",
            "user.email=test@example.invalid",
        ])
        .args(["-c", "commit.gpgsign=false"])
        .args(args)
        .output()
        .map(|o| o.status.success())
        .unwrap_or(false)
}

/// Collects a background sweep as the event loop does, until its overlay opens (a
/// guard against a hang, not a time target).
fn wait_for_sweep(a: &mut App) -> kern::tui::commands::sweep::Swept {
    let start = std::time::Instant::now();
    loop {
        commands::background::poll(a);
        if let Mode::Sweep(s) = &a.mode {
            return s.clone();
        }
        assert_eq!(a.mode, Mode::Working, "{:?}", a.message);
        assert!(start.elapsed().as_secs() < 300, "the sweep never finished");
        std::thread::sleep(std::time::Duration::from_millis(5));
    }
}

#[test]
fn a_sweep_with_torsion_runs_in_the_background_and_esc_stops_it() {
    let mut a = app(PLATE);
    run(&mut a, Cmd::SwitchList);
    run(&mut a, Cmd::Down);
    run(&mut a, Cmd::Sweep);
    typed(&mut a, "J 150 250 3");
    key(&mut a, KeyCode::Enter);
    // The key returns at once, before any value is solved: the screen says how far it
    // has got and how to stop it.
    assert_eq!(a.mode, Mode::Working, "{:?}", a.message);
    let s = screen(&a, 80, 24);
    assert!(
        s.contains("sweep of J over h") && s.contains("Esc stops it"),
        "{s}"
    );
    let swept = wait_for_sweep(&mut a);
    assert!(a.job.is_none());
    let hs: Vec<f64> = swept.samples.iter().map(|p| p.value).collect();
    assert_eq!(hs, [150.0, 200.0, 250.0]);
    // Saint-Venant torsion of a t × b rectangle (t ≤ b): J = (b·t³/3)·(1 − (192/π⁵)·(t/b)
    // ·Σ tanh(nπb/2t)/n⁵, n odd) (Timoshenko & Goodier, Theory of Elasticity, §109),
    // here t = 100 mm and b = h; the solve's tolerance is 1e-3, checked to 1 %.
    for p in &swept.samples {
        let (t, b) = (100.0f64, p.value);
        let sum: f64 = (0..20)
            .map(|k| (2 * k + 1) as f64)
            .map(|n| (n * PI * b / (2.0 * t)).tanh() / n.powi(5))
            .sum();
        let j = b * t.powi(3) / 3.0 * (1.0 - 192.0 / PI.powi(5) * t / b * sum);
        let got = *p.result.as_ref().unwrap();
        assert!((got - j).abs() < 0.01 * j, "h = {b}: J {got} against {j}");
    }
    key(&mut a, KeyCode::Esc);
    assert_eq!(a.mode, Mode::Main);
    // Esc while it runs stops it: the solves are cancelled and no overlay opens.
    run(&mut a, Cmd::Sweep);
    typed(&mut a, "J 100 300 201");
    key(&mut a, KeyCode::Enter);
    assert_eq!(a.mode, Mode::Working, "{:?}", a.message);
    key(&mut a, KeyCode::Esc);
    assert_eq!(a.mode, Mode::Main);
    assert!(a.job.is_none());
    let (note, _) = a.message.clone().unwrap();
    assert!(note.contains("sweep of J over h stopped"), "{note}");
    assert!(
        !commands::background::poll(&mut a),
        "nothing arrives after a stop"
    );
    assert_eq!(a.mode, Mode::Main);
}

/// Collects a background ranking as the event loop does, until its window opens (a
/// guard against a hang, not a time target).
fn wait_for_rates(a: &mut App) -> kern::tui::listing::Listing {
    let start = std::time::Instant::now();
    loop {
        commands::background::poll(a);
        if let Mode::Rates(l) = &a.mode {
            return l.clone();
        }
        assert_eq!(a.mode, Mode::Working, "{:?}", a.message);
        assert!(
            start.elapsed().as_secs() < 300,
            "the ranking never finished"
        );
        std::thread::sleep(std::time::Duration::from_millis(5));
    }
}

#[test]
fn a_ranking_by_j_runs_in_the_background_and_esc_stops_it() {
    let mut a = app(PLATE);
    run(&mut a, Cmd::Rates);
    typed(&mut a, "J");
    key(&mut a, KeyCode::Enter);
    // The key returns at once: the screen says how far the ranking has got.
    assert_eq!(a.mode, Mode::Working, "{:?}", a.message);
    let s = screen(&a, 80, 24);
    assert!(
        s.contains("ranking of the params by J") && s.contains("Esc stops it"),
        "{s}"
    );
    let r = wait_for_rates(&mut a);
    assert!(a.job.is_none());
    // Saint-Venant torsion of a t × b rectangle (t ≤ b): J = (t³/3)·(b − (192/π⁵)·t
    // ·Σ tanh(nπb/2t)/n⁵, n odd) (Timoshenko & Goodier, Theory of Elasticity, §109), so
    // dJ/db = (t³/3)·(1 − (96/π⁴)·Σ sech²(nπb/2t)/n⁴); here t = 100 mm and b = h = 200 mm.
    let (t, b) = (100.0f64, 200.0f64);
    let sum: f64 = (0..20)
        .map(|k| (2 * k + 1) as f64)
        .map(|n| (n * PI * b / (2.0 * t)).cosh().powi(-2) / n.powi(4))
        .sum();
    let want = t.powi(3) / 3.0 * (1.0 - 96.0 / PI.powi(4) * sum);
    let line = r.lines.iter().find(|l| l.starts_with("h:")).unwrap();
    // The rate as shown, `331 000 mm⁴ per mm of h` (groups of three set apart).
    let digits: String = line[2..]
        .split_whitespace()
        .take_while(|w| w.parse::<f64>().is_ok())
        .collect();
    let got: f64 = digits
        .parse()
        .unwrap_or_else(|_| panic!("a number in {line}"));
    // Three figures shown, and the solve's tolerance of 1e-3: checked to 2 %.
    assert!(
        (got - want).abs() < 0.02 * want,
        "dJ/dh {got} against {want}: {line}"
    );
    insta::assert_snapshot!("rates-j-80x24", screen(&a, 80, 24));
    run(&mut a, Cmd::Cancel);
    assert_eq!(a.mode, Mode::Main);
    // Esc while it runs stops it: no window opens, and nothing arrives later.
    run(&mut a, Cmd::Rates);
    typed(&mut a, "J");
    key(&mut a, KeyCode::Enter);
    assert_eq!(a.mode, Mode::Working, "{:?}", a.message);
    key(&mut a, KeyCode::Esc);
    assert_eq!(a.mode, Mode::Main);
    assert!(a.job.is_none());
    let (note, _) = a.message.clone().unwrap();
    assert!(
        note.contains("ranking of the params by J stopped"),
        "{note}"
    );
    assert!(
        !commands::background::poll(&mut a),
        "nothing arrives after a stop"
    );
    assert_eq!(a.mode, Mode::Main);
}

#[test]
fn compares_with_a_commit_chosen_from_the_list_or_another_file_side_by_side() {
    let dir = scratch("compare");
    let file = dir.join("plate.toml");
    std::fs::write(&file, PLATE).unwrap();
    assert!(git_in(&dir, &["init", "-q"]), "git init");
    assert!(git_in(&dir, &["add", "plate.toml"]));
    assert!(git_in(&dir, &["commit", "-qm", "plate 100 x 200"]));
    // A second commit whose subject carries a terminal escape: shown cleaned.
    std::fs::write(&file, PLATE.replace("h = 200", "h = 250")).unwrap();
    assert!(git_in(&dir, &["commit", "-qam", "deeper \x1b[31mplate"]));
    // The file now deeper than both commits: h = 300.
    let deeper = PLATE.replace("h = 200", "h = 300");
    std::fs::write(&file, &deeper).unwrap();
    let mut a = App::new(
        deeper.clone(),
        Some(file.clone()),
        Config::default(),
        Solver::Off,
    )
    .unwrap();
    run(&mut a, Cmd::Compare);
    let Mode::Revisions(r) = a.mode.clone() else {
        panic!("the list of commits opens: {:?} {:?}", a.mode, a.message)
    };
    // The last commit first.
    assert_eq!(r.commits.len(), 2);
    assert!(
        r.commits[0].subject.starts_with("deeper"),
        "{:?}",
        r.commits
    );
    assert_eq!(r.commits[1].subject, "plate 100 x 200");
    let list = screen(&a, 80, 24);
    assert!(
        !list.contains('\x1b') && list.contains("deeper plate"),
        "{list}"
    );
    // Enter takes the highlighted commit; Down moves to the earlier one.
    key(&mut a, KeyCode::Down);
    key(&mut a, KeyCode::Enter);
    let Mode::Compare(w) = a.mode.clone() else {
        panic!("the window opens: {:?} {:?}", a.mode, a.message)
    };
    assert_eq!(a.baseline_label, "earlier commit");
    assert!(w.head[0].contains("plate 100 x 200"), "{:?}", w.head);
    // Ixx = b·h³/12 (Gere & Goodno, App. E case 1): 66.67e6 mm⁴ at h = 200 and
    // 225.0e6 at 300, up (300/200)³ − 1 = 237.5 %.
    let ixx = w.lines.iter().find(|l| l.starts_with("Ixx ")).unwrap();
    assert!(ixx.contains("+238%") || ixx.contains("+237.5%"), "{ixx}");
    assert!((a.baseline.props.ixx - 100.0 * 200f64.powi(3) / 12.0).abs() < 1e-3);
    key(&mut a, KeyCode::Esc);
    assert_eq!(a.mode, Mode::Main);
    // Enter on the list at once: the last commit, h = 250.
    run(&mut a, Cmd::Compare);
    key(&mut a, KeyCode::Enter);
    assert_eq!(a.baseline_label, "last commit");
    assert!((a.baseline.props.ixx - 100.0 * 250f64.powi(3) / 12.0).abs() < 1e-3);
    key(&mut a, KeyCode::Esc);
    // A revision typed by hand (e from the list): HEAD~1: is the first commit.
    run(&mut a, Cmd::Compare);
    key(&mut a, KeyCode::Char('e'));
    typed(&mut a, "HEAD~1:");
    key(&mut a, KeyCode::Enter);
    assert!(matches!(a.mode, Mode::Compare(_)), "{:?}", a.message);
    assert!((a.baseline.props.ixx - 100.0 * 200f64.powi(3) / 12.0).abs() < 1e-3);
    key(&mut a, KeyCode::Esc);
    // Another file, typed.
    let other = dir.join("wide.toml");
    std::fs::write(&other, PLATE.replace("b = 100", "b = 150")).unwrap();
    run(&mut a, Cmd::Compare);
    key(&mut a, KeyCode::Char('e'));
    typed(&mut a, &other.display().to_string());
    key(&mut a, KeyCode::Enter);
    assert!(matches!(a.mode, Mode::Compare(_)), "{:?}", a.message);
    assert_eq!(a.baseline_label, "other file");
    key(&mut a, KeyCode::Esc);
    // A file git does not track: no list, and the line says so.
    let mut u = App::new(
        PLATE.to_string(),
        Some(other.clone()),
        Config::default(),
        Solver::Off,
    )
    .unwrap();
    run(&mut u, Cmd::Compare);
    assert!(matches!(u.mode, Mode::Typing { .. }), "{:?}", u.mode);
    let (note, _) = u.message.clone().unwrap();
    assert!(note.contains("no commit of"), "{note}");
    // The demo is in no repository: refused, saying what to type instead.
    let mut d = app(PLATE);
    run(&mut d, Cmd::Compare);
    let (note, _) = d.message.clone().unwrap();
    assert!(note.contains("in no git repository"), "{note}");
    key(&mut d, KeyCode::Enter);
    assert!(
        refusal(&d).contains("type a section file"),
        "{}",
        refusal(&d)
    );
}

#[test]
fn the_compare_window_has_both_designs_torsion_results() {
    // Solved inline (deterministic): the baseline's torsion is solved when it is set,
    // so J is compared too; a deeper plate twists less easily (J grows with h).
    let dir = scratch("compare-torsion");
    let other = dir.join("deeper.toml");
    std::fs::write(&other, PLATE.replace("h = 200", "h = 300")).unwrap();
    let mut a = App::new(PLATE.into(), None, Config::default(), Solver::Inline).unwrap();
    run(&mut a, Cmd::Compare);
    typed(&mut a, &other.display().to_string());
    key(&mut a, KeyCode::Enter);
    let Mode::Compare(l) = a.mode.clone() else {
        panic!("the window opens: {:?} {:?}", a.mode, a.message)
    };
    let j = l
        .lines
        .iter()
        .find(|l| l.starts_with("J "))
        .expect("a row of J");
    assert!(j.contains('−') && !j.contains('—'), "{j}");
    assert!(
        !l.lines.iter().any(|l| l.contains("under way")),
        "{:?}",
        l.lines
    );
}

#[test]
fn the_compare_window_scrolls_with_a_hint_of_what_is_out_of_view() {
    let dir = scratch("compare-scroll");
    let file = dir.join("plate.toml");
    std::fs::write(&file, PLATE).unwrap();
    assert!(git_in(&dir, &["init", "-q"]), "git init");
    assert!(git_in(&dir, &["add", "plate.toml"]));
    assert!(git_in(&dir, &["commit", "-qm", "plate"]));
    let deeper = PLATE.replace("h = 200", "h = 300");
    std::fs::write(&file, &deeper).unwrap();
    let mut a = App::new(deeper, Some(file), Config::default(), Solver::Off).unwrap();
    for (w, h) in [(80u16, 24u16), (40, 12), (120, 40)] {
        a.screen = Rect::new(0, 0, w, h);
        // Typed by hand (the hashes in the list change from run to run).
        run(&mut a, Cmd::Compare);
        key(&mut a, KeyCode::Char('e'));
        typed(&mut a, "HEAD:");
        key(&mut a, KeyCode::Enter);
        let Mode::Compare(l) = a.mode.clone() else {
            panic!("the window opens: {:?} {:?}", a.mode, a.message)
        };
        let below_title = |a: &App| {
            screen(a, w, h)
                .lines()
                .skip(1)
                .collect::<Vec<_>>()
                .join("\n")
        };
        let top = below_title(&a);
        // The rows overflow 80 × 24 and 40 × 12 (the plate has 19 rows of results).
        if h < 40 {
            assert!(
                top.contains("more below") && !top.contains("more above"),
                "{top}"
            );
            key(&mut a, KeyCode::End);
            let end = below_title(&a);
            assert!(
                end.contains("more above") && !end.contains("more below"),
                "{end}"
            );
            // The last row of results is in view at the end.
            let last = l.lines.last().unwrap().split_whitespace().next().unwrap();
            assert!(end.contains(last), "{last}: {end}");
            key(&mut a, KeyCode::PageUp);
            key(&mut a, KeyCode::Home);
            assert_eq!(below_title(&a), top, "Home goes back to the top");
            key(&mut a, KeyCode::Down);
            assert!(below_title(&a).contains("1 more above"));
            key(&mut a, KeyCode::End);
            insta::assert_snapshot!(format!("compare-end-{w}x{h}"), below_title(&a));
            key(&mut a, KeyCode::Home);
        } else {
            assert!(!top.contains("more below"), "{top}");
        }
        insta::assert_snapshot!(format!("compare-{w}x{h}"), top);
        key(&mut a, KeyCode::Esc);
        assert_eq!(a.mode, Mode::Main);
        // The list of commits, made here so that hashes and dates stay put; more
        // commits than rows keep the highlighted one in view.
        let commits = (0..12)
            .map(|i| Commit {
                hash: format!("{:07x}", 0xa1b2c3d + i),
                date: format!("2026-11-{:02}", 30 - i),
                subject: format!("mezzanine girder: flange {} mm", 300 + 10 * i),
            })
            .collect();
        a.mode = Mode::Revisions(Revisions { commits, row: 0 });
        for _ in 0..11 {
            key(&mut a, KeyCode::Down);
        }
        insta::assert_snapshot!(format!("revisions-{w}x{h}"), below_title(&a));
        key(&mut a, KeyCode::Esc);
        assert_eq!(a.mode, Mode::Main);
    }
}

#[test]
fn the_shear_group_shows_shear_areas_and_tau_once_solved() {
    // Solved inline (deterministic): a 60 × 120 mm rectangle, ν = 0, Vy = 36 kN, our own
    // lintel. The panel's "Shear" rows hold the shear areas (5A/6 = 6000 mm², Timoshenko
    // & Goodier §124) and τmax = 1.5·V/A = 7.5 MPa.
    let text =
        "format = 1\nunits = \"mm\"\n[[materials]]\nname = \"steel\"\nE = \"200 GPa\"\nnu = 0\n\
[[parts]]\nname = \"lintel\"\nshape = \"rect\"\nb = 60\nh = 120\n[actions]\nVy = \"36 kN\"\n";
    let a = App::new(text.to_string(), None, Config::default(), Solver::Inline).expect("valid");
    let shear = a.analysis.shear.as_ref().expect("the flexure solution ran");
    assert!(shear.areas.is_some() && shear.tau_max.is_some());
    let s = screen(&a, 120, 40);
    assert!(
        s.contains("Asy           6000 mm²") && s.contains("τmax         7.500 MPa"),
        "{s}"
    );
    insta::assert_snapshot!("shear-group-120x40", s);
}
