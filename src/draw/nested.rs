//! One nested draw for several classes whose plans take different
//! samples (a standard-indexed source whose classes fall on different
//! code letters by the arrows of Table II): the parts of the draw end at
//! every cumulative sample size any class takes, and each class counts in
//! the parts up to its own size. Drawn as stages ([`draw_stages`]
//! (crate::draw_stages), `lotsman draw --n 125 --n 75`), the first part is
//! exactly the single draw of its size, so every class's sample is a
//! random sample of the lot; "the first units of a sorted list" would not
//! be.

/// One part of a nested draw: the draw's units `from..=to`, and the
/// classes that count in them.
#[derive(Clone, Debug, PartialEq, Eq)]
pub struct NestedPart {
    /// The first unit of the draw in this part (1-based).
    pub from: u64,
    /// The last unit of the draw in this part.
    pub to: u64,
    /// Each class that counts in this part, with the stage (1-based) of
    /// its plan the part belongs to, and its plan's number of stages.
    pub users: Vec<(String, usize, usize)>,
    /// Whether every class counts in this part at its first stage.
    pub everyone: bool,
}

impl NestedPart {
    /// The units this part adds to the draw.
    pub fn units(&self) -> u64 {
        self.to + 1 - self.from
    }

    /// Who counts in the part, in words: `every class`, or `critical
    /// only`, `critical, stage 2; major, stage 2 only`.
    pub fn who(&self) -> String {
        if self.everyone {
            return "every class".to_string();
        }
        let named: Vec<String> = self
            .users
            .iter()
            .map(|(label, stage, stages)| match stages {
                1 => label.clone(),
                _ => format!("{label}, stage {stage}"),
            })
            .collect();
        format!("{} only", named.join("; "))
    }
}

/// The parts of one nested draw for `classes`, each a label and its
/// plan's cumulative sample sizes (increasing), in the order the parts
/// are drawn.
///
/// # Example
/// ```
/// use lotsman::nested_parts;
/// let classes = [
///     ("major".to_string(), vec![125]),
///     ("critical".to_string(), vec![200]),
/// ];
/// let parts = nested_parts(&classes);
/// assert_eq!(parts.iter().map(|p| p.units()).collect::<Vec<_>>(), [125, 75]);
/// assert_eq!(parts[0].who(), "every class");
/// assert_eq!(parts[1].who(), "critical only");
/// ```
pub fn nested_parts(classes: &[(String, Vec<u64>)]) -> Vec<NestedPart> {
    let ends: std::collections::BTreeSet<u64> = classes
        .iter()
        .flat_map(|(_, sizes)| sizes.iter().copied())
        .filter(|&n| n > 0)
        .collect();
    let mut previous = 0;
    ends.into_iter()
        .map(|end| {
            let users: Vec<(String, usize, usize)> = classes
                .iter()
                .filter_map(|(label, sizes)| {
                    let stage = sizes.iter().position(|&n| n >= end)?;
                    Some((label.clone(), stage + 1, sizes.len()))
                })
                .collect();
            let everyone = users.len() == classes.len() && users.iter().all(|u| u.1 == 1);
            let part = NestedPart {
                from: previous + 1,
                to: end,
                users,
                everyone,
            };
            previous = end;
            part
        })
        .collect()
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn double_plans_of_different_sizes_part_at_every_stage_end() {
        // Two double plans, 80 + 80 and 125 + 125 (cumulative 80, 160 and
        // 125, 250): parts end at 80, 125, 160 and 250.
        let classes = [
            ("A".to_string(), vec![80, 160]),
            ("B".to_string(), vec![125, 250]),
        ];
        let parts = nested_parts(&classes);
        let ends: Vec<u64> = parts.iter().map(|p| p.to).collect();
        assert_eq!(ends, [80, 125, 160, 250]);
        assert_eq!(parts[0].who(), "every class");
        assert_eq!(parts[1].who(), "A, stage 2; B, stage 1 only");
        assert_eq!(parts[2].who(), "A, stage 2; B, stage 2 only");
        assert_eq!(parts[3].who(), "B, stage 2 only");
        assert_eq!(parts[3].units(), 90);
    }
}
