//! Running the typst program as a child that cannot hold ampreport hostage:
//! its output is read with a bound (the rest is counted and dropped), the
//! wait ends at a deadline or at a stop signal ([`super::interrupt`]), and a
//! child that is given up on is killed together with anything it started.
//!
//! On Unix the child runs in a process group of its own, so killing the
//! group reaches a wrapper script's own children too; on Linux typst is
//! also told to die with ampreport (`PR_SET_PDEATHSIG`), so a `kill -9` of
//! ampreport leaves no typst running. That takes a step in the child
//! before its program starts, for which the standard library would copy
//! ampreport with `fork` (about 2 ms of processor time more per render
//! than `posix_spawn`); such a child is started by [`start`] instead,
//! which shares ampreport's memory until the program starts, as
//! `posix_spawn` does. A short query such as `git`'s is started by the
//! standard library without the step ([`Running::spawn_short`]), and, when
//! ampreport is killed outright, ends by itself.

use std::io::{self, Read};
use std::process::{Child, Command, ExitStatus, Stdio};
use std::sync::mpsc::{self, Receiver};
use std::time::{Duration, Instant};

use super::interrupt;
use crate::catalogue::Msg;

/// What the child wrote on one stream: the first bytes up to the bound, and
/// how many more were dropped.
#[derive(Debug, Clone, Default, PartialEq, Eq)]
pub(crate) struct Captured {
    pub bytes: Vec<u8>,
    pub dropped: u64,
}

impl Captured {
    /// Keeps what of `chunk` fits under `cap` bytes in all, and counts
    /// the rest as dropped.
    fn keep(&mut self, chunk: &[u8], cap: usize) {
        let room = cap.saturating_sub(self.bytes.len()).min(chunk.len());
        self.bytes.extend_from_slice(&chunk[..room]);
        self.dropped += (chunk.len() - room) as u64;
    }

    /// The text, trimmed, with a note of any dropped part.
    pub fn text(&self) -> String {
        let mut text = String::from_utf8_lossy(&self.bytes).trim().to_owned();
        if self.dropped > 0 {
            // Kept with the program's own output, before the reader's
            // language is known: English.
            let note = Msg::new("cli-program-more-output").arg("bytes", self.dropped.to_string());
            text.push_str(&format!("\n[{}]", note.english()));
        }
        text
    }
}

/// How a child's run ended, when it ended by itself.
#[derive(Debug)]
pub(crate) struct Finished {
    pub status: ExitStatus,
    pub stdout: Captured,
    pub stderr: Captured,
}

/// Why the wait for a child was given up; the child has been killed.
#[derive(Debug)]
pub(crate) enum Stopped {
    /// It was still running at the deadline.
    TimedOut { stderr: Captured },
    /// A stop signal came (its number).
    Interrupted(i32),
    /// Waiting itself failed.
    Failed(io::Error),
}

/// A running child with its output being read.
#[derive(Debug)]
pub(crate) struct Running {
    child: Process,
    reaped: bool,
    stdout: Receiver<Captured>,
    stderr: Receiver<Captured>,
    /// Told once by each output reader when its pipe closes, which the
    /// child's end does: the wait wakes then rather than at its next poll.
    closed: Receiver<()>,
}

#[cfg(target_os = "linux")]
mod start;

/// The reading end of a child's output.
#[cfg(unix)]
type Pipe = std::os::fd::OwnedFd;
#[cfg(not(unix))]
type Pipe = Box<dyn Read + Send>;

/// A started child: by the standard library, or on Linux, for a child
/// that dies with ampreport, by [`start`] (which does not copy ampreport).
#[derive(Debug)]
enum Process {
    Std(Child),
    #[cfg(target_os = "linux")]
    Started(start::Started),
}

impl Process {
    /// Starts `command` and takes the reading ends of its two outputs.
    fn spawn(
        command: &mut Command,
        dies_with_parent: bool,
    ) -> io::Result<(Self, [Option<Pipe>; 2])> {
        #[cfg(target_os = "linux")]
        if dies_with_parent && let Some(started) = start::start(command) {
            let (child, outputs) = started?;
            return Ok((
                Self::Started(child),
                [Some(outputs.stdout), Some(outputs.stderr)],
            ));
        }
        #[cfg(not(target_os = "linux"))]
        let _ = dies_with_parent;
        let mut child = command.spawn()?;
        #[cfg(unix)]
        let pipes = [
            child.stdout.take().map(Pipe::from),
            child.stderr.take().map(Pipe::from),
        ];
        #[cfg(not(unix))]
        let pipes = [
            child.stdout.take().map(|p| Box::new(p) as Pipe),
            child.stderr.take().map(|p| Box::new(p) as Pipe),
        ];
        Ok((Self::Std(child), pipes))
    }

    fn id(&self) -> u32 {
        match self {
            Self::Std(c) => c.id(),
            #[cfg(target_os = "linux")]
            Self::Started(c) => c.id(),
        }
    }

    fn try_wait(&mut self) -> io::Result<Option<ExitStatus>> {
        match self {
            Self::Std(c) => c.try_wait(),
            #[cfg(target_os = "linux")]
            Self::Started(c) => c.try_wait(),
        }
    }

    fn kill(&mut self) -> io::Result<()> {
        match self {
            Self::Std(c) => c.kill(),
            #[cfg(target_os = "linux")]
            Self::Started(c) => c.kill(),
        }
    }

    fn wait(&mut self) -> io::Result<ExitStatus> {
        match self {
            Self::Std(c) => c.wait(),
            #[cfg(target_os = "linux")]
            Self::Started(c) => c.wait(),
        }
    }
}

/// Starts `command`, trying again for a short while when the program file
/// is still open for writing somewhere ("text file busy"): a program just
/// installed or copied, or one whose writer's descriptor a child forked
/// at that moment still holds until it starts its own program.
fn spawn_when_not_busy<T>(mut spawn: impl FnMut() -> io::Result<T>) -> io::Result<T> {
    let mut pause = Duration::from_millis(2);
    let mut waited = Duration::ZERO;
    loop {
        match spawn() {
            Err(e) if is_busy(&e) && waited < BUSY_PATIENCE => {
                std::thread::sleep(pause);
                waited += pause;
                pause = (pause * 2).min(Duration::from_millis(50));
            }
            other => return other,
        }
    }
}

/// How long a busy program file is waited for before its error is told.
const BUSY_PATIENCE: Duration = Duration::from_millis(500);

#[cfg(unix)]
fn is_busy(e: &io::Error) -> bool {
    e.raw_os_error() == Some(libc::ETXTBSY)
}

#[cfg(not(unix))]
fn is_busy(_: &io::Error) -> bool {
    false
}

/// How long to wait for the output readers once the child has ended: a
/// grandchild that keeps the pipes open does not keep ampreport waiting.
const READER_GRACE: Duration = Duration::from_secs(2);

impl Running {
    /// Starts `command` with no input and both outputs read in the
    /// background, keeping at most `stdout_cap` and `stderr_cap` bytes; on
    /// Linux the child dies with ampreport.
    pub fn spawn(command: Command, stdout_cap: usize, stderr_cap: usize) -> io::Result<Self> {
        Self::start(command, stdout_cap, stderr_cap, true)
    }

    /// [`Running::spawn`] for a short query of a program that does not run
    /// on after its output is closed (`git`): in a process group of its
    /// own and killed with it at the deadline as any child, but not told
    /// to die with ampreport, so it is started with `posix_spawn`.
    pub fn spawn_short(command: Command, stdout_cap: usize, stderr_cap: usize) -> io::Result<Self> {
        Self::start(command, stdout_cap, stderr_cap, false)
    }

    fn start(
        mut command: Command,
        stdout_cap: usize,
        stderr_cap: usize,
        dies_with_parent: bool,
    ) -> io::Result<Self> {
        command
            .stdin(Stdio::null())
            .stdout(Stdio::piped())
            .stderr(Stdio::piped());
        own_group(&mut command, dies_with_parent);
        let (child, [out, err]) =
            spawn_when_not_busy(|| Process::spawn(&mut command, dies_with_parent))?;
        let (closing, closed) = mpsc::channel();
        let (stdout, stderr) = read_both(out, err, [stdout_cap, stderr_cap], closing);
        Ok(Self {
            child,
            reaped: false,
            stdout,
            stderr,
            closed,
        })
    }

    /// Waits until the child ends, `timeout` passes or a stop signal comes.
    pub fn wait(mut self, timeout: Duration) -> Result<Finished, Stopped> {
        let deadline = Instant::now().checked_add(timeout);
        let mut pause = Duration::from_millis(1);
        loop {
            match self.child.try_wait() {
                Ok(Some(status)) => {
                    self.reaped = true;
                    return Ok(Finished {
                        status,
                        stdout: collect(&self.stdout),
                        stderr: collect(&self.stderr),
                    });
                }
                Ok(None) => {}
                Err(e) => {
                    self.kill();
                    return Err(Stopped::Failed(e));
                }
            }
            if let Some(signal) = interrupt::received() {
                self.kill();
                return Err(Stopped::Interrupted(signal));
            }
            let now = Instant::now();
            if deadline.is_some_and(|d| now >= d) {
                self.kill();
                return Err(Stopped::TimedOut {
                    stderr: collect(&self.stderr),
                });
            }
            let left = deadline.map_or(pause, |d| d - now);
            // Polls at growing intervals, but wakes at once when an output
            // pipe closes (the child ending), and polls closely after it:
            // a poll of 20 ms added 10 ms on average to every run.
            match self.closed.recv_timeout(pause.min(left)) {
                Ok(()) => pause = Duration::from_millis(1),
                Err(mpsc::RecvTimeoutError::Timeout) => {
                    pause = (pause * 2).min(Duration::from_millis(20));
                }
                // Both pipes closed and told: poll as before.
                Err(mpsc::RecvTimeoutError::Disconnected) => {
                    std::thread::sleep(pause.min(left));
                    pause = (pause * 2).min(Duration::from_millis(20));
                }
            }
        }
    }

    /// Kills the child and its process group, and reaps it.
    fn kill(&mut self) {
        if self.reaped {
            return;
        }
        kill_group(self.child.id());
        let _ = self.child.kill();
        let _ = self.child.wait();
        self.reaped = true;
    }
}

impl Drop for Running {
    fn drop(&mut self) {
        self.kill();
    }
}

/// What a reader thread collected, or nothing if it did not finish in time.
fn collect(rx: &Receiver<Captured>) -> Captured {
    rx.recv_timeout(READER_GRACE).unwrap_or_default()
}

/// Reads the child's two outputs to their ends, keeping `caps` bytes of
/// each: on Unix on one thread that waits on both (`poll`), elsewhere on a
/// thread each. Each output's capture is sent as soon as that output ends
/// (a grandchild may hold the other open), and `closed` told. Without a
/// thread the pipes are dropped (the child sees them closed) and the
/// captures come back empty.
#[cfg(unix)]
fn read_both(
    stdout: Option<Pipe>,
    stderr: Option<Pipe>,
    caps: [usize; 2],
    closed: mpsc::Sender<()>,
) -> (Receiver<Captured>, Receiver<Captured>) {
    use std::os::fd::AsRawFd;
    let (out_tx, out_rx) = mpsc::channel();
    let (err_tx, err_rx) = mpsc::channel();
    let sources: [Option<Pipe>; 2] = [stdout, stderr];
    let mut streams = Vec::new();
    for ((source, cap), tx) in sources.into_iter().zip(caps).zip([out_tx, err_tx]) {
        match source {
            Some(fd) => streams.push((std::fs::File::from(fd), cap, Captured::default(), tx)),
            None => {
                let _ = tx.send(Captured::default());
            }
        }
    }
    if streams.is_empty() {
        return (out_rx, err_rx);
    }
    let _ = std::thread::Builder::new()
        .name("typst-output".into())
        .spawn(move || {
            let mut buf = [0u8; 8192];
            while !streams.is_empty() {
                let mut polled: Vec<libc::pollfd> = streams
                    .iter()
                    .map(|(file, ..)| libc::pollfd {
                        fd: file.as_raw_fd(),
                        events: libc::POLLIN,
                        revents: 0,
                    })
                    .collect();
                // SAFETY: `polled` is a live array of as many pollfd
                // values as the count passed, each naming an open
                // descriptor this thread owns.
                let n =
                    unsafe { libc::poll(polled.as_mut_ptr(), polled.len() as libc::nfds_t, -1) };
                let ended: Vec<usize> = if n < 0 {
                    if io::Error::last_os_error().kind() == io::ErrorKind::Interrupted {
                        continue;
                    }
                    // Polling itself failed: what was read is what there is.
                    (0..streams.len()).collect()
                } else {
                    let ready = polled.iter().enumerate().filter(|(_, p)| p.revents != 0);
                    ready
                        .filter_map(|(i, _)| {
                            let (file, cap, captured, _) = &mut streams[i];
                            match file.read(&mut buf) {
                                Ok(0) => Some(i),
                                Ok(n) => {
                                    captured.keep(&buf[..n], *cap);
                                    None
                                }
                                Err(e) if e.kind() == io::ErrorKind::Interrupted => None,
                                Err(_) => Some(i),
                            }
                        })
                        .collect()
                };
                for i in ended.into_iter().rev() {
                    let (_, _, captured, tx) = streams.remove(i);
                    let _ = tx.send(captured);
                    let _ = closed.send(());
                }
            }
        });
    (out_rx, err_rx)
}

#[cfg(not(unix))]
fn read_both(
    stdout: Option<Pipe>,
    stderr: Option<Pipe>,
    caps: [usize; 2],
    closed: mpsc::Sender<()>,
) -> (Receiver<Captured>, Receiver<Captured>) {
    (
        read_bounded(stdout, caps[0], closed.clone()),
        read_bounded(stderr, caps[1], closed),
    )
}

/// Reads `source` to its end on a thread of its own, keeping `cap` bytes.
/// Tells `closed` when the source has ended.
#[cfg(not(unix))]
fn read_bounded<R: Read + Send + 'static>(
    source: Option<R>,
    cap: usize,
    closed: mpsc::Sender<()>,
) -> Receiver<Captured> {
    let (tx, rx) = mpsc::channel();
    let Some(mut source) = source else {
        let _ = tx.send(Captured::default());
        return rx;
    };
    let spawned = std::thread::Builder::new()
        .name("typst-output".into())
        .spawn(move || {
            let mut captured = Captured::default();
            let mut buf = [0u8; 8192];
            loop {
                match source.read(&mut buf) {
                    Ok(0) => break,
                    Ok(n) => captured.keep(&buf[..n], cap),
                    Err(e) if e.kind() == io::ErrorKind::Interrupted => {}
                    Err(_) => break,
                }
            }
            let _ = tx.send(captured);
            let _ = closed.send(());
        });
    if spawned.is_err() {
        // No thread: the pipe is dropped, and the child sees a closed pipe.
        let (tx, rx) = mpsc::channel();
        let _ = tx.send(Captured::default());
        return rx;
    }
    rx
}

/// Puts the child in a process group of its own and, when asked, on
/// Linux, tells it to die with ampreport.
#[cfg(unix)]
fn own_group(command: &mut Command, dies_with_parent: bool) {
    use std::os::unix::process::CommandExt;
    command.process_group(0);
    #[cfg(not(target_os = "linux"))]
    let _ = dies_with_parent;
    #[cfg(target_os = "linux")]
    if dies_with_parent {
        // SAFETY: the closure runs in the child between fork and exec and
        // calls only async-signal-safe functions (prctl, getppid, _exit).
        let parent = std::process::id() as libc::pid_t;
        unsafe {
            command.pre_exec(move || {
                if libc::prctl(libc::PR_SET_PDEATHSIG, libc::SIGKILL, 0, 0, 0) != 0 {
                    return Err(io::Error::last_os_error());
                }
                // The parent may have died before the line above.
                if libc::getppid() != parent {
                    libc::_exit(1);
                }
                Ok(())
            });
        }
    }
}

#[cfg(not(unix))]
fn own_group(_: &mut Command, _: bool) {}

#[cfg(unix)]
fn kill_group(id: u32) {
    if let Ok(pid) = libc::pid_t::try_from(id) {
        // SAFETY: kill has no memory effects; the group is the child's own,
        // and the child is not reaped yet, so its id is not reused.
        unsafe {
            libc::kill(-pid, libc::SIGKILL);
        }
    }
}

#[cfg(not(unix))]
fn kill_group(_: u32) {}

/// The words for how a program ended, in English: "exited with status 1",
/// "was killed by signal 11 (SIGSEGV)".
pub(crate) fn describe_status(status: &ExitStatus) -> String {
    status_words(status).english()
}

/// How a program ended, not yet said ([`describe_status`]).
pub(crate) fn status_words(status: &ExitStatus) -> Msg {
    if let Some(code) = status.code() {
        return Msg::new("cli-program-exited").arg("code", code.to_string());
    }
    #[cfg(unix)]
    {
        use std::os::unix::process::ExitStatusExt;
        if let Some(signal) = status.signal() {
            return match interrupt::signal_name(signal) {
                Some(name) => Msg::new("cli-program-killed-named")
                    .arg("signal", signal.to_string())
                    .arg("name", name),
                None => Msg::new("cli-program-killed").arg("signal", signal.to_string()),
            };
        }
    }
    Msg::new("cli-program-ended").arg("status", status.to_string())
}

#[cfg(all(test, unix))]
mod tests {
    use super::*;

    fn sh(script: &str) -> Command {
        let mut c = Command::new("/bin/sh");
        c.arg("-c").arg(script);
        c
    }

    #[test]
    fn output_is_kept_up_to_the_bound() {
        let run = Running::spawn(
            sh("head -c 100000 /dev/zero | tr '\\0' x; echo oops >&2; exit 3"),
            1000,
            1000,
        )
        .unwrap();
        let done = run.wait(Duration::from_secs(60)).unwrap();
        assert_eq!(done.stdout.bytes.len(), 1000);
        assert_eq!(done.stdout.dropped, 99_000);
        assert_eq!(done.stderr.text(), "oops");
        assert_eq!(describe_status(&done.status), "exited with status 3");
        assert!(
            done.stdout
                .text()
                .ends_with("[… 99000 more bytes of output not shown]")
        );
    }

    #[test]
    fn a_child_past_its_deadline_is_killed_with_its_own_children() {
        past_the_deadline(Running::spawn);
    }

    #[test]
    fn a_short_query_past_its_deadline_is_killed_with_its_own_children() {
        past_the_deadline(Running::spawn_short);
    }

    fn past_the_deadline(spawn: fn(Command, usize, usize) -> io::Result<Running>) {
        let dir = tempfile::tempdir().unwrap();
        let pids = dir.path().join("pids");
        // The shell starts a sleep of its own, which keeps the pipes open.
        let script = format!(
            "sleep 30 & echo $! > {p}; echo started >&2; wait",
            p = pids.display()
        );
        let start = Instant::now();
        let run = spawn(sh(&script), 100, 100).unwrap();
        let stopped = run.wait(Duration::from_millis(300)).unwrap_err();
        assert!(start.elapsed() < Duration::from_secs(10));
        let Stopped::TimedOut { stderr } = stopped else {
            panic!("expected a time-out, got {stopped:?}");
        };
        assert_eq!(stderr.text(), "started");
        let grandchild: i32 = std::fs::read_to_string(&pids)
            .unwrap()
            .trim()
            .parse()
            .unwrap();
        // The grandchild is gone (or a zombie waiting for its new parent).
        let deadline = Instant::now() + Duration::from_secs(10);
        loop {
            let stat = std::fs::read_to_string(format!("/proc/{grandchild}/stat"));
            let alive = stat.is_ok_and(|s| {
                s.rsplit(')')
                    .next()
                    .map(str::trim_start)
                    .is_some_and(|r| !r.starts_with('Z'))
            });
            if !alive {
                break;
            }
            assert!(
                Instant::now() < deadline,
                "the sleep {grandchild} still runs"
            );
            std::thread::sleep(Duration::from_millis(20));
        }
    }

    #[test]
    fn a_signal_death_is_named() {
        let run = Running::spawn(sh("kill -SEGV $$"), 10, 10).unwrap();
        let done = run.wait(Duration::from_secs(60)).unwrap();
        assert_eq!(
            describe_status(&done.status),
            "was killed by signal 11 (SIGSEGV)"
        );
    }
}

#[cfg(all(test, target_os = "linux"))]
mod busy_tests {
    use super::*;
    use std::io::Write;
    use std::os::unix::fs::PermissionsExt;

    #[test]
    fn a_program_still_being_written_is_started_once_its_writer_is_done() {
        let dir = tempfile::tempdir().unwrap();
        let program = dir.path().join("prog");
        let mut file = std::fs::File::create(&program).unwrap();
        file.write_all(b"#!/bin/sh\necho started\n").unwrap();
        file.set_permissions(std::fs::Permissions::from_mode(0o755))
            .unwrap();
        // Open for writing: the system refuses to start it ("text file
        // busy") until the writer lets go, 40 ms from now.
        let writer = std::thread::spawn(move || {
            std::thread::sleep(Duration::from_millis(40));
            drop(file);
        });
        let done = Running::spawn(Command::new(&program), 1024, 1024)
            .expect("started once written")
            .wait(Duration::from_secs(10))
            .unwrap();
        writer.join().unwrap();
        assert!(done.status.success());
        assert_eq!(done.stdout.bytes, b"started\n");

        // A writer that never lets go: told, after a short wait.
        let _held = std::fs::OpenOptions::new()
            .write(true)
            .open(&program)
            .unwrap();
        let started = Instant::now();
        let e = Running::spawn(Command::new(&program), 1024, 1024).unwrap_err();
        assert!(is_busy(&e), "{e}");
        assert!(
            started.elapsed() >= BUSY_PATIENCE,
            "{:?}",
            started.elapsed()
        );
        assert!(started.elapsed() < Duration::from_secs(5));
    }
}
