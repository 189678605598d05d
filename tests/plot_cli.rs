//! Pictures from the command line: `zams --plot`, `sequence --plot`, and `plot FILE.csv`.

mod common;
use common::{scratch_dir, starpoise, stderr};

fn is_svg_with(path: &std::path::Path, texts: &[&str]) {
    let svg = std::fs::read_to_string(path).unwrap_or_else(|e| panic!("{}: {e}", path.display()));
    assert!(
        svg.trim_start().starts_with("<svg"),
        "{} is not SVG",
        path.display()
    );
    for t in texts {
        assert!(svg.contains(t), "{} lacks {t}", path.display());
    }
}

#[test]
fn zams_sequence_and_redraw_produce_figures() {
    let dir = scratch_dir("plots");
    let profile_svg = dir.join("star.svg");
    let profile_csv = dir.join("star.csv");
    let out = starpoise(&[
        "zams",
        "--mass",
        "3",
        "--physics",
        "analytic",
        "--plot",
        profile_svg.to_str().unwrap(),
        "--profile",
        profile_csv.to_str().unwrap(),
    ]);
    assert!(out.status.success(), "{}", stderr(&out));
    is_svg_with(&profile_svg, &["r / R", "nabla_ad", "T / T_c"]);

    let hr_svg = dir.join("hr.svg");
    let table = dir.join("hr.csv");
    let out = starpoise(&[
        "sequence",
        "--quiet",
        "--masses",
        "1,2,5,10",
        "--physics",
        "analytic",
        "--plot",
        hr_svg.to_str().unwrap(),
        "--out",
        table.to_str().unwrap(),
    ]);
    assert!(out.status.success(), "{}", stderr(&out));
    is_svg_with(&hr_svg, &["log10 T_eff / K", "log10 L / L_sun"]);

    // Redraw both from the saved tables.
    for (csv, svg, needle) in [
        (&profile_csv, dir.join("again-star.svg"), "nabla_rad"),
        (&table, dir.join("again-hr.svg"), "L_sun"),
    ] {
        let out = starpoise(&[
            "plot",
            csv.to_str().unwrap(),
            "--out",
            svg.to_str().unwrap(),
        ]);
        assert!(out.status.success(), "{}", stderr(&out));
        is_svg_with(&svg, &[needle]);
    }
    // A file that is neither kind is refused with exit 2 and no picture.
    let junk = dir.join("junk.csv");
    std::fs::write(&junk, "a,b\n1,2\n").unwrap();
    let target = dir.join("junk.svg");
    let out = starpoise(&[
        "plot",
        junk.to_str().unwrap(),
        "--out",
        target.to_str().unwrap(),
    ]);
    assert_eq!(out.status.code(), Some(2), "{}", stderr(&out));
    assert!(!target.exists());
    let _ = std::fs::remove_dir_all(&dir);
}
