//! `starpoise completions SHELL` writes a completion script for each supported shell to
//! standard output, naming every subcommand and the figure flags.

mod common;
use common::{starpoise, stderr};

/// Every subcommand a user can complete.
const SUBCOMMANDS: [&str; 10] = [
    "zams",
    "sequence",
    "compare",
    "merge",
    "plot",
    "polytrope",
    "probe",
    "verify",
    "completions",
    "help",
];

#[test]
fn each_shell_gets_a_script_naming_the_subcommands() {
    // What marks each shell's script as its own: bash's `complete` builtin, zsh's `#compdef`
    // header, fish's `complete -c` command (each shell's documented completion mechanism).
    for (shell, marker) in [
        ("bash", "complete -F"),
        ("zsh", "#compdef starpoise"),
        ("fish", "complete -c starpoise"),
    ] {
        let out = starpoise(&["completions", shell]);
        assert!(out.status.success(), "{shell}: {}", stderr(&out));
        assert!(out.stderr.is_empty(), "{shell}: {}", stderr(&out));
        let script = String::from_utf8(out.stdout).unwrap();
        assert!(script.contains(marker), "{shell}: no '{marker}'");
        for sub in SUBCOMMANDS {
            assert!(script.contains(sub), "{shell}: no subcommand {sub}");
        }
        for flag in ["abscissa", "plot", "masses"] {
            assert!(script.contains(flag), "{shell}: no flag {flag}");
        }
        // The abscissa's values are offered.
        for value in ["radius", "mass", "pressure"] {
            assert!(script.contains(value), "{shell}: no value {value}");
        }
    }
}

#[test]
fn an_unknown_shell_is_refused() {
    let out = starpoise(&["completions", "tcsh"]);
    assert_eq!(out.status.code(), Some(2));
    assert!(out.stdout.is_empty());
    assert!(stderr(&out).contains("tcsh"), "{}", stderr(&out));
}

#[test]
fn bash_script_completes_subcommands_and_values() {
    let out = starpoise(&["completions", "bash"]);
    assert!(out.status.success(), "{}", stderr(&out));
    let dir = common::scratch_dir("completions");
    let script = dir.join("starpoise.bash");
    std::fs::write(&script, &out.stdout).unwrap();
    // Call the completion function as bash's `complete -F` does: words so far in COMP_WORDS,
    // then (command, current word, previous word) as arguments.
    let probe = format!(
        "source '{}'; \
         COMP_WORDS=(starpoise com); COMP_CWORD=1; _starpoise starpoise com starpoise; \
         echo \"${{COMPREPLY[*]}}\"; \
         COMP_WORDS=(starpoise zams --abscissa ''); COMP_CWORD=3; _starpoise starpoise '' --abscissa; \
         echo \"${{COMPREPLY[*]}}\"",
        script.display()
    );
    let run = std::process::Command::new("bash")
        .args(["-c", &probe])
        .output()
        .expect("bash runs");
    assert!(
        run.status.success(),
        "{}",
        String::from_utf8_lossy(&run.stderr)
    );
    let lines: Vec<String> = String::from_utf8_lossy(&run.stdout)
        .lines()
        .map(str::to_string)
        .collect();
    assert_eq!(lines, ["compare completions", "radius mass pressure"]);
    let _ = std::fs::remove_dir_all(&dir);
}
