//! Pictures from the command line: `zams --plot`, `sequence --plot`, and `plot FILE.csv`, in
//! the format the file name asks for; anything but `.svg` or `.png` is refused first.

mod common;
use common::{scratch_dir, starpoise, stderr};
use std::path::Path;

fn is_svg_with(path: &Path, texts: &[&str]) {
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

/// The eight bytes every PNG file starts with (PNG specification, ISO/IEC 15948, §5.2).
const PNG_SIGNATURE: [u8; 8] = [0x89, b'P', b'N', b'G', b'\r', b'\n', 0x1a, b'\n'];

/// Assert that `path` is a PNG of `width` x `height` pixels (IHDR, the first chunk, holds them
/// big-endian: ISO/IEC 15948, §11.2.2).
fn is_png_of(path: &Path, (width, height): (u32, u32)) {
    let bytes = std::fs::read(path).unwrap_or_else(|e| panic!("{}: {e}", path.display()));
    assert_eq!(bytes[..8], PNG_SIGNATURE, "{} is not PNG", path.display());
    assert_eq!(&bytes[12..16], b"IHDR");
    let w = u32::from_be_bytes(bytes[16..20].try_into().unwrap());
    let h = u32::from_be_bytes(bytes[20..24].try_into().unwrap());
    assert_eq!((w, h), (width, height), "{}", path.display());
}

/// Pixel sizes of the two figures.
const PROFILE_PX: (u32, u32) = (800, 860);
const HR_PX: (u32, u32) = (800, 600);

/// Check a figure written as `extension`: an SVG holding `texts`, or a PNG of `size`.
fn is_figure(path: &Path, extension: &str, texts: &[&str], size: (u32, u32)) {
    if extension.eq_ignore_ascii_case("png") {
        is_png_of(path, size);
    } else {
        is_svg_with(path, texts);
    }
}

fn run_ok(args: &[&str]) {
    let out = starpoise(args);
    assert!(out.status.success(), "{args:?}: {}", stderr(&out));
}

#[test]
fn every_drawing_command_writes_the_format_its_extension_names() {
    for extension in ["svg", "png", "PNG"] {
        let dir = scratch_dir(&format!("plots-{extension}"));
        let profile_figure = dir.join(format!("star.{extension}"));
        let profile_csv = dir.join("star.csv");
        run_ok(&[
            "zams",
            "--mass",
            "3",
            "--physics",
            "analytic",
            "--plot",
            profile_figure.to_str().unwrap(),
            "--profile",
            profile_csv.to_str().unwrap(),
        ]);
        let profile_texts = ["r / R", "nabla_ad", "T / T_c"];
        is_figure(&profile_figure, extension, &profile_texts, PROFILE_PX);

        let hr_figure = dir.join(format!("hr.{extension}"));
        let table = dir.join("hr.csv");
        run_ok(&[
            "sequence",
            "--quiet",
            "--masses",
            "1,2,5,10",
            "--physics",
            "analytic",
            "--plot",
            hr_figure.to_str().unwrap(),
            "--out",
            table.to_str().unwrap(),
        ]);
        let hr_texts = ["log10 T_eff / K", "log10 L / L_sun", "Sun"];
        is_figure(&hr_figure, extension, &hr_texts, HR_PX);

        // Redraw both from the saved tables.
        for (csv, name, texts, size) in [
            (&profile_csv, "again-star", &profile_texts[..], PROFILE_PX),
            (&table, "again-hr", &hr_texts[..], HR_PX),
        ] {
            let figure = dir.join(format!("{name}.{extension}"));
            run_ok(&[
                "plot",
                csv.to_str().unwrap(),
                "--out",
                figure.to_str().unwrap(),
            ]);
            is_figure(&figure, extension, texts, size);
        }
        // Each abscissa redraws the saved profile, and the axis says which (the library's
        // tests check which text is the axis label).
        for (abscissa, label) in [
            ("radius", "r / R"),
            ("mass", "m / M"),
            ("pressure", "log10 P / (dyn cm^-2)"),
        ] {
            let figure = dir.join(format!("star-{abscissa}.{extension}"));
            run_ok(&[
                "plot",
                profile_csv.to_str().unwrap(),
                "--abscissa",
                abscissa,
                "--out",
                figure.to_str().unwrap(),
            ]);
            is_figure(&figure, extension, &[label], PROFILE_PX);
        }
        let _ = std::fs::remove_dir_all(&dir);
    }
}

#[test]
fn tables_that_are_neither_kind_are_refused() {
    let dir = scratch_dir("plots-junk");
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

#[test]
fn unknown_figure_extensions_are_refused_before_any_work() {
    let dir = scratch_dir("plots-refused");
    let table = dir.join("grid.csv");
    let profile = dir.join("star.csv");
    let zams = [
        "zams",
        "--mass",
        "1",
        "--profile",
        profile.to_str().unwrap(),
    ];
    let sequence = [
        "sequence",
        "--quiet",
        "--masses",
        "1,2",
        "--out",
        table.to_str().unwrap(),
    ];
    for (args, figure) in [
        (&zams[..], "star.pdf"),
        (&sequence[..], "hr.jpg"),
        (&sequence[..], "hr"),
    ] {
        let target = dir.join(figure);
        let mut args = args.to_vec();
        args.extend(["--plot", target.to_str().unwrap()]);
        let out = starpoise(&args);
        assert_eq!(out.status.code(), Some(2), "{args:?}: {}", stderr(&out));
        let message = stderr(&out);
        for wanted in ["--plot", figure, ".svg", ".png"] {
            assert!(message.contains(wanted), "{args:?}: {message}");
        }
        // Nothing computed: no table, no profile, no figure, no summary.
        assert!(out.stdout.is_empty(), "{args:?} printed a result");
        assert_eq!(
            std::fs::read_dir(&dir).unwrap().count(),
            0,
            "{args:?} wrote a file"
        );
    }
    // `plot --out` likewise, and `--abscissa` is refused for a sequence table and without
    // `--plot` on `zams`.
    std::fs::write(
        &table,
        "mass_msun,teff_k,luminosity_lsun\n1,5600,0.7\n2,9000,16\n",
    )
    .unwrap();
    let gif = dir.join("hr.gif");
    let out = starpoise(&[
        "plot",
        table.to_str().unwrap(),
        "--out",
        gif.to_str().unwrap(),
    ]);
    assert_eq!(out.status.code(), Some(2), "{}", stderr(&out));
    assert!(stderr(&out).contains("hr.gif"), "{}", stderr(&out));
    let png = dir.join("hr.png");
    let out = starpoise(&[
        "plot",
        table.to_str().unwrap(),
        "--abscissa",
        "mass",
        "--out",
        png.to_str().unwrap(),
    ]);
    assert_eq!(out.status.code(), Some(2), "{}", stderr(&out));
    assert!(stderr(&out).contains("--abscissa"), "{}", stderr(&out));
    let out = starpoise(&["zams", "--mass", "1", "--abscissa", "mass"]);
    assert_eq!(out.status.code(), Some(2), "{}", stderr(&out));
    assert!(out.stdout.is_empty());
    assert!(!gif.exists() && !png.exists());
    let _ = std::fs::remove_dir_all(&dir);
}

/// A profile written as ECSV (its centre row has empty Lamb frequencies) is redrawn like the
/// CSV one.
#[test]
fn an_ecsv_profile_is_redrawn() {
    let dir = scratch_dir("plot-ecsv");
    let table = dir.join("star.ecsv");
    let figure = dir.join("star.svg");
    run_ok(&[
        "zams",
        "--mass",
        "2",
        "--physics",
        "analytic",
        "--profile",
        table.to_str().unwrap(),
    ]);
    run_ok(&[
        "plot",
        table.to_str().unwrap(),
        "--out",
        figure.to_str().unwrap(),
    ]);
    is_svg_with(&figure, &["r / R", "nabla_ad"]);
    let _ = std::fs::remove_dir_all(&dir);
}
