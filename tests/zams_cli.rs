//! The `zams` command as a user runs it: output keys, profile files, exit codes.

mod common;
use common::{json, scratch_dir, starpoise, stderr};

/// Keys the summary must carry (issue "ZAMS models by fitting-point shooting").
const SUMMARY_KEYS: [&str; 24] = [
    "mass_msun",
    "x",
    "z",
    "physics",
    "converged",
    "iterations",
    "radius_rsun",
    "luminosity_lsun",
    "teff_k",
    "log_g_cgs",
    "central_temperature_k",
    "central_density_g_cm3",
    "central_pressure_dyn_cm2",
    "central_degeneracy",
    "convective_core_mass_fraction",
    "convective_envelope_mass_fraction",
    "cno_luminosity_fraction",
    "eddington_ratio",
    "kelvin_helmholtz_time_yr",
    "dynamical_time_s",
    "nuclear_time_yr",
    "he3_equilibrium_time_yr",
    "virial_residual",
    "luminosity_residual",
];

#[test]
fn json_summary_has_every_key_and_a_consistent_teff() {
    let out = starpoise(&[
        "zams",
        "--mass",
        "3",
        "--physics",
        "analytic",
        "--format",
        "json",
    ]);
    assert!(out.status.success(), "{}", stderr(&out));
    let v = json(&out);
    for k in SUMMARY_KEYS {
        assert!(v.get(k).is_some(), "missing key {k}");
    }
    assert_eq!(v["converged"], true);
    assert_eq!(v["physics"]["preset"], "analytic");
    // T_eff printed must satisfy L = 4 pi R^2 sigma T^4 with the IAU nominal solar values:
    // T_eff = 5772 K (L/L_sun)^(1/4) (R/R_sun)^(-1/2) (Prša et al. 2016, IAU 2015 B3).
    let l = v["luminosity_lsun"].as_f64().unwrap();
    let r = v["radius_rsun"].as_f64().unwrap();
    let t = v["teff_k"].as_f64().unwrap();
    let expected = 5772.0 * l.powf(0.25) / r.sqrt();
    // The nominal 5772 K is itself rounded to 1 K from L_sun and R_sun: allow 2e-4.
    assert!((t / expected - 1.0).abs() < 2e-4, "T_eff {t} vs {expected}");
}

#[test]
fn text_summary_names_units() {
    let out = starpoise(&["zams", "--mass", "2", "--physics", "analytic"]);
    assert!(out.status.success(), "{}", stderr(&out));
    let text = String::from_utf8_lossy(&out.stdout);
    for needle in ["R_sun", "L_sun", "K", "g/cm^3", "dyn/cm^2", "converged"] {
        assert!(text.contains(needle), "text output lacks {needle}:\n{text}");
    }
}

#[test]
fn profile_csv_has_the_documented_columns_and_rows() {
    let dir = scratch_dir("zams-profile");
    let path = dir.join("star.csv");
    let out = starpoise(&[
        "zams",
        "--mass",
        "1.5",
        "--physics",
        "analytic",
        "--profile",
        path.to_str().unwrap(),
        "--points",
        "120",
    ]);
    assert!(out.status.success(), "{}", stderr(&out));
    let mut reader = csv::ReaderBuilder::new()
        .comment(Some(b'#'))
        .from_path(&path)
        .unwrap();
    let header: Vec<String> = reader
        .headers()
        .unwrap()
        .iter()
        .map(str::to_string)
        .collect();
    assert_eq!(header, starpoise::structure::PROFILE_COLUMNS.to_vec());
    let rows: Vec<csv::StringRecord> = reader.records().map(|r| r.unwrap()).collect();
    assert_eq!(rows.len(), 120);
    let col = |name: &str| header.iter().position(|h| h == name).unwrap();
    let m: Vec<f64> = rows
        .iter()
        .map(|r| r[col("m_over_M")].parse().unwrap())
        .collect();
    let p: Vec<f64> = rows
        .iter()
        .map(|r| r[col("pressure_dyn_cm2")].parse().unwrap())
        .collect();
    // Centre first, mass increasing, pressure decreasing (hydrostatic equilibrium).
    assert!(m.windows(2).all(|w| w[1] > w[0]), "m/M not increasing");
    assert!(p.windows(2).all(|w| w[1] < w[0]), "P not decreasing");
    assert!(m[0] < 1e-6 && m[m.len() - 1] > 0.999_999);
    let _ = std::fs::remove_dir_all(&dir);
}

/// A JSON profile is {meta, columns, units, rows}, row-major.
#[test]
fn profile_json_has_meta_columns_units_and_rows() {
    let dir = scratch_dir("zams-profile-json");
    let path = dir.join("star.json");
    let out = starpoise(&[
        "zams",
        "--mass",
        "4",
        "--physics",
        "analytic",
        "--profile",
        path.to_str().unwrap(),
        "--profile-format",
        "json",
        "--points",
        "50",
    ]);
    assert!(out.status.success(), "{}", stderr(&out));
    let v: serde_json::Value =
        serde_json::from_str(&std::fs::read_to_string(&path).unwrap()).unwrap();
    // {meta, columns, units, rows}: rows are arrays in the order of columns.
    let columns: Vec<&str> = v["columns"]
        .as_array()
        .unwrap()
        .iter()
        .map(|c| c.as_str().unwrap())
        .collect();
    assert_eq!(columns, starpoise::structure::PROFILE_COLUMNS);
    assert_eq!(v["units"]["brunt_n2_rad2_s2"], "rad2 / s2");
    assert_eq!(v["units"]["m_over_M"], "");
    assert_eq!(v["meta"]["content"], "ZAMS profile");
    assert_eq!(v["meta"]["mass_msun"], 4.0);
    assert_eq!(v["meta"]["physics"]["preset"], "analytic");
    let rows = v["rows"].as_array().unwrap();
    assert_eq!(rows.len(), 50);
    assert!(rows
        .iter()
        .all(|r| r.as_array().unwrap().len() == columns.len()));
    let _ = std::fs::remove_dir_all(&dir);
}

/// Every bad value exits 2, names the value, and writes no file.
#[test]
fn bad_input_exits_2_names_the_value_and_writes_nothing() {
    let dir = scratch_dir("zams-bad");
    let profile = dir.join("p.csv");
    let missing_model = dir.join("none.json");
    let bad_model = dir.join("bad.json");
    std::fs::write(&bad_model, "{\"mass_msun\": 1, \"colour\": \"red\"}").unwrap();
    let cases: Vec<(Vec<&str>, &str)> = vec![
        (vec!["--mass", "0"], "--mass"),
        (vec!["--mass", "-1"], "--mass"),
        (vec!["--mass", "NaN"], "--mass"),
        (vec!["--mass", "0.01"], "--mass"),
        (vec!["--mass", "200"], "--mass"),
        (vec!["--mass", "1", "--x", "0.9", "--z", "0.2"], "X + Z"),
        (vec!["--mass", "1", "--x", "0", "--z", "0.02"], "--x"),
        (
            vec!["--mass", "1", "--opacity", "no-such-law"],
            "no-such-law",
        ),
        (vec!["--mass", "1", "--physics", "fancy"], "fancy"),
        (vec!["--mass", "1", "--fit-mass", "1.5"], "--fit-mass"),
        (vec!["--mass", "1", "--points", "3"], "--points"),
        (
            vec!["--model", missing_model.to_str().unwrap()],
            "none.json",
        ),
        (vec!["--model", bad_model.to_str().unwrap()], "colour"),
        (vec!["--mass", "0.5", "--physics", "analytic"], "analytic"),
    ];
    for (args, needle) in cases {
        let mut all = vec!["zams"];
        all.extend(args.iter().copied());
        all.extend(["--profile", profile.to_str().unwrap()]);
        let out = starpoise(&all);
        assert_eq!(out.status.code(), Some(2), "{all:?}: {}", stderr(&out));
        assert!(
            stderr(&out).contains(needle),
            "{all:?}: message lacks {needle}: {}",
            stderr(&out)
        );
        assert!(!profile.exists(), "{all:?} wrote a file");
    }
    assert_eq!(std::fs::read_dir(&dir).unwrap().count(), 1, "stray files");
    // An output path that is a directory is bad input too, for every command that writes.
    let d = dir.to_str().unwrap();
    for args in [
        vec![
            "zams",
            "--mass",
            "1",
            "--physics",
            "analytic",
            "--profile",
            d,
        ],
        vec!["zams", "--mass", "1", "--physics", "analytic", "--plot", d],
        vec![
            "sequence",
            "--masses",
            "1,2",
            "--physics",
            "analytic",
            "--out",
            d,
        ],
        vec!["polytrope", "--index", "3", "--profile", d],
        vec!["merge", "x.csv", "--out", d],
    ] {
        let out = starpoise(&args);
        assert_eq!(out.status.code(), Some(2), "{args:?}: {}", stderr(&out));
        assert!(
            stderr(&out).contains("directory"),
            "{args:?}: {}",
            stderr(&out)
        );
    }
    let _ = std::fs::remove_dir_all(&dir);
}

#[test]
fn model_file_is_read_and_flags_override_it() {
    let dir = scratch_dir("zams-model");
    let model = dir.join("star.json");
    std::fs::write(
        &model,
        r#"{"name": "test star", "mass_msun": 2.0, "preset": "analytic", "x": 0.7, "z": 0.02}"#,
    )
    .unwrap();
    let from_file = json(&starpoise(&[
        "zams",
        "--model",
        model.to_str().unwrap(),
        "--format",
        "json",
    ]));
    assert_eq!(from_file["mass_msun"], 2.0);
    let overridden = json(&starpoise(&[
        "zams",
        "--model",
        model.to_str().unwrap(),
        "--mass",
        "3",
        "--format",
        "json",
    ]));
    assert_eq!(overridden["mass_msun"], 3.0);
    assert_eq!(overridden["physics"]["preset"], "analytic");
    let _ = std::fs::remove_dir_all(&dir);
}

/// The `physics` object of `zams --format json`, merged with `mass_msun`, `x` and `z`, is a model
/// file that rebuilds the same star bit for bit: for each preset and for overrides that set
/// factors and law parameters; and every law name the summary prints is accepted by its flag.
#[test]
fn summary_physics_object_rebuilds_the_same_model() {
    let dir = scratch_dir("zams-roundtrip");
    let cases: [&[&str]; 6] = [
        &["--mass", "1"],
        &["--mass", "2", "--preset", "analytic"],
        &[
            "--mass",
            "1.3",
            "--opacity-factor",
            "1.5",
            "--rates-factor",
            "0.8",
        ],
        &[
            "--mass",
            "0.8",
            "--alpha",
            "1.6",
            "--opacity",
            "refined:guillotine=2.5",
        ],
        &[
            "--mass",
            "3",
            "--preset",
            "analytic",
            "--rates",
            "power-law:nu=5",
        ],
        &[
            "--mass",
            "5",
            "--atmosphere",
            "photosphere",
            "--convection",
            "adiabatic",
        ],
    ];
    for args in cases {
        let mut a = vec!["zams", "--format", "json"];
        a.extend_from_slice(args);
        let first = json(&starpoise(&a));
        let mut file = first["physics"].as_object().unwrap().clone();
        for k in ["mass_msun", "x", "z"] {
            file.insert(k.to_string(), first[k].clone());
        }
        let path = dir.join("again.json");
        std::fs::write(&path, serde_json::Value::Object(file).to_string()).unwrap();
        let again = json(&starpoise(&[
            "zams",
            "--format",
            "json",
            "--model",
            path.to_str().unwrap(),
        ]));
        assert_eq!(without_meta(again), without_meta(first.clone()), "{args:?}");
        // Each printed law is accepted by its flag and gives the same star again.
        let p = &first["physics"];
        let mut b = vec!["zams", "--format", "json", "--mass"];
        let mass = first["mass_msun"].to_string();
        b.push(&mass);
        let flags: Vec<(String, String)> = [
            ("--preset", "preset"),
            ("--eos", "eos"),
            ("--opacity", "opacity"),
            ("--opacity-factor", "opacity_factor"),
            ("--rates", "rates"),
            ("--rates-factor", "rates_factor"),
            ("--convection", "convection"),
            ("--atmosphere", "atmosphere"),
        ]
        .iter()
        .map(|(flag, key)| {
            let v = &p[*key];
            let text = v.as_str().map_or_else(|| v.to_string(), String::from);
            (flag.to_string(), text)
        })
        .collect();
        for (flag, value) in &flags {
            b.push(flag);
            b.push(value);
        }
        assert_eq!(
            without_meta(json(&starpoise(&b))),
            without_meta(first.clone()),
            "{b:?}"
        );
    }
    let _ = std::fs::remove_dir_all(&dir);
}

/// A model file with a key given twice, an unknown key, or an out-of-range value is refused
/// with exit 2, naming the file and the key.
#[test]
fn model_file_errors_name_the_file_and_key() {
    let dir = scratch_dir("zams-model-bad");
    let cases = [
        (r#"{"mass_msun": 1, "mass_msun": 2}"#, "given twice"),
        (
            r#"{"mass_msun": 1, "physics": "refined"}"#,
            "unknown key \"physics\"",
        ),
        (r#"{"mass_msun": 1000}"#, "mass_msun"),
        (
            r#"{"mass_msun": 1, "opacity": "kramers:guillotine=0"}"#,
            "guillotine",
        ),
        (r#"{"mass_msun": 1, "alpha": 50}"#, "alpha"),
    ];
    for (text, needle) in cases {
        let path = dir.join("bad.json");
        std::fs::write(&path, text).unwrap();
        let out = starpoise(&["zams", "--model", path.to_str().unwrap()]);
        assert_eq!(out.status.code(), Some(2), "{text}: {}", stderr(&out));
        let err = stderr(&out);
        assert!(
            err.contains("bad.json") && err.contains(needle),
            "{text}: {err}"
        );
    }
    let _ = std::fs::remove_dir_all(&dir);
}

/// A model that cannot converge exits 3, prints its history, never a result, and says
/// `converged: false` in JSON.
#[test]
fn non_convergence_exits_3_with_history_and_no_result() {
    let dir = scratch_dir("zams-noconv");
    let profile = dir.join("p.csv");
    // Two Newton iterations cannot converge from a guess a factor 3 off in every unknown.
    let out = starpoise(&[
        "zams",
        "--mass",
        "1",
        "--physics",
        "analytic",
        "--guess",
        "3e17",
        "5e7",
        "3",
        "0.3",
        "--max-iterations",
        "2",
        "--format",
        "json",
        "--profile",
        profile.to_str().unwrap(),
    ]);
    assert_eq!(out.status.code(), Some(3), "{}", stderr(&out));
    let err = stderr(&out);
    assert!(
        err.contains("did not converge")
            && err.contains("mismatch")
            && err.contains("last guesses"),
        "{err}"
    );
    let v = json(&out);
    assert_eq!(v["converged"], false);
    assert!(v["radius_rsun"].is_null() && v["luminosity_lsun"].is_null());
    assert!(!profile.exists());
    let _ = std::fs::remove_dir_all(&dir);
}

/// A JSON summary without its `meta` (which records the command line, different by design).
fn without_meta(mut v: serde_json::Value) -> serde_json::Value {
    if let Some(m) = v.as_object_mut() {
        m.remove("meta");
    }
    v
}
