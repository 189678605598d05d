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

/// The eight bytes every PNG file starts with (PNG specification, ISO/IEC 15948, §5.2).
const PNG_SIGNATURE: [u8; 8] = [0x89, b'P', b'N', b'G', b'\r', b'\n', 0x1a, b'\n'];

/// Assert that `path` is a PNG of `width` x `height` pixels (IHDR, the first chunk, holds them
/// big-endian: ISO/IEC 15948, §11.2.2).
fn is_png_of(path: &std::path::Path, width: u32, height: u32) {
    let bytes = std::fs::read(path).unwrap_or_else(|e| panic!("{}: {e}", path.display()));
    assert_eq!(bytes[..8], PNG_SIGNATURE, "{} is not PNG", path.display());
    assert_eq!(&bytes[12..16], b"IHDR");
    let w = u32::from_be_bytes(bytes[16..20].try_into().unwrap());
    let h = u32::from_be_bytes(bytes[20..24].try_into().unwrap());
    assert_eq!((w, h), (width, height), "{}", path.display());
}

#[test]
fn png_follows_the_extension_in_every_drawing_command() {
    let dir = scratch_dir("plots-png");
    let profile_png = dir.join("star.png");
    let profile_csv = dir.join("star.csv");
    let out = starpoise(&[
        "zams",
        "--mass",
        "3",
        "--physics",
        "analytic",
        "--plot",
        profile_png.to_str().unwrap(),
        "--abscissa",
        "pressure",
        "--profile",
        profile_csv.to_str().unwrap(),
    ]);
    assert!(out.status.success(), "{}", stderr(&out));
    is_png_of(&profile_png, 800, 860);

    let hr_png = dir.join("hr.PNG");
    let table = dir.join("hr.csv");
    let out = starpoise(&[
        "sequence",
        "--quiet",
        "--masses",
        "1,2,5,10",
        "--physics",
        "analytic",
        "--plot",
        hr_png.to_str().unwrap(),
        "--out",
        table.to_str().unwrap(),
    ]);
    assert!(out.status.success(), "{}", stderr(&out));
    is_png_of(&hr_png, 800, 600);

    for (csv, png, size) in [
        (&profile_csv, dir.join("again-star.png"), (800, 860)),
        (&table, dir.join("again-hr.png"), (800, 600)),
    ] {
        let out = starpoise(&[
            "plot",
            csv.to_str().unwrap(),
            "--out",
            png.to_str().unwrap(),
        ]);
        assert!(out.status.success(), "{}", stderr(&out));
        is_png_of(&png, size.0, size.1);
    }
    // Each abscissa redraws the saved profile, and the axis says which (the library's tests
    // check which text is the axis label).
    for (abscissa, label) in [
        ("radius", "r / R"),
        ("mass", "m / M"),
        ("pressure", "log10 P / (dyn cm^-2)"),
    ] {
        let svg = dir.join(format!("star-{abscissa}.svg"));
        let out = starpoise(&[
            "plot",
            profile_csv.to_str().unwrap(),
            "--abscissa",
            abscissa,
            "--out",
            svg.to_str().unwrap(),
        ]);
        assert!(out.status.success(), "{}", stderr(&out));
        is_svg_with(&svg, &[label]);
    }
    let _ = std::fs::remove_dir_all(&dir);
}

#[test]
fn unknown_figure_extensions_are_refused_before_any_work() {
    let dir = scratch_dir("plots-refused");
    let table = dir.join("grid.csv");
    let profile = dir.join("star.csv");
    for (args, figure) in [
        (
            vec![
                "zams",
                "--mass",
                "1",
                "--profile",
                profile.to_str().unwrap(),
            ],
            "star.pdf",
        ),
        (
            vec![
                "sequence",
                "--quiet",
                "--masses",
                "1,2",
                "--out",
                table.to_str().unwrap(),
            ],
            "hr.jpg",
        ),
        (
            vec![
                "sequence",
                "--quiet",
                "--masses",
                "1,2",
                "--out",
                table.to_str().unwrap(),
            ],
            "hr",
        ),
    ] {
        let target = dir.join(figure);
        let mut args = args.clone();
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
