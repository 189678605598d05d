//! Convective zones: from the boundaries a leg located to (lower, upper) mass fractions, and
//! the convective core and envelope they make.

/// Convective zones as (lower, upper) mass fractions, from the located boundaries and whether
/// the centre is convective.
pub fn convective_zones(centre_convective: bool, boundaries: &[f64]) -> Vec<(f64, f64)> {
    let mut edges: Vec<f64> = boundaries.to_vec();
    edges.sort_by(f64::total_cmp);
    let mut zones = Vec::new();
    let mut convective = centre_convective;
    let mut lower = 0.0;
    for &e in &edges {
        if convective {
            zones.push((lower, e));
        }
        lower = e;
        convective = !convective;
    }
    if convective {
        zones.push((lower, 1.0));
    }
    zones
}

/// How close (in mass fraction) to the surface a convective zone must reach to count as reaching
/// it: the photosphere and a thin layer below it can be radiative above a convective envelope.
pub const SURFACE_ZONE_MARGIN: f64 = 1e-3;

/// Mass fractions of the convective core (the zone containing the centre, else 0) and of the
/// convective envelope (the outermost zone if its top lies within [`SURFACE_ZONE_MARGIN`] of the
/// surface, else 0). A star convective from the centre to within that margin of the surface is
/// fully convective and reports 1 for both.
pub fn extent_from_zones(zones: &[(f64, f64)]) -> (f64, f64) {
    let reaches_surface = |z: &(f64, f64)| z.1 > 1.0 - SURFACE_ZONE_MARGIN;
    let core = zones.first().filter(|z| z.0 == 0.0).map_or(0.0, |z| {
        if reaches_surface(z) {
            1.0
        } else {
            z.1
        }
    });
    let envelope = zones
        .last()
        .filter(|z| reaches_surface(z))
        .map_or(0.0, |z| 1.0 - z.0);
    (core, envelope)
}
