//! Determinism by construction: a grid that needs continuation gives, split into 30 shards and
//! merged, exactly the single run's table (CSV, ECSV and JSON, the latter also testing that
//! JSON numbers read back to the same doubles), and `merge` fits with the ranges the shards
//! were run with. Only the provenance `command` line may differ (it records each command).

mod common;
use common::{scratch_dir, starpoise, stderr, without_command};
use std::path::{Path, PathBuf};

/// A grid that needs continuation: the analytic set with a thousandth of its nuclear rates fails
/// from the built-in guess at five of these masses (measured with this version; the test checks
/// that some model still needs continuation, so that it keeps testing it: when the solver's
/// starting guesses improve, choose a harder grid), which continuation must rescue. (The grid of
/// the original report, `--masses 0.7:40:30 --z 0.04`, now converges from the guess everywhere.)
const GRID: [&str; 10] = [
    "--physics",
    "analytic",
    "--masses",
    "0.7:150:40",
    "--rates-factor",
    "0.001",
    "--z",
    "0.02",
    "--fit-ranges",
    "0.7-2,2-150",
];

fn sequence(out: &Path, extra: &[&str]) {
    let mut args = vec!["sequence", "--quiet"];
    args.extend(GRID);
    args.extend(extra);
    args.extend(["--out", out.to_str().unwrap()]);
    let o = starpoise(&args);
    assert!(o.status.success(), "{args:?}: {}", stderr(&o));
}

fn merge(parts: &[PathBuf], out: &Path) {
    let mut args = vec!["merge".to_string()];
    args.extend(parts.iter().map(|p| p.display().to_string()));
    args.extend(["--out".to_string(), out.display().to_string()]);
    let args: Vec<&str> = args.iter().map(String::as_str).collect();
    let o = starpoise(&args);
    assert!(o.status.success(), "{}", stderr(&o));
}

#[test]
fn thirty_shards_merge_to_the_single_run() {
    let dir = scratch_dir("thirty");
    for ext in ["csv", "json", "ecsv"] {
        let whole = dir.join(format!("whole.{ext}"));
        sequence(&whole, &["--threads", "2"]);
        let text = std::fs::read_to_string(&whole).unwrap();
        // The grid needs continuation (else choose another), and every model converges.
        assert!(
            text.contains("continued"),
            "no model needed continuation: {text}"
        );
        assert!(!text.contains("iteration-limit") && !text.contains("stalled"));
        let parts: Vec<PathBuf> = (1..=30)
            .map(|k| {
                let part = dir.join(format!("part-{k}.{ext}"));
                let shard = format!("{k}/30");
                sequence(&part, &["--shard", &shard, "--threads", "1"]);
                part
            })
            .collect();
        let merged = dir.join(format!("merged.{ext}"));
        merge(&parts, &merged);
        assert_eq!(without_command(&merged), without_command(&whole), "{ext}");
    }
    // The fits of the merged JSON use the shards' ranges, not the default ones.
    let doc: serde_json::Value =
        serde_json::from_str(&std::fs::read_to_string(dir.join("merged.json")).unwrap()).unwrap();
    let ranges: Vec<f64> = doc["fits"][0]["ranges"]
        .as_array()
        .unwrap()
        .iter()
        .map(|r| r["from_msun"].as_f64().unwrap())
        .collect();
    assert_eq!(ranges, vec![0.7, 2.0]);
    assert_eq!(doc["meta"]["fit_ranges"], "0.7-2,2-150");
    let _ = std::fs::remove_dir_all(&dir);
}

/// The ends of a log range are the numbers given, to the bit: 0.08:120:60 (which once ended on
/// 0.07999999999999999 and 119.99999999999997) ends on 0.08 and 120, and the table of a solved
/// range shows its ends as written.
#[test]
fn log_ranges_end_on_their_ends() {
    let dir = scratch_dir("ends");
    let out = dir.join("t.csv");
    let masses = starpoise::grid::parse_value_list("--masses", "0.08:120:60:log").unwrap();
    assert_eq!((masses[0], masses[59]), (0.08, 120.0));
    let o = starpoise(&[
        "sequence",
        "--quiet",
        "--masses",
        "0.7:40:2",
        "--physics",
        "analytic",
        "--out",
        out.to_str().unwrap(),
    ]);
    assert!(o.status.success(), "{}", stderr(&o));
    let text = std::fs::read_to_string(&out).unwrap();
    let mut rdr = csv::ReaderBuilder::new()
        .comment(Some(b'#'))
        .from_reader(text.as_bytes());
    let col = rdr
        .headers()
        .unwrap()
        .iter()
        .position(|h| h == "mass_msun")
        .unwrap();
    let masses: Vec<String> = rdr.records().map(|r| r.unwrap()[col].to_string()).collect();
    assert_eq!(masses, ["0.7", "40.0"]);
    let _ = std::fs::remove_dir_all(&dir);
}
