//! `starpoise polytrope` run as a user runs it: exit codes, JSON keys, text, profile CSV.
//!
//! Exit code 2 for bad input and "no partial file" are the project's command-line contract
//! (issue 2); the numbers are checked against the library, which the other test files check
//! against published values.

use std::path::PathBuf;
use std::process::{Command, Output};

fn run(args: &[&str]) -> Output {
    Command::new(env!("CARGO_BIN_EXE_starpoise"))
        .arg("polytrope")
        .args(args)
        .output()
        .expect("the binary runs")
}

fn json(args: &[&str]) -> serde_json::Value {
    let mut all = args.to_vec();
    all.extend(["--format", "json"]);
    let out = run(&all);
    assert!(
        out.status.success(),
        "{}",
        String::from_utf8_lossy(&out.stderr)
    );
    serde_json::from_slice(&out.stdout).expect("stdout is one JSON object")
}

fn scratch(name: &str) -> PathBuf {
    let dir = std::env::temp_dir().join(format!("starpoise-cli-{}-{name}", std::process::id()));
    std::fs::create_dir_all(&dir).unwrap();
    dir
}

const DIMENSIONLESS_KEYS: [&str; 8] = [
    "index",
    "xi1",
    "omega_n",
    "rho_c_over_rho_mean",
    "w_n",
    "potential_energy_coefficient",
    "theta_n",
    "dtheta_dxi_at_xi1",
];

const SCALED_KEYS: [&str; 6] = [
    "mass_msun",
    "radius_rsun",
    "mu",
    "central_density_g_cm3",
    "central_pressure_dyn_cm2",
    "central_temperature_k",
];

#[test]
fn json_keys_present_and_numbers_parse() {
    let v = json(&["--index", "3"]);
    for key in DIMENSIONLESS_KEYS {
        assert!(v[key].is_f64(), "{key} missing or not a number: {v}");
    }
    for key in SCALED_KEYS {
        assert!(v.get(key).is_none(), "{key} present without a star");
    }
    // Reference-values.md §1 (computed): xi_1 = 6.896848619 for n = 3.
    assert!((v["xi1"].as_f64().unwrap() - 6.896_848_619).abs() < 5e-10);

    let v = json(&["--index", "3", "--mass", "1", "--radius", "1"]);
    for key in DIMENSIONLESS_KEYS.iter().chain(&SCALED_KEYS) {
        assert!(v[key].is_f64(), "{key} missing: {v}");
    }
    assert_eq!(v["mu"].as_f64(), Some(0.61), "documented default mu");
    assert!(v.get("beta").is_none());

    let v = json(&[
        "--index",
        "3",
        "--mass",
        "10",
        "--radius",
        "4",
        "--mu",
        "0.61",
        "--radiation",
    ]);
    // Reference-values.md §1 (computed): 1 - beta = 0.0358 at 10 M_sun, mu = 0.61.
    assert!(
        (1.0 - v["beta"].as_f64().unwrap() - 0.0358).abs() < 5e-5,
        "{v}"
    );
}

#[test]
fn n5_has_null_xi1() {
    let v = json(&["--index", "5"]);
    assert!(v["xi1"].is_null(), "{v}");
    assert!(v["rho_c_over_rho_mean"].is_null());
    assert!((v["omega_n"].as_f64().unwrap() - 3f64.sqrt()).abs() < 1e-15);
}

fn assert_bad_input(args: &[&str], flag: &str) {
    let out = run(args);
    assert_eq!(out.status.code(), Some(2), "{args:?}");
    let stderr = String::from_utf8_lossy(&out.stderr);
    assert!(
        stderr.contains(flag),
        "{args:?}: stderr {stderr:?} does not name {flag}"
    );
    assert!(out.stdout.is_empty(), "{args:?}: printed despite bad input");
}

#[test]
fn bad_index_exits_2_naming_the_flag() {
    for bad in ["6", "-1", "nan", "inf", "5.0000001"] {
        assert_bad_input(&["--index", bad], "--index");
    }
    assert_bad_input(&["--index=-1"], "--index");
    // n = 5 has no surface, so it cannot be scaled to a star.
    assert_bad_input(&["--index", "5", "--mass", "1", "--radius", "1"], "--index");
}

#[test]
fn bad_star_and_points_exit_2() {
    assert_bad_input(&["--index", "3", "--mass", "-1", "--radius", "1"], "--mass");
    assert_bad_input(&["--index", "3", "--mass", "0", "--radius", "1"], "--mass");
    assert_bad_input(
        &["--index", "3", "--mass", "1", "--radius", "nan"],
        "--radius",
    );
    assert_bad_input(
        &["--index", "3", "--mass", "1", "--radius", "1", "--mu", "0"],
        "--mu",
    );
    assert_bad_input(&["--index", "3", "--mass", "1"], "--radius");
    assert_bad_input(&["--index", "3", "--points", "1"], "--points");
    assert_bad_input(&["--index", "3", "--points", "1000001"], "--points");
}

#[test]
fn radiation_needs_n3_and_a_star() {
    assert_bad_input(
        &[
            "--index",
            "2",
            "--mass",
            "1",
            "--radius",
            "1",
            "--radiation",
        ],
        "--radiation",
    );
    assert_bad_input(&["--index", "5", "--radiation"], "--radiation");
    assert_bad_input(&["--index", "3", "--radiation"], "--radiation");
}

#[test]
fn bad_input_with_profile_writes_no_file() {
    let dir = scratch("nofile");
    let file = dir.join("profile.csv");
    let path = file.to_str().unwrap();
    let cases: [&[&str]; 4] = [
        &["--index", "6", "--profile", path],
        &["--index", "3", "--points", "0", "--profile", path],
        &[
            "--index",
            "2",
            "--mass",
            "1",
            "--radius",
            "1",
            "--radiation",
            "--profile",
            path,
        ],
        &[
            "--index",
            "3",
            "--mass",
            "1",
            "--radius",
            "-2",
            "--profile",
            path,
        ],
    ];
    for args in cases {
        let out = run(args);
        assert_eq!(out.status.code(), Some(2), "{args:?}");
        assert!(!file.exists(), "{args:?} left a file");
    }
    assert_eq!(
        std::fs::read_dir(&dir).unwrap().count(),
        0,
        "temporary file left"
    );
    std::fs::remove_dir_all(&dir).unwrap();
}

#[test]
fn profile_csv_header_and_rows() {
    let dir = scratch("csv");
    let file = dir.join("n3.csv");
    let out = run(&[
        "--index",
        "3",
        "--points",
        "57",
        "--profile",
        file.to_str().unwrap(),
    ]);
    assert!(out.status.success());
    let text = std::fs::read_to_string(&file).unwrap();
    // Metadata lines (provenance, index, units), then the header and the rows.
    assert!(text.starts_with("# program: starpoise\n"), "{text}");
    assert!(text.contains("\n# index: 3.0\n"), "{text}");
    let mut lines = text.lines().skip_while(|l| l.starts_with('#'));
    assert_eq!(lines.next(), Some("xi,theta,dtheta_dxi"));
    assert_eq!(lines.count(), 57);

    let out = run(&[
        "--index",
        "3",
        "--mass",
        "1",
        "--radius",
        "1",
        "--profile",
        file.to_str().unwrap(),
        "--format",
        "json",
    ]);
    assert!(out.status.success());
    let summary: serde_json::Value = serde_json::from_slice(&out.stdout).unwrap();
    let mut reader = csv::ReaderBuilder::new()
        .comment(Some(b'#'))
        .from_path(&file)
        .unwrap();
    let header: Vec<String> = reader
        .headers()
        .unwrap()
        .iter()
        .map(str::to_string)
        .collect();
    assert_eq!(
        header,
        [
            "xi",
            "theta",
            "dtheta_dxi",
            "radius_cm",
            "r_over_R",
            "mass_g",
            "m_over_M",
            "density_g_cm3",
            "pressure_dyn_cm2",
            "temperature_k"
        ]
    );
    let rows: Vec<Vec<f64>> = reader
        .records()
        .map(|r| r.unwrap().iter().map(|x| x.parse().unwrap()).collect())
        .collect();
    assert_eq!(rows.len(), 200, "default --points");
    // Centre row carries the central values of the summary; the last row is the surface.
    assert_eq!(
        rows[0][7],
        summary["central_density_g_cm3"].as_f64().unwrap()
    );
    assert_eq!(
        rows[0][8],
        summary["central_pressure_dyn_cm2"].as_f64().unwrap()
    );
    assert_eq!(
        rows[0][9],
        summary["central_temperature_k"].as_f64().unwrap()
    );
    let last = rows.last().unwrap();
    assert_eq!(last[0], summary["xi1"].as_f64().unwrap());
    assert_eq!(last[1], 0.0);
    assert!((last[4] - 1.0).abs() < 1e-15 && (last[6] - 1.0).abs() < 1e-15);
    std::fs::remove_dir_all(&dir).unwrap();
}

/// The text summary shows the same numbers as the JSON to its ten significant figures.
#[test]
fn text_output_matches_json() {
    let args = ["--index", "3", "--mass", "1", "--radius", "1"];
    let out = run(&args);
    assert!(out.status.success());
    let text = String::from_utf8(out.stdout).unwrap();
    let v = json(&args);
    let find = |label: &str| -> f64 {
        let line = text
            .lines()
            .find(|l| l.starts_with(label))
            .unwrap_or_else(|| panic!("{label} in {text}"));
        let rest = &line[label.len()..];
        rest.split_whitespace()
            .find_map(|w| w.parse().ok())
            .unwrap()
    };
    let pairs = [
        ("first zero xi_1", "xi1"),
        ("omega_n", "omega_n"),
        ("rho_c / rho_mean", "rho_c_over_rho_mean"),
        ("W_n", "w_n"),
        ("central density", "central_density_g_cm3"),
        ("central pressure", "central_pressure_dyn_cm2"),
        ("central temperature", "central_temperature_k"),
    ];
    for (label, key) in pairs {
        let shown = find(label);
        let exact = v[key].as_f64().unwrap();
        assert!(
            (shown / exact - 1.0).abs() < 1e-9,
            "{label}: {shown} vs {exact}"
        );
    }
    assert!(text.contains("g/cm^3") && text.contains("dyn/cm^2") && text.contains(" K"));
}
