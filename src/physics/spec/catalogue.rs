//! The catalogue of laws: one row per law (name, parameters with defaults and ranges, one-line
//! help, published source). The command-line help, the "allowed" messages, `probe`'s list, the
//! property tests and the README's law table are all generated from or checked against it.

/// A kind of law, named by its model-file key.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash, PartialOrd, Ord)]
pub enum LawKind {
    /// The preset a set starts from.
    Preset,
    /// Equation of state.
    Eos,
    /// Opacity.
    Opacity,
    /// Nuclear energy generation.
    Rates,
    /// Convection.
    Convection,
    /// Outer boundary (atmosphere).
    Atmosphere,
}

impl LawKind {
    /// Every kind, in the order the help and the README list them.
    pub const ALL: [LawKind; 6] = [
        LawKind::Preset,
        LawKind::Eos,
        LawKind::Opacity,
        LawKind::Rates,
        LawKind::Convection,
        LawKind::Atmosphere,
    ];

    /// The model-file and JSON key of this kind (also the variant key).
    pub fn key(self) -> &'static str {
        match self {
            LawKind::Preset => "preset",
            LawKind::Eos => "eos",
            LawKind::Opacity => "opacity",
            LawKind::Rates => "rates",
            LawKind::Convection => "convection",
            LawKind::Atmosphere => "atmosphere",
        }
    }

    /// The catalogue rows of this kind.
    pub fn entries(self) -> &'static [LawEntry] {
        match self {
            LawKind::Preset => super::preset::CATALOGUE,
            LawKind::Eos => super::eos::CATALOGUE,
            LawKind::Opacity => super::opacity::CATALOGUE,
            LawKind::Rates => super::rates::CATALOGUE,
            LawKind::Convection => super::convection::CATALOGUE,
            LawKind::Atmosphere => super::atmosphere::CATALOGUE,
        }
    }
}

/// A parameter's default: a number, or one computed from other published numbers.
#[derive(Debug, Clone, Copy)]
pub enum ParamDefault {
    /// A fixed number.
    Value(f64),
    /// Computed (e.g. a rate coefficient matched to another law at a reference point).
    Computed(fn() -> f64),
}

/// One numeric parameter of a law.
#[derive(Debug, Clone, Copy)]
pub struct Param {
    /// The key in `NAME:KEY=VALUE`.
    pub key: &'static str,
    /// Its default.
    pub default: ParamDefault,
    /// Smallest allowed value (inclusive).
    pub min: f64,
    /// Largest allowed value (inclusive).
    pub max: f64,
    /// Unit, or "" for a pure number.
    pub unit: &'static str,
    /// What it is, in a few words.
    pub help: &'static str,
}

impl Param {
    /// The default value.
    pub fn default_value(&self) -> f64 {
        match self.default {
            ParamDefault::Value(v) => v,
            ParamDefault::Computed(f) => f(),
        }
    }

    /// Whether `v` is finite and in [min, max].
    pub fn contains(&self, v: f64) -> bool {
        v.is_finite() && v >= self.min && v <= self.max
    }

    /// The range as text, e.g. `[0.1, 10]`.
    pub fn range_text(&self) -> String {
        format!("[{}, {}]", self.min, self.max)
    }
}

/// One law in the catalogue.
#[derive(Debug)]
pub struct LawEntry {
    /// The name a user selects it by.
    pub name: &'static str,
    /// Its numeric parameters (empty if none).
    pub params: &'static [Param],
    /// Whether it reads a file (`NAME:PATH`) instead of taking numeric parameters.
    pub reads_file: bool,
    /// One line of help.
    pub help: &'static str,
    /// The published source of the law.
    pub source: &'static str,
}

impl LawEntry {
    /// The syntax of this row, e.g. `kramers[:guillotine=T]` or `table:PATH`.
    pub fn syntax(&self) -> String {
        if self.reads_file {
            return format!("{}:PATH", self.name);
        }
        if self.params.is_empty() {
            return self.name.to_string();
        }
        let keys: Vec<String> = self
            .params
            .iter()
            .map(|p| format!("{}={}", p.key, p.default_value()))
            .collect();
        format!("{}[:{}]", self.name, keys.join(","))
    }
}

/// "allowed: ..." for a kind's rows `entries`: every row's syntax with its defaults, and an
/// example (a row with parameters, written out).
pub fn allowed(entries: &[LawEntry]) -> String {
    let rows: Vec<String> = entries.iter().map(LawEntry::syntax).collect();
    let example = match entries.iter().find(|e| !e.params.is_empty()) {
        Some(e) => {
            let params: Vec<String> = e
                .params
                .iter()
                .map(|p| format!("{}={}", p.key, p.default_value()))
                .collect();
            format!("{}:{}", e.name, params.join(","))
        }
        None => entries
            .first()
            .map_or(String::new(), |e| e.name.to_string()),
    };
    format!("allowed: {} (e.g. {example})", rows.join(", "))
}

/// The help line of a kind: its rows with their one-line help.
pub fn help(kind: LawKind) -> String {
    let rows: Vec<String> = kind
        .entries()
        .iter()
        .map(|e| format!("{} ({})", e.syntax(), e.help))
        .collect();
    rows.join("; ")
}
