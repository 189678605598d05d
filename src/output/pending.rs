//! The temporary files of writes in progress, so that an interrupted process can remove them.
//!
//! Every temporary file is registered (under a lock) before it is created and leaves the
//! register, under the same lock, only when it has been renamed onto its target or removed. A
//! signal handler running on its own thread (the binary installs one for SIGINT, SIGTERM and
//! SIGHUP) calls [`remove_all`], which removes every registered file and keeps the lock until the
//! process ends: no temporary file can then be created or renamed into place, so nothing is left
//! half-written under a final name and no temporary file survives the signal.

use std::path::{Path, PathBuf};
use std::sync::{Mutex, MutexGuard};

static PENDING: Mutex<Vec<PathBuf>> = Mutex::new(Vec::new());

/// The register, even if a thread panicked while holding it (the list stays valid).
fn lock() -> MutexGuard<'static, Vec<PathBuf>> {
    PENDING
        .lock()
        .unwrap_or_else(|poisoned| poisoned.into_inner())
}

/// Run `create` (which creates the temporary file `path`) with `path` registered, under the
/// lock; on failure `path` leaves the register.
pub(crate) fn create<T>(
    path: &Path,
    create: impl FnOnce() -> std::io::Result<T>,
) -> std::io::Result<T> {
    let mut list = lock();
    list.push(path.to_path_buf());
    let result = create();
    if result.is_err() {
        list.retain(|p| p != path);
    }
    result
}

/// Rename the registered temporary file `tmp` onto `target` and unregister it, under the lock.
pub(crate) fn commit(tmp: &Path, target: &Path) -> std::io::Result<()> {
    let mut list = lock();
    let result = std::fs::rename(tmp, target);
    if result.is_err() {
        let _ = std::fs::remove_file(tmp);
    }
    list.retain(|p| p != tmp);
    result
}

/// Remove the registered temporary file `tmp` and unregister it, under the lock.
pub(crate) fn discard(tmp: &Path) {
    let mut list = lock();
    let _ = std::fs::remove_file(tmp);
    list.retain(|p| p != tmp);
}

/// The temporary files registered now (for tests and diagnostics).
pub fn registered() -> Vec<PathBuf> {
    lock().clone()
}

/// Remove every registered temporary file and return the lock, held: while the caller keeps
/// it, no temporary file is created or renamed onto its target. A signal handler calls this and
/// then ends the process with the lock still held.
pub fn remove_all() -> MutexGuard<'static, Vec<PathBuf>> {
    let mut list = lock();
    for path in list.drain(..) {
        let _ = std::fs::remove_file(path);
    }
    list
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn a_discarded_file_is_removed_and_unregistered() {
        let dir = std::env::temp_dir().join(format!("starpoise-pending-{}", std::process::id()));
        std::fs::create_dir_all(&dir).unwrap();
        let tmp = dir.join(".x.partial");
        create(&tmp, || std::fs::File::create(&tmp)).unwrap();
        assert!(registered().contains(&tmp));
        discard(&tmp);
        assert!(!tmp.exists());
        assert!(!registered().contains(&tmp));
        std::fs::remove_dir_all(&dir).unwrap();
    }
}
