//! A progress bar on standard error for long runs, drawn only when standard error is a terminal.

use std::io::{IsTerminal, Write};
use std::time::Instant;

/// A bar that redraws at most ten times a second.
pub struct Bar {
    label: String,
    on: bool,
    last: Option<Instant>,
}

impl Bar {
    /// A bar labelled `label`; silent when `quiet` or when standard error is not a terminal.
    pub fn new(label: &str, quiet: bool) -> Self {
        Bar { label: label.into(), on: !quiet && std::io::stderr().is_terminal(), last: None }
    }

    /// Shows `fraction` done; always `true` (the command line cancels with Ctrl-C).
    pub fn update(&mut self, fraction: f64) -> bool {
        if !self.on || self.last.is_some_and(|t| t.elapsed().as_millis() < 100 && fraction < 1.0) {
            return true;
        }
        self.last = Some(Instant::now());
        let width = 30;
        let done = ((fraction.clamp(0.0, 1.0) * width as f64).round() as usize).min(width);
        let mut err = std::io::stderr().lock();
        let _ = write!(
            err,
            "\r{} [{}{}] {:3.0}%",
            self.label,
            "#".repeat(done),
            ".".repeat(width - done),
            fraction * 100.0
        );
        let _ = err.flush();
        true
    }
}

impl Drop for Bar {
    fn drop(&mut self) {
        if self.on && self.last.is_some() {
            let mut err = std::io::stderr().lock();
            let _ = write!(err, "\r{}\r", " ".repeat(self.label.len() + 40));
            let _ = err.flush();
        }
    }
}
