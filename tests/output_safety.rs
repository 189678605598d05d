//! Where outputs go and what is never done to a file: `-` is standard output, FIFOs and
//! character devices are written in place (never replaced), a link keeps pointing at its file,
//! a closed standard output ends the program quietly, and a signal during a write leaves neither
//! a temporary file nor a partial output.

mod common;
use common::{scratch_dir, small_grid, starpoise, stderr};
use std::io::Read;
use std::os::unix::fs::FileTypeExt;
use std::os::unix::process::ExitStatusExt;
use std::path::Path;
use std::process::{Command, Stdio};
use std::time::{Duration, Instant};

fn bin() -> Command {
    Command::new(env!("CARGO_BIN_EXE_starpoise"))
}

fn mkfifo(path: &Path) {
    let ok = Command::new("mkfifo").arg(path).status().unwrap().success();
    assert!(ok, "mkfifo {}", path.display());
}

/// A FIFO is opened and written in place, and stays a FIFO.
#[test]
fn a_fifo_is_streamed_not_replaced() {
    let dir = scratch_dir("fifo");
    let fifo = dir.join("pipe.csv");
    mkfifo(&fifo);
    let reader = {
        let fifo = fifo.clone();
        std::thread::spawn(move || {
            let mut text = String::new();
            std::fs::File::open(&fifo)
                .unwrap()
                .read_to_string(&mut text)
                .unwrap();
            text
        })
    };
    let out = starpoise(&[
        "polytrope",
        "--index",
        "1.5",
        "--profile",
        fifo.to_str().unwrap(),
    ]);
    assert!(out.status.success(), "{}", stderr(&out));
    let text = reader.join().unwrap();
    assert!(text.starts_with("# program: starpoise"), "{text}");
    assert!(text.contains("\nxi,theta,dtheta_dxi\n"), "{text}");
    let meta = std::fs::symlink_metadata(&fifo).unwrap();
    assert!(meta.file_type().is_fifo(), "the FIFO was replaced");
    assert_eq!(
        std::fs::read_dir(&dir).unwrap().count(),
        1,
        "a file was left"
    );
    let _ = std::fs::remove_dir_all(&dir);
}

/// A character device (here /dev/null, also through a link) is written in place: it stays a
/// device even for a process run as root.
#[test]
fn a_character_device_is_written_in_place() {
    let dir = scratch_dir("device");
    let link = dir.join("null.csv");
    std::os::unix::fs::symlink("/dev/null", &link).unwrap();
    for target in [Path::new("/dev/null"), link.as_path()] {
        small_grid(target);
        let meta = std::fs::metadata("/dev/null").unwrap();
        assert!(meta.file_type().is_char_device(), "/dev/null was replaced");
    }
    assert!(std::fs::symlink_metadata(&link)
        .unwrap()
        .file_type()
        .is_symlink());
    let _ = std::fs::remove_dir_all(&dir);
}

/// A link to a regular file stays a link; the file it points to gets the content, atomically.
#[test]
fn a_link_keeps_pointing_at_its_file() {
    let dir = scratch_dir("link");
    std::fs::create_dir_all(dir.join("data")).unwrap();
    let target = dir.join("data/real.csv");
    std::fs::write(&target, "old content\n").unwrap();
    let link = dir.join("link.csv");
    std::os::unix::fs::symlink("data/real.csv", &link).unwrap();
    let out = starpoise(&[
        "polytrope",
        "--index",
        "3",
        "--profile",
        link.to_str().unwrap(),
    ]);
    assert!(out.status.success(), "{}", stderr(&out));
    assert!(std::fs::symlink_metadata(&link)
        .unwrap()
        .file_type()
        .is_symlink());
    let text = std::fs::read_to_string(&target).unwrap();
    assert!(text.contains("xi,theta,dtheta_dxi"), "{text}");
    // No temporary file left beside the link or the target.
    assert_eq!(std::fs::read_dir(&dir).unwrap().count(), 2);
    assert_eq!(std::fs::read_dir(dir.join("data")).unwrap().count(), 1);
    let _ = std::fs::remove_dir_all(&dir);
}

/// `-` sends a text output to standard output for every command that writes one; what the
/// command would print there for people goes to standard error instead, and no file named `-`
/// appears.
#[test]
fn dash_is_standard_output_for_every_text_output() {
    let dir = scratch_dir("dash");
    let shard = dir.join("shard.csv");
    let cases: Vec<(Vec<String>, &str)> = vec![
        (
            vec![
                "zams",
                "--mass",
                "2",
                "--physics",
                "analytic",
                "--profile",
                "-",
            ],
            "mass_g,m_over_M,radius_cm",
        ),
        (
            vec![
                "zams",
                "--mass",
                "2",
                "--physics",
                "analytic",
                "--profile",
                "-",
                "--profile-format",
                "json",
            ],
            "\"columns\":[\"mass_g\"",
        ),
        (
            vec![
                "zams",
                "--mass",
                "2",
                "--physics",
                "analytic",
                "--profile",
                "-",
                "--profile-format",
                "ecsv",
            ],
            "# %ECSV 1.0",
        ),
        (
            vec!["polytrope", "--index", "2", "--profile", "-"],
            "xi,theta,dtheta_dxi",
        ),
        (
            vec![
                "sequence",
                "--quiet",
                "--masses",
                "1,2",
                "--physics",
                "analytic",
                "--out",
                "-",
            ],
            "grid_fingerprint,grid_index",
        ),
        (
            vec![
                "compare",
                "--mass",
                "2",
                "--physics",
                "analytic",
                "--variant",
                "a=",
                "--variant",
                "b=opacity-factor:2",
                "--out",
                "-",
            ],
            "mass_msun,x,y,z,variant",
        ),
    ]
    .into_iter()
    .map(|(a, n)| (a.into_iter().map(String::from).collect(), n))
    .collect();
    for (args, needle) in &cases {
        let out = bin().args(args).current_dir(&dir).output().unwrap();
        assert!(out.status.success(), "{args:?}: {}", stderr(&out));
        let text = String::from_utf8_lossy(&out.stdout);
        assert!(text.contains(needle), "{args:?}: {text}");
        assert!(!dir.join("-").exists(), "{args:?} wrote a file named -");
    }
    // The summary of zams moved to standard error.
    let out = bin()
        .args([
            "zams",
            "--mass",
            "2",
            "--physics",
            "analytic",
            "--profile",
            "-",
        ])
        .output()
        .unwrap();
    assert!(stderr(&out).contains("luminosity"), "{}", stderr(&out));
    assert!(!String::from_utf8_lossy(&out.stdout).contains("effective temperature"));
    // merge --out -
    small_grid(&shard);
    let out = starpoise(&["merge", shard.to_str().unwrap(), "--out", "-"]);
    assert!(out.status.success(), "{}", stderr(&out));
    let merged = String::from_utf8_lossy(&out.stdout);
    let rows = |t: &str| t.lines().filter(|l| !l.starts_with('#')).count();
    assert_eq!(rows(&merged), 3, "{merged}");
    let _ = std::fs::remove_dir_all(&dir);
}

/// `--profile /dev/stdout` with standard output redirected to a file writes the profile there
/// (through standard output) instead of replacing the file behind the process's back.
#[test]
fn dev_stdout_redirected_to_a_file_is_standard_output() {
    let dir = scratch_dir("devstdout");
    let file = dir.join("out.txt");
    let out = bin()
        .args(["polytrope", "--index", "1", "--profile", "/dev/stdout"])
        .stdout(std::fs::File::create(&file).unwrap())
        .output()
        .unwrap();
    assert!(out.status.success(), "{}", stderr(&out));
    let text = std::fs::read_to_string(&file).unwrap();
    assert!(text.contains("xi,theta,dtheta_dxi"), "{text}");
    assert!(stderr(&out).contains("first zero xi_1"), "{}", stderr(&out));
    assert_eq!(std::fs::read_dir(&dir).unwrap().count(), 1);
    let _ = std::fs::remove_dir_all(&dir);
}

/// A reader that closes standard output early ends the program quietly (no panic message; exit
/// 0 or death by SIGPIPE, as any filter), for every command that prints.
#[test]
fn a_closed_standard_output_ends_quietly() {
    let commands: [&[&str]; 11] = [
        &["zams", "--mass", "2", "--physics", "analytic"],
        &[
            "zams",
            "--mass",
            "2",
            "--physics",
            "analytic",
            "--format",
            "json",
        ],
        &[
            "zams",
            "--mass",
            "2",
            "--physics",
            "analytic",
            "--profile",
            "-",
        ],
        &["probe", "--density", "150", "--temperature", "1.57e7"],
        &[
            "probe",
            "--density",
            "150",
            "--temperature",
            "1.57e7",
            "--format",
            "json",
        ],
        &["verify", "--format", "json"],
        &[
            "polytrope",
            "--index",
            "3",
            "--points",
            "100000",
            "--profile",
            "-",
        ],
        &[
            "sequence",
            "--quiet",
            "--masses",
            "1,2",
            "--physics",
            "analytic",
        ],
        &[
            "compare",
            "--mass",
            "2",
            "--physics",
            "analytic",
            "--variant",
            "a=",
            "--variant",
            "b=opacity-factor:2",
        ],
        &["completions", "bash"],
        &["--help"],
    ];
    for args in commands {
        let mut child = bin()
            .args(args)
            .stdout(Stdio::piped())
            .stderr(Stdio::piped())
            .spawn()
            .unwrap();
        // Read five bytes, then close the pipe (as `| head -c 5` does).
        let mut stdout = child.stdout.take().unwrap();
        let mut first = [0u8; 5];
        let _ = stdout.read_exact(&mut first);
        drop(stdout);
        let out = child.wait_with_output().unwrap();
        let err = stderr(&out);
        assert!(!err.contains("panicked"), "{args:?}: {err}");
        assert!(!err.contains("Broken pipe"), "{args:?}: {err}");
        let quiet = out.status.success() || out.status.signal() == Some(13);
        assert!(quiet, "{args:?}: {:?} {err}", out.status);
    }
}

/// SIGINT or SIGTERM during a large write: the temporary file is removed, no output appears
/// under the final name, and the process ends by the signal.
#[test]
fn a_signal_during_a_write_leaves_nothing_behind() {
    for (signal, name) in [(2, "INT"), (15, "TERM")] {
        let dir = scratch_dir(&format!("signal-{name}"));
        let target = dir.join("p.csv");
        let mut child = bin()
            .args([
                "polytrope",
                "--index",
                "3",
                "--mass",
                "1",
                "--radius",
                "1",
                "--points",
                "1000000",
                "--profile",
                target.to_str().unwrap(),
            ])
            .stdout(Stdio::null())
            .stderr(Stdio::piped())
            .spawn()
            .unwrap();
        // Wait for the temporary file to appear and grow, then signal.
        let start = Instant::now();
        let partial = loop {
            let found = std::fs::read_dir(&dir)
                .unwrap()
                .filter_map(|e| e.ok())
                .map(|e| e.path())
                .find(|p| p.to_string_lossy().contains(".partial-"));
            if let Some(p) = found {
                if std::fs::metadata(&p).map(|m| m.len()).unwrap_or(0) > 0 {
                    break p;
                }
            }
            assert!(
                start.elapsed() < Duration::from_secs(60),
                "no temporary file appeared"
            );
            std::thread::sleep(Duration::from_millis(1));
        };
        let killed = Command::new("kill")
            .args([format!("-{name}"), child.id().to_string()])
            .status()
            .unwrap();
        assert!(killed.success());
        let status = child.wait().unwrap();
        assert_eq!(status.signal(), Some(signal), "{status:?}");
        assert!(
            !partial.exists(),
            "temporary file left: {}",
            partial.display()
        );
        assert!(!target.exists(), "a partial output under the final name");
        assert_eq!(std::fs::read_dir(&dir).unwrap().count(), 0);
        let _ = std::fs::remove_dir_all(&dir);
    }
}
