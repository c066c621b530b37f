//! Unsaved edits and the terminal when the workbench stops unexpectedly. The event loop
//! keeps a copy of unsaved text here ([`keep`]); a panic or a signal (SIGTERM, SIGHUP,
//! SIGINT, SIGQUIT) writes it as the recovery copy (`FILE.kern-recover`, see
//! [`crate::file::recover`]) and puts the terminal back before the process ends. In raw
//! mode Ctrl-C and Ctrl-\ are keys, not signals: Ctrl-C quits (asking if unsaved).

use super::app::App;
use crate::file::recover;
use signal_hook::consts::{SIGHUP, SIGINT, SIGQUIT, SIGTERM};
use signal_hook::iterator::Signals;
use std::path::PathBuf;
use std::sync::{Mutex, TryLockError};

/// The unsaved text and where its recovery copy goes; `None` when nothing is unsaved.
static UNSAVED: Mutex<Option<(PathBuf, String)>> = Mutex::new(None);

/// Notes the unsaved text of `app` (or that there is none).
pub fn keep(app: &App) {
    let want = app.modified().then_some(&app.text);
    let mut slot = UNSAVED.lock().unwrap_or_else(|e| e.into_inner());
    match (want, slot.as_mut()) {
        (None, _) => *slot = None,
        (Some(text), Some((_, kept))) if kept == text => {}
        (Some(text), _) => {
            *slot = recover::recovery_path(app.path.as_deref()).map(|p| (p, text.clone()));
        }
    }
}

/// Writes the recovery copy of the unsaved text, if any; the line to print says where
/// it went (or why it could not be written).
pub fn write_copy() -> Option<String> {
    let slot = match UNSAVED.try_lock() {
        Ok(s) => s,
        Err(TryLockError::Poisoned(e)) => e.into_inner(),
        // Held by the thread that stopped: better no copy than a deadlock.
        Err(TryLockError::WouldBlock) => return None,
    };
    let (at, text) = slot.as_ref()?;
    Some(match recover::write(at, text) {
        Ok(()) => format!(
            "kern: unsaved edits were written to {}; kern offers them the next time the file is opened",
            at.display()
        ),
        Err(e) => format!(
            "kern: could not write the unsaved edits to {}: {e}",
            at.display()
        ),
    })
}

/// Installs the panic hook (for a panic on the main thread, the recovery copy first;
/// then the hook already set, which
/// puts the terminal back) and a thread that, on a signal, writes the copy, puts the
/// terminal back and ends the process with status 128 + the signal's number.
pub fn install() -> std::io::Result<()> {
    let previous = std::panic::take_hook();
    std::panic::set_hook(Box::new(move |info| {
        // Only the event loop's own panic stops the workbench: a panic on the torsion
        // thread is reported on the screen and editing goes on.
        let main = std::thread::current().name() == Some("main");
        let said = if main { write_copy() } else { None };
        previous(info);
        if let Some(line) = said {
            crate::file::load::say(&line);
        }
    }));
    let mut signals = Signals::new([SIGTERM, SIGHUP, SIGINT, SIGQUIT])?;
    std::thread::Builder::new()
        .name("kern-signals".into())
        .spawn(move || {
            if let Some(sig) = signals.forever().next() {
                let said = write_copy();
                ratatui::restore();
                if let Some(line) = said {
                    crate::file::load::say(&line);
                }
                std::process::exit(128 + sig);
            }
        })?;
    Ok(())
}
