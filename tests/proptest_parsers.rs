//! Property tests of every parser of user input: arbitrary text never panics, and what is
//! accepted obeys the documented limits; arbitrary valid opacity tables give a finite, positive
//! kappa everywhere (inside, and clamped outside); every finite double written to JSON, CSV or
//! ECSV text reads back to the same bits.

use proptest::prelude::*;
use starpoise::grid::fits::parse_ranges;
use starpoise::grid::{parse_value_list, Shard, Variant, MAX_LIST_VALUES};
use starpoise::output::meta::Meta;
use starpoise::output::tabular::{format_number, read_ecsv, Cell};
use starpoise::physics::opacity::table::{
    LOG10_KAPPA_RANGE, LOG10_R_RANGE, LOG10_T_RANGE, MIN_AXIS_STEP,
};
use starpoise::physics::opacity::{Opacity, TableOpacity};
use starpoise::physics::spec::OVERRIDE_KEYS;
use starpoise::physics::{
    AtmosphereSpec, Composition, ConvectionSpec, EosSpec, OpacitySpec, PhysicsOverrides, Preset,
    RatesSpec,
};

/// Text that looks like the inputs: digits, separators, signs, letters of the law names, and
/// anything else now and then.
fn texty() -> impl Strategy<Value = String> {
    prop_oneof![
        "[0-9eE.,:;=+\\-/ a-z]{0,40}",
        "[0-9]{1,25}:[0-9]{1,25}:[0-9]{1,25}(:log|:lin)?",
        "\\PC{0,40}",
    ]
}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(2000))]

    #[test]
    fn value_lists_never_panic_and_respect_their_limits(text in texty()) {
        if let Ok(values) = parse_value_list("--masses", &text) {
            prop_assert!(!values.is_empty() && values.len() <= MAX_LIST_VALUES);
            prop_assert!(values.iter().all(|v| v.is_finite()));
            let mut sorted = values.clone();
            sorted.sort_by(f64::total_cmp);
            prop_assert!(sorted.windows(2).all(|w| w[0] != w[1]));
        }
    }

    #[test]
    fn shards_never_panic(text in texty()) {
        if let Ok(s) = Shard::parse(&text) {
            prop_assert!(1 <= s.k && s.k <= s.n);
        }
    }

    #[test]
    fn variants_fit_ranges_and_overrides_never_panic(text in texty(), key in 0usize..9) {
        let _ = Variant::parse(&text);
        let _ = Variant::parse(&format!("v={text}"));
        if let Ok(ranges) = parse_ranges(&text) {
            prop_assert!(ranges.iter().all(|&(a, b)| a > 0.0 && b > a && b.is_finite()));
        }
        let mut o = PhysicsOverrides::default();
        let _ = o.set(OVERRIDE_KEYS[key], &text);
        let _ = o.resolve();
    }

    #[test]
    fn law_specs_never_panic(text in texty()) {
        let _ = text.parse::<Preset>();
        let _ = text.parse::<EosSpec>();
        let _ = text.parse::<OpacitySpec>();
        let _ = text.parse::<RatesSpec>();
        let _ = text.parse::<ConvectionSpec>();
        let _ = text.parse::<AtmosphereSpec>();
        let _ = serde_json::from_str::<PhysicsOverrides>(&text);
    }

    #[test]
    fn tables_ecsv_and_comment_lines_never_panic(text in "\\PC{0,200}", line in texty()) {
        let _ = TableOpacity::from_csv(&text, "memory", true);
        let with_header = format!("log10_T,log10_R,log10_kappa\n{line}\n{text}");
        if let Ok(t) = TableOpacity::from_csv(&with_header, "memory", true) {
            let k = t.kappa(1.0, 1e6, &Composition::new(0.7, 0.02).unwrap());
            prop_assert!(k.is_ok_and(|k| k.is_finite() && k > 0.0));
        }
        let _ = read_ecsv(&text);
        let _ = read_ecsv(&format!("# %ECSV 1.0\n# ---\n{text}"));
        let _ = Meta::read_comment_lines(&text);
    }

    /// Every finite double written by the table writers reads back to the same bits (JSON
    /// through serde_json with float_roundtrip; CSV and ECSV through the standard parser).
    #[test]
    fn doubles_round_trip_through_text(bits in any::<u64>()) {
        let v = f64::from_bits(bits);
        prop_assume!(v.is_finite());
        let back: f64 = format_number(v).parse().unwrap();
        prop_assert_eq!(back.to_bits(), v.to_bits());
        let json = serde_json::to_string(&Cell::number(v).json()).unwrap();
        let back: f64 = serde_json::from_str(&json).unwrap();
        prop_assert_eq!(back.to_bits(), v.to_bits());
    }
}

/// A valid table: axes increasing with steps at least [`MIN_AXIS_STEP`] inside their ranges,
/// log10 kappa anywhere in its range (extremes included, to provoke overshoot).
fn valid_table() -> impl Strategy<Value = (Vec<f64>, Vec<f64>, Vec<f64>)> {
    let step = prop_oneof![MIN_AXIS_STEP..1e-3, 0.01f64..1.0];
    let axis = |lo: f64, hi: f64| {
        (lo..hi - 6.0, proptest::collection::vec(step.clone(), 1..6)).prop_map(|(start, steps)| {
            let mut v = vec![start];
            for s in steps {
                let last = *v.last().unwrap_or(&start);
                v.push(last + s);
            }
            v
        })
    };
    (
        axis(LOG10_T_RANGE.0, LOG10_T_RANGE.1),
        axis(LOG10_R_RANGE.0, LOG10_R_RANGE.1),
    )
        .prop_flat_map(|(t, r)| {
            let n = t.len() * r.len();
            let kappa = prop_oneof![
                LOG10_KAPPA_RANGE.0..LOG10_KAPPA_RANGE.1,
                Just(LOG10_KAPPA_RANGE.0),
                Just(LOG10_KAPPA_RANGE.1),
            ];
            (Just(t), Just(r), proptest::collection::vec(kappa, n))
        })
}

fn table_text(t: &[f64], r: &[f64], k: &[f64]) -> String {
    let mut text = String::from("log10_T,log10_R,log10_kappa\n");
    for (i, lt) in t.iter().enumerate() {
        for (j, lr) in r.iter().enumerate() {
            text.push_str(&format!("{lt},{lr},{}\n", k[i * r.len() + j]));
        }
    }
    text
}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(3000))]

    /// Inside the grid (unclamped) and anywhere (clamped), kappa is finite and positive and
    /// within the range the table's values allow, also times the largest opacity factor.
    #[test]
    fn valid_tables_give_finite_positive_kappa(
        (t, r, k) in valid_table(),
        ft in 0.0f64..1.0,
        fr in 0.0f64..1.0,
        log_rho in -300.0f64..300.0,
        log_temp in -300.0f64..300.0,
    ) {
        let text = table_text(&t, &r, &k);
        let comp = Composition::new(0.7, 0.02).unwrap();
        let table = TableOpacity::from_csv(&text, "memory", false).unwrap();
        let lt = t[0] + ft * (t[t.len() - 1] - t[0]);
        let lr = r[0] + fr * (r[r.len() - 1] - r[0]);
        let temp = 10f64.powf(lt);
        let rho = 10f64.powf(lr + 3.0 * (lt - 6.0));
        // Points whose rho or T themselves overflow are not points of the table.
        prop_assume!(rho.is_finite() && rho > 0.0 && temp.is_finite());
        if let Ok(kappa) = table.kappa(rho, temp, &comp) {
            prop_assert!(kappa.is_finite() && kappa > 0.0);
            prop_assert!((kappa * 1e6).is_finite());
            let (lo, hi) = LOG10_KAPPA_RANGE;
            prop_assert!(kappa.log10() >= lo - 1e-9 && kappa.log10() <= hi + 1e-9, "{kappa}");
        }
        let clamped = TableOpacity::from_csv(&text, "memory", true).unwrap();
        let kappa = clamped
            .kappa(10f64.powf(log_rho), 10f64.powf(log_temp), &comp)
            .map_err(|e| TestCaseError::fail(e.to_string()))?;
        prop_assert!(kappa.is_finite() && kappa > 0.0, "{kappa}");
    }
}
