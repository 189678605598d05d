//! Where an output goes, checked before anything is computed, and how it is written.
//!
//! An output path is one of:
//!
//! - `-`, or a path to the regular file this process's standard output is redirected to
//!   (`/dev/stdout` after `> file`): standard output, streamed;
//! - a FIFO or a character device (`/dev/null`, a terminal), or a symbolic link to one: opened
//!   and written in place, never replaced;
//! - a regular file, new or existing, or a symbolic link to one: the content goes to a temporary
//!   file beside the file the link finally points to, which is renamed onto that file only when
//!   everything was written and flushed to disk. The link stays a link; a failure or an
//!   interruption never leaves a partial file under the final name (the temporary files are
//!   registered in [`super::pending`], which a signal handler empties);
//! - anything else (a directory, a block device, a socket) is refused.
//!
//! [`check_outputs`] runs before any computation: every output must be writable (its folder
//! exists and takes a new file, an existing file is not read-only), no output may be an input
//! of the same command (model file, opacity table, shard files, plot source) or another output
//! of it, at most one output may go to standard output, and a figure may not (its format
//! follows its file name's extension). Paths are compared after resolving links (and by device
//! and inode where the files exist), so `./a.csv`, a link to it and a hard link are the same
//! file.

use super::pending;
use crate::error::{Error, Result};
use std::fs::{self, OpenOptions};
use std::io::{BufWriter, Write};
use std::path::{Path, PathBuf};
use std::sync::atomic::{AtomicUsize, Ordering};

/// The path that means standard output.
pub const STDOUT_PATH: &str = "-";

/// Whether `path` is `-` (standard output).
pub fn is_stdout_path(path: &Path) -> bool {
    path.as_os_str() == STDOUT_PATH
}

/// What an output holds, for the checks of [`check_outputs`].
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum OutputKind {
    /// Text (CSV, ECSV, JSON): may go to standard output (`-`).
    Text,
    /// A figure, whose format follows the file name's extension: never standard output.
    Figure,
}

/// Where an output is written.
#[derive(Debug, Clone, PartialEq, Eq)]
pub enum Destination {
    /// Standard output, streamed.
    Stdout,
    /// A FIFO or character device (or a link to one), opened and written in place.
    Stream(PathBuf),
    /// A regular file (new, or existing, or the final target of a link), written to a temporary
    /// file beside it and renamed onto it.
    File(PathBuf),
}

/// A file as the operating system knows it: its canonical path and, if it exists, its device
/// and inode.
#[derive(Debug, Clone, PartialEq)]
struct FileId {
    path: PathBuf,
    inode: Option<(u64, u64)>,
}

impl FileId {
    fn of(path: &Path) -> Self {
        let inode = fs::metadata(path).ok().and_then(|m| inode(&m));
        let path = fs::canonicalize(path).unwrap_or_else(|_| {
            let dir = folder(path);
            let name = path.file_name().map(PathBuf::from).unwrap_or_default();
            fs::canonicalize(dir)
                .map(|d| d.join(&name))
                .unwrap_or_else(|_| std::path::absolute(path).unwrap_or(path.to_path_buf()))
        });
        Self { path, inode }
    }

    fn same(&self, other: &FileId) -> bool {
        self.path == other.path || (self.inode.is_some() && self.inode == other.inode)
    }
}

#[cfg(unix)]
fn inode(m: &fs::Metadata) -> Option<(u64, u64)> {
    use std::os::unix::fs::MetadataExt;
    Some((m.dev(), m.ino()))
}

#[cfg(not(unix))]
fn inode(_: &fs::Metadata) -> Option<(u64, u64)> {
    None
}

/// Whether `m` is a FIFO or a character device (written in place).
#[cfg(unix)]
fn is_stream(m: &fs::Metadata) -> bool {
    use std::os::unix::fs::FileTypeExt;
    let t = m.file_type();
    t.is_fifo() || t.is_char_device()
}

#[cfg(not(unix))]
fn is_stream(_: &fs::Metadata) -> bool {
    false
}

/// Device and inode of this process's standard output, if it can be examined.
#[cfg(unix)]
fn stdout_inode() -> Option<(u64, u64)> {
    use std::os::fd::AsFd;
    let fd = std::io::stdout().as_fd().try_clone_to_owned().ok()?;
    let file = fs::File::from(fd);
    file.metadata().ok().and_then(|m| inode(&m))
}

#[cfg(not(unix))]
fn stdout_inode() -> Option<(u64, u64)> {
    None
}

/// The folder of `path` (`.` for a bare file name).
fn folder(path: &Path) -> &Path {
    path.parent()
        .filter(|d| !d.as_os_str().is_empty())
        .unwrap_or(Path::new("."))
}

/// The file a chain of symbolic links ends at (which need not exist), at most 40 links deep.
fn final_target(path: &Path) -> std::io::Result<PathBuf> {
    let mut current = path.to_path_buf();
    for _ in 0..40 {
        match fs::symlink_metadata(&current) {
            Ok(m) if m.file_type().is_symlink() => {
                let link = fs::read_link(&current)?;
                current = if link.is_absolute() {
                    link
                } else {
                    folder(&current).join(link)
                };
            }
            _ => return Ok(current),
        }
    }
    Err(std::io::Error::other("too many levels of symbolic links"))
}

impl Destination {
    /// Where `path` (given with `flag`) sends an output; see the module documentation. Errors
    /// ([`Error::InvalidInput`], exit code 2) name the flag and the path: a directory, a block
    /// device or socket, a folder that does not exist, a path that cannot be examined.
    pub fn resolve(flag: &str, path: &Path) -> Result<Self> {
        let refuse = |why: String| Error::invalid(flag, path.display(), &why);
        if is_stdout_path(path) {
            return Ok(Destination::Stdout);
        }
        if path.as_os_str().is_empty() {
            return Err(refuse(
                "an empty file name; give a file name, e.g. out/star.csv, or - for standard output"
                    .into(),
            ));
        }
        match fs::metadata(path) {
            Ok(m) => {
                if m.is_file() && inode(&m).is_some() && inode(&m) == stdout_inode() {
                    // Our own standard output redirected to a file (`/dev/stdout`): replacing
                    // the file would lose what we print there; write through standard output.
                    Ok(Destination::Stdout)
                } else if m.is_file() {
                    let target = fs::canonicalize(path)
                        .map_err(|e| refuse(format!("the file cannot be resolved ({e})")))?;
                    Ok(Destination::File(target))
                } else if m.is_dir() {
                    Err(refuse(
                        "this is a directory; give a file name, e.g. out/star.csv".into(),
                    ))
                } else if is_stream(&m) {
                    Ok(Destination::Stream(path.to_path_buf()))
                } else {
                    Err(refuse(
                        "not a regular file, FIFO or character device (block devices and sockets are never written); give a file name, e.g. out/star.csv".into(),
                    ))
                }
            }
            Err(e) if e.kind() == std::io::ErrorKind::NotFound => {
                // A new file, possibly through a link that points to no file yet.
                let target = final_target(path)
                    .map_err(|e| refuse(format!("the link cannot be followed ({e})")))?;
                let dir = folder(&target);
                if !dir.is_dir() {
                    return Err(refuse(format!(
                        "the folder {} does not exist; create it first or choose another",
                        dir.display()
                    )));
                }
                Ok(Destination::File(target))
            }
            Err(e) => Err(refuse(format!("the path cannot be examined ({e})"))),
        }
    }

    /// Whether this is standard output.
    pub fn is_stdout(&self) -> bool {
        matches!(self, Destination::Stdout)
    }

    fn identity(&self) -> Option<FileId> {
        match self {
            Destination::Stdout => None,
            Destination::Stream(p) | Destination::File(p) => Some(FileId::of(p)),
        }
    }

    /// Check that the destination takes the output: an existing file or device is not
    /// read-only, and a new file's folder accepts a file (a probe file is created there and
    /// removed).
    fn check_writable(&self, flag: &str, path: &Path) -> Result<()> {
        let refuse = |why: String| Error::invalid(flag, path.display(), &why);
        let target = match self {
            Destination::Stdout => return Ok(()),
            Destination::Stream(p) | Destination::File(p) => p,
        };
        if let Ok(m) = fs::metadata(target) {
            if m.permissions().readonly() {
                return Err(refuse(
                    "the file is read-only; make it writable or choose another name".into(),
                ));
            }
        }
        if let Destination::File(target) = self {
            let dir = folder(target);
            let probe = dir.join(format!(
                ".starpoise-probe-{}-{}",
                std::process::id(),
                COUNTER.fetch_add(1, Ordering::Relaxed)
            ));
            match OpenOptions::new().write(true).create_new(true).open(&probe) {
                Ok(_) => {
                    let _ = fs::remove_file(&probe);
                }
                Err(e) => {
                    return Err(refuse(format!(
                        "the folder {} does not take a new file ({e}); choose a writable folder",
                        dir.display()
                    )))
                }
            }
        }
        Ok(())
    }

    /// Write the output through `fill` (`shown` names it in errors). Standard output and
    /// streams are written in place; a file is written to a temporary file beside it, renamed
    /// onto it only after `fill` succeeded and the data reached the disk; on any error the
    /// temporary file is removed and the file is untouched.
    ///
    /// Errors: [`Error::OutputClosed`] when the reader of standard output or of a FIFO went
    /// away, [`Error::Io`] for anything else.
    pub fn write<F>(&self, shown: &Path, fill: F) -> Result<()>
    where
        F: FnOnce(&mut dyn Write) -> std::io::Result<()>,
    {
        let fail = |e: std::io::Error, closed: bool| {
            if closed || e.kind() == std::io::ErrorKind::BrokenPipe {
                Error::OutputClosed {
                    path: shown.display().to_string(),
                }
            } else {
                Error::Io {
                    path: shown.display().to_string(),
                    reason: e.to_string(),
                }
            }
        };
        match self {
            Destination::Stdout => {
                let mut watch = Watch::new(std::io::stdout().lock());
                let result = fill_and_flush(&mut watch, fill);
                result.map_err(|e| fail(e, watch.closed))
            }
            Destination::Stream(path) => {
                let file = OpenOptions::new()
                    .write(true)
                    .open(path)
                    .map_err(|e| fail(e, false))?;
                let mut watch = Watch::new(file);
                let result = fill_and_flush(&mut watch, fill);
                result.map_err(|e| fail(e, watch.closed))
            }
            Destination::File(target) => {
                let name = target
                    .file_name()
                    .map(|n| n.to_string_lossy().into_owned())
                    .unwrap_or_else(|| "output".to_string());
                let tmp = folder(target).join(format!(
                    ".{name}.partial-{}-{}",
                    std::process::id(),
                    COUNTER.fetch_add(1, Ordering::Relaxed)
                ));
                let file = pending::create(&tmp, || {
                    OpenOptions::new().write(true).create_new(true).open(&tmp)
                })
                .map_err(|e| fail(e, false))?;
                if let Ok(m) = fs::metadata(target) {
                    let _ = fs::set_permissions(&tmp, m.permissions());
                }
                let mut watch = Watch::new(file);
                let result = fill_and_flush(&mut watch, fill).and_then(|()| watch.inner.sync_all());
                match result {
                    Ok(()) => pending::commit(&tmp, target).map_err(|e| fail(e, false)),
                    Err(e) => {
                        pending::discard(&tmp);
                        Err(fail(e, false))
                    }
                }
            }
        }
    }
}

static COUNTER: AtomicUsize = AtomicUsize::new(0);

/// A writer that remembers whether its reader went away (a broken pipe), which the layers
/// above may have wrapped into another error kind.
struct Watch<W> {
    inner: W,
    closed: bool,
}

impl<W> Watch<W> {
    fn new(inner: W) -> Self {
        Self {
            inner,
            closed: false,
        }
    }

    fn note<T>(&mut self, r: std::io::Result<T>) -> std::io::Result<T> {
        if let Err(e) = &r {
            if e.kind() == std::io::ErrorKind::BrokenPipe {
                self.closed = true;
            }
        }
        r
    }
}

impl<W: Write> Write for Watch<W> {
    fn write(&mut self, buf: &[u8]) -> std::io::Result<usize> {
        let r = self.inner.write(buf);
        self.note(r)
    }

    fn flush(&mut self) -> std::io::Result<()> {
        let r = self.inner.flush();
        self.note(r)
    }
}

fn fill_and_flush<W: Write, F>(watch: &mut Watch<W>, fill: F) -> std::io::Result<()>
where
    F: FnOnce(&mut dyn Write) -> std::io::Result<()>,
{
    let mut w = BufWriter::new(watch);
    fill(&mut w)?;
    w.flush()
}

/// Check the outputs of one command before anything is computed (see the module
/// documentation). `inputs` are (what, path) of the files the command reads (`what` names it in
/// the message, e.g. `the model file (--model)`), `outputs` are (flag, path, kind). Returns the
/// destinations in the order of `outputs`.
///
/// Errors: [`Error::InvalidInput`] (exit code 2) naming the output's flag and path and what is
/// wrong.
pub fn check_outputs(
    inputs: &[(&str, &Path)],
    outputs: &[(&str, &Path, OutputKind)],
) -> Result<Vec<Destination>> {
    let inputs: Vec<(&str, &Path, FileId)> = inputs
        .iter()
        .map(|(what, p)| (*what, *p, FileId::of(p)))
        .collect();
    let mut done: Vec<(&str, Destination, Option<FileId>)> = Vec::new();
    for &(flag, path, kind) in outputs {
        let refuse = |why: String| Error::invalid(flag, path.display(), &why);
        if kind == OutputKind::Figure && is_stdout_path(path) {
            return Err(refuse(format!(
                "a figure goes to a file; its format follows the extension: {}",
                super::plot::FIGURE_EXTENSIONS
            )));
        }
        let destination = Destination::resolve(flag, path)?;
        if kind == OutputKind::Figure && destination.is_stdout() {
            return Err(refuse(
                "this is standard output; a figure goes to a file named .svg or .png".into(),
            ));
        }
        destination.check_writable(flag, path)?;
        let id = destination.identity();
        if let Some(id) = &id {
            if let Some((what, p, _)) = inputs.iter().find(|(_, _, i)| i.same(id)) {
                return Err(refuse(format!(
                    "this is also {what} ({}); an output never replaces an input: choose another file name",
                    p.display()
                )));
            }
        }
        for (other, d, other_id) in &done {
            if d.is_stdout() && destination.is_stdout() {
                return Err(refuse(format!(
                    "{other} already goes to standard output; only one output can"
                )));
            }
            if let (Some(a), Some(b)) = (&id, other_id) {
                if a.same(b) {
                    return Err(refuse(format!(
                        "this is also the output of {other}; give each output its own file"
                    )));
                }
            }
        }
        done.push((flag, destination, id));
    }
    Ok(done.into_iter().map(|(_, d, _)| d).collect())
}

/// [`check_outputs`] for one text output and no inputs.
pub fn check_output_path(flag: &str, path: &Path) -> Result<Destination> {
    let mut d = check_outputs(&[], &[(flag, path, OutputKind::Text)])?;
    Ok(d.remove(0))
}

/// Write the output `path` through `fill`: `-` is standard output, a FIFO or character device
/// is written in place, a regular file (or the file a link points to) atomically through a
/// temporary file (see [`Destination::write`]).
pub fn write_output<F>(path: &Path, fill: F) -> Result<()>
where
    F: FnOnce(&mut dyn Write) -> std::io::Result<()>,
{
    Destination::resolve("output", path)?.write(path, fill)
}

/// Print `text` on standard output. Errors: [`Error::OutputClosed`] if the reader went away.
pub fn print_stdout(text: &str) -> Result<()> {
    Destination::Stdout.write(Path::new("standard output"), |w| {
        w.write_all(text.as_bytes())
    })
}

#[cfg(test)]
mod tests {
    use super::*;

    fn scratch(name: &str) -> PathBuf {
        let dir =
            std::env::temp_dir().join(format!("starpoise-dest-{name}-{}", std::process::id()));
        let _ = fs::remove_dir_all(&dir);
        fs::create_dir_all(&dir).unwrap();
        dir
    }

    #[test]
    fn output_paths_are_checked_first() {
        let dir = scratch("check");
        assert!(check_output_path("--out", &dir).is_err());
        assert!(check_output_path("--out", &dir.join("no-such-dir/x.csv")).is_err());
        assert!(check_output_path("--out", &dir.join("fine.csv")).is_ok());
        assert_eq!(
            check_output_path("--out", Path::new("-")).unwrap(),
            Destination::Stdout
        );
        assert_eq!(fs::read_dir(&dir).unwrap().count(), 0, "probe file left");
        fs::remove_dir_all(&dir).unwrap();
    }

    #[test]
    fn failure_leaves_no_file() {
        let dir = scratch("atomic");
        let target = dir.join("out.csv");
        let r = write_output(&target, |w| {
            w.write_all(b"half")?;
            Err(std::io::Error::other("boom"))
        });
        assert!(r.is_err());
        assert!(!target.exists());
        assert_eq!(
            fs::read_dir(&dir).unwrap().count(),
            0,
            "temporary file left behind"
        );
        write_output(&target, |w| w.write_all(b"whole")).unwrap();
        assert_eq!(fs::read_to_string(&target).unwrap(), "whole");
        fs::remove_dir_all(&dir).unwrap();
    }

    #[cfg(unix)]
    #[test]
    fn a_link_to_a_file_stays_a_link() {
        let dir = scratch("link");
        let target = dir.join("real.csv");
        fs::write(&target, "old").unwrap();
        let link = dir.join("link.csv");
        std::os::unix::fs::symlink("real.csv", &link).unwrap();
        write_output(&link, |w| w.write_all(b"new")).unwrap();
        assert!(fs::symlink_metadata(&link)
            .unwrap()
            .file_type()
            .is_symlink());
        assert_eq!(fs::read_to_string(&target).unwrap(), "new");
        // A dangling link gets its target created.
        let dangling = dir.join("dangling.csv");
        std::os::unix::fs::symlink("made.csv", &dangling).unwrap();
        write_output(&dangling, |w| w.write_all(b"made")).unwrap();
        assert!(fs::symlink_metadata(&dangling)
            .unwrap()
            .file_type()
            .is_symlink());
        assert_eq!(fs::read_to_string(dir.join("made.csv")).unwrap(), "made");
        fs::remove_dir_all(&dir).unwrap();
    }

    #[test]
    fn outputs_equal_to_inputs_or_each_other_are_refused() {
        let dir = scratch("same");
        let input = dir.join("model.json");
        fs::write(&input, "{}").unwrap();
        let dotted = dir.join(".").join("model.json");
        let e = check_outputs(
            &[("the model file (--model)", &input)],
            &[("--profile", &dotted, OutputKind::Text)],
        )
        .unwrap_err();
        assert!(e.to_string().contains("--model"), "{e}");
        let a = dir.join("a.svg");
        let e = check_outputs(
            &[],
            &[
                ("--profile", &a, OutputKind::Text),
                ("--plot", &a, OutputKind::Figure),
            ],
        )
        .unwrap_err();
        assert!(e.to_string().contains("--profile"), "{e}");
        let e = check_outputs(&[], &[("--plot", Path::new("-"), OutputKind::Figure)]);
        assert!(e.is_err());
        fs::remove_dir_all(&dir).unwrap();
    }
}
