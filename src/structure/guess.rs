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
pub const REFINED_MODELS: [(f64, GuessRow); 38] = [
    (0.075, [40.824352, 14.899347, -2.355593, -8.867682]),
    (0.08, [40.618537, 15.034984, -2.271127, -8.121756]),
    (0.085, [40.462143, 15.123075, -2.200655, -7.661902]),
    (0.09, [40.334831, 15.187297, -2.139186, -7.338419]),
    (0.1, [40.138907, 15.279074, -2.035525, -6.885813]),
    (0.12, [39.870781, 15.397093, -1.873976, -6.310116]),
    (0.15, [39.609399, 15.509663, -1.693488, -5.757349]),
    (0.2, [39.328559, 15.631741, -1.475647, -5.148717]),
    (0.25, [39.138991, 15.718298, -1.314172, -4.717132]),
    (0.3, [38.997460, 15.786540, -1.185741, -4.378657]),
    (0.35, [38.884424, 15.843119, -1.078912, -4.098346]),
    (0.4, [38.790190, 15.891509, -0.987373, -3.858094]),
    (0.45, [38.788693, 15.910427, -0.902542, -3.627180]),
    (0.5, [38.830946, 15.941990, -0.813909, -3.373893]),
    (0.6, [38.955252, 16.024850, -0.631668, -2.791363]),
    (0.7, [39.110299, 16.124426, -0.482602, -2.122310]),
    (0.8, [39.269129, 16.224456, -0.368680, -1.467000]),
    (0.9, [39.417294, 16.317077, -0.247904, -0.874196]),
    (1.0, [39.554751, 16.403787, -0.116194, -0.331360]),
    (1.1, [39.679285, 16.485416, 0.018165, 0.168528]),
    (1.2, [39.784192, 16.561548, 0.131755, 0.623587]),
    (1.35, [39.884368, 16.660056, 0.225311, 1.214171]),
    (1.5, [39.912829, 16.732125, 0.258939, 1.708870]),
    (1.7, [39.881558, 16.797933, 0.309314, 2.264210]),
    (2.0, [39.778899, 16.863139, 0.390860, 2.953299]),
    (2.5, [39.584570, 16.934390, 0.516397, 3.859758]),
    (3.0, [39.405064, 16.984937, 0.622903, 4.571248]),
    (4.0, [39.107795, 17.057426, 0.792115, 5.644757]),
    (5.0, [38.876323, 17.109658, 0.922742, 6.438969]),
    (7.0, [38.541454, 17.183235, 1.117710, 7.577941]),
    (10.0, [38.222941, 17.254650, 1.320825, 8.711216]),
    (15.0, [37.925601, 17.327276, 1.545937, 9.903136]),
    (20.0, [37.760890, 17.373224, 1.701814, 10.681514]),
    (30.0, [37.589230, 17.430455, 1.917554, 11.679499]),
    (50.0, [37.453308, 17.491245, 2.187038, 12.779956]),
    (70.0, [37.399390, 17.525400, 2.365549, 13.422046]),
    (100.0, [37.364512, 17.557435, 2.557489, 14.044771]),
    (150.0, [37.345303, 17.589507, 2.779742, 14.693261]),
];

/// The metallicity of [`REFINED_MODELS_LOW_Z`].
pub const LOW_Z: f64 = 0.002;

/// Reference models of the refined physics at X = 0.70, Z = [`LOW_Z`] (computed by this program:
/// `cargo run --release --example guess_table -- refined 0.002`; masses from just above the
/// hydrogen-burning limit there). With [`REFINED_MODELS`] they give the guess at any Z by
/// interpolation in ln Z (with [`REFINED_MODELS_HIGH_Z`] above Z = 0.02).
pub const REFINED_MODELS_LOW_Z: [(f64, GuessRow); 37] = [
    (0.08, [41.171092, 14.931676, -2.408590, -8.298264]),
    (0.085, [40.863696, 15.097595, -2.300669, -7.467302]),
    (0.09, [40.661274, 15.187673, -2.220462, -7.049685]),
    (0.1, [40.397113, 15.297081, -2.099800, -6.553230]),
    (0.12, [40.083591, 15.424902, -1.926955, -5.965759]),
    (0.15, [39.802663, 15.542308, -1.741597, -5.409456]),
    (0.2, [39.514269, 15.668024, -1.521905, -4.795927]),
    (0.25, [39.324815, 15.756876, -1.360517, -4.359479]),
    (0.3, [39.185637, 15.826927, -1.232734, -4.015446]),
    (0.35, [39.075962, 15.885104, -1.126794, -3.728659]),
    (0.4, [39.024270, 15.923530, -1.034589, -3.472216]),
    (0.45, [39.073637, 15.960941, -0.937883, -3.177023]),
    (0.5, [39.145627, 16.010653, -0.837805, -2.831464]),
    (0.6, [39.323032, 16.129932, -0.678307, -2.034616]),
    (0.7, [39.500093, 16.247085, -0.560367, -1.275300]),
    (0.8, [39.660937, 16.353548, -0.442824, -0.604095]),
    (0.9, [39.804631, 16.450534, -0.320437, -0.007896]),
    (1.0, [39.929719, 16.538730, -0.208770, 0.522135]),
    (1.1, [40.034365, 16.617911, -0.133113, 0.991377]),
    (1.2, [40.118119, 16.687927, -0.102834, 1.407966]),
    (1.35, [40.205003, 16.776665, -0.076855, 1.951185]),
    (1.5, [40.248125, 16.847368, -0.047602, 2.415535]),
    (1.7, [40.251244, 16.918440, -0.002361, 2.942045]),
    (2.0, [40.188732, 16.991860, 0.072514, 3.592003]),
    (2.5, [40.027542, 17.069971, 0.194953, 4.435794]),
    (3.0, [39.863271, 17.122919, 0.303932, 5.090733]),
    (4.0, [39.581137, 17.196064, 0.483505, 6.072527]),
    (5.0, [39.358860, 17.247560, 0.626011, 6.798657]),
    (7.0, [39.037114, 17.319469, 0.842756, 7.846750]),
    (10.0, [38.731956, 17.389397, 1.071109, 8.903342]),
    (15.0, [38.447740, 17.461257, 1.323770, 10.033072]),
    (20.0, [38.290544, 17.507262, 1.496588, 10.781438]),
    (30.0, [38.127232, 17.565169, 1.731292, 11.752084]),
    (50.0, [37.999276, 17.627299, 2.017314, 12.833706]),
    (70.0, [37.949502, 17.662386, 2.203331, 13.468101]),
    (100.0, [37.917925, 17.695269, 2.400259, 14.083159]),
    (150.0, [37.901443, 17.728115, 2.624577, 14.722838]),
];

/// The metallicity of [`REFINED_MODELS_HIGH_Z`].
pub const HIGH_Z: f64 = 0.04;

/// Reference models of the refined physics at X = 0.70, Z = [`HIGH_Z`] (computed by this
/// program: `cargo run --release --example guess_table -- refined 0.04`).
pub const REFINED_MODELS_HIGH_Z: [(f64, GuessRow); 38] = [
    (0.075, [40.654515, 14.939932, -2.313651, -8.749395]),
    (0.08, [40.485528, 15.051722, -2.238227, -8.130888]),
    (0.085, [40.350524, 15.129860, -2.173070, -7.716308]),
    (0.09, [40.237398, 15.189157, -2.115133, -7.411087]),
    (0.1, [40.057573, 15.276495, -2.015467, -6.970978]),
    (0.12, [39.802379, 15.391400, -1.857132, -6.401251]),
    (0.15, [39.547357, 15.502251, -1.678220, -5.851387]),
    (0.2, [39.269497, 15.623057, -1.461099, -5.245254]),
    (0.25, [39.080001, 15.708778, -1.299614, -4.815344]),
    (0.3, [38.937879, 15.776397, -1.171011, -4.478596]),
    (0.35, [38.824098, 15.832485, -1.063975, -4.200216]),
    (0.4, [38.729012, 15.880471, -0.972209, -3.962048]),
    (0.45, [38.656198, 15.914717, -0.891874, -3.752804]),
    (0.5, [38.663072, 15.932444, -0.815200, -3.545704]),
    (0.6, [38.747797, 15.992105, -0.655045, -3.084919]),
    (0.7, [38.869014, 16.069601, -0.496296, -2.549899]),
    (0.8, [39.012269, 16.158578, -0.371674, -1.954826]),
    (0.9, [39.155912, 16.246245, -0.264945, -1.381169]),
    (1.0, [39.291629, 16.328548, -0.150342, -0.853440]),
    (1.1, [39.418944, 16.406665, -0.024711, -0.362435]),
    (1.2, [39.534677, 16.481261, 0.106103, 0.096606]),
    (1.35, [39.666231, 16.585289, 0.272179, 0.716309]),
    (1.5, [39.719237, 16.667077, 0.366475, 1.236195]),
    (1.7, [39.701545, 16.739251, 0.420562, 1.811359]),
    (2.0, [39.605020, 16.807733, 0.500932, 2.521129]),
    (2.5, [39.414646, 16.880753, 0.627035, 3.458963]),
    (3.0, [39.237918, 16.932301, 0.734478, 4.200331]),
    (4.0, [38.944397, 17.006456, 0.904359, 5.326023]),
    (5.0, [38.714757, 17.060122, 1.034452, 6.161810]),
    (7.0, [38.380454, 17.135902, 1.226612, 7.359956]),
    (10.0, [38.060317, 17.209380, 1.424410, 8.546619]),
    (15.0, [37.760158, 17.283710, 1.641402, 9.784642]),
    (20.0, [37.593674, 17.330422, 1.790822, 10.586561]),
    (30.0, [37.420215, 17.388221, 1.997408, 11.607193]),
    (50.0, [37.282953, 17.449189, 2.256361, 12.724423]),
    (70.0, [37.228613, 17.483322, 2.428994, 13.373831]),
    (100.0, [37.194065, 17.515400, 2.616864, 14.004476]),
    (150.0, [37.175678, 17.547575, 2.837207, 14.661728]),
];

/// The hydrogen mass fractions of [`REFINED_MODELS_LOW_X`] and [`REFINED_MODELS_HIGH_X`].
pub const LOW_X: f64 = 0.65;
/// See [`LOW_X`].
pub const HIGH_X: f64 = 0.75;

/// Reference models of the refined physics at X = [`LOW_X`], Z = 0.02 (computed by this program:
/// `cargo run --release --example guess_table -- refined 0.02 0.65`; `0.75` for the next table).
/// With [`REFINED_MODELS`] they shift the guess linearly in X.
pub const REFINED_MODELS_LOW_X: [(f64, GuessRow); 38] = [
    (0.075, [40.596799, 15.044604, -2.299602, -8.257040]),
    (0.08, [40.441465, 15.135987, -2.227326, -7.774515]),
    (0.085, [40.315741, 15.202547, -2.164410, -7.434502]),
    (0.09, [40.211421, 15.254705, -2.108611, -7.172415]),
    (0.1, [40.044951, 15.334176, -2.012188, -6.777348]),
    (0.12, [39.805503, 15.442727, -1.857700, -6.242083]),
    (0.15, [39.562641, 15.550494, -1.681783, -5.708259]),
    (0.2, [39.295440, 15.670090, -1.467287, -5.110164]),
    (0.25, [39.113628, 15.756088, -1.307663, -4.681819]),
    (0.3, [38.977013, 15.824225, -1.180390, -4.344173]),
    (0.35, [38.867435, 15.880853, -1.074378, -4.063641]),
    (0.4, [38.830681, 15.909618, -0.981072, -3.811289]),
    (0.45, [38.872788, 15.942513, -0.885080, -3.536681]),
    (0.5, [38.935124, 15.984786, -0.785378, -3.232068]),
    (0.6, [39.093199, 16.087423, -0.600103, -2.532700]),
    (0.7, [39.270077, 16.199291, -0.469493, -1.794014]),
    (0.8, [39.435836, 16.302995, -0.340553, -1.126523]),
    (0.9, [39.587970, 16.399078, -0.197824, -0.522616]),
    (1.0, [39.723692, 16.488828, -0.048918, 0.028585]),
    (1.1, [39.834022, 16.571838, 0.077128, 0.525702]),
    (1.2, [39.906505, 16.644239, 0.155703, 0.963110]),
    (1.35, [39.943094, 16.725850, 0.200690, 1.521715]),
    (1.5, [39.922177, 16.782730, 0.242634, 1.994699]),
    (1.7, [39.854701, 16.836592, 0.303258, 2.535274]),
    (2.0, [39.728689, 16.893686, 0.392031, 3.213258]),
    (2.5, [39.520850, 16.959916, 0.521437, 4.108173]),
    (3.0, [39.336906, 17.008447, 0.629005, 4.810953]),
    (4.0, [39.038231, 17.079141, 0.798527, 5.871434]),
    (5.0, [38.808666, 17.130419, 0.928936, 6.656070]),
    (7.0, [38.480437, 17.202713, 1.123194, 7.780957]),
    (10.0, [38.172889, 17.272720, 1.325124, 8.898597]),
    (15.0, [37.890549, 17.343670, 1.548599, 10.070533]),
    (20.0, [37.736312, 17.388443, 1.703411, 10.833458]),
    (30.0, [37.577313, 17.444116, 1.918115, 11.809521]),
    (50.0, [37.452987, 17.503206, 2.187155, 12.885257]),
    (70.0, [37.404454, 17.536430, 2.365744, 13.513844]),
    (100.0, [37.373954, 17.567658, 2.558165, 14.125039]),
    (150.0, [37.358221, 17.598938, 2.780537, 14.762276]),
];

/// Reference models of the refined physics at X = [`HIGH_X`], Z = 0.02 (as [`REFINED_MODELS_LOW_X`]).
pub const REFINED_MODELS_HIGH_X: [(f64, GuessRow); 37] = [
    (0.08, [40.843090, 14.891919, -2.326458, -8.732378]),
    (0.085, [40.641821, 15.022854, -2.245147, -8.013699]),
    (0.09, [40.484312, 15.108679, -2.176228, -7.569588]),
    (0.1, [40.248749, 15.220205, -2.062759, -7.018506]),
    (0.12, [39.944203, 15.351380, -1.892227, -6.385061]),
    (0.15, [39.660860, 15.469924, -1.706320, -5.808744]),
    (0.2, [39.365177, 15.595041, -1.484833, -5.188015]),
    (0.25, [39.167583, 15.682374, -1.321429, -4.752351]),
    (0.3, [39.021007, 15.750822, -1.191812, -4.412534]),
    (0.35, [38.904529, 15.807429, -1.084176, -4.132024]),
    (0.4, [38.807655, 15.855769, -0.992015, -3.892154]),
    (0.45, [38.735622, 15.890327, -0.911346, -3.681156]),
    (0.5, [38.749308, 15.910134, -0.832985, -3.467291]),
    (0.6, [38.841934, 15.975185, -0.666766, -2.979971]),
    (0.7, [38.969379, 16.058592, -0.504989, -2.408438]),
    (0.8, [39.115278, 16.151720, -0.384686, -1.788083]),
    (0.9, [39.257875, 16.241340, -0.280193, -1.204432]),
    (1.0, [39.391658, 16.324943, -0.167593, -0.671493]),
    (1.1, [39.516919, 16.403814, -0.046371, -0.179018]),
    (1.2, [39.632095, 16.478563, 0.075405, 0.278067]),
    (1.35, [39.774471, 16.582023, 0.220225, 0.892398]),
    (1.5, [39.859614, 16.669568, 0.284198, 1.415555]),
    (1.7, [39.883025, 16.752409, 0.322664, 1.994766]),
    (2.0, [39.817271, 16.830073, 0.393254, 2.699164]),
    (2.5, [39.642906, 16.908529, 0.512633, 3.617765]),
    (3.0, [39.469792, 16.961701, 0.617387, 4.337706]),
    (4.0, [39.175427, 17.036296, 0.785867, 5.423779]),
    (5.0, [38.942861, 17.089529, 0.916573, 6.227213]),
    (7.0, [38.602502, 17.164353, 1.112098, 7.379609]),
    (10.0, [38.274146, 17.237101, 1.316251, 8.527545]),
    (15.0, [37.962627, 17.311328, 1.542908, 9.738126]),
    (20.0, [37.787657, 17.358414, 1.699857, 10.531126]),
    (30.0, [37.603292, 17.417168, 1.916715, 11.550266]),
    (50.0, [37.455529, 17.479639, 2.186761, 12.675100]),
    (70.0, [37.396087, 17.514722, 2.365250, 13.330681]),
    (100.0, [37.356743, 17.547569, 2.556799, 13.965048]),
    (150.0, [37.333949, 17.580431, 2.778854, 14.624743]),
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
