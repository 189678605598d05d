//! Helpers shared by the command-line tests.
#![allow(dead_code)]

use std::path::PathBuf;
use std::process::{Command, Output};

/// Run the starpoise binary with `args`.
pub fn starpoise(args: &[&str]) -> Output {
    Command::new(env!("CARGO_BIN_EXE_starpoise"))
        .args(args)
        .output()
        .expect("the binary runs")
}

/// A fresh empty directory for one test's files.
pub fn scratch_dir(name: &str) -> PathBuf {
    let dir = std::env::temp_dir().join(format!("starpoise-test-{name}-{}", std::process::id()));
    let _ = std::fs::remove_dir_all(&dir);
    std::fs::create_dir_all(&dir).expect("scratch directory");
    dir
}

/// Standard error as text.
pub fn stderr(o: &Output) -> String {
    String::from_utf8_lossy(&o.stderr).into_owned()
}

/// Standard output parsed as one JSON value.
pub fn json(o: &Output) -> serde_json::Value {
    serde_json::from_slice(&o.stdout).unwrap_or_else(|e| {
        panic!(
            "stdout is not JSON ({e}): {}",
            String::from_utf8_lossy(&o.stdout)
        )
    })
}
