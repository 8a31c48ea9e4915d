//! A lot packed in cartons: the cartons' sizes and the numbering of their
//! units, and the share of the sample each carton gets.

use serde::Serialize;

/// One carton of a stratified draw: which units it holds and how many of
/// them are drawn.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Serialize)]
pub struct CartonShare {
    /// The carton's number, from 1.
    pub carton: u64,
    /// The lot position of its first unit.
    pub first: u64,
    /// How many units it holds.
    pub size: u64,
    /// How many of them are drawn.
    pub sample: u64,
}

impl CartonShare {
    /// The lot position of its last unit.
    pub fn last(&self) -> u64 {
        self.first + self.size - 1
    }
}

/// The cartons of a lot of `lot_size` units in `cartons` cartons, and the
/// share of a sample of `sample` units each gets
/// (`1 <= cartons <= lot_size`, `sample <= lot_size`; other values give
/// an empty list).
///
/// Sizes: with `lot_size = q * cartons + r` (`0 <= r < cartons`), the
/// first `r` cartons hold `q + 1` units and the others `q`. The units are
/// numbered carton by carton: carton 1 holds positions `1..=s1`, carton 2
/// the next `s2`, and so on.
///
/// Shares: proportional to the sizes by the largest-remainder method
/// (Hamilton's): carton `i` first gets `floor(sample * s_i / lot_size)`;
/// the units left over go one each to the cartons with the largest
/// remainders `sample * s_i mod lot_size`, the lower carton number first
/// on a tie. The shares sum to `sample`, and none exceeds its carton
/// (a quota with a remainder is below `s_i`, so its floor plus one is at
/// most `s_i`).
pub fn carton_shares(lot_size: u64, cartons: u64, sample: u64) -> Vec<CartonShare> {
    if cartons == 0 || cartons > lot_size || sample > lot_size {
        return Vec::new();
    }
    let (q, r) = (lot_size / cartons, lot_size % cartons);
    let mut shares = Vec::with_capacity(usize::try_from(cartons).unwrap_or(0));
    let mut remainders = Vec::with_capacity(shares.capacity());
    let mut first = 1;
    let mut given = 0;
    for carton in 1..=cartons {
        let size = if carton <= r { q + 1 } else { q };
        let quota = u128::from(sample) * u128::from(size);
        let floor = u64::try_from(quota / u128::from(lot_size)).unwrap_or(size);
        remainders.push((quota % u128::from(lot_size), carton));
        shares.push(CartonShare {
            carton,
            first,
            size,
            sample: floor,
        });
        given += floor;
        first += size;
    }
    // Largest remainder first; on a tie, the lower carton number.
    remainders.sort_unstable_by(|a, b| b.0.cmp(&a.0).then(a.1.cmp(&b.1)));
    let left = usize::try_from(sample - given).unwrap_or(0);
    for &(_, carton) in remainders.iter().take(left) {
        if let Some(s) = usize::try_from(carton - 1)
            .ok()
            .and_then(|i| shares.get_mut(i))
        {
            s.sample += 1;
        }
    }
    shares
}

#[cfg(test)]
mod tests {
    use super::*;

    /// 10 units in 3 cartons: sizes 4, 3, 3 (positions 1-4, 5-7, 8-10); a
    /// sample of 5 has quotas 2, 1.5, 1.5: floors 2, 1, 1 and the one unit
    /// left goes to carton 2 (remainder tie, lower number).
    #[test]
    fn a_worked_allocation() {
        let s = carton_shares(10, 3, 5);
        let got: Vec<(u64, u64, u64)> = s.iter().map(|c| (c.first, c.size, c.sample)).collect();
        assert_eq!(got, vec![(1, 4, 2), (5, 3, 2), (8, 3, 1)]);
        assert_eq!(s[2].last(), 10);
    }

    #[test]
    fn shares_sum_to_the_sample_and_fit_their_cartons() {
        for n in 1..=40u64 {
            for c in 1..=n {
                for k in 0..=n {
                    let s = carton_shares(n, c, k);
                    assert_eq!(s.len() as u64, c);
                    assert_eq!(s.iter().map(|x| x.sample).sum::<u64>(), k);
                    assert_eq!(s.iter().map(|x| x.size).sum::<u64>(), n);
                    assert!(s.iter().all(|x| x.sample <= x.size));
                    assert_eq!(s[s.len() - 1].last(), n);
                }
            }
        }
    }
}
