//! Work that needs the torsion solve many times over (a sweep of J, the ranking of the
//! params by J…) runs on a thread of its own, itself parallel, while the screen shows
//! how far it has got: the thread counts what it has finished, the event loop collects
//! the outcome ([`poll`]), and Esc stops it through the solver's cancel flag ([`stop`]).

use crate::tui::app::{App, Mode};
use std::sync::atomic::{AtomicBool, AtomicUsize, Ordering};
use std::sync::mpsc::{channel, Receiver, TryRecvError};
use std::sync::Arc;

/// What a finished job does to the workbench (opens its window, or says why not).
pub type Finish = Box<dyn FnOnce(&mut App) + Send>;

/// A job under way: its outcome when done, how many of its pieces are finished, and the
/// flag that stops its torsion solves.
pub struct Job {
    /// What it is, `sweep of J over h`.
    pub what: String,
    /// What it counts, plural (`values`, `params`).
    pub pieces: &'static str,
    /// Why it takes a while, one sentence.
    pub why: &'static str,
    pub total: usize,
    done: Arc<AtomicUsize>,
    cancel: Arc<AtomicBool>,
    outcome: Receiver<Finish>,
}

impl Job {
    /// The pieces finished so far.
    pub fn done(&self) -> usize {
        self.done.load(Ordering::Relaxed).min(self.total)
    }

    /// Stops the job: its torsion solves end early and its outcome is never shown.
    fn cancel(&self) {
        self.cancel.store(true, Ordering::Relaxed);
    }
}

impl Drop for Job {
    fn drop(&mut self) {
        self.cancel();
    }
}

/// Starts `work` on a thread of its own and puts the workbench in [`Mode::Working`].
/// `work` counts its finished pieces in the counter it is given; `cancel` is the flag
/// its torsion solves watch.
pub fn start(
    app: &mut App,
    what: String,
    pieces: &'static str,
    why: &'static str,
    total: usize,
    cancel: Arc<AtomicBool>,
    work: impl FnOnce(&AtomicUsize) -> Finish + Send + 'static,
) {
    let done = Arc::new(AtomicUsize::new(0));
    let (tx, rx) = channel();
    let counter = done.clone();
    std::thread::spawn(move || {
        // The receiver is gone when the job was stopped: nothing to do then.
        let _ = tx.send(work(&counter));
    });
    app.message = None;
    app.job = Some(Job {
        what,
        pieces,
        why,
        total,
        done,
        cancel,
        outcome: rx,
    });
    app.mode = Mode::Working;
}

/// Takes the outcome of a background job when it is in and shows it; returns whether
/// anything changed on the screen (the count of pieces done moves while it runs).
pub fn poll(app: &mut App) -> bool {
    let Some(job) = &app.job else {
        return false;
    };
    match job.outcome.try_recv() {
        Err(TryRecvError::Empty) => true,
        Err(TryRecvError::Disconnected) => {
            app.job = None;
            app.mode = Mode::Main;
            app.error("the background work stopped without results (please report this)");
            true
        }
        Ok(finish) => {
            app.job = None;
            app.mode = Mode::Main;
            finish(app);
            true
        }
    }
}

/// Stops a background job, if one runs; says how far it got.
pub fn stop(app: &mut App) {
    if let Some(job) = app.job.take() {
        job.cancel();
        app.note(format!(
            "{} stopped after {} of {} {}",
            job.what,
            job.done(),
            job.total,
            job.pieces
        ));
    }
}
