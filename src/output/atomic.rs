//! Atomic file writes: a temporary file beside the target, renamed into place only when
//! everything was written, so that a failure never leaves a partial file.

use crate::error::{Error, Result};
use std::fs::{self, File};
use std::io::{BufWriter, Write};
use std::path::{Path, PathBuf};

fn temporary_path(path: &Path) -> PathBuf {
    let name = path
        .file_name()
        .map(|n| n.to_string_lossy().into_owned())
        .unwrap_or_else(|| "output".to_string());
    let tmp = format!(".{name}.partial-{}", std::process::id());
    match path.parent() {
        Some(dir) if !dir.as_os_str().is_empty() => dir.join(tmp),
        _ => PathBuf::from(tmp),
    }
}

/// Check, before any work is done, that `path` (given with flag `flag`) can take a new file: its
/// directory exists and it is not itself a directory. Errors are [`Error::InvalidInput`] (exit
/// code 2) naming the flag and the path.
pub fn check_output_path(flag: &str, path: &Path) -> Result<()> {
    let dir = path
        .parent()
        .filter(|d| !d.as_os_str().is_empty())
        .unwrap_or(Path::new("."));
    if path.is_dir() {
        Err(Error::invalid(
            flag,
            path.display(),
            "this is a directory; give a file name, e.g. out/star.csv",
        ))
    } else if !dir.is_dir() {
        Err(Error::invalid(
            flag,
            path.display(),
            "the directory of the output file must exist",
        ))
    } else {
        Ok(())
    }
}

/// Write `path` through `fill`, atomically: the content goes to a temporary file in the same
/// directory, which is renamed onto `path` only after `fill` succeeded and the data was flushed.
/// On any error the temporary file is removed and `path` is untouched.
pub fn write_atomically<F>(path: &Path, fill: F) -> Result<()>
where
    F: FnOnce(&mut dyn Write) -> std::io::Result<()>,
{
    let io_error = |e: std::io::Error| Error::Io {
        path: path.display().to_string(),
        reason: e.to_string(),
    };
    let tmp = temporary_path(path);
    let result = (|| -> std::io::Result<()> {
        let file = File::create(&tmp)?;
        let mut writer = BufWriter::new(file);
        fill(&mut writer)?;
        writer.flush()?;
        writer.get_ref().sync_all()?;
        Ok(())
    })();
    match result {
        Ok(()) => fs::rename(&tmp, path).map_err(|e| {
            let _ = fs::remove_file(&tmp);
            io_error(e)
        }),
        Err(e) => {
            let _ = fs::remove_file(&tmp);
            Err(io_error(e))
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn output_paths_are_checked_first() {
        let dir = std::env::temp_dir();
        assert!(check_output_path("--out", &dir).is_err());
        assert!(check_output_path("--out", &dir.join("no-such-dir-starpoise/x.csv")).is_err());
        assert!(check_output_path("--out", &dir.join("fine.csv")).is_ok());
    }

    #[test]
    fn failure_leaves_no_file() {
        let dir = std::env::temp_dir().join(format!("starpoise-atomic-{}", std::process::id()));
        fs::create_dir_all(&dir).unwrap();
        let target = dir.join("out.csv");
        let r = write_atomically(&target, |w| {
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
        write_atomically(&target, |w| w.write_all(b"whole")).unwrap();
        assert_eq!(fs::read_to_string(&target).unwrap(), "whole");
        fs::remove_dir_all(&dir).unwrap();
    }
}
