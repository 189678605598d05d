//! Print the README's table of laws from the catalogue (`starpoise::physics::spec::catalogue`):
//! `cargo run --release --example law_table`. tests/spec.rs checks that README lists every law.

use starpoise::physics::spec::LawKind;

fn main() {
    println!("| key | law | what it is | source |");
    println!("|---|---|---|---|");
    for kind in LawKind::ALL {
        for e in kind.entries() {
            println!(
                "| `{}` | `{}` | {} | {} |",
                kind.key(),
                e.syntax(),
                e.help,
                e.source
            );
        }
    }
}
