//! The `table:PATH` opacity: round trip against the laws it was made from, the shipped demo
//! table, and every malformed-table error.

use starpoise::error::{Error, PhysicsError};
use starpoise::physics::opacity::table::tabulate;
use starpoise::physics::opacity::{ElectronScattering, Kramers, Opacity, TableOpacity};
use starpoise::physics::Composition;
use std::path::Path;

/// kramers (guillotine 1) + electron-scattering: the law the demo table is made from.
#[derive(Debug)]
struct KramersPlusScattering;

impl Opacity for KramersPlusScattering {
    fn name(&self) -> String {
        "kramers+electron-scattering".into()
    }
    fn kappa(&self, rho: f64, t: f64, c: &Composition) -> Result<f64, PhysicsError> {
        Ok(Kramers::default().kappa(rho, t, c)? + ElectronScattering.kappa(rho, t, c)?)
    }
}

fn solar() -> Composition {
    Composition::new(0.70, 0.02).unwrap()
}

fn demo_grid() -> (Vec<f64>, Vec<f64>) {
    let t: Vec<f64> = (35..=85).map(|k| k as f64 / 10.0).collect();
    let r: Vec<f64> = (-16..=2).map(|k| k as f64 / 2.0).collect();
    (t, r)
}

const DEMO_COMMENT: &str = "starpoise demo opacity table: INVENTED DEMO DATA, not a physical opacity table.\n\
Generated from the analytic laws kramers (guillotine 1) + electron-scattering for X = 0.70, Z = 0.02\n\
by the ignored test `regenerate_demo_table` in tests/opacity_table.rs.\n\
R = rho / T6^3 with rho in g/cm^3 and T6 = T / 1e6 K; kappa in cm^2/g.";

/// Rewrite models/demo-opacity.csv (run with `cargo test --test opacity_table -- --ignored`).
#[test]
#[ignore]
fn regenerate_demo_table() {
    let (t, r) = demo_grid();
    let text = tabulate(&KramersPlusScattering, &solar(), &t, &r, DEMO_COMMENT).unwrap();
    std::fs::write(
        Path::new(env!("CARGO_MANIFEST_DIR")).join("models/demo-opacity.csv"),
        text,
    )
    .unwrap();
}

/// The shipped demo table is exactly what its generator writes (it can be rebuilt).
#[test]
fn shipped_demo_table_is_reproducible() {
    let (t, r) = demo_grid();
    let text = tabulate(&KramersPlusScattering, &solar(), &t, &r, DEMO_COMMENT).unwrap();
    let path = Path::new(env!("CARGO_MANIFEST_DIR")).join("models/demo-opacity.csv");
    let shipped = std::fs::read_to_string(&path).unwrap();
    assert_eq!(shipped, text);
    let table = TableOpacity::from_file(&path, false).unwrap();
    assert_eq!(table.log10_t_range(), (3.5, 8.5));
    assert_eq!(table.log10_r_range(), (-8.0, 1.0));
}

/// A table made from kramers + electron-scattering reproduces them off the grid nodes to
/// interpolation accuracy: grid 0.1 dex in T and 0.5 dex in R; the Steffen cubic has error
/// O(h^3 y''') ~ 0.5^3 * (curvature of log(a + b R) ~ 0.3) ~ 1e-2 dex at worst, so 1.5 per
/// cent in kappa; at the nodes it is exact to the 1e-10 printed digits.
#[test]
fn table_reproduces_its_laws() {
    let (t, r) = demo_grid();
    let c = solar();
    let text = tabulate(&KramersPlusScattering, &c, &t, &r, "test").unwrap();
    let table = TableOpacity::from_csv(&text, "memory", false).unwrap();
    let mut worst: f64 = 0.0;
    let mut lt = 3.53;
    while lt < 8.5 {
        let mut lr = -7.9;
        while lr < 1.0 {
            let temp = 10f64.powf(lt);
            let rho = 10f64.powf(lr + 3.0 * (lt - 6.0));
            let want = KramersPlusScattering.kappa(rho, temp, &c).unwrap();
            let got = table.kappa(rho, temp, &c).unwrap();
            worst = worst.max((got / want - 1.0).abs());
            lr += 0.37;
        }
        lt += 0.117;
    }
    assert!(worst < 0.015, "worst relative error {worst}");
    // On the nodes.
    let temp = 1e5;
    let rho = 10f64.powf(-2.0 + 3.0 * (5.0 - 6.0));
    let want = KramersPlusScattering.kappa(rho, temp, &c).unwrap();
    assert!((table.kappa(rho, temp, &c).unwrap() / want - 1.0).abs() < 1e-9);
}

/// Outside the grid: an error naming the point and the range; with clamping the edge value.
#[test]
fn outside_the_table() {
    let (t, r) = demo_grid();
    let c = solar();
    let text = tabulate(&KramersPlusScattering, &c, &t, &r, "test").unwrap();
    let table = TableOpacity::from_csv(&text, "demo.csv", false).unwrap();
    let err = table.kappa(1e-3, 1e3, &c).unwrap_err();
    assert!(err.reason.contains("log10_T = 3.0000"), "{}", err.reason);
    assert!(err.reason.contains("log10_T 3.5..8.5"), "{}", err.reason);
    assert!(err.law.contains("demo.csv"));
    let clamped = TableOpacity::from_csv(&text, "demo.csv", true).unwrap();
    let edge = clamped.kappa(1e-3, 10f64.powf(3.5), &c).unwrap();
    assert!(clamped.kappa(1e-3 * 1e-4, 1e3, &c).unwrap() > 0.0);
    assert!(edge > 0.0);
    assert!(table.kappa(f64::NAN, 1e5, &c).is_err());
}

fn parse_error(text: &str) -> String {
    match TableOpacity::from_csv(text, "bad.csv", false) {
        Err(Error::BadFile { path, reason }) => {
            assert_eq!(path, "bad.csv");
            reason
        }
        other => panic!("expected BadFile, got {other:?}"),
    }
}

const H: &str = "log10_T,log10_R,log10_kappa\n";

/// Every malformed table is refused with the file name and the offending line.
#[test]
fn malformed_tables_are_refused() {
    let good = format!("# c\n{H}4,-3,0.1\n4,-2,0.2\n5,-3,0.3\n5,-2,0.4\n");
    assert!(TableOpacity::from_csv(&good, "ok.csv", false).is_ok());
    let cases: [(&str, String, &str); 12] = [
        (
            "wrong header",
            "T,R,kappa\n4,-3,0.1\n".into(),
            "line 1: expected the header",
        ),
        ("no header", "# only a comment\n".into(), "no header"),
        (
            "ragged",
            format!("{H}4,-3,0.1\n4,-2\n"),
            "line 3: expected 3",
        ),
        ("too many", format!("{H}4,-3,0.1,7\n"), "line 2: expected 3"),
        (
            "non-numeric",
            format!("{H}4,-3,0.1\n4,abc,0.2\n"),
            "line 3: log10_R value `abc`",
        ),
        (
            "nan",
            format!("{H}4,-3,NaN\n"),
            "line 2: log10_kappa value `NaN`",
        ),
        (
            "unsorted T",
            format!("{H}5,-3,0.1\n5,-2,0.2\n4,-3,0.3\n4,-2,0.4\n"),
            "line 4: log10_T 4 is smaller",
        ),
        (
            "unsorted R",
            format!("{H}4,-2,0.1\n4,-3,0.2\n"),
            "line 3: log10_R -3 is smaller",
        ),
        (
            "duplicate",
            format!("{H}4,-3,0.1\n4,-3,0.2\n"),
            "line 3: duplicates the grid point",
        ),
        (
            "short block",
            format!("{H}4,-3,0.1\n4,-2,0.2\n5,-3,0.3\n6,-3,0.4\n"),
            "line 5: the block log10_T = 5 has 1 rows",
        ),
        (
            "off-grid R",
            format!("{H}4,-3,0.1\n4,-2,0.2\n5,-3,0.3\n5,-1,0.4\n"),
            "line 5: log10_R -1 is not on the grid",
        ),
        (
            "one T",
            format!("{H}4,-3,0.1\n4,-2,0.2\n"),
            "at least 2 of each",
        ),
    ];
    for (what, text, want) in cases {
        let reason = parse_error(&text);
        assert!(reason.contains(want), "{what}: {reason}");
    }
    // A short last block.
    let reason = parse_error(&format!("{H}4,-3,0.1\n4,-2,0.2\n5,-3,0.3\n"));
    assert!(reason.contains("the last block has 1 rows"), "{reason}");
    // A missing file names the file.
    match TableOpacity::from_file(Path::new("/nonexistent/table.csv"), false) {
        Err(Error::BadFile { path, .. }) => assert!(path.contains("table.csv")),
        other => panic!("{other:?}"),
    }
}
