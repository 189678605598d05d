//! Choosing laws: presets, overrides, factors, the one grammar both ways, the catalogue, and the
//! error messages.

use proptest::prelude::*;
use starpoise::error::Error;
use starpoise::physics::spec::{catalogue, grammar, LawKind, LawSpec};
use starpoise::physics::{
    AtmosphereSpec, ConvectionSpec, EosSpec, OpacitySpec, PhysicsOverrides, PhysicsSet,
    PhysicsSpec, Preset, RatesSpec,
};

/// Overrides from `KEY:VALUE;...` in the variant grammar.
fn with(text: &str) -> starpoise::Result<PhysicsSpec> {
    let mut o = PhysicsOverrides::default();
    for item in text.split(';').filter(|s| !s.is_empty()) {
        let (k, v) = item.split_once(':').unwrap_or((item, ""));
        o.set(k, v)?;
    }
    o.resolve()
}

fn invalid(text: &str) -> (String, String, String) {
    match with(text).and_then(|s| PhysicsSet::from_spec(&s)) {
        Err(Error::InvalidInput {
            name,
            value,
            allowed,
        }) => (name, value, allowed),
        other => panic!("{text}: expected InvalidInput, got {other:?}"),
    }
}

/// No preset means `refined`; each preset's set built through the fallible path has the same
/// laws as the preset constructor.
#[test]
fn presets() {
    let d = with("").unwrap();
    assert_eq!(d, Preset::Refined.spec());
    assert_eq!(d.preset.to_string(), "refined");
    assert_eq!(d.eos.to_string(), "molecular");
    assert_eq!(d.opacity.to_string(), "refined:guillotine=3,exponent=0.5");
    assert_eq!(d.rates.to_string(), "sfactor");
    assert_eq!(d.convection.to_string(), "mlt:alpha=2.4");
    assert_eq!(d.atmosphere.to_string(), "krishna-swamy");
    assert_eq!(with("preset:analytic").unwrap(), Preset::Analytic.spec());
    for (preset, set) in [
        (Preset::Refined, PhysicsSet::refined()),
        (Preset::Analytic, PhysicsSet::analytic()),
    ] {
        let built = PhysicsSet::from_spec(&preset.spec()).unwrap();
        assert_eq!(built.spec(), set.spec());
        assert_eq!(built.eos().name(), set.eos().name());
        assert_eq!(built.opacity().name(), set.opacity().name());
        assert_eq!(built.rates().name(), set.rates().name());
        assert_eq!(built.convection().name(), set.convection().name());
    }
    // A factor of 1 leaves the analytic set's laws unwrapped.
    let a1 = PhysicsSet::from_spec(&with("preset:analytic;opacity-factor:1").unwrap()).unwrap();
    assert_eq!(a1.opacity().name(), PhysicsSet::analytic().opacity().name());
}

/// Every law can be chosen by name, with parameters, and prints in the same grammar.
#[test]
fn overrides_by_name() {
    for eos in ["ideal", "saha", "degenerate", "refined", "molecular"] {
        let s = with(&format!("preset:analytic;eos:{eos}")).unwrap();
        assert_eq!(s.eos.to_string(), eos);
    }
    let table = concat!(env!("CARGO_MANIFEST_DIR"), "/models/demo-opacity.csv");
    for (kappa, want) in [
        ("electron-scattering", "electron-scattering".to_string()),
        ("kramers", "kramers:guillotine=1".to_string()),
        ("kramers:guillotine=30", "kramers:guillotine=30".to_string()),
        ("h-minus", "h-minus".to_string()),
        ("bell-lin", "bell-lin".to_string()),
        ("conductive", "conductive".to_string()),
        ("analytic", "analytic".to_string()),
        ("refined", "refined:guillotine=3,exponent=0.5".to_string()),
        (
            "refined:exponent=0,guillotine=10",
            "refined:guillotine=10,exponent=0".to_string(),
        ),
        (&format!("table:{table}"), format!("table:{table}")),
        (
            &format!("table-clamped:{table}"),
            format!("table-clamped:{table}"),
        ),
    ] {
        let s = with(&format!("opacity:{kappa}")).unwrap();
        assert_eq!(s.opacity.to_string(), want);
        PhysicsSet::from_spec(&s).unwrap();
    }
    let s = with("rates:power-law:eps0=0.1,t0=1.5e7,nu=4").unwrap();
    assert_eq!(s.rates.to_string(), "power-law:eps0=0.1,t0=15000000,nu=4");
    assert_eq!(
        with("convection:adiabatic").unwrap().convection,
        ConvectionSpec::Adiabatic
    );
    assert_eq!(
        with("preset:analytic;convection:mlt;alpha:2")
            .unwrap()
            .convection
            .to_string(),
        "mlt:alpha=2"
    );
    assert_eq!(
        with("alpha:1.5").unwrap().convection.to_string(),
        "mlt:alpha=1.5"
    );
    // What the JSON summary prints for convection is accepted back.
    assert_eq!(
        with("convection:mlt:alpha=2.4").unwrap(),
        Preset::Refined.spec()
    );
    for atmosphere in ["photosphere", "eddington", "hopf", "krishna-swamy"] {
        let s = with(&format!("atmosphere:{atmosphere}")).unwrap();
        assert_eq!(s.atmosphere.to_string(), atmosphere);
    }
    let s = with("opacity-factor:2;rates-factor:0.5").unwrap();
    assert_eq!((s.opacity_factor, s.rates_factor), (2.0, 0.5));
    assert_eq!(
        with("atmosphere:photosphere").unwrap().atmosphere,
        AtmosphereSpec::Photosphere
    );
}

/// Unknown names and bad parameters name the key, the value, and what is allowed.
#[test]
fn clear_errors() {
    let (n, v, a) = invalid("preset:fancy");
    assert_eq!((n.as_str(), v.as_str()), ("preset", "fancy"));
    assert!(a.contains("refined") && a.contains("analytic"), "{a}");
    let (n, _, a) = invalid("eos:vdw");
    assert_eq!(n, "eos");
    assert!(
        a.contains("ideal, saha, degenerate, refined, molecular"),
        "{a}"
    );
    let (n, _, a) = invalid("opacity:opal");
    assert_eq!(n, "opacity");
    assert!(a.contains("table:PATH") && a.contains("kramers"), "{a}");
    let (n, _, a) = invalid("opacity:kramers:gilotine=3");
    assert_eq!(n, "opacity");
    assert!(a.contains("no parameter 'gilotine'"), "{a}");
    let (n, _, a) = invalid("opacity:kramers:guillotine=-3");
    assert_eq!(n, "opacity");
    assert!(a.contains("guillotine = -3 is outside its range"), "{a}");
    assert_eq!(invalid("opacity:table:").0, "opacity");
    let (n, _, a) = invalid("rates:power-law:eps0=1,gamma=4");
    assert_eq!(n, "rates");
    assert!(
        a.contains("eps0") && a.contains("t0") && a.contains("nu"),
        "{a}"
    );
    let (n, _, a) = invalid("rates:cf88");
    assert_eq!(n, "rates");
    assert!(a.contains("sfactor"), "{a}");
    let (n, _, a) = invalid("convection:fast");
    assert_eq!(n, "convection");
    assert!(a.contains("adiabatic, mlt"), "{a}");
    assert_eq!(invalid("preset:analytic;alpha:2").0, "alpha");
    assert_eq!(invalid("alpha:-1").0, "alpha");
    assert_eq!(invalid("opacity-factor:0").0, "opacity_factor");
    assert_eq!(invalid("rates-factor:NaN").0, "rates_factor");
    assert_eq!(invalid("eos:ideal:x=1").0, "eos");
    assert_eq!(invalid("eos:external:mine").0, "eos");
    // A missing table file is a BadFile naming it.
    match PhysicsSet::from_spec(&with("opacity:table:/no/such/file.csv").unwrap()) {
        Err(Error::BadFile { path, .. }) => assert!(path.contains("file.csv")),
        other => panic!("{other:?}"),
    }
}

/// Unset power-law parameters take their documented defaults: t0 = 1.5e7 K, nu = 4, and eps0
/// the analytic pp rate per unit rho X^2 at t0 (2.38e6 T6^(-2/3) exp(-33.80 T6^(-1/3)),
/// Kippenhahn & Weigert 1990 §18.5, memory): at T = t0 the two laws agree exactly.
#[test]
fn power_law_defaults_match_the_analytic_pp_rate_at_t0() {
    use starpoise::physics::Composition;
    let set =
        PhysicsSet::from_spec(&with("preset:analytic;rates:power-law:nu=4").unwrap()).unwrap();
    let comp = Composition::new(0.7, 0.02).unwrap();
    let power = set.rates().rate(80.0, 1.5e7, &comp).unwrap();
    let pp = PhysicsSet::analytic()
        .rates()
        .rate(80.0, 1.5e7, &comp)
        .unwrap();
    assert!((power.eps_pp_erg_g_s / pp.eps_pp_erg_g_s - 1.0).abs() < 1e-12);
    assert_eq!(power.nu_pp, 4.0);
}

/// Every catalogue row parses from its name to a spec whose own row is that row, and prints
/// back to text that parses to the same spec: the enum arms, the catalogue and the grammar agree.
fn catalogue_agrees<S>()
where
    S: LawSpec + std::fmt::Display + std::str::FromStr + PartialEq + std::fmt::Debug,
    <S as std::str::FromStr>::Err: std::fmt::Debug,
{
    for entry in S::catalogue() {
        let text = if entry.reads_file {
            format!("{}:some/file.csv", entry.name)
        } else {
            entry.name.to_string()
        };
        let spec: S = grammar::parse(&text).unwrap();
        let (row, _) = spec.parts().unwrap();
        assert_eq!(row.name, entry.name);
        let again: S = spec.to_string().parse().unwrap();
        assert_eq!(again, spec);
    }
}

#[test]
fn catalogue_rows_match_the_enums() {
    catalogue_agrees::<Preset>();
    catalogue_agrees::<EosSpec>();
    catalogue_agrees::<OpacitySpec>();
    catalogue_agrees::<RatesSpec>();
    catalogue_agrees::<ConvectionSpec>();
    catalogue_agrees::<AtmosphereSpec>();
    for kind in LawKind::ALL {
        assert!(!kind.entries().is_empty());
        for e in kind.entries() {
            for p in e.params {
                assert!(p.contains(p.default_value()), "{} {}", e.name, p.key);
            }
        }
    }
}

/// The README's law table names every law of the catalogue, with its syntax (the table is
/// checked against the catalogue, not kept by hand).
#[test]
fn readme_lists_every_law() {
    let readme = std::fs::read_to_string(concat!(env!("CARGO_MANIFEST_DIR"), "/README.md"))
        .expect("README.md");
    for kind in LawKind::ALL {
        for e in kind.entries() {
            let syntax = e.syntax();
            assert!(
                readme.contains(&format!("`{syntax}`")),
                "README.md does not list {} law `{syntax}`",
                kind.key()
            );
        }
    }
}

/// A value of parameter `p` drawn from its range (log-uniform over positive ranges).
fn param_value(p: &catalogue::Param, u: f64) -> f64 {
    if p.min > 0.0 {
        (p.min.ln() + u * (p.max.ln() - p.min.ln())).exp()
    } else {
        p.min + u * (p.max - p.min)
    }
}

/// The spec of row `entry` with parameters drawn from `us`, as text.
fn text_of(entry: &catalogue::LawEntry, us: &[f64]) -> String {
    if entry.reads_file {
        return format!("{}:dir/table {}.csv", entry.name, us.len());
    }
    let params: Vec<String> = entry
        .params
        .iter()
        .zip(us)
        .map(|(p, &u)| format!("{}={}", p.key, param_value(p, u)))
        .collect();
    if params.is_empty() {
        entry.name.to_string()
    } else {
        format!("{}:{}", entry.name, params.join(","))
    }
}

fn round_trip<S>(text: &str)
where
    S: LawSpec + std::fmt::Display + std::str::FromStr + PartialEq + std::fmt::Debug,
    <S as std::str::FromStr>::Err: std::fmt::Debug,
{
    let spec: S = text.parse().unwrap();
    let printed = spec.to_string();
    let again: S = printed.parse().unwrap();
    assert_eq!(again, spec, "{text} -> {printed}");
    assert_eq!(again.to_string(), printed);
    let json = serde_json::to_string(&printed).unwrap();
    let from_json: String = serde_json::from_str(&json).unwrap();
    assert_eq!(from_json, printed);
}

proptest! {
    /// For every law of every kind and random parameters in their ranges: what is printed
    /// parses back to the same spec, and prints the same again.
    #[test]
    fn every_law_round_trips(row in 0usize..64, us in prop::collection::vec(0.0f64..=1.0, 3)) {
        for kind in LawKind::ALL {
            let entries = kind.entries();
            let entry = &entries[row % entries.len()];
            let text = text_of(entry, &us);
            match kind {
                LawKind::Preset => round_trip::<Preset>(&text),
                LawKind::Eos => round_trip::<EosSpec>(&text),
                LawKind::Opacity => round_trip::<OpacitySpec>(&text),
                LawKind::Rates => round_trip::<RatesSpec>(&text),
                LawKind::Convection => round_trip::<ConvectionSpec>(&text),
                LawKind::Atmosphere => round_trip::<AtmosphereSpec>(&text),
            }
        }
    }

    /// A complete spec serialised to JSON (the summary's `physics` object) reads back as
    /// overrides that resolve to the same spec.
    #[test]
    fn physics_object_round_trips(
        alpha in 0.1f64..=10.0,
        of in 1e-3f64..1e3,
        rf in 1e-3f64..1e3,
        analytic in any::<bool>(),
    ) {
        let preset = if analytic { "analytic" } else { "refined" };
        let spec = with(&format!(
            "preset:{preset};convection:mlt;alpha:{alpha};opacity-factor:{of};rates-factor:{rf}"
        ))
        .unwrap();
        let json = serde_json::to_value(&spec).unwrap();
        let overrides: PhysicsOverrides = serde_json::from_value(json).unwrap();
        prop_assert_eq!(overrides.resolve().unwrap(), spec);
    }

    /// Arbitrary text never panics the parsers; it parses or gives an error naming the kind.
    #[test]
    fn arbitrary_text_never_panics(text in ".{0,40}") {
        let _ = text.parse::<Preset>();
        let _ = text.parse::<EosSpec>();
        let _ = text.parse::<OpacitySpec>();
        let _ = text.parse::<RatesSpec>();
        let _ = text.parse::<ConvectionSpec>();
        let _ = text.parse::<AtmosphereSpec>();
    }
}
