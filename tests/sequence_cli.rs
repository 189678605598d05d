//! `sequence` and `merge` as a user runs them: shards, threads, order, and bad input.

mod common;
use common::{scratch_dir, small_grid, starpoise, stderr, without_command};

const GRID: [&str; 6] = [
    "--masses",
    "1,2,4,8,16",
    "--z",
    "0.01,0.02",
    "--physics",
    "analytic",
];

fn run_to(path: &std::path::Path, extra: &[&str]) -> std::process::Output {
    let mut args = vec!["sequence", "--quiet"];
    args.extend(GRID);
    args.extend(extra);
    args.extend(["--out", path.to_str().unwrap()]);
    starpoise(&args)
}

/// Three shards merged give exactly (byte for byte, apart from the provenance `command` line)
/// the single run's table.
#[test]
fn three_shards_merge_to_the_single_run() {
    let dir = scratch_dir("shards");
    let whole = dir.join("whole.csv");
    assert!(run_to(&whole, &[]).status.success());
    let mut parts = Vec::new();
    for k in 1..=3 {
        let part = dir.join(format!("part-{k}.csv"));
        let shard = format!("{k}/3");
        let out = run_to(&part, &["--shard", &shard]);
        assert!(out.status.success(), "{}", stderr(&out));
        parts.push(part);
    }
    let merged = dir.join("merged.csv");
    let mut args = vec!["merge"];
    let names: Vec<String> = parts.iter().map(|p| p.display().to_string()).collect();
    args.extend(names.iter().map(String::as_str));
    args.extend(["--out", merged.to_str().unwrap()]);
    let out = starpoise(&args);
    assert!(out.status.success(), "{}", stderr(&out));
    // Byte for byte, but for the provenance line that records each command line.
    assert_eq!(without_command(&merged), without_command(&whole));
    // A missing shard, a repeated shard and a foreign grid are refused with exit 2.
    let foreign = dir.join("foreign.csv");
    small_grid(&foreign);
    let bad_sets: Vec<(Vec<&str>, &str)> = vec![
        (vec![&names[0], &names[1]], "missing"),
        (vec![&names[0], &names[1], &names[2], &names[2]], "also in"),
        (
            vec![&names[0], &names[1], &names[2], foreign.to_str().unwrap()],
            "different grid",
        ),
    ];
    for (files, needle) in bad_sets {
        let target = dir.join("bad-merge.csv");
        let mut a = vec!["merge"];
        a.extend(files);
        a.extend(["--out", target.to_str().unwrap()]);
        let out = starpoise(&a);
        assert_eq!(out.status.code(), Some(2), "{}", stderr(&out));
        assert!(stderr(&out).contains(needle), "{}", stderr(&out));
        assert!(!target.exists());
    }
    let _ = std::fs::remove_dir_all(&dir);
}

/// The table does not depend on the number of threads or on the order of the mass list.
#[test]
fn result_does_not_depend_on_threads_or_order() {
    let dir = scratch_dir("threads");
    let one = dir.join("one.csv");
    let two = dir.join("two.csv");
    assert!(run_to(&one, &["--threads", "1"]).status.success());
    assert!(run_to(&two, &["--threads", "2"]).status.success());
    assert_eq!(without_command(&one), without_command(&two));
    // Reordered masses: the same models (rows compared by mass and Z, values exactly equal).
    let shuffled = dir.join("shuffled.csv");
    let out = starpoise(&[
        "sequence",
        "--quiet",
        "--masses",
        "16,1,8,4,2",
        "--z",
        "0.02,0.01",
        "--physics",
        "analytic",
        "--out",
        shuffled.to_str().unwrap(),
    ]);
    assert!(out.status.success());
    let key_rows = |p: &std::path::Path| {
        let mut rdr = csv::ReaderBuilder::new()
            .comment(Some(b'#'))
            .from_path(p)
            .unwrap();
        let h = rdr.headers().unwrap().clone();
        let col = |n: &str| h.iter().position(|x| x == n).unwrap();
        let (m, z, l, r) = (
            col("mass_msun"),
            col("z"),
            col("luminosity_lsun"),
            col("radius_rsun"),
        );
        let mut v: Vec<(String, String, String, String)> = rdr
            .records()
            .map(|rec| {
                let rec = rec.unwrap();
                (
                    rec[m].to_string(),
                    rec[z].to_string(),
                    rec[l].to_string(),
                    rec[r].to_string(),
                )
            })
            .collect();
        v.sort();
        v
    };
    assert_eq!(key_rows(&one), key_rows(&shuffled));
    let _ = std::fs::remove_dir_all(&dir);
}

/// Bad grids exit 2 with a message naming the value and an example, and write nothing.
#[test]
fn bad_grids_exit_2() {
    let dir = scratch_dir("bad-grid");
    let out_file = dir.join("t.csv");
    let cases: Vec<(Vec<&str>, &str)> = vec![
        (vec!["--masses", ""], "--masses"),
        (vec!["--masses", "5:1:3"], "FROM must not exceed TO"),
        (vec!["--masses", "1:5:0"], "COUNT"),
        (vec!["--masses", "1,2", "--shard", "4/3"], "--shard"),
        (vec!["--masses", "1,2", "--shard", "0/3"], "--shard"),
        (vec!["--masses", "1,2", "--variant", "hot"], "--variant"),
        (
            vec!["--masses", "1,2", "--variant", "x=colour:red"],
            "colour",
        ),
        (vec!["--masses", "1,300"], "--mass"),
    ];
    for (args, needle) in cases {
        let mut a = vec!["sequence", "--quiet", "--physics", "analytic"];
        a.extend(args.iter().copied());
        a.extend(["--out", out_file.to_str().unwrap()]);
        let out = starpoise(&a);
        assert_eq!(out.status.code(), Some(2), "{a:?}: {}", stderr(&out));
        assert!(stderr(&out).contains(needle), "{a:?}: {}", stderr(&out));
        assert!(
            stderr(&out).contains("e.g."),
            "{a:?}: no example in {}",
            stderr(&out)
        );
        assert!(!out_file.exists());
    }
    let _ = std::fs::remove_dir_all(&dir);
}

/// The CSV header (after the `#` metadata lines) is the documented column list; an empty shard
/// still writes it; the fits in the JSON table are the least-squares slopes of its own rows.
#[test]
fn header_empty_shards_and_fits() {
    let dir = scratch_dir("header");
    let full = dir.join("t.csv");
    assert!(run_to(&full, &[]).status.success());
    let header: Vec<String> = csv::ReaderBuilder::new()
        .comment(Some(b'#'))
        .from_path(&full)
        .unwrap()
        .headers()
        .unwrap()
        .iter()
        .map(str::to_string)
        .collect();
    assert_eq!(header, starpoise::grid::GridRow::columns());
    // One mass in 50 shards: most shards are empty.
    let empty = (1..=50)
        .map(|k| {
            let p = dir.join(format!("e{k}.csv"));
            let shard = format!("{k}/50");
            let out = starpoise(&[
                "sequence",
                "--quiet",
                "--masses",
                "1",
                "--physics",
                "analytic",
                "--shard",
                &shard,
                "--out",
                p.to_str().unwrap(),
            ]);
            assert!(out.status.success(), "{}", stderr(&out));
            p
        })
        .find(|p| data_lines(&std::fs::read_to_string(p).unwrap()).len() == 1)
        .expect("an empty shard");
    let text = std::fs::read_to_string(&empty).unwrap();
    assert_eq!(
        data_lines(&text),
        vec![starpoise::grid::GridRow::columns().join(",")]
    );
    // Fits: L ~ M^a over 2-20 M_sun from the rows themselves.
    let json_path = dir.join("t.json");
    let out = starpoise(&[
        "sequence",
        "--quiet",
        "--masses",
        "2,4,8,16",
        "--physics",
        "analytic",
        "--out",
        json_path.to_str().unwrap(),
    ]);
    assert!(out.status.success());
    let t: serde_json::Value =
        serde_json::from_str(&std::fs::read_to_string(&json_path).unwrap()).unwrap();
    let pts: Vec<(f64, f64)> = t["rows"]
        .as_array()
        .unwrap()
        .iter()
        .map(|r| {
            (
                r["mass_msun"].as_f64().unwrap().log10(),
                r["luminosity_lsun"].as_f64().unwrap().log10(),
            )
        })
        .collect();
    let n = pts.len() as f64;
    let (mx, my) = (
        pts.iter().map(|p| p.0).sum::<f64>() / n,
        pts.iter().map(|p| p.1).sum::<f64>() / n,
    );
    let slope = pts.iter().map(|p| (p.0 - mx) * (p.1 - my)).sum::<f64>()
        / pts.iter().map(|p| (p.0 - mx).powi(2)).sum::<f64>();
    let fit = t["fits"][0]["ranges"]
        .as_array()
        .unwrap()
        .iter()
        .find(|r| r["from_msun"] == 2.0)
        .unwrap();
    assert_eq!(fit["models"], 4);
    assert!((fit["luminosity_exponent"].as_f64().unwrap() - slope).abs() < 1e-12);
    let _ = std::fs::remove_dir_all(&dir);
}

/// The lines of a CSV file that are not `#` metadata.
fn data_lines(text: &str) -> Vec<String> {
    text.lines()
        .filter(|l| !l.starts_with('#'))
        .map(String::from)
        .collect()
}

/// A run stopped part-way (here killed, which is harsher than Ctrl-C) leaves no output file and
/// no temporary file: the table is written only after the last model, to a temporary name that
/// is renamed into place.
#[test]
fn an_interrupted_run_leaves_no_file() {
    let dir = scratch_dir("interrupted");
    let out = dir.join("grid.csv");
    let mut child = std::process::Command::new(env!("CARGO_BIN_EXE_starpoise"))
        .args([
            "sequence",
            "--quiet",
            "--masses",
            "0.1:100:400",
            "--out",
            out.to_str().unwrap(),
        ])
        .spawn()
        .unwrap();
    std::thread::sleep(std::time::Duration::from_millis(300));
    let finished_already = child.try_wait().unwrap().is_some();
    child.kill().unwrap();
    let _ = child.wait();
    if !finished_already {
        assert_eq!(
            std::fs::read_dir(&dir).unwrap().count(),
            0,
            "files left behind"
        );
    }
    let _ = std::fs::remove_dir_all(&dir);
}
