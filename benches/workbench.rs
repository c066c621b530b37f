//! The workbench's frame budget: one edit on a 200-part section — the new text read,
//! every property recomputed and the whole screen drawn into a test terminal — must fit
//! in one frame at 60 Hz (16 ms); and so must a frame (collecting the sweep, drawing
//! the screen) while a sweep with a torsion solve at every value runs in the
//! background.

use criterion::{criterion_group, criterion_main, Criterion};
use kern::tui::app::{App, Focus, Solver};
use kern::tui::commands::run;
use kern::tui::config::Config;
use kern::tui::keys::Cmd;
use kern::tui::views;
use ratatui::backend::TestBackend;
use ratatui::Terminal;
use std::fmt::Write as _;

/// A built-up section of 200 parts: a deck of 20 × 10 plates, 100 × 20 mm each, their
/// width set by one param (the value the benchmark steps).
fn section() -> String {
    let mut s = String::from(
        "format = 1\ntitle = \"Stacked deck plates\"\nunits = \"mm\"\n\n[params]\nw = 100\n",
    );
    for i in 0..200 {
        let (col, row) = (i % 20, i / 20);
        let x = col as f64 * 100.0;
        let y = row as f64 * 20.0;
        let _ = write!(
            s,
            "\n[[parts]]\nname = \"plate {i}\"\nshape = \"rect\"\nb = \"w\"\nh = 20\nat = [{x}, {y}]\n"
        );
    }
    s
}

fn edit_recompute_redraw(c: &mut Criterion) {
    let mut app = App::new(section(), None, Config::default(), Solver::Off).expect("valid");
    let mut term = Terminal::new(TestBackend::new(120, 40)).expect("terminal");
    app.focus = Focus::Params;
    let mut up = true;
    c.bench_function("edit + recompute + redraw, 200 parts, 120x40", |b| {
        b.iter(|| {
            run(&mut app, if up { Cmd::StepUp } else { Cmd::StepDown });
            up = !up;
            term.draw(|f| views::render(&app, f.area(), f.buffer_mut()))
                .expect("draw");
        })
    });
}

/// Starts a sweep of J over the first param of the bundled demo, 201 values, each
/// with its torsion solve, in the background.
fn start_sweep(app: &mut App) {
    use crossterm::event::{KeyCode, KeyEvent, KeyModifiers};
    app.mode = kern::tui::app::Mode::Main;
    app.focus = Focus::Params;
    run(app, Cmd::Sweep);
    for c in "J 200 400 201".chars() {
        kern::tui::handle_key(app, &KeyEvent::new(KeyCode::Char(c), KeyModifiers::NONE));
    }
    kern::tui::handle_key(app, &KeyEvent::new(KeyCode::Enter, KeyModifiers::NONE));
    assert!(app.job.is_some(), "{:?}", app.message);
}

fn frame_during_a_torsion_sweep(c: &mut Criterion) {
    let text = kern::tui::DEMO.to_string();
    let mut app = App::new(text, None, Config::default(), Solver::Off).expect("valid");
    let mut term = Terminal::new(TestBackend::new(120, 40)).expect("terminal");
    start_sweep(&mut app);
    c.bench_function("frame while a 201-value torsion sweep runs, 120x40", |b| {
        b.iter(|| {
            kern::tui::commands::background::poll(&mut app);
            if app.job.is_none() {
                start_sweep(&mut app);
            }
            term.draw(|f| views::render(&app, f.area(), f.buffer_mut()))
                .expect("draw");
        })
    });
}

criterion_group!(benches, edit_recompute_redraw, frame_during_a_torsion_sweep);
criterion_main!(benches);
