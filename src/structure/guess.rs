//! Starting guesses for the shooting unknowns.
//!
//! The built-in guess interpolates, in log M, a reference table of this program's own converged
//! models of the preset at X = 0.70, Z = 0.02 ([`REFINED_MODELS`], [`ANALYTIC_MODELS`],
//! regenerated with `cargo run --release --example guess_table -- PRESET` whenever the preset's
//! laws change). For other metallicities the refined guess is linear in ln Z towards a second
//! table at Z = 0.002 or 0.04 ([`REFINED_MODELS_LOW_Z`], [`REFINED_MODELS_HIGH_Z`]) and linear
//! in X towards one at X = 0.65 or 0.75 ([`REFINED_MODELS_LOW_X`], [`REFINED_MODELS_HIGH_X`]);
//! the analytic one is shifted by logarithmic slopes fitted to this program's refined models at Z = 0.001
//! and Z = 0.04. The Newton iteration takes it from there; a guess
//! within a few per cent takes it there in two or three iterations.
//!
//! For continuation along a sequence, [`shifted`] moves a converged neighbour by the difference
//! of the smooth [`polytrope_guess`] between the two masses:
//! Radius and luminosity come from the published ZAMS fits of Tout et al. (1996) (at Z = 0.02;
//! the Newton iteration absorbs the composition dependence). Central pressure and temperature
//! come from the polytrope that best describes the star's interior at that mass: n = 3
//! (radiative core, Eddington's standard model) above about 0.6 M_sun, n = 1.5 (fully
//! convective) below about 0.3 M_sun, blended in log M between:
//! P_c = W_n G M^2 / R^4 and T_c = Theta_n mu m_u G M / (k R)
//! (Chandrasekhar 1939, ch. IV; W_3 = 11.05, Theta_3 = 0.854, W_1.5 = 0.770, Theta_1.5 = 0.538).

use super::shooting::Unknowns;
use crate::constants::{G_CGS, K_B_ERG_K, L_SUN_ERG_S, M_SUN_G, M_U_G, R_SUN_CM};
use crate::numerics::interpolation::{interval, steffen};
use crate::physics::{Composition, Preset};
use crate::polytrope::eddington_beta;
use crate::reference::{tout1996_luminosity_lsun, tout1996_radius_rsun};

/// A row of the reference table: (ln P_c with P_c in dyn cm^-2, ln T_c with T_c in K,
/// ln(R / R_sun), ln(L / L_sun)).
pub type GuessRow = [f64; 4];

/// Reference models: (M / M_sun, [`GuessRow`]), refined physics, X = 0.70, Z = 0.02 (computed
/// by this program; see the module documentation).
pub const REFINED_MODELS: [(f64, GuessRow); 37] = [
    (0.08, [40.974029, 14.976063, -2.353486, -8.188542]),
    (0.085, [40.653800, 15.113270, -2.241066, -7.556315]),
    (0.09, [40.466933, 15.188291, -2.164395, -7.217928]),
    (0.1, [40.219689, 15.284882, -2.047900, -6.781650]),
    (0.12, [39.916396, 15.403079, -1.878248, -6.236659]),
    (0.15, [39.638263, 15.514581, -1.694610, -5.705446]),
    (0.2, [39.347984, 15.635611, -1.475609, -5.111517]),
    (0.25, [39.154437, 15.721592, -1.313958, -4.686866]),
    (0.3, [39.010364, 15.789395, -1.185530, -4.353178]),
    (0.35, [38.895466, 15.845618, -1.078752, -4.076512]),
    (0.4, [38.799802, 15.893736, -0.987278, -3.839103]),
    (0.45, [38.792738, 15.912889, -0.902946, -3.612475]),
    (0.5, [38.833486, 15.943620, -0.814789, -3.363402]),
    (0.6, [38.956254, 16.025496, -0.632915, -2.787048]),
    (0.7, [39.110661, 16.124655, -0.483556, -2.120799]),
    (0.8, [39.269209, 16.224507, -0.369011, -1.466677]),
    (0.9, [39.417290, 16.317074, -0.247898, -0.874213]),
    (1.0, [39.554739, 16.403778, -0.116073, -0.331411]),
    (1.1, [39.679278, 16.485411, 0.018299, 0.168498]),
    (1.2, [39.784189, 16.561545, 0.131783, 0.623570]),
    (1.35, [39.884366, 16.660054, 0.225154, 1.214159]),
    (1.5, [39.912829, 16.732124, 0.258791, 1.708861]),
    (1.7, [39.881559, 16.797933, 0.309189, 2.264203]),
    (2.0, [39.778901, 16.863139, 0.390757, 2.953293]),
    (2.5, [39.584571, 16.934390, 0.516317, 3.859753]),
    (3.0, [39.405065, 16.984937, 0.622838, 4.571244]),
    (4.0, [39.107796, 17.057426, 0.792067, 5.644754]),
    (5.0, [38.876324, 17.109658, 0.922704, 6.438967]),
    (7.0, [38.541454, 17.183235, 1.117683, 7.577939]),
    (10.0, [38.222942, 17.254650, 1.320805, 8.711215]),
    (15.0, [37.925601, 17.327276, 1.545924, 9.903135]),
    (20.0, [37.760890, 17.373224, 1.701804, 10.681514]),
    (30.0, [37.589231, 17.430455, 1.917547, 11.679498]),
    (50.0, [37.453308, 17.491245, 2.187033, 12.779956]),
    (70.0, [37.399390, 17.525400, 2.365545, 13.422046]),
    (100.0, [37.364512, 17.557435, 2.557486, 14.044771]),
    (150.0, [37.345303, 17.589507, 2.779740, 14.693261]),
];

/// The metallicity of [`REFINED_MODELS_LOW_Z`].
pub const LOW_Z: f64 = 0.002;

/// Reference models of the refined physics at X = 0.70, Z = [`LOW_Z`] (computed by this program:
/// `cargo run --release --example guess_table -- refined 0.002`; masses from just above the
/// hydrogen-burning limit there). With [`REFINED_MODELS`] they give the guess at any Z by
/// interpolation in ln Z (with [`REFINED_MODELS_HIGH_Z`] above Z = 0.02).
pub const REFINED_MODELS_LOW_Z: [(f64, GuessRow); 35] = [
    (0.09, [40.821769, 15.179104, -2.253418, -6.962937]),
    (0.1, [40.480464, 15.300801, -2.113165, -6.459566]),
    (0.12, [40.129116, 15.430397, -1.931413, -5.895556]),
    (0.15, [39.831698, 15.547142, -1.742945, -5.358188]),
    (0.2, [39.534142, 15.671967, -1.522151, -4.758210]),
    (0.25, [39.341038, 15.760340, -1.360643, -4.327899]),
    (0.3, [39.199619, 15.830033, -1.232909, -3.987986]),
    (0.35, [39.088318, 15.887916, -1.127054, -3.704343]),
    (0.4, [39.029926, 15.927026, -1.035329, -3.452250]),
    (0.45, [39.076762, 15.963038, -0.939564, -3.163504]),
    (0.5, [39.147416, 16.011861, -0.839966, -2.823460]),
    (0.6, [39.323558, 16.130281, -0.680020, -2.032326]),
    (0.7, [39.500182, 16.247144, -0.560920, -1.274929]),
    (0.8, [39.660933, 16.353546, -0.442834, -0.604111]),
    (0.9, [39.804623, 16.450529, -0.320293, -0.007929]),
    (1.0, [39.929716, 16.538727, -0.208706, 0.522120]),
    (1.1, [40.034362, 16.617909, -0.133252, 0.991367]),
    (1.2, [40.118118, 16.687926, -0.103022, 1.407958]),
    (1.35, [40.205002, 16.776664, -0.077013, 1.951179]),
    (1.5, [40.248125, 16.847367, -0.047737, 2.415530]),
    (1.7, [40.251244, 16.918439, -0.002474, 2.942042]),
    (2.0, [40.188732, 16.991860, 0.072421, 3.592000]),
    (2.5, [40.027542, 17.069971, 0.194881, 4.435792]),
    (3.0, [39.863272, 17.122918, 0.303872, 5.090731]),
    (4.0, [39.581137, 17.196064, 0.483460, 6.072525]),
    (5.0, [39.358860, 17.247560, 0.625975, 6.798656]),
    (7.0, [39.037114, 17.319469, 0.842729, 7.846749]),
    (10.0, [38.731956, 17.389397, 1.071090, 8.903341]),
    (15.0, [38.447741, 17.461257, 1.323758, 10.033071]),
    (20.0, [38.290544, 17.507262, 1.496578, 10.781438]),
    (30.0, [38.127232, 17.565169, 1.731285, 11.752084]),
    (50.0, [37.999276, 17.627299, 2.017309, 12.833706]),
    (70.0, [37.949502, 17.662386, 2.203327, 13.468100]),
    (100.0, [37.917925, 17.695269, 2.400256, 14.083159]),
    (150.0, [37.901443, 17.728115, 2.624575, 14.722838]),
];

/// The metallicity of [`REFINED_MODELS_HIGH_Z`].
pub const HIGH_Z: f64 = 0.04;

/// Reference models of the refined physics at X = 0.70, Z = [`HIGH_Z`] (computed by this
/// program: `cargo run --release --example guess_table -- refined 0.04`).
pub const REFINED_MODELS_HIGH_Z: [(f64, GuessRow); 37] = [
    (0.08, [40.764567, 15.021030, -2.300853, -8.082847]),
    (0.085, [40.525827, 15.125291, -2.209098, -7.592407]),
    (0.09, [40.364381, 15.192078, -2.138853, -7.283276]),
    (0.1, [40.137983, 15.282921, -2.027609, -6.863411]),
    (0.12, [39.848386, 15.397590, -1.861384, -6.326210]),
    (0.15, [39.576629, 15.507278, -1.679323, -5.798455]),
    (0.2, [39.289222, 15.626995, -1.461015, -5.207385]),
    (0.25, [39.095594, 15.712103, -1.299327, -4.784744]),
    (0.3, [38.950802, 15.779253, -1.170709, -4.453048]),
    (0.35, [38.835071, 15.834965, -1.063716, -4.178498]),
    (0.4, [38.738499, 15.882647, -0.972010, -3.943301]),
    (0.45, [38.662597, 15.917750, -0.891762, -3.736591]),
    (0.5, [38.666699, 15.934583, -0.815498, -3.532920]),
    (0.6, [38.749443, 15.993138, -0.655924, -3.078132]),
    (0.7, [38.869738, 16.070052, -0.497293, -2.546894]),
    (0.8, [39.012552, 16.158751, -0.372353, -1.953686]),
    (0.9, [39.155974, 16.246283, -0.265163, -1.380925]),
    (1.0, [39.291621, 16.328544, -0.150314, -0.853468]),
    (1.1, [39.418929, 16.406655, -0.024588, -0.362494]),
    (1.2, [39.534668, 16.481255, 0.106244, 0.096568]),
    (1.35, [39.666228, 16.585286, 0.272201, 0.716292]),
    (1.5, [39.719237, 16.667075, 0.366329, 1.236183]),
    (1.7, [39.701546, 16.739250, 0.420419, 1.811350]),
    (2.0, [39.605021, 16.807732, 0.500814, 2.521122]),
    (2.5, [39.414647, 16.880752, 0.626944, 3.458957]),
    (3.0, [39.237919, 16.932300, 0.734403, 4.200326]),
    (4.0, [38.944398, 17.006455, 0.904305, 5.326019]),
    (5.0, [38.714758, 17.060122, 1.034409, 6.161807]),
    (7.0, [38.380455, 17.135901, 1.226582, 7.359953]),
    (10.0, [38.060318, 17.209380, 1.424389, 8.546617]),
    (15.0, [37.760159, 17.283710, 1.641388, 9.784641]),
    (20.0, [37.593675, 17.330422, 1.790811, 10.586560]),
    (30.0, [37.420215, 17.388220, 1.997400, 11.607193]),
    (50.0, [37.282953, 17.449189, 2.256355, 12.724422]),
    (70.0, [37.228613, 17.483322, 2.428990, 13.373831]),
    (100.0, [37.194065, 17.515400, 2.616861, 14.004476]),
    (150.0, [37.175678, 17.547575, 2.837205, 14.661728]),
];

/// The hydrogen mass fractions of [`REFINED_MODELS_LOW_X`] and [`REFINED_MODELS_HIGH_X`].
pub const LOW_X: f64 = 0.65;
/// See [`LOW_X`].
pub const HIGH_X: f64 = 0.75;

/// Reference models of the refined physics at X = [`LOW_X`], Z = 0.02 (computed by this program:
/// `cargo run --release --example guess_table -- refined 0.02 0.65`; `0.75` for the next table).
/// With [`REFINED_MODELS`] they shift the guess linearly in X.
pub const REFINED_MODELS_LOW_X: [(f64, GuessRow); 38] = [
    (0.075, [40.945935, 14.989134, -2.379669, -8.306705]),
    (0.08, [40.636170, 15.127329, -2.267807, -7.659075]),
    (0.085, [40.451491, 15.204515, -2.189858, -7.304998]),
    (0.09, [40.315232, 15.260127, -2.126049, -7.050292]),
    (0.1, [40.114146, 15.340986, -2.021279, -6.677999]),
    (0.12, [39.847219, 15.448794, -1.860844, -6.172032]),
    (0.15, [39.589855, 15.555352, -1.682445, -5.658474]),
    (0.2, [39.314233, 15.673923, -1.467099, -5.073959]),
    (0.25, [39.128580, 15.759324, -1.307384, -4.652497]),
    (0.3, [38.989453, 15.827006, -1.180155, -4.319659]),
    (0.35, [38.878049, 15.883273, -1.074220, -4.042728]),
    (0.4, [38.835548, 15.912486, -0.981322, -3.794693]),
    (0.45, [38.875647, 15.944336, -0.885926, -3.525045]),
    (0.5, [38.936879, 15.985920, -0.786582, -3.224572]),
    (0.6, [39.093821, 16.087820, -0.601356, -2.530072]),
    (0.7, [39.270238, 16.199392, -0.470048, -1.793359]),
    (0.8, [39.435842, 16.302999, -0.340608, -1.126499]),
    (0.9, [39.587955, 16.399069, -0.197706, -0.522673]),
    (1.0, [39.723684, 16.488822, -0.048776, 0.028548]),
    (1.1, [39.834018, 16.571835, 0.077153, 0.525682]),
    (1.2, [39.906503, 16.644237, 0.155559, 0.963095]),
    (1.35, [39.943094, 16.725848, 0.200533, 1.521704]),
    (1.5, [39.922177, 16.782729, 0.242498, 1.994689]),
    (1.7, [39.854702, 16.836591, 0.303141, 2.535266]),
    (2.0, [39.728690, 16.893686, 0.391934, 3.213251]),
    (2.5, [39.520851, 16.959916, 0.521361, 4.108168]),
    (3.0, [39.336908, 17.008446, 0.628942, 4.810949]),
    (4.0, [39.038233, 17.079141, 0.798481, 5.871430]),
    (5.0, [38.808667, 17.130419, 0.928899, 6.656067]),
    (7.0, [38.480438, 17.202712, 1.123168, 7.780955]),
    (10.0, [38.172890, 17.272720, 1.325105, 8.898595]),
    (15.0, [37.890549, 17.343670, 1.548587, 10.070532]),
    (20.0, [37.736312, 17.388443, 1.703401, 10.833457]),
    (30.0, [37.577313, 17.444115, 1.918108, 11.809521]),
    (50.0, [37.452987, 17.503206, 2.187150, 12.885257]),
    (70.0, [37.404454, 17.536430, 2.365740, 13.513844]),
    (100.0, [37.373954, 17.567658, 2.558162, 14.125039]),
    (150.0, [37.358221, 17.598938, 2.780535, 14.762276]),
];

/// Reference models of the refined physics at X = [`HIGH_X`], Z = 0.02 (as [`REFINED_MODELS_LOW_X`]).
pub const REFINED_MODELS_HIGH_X: [(f64, GuessRow); 36] = [
    (0.085, [41.015828, 14.956434, -2.332818, -8.113482]),
    (0.09, [40.677116, 15.097215, -2.217557, -7.473458]),
    (0.1, [40.347783, 15.223936, -2.080211, -6.910346]),
    (0.12, [39.994708, 15.357163, -1.897934, -6.308054]),
    (0.15, [39.691556, 15.474874, -1.707977, -5.754723]),
    (0.2, [39.385289, 15.598945, -1.484978, -5.149798]),
    (0.25, [39.183501, 15.685715, -1.321299, -4.721226]),
    (0.3, [39.034359, 15.753744, -1.191641, -4.386144]),
    (0.35, [38.915998, 15.810004, -1.084030, -4.109283]),
    (0.4, [38.817667, 15.858055, -0.991914, -3.872309]),
    (0.45, [38.741982, 15.893554, -0.911340, -3.663942]),
    (0.5, [38.752847, 15.912324, -0.833477, -3.453958]),
    (0.6, [38.843471, 15.976184, -0.667878, -2.973348]),
    (0.7, [38.969997, 16.058988, -0.506117, -2.405793]),
    (0.8, [39.115496, 16.151858, -0.385369, -1.787181]),
    (0.9, [39.257917, 16.241365, -0.280394, -1.204265]),
    (1.0, [39.391650, 16.324938, -0.167558, -0.671524]),
    (1.1, [39.516907, 16.403807, -0.046252, -0.179062]),
    (1.2, [39.632088, 16.478559, 0.075533, 0.278042]),
    (1.35, [39.774468, 16.582021, 0.220189, 0.892387]),
    (1.5, [39.859613, 16.669566, 0.284042, 1.415546]),
    (1.7, [39.883025, 16.752408, 0.322530, 1.994759]),
    (2.0, [39.817272, 16.830072, 0.393145, 2.699159]),
    (2.5, [39.642907, 16.908529, 0.512549, 3.617761]),
    (3.0, [39.469793, 16.961701, 0.617319, 4.337702]),
    (4.0, [39.175428, 17.036295, 0.785817, 5.423776]),
    (5.0, [38.942862, 17.089529, 0.916533, 6.227211]),
    (7.0, [38.602502, 17.164353, 1.112070, 7.379607]),
    (10.0, [38.274146, 17.237101, 1.316231, 8.527544]),
    (15.0, [37.962627, 17.311328, 1.542895, 9.738125]),
    (20.0, [37.787657, 17.358414, 1.699847, 10.531125]),
    (30.0, [37.603292, 17.417168, 1.916707, 11.550266]),
    (50.0, [37.455529, 17.479639, 2.186756, 12.675100]),
    (70.0, [37.396087, 17.514722, 2.365246, 13.330681]),
    (100.0, [37.356743, 17.547569, 2.556796, 13.965048]),
    (150.0, [37.333949, 17.580431, 2.778852, 14.624743]),
];

/// Reference models of the `analytic` preset, as [`REFINED_MODELS`] (its masses from 0.7 M_sun,
/// the preset's lowest).
pub const ANALYTIC_MODELS: [(f64, GuessRow); 23] = [
    (0.7, [38.007372, 15.896420, 0.101104, -4.343606]),
    (0.8, [38.160631, 15.999166, 0.130958, -3.621239]),
    (0.9, [38.304416, 16.091974, 0.155104, -2.983561]),
    (1.0, [38.440004, 16.176774, 0.174914, -2.412902]),
    (1.1, [38.568347, 16.254965, 0.191348, -1.896664]),
    (1.2, [38.690054, 16.327602, 0.205126, -1.425591]),
    (1.35, [38.860150, 16.427879, 0.222116, -0.789082]),
    (1.5, [39.010762, 16.519535, 0.236706, -0.223413]),
    (1.7, [39.153077, 16.627263, 0.258985, 0.432590]),
    (2.0, [39.203732, 16.733860, 0.314600, 1.243865]),
    (2.5, [39.109285, 16.829465, 0.435041, 2.331029]),
    (3.0, [38.981531, 16.890297, 0.549672, 3.211172]),
    (4.0, [38.751701, 16.975116, 0.738660, 4.569199]),
    (5.0, [38.565895, 17.036089, 0.885418, 5.580484]),
    (7.0, [38.287466, 17.121625, 1.101625, 7.008768]),
    (10.0, [38.010924, 17.202936, 1.321301, 8.372849]),
    (15.0, [37.742784, 17.282703, 1.558737, 9.730488]),
    (20.0, [37.590547, 17.331552, 1.720659, 10.578747]),
    (30.0, [37.429131, 17.390952, 1.942987, 11.633714]),
    (50.0, [37.298910, 17.452797, 2.219315, 12.769125]),
    (70.0, [37.246241, 17.487138, 2.401727, 13.422687]),
    (100.0, [37.211083, 17.519056, 2.596423, 14.050702]),
    (150.0, [37.190271, 17.550735, 2.819463, 14.699557]),
];

/// The reference table of a preset.
pub fn reference_models(preset: Preset) -> &'static [(f64, GuessRow)] {
    match preset {
        Preset::Refined => &REFINED_MODELS,
        Preset::Analytic => &ANALYTIC_MODELS,
    }
}

/// Built-in starting guess (ln P_c, ln T_c, ln R, ln L) for mass `mass_msun` and the laws of
/// `preset`: the preset's reference table interpolated in ln M by monotone cubics (Steffen
/// 1990; [`crate::numerics::interpolation`]), extrapolated linearly from the end intervals.
/// For the refined preset, linear in ln Z through that and [`REFINED_MODELS_LOW_Z`] (Z below
/// 0.02) or [`REFINED_MODELS_HIGH_Z`] (above); otherwise
/// (and below the low-Z table's masses) shifted for Z by d(ln Q)/d(ln Z) that blend in log M
/// from their 1 M_sun values to their 10 M_sun values: ln L -0.22 to 0, ln R 0.035 to 0.12, ln T_c -0.02 to -0.045, ln P_c
/// -0.13 to -0.26 (fitted to this program's own refined models at Z = 0.001 and 0.04).
pub fn initial_guess(mass_msun: f64, comp: &Composition, preset: Preset) -> Unknowns {
    let lm = mass_msun.ln();
    let row = interpolated(reference_models(preset), lm);
    let zeta = (comp.z().max(1e-6) / 0.02).ln();
    let refined = preset == Preset::Refined;
    // The refined preset has tables at Z = LOW_Z and HIGH_Z too: the guess is linear in ln Z
    // between Z = 0.02 and the one on the side of Z (extrapolated beyond it) wherever the mass
    // lies inside that table; elsewhere the fitted slopes in ln Z.
    let (z_side, z_table): (f64, &[(f64, GuessRow)]) = if comp.z() < 0.02 {
        (LOW_Z, &REFINED_MODELS_LOW_Z)
    } else {
        (HIGH_Z, &REFINED_MODELS_HIGH_Z)
    };
    let z_step = refined
        .then(|| toward(z_table, &row, lm, zeta / (z_side / 0.02).ln()))
        .flatten()
        .unwrap_or_else(|| {
            let w = (lm / 10f64.ln()).clamp(0.0, 1.0);
            let blend = |at1: f64, at10: f64| at1 + w * (at10 - at1);
            [
                blend(-0.13, -0.26) * zeta,
                blend(-0.02, -0.045) * zeta,
                blend(0.035, 0.12) * zeta,
                blend(-0.22, 0.0) * zeta,
            ]
        });
    // And linear in X between X = 0.70 and the table on the side of X (at Z = 0.02, added to
    // the step in Z).
    let (x_side, x_table): (f64, &[(f64, GuessRow)]) = if comp.x() < 0.70 {
        (LOW_X, &REFINED_MODELS_LOW_X)
    } else {
        (HIGH_X, &REFINED_MODELS_HIGH_X)
    };
    let x_step = refined
        .then(|| toward(x_table, &row, lm, (comp.x() - 0.70) / (x_side - 0.70)))
        .flatten()
        .unwrap_or([0.0; 4]);
    Unknowns::new(
        row[0] + z_step[0] + x_step[0],
        row[1] + z_step[1] + x_step[1],
        row[2] + z_step[2] + x_step[2] + R_SUN_CM.ln(),
        row[3] + z_step[3] + x_step[3] + L_SUN_ERG_S.ln(),
    )
}

/// The step from `row` (the reference table's row at ln M = `lm`) `fraction` of the way to the
/// row of the side table `table` there (the guess linear in one composition variable); `None`
/// below the side table's lightest mass.
fn toward(table: &[(f64, GuessRow)], row: &GuessRow, lm: f64, fraction: f64) -> Option<GuessRow> {
    (lm >= table[0].0.ln()).then(|| {
        let side = interpolated(table, lm);
        std::array::from_fn(|k| fraction * (side[k] - row[k]))
    })
}

/// The row of `table` at ln M = `lm`: monotone cubic (Steffen 1990) inside the table, the end
/// interval's line beyond it.
fn interpolated(table: &[(f64, GuessRow)], lm: f64) -> GuessRow {
    let ln_masses: Vec<f64> = table.iter().map(|(m, _)| m.ln()).collect();
    let (first, last) = (ln_masses[0], ln_masses[ln_masses.len() - 1]);
    let i = interval(&ln_masses, lm.clamp(first, last));
    std::array::from_fn(|k| {
        let values: Vec<f64> = table.iter().map(|(_, r)| r[k]).collect();
        if (first..=last).contains(&lm) {
            steffen(&ln_masses, &values, i, lm)
        } else {
            let f = (lm - ln_masses[i]) / (ln_masses[i + 1] - ln_masses[i]);
            values[i] + f * (values[i + 1] - values[i])
        }
    })
}

/// The guess for `to_msun` from a converged neighbour `row` at `from_msun`: the neighbour's
/// unknowns shifted by the difference of [`polytrope_guess`] between the two masses (used for
/// continuation along a sequence).
pub fn shifted(row: &GuessRow, from_msun: f64, to_msun: f64, comp: &Composition) -> Unknowns {
    let base = Unknowns::new(
        row[0],
        row[1],
        row[2] + R_SUN_CM.ln(),
        row[3] + L_SUN_ERG_S.ln(),
    );
    base + polytrope_guess(to_msun, comp) - polytrope_guess(from_msun, comp)
}

/// The converged unknowns as a [`GuessRow`].
pub fn as_row(u: &Unknowns) -> GuessRow {
    [u[0], u[1], u[2] - R_SUN_CM.ln(), u[3] - L_SUN_ERG_S.ln()]
}

/// Guess from the ZAMS fits of Tout et al. (1996) for R and L and from polytropes for P_c, T_c.
pub fn polytrope_guess(mass_msun: f64, comp: &Composition) -> Unknowns {
    let r_cm = tout1996_radius_rsun(mass_msun) * R_SUN_CM;
    let l_erg_s = tout1996_luminosity_lsun(mass_msun) * L_SUN_ERG_S;
    let m_g = mass_msun * M_SUN_G;
    // Weight of the n = 3 polytrope, 0 below 0.3 M_sun and 1 above 0.6 M_sun.
    let w = ((mass_msun.ln() - 0.3f64.ln()) / (0.6f64.ln() - 0.3f64.ln())).clamp(0.0, 1.0);
    let ln_w_n = (1.0 - w) * 0.770_140f64.ln() + w * 11.050_68f64.ln();
    let ln_theta_n = (1.0 - w) * 0.538_494f64.ln() + w * 0.854_316f64.ln();
    let ln_pc = ln_w_n + (G_CGS * m_g * m_g / r_cm.powi(4)).ln();
    // Radiation pressure lowers T_c at given P_c by the gas fraction beta of Eddington's
    // standard model (omega_3 = 2.018235951, Chandrasekhar 1939 Table 4). The mass and mu are
    // positive here, so the solve cannot fail; beta = 1 would only weaken the guess.
    let beta = eddington_beta(mass_msun, comp.mu(), OMEGA_3).unwrap_or(1.0);
    let ln_tc =
        ln_theta_n + beta.ln() + (comp.mu() * M_U_G * G_CGS * m_g / (K_B_ERG_K * r_cm)).ln();
    Unknowns::new(ln_pc, ln_tc, r_cm.ln(), l_erg_s.ln())
}

/// omega_3 = -xi_1^2 theta'(xi_1) of the n = 3 polytrope (Chandrasekhar 1939, Table 4;
/// docs/references.md §1).
const OMEGA_3: f64 = 2.018_235_951;
