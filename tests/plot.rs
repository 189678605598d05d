//! Figures: the HR diagram and the profile figure are valid SVG or PNG (by extension) with the
//! promised labels, temperature increases to the left, the Sun is marked, labels collide with
//! nothing, the profile takes three abscissae, bad input leaves no file, and saved tables read
//! back.
//!
//! All data here is invented demo data built in the tests (power laws, an n = 1 polytrope
//! shape); no number is a physical result, so no published source applies. What is checked is
//! the drawing, not the physics; the Sun's place is the IAU 2015 B3 nominal T_eff = 5772 K and
//! L = 1 L_sun (docs/references.md §2).

use starpoise::output::plot::{
    format_mass, hr_diagram, profile_plot, read_table, render_hr_diagram, render_profile, Abscissa,
    HrFigure, HrLayout, HrPoint, HrSeries, ImageFormat, PlacedLabel, PlotInput, ProfileFigure,
    HR_HEIGHT_PX, HR_WIDTH_PX, MAX_MASS_LABELS, NABLA_AXIS_CAP, PROFILE_HEIGHT_PX,
    PROFILE_WIDTH_PX, SUN_LABEL,
};
use starpoise::structure::ProfileRow;
use starpoise::Error;
use std::f64::consts::PI;
use std::path::PathBuf;

/// A fresh, empty directory for one test.
fn scratch(name: &str) -> PathBuf {
    let dir = std::env::temp_dir().join(format!("starpoise-plot-{}-{name}", std::process::id()));
    let _ = std::fs::remove_dir_all(&dir);
    std::fs::create_dir_all(&dir).unwrap();
    dir
}

/// Invented sequence: L = M^a, R = M^b (solar units), T_eff = 5772 K (L / R^2)^(1/4).
fn power_law(label: &str, masses: &[f64], a: f64, b: f64) -> HrSeries {
    HrSeries {
        label: label.to_string(),
        points: masses
            .iter()
            .map(|&m| {
                let l = m.powf(a);
                let r = m.powf(b);
                HrPoint {
                    mass_msun: m,
                    teff_k: 5772.0 * (l / (r * r)).powf(0.25),
                    luminosity_lsun: l,
                }
            })
            .collect(),
    }
}

fn demo_series() -> Vec<HrSeries> {
    let masses = [0.5, 1.0, 2.0, 5.0, 10.0, 20.0];
    vec![
        power_law("steep demo", &masses, 3.5, 0.8),
        power_law("shallow demo", &masses, 3.0, 0.6),
    ]
}

/// Invented profile on the n = 1 polytrope theta = sin(xi)/xi: rho/rho_c = theta,
/// P/P_c = theta^2 + 1e-13 (so that log P stays finite at the surface, where P = 1e4 dyn/cm^2),
/// T/T_c = theta, m/M = (sin xi - xi cos xi)/pi, L/L_s = m/M; a made-up nabla_rad that exceeds
/// nabla_ad = 0.4 inside r/R = 0.15 and outside r/R = 0.85 and grows to 5 at the surface.
fn polytrope_rows(n: usize) -> Vec<ProfileRow> {
    (0..n)
        .map(|i| {
            let x = i as f64 / (n - 1) as f64;
            let xi = PI * x;
            let theta = if i == 0 {
                1.0
            } else {
                (xi.sin() / xi).max(0.0)
            };
            let m = (xi.sin() - xi * xi.cos()) / PI;
            let nabla_rad = if x < 0.15 {
                0.6
            } else if x > 0.85 {
                0.5 + 4.5 * (x - 0.85) / 0.15
            } else {
                0.25
            };
            ProfileRow {
                mass_g: m * 2e33,
                m_over_m: m,
                radius_cm: x * 7e10,
                r_over_r: x,
                pressure_dyn_cm2: 1e17 * theta * theta + 1e4,
                temperature_k: 1.5e7 * theta,
                density_g_cm3: 100.0 * theta,
                luminosity_erg_s: 4e33 * m,
                eps_pp_erg_g_s: 1.0,
                eps_cno_erg_g_s: 0.0,
                opacity_cm2_g: 1.0,
                nabla_rad,
                nabla_ad: 0.4,
                nabla: nabla_rad.min(0.4),
                convective: u8::from(nabla_rad > 0.4),
                mu: 0.6,
                gamma1: 5.0 / 3.0,
                brunt_n2_rad2_s2: 0.0,
                lamb_l1_rad_s: 0.0,
                lamb_l2_rad_s: 0.0,
                ..ProfileRow::default()
            }
        })
        .collect()
}

/// The text content of every `<text>` element.
fn svg_texts(svg: &str) -> Vec<String> {
    svg.split("<text")
        .skip(1)
        .filter_map(|t| {
            let body = &t[t.find('>')? + 1..t.find("</text>")?];
            Some(body.trim().to_string())
        })
        .collect()
}

/// Centres of the `<circle>` elements whose fill is `fill`.
fn circles(svg: &str, fill: &str) -> Vec<(i32, i32)> {
    let attr = |tag: &str, name: &str| -> Option<String> {
        let start = tag.find(&format!(" {name}=\""))? + name.len() + 3;
        let end = start + tag[start..].find('"')?;
        Some(tag[start..end].to_string())
    };
    svg.split("<circle")
        .skip(1)
        .filter_map(|t| {
            let tag = &t[..t.find("/>")?];
            if attr(tag, "fill")? != fill {
                return None;
            }
            Some((
                attr(tag, "cx")?.parse().ok()?,
                attr(tag, "cy")?.parse().ok()?,
            ))
        })
        .collect()
}

/// The SVG document of a figure rendered as SVG.
fn svg_of(image: &[u8]) -> String {
    let svg = String::from_utf8(image.to_vec()).unwrap();
    assert!(svg.starts_with("<svg"), "not SVG");
    svg
}

fn svg_hr(series: &[HrSeries], title: &str) -> (HrFigure, String) {
    let figure = render_hr_diagram(series, title, ImageFormat::Svg).unwrap();
    let svg = svg_of(&figure.image);
    (figure, svg)
}

fn svg_profile(rows: &[ProfileRow], title: &str, abscissa: Abscissa) -> (ProfileFigure, String) {
    let figure = render_profile(rows, title, abscissa, ImageFormat::Svg).unwrap();
    let svg = svg_of(&figure.image);
    (figure, svg)
}

/// The eight bytes every PNG file starts with (PNG specification, ISO/IEC 15948, §5.2).
const PNG_SIGNATURE: [u8; 8] = [0x89, b'P', b'N', b'G', b'\r', b'\n', 0x1a, b'\n'];

/// Decode a PNG into (width, height, RGB bytes), checking the signature first.
fn decode_png(bytes: &[u8]) -> (u32, u32, Vec<u8>) {
    assert_eq!(bytes[..8], PNG_SIGNATURE, "no PNG signature");
    // The first chunk is IHDR with width and height, big-endian (ISO/IEC 15948, §11.2.2).
    assert_eq!(&bytes[12..16], b"IHDR");
    let width = u32::from_be_bytes(bytes[16..20].try_into().unwrap());
    let height = u32::from_be_bytes(bytes[20..24].try_into().unwrap());
    let decoder = png::Decoder::new(std::io::Cursor::new(bytes.to_vec()));
    let mut reader = decoder.read_info().unwrap();
    let mut buffer = vec![0; reader.output_buffer_size().unwrap()];
    let info = reader.next_frame(&mut buffer).unwrap();
    assert_eq!((info.width, info.height), (width, height));
    assert_eq!(info.color_type, png::ColorType::Rgb);
    buffer.truncate(info.buffer_size());
    (width, height, buffer)
}

/// RGB of pixel (x, y) of a decoded image `width` pixels wide.
fn pixel(rgb: &[u8], width: u32, (x, y): (i32, i32)) -> [u8; 3] {
    let i = 3 * (y as usize * width as usize + x as usize);
    [rgb[i], rgb[i + 1], rgb[i + 2]]
}

#[test]
fn hr_diagram_has_labels_legend_and_masses() {
    let (figure, svg) = svg_hr(&demo_series(), "Demo");
    assert!(svg.trim_end().ends_with("</svg>"));
    let texts = svg_texts(&svg);
    for wanted in [
        "Demo",
        "log10 T_eff / K",
        "log10 L / L_sun",
        "steep demo",
        "shallow demo",
        SUN_LABEL,
    ] {
        assert!(texts.iter().any(|t| t == wanted), "no text '{wanted}'");
    }
    // Every mass of the first series is labelled; the round ones of the second too (others
    // may give way to the first series' labels).
    assert_eq!(
        figure.layout.mass_labels[0],
        ["0.5", "1", "2", "5", "10", "20"]
    );
    for mass in ["1", "10"] {
        assert!(
            figure.layout.mass_labels[1].iter().any(|l| l == mass),
            "{mass} missing: {:?}",
            figure.layout.mass_labels[1]
        );
    }
    // What the layout lists is what the file says.
    for label in &figure.layout.labels {
        assert!(texts.contains(&label.text), "{} not in the SVG", label.text);
    }
}

#[test]
fn hr_temperature_increases_to_the_left_and_luminosity_upwards() {
    let series = demo_series();
    let (figure, svg) = svg_hr(&series, "");
    for (s, px) in series.iter().zip(&figure.layout.points_px) {
        let hottest = (0..s.points.len())
            .max_by(|&a, &b| s.points[a].teff_k.total_cmp(&s.points[b].teff_k))
            .unwrap();
        let coolest = (0..s.points.len())
            .min_by(|&a, &b| s.points[a].teff_k.total_cmp(&s.points[b].teff_k))
            .unwrap();
        assert!(
            px[hottest].0 < px[coolest].0,
            "hottest at x = {}, coolest at x = {}",
            px[hottest].0,
            px[coolest].0
        );
        // Brighter is higher: smaller pixel y.
        assert!(px[hottest].1 < px[coolest].1);
    }
    // The reported positions are where the first series' filled black circles were drawn.
    let drawn = circles(&svg, "#000000");
    for p in &figure.layout.points_px[0] {
        assert!(drawn.contains(p), "no circle at {p:?}; circles: {drawn:?}");
    }
}

#[test]
fn crowded_series_is_thinned_to_round_masses() {
    let masses: Vec<f64> = (0..40)
        .map(|i| 10f64.powf(-1.0 + 3.0 * i as f64 / 39.0))
        .collect();
    let (figure, _) = svg_hr(&[power_law("dense", &masses, 3.5, 0.8)], "");
    let labels = &figure.layout.mass_labels[0];
    assert!(labels.len() <= MAX_MASS_LABELS, "{labels:?}");
    for round in ["0.1", "1", "10", "100"] {
        assert!(
            labels.iter().any(|l| l == round),
            "{round} missing: {labels:?}"
        );
    }
    assert_eq!(format_mass(masses[13]), "1");
}

#[test]
fn hr_file_is_written_and_bad_input_leaves_none() {
    let dir = scratch("hr");
    let good = dir.join("hr.svg");
    hr_diagram(&good, &demo_series(), "Demo").unwrap();
    let text = std::fs::read_to_string(&good).unwrap();
    assert!(text.starts_with("<svg") && text.contains("log10 T_eff / K"));

    let cases: Vec<(&str, Vec<HrSeries>)> = vec![
        ("no-series", vec![]),
        (
            "empty-series",
            vec![HrSeries {
                label: "nothing".into(),
                points: vec![],
            }],
        ),
        (
            "bad-point",
            vec![HrSeries {
                label: "negative".into(),
                points: vec![HrPoint {
                    mass_msun: 1.0,
                    teff_k: -5772.0,
                    luminosity_lsun: 1.0,
                }],
            }],
        ),
    ];
    for (name, series) in cases {
        let path = dir.join(format!("{name}.svg"));
        let err = hr_diagram(&path, &series, "x").unwrap_err();
        assert!(matches!(err, Error::InvalidInput { .. }), "{name}: {err}");
        assert_eq!(err.exit_code(), starpoise::error::ExitCode::BadInput);
        assert!(!path.exists(), "{name}: file written");
    }
    let err = hr_diagram(
        &dir.join("empty-series.svg"),
        &[HrSeries {
            label: "nothing".into(),
            points: vec![],
        }],
        "",
    )
    .unwrap_err();
    assert!(err.to_string().contains("nothing"), "{err}");
    // Only the good file and no temporary left behind.
    assert_eq!(std::fs::read_dir(&dir).unwrap().count(), 1);

    // A folder that does not exist is refused before drawing, as bad input.
    let err = hr_diagram(&dir.join("missing/hr.svg"), &demo_series(), "").unwrap_err();
    assert!(matches!(err, Error::InvalidInput { .. }), "{err}");
    assert!(err.to_string().contains("does not exist"), "{err}");
    std::fs::remove_dir_all(&dir).unwrap();
}

#[test]
fn profile_figure_has_both_panels_and_shading() {
    let rows = polytrope_rows(201);
    let (figure, svg) = svg_profile(&rows, "Demo profile", Abscissa::Radius);
    let texts = svg_texts(&svg);
    for wanted in [
        "Demo profile",
        "r / R",
        "normalised value",
        "T / T_c",
        "rho / rho_c",
        "P / P_c",
        "L / L_surface",
        "m / M",
        "nabla_rad",
        "nabla_ad",
        "nabla",
        "convective",
    ] {
        assert!(texts.iter().any(|t| t == wanted), "no text '{wanted}'");
    }
    // nabla_rad reaches 5, so the axis stops at the cap and says so.
    let figure = figure.layout;
    assert!(figure.nabla_clipped);
    assert_eq!(figure.nabla_axis_top, NABLA_AXIS_CAP);
    assert!(texts.iter().any(|t| t.contains("cut at 1")), "{texts:?}");
    // Core r/R < 0.15 and envelope r/R > 0.85; rows are 0.005 apart, so the band edges are
    // within one row spacing of those.
    assert_eq!(figure.convective_bands.len(), 2);
    let (core, envelope) = (figure.convective_bands[0], figure.convective_bands[1]);
    assert_eq!(core.0, 0.0);
    assert!((core.1 - 0.15).abs() <= 0.005, "{core:?}");
    assert!((envelope.0 - 0.85).abs() <= 0.005, "{envelope:?}");
    assert_eq!(envelope.1, 1.0);
    // Each band is shaded in both panels.
    let shaded = svg.matches("fill=\"#DEDEDE\"").count();
    assert!(shaded >= 4, "{shaded} shaded rectangles");
}

#[test]
fn profile_without_large_gradient_is_not_cut() {
    let mut rows = polytrope_rows(51);
    for r in &mut rows {
        r.nabla_rad = 0.3;
        r.nabla = 0.3;
        r.convective = 0;
    }
    let (figure, svg) = svg_profile(&rows, "", Abscissa::Radius);
    assert!(!figure.layout.nabla_clipped);
    // Axis top 8 % above the largest gradient, nabla_ad = 0.4; tolerance for rounding only.
    assert!((figure.layout.nabla_axis_top - 0.432).abs() < 1e-12);
    assert!(figure.layout.convective_bands.is_empty());
    assert!(!svg_texts(&svg).iter().any(|t| t == "convective"));
}

#[test]
fn profile_file_is_written_and_bad_input_leaves_none() {
    let dir = scratch("profile");
    let good = dir.join("profile.svg");
    profile_plot(&good, &polytrope_rows(101), "", Abscissa::Radius).unwrap();
    assert!(std::fs::read_to_string(&good).unwrap().starts_with("<svg"));

    let one_row = polytrope_rows(2)[..1].to_vec();
    let mut cold = polytrope_rows(11);
    cold[0].temperature_k = 0.0;
    let mut nan = polytrope_rows(11);
    nan[4].density_g_cm3 = f64::NAN;
    let mut vacuum = polytrope_rows(11);
    vacuum[10].pressure_dyn_cm2 = 0.0;
    for (name, rows, abscissa) in [
        ("empty", vec![], Abscissa::Radius),
        ("one", one_row, Abscissa::Mass),
        ("cold", cold, Abscissa::Radius),
        ("nan", nan, Abscissa::Pressure),
        ("vacuum", vacuum, Abscissa::Pressure),
    ] {
        let path = dir.join(format!("{name}.png"));
        let err = profile_plot(&path, &rows, "", abscissa).unwrap_err();
        assert!(matches!(err, Error::InvalidInput { .. }), "{name}: {err}");
        assert!(!path.exists(), "{name}: file written");
    }
    assert_eq!(std::fs::read_dir(&dir).unwrap().count(), 1);
    std::fs::remove_dir_all(&dir).unwrap();
}

#[test]
fn profile_table_reads_back() {
    let dir = scratch("read-profile");
    let path = dir.join("model.csv");
    let rows = polytrope_rows(21);
    // Written the way the profile output writes it: serde through the csv crate.
    let mut w = csv::Writer::from_path(&path).unwrap();
    for r in &rows {
        w.serialize(r).unwrap();
    }
    w.flush().unwrap();
    drop(w);
    let header = std::fs::read_to_string(&path).unwrap();
    assert!(header.starts_with("mass_g,m_over_M,radius_cm,r_over_R,pressure_dyn_cm2,"));
    match read_table(&path).unwrap() {
        PlotInput::Profile(back) => assert_eq!(back, rows),
        other => panic!("read as {other:?}"),
    }
    std::fs::remove_dir_all(&dir).unwrap();
}

#[test]
fn sequence_table_groups_by_variant_and_skips_failures() {
    let dir = scratch("read-sequence");
    let path = dir.join("grid.csv");
    std::fs::write(
        &path,
        "variant,mass_msun,radius_rsun,luminosity_lsun,teff_k,status\n\
         base,1,0.9,0.7,5600,converged\n\
         hot,1,0.95,0.5,5300,converged\n\
         base,2,1.6,16,9000,converged\n\
         base,3,,,,no convergence after 40 iterations\n\
         hot,2,1.7,12,8400,converged\n\
         hot,5,,,,converged\n",
    )
    .unwrap();
    let PlotInput::Sequence(series) = read_table(&path).unwrap() else {
        panic!("not a sequence");
    };
    assert_eq!(series.len(), 2);
    assert_eq!(series[0].label, "base");
    assert_eq!(series[1].label, "hot");
    assert_eq!(
        series[0].points,
        [
            HrPoint {
                mass_msun: 1.0,
                teff_k: 5600.0,
                luminosity_lsun: 0.7
            },
            HrPoint {
                mass_msun: 2.0,
                teff_k: 9000.0,
                luminosity_lsun: 16.0
            }
        ]
    );
    assert_eq!(series[1].points.len(), 2);

    // Without a variant column: one series named after the file.
    let plain = dir.join("zams-line.csv");
    std::fs::write(
        &plain,
        "mass_msun,teff_k,luminosity_lsun\n1,5600,0.7\n10,25000,5000\n",
    )
    .unwrap();
    let PlotInput::Sequence(series) = read_table(&plain).unwrap() else {
        panic!("not a sequence");
    };
    assert_eq!(series.len(), 1);
    assert_eq!(series[0].label, "zams-line");
    assert_eq!(series[0].points.len(), 2);
    // And it draws.
    hr_diagram(&dir.join("zams-line.svg"), &series, "").unwrap();
    std::fs::remove_dir_all(&dir).unwrap();
}

#[test]
fn bad_tables_name_file_and_line() {
    let dir = scratch("read-bad");
    let cases = [
        ("unknown.csv", "a,b,c\n1,2,3\n", "line 1"),
        (
            "number.csv",
            "mass_msun,teff_k,luminosity_lsun\n1,5600,0.7\n2,hot,16\n",
            "line 3",
        ),
        (
            "negative.csv",
            "mass_msun,teff_k,luminosity_lsun\n1,-5600,0.7\n",
            "line 2",
        ),
        (
            "ragged.csv",
            "mass_msun,teff_k,luminosity_lsun\n1,5600\n",
            "line 2",
        ),
        (
            "none.csv",
            "mass_msun,teff_k,luminosity_lsun,status\n1,5600,0.7,failed\n",
            "no row",
        ),
        (
            "short-profile.csv",
            "mass_g,m_over_M,r_over_R\n1,2,3\n",
            "line 1",
        ),
    ];
    for (name, text, wanted) in cases {
        let path = dir.join(name);
        std::fs::write(&path, text).unwrap();
        let err = read_table(&path).unwrap_err();
        let Error::BadFile { path: p, reason } = &err else {
            panic!("{name}: {err:?}");
        };
        assert!(p.ends_with(name), "{name}: path {p}");
        assert!(reason.contains(wanted), "{name}: {reason}");
    }
    // A profile row that does not parse.
    let columns = starpoise::structure::PROFILE_COLUMNS;
    let mut text = columns.join(",");
    text.push('\n');
    text.push_str(&vec!["1"; columns.len()].join(","));
    text.push('\n');
    text.push_str(&vec!["x"; columns.len()].join(","));
    text.push('\n');
    let path = dir.join("broken-profile.csv");
    std::fs::write(&path, text).unwrap();
    let err = read_table(&path).unwrap_err();
    assert!(
        matches!(&err, Error::BadFile { reason, .. } if reason.contains("line 3")),
        "{err}"
    );
    let err = read_table(&dir.join("absent.csv")).unwrap_err();
    assert!(matches!(err, Error::BadFile { .. }), "{err}");
    std::fs::remove_dir_all(&dir).unwrap();
}

#[test]
fn overlapping_mass_labels_are_left_out() {
    // Two models a hair apart land on the same pixel: only the rounder one is labelled.
    let series = HrSeries {
        label: "close".into(),
        points: vec![
            HrPoint {
                mass_msun: 1.0,
                teff_k: 5772.0,
                luminosity_lsun: 1.0,
            },
            HrPoint {
                mass_msun: 1.003,
                teff_k: 5772.5,
                luminosity_lsun: 1.001,
            },
            HrPoint {
                mass_msun: 10.0,
                teff_k: 25000.0,
                luminosity_lsun: 5000.0,
            },
        ],
    };
    let (figure, _) = svg_hr(&[series], "");
    assert_eq!(figure.layout.mass_labels[0], ["1", "10"]);
}

/// An invented ZAMS-like sequence from 0.1 to 100 M_sun, `count` masses log-spaced (the
/// decades 0.1, 1, 10 and 100 among them when count - 1 is a multiple of 3): L = M^4 below
/// 1 M_sun and M^3 above, R = M^0.8, scaled by `l_scale`.
fn zams_like(label: &str, count: usize, l_scale: f64) -> HrSeries {
    HrSeries {
        label: label.to_string(),
        points: (0..count)
            .map(|i| {
                let m = 10f64.powf(-1.0 + 3.0 * i as f64 / (count - 1) as f64);
                let l = l_scale * if m < 1.0 { m.powi(4) } else { m.powi(3) };
                let r = m.powf(0.8);
                HrPoint {
                    mass_msun: m,
                    teff_k: 5772.0 * (l / (r * r)).powf(0.25),
                    luminosity_lsun: l,
                }
            })
            .collect(),
    }
}

/// Every label lies inside the plotting area, overlaps no marker (the Sun's included), no
/// other label and not the legend, and sits within the outer ring of places around what it
/// names (12 px gap, see `placement.rs`).
fn assert_labels_collide_with_nothing(figure: &HrFigure) {
    let layout = &figure.layout;
    assert!(!layout.labels.is_empty());
    for (i, label) in layout.labels.iter().enumerate() {
        let b = label.placement.bbox;
        assert!(
            layout.plot_area_px.contains(&b),
            "{} outside: {b:?}",
            label.text
        );
        assert!(
            !b.overlaps(&layout.legend_px),
            "{} on the legend",
            label.text
        );
        for m in &layout.markers_px {
            assert!(!b.overlaps(m), "{} at {b:?} on marker {m:?}", label.text);
        }
        for other in &layout.labels[i + 1..] {
            assert!(
                !b.overlaps(&other.placement.bbox),
                "{} and {} overlap",
                label.text,
                other.text
            );
        }
        // Gap between the label box and the anchor's marker box (half-size 7 px).
        let (x, y) = label.anchor_px;
        let gap_x = (b.left - (x + 7)).max((x - 7) - b.right).max(0);
        let gap_y = (b.top - (y + 7)).max((y - 7) - b.bottom).max(0);
        assert!(
            gap_x <= 12 && gap_y <= 12,
            "{} is {gap_x}, {gap_y} px away",
            label.text
        );
        // The box is the text's own size in the embedded font.
        let (w, h) = starpoise::output::plot::text_box_px(&label.text, 17.0).unwrap();
        assert_eq!(
            (b.right - b.left, b.bottom - b.top),
            (w, h),
            "{}",
            label.text
        );
    }
}

/// The Sun's label of a diagram.
fn sun_label(layout: &HrLayout) -> &PlacedLabel {
    layout
        .labels
        .iter()
        .find(|l| l.text == SUN_LABEL)
        .expect("a Sun label")
}

#[test]
fn sun_is_marked_at_the_nominal_point() {
    let mut series = zams_like("demo", 25, 0.7);
    // An invented model exactly at the Sun's nominal place lands on the symbol's centre.
    series.points.push(HrPoint {
        mass_msun: 1.1,
        teff_k: 5772.0,
        luminosity_lsun: 1.0,
    });
    let (figure, svg) = svg_hr(&[series], "");
    let sun = figure.layout.sun_px;
    assert_eq!(*figure.layout.points_px[0].last().unwrap(), sun);
    // SVG: the dot of ⊙ is a small filled black circle, the ring an orange (Okabe–Ito
    // #E69F00) outline, both centred on the Sun; the label says "Sun".
    assert!(circles(&svg, "#000000").contains(&sun), "no dot at {sun:?}");
    let ring = svg.split("<circle").skip(1).any(|c| {
        c.contains(&format!("cx=\"{}\" cy=\"{}\"", sun.0, sun.1)) && c.contains("#E69F00")
    });
    assert!(ring, "no orange ring at {sun:?}");
    assert_eq!(sun_label(&figure.layout).anchor_px, sun);
    assert!(figure
        .layout
        .markers_px
        .iter()
        .any(|m| m.contains_point(sun)));

    // PNG: the same places; the dot is black, the ring orange, and the label's box holds
    // dark text pixels set in the embedded font.
    let series = [zams_like("demo", 25, 0.7)];
    let png = render_hr_diagram(&series, "", ImageFormat::Png).unwrap();
    let (width, height, rgb) = decode_png(&png.image);
    assert_eq!((width, height), (HR_WIDTH_PX, HR_HEIGHT_PX));
    let sun = png.layout.sun_px;
    assert_eq!(pixel(&rgb, width, sun), [0, 0, 0]);
    let orange = (sun.0 + 3..=sun.0 + 8).any(|x| {
        let [r, g, b] = pixel(&rgb, width, (x, sun.1));
        r > 200 && g > 120 && g < 200 && b < 60
    });
    assert!(orange, "no orange ring right of {sun:?}");
    let b = sun_label(&png.layout).placement.bbox;
    let dark = (b.left..=b.right)
        .flat_map(|x| (b.top..=b.bottom).map(move |y| (x, y)))
        .filter(|&p| pixel(&rgb, width, p).iter().all(|&c| c < 100))
        .count();
    assert!(dark >= 20, "only {dark} dark pixels in the label box {b:?}");
}

#[test]
fn round_masses_are_labelled_clear_of_markers_and_each_other() {
    let one = [zams_like("one", 40, 1.0)];
    let (figure, _) = svg_hr(&one, "ZAMS");
    assert_labels_collide_with_nothing(&figure);
    for round in ["0.1", "1", "10", "100"] {
        assert!(
            figure.layout.mass_labels[0].iter().any(|l| l == round),
            "{round} missing: {:?}",
            figure.layout.mass_labels[0]
        );
    }
    // One sequence leaves room off the line for every label.
    assert!(figure.layout.labels.iter().all(|l| !l.placement.over_line));

    // Three close sequences: still no collision, and every decade labelled at least once.
    let three = [
        zams_like("a", 25, 1.0),
        zams_like("b", 25, 0.7),
        zams_like("c", 25, 0.5),
    ];
    let (figure, _) = svg_hr(&three, "ZAMS");
    assert_labels_collide_with_nothing(&figure);
    for round in ["0.1", "1", "10", "100"] {
        assert!(
            figure.layout.labels.iter().any(|l| l.text == round),
            "{round} missing"
        );
    }
    assert!(figure.layout.labels.iter().any(|l| l.text == SUN_LABEL));
}

#[test]
fn png_and_svg_put_everything_at_the_same_pixels() {
    let series = [zams_like("a", 25, 1.0), zams_like("b", 25, 0.6)];
    let svg = render_hr_diagram(&series, "Demo", ImageFormat::Svg).unwrap();
    let png = render_hr_diagram(&series, "Demo", ImageFormat::Png).unwrap();
    assert_eq!(svg.layout, png.layout);
    assert_labels_collide_with_nothing(&png);
    let rows = polytrope_rows(101);
    for abscissa in Abscissa::ALL {
        let svg = render_profile(&rows, "Demo", abscissa, ImageFormat::Svg).unwrap();
        let png = render_profile(&rows, "Demo", abscissa, ImageFormat::Png).unwrap();
        assert_eq!(svg.layout, png.layout);
        let (width, height, _) = decode_png(&png.image);
        assert_eq!((width, height), (PROFILE_WIDTH_PX, PROFILE_HEIGHT_PX));
    }
}

#[test]
fn figure_format_follows_the_extension() {
    let dir = scratch("formats");
    let rows = polytrope_rows(51);
    for name in ["hr.svg", "hr.png", "HR.PNG", "profile.svg", "profile.png"] {
        let path = dir.join(name);
        if name.starts_with("profile") {
            profile_plot(&path, &rows, "", Abscissa::Mass).unwrap();
        } else {
            hr_diagram(&path, &demo_series(), "").unwrap();
        }
        let bytes = std::fs::read(&path).unwrap();
        if name.to_ascii_lowercase().ends_with(".png") {
            let (w, h, _) = decode_png(&bytes);
            let expected = if name.starts_with("profile") {
                (PROFILE_WIDTH_PX, PROFILE_HEIGHT_PX)
            } else {
                (HR_WIDTH_PX, HR_HEIGHT_PX)
            };
            assert_eq!((w, h), expected, "{name}");
        } else {
            assert!(bytes.starts_with(b"<svg"), "{name} is not SVG");
        }
    }
    for name in ["hr.pdf", "hr", "hr.svgz", "hr.jpg"] {
        let path = dir.join(name);
        for err in [
            hr_diagram(&path, &demo_series(), "").unwrap_err(),
            profile_plot(&path, &rows, "", Abscissa::Radius).unwrap_err(),
        ] {
            assert_eq!(
                err.exit_code(),
                starpoise::error::ExitCode::BadInput,
                "{name}: {err}"
            );
            let text = err.to_string();
            assert!(
                text.contains(name) && text.contains(".svg") && text.contains(".png"),
                "{text}"
            );
        }
        assert!(!path.exists(), "{name} written");
    }
    assert_eq!(std::fs::read_dir(&dir).unwrap().count(), 5);
    std::fs::remove_dir_all(&dir).unwrap();
}

#[test]
fn profile_takes_radius_mass_or_pressure_as_abscissa() {
    let rows = polytrope_rows(201);
    let log_p = |i: usize| rows[i].pressure_dyn_cm2.log10();
    let n = rows.len() - 1;
    for abscissa in Abscissa::ALL {
        let (figure, svg) = svg_profile(&rows, "", abscissa);
        let layout = &figure.layout;
        let texts = svg_texts(&svg);
        assert!(
            texts.iter().any(|t| t == abscissa.axis_label()),
            "{abscissa}: no axis label"
        );
        let expected_range = match abscissa {
            Abscissa::Radius | Abscissa::Mass => (0.0, 1.0),
            Abscissa::Pressure => (log_p(0), log_p(n)),
        };
        assert_eq!(layout.x_range, expected_range, "{abscissa}");
        // The quantity on the x axis is not drawn again as a curve; P/P_c is left out on the
        // pressure axis, where it would only repeat the axis.
        let curves = &layout.upper_curves;
        assert_eq!(
            curves.contains(&"r / R"),
            abscissa != Abscissa::Radius,
            "{curves:?}"
        );
        assert_eq!(
            curves.contains(&"m / M"),
            abscissa != Abscissa::Mass,
            "{curves:?}"
        );
        assert_eq!(
            curves.contains(&"P / P_c"),
            abscissa != Abscissa::Pressure,
            "{curves:?}"
        );
        // Core (r/R < 0.15) and envelope (r/R > 0.85), in the abscissa's own values: the
        // core starts at the first row and the envelope ends at the last.
        let bands = &layout.convective_bands;
        assert_eq!(bands.len(), 2, "{abscissa}: {bands:?}");
        let first = abscissa.value(&rows[0]);
        let last = abscissa.value(&rows[n]);
        assert_eq!(bands[0].0, first, "{abscissa}");
        assert_eq!(bands[1].1, last, "{abscissa}");
        // The core's outer edge lies between the rows at r/R = 0.145 and 0.155 (0.005 apart).
        let (lo, hi) = (
            abscissa.value(&rows[29]).min(abscissa.value(&rows[31])),
            abscissa.value(&rows[29]).max(abscissa.value(&rows[31])),
        );
        assert!(
            bands[0].1 >= lo && bands[0].1 <= hi,
            "{abscissa}: {bands:?}"
        );
    }
    // On the pressure axis the log P ticks are whole decades.
    let (_, svg) = svg_profile(&rows, "", Abscissa::Pressure);
    let texts = svg_texts(&svg);
    for tick in ["16", "10", "6"] {
        assert!(texts.iter().any(|t| t == tick), "no tick {tick}: {texts:?}");
    }
}

#[test]
fn decades_between_models_are_ticked_on_the_line_and_labelled() {
    // 60 invented masses log-spaced from 0.08 to 150 M_sun: no model at 0.1, 1, 10 or 100.
    let masses: Vec<f64> = (0..60)
        .map(|i| 0.08 * (150.0_f64 / 0.08).powf(i as f64 / 59.0))
        .collect();
    let series = HrSeries {
        label: "dense".into(),
        points: power_law("dense", &masses, 3.5, 0.8).points,
    };
    let (figure, _) = svg_hr(&[series], "");
    assert_labels_collide_with_nothing(&figure);
    let px = &figure.layout.points_px[0];
    for decade in ["0.1", "1", "10", "100"] {
        let label = figure
            .layout
            .labels
            .iter()
            .find(|l| l.text == decade)
            .unwrap_or_else(|| panic!("{decade} missing"));
        assert!(label.interpolated, "{decade}");
        // The tick lies on the drawn segment between the two neighbouring models (within
        // the rounding of pixel coordinates).
        let m: f64 = decade.parse().unwrap();
        let below = masses.iter().rposition(|&x| x < m).unwrap();
        let (a, b) = (px[below], px[below + 1]);
        let (p, q) = (label.anchor_px, (b.0 - a.0, b.1 - a.1));
        let cross = f64::from((p.0 - a.0) * q.1 - (p.1 - a.1) * q.0);
        let distance = cross.abs() / f64::from(q.0).hypot(f64::from(q.1));
        assert!(distance <= 1.5, "{decade}: {distance} px off the line");
        let inside = |v: i32, e0: i32, e1: i32| v >= e0.min(e1) - 1 && v <= e0.max(e1) + 1;
        assert!(
            inside(p.0, a.0, b.0) && inside(p.1, a.1, b.1),
            "{decade} off the segment"
        );
        // Its tick is a mark the labels avoid.
        assert!(figure.layout.markers_px.iter().any(|b| b.contains_point(p)));
    }
    // With the decades labelled, masses that are not round (0.117 ...) are not: only the
    // decades, the two ends and the Sun.
    let mut texts: Vec<&str> = figure
        .layout
        .labels
        .iter()
        .map(|l| l.text.as_str())
        .collect();
    texts.sort_unstable();
    assert_eq!(texts, ["0.08", "0.1", "1", "10", "100", "150", SUN_LABEL]);
}
