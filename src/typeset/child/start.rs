//! Starting a child on Linux that dies with ampreport, without copying
//! ampreport first.
//!
//! The standard library starts a program with `posix_spawn` unless it is
//! asked to run a step in the child before `exec`; then it copies the whole
//! process with `fork`, and every page ampreport writes afterwards is
//! faulted in again. Telling the child to die with ampreport
//! (`PR_SET_PDEATHSIG`) is such a step. Here the child shares ampreport's
//! memory while ampreport waits (`clone` with `CLONE_VM | CLONE_VFORK`, what
//! the C library's own `posix_spawn` does), takes the steps the standard
//! library would take (signal handlers and mask back to their defaults, a
//! process group of its own, the standard streams, the folder) plus the
//! death signal, and starts the program. Measured on 5 December: about
//! 2 ms of processor time per demo render, and much more for a large job,
//! whose heap `fork` copies page by page (docs/performance.md, "typst
//! started without copying ampreport").
//!
//! Between `clone` and `exec` the child runs on a stack of its own but in
//! ampreport's memory: it calls only system calls (through the C library's
//! thin wrappers), reads what was prepared for it, and writes nothing but
//! the error number it failed with.

use std::ffi::{CString, OsStr, OsString};
use std::io;
use std::os::fd::{AsRawFd, FromRawFd, OwnedFd};
use std::os::unix::ffi::{OsStrExt, OsStringExt};
use std::process::{Command, ExitStatus};
use std::sync::atomic::{AtomicI32, Ordering};

/// A child started here: its process id, and how it ended once reaped.
#[derive(Debug)]
pub(crate) struct Started {
    pid: libc::pid_t,
    ended: Option<ExitStatus>,
}

/// What the child was started with: the reading ends of its two outputs.
#[derive(Debug)]
pub(crate) struct Outputs {
    pub stdout: OwnedFd,
    pub stderr: OwnedFd,
}

/// Everything the child reads between `clone` and `exec`, prepared before.
struct Plan {
    program: CString,
    /// Null-terminated arrays of pointers into `_strings`.
    argv: Vec<*const libc::c_char>,
    envp: Vec<*const libc::c_char>,
    folder: Option<CString>,
    stdin: libc::c_int,
    stdout: libc::c_int,
    stderr: libc::c_int,
    parent: libc::pid_t,
    /// The error number of the step that failed, or 0.
    failed: AtomicI32,
}

/// Starts `command` with its input from the null device and its two
/// outputs into new pipes, in a process group of its own, told to die with
/// ampreport. `None` when the command needs what is not done here (a
/// program name without a folder, which needs a search of `PATH`); the
/// caller then starts it with the standard library.
///
/// Only the program, arguments, environment changes and folder of
/// `command` are used: the callers set nothing else.
pub(crate) fn start(command: &Command) -> Option<io::Result<(Started, Outputs)>> {
    let program = command.get_program();
    if !program.as_bytes().contains(&b'/') || holds_nul(command) {
        return None;
    }
    Some(start_program(command, program))
}

/// Whether the standard library saw a NUL byte in the program, an argument
/// or the folder: it keeps a stand-in text in their place, and refuses to
/// start such a command, so it is left to it.
fn holds_nul(command: &Command) -> bool {
    const STAND_IN: &str = "<string-with-nul>";
    command.get_args().any(|a| a == STAND_IN)
        || command
            .get_current_dir()
            .is_some_and(|d| d.as_os_str() == STAND_IN)
}

fn start_program(command: &Command, program: &OsStr) -> io::Result<(Started, Outputs)> {
    let program = c_string(program)?;
    let mut strings = Vec::new();
    strings.push(program.clone());
    for arg in command.get_args() {
        strings.push(c_string(arg)?);
    }
    let args_end = strings.len();
    for entry in environment(command) {
        strings.push(CString::new(entry.into_vec()).map_err(|_| nul_error())?);
    }
    let pointers = |range: &[CString]| {
        let mut v: Vec<*const libc::c_char> = range.iter().map(|s| s.as_ptr()).collect();
        v.push(std::ptr::null());
        v
    };
    let argv = pointers(&strings[..args_end]);
    let envp = pointers(&strings[args_end..]);
    let folder = command
        .get_current_dir()
        .map(|d| c_string(d.as_os_str()))
        .transpose()?;

    let null = std::fs::File::open("/dev/null")?;
    let (stdout_read, stdout_write) = pipe()?;
    let (stderr_read, stderr_write) = pipe()?;

    let plan = Plan {
        program,
        argv,
        envp,
        folder,
        stdin: null.as_raw_fd(),
        stdout: stdout_write.as_raw_fd(),
        stderr: stderr_write.as_raw_fd(),
        parent: std::process::id() as libc::pid_t,
        failed: AtomicI32::new(0),
    };
    // The child's stack: 64 KiB, aligned for any call.
    let mut stack = vec![0u128; 4096];
    // SAFETY: the end of the live buffer above, which outlives the child's
    // use of it (ampreport is held until the child has started its program
    // or ended).
    let stack_top = unsafe { stack.as_mut_ptr().add(stack.len()) }.cast::<libc::c_void>();

    // No signal handler of ampreport's may run in the child while it
    // shares ampreport's memory: every signal is held from here until the
    // child has set the handlers back to their defaults.
    // SAFETY: sigset_t values are plain data, filled in by sigfillset and
    // pthread_sigmask before being read.
    let mut all: libc::sigset_t = unsafe { std::mem::zeroed() };
    let mut before: libc::sigset_t = unsafe { std::mem::zeroed() };
    // SAFETY: pointers to live locals.
    unsafe {
        libc::sigfillset(&mut all);
        libc::pthread_sigmask(libc::SIG_SETMASK, &all, &mut before);
    }
    // SAFETY: `child_main` is given a pointer to `plan`, which lives until
    // after `clone` returns; with CLONE_VFORK that is after the child has
    // called execve or _exit, its last uses of `plan` and of the stack.
    let pid = unsafe {
        libc::clone(
            child_main,
            stack_top,
            libc::CLONE_VM | libc::CLONE_VFORK | libc::SIGCHLD,
            std::ptr::from_ref(&plan).cast_mut().cast::<libc::c_void>(),
        )
    };
    let clone_error = io::Error::last_os_error();
    // SAFETY: restores the mask saved above.
    unsafe {
        libc::pthread_sigmask(libc::SIG_SETMASK, &before, std::ptr::null_mut());
    }
    drop(stack);
    drop(null);
    drop(stdout_write);
    drop(stderr_write);
    if pid < 0 {
        return Err(clone_error);
    }
    let mut started = Started { pid, ended: None };
    let failed = plan.failed.load(Ordering::SeqCst);
    if failed != 0 {
        // The child has ended with status 127: reaped here.
        let _ = started.wait();
        return Err(io::Error::from_raw_os_error(failed));
    }
    Ok((
        started,
        Outputs {
            stdout: stdout_read,
            stderr: stderr_read,
        },
    ))
}

/// The environment the program gets: ampreport's own with the command's
/// changes, in ampreport's order, new names last.
fn environment(command: &Command) -> Vec<OsString> {
    let changes: Vec<(&OsStr, Option<&OsStr>)> = command.get_envs().collect();
    let mut out = Vec::new();
    for (name, value) in std::env::vars_os() {
        match changes.iter().find(|(n, _)| *n == name) {
            Some((_, None)) => {}
            Some((_, Some(new))) => out.push(entry(&name, new)),
            None => out.push(entry(&name, &value)),
        }
    }
    for (name, value) in &changes {
        if let Some(value) = value
            && std::env::var_os(name).is_none()
        {
            out.push(entry(name, value));
        }
    }
    out
}

fn entry(name: &OsStr, value: &OsStr) -> OsString {
    let mut e = OsString::with_capacity(name.len() + value.len() + 1);
    e.push(name);
    e.push("=");
    e.push(value);
    e
}

fn c_string(s: &OsStr) -> io::Result<CString> {
    CString::new(s.as_bytes()).map_err(|_| nul_error())
}

fn nul_error() -> io::Error {
    io::Error::new(
        io::ErrorKind::InvalidInput,
        "nul byte found in provided data",
    )
}

/// A pipe whose two ends are closed when a program is started.
fn pipe() -> io::Result<(OwnedFd, OwnedFd)> {
    let mut fds = [0 as libc::c_int; 2];
    // SAFETY: `fds` has room for the two descriptors pipe2 writes.
    if unsafe { libc::pipe2(fds.as_mut_ptr(), libc::O_CLOEXEC) } != 0 {
        return Err(io::Error::last_os_error());
    }
    // SAFETY: both descriptors are new and owned by nothing else.
    Ok(unsafe { (OwnedFd::from_raw_fd(fds[0]), OwnedFd::from_raw_fd(fds[1])) })
}

/// The child, in ampreport's memory, until it starts its program: notes
/// the error number of a failed step and ends with status 127.
extern "C" fn child_main(arg: *mut libc::c_void) -> libc::c_int {
    // SAFETY: `arg` is the `Plan` that `start_program` keeps alive until
    // this function has called execve or _exit.
    let plan = unsafe { &*arg.cast::<Plan>() };
    // SAFETY: only system calls on the child's own state and reads of the
    // prepared plan follow.
    unsafe {
        let fail = |plan: &Plan| -> ! {
            plan.failed
                .store(*libc::__errno_location(), Ordering::SeqCst);
            libc::_exit(127)
        };
        // Handlers back to their defaults (a handler of ampreport's would
        // run in ampreport's memory), and a broken pipe ends the program
        // again as it would without Rust; ignored signals stay ignored.
        let mut old: libc::sigaction = std::mem::zeroed();
        for signal in 1..libc::SIGRTMAX() + 1 {
            if signal == libc::SIGKILL || signal == libc::SIGSTOP {
                continue;
            }
            if libc::sigaction(signal, std::ptr::null(), &mut old) != 0 {
                continue;
            }
            let handler = old.sa_sigaction;
            if handler != libc::SIG_IGN && handler != libc::SIG_DFL || signal == libc::SIGPIPE {
                let mut default: libc::sigaction = std::mem::zeroed();
                default.sa_sigaction = libc::SIG_DFL;
                libc::sigaction(signal, &default, std::ptr::null_mut());
            }
        }
        let mut none: libc::sigset_t = std::mem::zeroed();
        libc::sigemptyset(&mut none);
        if libc::sigprocmask(libc::SIG_SETMASK, &none, std::ptr::null_mut()) != 0 {
            fail(plan);
        }
        if libc::setpgid(0, 0) != 0 {
            fail(plan);
        }
        if libc::prctl(libc::PR_SET_PDEATHSIG, libc::SIGKILL, 0, 0, 0) != 0 {
            fail(plan);
        }
        // ampreport may have died before the line above.
        if libc::getppid() != plan.parent {
            libc::_exit(1);
        }
        for (from, to) in [
            (plan.stdin, libc::STDIN_FILENO),
            (plan.stdout, libc::STDOUT_FILENO),
            (plan.stderr, libc::STDERR_FILENO),
        ] {
            let done = if from == to {
                libc::fcntl(to, libc::F_SETFD, 0)
            } else {
                libc::dup2(from, to)
            };
            if done < 0 {
                fail(plan);
            }
        }
        if let Some(folder) = &plan.folder
            && libc::chdir(folder.as_ptr()) != 0
        {
            fail(plan);
        }
        libc::execve(
            plan.program.as_ptr(),
            plan.argv.as_ptr(),
            plan.envp.as_ptr(),
        );
        fail(plan)
    }
}

impl Started {
    pub fn id(&self) -> u32 {
        self.pid as u32
    }

    /// How it ended, if it has; reaps it then.
    pub fn try_wait(&mut self) -> io::Result<Option<ExitStatus>> {
        self.reap(libc::WNOHANG)
    }

    /// Waits for it to end and reaps it.
    pub fn wait(&mut self) -> io::Result<ExitStatus> {
        loop {
            if let Some(status) = self.reap(0)? {
                return Ok(status);
            }
        }
    }

    /// Kills it, unless it has been reaped (its id may be another's then).
    pub fn kill(&mut self) -> io::Result<()> {
        if self.ended.is_some() {
            return Ok(());
        }
        // SAFETY: kill has no memory effects; the child is not reaped, so
        // its id is still its own.
        if unsafe { libc::kill(self.pid, libc::SIGKILL) } != 0 {
            return Err(io::Error::last_os_error());
        }
        Ok(())
    }

    fn reap(&mut self, flags: libc::c_int) -> io::Result<Option<ExitStatus>> {
        use std::os::unix::process::ExitStatusExt;
        if let Some(status) = self.ended {
            return Ok(Some(status));
        }
        let mut raw = 0;
        loop {
            // SAFETY: `raw` is a live local for waitpid to fill in.
            let r = unsafe { libc::waitpid(self.pid, &mut raw, flags) };
            if r == self.pid {
                let status = ExitStatus::from_raw(raw);
                self.ended = Some(status);
                return Ok(Some(status));
            }
            if r == 0 {
                return Ok(None);
            }
            let e = io::Error::last_os_error();
            if e.kind() != io::ErrorKind::Interrupted {
                return Err(e);
            }
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use std::io::Read;

    fn run(command: &Command) -> (ExitStatus, String, String) {
        let (mut child, outputs) = start(command).expect("a path").expect("started");
        let mut out = String::new();
        let mut err = String::new();
        std::fs::File::from(outputs.stdout)
            .read_to_string(&mut out)
            .unwrap();
        std::fs::File::from(outputs.stderr)
            .read_to_string(&mut err)
            .unwrap();
        (child.wait().unwrap(), out, err)
    }

    fn sh(script: &str) -> Command {
        let mut c = Command::new("/bin/sh");
        c.arg("-c").arg(script).arg("zero").arg("one two");
        c
    }

    #[test]
    fn arguments_environment_folder_and_outputs_are_as_asked() {
        let dir = tempfile::tempdir().unwrap();
        let mut c = sh(
            "printf '%s|%s|%s\\n' \"$0\" \"$1\" \"$PWD\"; echo \"${AMPREPORT_T_SET-unset} ${AMPREPORT_T_GONE-unset}\" >&2; \
             read line; echo \"read:$line:$?\"; exit 7",
        );
        c.current_dir(dir.path())
            .env("AMPREPORT_T_SET", "a b")
            .env_remove("AMPREPORT_T_GONE");
        // SAFETY: a variable of the test's own, set before the start.
        unsafe { std::env::set_var("AMPREPORT_T_GONE", "still") };
        let (status, out, err) = run(&c);
        let folder = dir.path().canonicalize().unwrap();
        assert_eq!(out, format!("zero|one two|{}\nread::1\n", folder.display()));
        assert_eq!(err, "a b unset\n");
        assert_eq!(status.code(), Some(7));
    }

    #[test]
    fn the_environment_is_passed_on_unchanged_when_not_changed() {
        // SAFETY: a variable of the test's own, set before the start.
        unsafe { std::env::set_var("AMPREPORT_T_KEPT", "x=y") };
        let (_, out, _) = run(&sh("echo \"$AMPREPORT_T_KEPT\""));
        assert_eq!(out, "x=y\n");
    }

    #[test]
    fn the_child_has_its_own_group_default_pipe_signal_and_an_empty_mask() {
        // The program reads its own state (no shell between: a shell
        // blocks every signal while it waits for a command it started):
        // fields of /proc/PID/status (proc(5)); SigBlk and SigIgn are bit
        // masks with bit N-1 for signal N.
        let mut c = Command::new("/usr/bin/env");
        c.args([
            "grep",
            "-E",
            "^(Pid|NSpgid|SigBlk|SigIgn):",
            "/proc/self/status",
        ]);
        let (status, out, _) = run(&c);
        assert!(status.success(), "{out}");
        let field = |name: &str| {
            out.lines()
                .find_map(|l| l.strip_prefix(name))
                .unwrap_or_else(|| panic!("{name} in {out}"))
                .trim()
                .to_owned()
        };
        assert_eq!(
            field("Pid:"),
            field("NSpgid:"),
            "a process group of its own"
        );
        assert_eq!(u64::from_str_radix(&field("SigBlk:"), 16).unwrap(), 0);
        let ignored = u64::from_str_radix(&field("SigIgn:"), 16).unwrap();
        assert_eq!(ignored & (1 << (libc::SIGPIPE - 1)), 0, "{ignored:x}");
    }

    #[test]
    fn the_child_is_told_to_die_with_its_parent() {
        // The death signal comes when the thread that started the child
        // ends (prctl(2), PR_SET_PDEATHSIG): a thread that starts a long
        // sleep and ends has it killed.
        let (mut child, _outputs) =
            std::thread::spawn(|| start(&sh("exec sleep 30")).unwrap().unwrap())
                .join()
                .unwrap();
        let status = child.wait().unwrap();
        use std::os::unix::process::ExitStatusExt;
        assert_eq!(status.signal(), Some(libc::SIGKILL));
    }

    #[test]
    fn a_failed_start_is_told() {
        let e = start(&Command::new("/nonexistent/ampreport-test"))
            .unwrap()
            .unwrap_err();
        assert_eq!(e.kind(), io::ErrorKind::NotFound);
        let dir = tempfile::tempdir().unwrap();
        let e = start(&Command::new(dir.path())).unwrap().unwrap_err();
        assert_eq!(e.raw_os_error(), Some(libc::EACCES));
        let mut c = Command::new("/bin/true");
        c.current_dir(dir.path().join("missing"));
        let e = start(&c).unwrap().unwrap_err();
        assert_eq!(e.kind(), io::ErrorKind::NotFound);
    }

    #[test]
    fn a_bare_program_name_is_left_to_the_standard_library() {
        assert!(start(&Command::new("sh")).is_none());
    }

    #[test]
    fn a_nul_is_refused() {
        // In an argument or the folder: left to the standard library,
        // which refuses it.
        let mut c = Command::new("/bin/true");
        c.arg("a\0b");
        assert!(start(&c).is_none());
        assert_eq!(c.spawn().unwrap_err().kind(), io::ErrorKind::InvalidInput);
        let mut c = Command::new("/bin/true");
        c.current_dir("/tmp\0x");
        assert!(start(&c).is_none());
        // In the environment: refused here.
        let mut c = Command::new("/bin/true");
        c.env("AMPREPORT_T_NUL", "a\0b");
        let e = start(&c).unwrap().unwrap_err();
        assert_eq!(e.kind(), io::ErrorKind::InvalidInput);
    }

    #[test]
    fn try_wait_kill_and_wait() {
        let (mut child, _outputs) = start(&sh("exec sleep 30")).unwrap().unwrap();
        assert!(child.try_wait().unwrap().is_none());
        child.kill().unwrap();
        let status = child.wait().unwrap();
        use std::os::unix::process::ExitStatusExt;
        assert_eq!(status.signal(), Some(libc::SIGKILL));
        // Reaped: asked again, the same answer and no signal sent.
        assert_eq!(child.try_wait().unwrap(), Some(status));
        child.kill().unwrap();
    }
}
