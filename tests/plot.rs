//! Figures: the HR diagram and the profile figure are valid SVG with the promised labels,
//! temperature increases to the left, bad input leaves no file, and saved tables read back.
//!
//! All data here is invented demo data built in the tests (power laws, an n = 1 polytrope
//! shape); no number is a physical result, so no published source applies. What is checked is
//! the drawing, not the physics.

use starpoise::output::plot::{
    format_mass, hr_diagram, profile_plot, read_table, render_hr_diagram, render_profile, HrPoint,
    HrSeries, PlotInput, MAX_MASS_LABELS, NABLA_AXIS_CAP,
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
/// P/P_c = theta^2, T/T_c = theta, m/M = (sin xi - xi cos xi)/pi, L/L_s = m/M; a made-up
/// nabla_rad that exceeds nabla_ad = 0.4 inside r/R = 0.15 and outside r/R = 0.85 and grows to
/// 5 at the surface.
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
                pressure_dyn_cm2: 1e17 * theta * theta,
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

#[test]
fn hr_diagram_has_labels_legend_and_masses() {
    let figure = render_hr_diagram(&demo_series(), "Demo").unwrap();
    assert!(figure.svg.starts_with("<svg"));
    assert!(figure.svg.trim_end().ends_with("</svg>"));
    let texts = svg_texts(&figure.svg);
    for wanted in [
        "Demo",
        "log10 T_eff / K",
        "log10 L / L_sun",
        "steep demo",
        "shallow demo",
    ] {
        assert!(texts.iter().any(|t| t == wanted), "no text '{wanted}'");
    }
    for mass in ["0.5", "1", "2", "5", "10", "20"] {
        let count = texts.iter().filter(|t| *t == mass).count();
        assert!(
            count >= 2,
            "mass label {mass} appears {count} times, want one per series"
        );
    }
    assert_eq!(figure.mass_labels[0], ["0.5", "1", "2", "5", "10", "20"]);
}

#[test]
fn hr_temperature_increases_to_the_left_and_luminosity_upwards() {
    let series = demo_series();
    let figure = render_hr_diagram(&series, "").unwrap();
    for (s, px) in series.iter().zip(&figure.points_px) {
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
    let drawn = circles(&figure.svg, "#000000");
    for p in &figure.points_px[0] {
        assert!(drawn.contains(p), "no circle at {p:?}; circles: {drawn:?}");
    }
}

#[test]
fn crowded_series_is_thinned_to_round_masses() {
    let masses: Vec<f64> = (0..40)
        .map(|i| 10f64.powf(-1.0 + 3.0 * i as f64 / 39.0))
        .collect();
    let figure = render_hr_diagram(&[power_law("dense", &masses, 3.5, 0.8)], "").unwrap();
    let labels = &figure.mass_labels[0];
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

    let err = hr_diagram(&dir.join("missing/hr.svg"), &demo_series(), "").unwrap_err();
    assert!(matches!(err, Error::Io { .. }), "{err}");
    std::fs::remove_dir_all(&dir).unwrap();
}

#[test]
fn profile_figure_has_both_panels_and_shading() {
    let rows = polytrope_rows(201);
    let figure = render_profile(&rows, "Demo profile").unwrap();
    assert!(figure.svg.starts_with("<svg"));
    let texts = svg_texts(&figure.svg);
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
    let shaded = figure.svg.matches("fill=\"#DEDEDE\"").count();
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
    let figure = render_profile(&rows, "").unwrap();
    assert!(!figure.nabla_clipped);
    // Axis top 8 % above the largest gradient, nabla_ad = 0.4; tolerance for rounding only.
    assert!((figure.nabla_axis_top - 0.432).abs() < 1e-12);
    assert!(figure.convective_bands.is_empty());
    assert!(!svg_texts(&figure.svg).iter().any(|t| t == "convective"));
}

#[test]
fn profile_file_is_written_and_bad_input_leaves_none() {
    let dir = scratch("profile");
    let good = dir.join("profile.svg");
    profile_plot(&good, &polytrope_rows(101), "").unwrap();
    assert!(std::fs::read_to_string(&good).unwrap().starts_with("<svg"));

    let one_row = polytrope_rows(2)[..1].to_vec();
    let mut cold = polytrope_rows(11);
    cold[0].temperature_k = 0.0;
    let mut nan = polytrope_rows(11);
    nan[4].density_g_cm3 = f64::NAN;
    for (name, rows) in [
        ("empty", vec![]),
        ("one", one_row),
        ("cold", cold),
        ("nan", nan),
    ] {
        let path = dir.join(format!("{name}.svg"));
        let err = profile_plot(&path, &rows, "").unwrap_err();
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
    let mut text = starpoise::structure::PROFILE_COLUMNS.join(",");
    text.push('\n');
    text.push_str(&["1"; 20].join(","));
    text.push('\n');
    text.push_str(&["x"; 20].join(","));
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
    let figure = render_hr_diagram(&[series], "").unwrap();
    assert_eq!(figure.mass_labels[0], ["1", "10"]);
}
