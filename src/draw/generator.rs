//! The seeded generator of a draw, and its unbiased bounded integers.

use rand_chacha::ChaCha20Rng;
use rand_chacha::rand_core::{Rng, SeedableRng};

/// The generator as the output names it.
pub const DRAW_GENERATOR: &str = "ChaCha20";

/// ChaCha20 keyed by a draw's seed, read as raw 64-bit words.
///
/// The 256-bit key is the seed's 8 bytes, little-endian, followed by 24
/// zero bytes; the nonce (stream) and the block counter start at 0. Each
/// 64-bit word is two consecutive 32-bit words of the keystream, the first
/// as the low half (little-endian, as the keystream's bytes read). With
/// seed 0 the first word is `0x903d_f1a0_ade0_b876`, the first 8 bytes
/// `76 b8 e0 ad a0 f1 3d 90` of the all-zero key's keystream (RFC 8439,
/// appendix A.1, test vector 1).
#[derive(Clone, Debug)]
pub struct Generator {
    rng: ChaCha20Rng,
}

impl Generator {
    /// The generator keyed by `seed`.
    pub fn new(seed: u64) -> Self {
        let mut key = [0u8; 32];
        key[..8].copy_from_slice(&seed.to_le_bytes());
        Generator {
            rng: ChaCha20Rng::from_seed(key),
        }
    }

    /// The next raw 64-bit word.
    pub fn word(&mut self) -> u64 {
        self.rng.next_u64()
    }

    /// A uniform integer in `0..range` (`range >= 1`; 0 gives 0).
    ///
    /// Lemire's method (D. Lemire, "Fast random integer generation in an
    /// interval", ACM TOMACS 29(1), 2019, algorithm 5): the 128-bit product
    /// `x * range` of a word `x`; its high half is the result unless its
    /// low half falls below `2^64 mod range`, in which case the word is
    /// rejected and another drawn. The accepted words map exactly
    /// `floor(2^64 / range)` to each result, so the result is unbiased. At
    /// most one word in two is rejected (fewer than `range / 2^64` on
    /// average), so the cost is one word per integer in practice.
    pub fn below(&mut self, range: u64) -> u64 {
        if range == 0 {
            return 0;
        }
        let mut product = u128::from(self.word()) * u128::from(range);
        // Truncation to the low 64 bits is the method.
        #[allow(clippy::cast_possible_truncation)]
        let mut low = product as u64;
        if low < range {
            // 2^64 mod range, computed in 64 bits as (2^64 - range) mod range.
            let threshold = range.wrapping_neg() % range;
            while low < threshold {
                product = u128::from(self.word()) * u128::from(range);
                #[allow(clippy::cast_possible_truncation)]
                {
                    low = product as u64;
                }
            }
        }
        #[allow(clippy::cast_possible_truncation)]
        let high = (product >> 64) as u64;
        high
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    /// RFC 8439 appendix A.1, test vector 1: the keystream of the all-zero
    /// key and nonce, block 0, starts 76 b8 e0 ad a0 f1 3d 90 40 5d 6a e5
    /// 53 86 bd 28.
    #[test]
    fn the_zero_key_gives_the_published_keystream() {
        let mut g = Generator::new(0);
        assert_eq!(
            g.word(),
            u64::from_le_bytes([0x76, 0xb8, 0xe0, 0xad, 0xa0, 0xf1, 0x3d, 0x90])
        );
        assert_eq!(
            g.word(),
            u64::from_le_bytes([0x40, 0x5d, 0x6a, 0xe5, 0x53, 0x86, 0xbd, 0x28])
        );
    }

    #[test]
    fn bounded_integers_stay_in_range() {
        let mut g = Generator::new(7);
        for range in [1u64, 2, 3, 10, 1 << 40, u64::MAX] {
            for _ in 0..100 {
                assert!(g.below(range) < range);
            }
        }
        assert_eq!(g.below(1), 0);
    }

    /// A range just above 2^63 rejects almost half the words: the rejection
    /// branch runs, and the results still fall in range.
    #[test]
    fn the_rejection_branch_keeps_results_in_range() {
        let mut g = Generator::new(11);
        let range = (1u64 << 63) + 1;
        for _ in 0..1000 {
            assert!(g.below(range) < range);
        }
    }
}
