//! The terminal workbench: `kern FILE` opens a section for editing with live results.
//!
//! State and edits live in [`app`] and [`commands`] (no terminal needed, so tests drive
//! them directly); keys in one table ([`keys`]); each pane is a pure view ([`views`]) in
//! the look of [`theme`]; the torsion solve runs on a thread ([`worker`]). This module
//! only sets up the terminal, runs the event loop and puts the terminal back — on exit,
//! on error, on panic and on a signal ([`rescue`], which also keeps unsaved edits).

pub mod app;
pub mod columns;
pub mod commands;
pub mod config;
pub mod keys;
pub mod listing;
pub mod raster;
pub mod rescue;
pub mod shade;
pub mod theme;
pub mod views;
pub mod watch;
pub mod worker;

use crate::file::input::{read_text, ReadError};
use crate::numfmt::Numbers;
use crate::report::rows::Notation;
use app::{App, Mode, Solver};
use config::Config;
use crossterm::event::{self, Event, KeyEvent, KeyEventKind};
use keys::{lookup, Cmd, Ctx};
use std::path::PathBuf;
use std::time::Duration;
use worker::Worker;

/// The bundled demo section (opened by `kern` without a file).
pub const DEMO: &str = include_str!("../../sections/mezzanine-girder.toml");

/// The text of a new section for a file that does not exist yet: one plate to start
/// from, titled after the file.
pub fn starter(path: &std::path::Path) -> String {
    let stem = path
        .file_stem()
        .map_or("new section".into(), |s| s.to_string_lossy().into_owned());
    let title: String = stem
        .chars()
        .filter(|c| !c.is_control() && *c != '"' && *c != '\\')
        .collect();
    format!(
        "# {title}: say here what this section models.\n\
         format = 1\n\
         title = \"{title}\"\n\
         units = \"mm\"\n\
         \n\
         [params]\n\
         \n\
         [[parts]]\n\
         name = \"plate\"\n\
         shape = \"rect\"\n\
         b = 200\n\
         h = 20\n"
    )
}

/// How often the screen checks on a running torsion solve.
const SOLVE_POLL: Duration = Duration::from_millis(100);
/// How often the open file is looked at on disk (one `stat` each time).
const WATCH_POLL: Duration = Duration::from_millis(500);

/// Opens the workbench on `path` (the demo if `None`); returns the exit status: 2 for a
/// file that cannot be read or is not a valid section, as `kern calc` says it. The form
/// of numbers and the notation, when given, override the config file's.
pub fn run(path: Option<PathBuf>, numbers: Option<Numbers>, notation: Option<Notation>) -> i32 {
    let mut new_file = None;
    let text = match &path {
        None => DEMO.to_string(),
        Some(p) => match read_text(p) {
            Ok(t) => t,
            Err(ReadError::Missing) => {
                new_file = Some(format!(
                    "{}; the title is the file's name (o changes it)",
                    new_file_note(p)
                ));
                starter(p)
            }
            Err(e) => {
                crate::file::load::say(&e.line(p));
                return 2;
            }
        },
    };
    let (mut config, config_err) = Config::load();
    config.numbers = numbers.unwrap_or(config.numbers);
    config.notation = notation.unwrap_or(config.notation);
    let mut app = match App::new(
        text.clone(),
        path.clone(),
        config,
        Solver::Thread(Worker::spawn()),
    ) {
        Ok(a) => a,
        Err(d) => {
            let name = path.map_or("demo".into(), |p| p.display().to_string());
            crate::file::load::say(&crate::file::load::diagnostic_line(&name, &text, &d));
            return 2;
        }
    };
    if let Some(note) = new_file {
        app.note(note);
    }
    if let Some(e) = config_err {
        app.error(e);
    }
    app.offer_recovery();
    // ratatui::try_init also installs a panic hook that restores the terminal first.
    let mut terminal = match ratatui::try_init() {
        Ok(t) => t,
        Err(e) => {
            crate::file::load::say(&format!("kern: cannot use this terminal: {e}"));
            return 1;
        }
    };
    if let Err(e) = rescue::install() {
        app.error(format!(
            "cannot watch for signals ({e}): unsaved edits are not kept if kern is killed"
        ));
    }
    let result = event_loop(&mut terminal, &mut app);
    ratatui::restore();
    match result {
        Ok(()) => 0,
        Err(e) => {
            crate::file::load::say(&format!("kern: terminal error: {e}"));
            1
        }
    }
}

/// What the message line says about a section that does not exist yet; a dangling
/// symbolic link is named as such, with the file a save creates.
fn new_file_note(p: &std::path::Path) -> String {
    match std::fs::read_link(p) {
        Ok(to) => format!(
            "{} is a link to {}, which does not exist: saving (s) creates it",
            p.display(),
            to.display()
        ),
        Err(_) => "a new section: nothing is written until you save (s)".into(),
    }
}

fn event_loop(terminal: &mut ratatui::DefaultTerminal, app: &mut App) -> std::io::Result<()> {
    loop {
        let frame = terminal.draw(|f| views::render(app, f.area(), f.buffer_mut()))?;
        app.screen = frame.area;
        if app.quit {
            return Ok(());
        }
        // Block on input; wake up now and then to collect a running solve and to look
        // at the file on disk.
        let busy = app.solving || app.job.is_some();
        let wait = match (busy, app.path.is_some()) {
            (true, _) => Some(SOLVE_POLL),
            (false, true) => Some(WATCH_POLL),
            (false, false) => None,
        };
        let ev = match wait {
            Some(t) if !event::poll(t)? => None,
            _ => Some(event::read()?),
        };
        if app.poll_solver() {
            commands::compare::refresh(app);
        }
        commands::background::poll(app);
        commands::follow_disk(app);
        if let Some(Event::Key(k)) = ev {
            if k.kind != KeyEventKind::Release {
                handle_key(app, &k);
                rescue::keep(app);
            }
        }
    }
}

/// What a key press does in the current mode.
pub fn handle_key(app: &mut App, k: &KeyEvent) {
    let ctx = match app.mode {
        Mode::Main if app.tables.is_some() => Ctx::Tables,
        Mode::Main => Ctx::Main,
        Mode::Typing { .. } => Ctx::Typing,
        Mode::Choosing(_) => Ctx::Choosing,
        Mode::AskQuit
        | Mode::AskOverwrite(_)
        | Mode::AskReadOnly(_)
        | Mode::AskRecover(_)
        | Mode::AskBaseline
        | Mode::AskVoid(_)
        | Mode::AskDisk(_)
        | Mode::AskSeek(_)
        | Mode::Sweep(_)
        | Mode::Working => Ctx::Asking,
        Mode::Rates(_) | Mode::Compare(_) => Ctx::Window,
        Mode::Revisions(_) => Ctx::Revisions,
        Mode::Help(_) => Ctx::Help,
    };
    match (lookup(ctx, k), k.code) {
        (Some(cmd), _) => {
            if ctx == Ctx::Main && cmd != Cmd::Help {
                app.message = None;
            }
            commands::run(app, cmd);
        }
        // Other Ctrl and Alt chords do nothing; they never type their letter.
        (None, event::KeyCode::Char(c)) if ctx == Ctx::Typing && !keys::is_chord(k) => {
            commands::type_char(app, c)
        }
        _ => {}
    }
}
