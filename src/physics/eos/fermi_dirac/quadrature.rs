// The exact quadrature behind the Fermi–Dirac table, and the table's grid.
//
// This file is compiled twice: as the module `fermi_dirac::quadrature` of the library, and by
// `include!` into the build script (`build.rs`), which tabulates it once at build time so that
// no process pays for the table at start-up. It must therefore stand alone: no `use`, no inner
// attributes or inner doc comments, std only.

/// Lowest psi of the interpolation table (the non-degenerate series takes over below).
pub const TABLE_PSI_MIN: f64 = -10.0;
/// Highest psi of the interpolation table (the Sommerfeld expansion takes over above).
pub const TABLE_PSI_MAX: f64 = 50.0;
/// Node spacing of the table in psi.
pub const TABLE_STEP: f64 = 0.05;
/// Number of table nodes, (TABLE_PSI_MAX - TABLE_PSI_MIN) / TABLE_STEP + 1.
pub const TABLE_NODES: usize = 1201;

/// psi of table node `i`.
pub fn table_node_psi(i: usize) -> f64 {
    TABLE_PSI_MIN + i as f64 * TABLE_STEP
}

/// F_j(psi) for j = -1/2, 1/2, 3/2 by the trapezoid rule in t = sqrt(x), together with
/// dF_-1/2/dpsi. Returns [F_-1/2, F_1/2, F_3/2, dF_-1/2/dpsi].
///
/// F_j = 2 integral_0^inf t^(2j+1) / (exp(t^2 - psi) + 1) dt. The integrands are even in t and
/// analytic near the real axis, so the trapezoid rule with step 0.02 up to t^2 = max(psi, 0) + 60
/// is accurate to about machine precision. Slow (a few thousand exponentials): for tests and for
/// building the table, not for per-point use.
pub fn fermi_dirac_by_quadrature(psi: f64) -> [f64; 4] {
    let h = 0.02;
    let t_max = (psi.max(0.0) + 60.0).sqrt();
    let n = (t_max / h).ceil() as usize;
    let mut sums = [0.0; 4];
    for i in 0..=n {
        let t = i as f64 * h;
        let weight = if i == 0 { 0.5 } else { 1.0 };
        let e = (t * t - psi).exp();
        let occ = 1.0 / (e + 1.0);
        let t2 = t * t;
        sums[0] += weight * occ;
        sums[1] += weight * t2 * occ;
        sums[2] += weight * t2 * t2 * occ;
        // d/dpsi of 1/(e+1) is e/(e+1)^2.
        sums[3] += weight * e * occ * occ;
    }
    sums.map(|s| 2.0 * h * s)
}

/// The table at node `i`: ([ln F_-1/2, ln F_1/2, ln F_3/2], [d ln F_j / d psi for the same j]),
/// the slopes from d ln F_j / d psi = j F_(j-1) / F_j (and dF_-1/2/dpsi from the quadrature).
pub fn table_node(i: usize) -> ([f64; 3], [f64; 3]) {
    let [fm, fh, f3, dfm] = fermi_dirac_by_quadrature(table_node_psi(i));
    (
        [fm.ln(), fh.ln(), f3.ln()],
        [dfm / fm, 0.5 * fm / fh, 1.5 * fh / f3],
    )
}
