//! Grids of models: mass x composition x physics variant, solved in parallel, sliced into
//! deterministic shards for batch clusters.

pub mod compare;
pub mod fits;
pub mod masses;
pub mod merge;
pub mod row;
pub mod run;
pub mod shard;
pub mod table;
pub mod variant;

use crate::error::{Error, Result};

/// The most points one grid may hold (variants x Z x X x masses), checked before anything is
/// allocated.
pub const MAX_GRID_POINTS: usize = 1_000_000;
use crate::physics::{Composition, PhysicsOverrides, PhysicsSet};
pub use masses::{parse_value_list, MAX_LIST_VALUES};
pub use row::{GridRow, RowStatus};
pub use shard::Shard;
pub use table::GridTable;
pub use variant::Variant;

/// One model of a grid.
#[derive(Debug, Clone)]
pub struct GridPoint {
    /// Position in the whole grid's canonical order (variant, Z, X, mass, each as given).
    pub index: usize,
    /// Index of the variant in [`Grid::variants`].
    pub variant: usize,
    /// Mass, M_sun.
    pub mass_msun: f64,
    /// Composition.
    pub composition: Composition,
}

impl GridPoint {
    /// The canonical key of the point, independent of where it stands in the input lists.
    pub fn key(&self, grid: &Grid) -> String {
        format!(
            "{}|{:.15e}|{:.15e}|{:.15e}",
            grid.variants[self.variant].name,
            self.composition.z(),
            self.composition.x(),
            self.mass_msun
        )
    }
}

/// A product grid with the physics of each variant built.
#[derive(Debug, Clone)]
pub struct Grid {
    /// The variants; the first is the reference for comparisons.
    pub variants: Vec<Variant>,
    /// The laws of each variant.
    pub physics: Vec<PhysicsSet>,
    /// Every point, in canonical order.
    pub points: Vec<GridPoint>,
    /// Fitting mass fraction used for every model.
    pub fit_mass_fraction: f64,
}

impl Grid {
    /// The product grid variants x Z x X x masses, in that nesting order. Builds every variant's
    /// physics (so that a bad law name is reported before any model is solved) and every
    /// composition. Errors: more than [`MAX_GRID_POINTS`] points (key `grid size`), and the
    /// errors of the laws and compositions.
    pub fn product(
        base: &PhysicsOverrides,
        variants: Vec<Variant>,
        masses: &[f64],
        xs: &[f64],
        zs: &[f64],
        fit_mass_fraction: f64,
    ) -> Result<Self> {
        let size = [variants.len(), zs.len(), xs.len(), masses.len()]
            .iter()
            .try_fold(1usize, |a, &b| a.checked_mul(b))
            .filter(|&n| n <= MAX_GRID_POINTS);
        if size.is_none() {
            return Err(Error::invalid(
                "grid size",
                format!(
                    "{} variants x {} Z x {} X x {} masses",
                    variants.len(),
                    zs.len(),
                    xs.len(),
                    masses.len()
                ),
                &format!(
                    "a grid holds at most {MAX_GRID_POINTS} points; split it into several runs"
                ),
            ));
        }
        // The base flags on their own first, so that their errors name the flags; then each
        // variant over them, whose errors name the variant.
        PhysicsSet::from_spec(&base.resolve()?)?;
        let physics = variants
            .iter()
            .map(|v| {
                base.overridden_by(&v.overrides)
                    .resolve()
                    .and_then(|spec| PhysicsSet::from_spec(&spec))
                    .map_err(|e| match e {
                        Error::InvalidInput {
                            name,
                            value,
                            allowed,
                        } => Error::invalid(
                            "variant",
                            format!("{}={}", v.name, v.spec),
                            &format!("{name} = {value}: {allowed}"),
                        ),
                        other => other,
                    })
            })
            .collect::<Result<Vec<_>>>()?;
        let mut points = Vec::new();
        for v in 0..variants.len() {
            for &z in zs {
                for &x in xs {
                    let composition = Composition::new(x, z)?;
                    for &mass_msun in masses {
                        points.push(GridPoint {
                            index: points.len(),
                            variant: v,
                            mass_msun,
                            composition,
                        });
                    }
                }
            }
        }
        Ok(Self {
            variants,
            physics,
            points,
            fit_mass_fraction,
        })
    }

    /// A fingerprint of the grid's definition (points, laws, fitting mass), the same for every
    /// shard of one grid: FNV-1a of a canonical description, as 16 hex digits.
    pub fn fingerprint(&self) -> String {
        let mut text = format!("fit={:.6e};", self.fit_mass_fraction);
        for (v, p) in self.variants.iter().zip(&self.physics) {
            let spec = serde_json::to_string(p.spec()).unwrap_or_default();
            text.push_str(&format!("{}={spec};", v.name));
        }
        for p in &self.points {
            text.push_str(&p.key(self));
            text.push(';');
        }
        format!("{:016x}", shard::fnv1a(text.as_bytes()))
    }

    /// Every file the grid's laws read (opacity tables), once each.
    pub fn input_files(&self) -> Vec<std::path::PathBuf> {
        let mut files: Vec<std::path::PathBuf> = Vec::new();
        for p in &self.physics {
            for f in p.spec().input_files() {
                if !files.iter().any(|g| g == f) {
                    files.push(f.to_path_buf());
                }
            }
        }
        files
    }

    /// The points of shard `shard` (all points if `None`).
    pub fn select(&self, shard: Option<Shard>) -> Vec<GridPoint> {
        self.points
            .iter()
            .filter(|p| shard.is_none_or(|s| s.contains(&p.key(self))))
            .cloned()
            .collect()
    }
}
