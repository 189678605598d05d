//! Hostile and careless input, table-driven: every command and every parsed input (numbers,
//! lists, ranges, shards, variant specs, law names and parameters, model files, opacity tables,
//! merge files, plot sources, output paths). Each case must end with exit code 2, a message on
//! standard error that names the value and says what is allowed, no panic, and no file left
//! behind in the folder it ran in.

mod common;
use common::scratch_dir;
use std::path::{Path, PathBuf};
use std::process::Command;

/// One refused command line: `args` (with `{dir}` standing for the scratch folder), and two
/// texts the message must contain: the value (or the flag, where clap names no value) and what
/// is allowed.
struct Case {
    args: &'static [&'static str],
    value: &'static str,
    allowed: &'static str,
}

const fn case(args: &'static [&'static str], value: &'static str, allowed: &'static str) -> Case {
    Case {
        args,
        value,
        allowed,
    }
}

/// The demo opacity table's first lines, with one line replaced to make it hostile.
fn table_with(dir: &Path, name: &str, from: &str, to: &str) {
    let demo = std::fs::read_to_string(
        Path::new(env!("CARGO_MANIFEST_DIR")).join("models/demo-opacity.csv"),
    )
    .unwrap();
    let text = demo.replacen(from, to, 1);
    assert_ne!(text, demo, "{name}: {from} not found");
    std::fs::write(dir.join(name), text).unwrap();
}

/// The files the cases read, written once into `dir`.
fn fixtures(dir: &Path) {
    let w = |name: &str, text: &str| std::fs::write(dir.join(name), text).unwrap();
    w("model.json", r#"{"name": "Lantern-T", "mass_msun": 1.0}"#);
    w("dup.json", r#"{"mass_msun": 1.0, "mass_msun": 2.0}"#);
    w("unknown.json", r#"{"mass_msun": 1.0, "colour": "red"}"#);
    w("badmass.json", r#"{"mass_msun": -1}"#);
    w("badpoints.json", r#"{"mass_msun": 1, "points": 5}"#);
    w("notjson.json", "mass_msun = 1");
    w("array.json", "[1, 2, 3]");
    let demo = Path::new(env!("CARGO_MANIFEST_DIR")).join("models/demo-opacity.csv");
    std::fs::copy(&demo, dir.join("table.csv")).unwrap();
    table_with(dir, "kappa400.csv", "3.5,-8,-0.4674995601", "3.5,-8,400");
    table_with(
        dir,
        "axis308.csv",
        "3.5,-8,-0.4674995601",
        "1e308,-8,-0.4674995601",
    );
    table_with(dir, "nan.csv", "3.5,-8,-0.4674995601", "3.5,-8,nan");
    table_with(dir, "dup-point.csv", "3.5,-7.5,", "3.5,-8,");
    table_with(
        dir,
        "noheader.csv",
        "log10_T,log10_R,log10_kappa",
        "T,R,kappa",
    );
    table_with(dir, "close.csv", "3.5,-7.5,", "3.5,-7.9999999999,");
    table_with(dir, "short-row.csv", "3.5,-8,-0.4674995601", "3.5,-8");
    std::fs::create_dir_all(dir.join("folder")).unwrap();
    w("notatable.csv", "a,b\n1,2\n");
    w(
        "profile.csv",
        &format!(
            "{}\n{}\n",
            starpoise::structure::PROFILE_COLUMNS.join(","),
            ["1"; 20].join(",")
        ),
    );
    w("seq.csv", "mass_msun,teff_k,luminosity_lsun\n1,5772,1\n");
    w("readonly.csv", "keep\n");
    let mut perms = std::fs::metadata(dir.join("readonly.csv"))
        .unwrap()
        .permissions();
    perms.set_readonly(true);
    std::fs::set_permissions(dir.join("readonly.csv"), perms).unwrap();
    // A shard of a real grid, and copies made hostile.
    common::small_grid(&dir.join("shard.csv"));
    let shard = std::fs::read_to_string(dir.join("shard.csv")).unwrap();
    let huge = shard.replace(",0,2,base,", ",0,18446744073709551615,base,");
    assert_ne!(huge, shard);
    w("huge-grid.csv", &huge);
    let far = shard.replace(",1,2,base,", ",7,2,base,");
    assert_ne!(far, shard);
    w("far-index.csv", &far);
    w("broken.json", "{\"rows\": [");
}

/// Every file (recursively) under `dir`, as relative paths.
fn listing(dir: &Path) -> Vec<PathBuf> {
    let mut out = Vec::new();
    let mut todo = vec![dir.to_path_buf()];
    while let Some(d) = todo.pop() {
        for e in std::fs::read_dir(&d).unwrap() {
            let p = e.unwrap().path();
            if p.is_dir() {
                todo.push(p.clone());
            }
            out.push(p.strip_prefix(dir).unwrap().to_path_buf());
        }
    }
    out.sort();
    out
}

const CASES: &[Case] = &[
    // zams: numbers
    case(&["zams", "--mass", "-1"], "-1", "between 0.05 and 150"),
    case(&["zams", "--mass", "0"], "= 0", "between 0.05 and 150"),
    case(
        &["zams", "--mass", "1e9"],
        "1000000000",
        "between 0.05 and 150",
    ),
    case(&["zams", "--mass", "nan"], "nan", "finite number"),
    case(&["zams", "--mass", "inf"], "inf", "finite number"),
    case(&["zams", "--mass", "abc"], "abc", "decimal number"),
    case(&["zams", "--mass", "1,5"], "1,5", "decimal number"),
    case(&["zams", "--mass", "1", "--x", "-0.1"], "-0.1", "[0, 1]"),
    case(&["zams", "--mass", "1", "--x", "1.5"], "1.5", "[0, 1]"),
    case(&["zams", "--mass", "1", "--z", "2"], "--z = 2", "[0, 1]"),
    case(
        &["zams", "--mass", "1", "--x", "0.9", "--z", "0.2"],
        "--x + --z",
        "must not exceed 1",
    ),
    case(&["zams", "--mass", "1", "--x", "0"], "--x = 0", "above 0"),
    case(
        &["zams", "--mass", "1", "--fit-mass", "0.99"],
        "0.99",
        "[0.05, 0.95]",
    ),
    case(
        &["zams", "--mass", "1", "--fit-mass", "-0.4"],
        "-0.4",
        "[0.05, 0.95]",
    ),
    case(
        &["zams", "--mass", "1", "--tolerance", "-1e-10"],
        "-1e-10",
        "[1e-13, 1e-6]",
    ),
    case(
        &["zams", "--mass", "1", "--tolerance", "1e-3"],
        "0.001",
        "[1e-13, 1e-6]",
    ),
    case(
        &["zams", "--mass", "1", "--tolerance", "0"],
        "--tolerance = 0",
        "[1e-13, 1e-6]",
    ),
    case(
        &["zams", "--mass", "1", "--max-iterations", "0"],
        "--max-iterations = 0",
        "[1, 500]",
    ),
    case(
        &["zams", "--mass", "1", "--max-iterations", "-3"],
        "-3",
        "1 to 500",
    ),
    case(
        &["zams", "--mass", "1", "--max-iterations", "1e3"],
        "1e3",
        "1 to 500",
    ),
    case(
        &["zams", "--mass", "1", "--points", "5"],
        "--points = 5",
        "[10, 100000]",
    ),
    case(
        &["zams", "--mass", "1", "--points", "1000000"],
        "1000000",
        "[10, 100000]",
    ),
    case(
        &["zams", "--mass", "1", "--points", "-5"],
        "-5",
        "10 to 100000",
    ),
    case(
        &["zams", "--mass", "1", "--points", "18446744073709551616"],
        "18446744073709551616",
        "10 to 100000",
    ),
    case(
        &["zams", "--mass", "1", "--guess", "1e17", "1e7", "1", "-4"],
        "--guess LSUN = -4",
        "positive",
    ),
    case(
        &["zams", "--mass", "1", "--guess", "0", "1e7", "1", "1"],
        "--guess PC = 0",
        "positive",
    ),
    case(
        &["zams", "--mass", "1", "--guess", "1e17", "-1e7", "1", "1"],
        "--guess TC = -10000000",
        "positive",
    ),
    case(
        &["zams", "--mass", "1", "--guess", "1e17", "1e7", "1"],
        "--guess",
        "4 values",
    ),
    case(&["zams", "--mass", "1", "--alpha", "-1"], "-1", "[0.1, 10]"),
    case(
        &["zams", "--mass", "1", "--alpha", "100"],
        "100",
        "[0.1, 10]",
    ),
    case(
        &[
            "zams",
            "--mass",
            "1",
            "--alpha",
            "1.5",
            "--convection",
            "adiabatic",
        ],
        "1.5",
        "only to convection mlt",
    ),
    case(
        &["zams", "--mass", "1", "--opacity-factor", "0"],
        "--opacity-factor = 0",
        "[0.000001, 1000000]",
    ),
    case(
        &["zams", "--mass", "1", "--rates-factor", "1e7"],
        "= 10000000",
        "[0.000001, 1000000]",
    ),
    case(
        &["zams", "--mass", "0.5", "--physics", "analytic"],
        "0.5",
        "0.7",
    ),
    // zams: law names and parameters
    case(
        &["zams", "--mass", "1", "--eos", "nonsense"],
        "nonsense",
        "ideal",
    ),
    case(
        &["zams", "--mass", "1", "--opacity", "kramers:guillotine=-1"],
        "-1",
        "guillotine",
    ),
    case(
        &["zams", "--mass", "1", "--opacity", "kramers:colour=1"],
        "colour",
        "guillotine",
    ),
    case(
        &["zams", "--mass", "1", "--rates", "power-law:nu=100"],
        "100",
        "nu",
    ),
    case(
        &["zams", "--mass", "1", "--convection", "mlt:alpha=0"],
        "0",
        "alpha",
    ),
    case(
        &["zams", "--mass", "1", "--atmosphere", "hot"],
        "hot",
        "photosphere",
    ),
    case(
        &["zams", "--mass", "1", "--physics", "galaxy"],
        "galaxy",
        "refined",
    ),
    case(
        &[
            "zams",
            "--mass",
            "1",
            "--opacity",
            "table:{dir}/missing.csv",
        ],
        "missing.csv",
        "cannot read",
    ),
    case(
        &["zams", "--mass", "1", "--profile-format", "xml"],
        "xml",
        "possible values",
    ),
    case(
        &["zams", "--mass", "1", "--format", "yaml"],
        "yaml",
        "possible values",
    ),
    case(&["zams", "--mass"], "--mass", "a value is required"),
    // zams: model files
    case(
        &["zams", "--model", "{dir}/missing.json"],
        "missing.json",
        "cannot read",
    ),
    case(
        &["zams", "--model", "{dir}/dup.json"],
        "mass_msun",
        "given twice",
    ),
    case(
        &["zams", "--model", "{dir}/unknown.json"],
        "colour",
        "allowed keys",
    ),
    case(
        &["zams", "--model", "{dir}/badmass.json"],
        "-1",
        "between 0.05 and 150",
    ),
    case(
        &["zams", "--model", "{dir}/badpoints.json"],
        "5",
        "[10, 100000]",
    ),
    case(
        &["zams", "--model", "{dir}/notjson.json"],
        "notjson.json",
        "a JSON object",
    ),
    case(
        &["zams", "--model", "{dir}/array.json"],
        "array.json",
        "a JSON object",
    ),
    // zams: output paths
    case(
        &["zams", "--mass", "1", "--profile", "{dir}/folder"],
        "folder",
        "directory",
    ),
    case(
        &["zams", "--mass", "1", "--profile", "{dir}/nowhere/p.csv"],
        "nowhere",
        "does not exist",
    ),
    case(
        &[
            "zams",
            "--model",
            "{dir}/model.json",
            "--profile",
            "{dir}/model.json",
        ],
        "model.json",
        "never replaces an input",
    ),
    case(
        &[
            "zams",
            "--mass",
            "1",
            "--opacity",
            "table:{dir}/table.csv",
            "--profile",
            "{dir}/./table.csv",
        ],
        "table.csv",
        "never replaces an input",
    ),
    case(
        &[
            "zams",
            "--mass",
            "1",
            "--profile",
            "{dir}/a.svg",
            "--plot",
            "{dir}/a.svg",
        ],
        "a.svg",
        "its own file",
    ),
    case(
        &["zams", "--mass", "1", "--plot", "{dir}/p.pdf"],
        "p.pdf",
        ".svg or .png",
    ),
    case(
        &["zams", "--mass", "1", "--plot", "-"],
        "--plot = -",
        ".svg or .png",
    ),
    case(
        &["zams", "--mass", "1", "--profile", "/proc/starpoise.csv"],
        "/proc/starpoise.csv",
        "writable folder",
    ),
    case(
        &["zams", "--mass", "1", "--profile", "{dir}/readonly.csv"],
        "readonly.csv",
        "read-only",
    ),
    case(
        &["zams", "--mass", "1", "--profile", ""],
        "--profile",
        "a value is required",
    ),
    // sequence: lists, ranges, grids
    case(
        &["sequence", "--masses", "1:2:18446744073709551615"],
        "1:2:18446744073709551615",
        "1 to 100000",
    ),
    case(
        &["sequence", "--masses", "1:2:1000000000000"],
        "1:2:1000000000000",
        "1 to 100000",
    ),
    case(&["sequence", "--masses", "1:2:-3"], "1:2:-3", "1 to 100000"),
    case(
        &["sequence", "--masses", "-1,1"],
        "--masses = -1",
        "between 0.05 and 150",
    ),
    case(&["sequence", "--masses", "1,1"], "1,1", "appears twice"),
    case(
        &["sequence", "--masses", "5:1:3"],
        "5:1:3",
        "must not exceed TO",
    ),
    case(
        &["sequence", "--masses", "0:1:3:log"],
        "0:1:3:log",
        "FROM > 0",
    ),
    case(
        &["sequence", "--masses", "1:2:3:cubic"],
        "1:2:3:cubic",
        "log or lin",
    ),
    case(&["sequence", "--masses", "1,,2"], "1,,2", "is not a number"),
    case(
        &["sequence", "--masses", ""],
        "--masses",
        "the list is empty",
    ),
    case(
        &["sequence", "--masses", "1", "--x", "1.5"],
        "--x = 1.5",
        "[0, 1]",
    ),
    case(
        &["sequence", "--masses", "1", "--z", "-0.01"],
        "--z = -0.01",
        "[0, 1]",
    ),
    case(
        &["sequence", "--masses", "1", "--z", "0:0.04:nan"],
        "0:0.04:nan",
        "COUNT",
    ),
    case(
        &[
            "sequence",
            "--masses",
            "1:150:100000",
            "--z",
            "0.01:0.02:11",
        ],
        "100000 masses",
        "at most 1000000 points",
    ),
    case(
        &["sequence", "--masses", "1", "--shard", "-1/3"],
        "-1/3",
        "K/N",
    ),
    case(
        &["sequence", "--masses", "1", "--shard", "4/3"],
        "4/3",
        "1 <= K <= N",
    ),
    case(
        &["sequence", "--masses", "1", "--shard", "0/0"],
        "0/0",
        "1 <= K <= N",
    ),
    case(
        &["sequence", "--masses", "1", "--shard", "1"],
        "--shard = 1",
        "K/N",
    ),
    case(
        &["sequence", "--masses", "1", "--threads", "-1"],
        "-1",
        "0 to 256",
    ),
    case(
        &["sequence", "--masses", "1", "--threads", "100000"],
        "--threads = 100000",
        "[0, 256]",
    ),
    case(
        &["sequence", "--masses", "1", "--fit-ranges", "2-1"],
        "2-1",
        "LO-HI",
    ),
    case(
        &["sequence", "--masses", "1", "--fit-ranges", "a-b"],
        "a-b",
        "LO-HI",
    ),
    case(
        &["sequence", "--masses", "1", "--fit-mass", "2"],
        "2",
        "[0.05, 0.95]",
    ),
    // sequence: variants
    case(
        &["sequence", "--masses", "1", "--variant", "hot"],
        "hot",
        "NAME=SPEC",
    ),
    case(
        &["sequence", "--masses", "1", "--variant", "x=colour:red"],
        "colour",
        "allowed",
    ),
    case(
        &["sequence", "--masses", "1", "--variant", "x=alpha:-1"],
        "x=alpha:-1",
        "[0.1, 10]",
    ),
    case(
        &["sequence", "--masses", "1", "--variant", "a b=alpha:1"],
        "a b=alpha:1",
        "letters, digits",
    ),
    case(
        &[
            "sequence",
            "--masses",
            "1",
            "--variant",
            "a=alpha:1",
            "--variant",
            "a=alpha:2",
        ],
        "a",
        "its own name",
    ),
    case(
        &["sequence", "--masses", "1", "--variant", "x=eos:nonsense"],
        "nonsense",
        "ideal",
    ),
    case(
        &[
            "sequence",
            "--masses",
            "1",
            "--physics",
            "analytic",
            "--variant",
            "x=alpha:1.5",
        ],
        "--variant = x=alpha:1.5",
        "only to convection mlt",
    ),
    // sequence: outputs
    case(
        &[
            "sequence",
            "--masses",
            "1",
            "--out",
            "{dir}/x.csv",
            "--plot",
            "{dir}/x.csv",
        ],
        "x.csv",
        ".svg or .png",
    ),
    case(
        &[
            "sequence",
            "--masses",
            "1",
            "--out",
            "{dir}/x.svg",
            "--plot",
            "{dir}/x.svg",
        ],
        "x.svg",
        "its own file",
    ),
    case(
        &["sequence", "--masses", "1", "--out", "/proc/x.csv"],
        "/proc/x.csv",
        "writable folder",
    ),
    case(
        &["sequence", "--masses", "1", "--plot", "{dir}/hr.jpg"],
        "hr.jpg",
        ".svg or .png",
    ),
    case(
        &[
            "sequence",
            "--masses",
            "1",
            "--opacity",
            "table:{dir}/table.csv",
            "--out",
            "{dir}/table.csv",
        ],
        "table.csv",
        "never replaces an input",
    ),
    // compare
    case(
        &["compare", "--mass", "1", "--variant", "a="],
        "--variant",
        "at least two",
    ),
    case(
        &[
            "compare",
            "--mass",
            "-1",
            "--variant",
            "a=",
            "--variant",
            "b=alpha:1.5",
        ],
        "--mass = -1",
        "between 0.05 and 150",
    ),
    case(
        &[
            "compare",
            "--mass",
            "1:2:0",
            "--variant",
            "a=",
            "--variant",
            "b=alpha:1.5",
        ],
        "1:2:0",
        "1 to 100000",
    ),
    case(
        &[
            "compare",
            "--mass",
            "1",
            "--variant",
            "a=",
            "--variant",
            "a=alpha:1.5",
        ],
        "a",
        "its own name",
    ),
    case(
        &[
            "compare",
            "--mass",
            "1",
            "--variant",
            "a=",
            "--variant",
            "b=alpha:1.5",
            "--threads",
            "999",
        ],
        "--threads = 999",
        "[0, 256]",
    ),
    case(
        &[
            "compare",
            "--mass",
            "1",
            "--variant",
            "a=",
            "--variant",
            "b=alpha:1.5",
            "--out",
            "/proc/c.csv",
        ],
        "/proc/c.csv",
        "writable folder",
    ),
    // merge
    case(
        &["merge", "{dir}/missing.csv", "--out", "{dir}/m.csv"],
        "missing.csv",
        "cannot read",
    ),
    case(
        &["merge", "{dir}/huge-grid.csv", "--out", "{dir}/m.csv"],
        "grid points missing",
        "is a shard missing",
    ),
    case(
        &["merge", "{dir}/shard.csv", "--out", "{dir}/shard.csv"],
        "shard.csv",
        "never replaces an input",
    ),
    case(
        &["merge", "{dir}/notatable.csv", "--out", "{dir}/m.csv"],
        "notatable.csv",
        "missing",
    ),
    case(
        &["merge", "{dir}/broken.json", "--out", "{dir}/m.json"],
        "broken.json",
        "not a starpoise sequence table",
    ),
    case(
        &["merge", "{dir}/far-index.csv", "--out", "{dir}/m.csv"],
        "far-index.csv",
        "outside the grid",
    ),
    case(
        &[
            "merge",
            "{dir}/shard.csv",
            "{dir}/shard.csv",
            "--out",
            "{dir}/m.csv",
        ],
        "shard.csv",
        "given once",
    ),
    // plot
    case(
        &["plot", "{dir}/missing.csv"],
        "missing.csv",
        "No such file",
    ),
    case(
        &["plot", "{dir}/profile.csv", "--out", "{dir}/profile.csv"],
        "profile.csv",
        ".svg or .png",
    ),
    case(
        &["plot", "{dir}/seq.svg", "--out", "{dir}/seq.svg"],
        "seq.svg",
        "never replaces an input",
    ),
    case(
        &["plot", "{dir}/profile.csv", "--out", "{dir}/p.pdf"],
        "p.pdf",
        ".svg or .png",
    ),
    case(
        &["plot", "{dir}/notatable.csv", "--out", "{dir}/n.svg"],
        "notatable.csv",
        "neither a profile",
    ),
    case(
        &[
            "plot",
            "{dir}/seq.csv",
            "--out",
            "{dir}/s.svg",
            "--abscissa",
            "mass",
        ],
        "mass",
        "only for a profile table",
    ),
    // polytrope
    case(&["polytrope", "--index", "-1"], "-1", "[0, 5]"),
    case(&["polytrope", "--index", "6"], "6", "[0, 5]"),
    case(
        &["polytrope", "--index", "5", "--mass", "1", "--radius", "1"],
        "5",
        "below 5",
    ),
    case(
        &[
            "polytrope",
            "--index",
            "3",
            "--mass",
            "1e300",
            "--radius",
            "1e-300",
        ],
        "1e300",
        "not a finite number",
    ),
    case(
        &[
            "polytrope",
            "--index",
            "3",
            "--mass",
            "1e-300",
            "--radius",
            "1e300",
        ],
        "1e-300",
        "not a finite number",
    ),
    case(
        &["polytrope", "--index", "3", "--points", "1"],
        "--points = 1",
        "2 to 1000000",
    ),
    case(
        &["polytrope", "--index", "3", "--points", "2000000"],
        "2000000",
        "2 to 1000000",
    ),
    case(
        &[
            "polytrope",
            "--index",
            "2",
            "--radiation",
            "--mass",
            "1",
            "--radius",
            "1",
        ],
        "2",
        "n = 3",
    ),
    case(
        &[
            "polytrope",
            "--index",
            "3",
            "--mass",
            "1",
            "--radius",
            "1",
            "--mu",
            "-1",
        ],
        "-1",
        "mu",
    ),
    case(
        &["polytrope", "--index", "3", "--profile", "/proc/p.csv"],
        "/proc/p.csv",
        "writable folder",
    ),
    // probe
    case(
        &["probe", "--density", "-5", "--temperature", "1e7"],
        "-5",
        "positive",
    ),
    case(
        &["probe", "--density", "1", "--temperature", "-1e7"],
        "-10000000",
        "positive",
    ),
    case(
        &["probe", "--density", "1e300", "--temperature", "1e7"],
        "1e300",
        "outside the domain",
    ),
    case(
        &["probe", "--density", "1", "--temperature", "nan"],
        "nan",
        "finite number",
    ),
    case(
        &[
            "probe",
            "--density",
            "1",
            "--temperature",
            "1e7",
            "--x",
            "2",
        ],
        "--x = 2",
        "[0, 1]",
    ),
    // opacity tables, through probe
    case(
        &[
            "probe",
            "--density",
            "1",
            "--temperature",
            "1e6",
            "--opacity",
            "table:{dir}/kappa400.csv",
        ],
        "line 6",
        "[-30, 30]",
    ),
    case(
        &[
            "probe",
            "--density",
            "1",
            "--temperature",
            "1e6",
            "--opacity",
            "table:{dir}/axis308.csv",
        ],
        "line 6",
        "[0, 12]",
    ),
    case(
        &[
            "probe",
            "--density",
            "1",
            "--temperature",
            "1e6",
            "--opacity",
            "table:{dir}/nan.csv",
        ],
        "line 6",
        "finite number",
    ),
    case(
        &[
            "probe",
            "--density",
            "1",
            "--temperature",
            "1e6",
            "--opacity",
            "table:{dir}/dup-point.csv",
        ],
        "line 7",
        "duplicates",
    ),
    case(
        &[
            "probe",
            "--density",
            "1",
            "--temperature",
            "1e6",
            "--opacity",
            "table:{dir}/noheader.csv",
        ],
        "line 5",
        "log10_T,log10_R,log10_kappa",
    ),
    case(
        &[
            "probe",
            "--density",
            "1",
            "--temperature",
            "1e6",
            "--opacity",
            "table:{dir}/close.csv",
        ],
        "line 7",
        "closer than",
    ),
    case(
        &[
            "probe",
            "--density",
            "1",
            "--temperature",
            "1e6",
            "--opacity",
            "table:{dir}/short-row.csv",
        ],
        "line 6",
        "3 comma-separated values",
    ),
    // modes, limits
    case(&["modes", "--polytrope", "-1"], "-1", "[0, 5)"),
    case(
        &["modes", "--polytrope", "3", "--gamma1", "1"],
        "--gamma1 = 1",
        "4/3",
    ),
    case(
        &["modes", "--polytrope", "3", "--degrees", "0,-1"],
        "-1",
        "0 to 1000",
    ),
    case(
        &["modes", "--polytrope", "3", "--degrees", "2000"],
        "2000",
        "0 to 1000",
    ),
    case(
        &["modes", "--polytrope", "3", "--max-order", "-5"],
        "-5",
        "1 to 1000",
    ),
    case(
        &["modes", "--polytrope", "3", "--points", "1e9"],
        "1e9",
        "50 to 100000",
    ),
    case(&["modes", "--mass", "-1"], "-1", "between 0.05 and 150"),
    case(&["modes", "--mass", "1", "--points", "5"], "5", "10"),
    case(
        &["modes", "--mass", "1", "--gamma1", "1.6"],
        "1.6",
        "polytrope",
    ),
    case(
        &[
            "modes",
            "--polytrope",
            "3",
            "--eigenfunctions",
            "/proc/e.csv",
        ],
        "/proc/e.csv",
        "writable folder",
    ),
    case(&["limits", "--x", "2"], "--x = 2", "[0, 1]"),
    case(
        &["limits", "--opacity-factor", "-3"],
        "-3",
        "[0.000001, 1000000]",
    ),
    // verify, completions
    case(&["verify", "--format", "xml"], "xml", "possible values"),
    case(&["completions", "tcsh"], "tcsh", "possible values"),
];

#[test]
fn every_hostile_input_is_refused_cleanly() {
    assert!(CASES.len() >= 80, "{} cases", CASES.len());
    let dir = scratch_dir("hostile");
    fixtures(&dir);
    let before = listing(&dir);
    let d = dir.display().to_string();
    let mut failures = Vec::new();
    for c in CASES {
        let args: Vec<String> = c.args.iter().map(|a| a.replace("{dir}", &d)).collect();
        let out = Command::new(env!("CARGO_BIN_EXE_starpoise"))
            .args(&args)
            .current_dir(&dir)
            .output()
            .expect("the binary runs");
        let err = String::from_utf8_lossy(&out.stderr);
        let problems: Vec<&str> = [
            (out.status.code() != Some(2), "exit code is not 2"),
            (err.contains("panicked"), "panicked"),
            (!err.contains(c.value), "value not named"),
            (!err.contains(c.allowed), "allowed not said"),
            (listing(&dir) != before, "a file was left"),
        ]
        .into_iter()
        .filter_map(|(bad, what)| bad.then_some(what))
        .collect();
        if !problems.is_empty() {
            failures.push(format!(
                "{args:?}: {} (exit {:?}): {err}",
                problems.join(", "),
                out.status.code()
            ));
        }
    }
    assert!(
        failures.is_empty(),
        "{} of {} cases failed:\n{}",
        failures.len(),
        CASES.len(),
        failures.join("\n")
    );
    let _ = std::fs::remove_dir_all(&dir);
}
