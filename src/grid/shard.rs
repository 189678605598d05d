//! Deterministic shards of a grid for batch clusters.

use crate::error::{Error, Result};

/// The K-th (1-based) of N slices.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub struct Shard {
    /// This slice, 1..=n.
    pub k: usize,
    /// Number of slices.
    pub n: usize,
}

impl Shard {
    /// Parse `K/N` with 1 <= K <= N.
    pub fn parse(text: &str) -> Result<Self> {
        let bad = |why: &str| {
            Error::invalid(
                "shard",
                text,
                &format!("{why}; a shard is K/N with whole numbers 1 <= K <= N, e.g. 2/8"),
            )
        };
        let (k, n) = text.split_once('/').ok_or_else(|| bad("no '/'"))?;
        let k: usize = k
            .trim()
            .parse()
            .map_err(|_| bad("K is not a whole number"))?;
        let n: usize = n
            .trim()
            .parse()
            .map_err(|_| bad("N is not a whole number"))?;
        if n == 0 || k == 0 || k > n {
            return Err(bad("K or N is out of range"));
        }
        Ok(Self { k, n })
    }

    /// Whether the grid point with canonical `key` belongs to this shard: FNV-1a (64-bit) of the
    /// key, modulo N. The assignment depends only on the point itself, so it is stable when the
    /// input lists are reordered.
    pub fn contains(&self, key: &str) -> bool {
        (fnv1a(key.as_bytes()) % self.n as u64) as usize == self.k - 1
    }
}

/// FNV-1a 64-bit hash (Fowler, Noll, Vo; public-domain algorithm), fixed across platforms.
pub fn fnv1a(bytes: &[u8]) -> u64 {
    let mut h: u64 = 0xcbf2_9ce4_8422_2325;
    for &b in bytes {
        h ^= u64::from(b);
        h = h.wrapping_mul(0x0000_0100_0000_01b3);
    }
    h
}

#[cfg(test)]
mod tests {
    use super::*;

    /// FNV-1a test vectors: "" -> cbf29ce484222325, "a" -> af63dc4c8601ec8c (published with the
    /// algorithm; from memory).
    #[test]
    fn fnv_test_vectors() {
        assert_eq!(fnv1a(b""), 0xcbf2_9ce4_8422_2325);
        assert_eq!(fnv1a(b"a"), 0xaf63_dc4c_8601_ec8c);
    }

    #[test]
    fn shards_partition_the_keys() {
        let keys: Vec<String> = (0..100).map(|i| format!("point-{i}")).collect();
        let n = 3;
        for key in &keys {
            let owners = (1..=n).filter(|&k| Shard { k, n }.contains(key)).count();
            assert_eq!(owners, 1);
        }
        for bad in ["0/3", "4/3", "1/0", "3", "a/b"] {
            assert!(Shard::parse(bad).is_err(), "{bad}");
        }
    }
}
