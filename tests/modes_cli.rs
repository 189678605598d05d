//! `starpoise modes` run as a user runs it: exit codes, JSON keys, text, eigenfunction CSV.
//!
//! Exit code 2 for bad input and "no file touched" are the project's command-line contract; the
//! numbers are checked against published values in tests/oscillation_*.rs, and here against the
//! radial table of docs/references.md §8.6.

mod common;

use common::{json, scratch_dir, starpoise, stderr};

fn modes(args: &[&str]) -> std::process::Output {
    let mut all = vec!["modes"];
    all.extend_from_slice(args);
    starpoise(&all)
}

#[test]
fn json_report_has_the_documented_keys() {
    let out = modes(&[
        "--polytrope",
        "3",
        "--degrees",
        "0,2",
        "--max-order",
        "4",
        "--format",
        "json",
    ]);
    assert!(out.status.success(), "{}", stderr(&out));
    let v = json(&out);
    for key in [
        "program",
        "version",
        "command",
        "constants",
        "model",
        "polytropic_index",
        "gamma1",
        "degrees",
        "max_order",
        "cowling",
    ] {
        assert!(!v["meta"][key].is_null(), "meta.{key} missing: {v}");
    }
    let list = v["modes"].as_array().unwrap();
    // Radial orders 1-4, l = 2 from g4 to p4 (nine modes).
    assert_eq!(list.len(), 4 + 9);
    for m in list {
        for key in [
            "degree",
            "order",
            "kind",
            "sigma",
            "sigma_squared",
            "inertia",
        ] {
            assert!(!m[key].is_null(), "{key} missing: {m}");
        }
        // The keys of a mode are the table columns that Python's Star.modes gives, less the
        // physical ones a polytrope has not.
        let physical = ["frequency_uhz", "growth_rate_per_s", "growth_per_radian"];
        let mut expected: Vec<&str> = starpoise::output::modes::MODE_COLUMNS
            .into_iter()
            .filter(|k| !physical.contains(k))
            .collect();
        let mut got: Vec<&str> = m.as_object().unwrap().keys().map(String::as_str).collect();
        expected.sort_unstable();
        got.sort_unstable();
        assert_eq!(got, expected, "{m}");
    }
    // docs/references.md §8.6: n = 3, Gamma_1 = 5/3, radial fundamental w = 9.25471 (+-1e-5).
    let w = list[0]["sigma_squared"].as_f64().unwrap();
    assert!((w - 9.25471).abs() <= 1e-5, "{w}");
    assert!((list[0]["sigma"].as_f64().unwrap() - w.sqrt()).abs() < 1e-12);
    assert_eq!(list[0]["kind"], "p");
    let kinds: Vec<&str> = list[4..]
        .iter()
        .map(|m| m["kind"].as_str().unwrap())
        .collect();
    assert_eq!(kinds, ["g", "g", "g", "g", "f", "p", "p", "p", "p"]);
    // docs/references.md §8.6: Delta nu sqrt(R^3/GM) = 0.1970 for n = 3.
    let dnu = v["large_separation_asymptotic"].as_f64().unwrap();
    assert!((dnu - 0.1970).abs() < 5e-5, "{dnu}");
    assert!(v["small_separation_d02"].is_f64());
    assert!(v["period_spacing_asymptotic"].is_f64());
}

#[test]
fn text_report_lists_the_modes() {
    let out = modes(&["--polytrope", "1.5", "--degrees", "0", "--max-order", "2"]);
    assert!(out.status.success(), "{}", stderr(&out));
    let text = String::from_utf8_lossy(&out.stdout);
    assert!(text.contains("polytrope n = 1.5"), "{text}");
    // docs/references.md §8.6: n = 1.5 radial w = 2.70587, 12.5356 (+-1 in the last digit).
    let sigma2: Vec<f64> = text
        .lines()
        .filter(|l| l.trim_start().starts_with("0 "))
        .map(|l| l.split_whitespace().nth(4).unwrap().parse().unwrap())
        .collect();
    assert_eq!(sigma2.len(), 2, "{text}");
    assert!((sigma2[0] - 2.70587).abs() <= 1e-5, "{text}");
    assert!((sigma2[1] - 12.5356).abs() <= 1e-4, "{text}");
    // n = 1.5 with Gamma_1 = 5/3 is neutrally stratified: no g-mode cavity.
    assert!(text.contains("Pi_0, asymptotic: n/a"), "{text}");
}

#[test]
fn eigenfunctions_are_written() {
    let dir = scratch_dir("modes-eigen");
    let path = dir.join("eigen.csv");
    let out = modes(&[
        "--polytrope",
        "3",
        "--degrees",
        "1",
        "--max-order",
        "1",
        "--eigenfunctions",
        path.to_str().unwrap(),
    ]);
    assert!(out.status.success(), "{}", stderr(&out));
    let text = std::fs::read_to_string(&path).unwrap();
    // The provenance comes first, as `# key: value` lines (output::meta).
    assert!(text.starts_with("# program: starpoise"), "{text}");
    let mut lines = text.lines().skip_while(|l| l.starts_with('#'));
    assert_eq!(
        lines.next(),
        Some("degree,order,x,xi_r,xi_h,p_prime,phi_prime")
    );
    let rows: Vec<Vec<f64>> = lines
        .map(|l| l.split(',').map(|v| v.parse().unwrap()).collect())
        .collect();
    // g1 and p1; each normalised to xi_r(R) = R at its last row (x = 1).
    for order in [-1.0, 1.0] {
        let mode: Vec<&Vec<f64>> = rows.iter().filter(|r| r[1] == order).collect();
        assert!(mode.len() > 100);
        let last = mode.last().unwrap();
        assert_eq!(last[2], 1.0);
        assert!((last[3] - 1.0).abs() < 1e-12);
    }
}

#[test]
fn bad_input_exits_2_and_touches_no_file() {
    let dir = scratch_dir("modes-bad");
    let path = dir.join("keep.csv");
    std::fs::write(&path, "untouched").unwrap();
    let cases: [(&[&str], &str); 9] = [
        (&["--polytrope", "5"], "--polytrope = 5"),
        (&["--polytrope", "-1"], "--polytrope = -1"),
        (&["--polytrope", "3", "--gamma1", "1.2"], "--gamma1 = 1.2"),
        (&["--polytrope", "3", "--max-order", "0"], "--max-order = 0"),
        (&["--polytrope", "3", "--points", "10"], "--points = 10"),
        (&["--polytrope", "3", "--z", "0.01"], "--polytrope = 3"),
        (&["--mass", "1", "--gamma1", "1.6"], "--gamma1 = 1.6"),
        (&["--mass", "400"], "--mass = 400"),
        (&["--mass", "1", "--points", "5"], "--points = 5"),
    ];
    for (args, message) in cases {
        let mut all = args.to_vec();
        all.extend(["--eigenfunctions", path.to_str().unwrap()]);
        let out = modes(&all);
        assert_eq!(out.status.code(), Some(2), "{args:?}");
        assert!(stderr(&out).contains(message), "{args:?}: {}", stderr(&out));
        assert_eq!(std::fs::read_to_string(&path).unwrap(), "untouched");
    }
    let out = modes(&[
        "--polytrope",
        "3",
        "--eigenfunctions",
        dir.to_str().unwrap(),
    ]);
    assert_eq!(out.status.code(), Some(2));
    assert!(
        stderr(&out).contains("--eigenfunctions"),
        "{}",
        stderr(&out)
    );
}

/// A ZAMS model (`--mass`): frequencies also in uHz, the growth rates of the radial modes, and
/// the separations in uHz with the solar-scaled relations of Kjeldsen & Bedding (1995, A&A 293,
/// 87; docs/references.md §8.6) beside them. The large separation from the radial modes near
/// nu_max is within 3 per cent of the scaling relation at the model's own M and R (the bound
/// of tests/oscillation_zams.rs, which explains it).
#[test]
fn zams_json_report_in_microhertz() {
    let out = modes(&[
        "--mass",
        "1",
        "--degrees",
        "0,2",
        "--max-order",
        "25",
        "--format",
        "json",
    ]);
    assert!(out.status.success(), "{}", stderr(&out));
    let v = json(&out);
    assert_eq!(v["meta"]["model"], "zams");
    for key in ["mass_msun", "x", "z", "physics", "radius_rsun", "teff_k"] {
        assert!(
            !v["meta"][key].is_null(),
            "meta.{key} missing: {}",
            v["meta"]
        );
    }
    let radius = v["meta"]["radius_rsun"].as_f64().unwrap();
    // sqrt(G M_sun/R_sun^3)/(2 pi) = 99.92 uHz for the nominal Sun (docs/references.md §8.6).
    let unit = 99.92 * 2.0 * std::f64::consts::PI / radius.powf(1.5);
    let list = v["modes"].as_array().unwrap();
    assert_eq!(list.len(), 25 + 51);
    for m in list {
        let nu = m["frequency_uhz"].as_f64().unwrap();
        let expected = m["cyclic_frequency"].as_f64().unwrap() * unit;
        assert!((nu / expected - 1.0).abs() < 1e-4, "{m}");
        assert_eq!(m["degree"] == 0, m["growth_rate_per_s"].is_f64(), "{m}");
    }
    let dnu = v["large_separation_uhz"].as_f64().unwrap();
    let scaling = v["large_separation_scaling_uhz"].as_f64().unwrap();
    assert!((dnu / scaling - 1.0).abs() < 0.03, "{dnu} vs {scaling}");
    for key in [
        "large_separation_asymptotic_uhz",
        "small_separation_d02_uhz",
        "separations_around_uhz",
        "nu_max_scaling_uhz",
        "period_spacing_asymptotic_s",
    ] {
        assert!(v[key].is_f64(), "{key} missing");
    }
    // The separations are measured at the radial mode nearest nu_max.
    let around = v["separations_around_uhz"].as_f64().unwrap();
    let nu_max = v["nu_max_scaling_uhz"].as_f64().unwrap();
    assert!((around - nu_max).abs() < 0.5 * dnu, "{around} vs {nu_max}");
}
