//! Choosing laws by name: presets, overrides, factors and the error messages.

use starpoise::error::Error;
use starpoise::physics::{PhysicsOptions, PhysicsSet};

fn opts() -> PhysicsOptions {
    PhysicsOptions::default()
}

fn invalid(o: &PhysicsOptions) -> (String, String, String) {
    match o.build() {
        Err(Error::InvalidInput {
            name,
            value,
            allowed,
        }) => (name, value, allowed),
        other => panic!("expected InvalidInput, got {other:?}"),
    }
}

/// No preset means `refined`; `analytic` is exactly PhysicsSet::analytic().
#[test]
fn presets() {
    let d = opts().build().unwrap().describe();
    assert_eq!(d, PhysicsSet::refined().describe());
    assert_eq!(d.preset, "refined");
    assert_eq!(d.eos, "molecular");
    assert_eq!(d.opacity, "refined");
    assert_eq!(d.rates, "sfactor");
    assert_eq!(d.convection, "mlt:alpha=2.4");
    assert_eq!(d.atmosphere, "krishna-swamy");
    let a = PhysicsOptions {
        physics: Some("analytic".into()),
        ..opts()
    };
    assert_eq!(
        a.build().unwrap().describe(),
        PhysicsSet::analytic().describe()
    );
    // A factor of 1 leaves the analytic set untouched.
    let a1 = PhysicsOptions {
        physics: Some("analytic".into()),
        opacity_factor: Some(1.0),
        ..opts()
    };
    assert_eq!(
        a1.build().unwrap().describe(),
        PhysicsSet::analytic().describe()
    );
}

/// Every law can be chosen by name, with parameters.
#[test]
fn overrides_by_name() {
    for (eos, want) in [
        ("ideal", "ideal"),
        ("saha", "saha"),
        ("degenerate", "degenerate"),
        ("refined", "refined"),
    ] {
        let o = PhysicsOptions {
            physics: Some("analytic".into()),
            eos: Some(eos.into()),
            ..opts()
        };
        assert_eq!(o.build().unwrap().describe().eos, want);
    }
    let table = concat!(env!("CARGO_MANIFEST_DIR"), "/models/demo-opacity.csv");
    for (kappa, want) in [
        ("electron-scattering", "electron-scattering".to_string()),
        ("kramers", "kramers:guillotine=1".to_string()),
        ("kramers:guillotine=30", "kramers:guillotine=30".to_string()),
        ("h-minus", "h-minus".to_string()),
        ("conductive", "conductive".to_string()),
        ("analytic", "analytic".to_string()),
        ("refined", "refined".to_string()),
        (
            "refined:guillotine=10,exponent=0",
            "refined:guillotine=10,exponent=0".to_string(),
        ),
        (&format!("table:{table}"), format!("table:{table}")),
        (
            &format!("table-clamped:{table}"),
            format!("table-clamped:{table}"),
        ),
    ] {
        let o = PhysicsOptions {
            opacity: Some(kappa.to_string()),
            ..opts()
        };
        assert_eq!(o.build().unwrap().describe().opacity, want);
    }
    for (rates, want) in [
        ("analytic", "analytic"),
        ("sfactor", "sfactor"),
        (
            "power-law:eps0=0.1,t0=1.5e7,nu=4",
            "power-law:eps0=0.1,t0=15000000,nu=4",
        ),
    ] {
        let o = PhysicsOptions {
            rates: Some(rates.into()),
            ..opts()
        };
        assert_eq!(o.build().unwrap().describe().rates, want);
    }
    let o = PhysicsOptions {
        convection: Some("adiabatic".into()),
        ..opts()
    };
    assert_eq!(o.build().unwrap().describe().convection, "adiabatic");
    let o = PhysicsOptions {
        physics: Some("analytic".into()),
        convection: Some("mlt".into()),
        alpha: Some(2.0),
        ..opts()
    };
    assert_eq!(o.build().unwrap().describe().convection, "mlt:alpha=2");
    let o = PhysicsOptions {
        alpha: Some(1.5),
        ..opts()
    };
    assert_eq!(o.build().unwrap().describe().convection, "mlt:alpha=1.5");
    let o = PhysicsOptions {
        opacity_factor: Some(2.0),
        rates_factor: Some(0.5),
        ..opts()
    };
    let d = o.build().unwrap().describe();
    assert_eq!(
        (d.opacity.as_str(), d.rates.as_str()),
        ("refined*2", "sfactor*0.5")
    );
    let o = PhysicsOptions {
        atmosphere: Some("photosphere".into()),
        ..opts()
    };
    assert_eq!(o.build().unwrap().describe().atmosphere, "photosphere");
}

/// Unknown names and bad parameters name the flag, the value, and what is allowed.
#[test]
fn clear_errors() {
    let (n, v, a) = invalid(&PhysicsOptions {
        physics: Some("fancy".into()),
        ..opts()
    });
    assert_eq!((n.as_str(), v.as_str()), ("--physics", "fancy"));
    assert!(a.contains("analytic, refined"));
    let (n, _, a) = invalid(&PhysicsOptions {
        eos: Some("vdw".into()),
        ..opts()
    });
    assert_eq!(n, "--eos");
    assert!(a.contains("ideal, saha, degenerate, refined"));
    let (n, _, a) = invalid(&PhysicsOptions {
        opacity: Some("opal".into()),
        ..opts()
    });
    assert_eq!(n, "--opacity");
    assert!(a.contains("table:PATH") && a.contains("kramers"));
    let (n, _, _) = invalid(&PhysicsOptions {
        opacity: Some("kramers:gilotine=3".into()),
        ..opts()
    });
    assert_eq!(n, "--opacity");
    let (n, _, _) = invalid(&PhysicsOptions {
        opacity: Some("kramers:guillotine=-3".into()),
        ..opts()
    });
    assert_eq!(n, "guillotine");
    let (n, _, _) = invalid(&PhysicsOptions {
        opacity: Some("table:".into()),
        ..opts()
    });
    assert_eq!(n, "--opacity");
    let (n, _, a) = invalid(&PhysicsOptions {
        rates: Some("power-law:eps0=1,gamma=4".into()),
        ..opts()
    });
    assert_eq!(n, "--rates");
    assert!(a.contains("eps0") && a.contains("t0") && a.contains("nu"));
    let (n, _, a) = invalid(&PhysicsOptions {
        rates: Some("cf88".into()),
        ..opts()
    });
    assert_eq!(n, "--rates");
    assert!(a.contains("sfactor"));
    let (n, _, a) = invalid(&PhysicsOptions {
        convection: Some("fast".into()),
        ..opts()
    });
    assert_eq!(n, "--convection");
    assert!(a.contains("adiabatic, mlt"));
    let (n, _, _) = invalid(&PhysicsOptions {
        physics: Some("analytic".into()),
        alpha: Some(2.0),
        ..opts()
    });
    assert_eq!(n, "--alpha");
    let (n, _, _) = invalid(&PhysicsOptions {
        alpha: Some(-1.0),
        ..opts()
    });
    assert_eq!(n, "--alpha");
    let (n, _, _) = invalid(&PhysicsOptions {
        opacity_factor: Some(0.0),
        ..opts()
    });
    assert_eq!(n, "--opacity-factor");
    let (n, _, _) = invalid(&PhysicsOptions {
        rates_factor: Some(f64::NAN),
        ..opts()
    });
    assert_eq!(n, "--rates-factor");
    let (n, _, _) = invalid(&PhysicsOptions {
        eos: Some("ideal:x=1".into()),
        ..opts()
    });
    assert_eq!(n, "--eos");
    // A missing table file is a BadFile naming it.
    let o = PhysicsOptions {
        opacity: Some("table:/no/such/file.csv".into()),
        ..opts()
    };
    match o.build() {
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
    let set = PhysicsOptions {
        physics: Some("analytic".into()),
        rates: Some("power-law:nu=4".into()),
        ..Default::default()
    }
    .build()
    .unwrap();
    let comp = Composition::new(0.7, 0.02).unwrap();
    let power = set.rates.rate(80.0, 1.5e7, &comp).unwrap();
    let analytic = PhysicsOptions {
        physics: Some("analytic".into()),
        ..Default::default()
    }
    .build()
    .unwrap();
    let pp = analytic.rates.rate(80.0, 1.5e7, &comp).unwrap();
    assert!((power.eps_pp_erg_g_s / pp.eps_pp_erg_g_s - 1.0).abs() < 1e-12);
    assert_eq!(power.nu_pp, 4.0);
}
