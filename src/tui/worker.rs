//! The torsion solve off the UI thread: one background thread takes the latest job,
//! solves it and sends the result back; submitting a new job sets the cancel flag of
//! the one before, so a stale solve stops early and its result is never shown. The flexure
//! solution (shear areas and stresses) rides the same solve, with the section's ν.

use crate::analysis::Analysis;
use crate::fe::{torsion, Torsion, TorsionOptions};
use crate::geom::Piece;
use std::sync::atomic::{AtomicBool, Ordering};
use std::sync::mpsc::{channel, Receiver, Sender, TryRecvError};
use std::sync::Arc;

struct Job {
    generation: u64,
    pieces: Vec<Piece>,
    /// The solve's options (`Analysis::torsion_options`), its cancel flag among them.
    opts: TorsionOptions,
    cancel: Arc<AtomicBool>,
}

/// A finished solve, for the edit numbered `generation`.
pub struct Done {
    pub generation: u64,
    pub result: Result<Torsion, crate::model::Warning>,
}

/// The handle of the background solver.
pub struct Worker {
    jobs: Sender<Job>,
    done: Receiver<Done>,
    cancel: Option<Arc<AtomicBool>>,
}

/// What became of the solver when asked for results.
pub enum Poll {
    Nothing,
    Finished(Done),
    /// The thread is gone (it cannot be, short of a bug in the solver).
    Stopped,
}

impl Worker {
    /// Starts the solver thread.
    pub fn spawn() -> Worker {
        let (jobs, job_rx) = channel::<Job>();
        let (done_tx, done) = channel::<Done>();
        std::thread::spawn(move || {
            while let Ok(mut job) = job_rx.recv() {
                // Only the newest job matters.
                while let Ok(newer) = job_rx.try_recv() {
                    job = newer;
                }
                if job.cancel.load(Ordering::Relaxed) {
                    continue;
                }
                let opts = &job.opts;
                let result = std::panic::catch_unwind(|| torsion(&job.pieces, opts))
                    .unwrap_or(Err(crate::model::Warning::SolverFailed));
                if job.cancel.load(Ordering::Relaxed) {
                    continue;
                }
                let sent = done_tx.send(Done {
                    generation: job.generation,
                    result,
                });
                if sent.is_err() {
                    break;
                }
            }
        });
        Worker {
            jobs,
            done,
            cancel: None,
        }
    }

    /// Cancels the solve under way (if any) and starts one for the pieces of `a`.
    pub fn submit(&mut self, generation: u64, a: &Analysis) {
        if let Some(c) = self.cancel.take() {
            c.store(true, Ordering::Relaxed);
        }
        let cancel = Arc::new(AtomicBool::new(false));
        self.cancel = Some(cancel.clone());
        let _ = self.jobs.send(Job {
            generation,
            pieces: a.pieces.clone(),
            opts: a.torsion_options(crate::fe::DEFAULT_TOL, Some(cancel.clone()), true),
            cancel,
        });
    }

    /// A finished solve, if there is one, without waiting.
    pub fn poll(&self) -> Poll {
        match self.done.try_recv() {
            Ok(d) => Poll::Finished(d),
            Err(TryRecvError::Empty) => Poll::Nothing,
            Err(TryRecvError::Disconnected) => Poll::Stopped,
        }
    }
}

impl Drop for Worker {
    fn drop(&mut self) {
        if let Some(c) = &self.cancel {
            c.store(true, Ordering::Relaxed);
        }
    }
}
