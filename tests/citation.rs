//! The licence and citation files: LICENSE-MIT and LICENSE-APACHE are the standard texts named
//! by Cargo.toml's `license = "MIT OR Apache-2.0"`, and CITATION.cff uses only the keys of the
//! Citation File Format 1.2.0 with its required ones present and the package's own version.
//!
//! Source for the key lists: the CFF 1.2.0 JSON schema (`schema.json` of the format's 1.2.0
//! release, as bundled with the `cffconvert` 2.0.0 package on PyPI: its `properties` and
//! `required`, with `additionalProperties: false`; confirmed). CITATION.cff was also checked
//! by hand with `cffconvert --validate` 2.0.0. The licence identifiers are SPDX's.

use std::path::Path;

fn read(name: &str) -> String {
    let path = Path::new(env!("CARGO_MANIFEST_DIR")).join(name);
    std::fs::read_to_string(&path).unwrap_or_else(|e| panic!("{}: {e}", path.display()))
}

/// Every top-level key CFF 1.2.0 allows.
const CFF_KEYS: [&str; 21] = [
    "abstract",
    "authors",
    "cff-version",
    "commit",
    "contact",
    "date-released",
    "doi",
    "identifiers",
    "keywords",
    "license",
    "license-url",
    "message",
    "preferred-citation",
    "references",
    "repository",
    "repository-artifact",
    "repository-code",
    "title",
    "type",
    "url",
    "version",
];

/// The keys CFF 1.2.0 requires.
const CFF_REQUIRED: [&str; 4] = ["authors", "cff-version", "message", "title"];

/// Top-level (key, value on the same line) pairs of a block-style YAML mapping: lines that
/// start in column one, are not comments or list items, and hold `key:`.
fn top_level(yaml: &str) -> Vec<(String, String)> {
    yaml.lines()
        .filter(|l| !l.starts_with([' ', '#', '-']) && !l.trim().is_empty())
        .map(|l| {
            let (key, value) = l
                .split_once(':')
                .unwrap_or_else(|| panic!("no key in '{l}'"));
            (key.to_string(), value.trim().trim_matches('"').to_string())
        })
        .collect()
}

/// The items of the block list under top-level `key`.
fn list_under(yaml: &str, key: &str) -> Vec<String> {
    yaml.lines()
        .skip_while(|l| !l.starts_with(&format!("{key}:")))
        .skip(1)
        .take_while(|l| l.starts_with(' ') || l.starts_with('-'))
        .filter_map(|l| l.trim().strip_prefix("- ").map(str::to_string))
        .collect()
}

#[test]
fn citation_file_follows_cff_1_2_0() {
    let cff = read("CITATION.cff");
    let keys = top_level(&cff);
    for (key, _) in &keys {
        assert!(
            CFF_KEYS.contains(&key.as_str()),
            "'{key}' is not a CFF 1.2.0 key"
        );
    }
    for required in CFF_REQUIRED {
        assert!(
            keys.iter().any(|(k, _)| k == required),
            "'{required}' missing"
        );
    }
    let value = |key: &str| {
        keys.iter()
            .find(|(k, _)| k == key)
            .map(|(_, v)| v.clone())
            .unwrap_or_else(|| panic!("no {key}"))
    };
    assert_eq!(value("cff-version"), "1.2.0");
    assert_eq!(value("title"), env!("CARGO_PKG_NAME"));
    assert_eq!(value("version"), env!("CARGO_PKG_VERSION"));
    assert_eq!(value("type"), "software");
    assert!(!value("message").is_empty());
    // The abstract is a folded block: at least a few lines of text under the key.
    let abstract_lines = cff
        .lines()
        .skip_while(|l| !l.starts_with("abstract:"))
        .skip(1)
        .take_while(|l| l.starts_with("  "))
        .count();
    assert!(abstract_lines >= 3, "abstract too short");
    assert_eq!(
        list_under(&cff, "authors"),
        ["name: The starpoise developers"]
    );
    // A list of licences means any one of them (CFF 1.2.0), as Cargo.toml's OR does.
    let licenses = list_under(&cff, "license");
    let expected: Vec<String> = env!("CARGO_PKG_LICENSE")
        .split(" OR ")
        .map(str::to_string)
        .collect();
    assert_eq!(licenses, expected);
    assert!(list_under(&cff, "keywords").len() >= 3);
}

#[test]
fn licence_files_are_the_standard_texts() {
    let mit = read("LICENSE-MIT");
    assert!(mit.starts_with("MIT License\n\nCopyright (c) 2026 the starpoise developers\n"));
    for phrase in [
        "Permission is hereby granted, free of charge, to any person obtaining a copy",
        "The above copyright notice and this permission notice shall be included in all",
        "THE SOFTWARE IS PROVIDED \"AS IS\", WITHOUT WARRANTY OF ANY KIND, EXPRESS OR",
    ] {
        assert!(mit.contains(phrase), "LICENSE-MIT lacks '{phrase}'");
    }
    let apache = read("LICENSE-APACHE");
    for phrase in [
        "Apache License",
        "Version 2.0, January 2004",
        "TERMS AND CONDITIONS FOR USE, REPRODUCTION, AND DISTRIBUTION",
        "9. Accepting Warranty or Additional Liability.",
        "END OF TERMS AND CONDITIONS",
        "APPENDIX: How to apply the Apache License to your work.",
    ] {
        assert!(apache.contains(phrase), "LICENSE-APACHE lacks '{phrase}'");
    }
    // The canonical text has 202 lines (the copy in Debian's common-licenses).
    assert_eq!(apache.lines().count(), 202);
    assert_eq!(env!("CARGO_PKG_LICENSE"), "MIT OR Apache-2.0");
    // The embedded font travels with its licence.
    let font_licence = read("assets/fonts/DejaVuSans-LICENSE.txt");
    assert!(font_licence.contains("Bitstream Vera Fonts Copyright"));
    assert!(font_licence.contains("Arev Fonts Copyright"));
}
