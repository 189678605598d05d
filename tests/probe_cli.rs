//! The `probe` command: JSON keys and values, text output, and exit code 2 on bad input.

use std::process::Command;

fn probe(args: &[&str]) -> std::process::Output {
    Command::new(env!("CARGO_BIN_EXE_starpoise"))
        .arg("probe")
        .args(args)
        .output()
        .unwrap()
}

/// JSON output carries every documented key with its unit, and its numbers are the library's:
/// at the solar centre P about 2.4e17 dyn/cm^2 (Bahcall, Serenelli & Basu 2005, ApJ 621, L85;
/// secondary sources, via docs/references.md §6; the refined EOS agrees to 5 per cent), and the
/// JSON values equal a
/// direct library evaluation.
#[test]
fn json_keys_and_values() {
    let out = probe(&[
        "--density",
        "150",
        "--temperature",
        "1.57e7",
        "--x",
        "0.34",
        "--format",
        "json",
    ]);
    assert!(
        out.status.success(),
        "{}",
        String::from_utf8_lossy(&out.stderr)
    );
    let v: serde_json::Value = serde_json::from_slice(&out.stdout).unwrap();
    for key in [
        "pressure_dyn_cm2",
        "gas_pressure_dyn_cm2",
        "radiation_pressure_dyn_cm2",
        "beta",
        "mu",
        "chi_rho",
        "chi_t",
        "nabla_ad",
        "gamma1",
        "cp_erg_g_k",
        "delta",
        "degeneracy_psi",
        "hydrogen_ionised",
        "helium_single",
        "helium_double",
        "opacity_cm2_g",
        "opacity_laws",
        "eps_pp_erg_g_s",
        "eps_cno_erg_g_s",
        "eps_total_erg_g_s",
        "nu_pp",
        "nu_cno",
        "density_g_cm3",
        "temperature_k",
        "physics",
        "x",
        "y",
        "z",
        "x_cno",
    ] {
        assert!(v.get(key).is_some(), "missing {key}");
    }
    let p = v["pressure_dyn_cm2"].as_f64().unwrap();
    assert!((p / 2.4e17 - 1.0).abs() < 0.05, "P = {p}");
    assert_eq!(v["physics"]["preset"], "refined");
    let laws = v["opacity_laws"].as_array().unwrap();
    assert_eq!(laws.len(), 7);
    assert!(laws
        .iter()
        .any(|l| l["law"] == "h-minus" && l["opacity_cm2_g"].is_null() && l["error"].is_string()));
    use starpoise::physics::{Composition, PhysicsSet};
    let lib = starpoise::output::ProbeReport::evaluate(
        150.0,
        1.57e7,
        &Composition::new(0.34, 0.02).unwrap(),
        &PhysicsSet::refined(),
    )
    .unwrap();
    assert_eq!(v["eps_pp_erg_g_s"].as_f64().unwrap(), lib.eps_pp_erg_g_s);
    assert_eq!(v["opacity_cm2_g"].as_f64().unwrap(), lib.opacity_cm2_g);
    assert_eq!(v["nabla_ad"].as_f64().unwrap(), lib.nabla_ad);
}

/// The analytic preset reproduces the hand formulas: kappa = 0.2(1+X) + (4.34e25 Z +
/// 3.68e22 (1-Z))(1+X) rho T^-3.5 at rho = 1, T = 1e6 (issue 3 definition of the set), and the
/// ideal law has no degeneracy parameter (null).
#[test]
fn analytic_preset_by_hand() {
    let out = probe(&[
        "--density",
        "1",
        "--temperature",
        "1e6",
        "--physics",
        "analytic",
        "--format",
        "json",
    ]);
    assert!(out.status.success());
    let v: serde_json::Value = serde_json::from_slice(&out.stdout).unwrap();
    let want = 0.2 * 1.7 + (4.34e25 * 0.02 + 3.68e22 * 0.98) * 1.7 * 1e-21;
    assert!((v["opacity_cm2_g"].as_f64().unwrap() / want - 1.0).abs() < 1e-12);
    assert!(v["degeneracy_psi"].is_null());
    assert_eq!(v["beta"].as_f64().map(|b| b > 0.99), Some(true));
}

/// Text output names the quantities with units; overrides and factors show in the header.
#[test]
fn text_output_and_overrides() {
    let out = probe(&[
        "--density",
        "1e-8",
        "--temperature",
        "1e4",
        "--eos",
        "saha",
        "--opacity-factor",
        "2",
    ]);
    assert!(
        out.status.success(),
        "{}",
        String::from_utf8_lossy(&out.stderr)
    );
    let text = String::from_utf8(out.stdout).unwrap();
    for needle in [
        "nabla_ad",
        "dyn/cm^2",
        "eos saha",
        "factor 2",
        "H ionised",
        "eps_CNO",
        "cm^2/g",
    ] {
        assert!(text.contains(needle), "missing {needle} in\n{text}");
    }
}

/// Bad or out-of-domain input exits with code 2 and a message naming the problem.
#[test]
fn bad_input_exits_with_2() {
    let cases: [(&[&str], &str); 7] = [
        (&["--density", "-1", "--temperature", "1e6"], "--density"),
        (&["--density", "1", "--temperature", "nan"], "--temperature"),
        (
            &["--density", "1e9", "--temperature", "1e6"],
            "outside the domain",
        ),
        (
            &["--density", "1", "--temperature", "1e6", "--eos", "vdw"],
            "allowed: ideal, saha",
        ),
        (
            &[
                "--density",
                "1",
                "--temperature",
                "1e6",
                "--x",
                "0.9",
                "--z",
                "0.2",
            ],
            "X + Z",
        ),
        (
            &[
                "--density",
                "1",
                "--temperature",
                "1e6",
                "--opacity",
                "table:/no/such.csv",
            ],
            "no/such.csv",
        ),
        (
            &[
                "--density",
                "1",
                "--temperature",
                "1e6",
                "--physics",
                "analytic",
                "--alpha",
                "2",
            ],
            "--alpha",
        ),
    ];
    for (args, needle) in cases {
        let out = probe(args);
        assert_eq!(out.status.code(), Some(2), "{args:?}");
        let err = String::from_utf8_lossy(&out.stderr);
        assert!(err.contains(needle), "{args:?}: {err}");
        assert!(out.stdout.is_empty());
    }
}
