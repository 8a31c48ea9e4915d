//! The seed of a draw: given, or derived from the lot ID and the plan
//! source, so that the draw can be made again from what the ledger keeps.

use sha2::{Digest, Sha256};

/// Where a draw's seed came from.
#[derive(Clone, Debug, PartialEq, Eq)]
pub enum SeedSource {
    /// Given by the user (`--seed`).
    Given,
    /// Derived from the lot ID alone (no plan source given).
    Lot,
    /// Derived from the plan source's SHA-256 (lowercase hex) and the lot
    /// ID.
    PlanAndLot {
        /// The SHA-256 of the plan source's text, lowercase hex.
        plan_sha256: String,
    },
}

/// The seed derived from the lot ID, and from the plan source's SHA-256
/// when one is given.
///
/// ```text
/// with a plan:    seed = first 8 bytes of SHA-256(H || 0x00 || L)
/// without a plan: seed = first 8 bytes of SHA-256(L)
/// ```
///
/// where `H` is the plan source's SHA-256 written as 64 lowercase hex
/// digits (ASCII, as the ledger records it), `L` the lot ID's UTF-8 bytes,
/// and the 8 bytes are read as a big-endian unsigned integer: the first 16
/// hex digits of the digest. In a shell:
/// `printf '%s\0%s' "$H" "$L" | sha256sum | cut -c1-16` gives them.
///
/// ```
/// // printf '%s' L-1 | sha256sum | cut -c1-16 prints 3f4d74109fa7ca3d.
/// assert_eq!(lotsman::draw_seed(None, "L-1"), 0x3f4d_7410_9fa7_ca3d);
/// ```
pub fn draw_seed(plan_sha256: Option<&str>, lot: &str) -> u64 {
    let mut hasher = Sha256::new();
    if let Some(h) = plan_sha256 {
        hasher.update(h.to_ascii_lowercase().as_bytes());
        hasher.update([0u8]);
    }
    hasher.update(lot.as_bytes());
    let digest = hasher.finalize();
    let mut first = [0u8; 8];
    first.copy_from_slice(&digest[..8]);
    u64::from_be_bytes(first)
}

#[cfg(test)]
mod tests {
    use super::*;

    /// Pinned against coreutils' sha256sum:
    /// `printf '%s' LOT-0417 | sha256sum | cut -c1-16` and
    /// `printf '%s\0%s' "$PLAN" LOT-0417 | sha256sum | cut -c1-16`.
    #[test]
    fn the_seed_is_the_digest_s_first_16_hex_digits() {
        assert_eq!(format!("{:016x}", draw_seed(None, "LOT-0417")), SHA_LOT);
        assert_eq!(
            format!("{:016x}", draw_seed(Some(PLAN), "LOT-0417")),
            SHA_PLAN_LOT
        );
    }

    const PLAN: &str = "0000000000000000000000000000000000000000000000000000000000000000";
    const SHA_LOT: &str = "e82e0205da3720b0";
    const SHA_PLAN_LOT: &str = "de6814412b319a33";
}
