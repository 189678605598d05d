//! The ready model files in models/ work as the README says.

mod common;
use common::{json, starpoise, stderr};

#[test]
fn every_shipped_model_file_converges() {
    let dir = std::path::Path::new(env!("CARGO_MANIFEST_DIR")).join("models/lantern-survey");
    let mut count = 0;
    for entry in std::fs::read_dir(&dir).unwrap() {
        let path = entry.unwrap().path();
        if path.extension().is_some_and(|e| e == "json") {
            let out = starpoise(&[
                "zams",
                "--model",
                path.to_str().unwrap(),
                "--format",
                "json",
            ]);
            assert!(out.status.success(), "{}: {}", path.display(), stderr(&out));
            let v = json(&out);
            let file: serde_json::Value =
                serde_json::from_str(&std::fs::read_to_string(&path).unwrap()).unwrap();
            assert_eq!(v["mass_msun"], file["mass_msun"], "{}", path.display());
            assert_eq!(v["converged"], true);
            count += 1;
        }
    }
    assert_eq!(count, 4);
}

/// The demo opacity table can replace the refined opacity in a whole model.
#[test]
fn demo_opacity_table_builds_a_model() {
    let table = std::path::Path::new(env!("CARGO_MANIFEST_DIR")).join("models/demo-opacity.csv");
    let spec = format!("table:{}", table.display());
    let out = starpoise(&[
        "zams",
        "--mass",
        "5",
        "--opacity",
        &spec,
        "--format",
        "json",
    ]);
    assert!(out.status.success(), "{}", stderr(&out));
    assert_eq!(json(&out)["converged"], true);
}
