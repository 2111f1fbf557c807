//! Stopping cleanly when the user or the system asks: after [`install`],
//! SIGINT, SIGTERM and SIGHUP no longer end the process on the spot but are
//! noted, and every wait on typst and every step that puts a file in place
//! looks at [`received`] and stops, so the temporary files and the typst
//! child go away with it and no good PDF is replaced. A second signal while
//! the first is being handled ends the process at once.
//!
//! Without [`install`] (a library caller, the unit tests) signals keep their
//! usual effect and [`received`] is always `None`.

use std::sync::atomic::{AtomicBool, AtomicUsize, Ordering};
use std::sync::{Arc, OnceLock};

/// The signals that ask for a clean stop.
#[cfg(unix)]
pub const SIGNALS: [i32; 3] = [libc::SIGINT, libc::SIGTERM, libc::SIGHUP];
#[cfg(not(unix))]
pub const SIGNALS: [i32; 0] = [];

struct Flags {
    any: Arc<AtomicBool>,
    which: Arc<AtomicUsize>,
}

static FLAGS: OnceLock<Flags> = OnceLock::new();

/// Takes over [`SIGNALS`] for the rest of the process. Calling it again does
/// nothing.
pub fn install() -> std::io::Result<()> {
    let mut fresh = false;
    let flags = FLAGS.get_or_init(|| {
        fresh = true;
        Flags {
            any: Arc::new(AtomicBool::new(false)),
            which: Arc::new(AtomicUsize::new(0)),
        }
    });
    if !fresh {
        return Ok(());
    }
    for signal in SIGNALS {
        // Registered first, so it sees the flag as it was before this signal:
        // only a second signal ends the process here.
        signal_hook::flag::register_conditional_shutdown(
            signal,
            128 + signal,
            Arc::clone(&flags.any),
        )?;
        signal_hook::flag::register_usize(signal, Arc::clone(&flags.which), signal as usize)?;
        signal_hook::flag::register(signal, Arc::clone(&flags.any))?;
    }
    Ok(())
}

/// The signal that asked for a stop, if one came since [`install`].
pub fn received() -> Option<i32> {
    let flags = FLAGS.get()?;
    match flags.which.load(Ordering::SeqCst) {
        0 => None,
        n => i32::try_from(n).ok(),
    }
}

/// Ends the process the way `signal` would have, once the clean-up is done,
/// so a shell sees a process stopped by that signal (and a loop over jobs
/// stops with it). Returns only if the signal could not be raised.
pub fn exit_as_signalled(signal: i32) {
    let _ = signal_hook::low_level::emulate_default_handler(signal);
}

/// The name of a common signal, for messages ("SIGTERM"), or `None`.
pub fn signal_name(signal: i32) -> Option<&'static str> {
    #[cfg(unix)]
    {
        let name = match signal {
            libc::SIGHUP => "SIGHUP",
            libc::SIGINT => "SIGINT",
            libc::SIGQUIT => "SIGQUIT",
            libc::SIGILL => "SIGILL",
            libc::SIGABRT => "SIGABRT",
            libc::SIGBUS => "SIGBUS",
            libc::SIGFPE => "SIGFPE",
            libc::SIGKILL => "SIGKILL",
            libc::SIGSEGV => "SIGSEGV",
            libc::SIGPIPE => "SIGPIPE",
            libc::SIGALRM => "SIGALRM",
            libc::SIGTERM => "SIGTERM",
            libc::SIGXCPU => "SIGXCPU",
            libc::SIGXFSZ => "SIGXFSZ",
            _ => return None,
        };
        Some(name)
    }
    #[cfg(not(unix))]
    {
        let _ = signal;
        None
    }
}

#[cfg(all(test, unix))]
mod tests {
    use super::*;

    #[test]
    fn nothing_is_received_without_a_signal() {
        assert_eq!(received(), None);
        assert_eq!(signal_name(libc::SIGSEGV), Some("SIGSEGV"));
        assert_eq!(signal_name(libc::SIGTERM), Some("SIGTERM"));
        assert_eq!(signal_name(1000), None);
    }
}
