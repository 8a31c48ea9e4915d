//! The binary's progress bar for batch runs (the library only reports
//! finished items through a callback).
//!
//! The bar is drawn on stderr, and only when stderr is a terminal and the
//! run has lasted a second: a quick run shows nothing, and a pipe, a file
//! or a test harness never receives a byte of it.

use std::io::IsTerminal;
use std::sync::mpsc::{self, RecvTimeoutError, Sender};
use std::thread::JoinHandle;
use std::time::Duration;

use indicatif::{ProgressBar, ProgressDrawTarget, ProgressStyle};

/// How long a run goes before the bar appears.
const DELAY: Duration = Duration::from_secs(1);

/// A progress bar that appears after [`DELAY`] on a terminal.
pub struct Progress {
    bar: ProgressBar,
    /// Dropping the sender tells the timer thread that the run is over.
    timer: Option<(Sender<()>, JoinHandle<()>)>,
}

impl Progress {
    /// A bar over `total` items, `what` naming them ("sources verified").
    pub fn start(total: usize, what: &'static str) -> Self {
        let bar = ProgressBar::with_draw_target(Some(total as u64), ProgressDrawTarget::hidden());
        if !std::io::stderr().is_terminal() {
            return Progress { bar, timer: None };
        }
        if let Ok(style) = ProgressStyle::with_template("{bar:40} {pos}/{len} {msg} ({eta} left)") {
            bar.set_style(style);
        }
        bar.set_message(what);
        let (stop, stopped) = mpsc::channel::<()>();
        let shown = bar.clone();
        let timer = std::thread::spawn(move || {
            if stopped.recv_timeout(DELAY) == Err(RecvTimeoutError::Timeout) {
                shown.set_draw_target(ProgressDrawTarget::stderr());
                shown.enable_steady_tick(Duration::from_millis(200));
                // Wait until the run is over; the sender's drop ends this.
                let _ = stopped.recv();
            }
        });
        Progress {
            bar,
            timer: Some((stop, timer)),
        }
    }

    /// Records that `done` items are finished.
    pub fn set(&self, done: usize) {
        self.bar.set_position(done as u64);
    }

    /// Ends the run and wipes the bar, if it was drawn, from the terminal.
    pub fn finish(self) {
        if let Some((stop, timer)) = self.timer {
            drop(stop);
            // The timer thread only waits and draws; it cannot panic.
            let _ = timer.join();
        }
        self.bar.finish_and_clear();
    }
}
