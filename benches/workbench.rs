//! The workbench's frame budget: one edit on a 200-part section — the new text read,
//! every property recomputed and the whole screen drawn into a test terminal — must fit
//! in one frame at 60 Hz (16 ms).

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

criterion_group!(benches, edit_recompute_redraw);
criterion_main!(benches);
