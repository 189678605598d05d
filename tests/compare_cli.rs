//! `compare` as a user runs it: the direction and size of the response to a higher opacity,
//! the reference row, the JSON and CSV records, a model that fails, and bad input.

mod common;
use common::{json, scratch_dir, starpoise, stderr};
use serde_json::Value;

const FAST: [&str; 4] = ["--physics", "analytic", "--mass", "1,5"];

fn compare(variants: &[&str], extra: &[&str]) -> std::process::Output {
    let mut args = vec!["compare"];
    args.extend(FAST);
    for v in variants {
        args.extend(["--variant", v]);
    }
    args.extend(extra);
    starpoise(&args)
}

fn record<'a>(doc: &'a Value, mass: f64, variant: &str) -> &'a Value {
    doc["records"]
        .as_array()
        .expect("records")
        .iter()
        .find(|r| r["mass_msun"] == mass && r["variant"] == variant)
        .unwrap_or_else(|| panic!("no record for {mass} M_sun, {variant}"))
}

fn num(r: &Value, key: &str) -> f64 {
    r[key]
        .as_f64()
        .unwrap_or_else(|| panic!("{key} is not a number in {r}"))
}

/// A higher opacity makes the star fainter at fixed mass (fact of the trade, common practice,
/// no source). Size: the homology relations for radiative diffusion give L ∝ M^3 mu^4 / kappa
/// for a constant opacity (electron scattering) and L ∝ M^5.5 mu^7.5 R^-0.5 / kappa_0 for a
/// Kramers law (from memory, any stellar-structure text's chapter on homology), so the
/// sensitivity dlog L / dlog kappa is -1 (electron scattering) to -1 - 0.5 dlog R / dlog kappa
/// (Kramers); R moves little (|dlog R / dlog kappa| < 0.2 here), so -1.2 .. -0.8 at 5 M_sun,
/// a mostly radiative star of the analytic set, leaves room for the convective core only.
#[test]
fn higher_opacity_makes_the_star_fainter() {
    let out = compare(
        &[
            "base=",
            "hot=opacity-factor:2",
            "both=opacity-factor:2;rates-factor:2",
        ],
        &["--format", "json"],
    );
    assert!(out.status.success(), "{}", stderr(&out));
    let doc = json(&out);
    assert_eq!(doc["reference"], "base");
    for mass in [1.0, 5.0] {
        let hot = record(&doc, mass, "hot");
        assert!(num(hot, "dlog_luminosity_dex") < 0.0, "{hot}");
        assert_eq!(hot["varied_factor"], "opacity-factor");
        assert_eq!(num(hot, "factor_reference"), 1.0);
        assert_eq!(num(hot, "factor_variant"), 2.0);
        // The sensitivity is the difference over log10 2 (1e-12: a few ulps of the quotient).
        for (d, s) in [
            ("dlog_luminosity_dex", "sensitivity_luminosity"),
            ("dlog_radius_dex", "sensitivity_radius"),
            (
                "dlog_central_temperature_dex",
                "sensitivity_central_temperature",
            ),
            ("dlog_central_density_dex", "sensitivity_central_density"),
        ] {
            let expected = num(hot, d) / 2f64.log10();
            assert!((num(hot, s) - expected).abs() < 1e-12, "{s}: {hot}");
        }
        // The difference is log10 of the ratio of the printed values (1e-12: rounding of
        // the logarithms).
        let base = record(&doc, mass, "base");
        let ratio = num(hot, "luminosity_lsun") / num(base, "luminosity_lsun");
        assert!((num(hot, "dlog_luminosity_dex") - ratio.log10()).abs() < 1e-12);
        // Two factors changed at once: differences, but no sensitivity.
        let both = record(&doc, mass, "both");
        assert!(both["dlog_luminosity_dex"].is_number());
        assert!(both["varied_factor"].is_null());
        assert!(both["sensitivity_luminosity"].is_null());
    }
    let s = num(record(&doc, 5.0, "hot"), "sensitivity_luminosity");
    assert!((-1.2..=-0.8).contains(&s), "dlog L / dlog kappa = {s}");
    let r = num(record(&doc, 5.0, "hot"), "sensitivity_radius");
    assert!(r.abs() < 0.2, "dlog R / dlog kappa = {r}");
}

/// The reference row has exactly zero differences and no sensitivities; every documented key
/// is present in every record.
#[test]
fn reference_row_and_json_keys() {
    let out = compare(&["base=", "hot=opacity-factor:2"], &["--format", "json"]);
    assert!(out.status.success(), "{}", stderr(&out));
    let doc = json(&out);
    let keys = [
        "mass_msun",
        "x",
        "z",
        "variant",
        "spec",
        "reference",
        "status",
        "luminosity_lsun",
        "radius_rsun",
        "teff_k",
        "central_temperature_k",
        "central_density_g_cm3",
        "convective_core_mass_fraction",
        "dlog_luminosity_dex",
        "dlog_radius_dex",
        "dlog_central_temperature_dex",
        "dlog_central_density_dex",
        "delta_convective_core_mass_fraction",
        "varied_factor",
        "factor_reference",
        "factor_variant",
        "sensitivity_luminosity",
        "sensitivity_radius",
        "sensitivity_central_temperature",
        "sensitivity_central_density",
    ];
    let records = doc["records"].as_array().expect("records");
    assert_eq!(records.len(), 4);
    for r in records {
        for k in keys {
            assert!(r.get(k).is_some(), "{k} missing in {r}");
        }
    }
    // Masses in the order given, the reference first within each.
    let order: Vec<(f64, &str)> = records
        .iter()
        .map(|r| (num(r, "mass_msun"), r["variant"].as_str().unwrap_or("")))
        .collect();
    assert_eq!(
        order,
        [(1.0, "base"), (1.0, "hot"), (5.0, "base"), (5.0, "hot")]
    );
    for mass in [1.0, 5.0] {
        let base = record(&doc, mass, "base");
        assert_eq!(base["reference"], true);
        for k in [
            "dlog_luminosity_dex",
            "dlog_radius_dex",
            "dlog_central_temperature_dex",
            "dlog_central_density_dex",
            "delta_convective_core_mass_fraction",
        ] {
            assert_eq!(num(base, k), 0.0, "{k}");
        }
        assert!(base["sensitivity_luminosity"].is_null());
        assert_eq!(record(&doc, mass, "hot")["reference"], false);
    }
}

/// The text screen: units in the header, the reference marked, signed differences, the
/// sensitivity line, and the same numbers as the JSON records.
#[test]
fn text_screen() {
    let out = compare(&["base=", "hot=opacity-factor:2"], &[]);
    assert!(out.status.success(), "{}", stderr(&out));
    let text = String::from_utf8_lossy(&out.stdout);
    for needle in [
        "L/L_sun",
        "R/R_sun",
        "Teff/K",
        "T_c/K",
        "g/cm^3",
        "M = 1 M_sun",
        "M = 5 M_sun",
        "dlog(opacity-factor 1 -> 2)",
        "hot        = opacity-factor:2",
    ] {
        assert!(text.contains(needle), "{needle} missing in\n{text}");
    }
    let doc = json(&compare(
        &["base=", "hot=opacity-factor:2"],
        &["--format", "json"],
    ));
    let lines: Vec<&str> = text.lines().collect();
    let base_rows: Vec<&&str> = lines.iter().filter(|l| l.starts_with("ref base")).collect();
    assert_eq!(base_rows.len(), 2, "{text}");
    for row in base_rows {
        assert_eq!(row.matches("+0.0000").count(), 5, "{row}");
    }
    // The 5 M_sun hot row shows its dlog L with sign and 4 decimals.
    let hot5 = format!(
        "{:+.4}",
        num(record(&doc, 5.0, "hot"), "dlog_luminosity_dex")
    );
    let block5 = text.split("M = 5 M_sun").nth(1).unwrap_or("");
    let hot_row = block5
        .lines()
        .find(|l| l.trim_start().starts_with("hot "))
        .unwrap_or("");
    assert!(hot_row.contains(&hot5), "{hot5} not in {hot_row}");
    assert!(hot5.starts_with('-'));
}

/// `--out` writes the records as CSV or, by extension, the whole table as JSON.
#[test]
fn writes_csv_and_json() {
    let dir = scratch_dir("compare-out");
    let csv = dir.join("cmp.csv");
    let out = compare(
        &["base=", "hot=opacity-factor:2"],
        &["--out", csv.to_str().unwrap()],
    );
    assert!(out.status.success(), "{}", stderr(&out));
    let text = std::fs::read_to_string(&csv).unwrap();
    // Metadata lines first (provenance, composition, reference, units), then a plain header.
    assert!(text.starts_with("# program: starpoise\n"), "{text}");
    for line in ["# x: 0.7\n", "# reference: base\n", "# units: {"] {
        assert!(text.contains(line), "{line} missing in {text}");
    }
    let mut lines = text.lines().skip_while(|l| l.starts_with('#'));
    let header = lines.next().unwrap_or("");
    assert!(
        header.starts_with(
            "mass_msun,x,y,z,variant,spec,reference,status,reason,warnings,luminosity_lsun"
        ),
        "{header}"
    );
    assert!(header.contains("sensitivity_central_density"));
    assert_eq!(lines.count(), 4);
    let js = dir.join("cmp.json");
    let out = compare(
        &["base=", "hot=opacity-factor:2"],
        &["--out", js.to_str().unwrap()],
    );
    assert!(out.status.success(), "{}", stderr(&out));
    let doc: Value = serde_json::from_str(&std::fs::read_to_string(&js).unwrap()).unwrap();
    assert_eq!(doc["records"].as_array().map(Vec::len), Some(4));
    assert_eq!(doc["meta"]["program"], "starpoise");
    assert_eq!(doc["units"]["luminosity_lsun"], "solLum");
    assert_eq!(doc["records"][0]["y"].as_f64(), Some(1.0 - 0.7 - 0.02));
    let _ = std::fs::remove_dir_all(&dir);
}

/// A variant whose model does not converge shows its status; the others still print; exit 3
/// with a count on stderr. (An opacity a million times higher leaves no photosphere for the
/// starting guess.)
#[test]
fn failed_variant_keeps_its_row() {
    let out = compare(
        &["base=", "hot=opacity-factor:2", "odd=opacity-factor:1e6"],
        &[],
    );
    assert_eq!(out.status.code(), Some(3), "{}", stderr(&out));
    assert!(
        stderr(&out).contains("2 of 6 models did not converge"),
        "{}",
        stderr(&out)
    );
    let text = String::from_utf8_lossy(&out.stdout);
    let odd: Vec<&str> = text
        .lines()
        .filter(|l| l.trim_start().starts_with("odd ") && !l.contains("= opacity-factor"))
        .collect();
    assert_eq!(odd.len(), 2, "{text}");
    assert!(odd.iter().all(|l| l.contains("not converged")), "{text}");
    assert_eq!(text.matches("dlog(opacity-factor 1 -> 2)").count(), 2);
}

/// Bad input exits 2, names the value, shows an example, and writes no file.
#[test]
fn bad_input_exits_2() {
    let dir = scratch_dir("compare-bad");
    let target = dir.join("never.csv");
    let t = target.to_str().unwrap();
    let cases: Vec<(Vec<&str>, &str)> = vec![
        (
            vec!["--mass", "1", "--variant", "hot=opacity-factor:2"],
            "hot=opacity-factor:2",
        ),
        (
            vec![
                "--mass",
                "1",
                "--variant",
                "base=",
                "--variant",
                "x=colour:red",
            ],
            "x=colour:red",
        ),
        (
            vec!["--mass", "1", "--variant", "a=", "--variant", "a=alpha:1.5"],
            "--variant = a",
        ),
        (
            vec!["--mass", "", "--variant", "a=", "--variant", "b=alpha:1.5"],
            "--mass",
        ),
    ];
    for (args, needle) in cases {
        let mut a = vec!["compare", "--physics", "analytic", "--out", t];
        a.extend(args);
        let out = starpoise(&a);
        assert_eq!(out.status.code(), Some(2), "{a:?}: {}", stderr(&out));
        let err = stderr(&out);
        assert!(err.contains(needle), "{needle} not in {err}");
        assert!(err.contains("e.g."), "no example in {err}");
        assert!(!target.exists());
    }
    let _ = std::fs::remove_dir_all(&dir);
}
