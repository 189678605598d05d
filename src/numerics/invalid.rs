//! A numerical tool's setting that is not allowed (the numerics know nothing of the library's
//! error type; [`crate::error::Error`] takes this one in as `InvalidInput`).

use std::fmt;

/// A setting of a numerical tool outside what it allows: its name, the value given and what
/// is allowed.
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct InvalidSetting {
    /// The setting, e.g. `max_step`.
    pub name: String,
    /// The value as given.
    pub value: String,
    /// What is allowed.
    pub allowed: String,
}

impl InvalidSetting {
    /// The setting `name` = `value`, outside what is `allowed`.
    pub fn new(name: &str, value: impl fmt::Display, allowed: &str) -> Self {
        Self {
            name: name.to_string(),
            value: value.to_string(),
            allowed: allowed.to_string(),
        }
    }
}

impl fmt::Display for InvalidSetting {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        write!(
            f,
            "invalid {} = {}: {}",
            self.name, self.value, self.allowed
        )
    }
}

impl std::error::Error for InvalidSetting {}
