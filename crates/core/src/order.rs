//! Ordering with little code: the standard library's stable sort is about
//! 3.3 KB of wasm per element type, and collecting into a `BTreeMap` or
//! `BTreeSet` instantiates it for the key type (the items are sorted, then
//! the tree built). The short lists of a check (a few dozen items, bounded
//! by `limits`) need neither: an insertion sort and one insert per item
//! give the same order in a fraction of the code. Long lists (record
//! samples) keep the standard sort.

use std::collections::BTreeMap;

/// Sorts `items` so that no item comes before one it is `before`, keeping
/// the order of items neither is before (stable, as `sort_by`).
/// Quadratic: for short lists only.
pub fn sort_short_by<T>(items: &mut [T], mut before: impl FnMut(&T, &T) -> bool) {
    for i in 1..items.len() {
        let mut j = i;
        while j > 0
            && items
                .get(j)
                .zip(items.get(j - 1))
                .is_some_and(|(later, earlier)| before(later, earlier))
        {
            items.swap(j, j - 1);
            j -= 1;
        }
    }
}

/// Sorts `items` by their `Ord`, stable, as `sort` does. Short lists only.
pub fn sort_short<T: Ord>(items: &mut [T]) {
    sort_short_by(items, |a, b| a < b);
}

/// The map of `pairs`, the last value kept for a repeated key, as
/// `collect` gives it.
pub fn map_of<K: Ord, V>(pairs: impl IntoIterator<Item = (K, V)>) -> BTreeMap<K, V> {
    let mut map = BTreeMap::new();
    for (key, value) in pairs {
        map.insert(key, value);
    }
    map
}

#[cfg(test)]
mod tests {
    use super::*;
    use proptest::prelude::*;

    proptest! {
        #[test]
        fn the_short_sort_orders_as_the_standard_stable_sort(
            items in prop::collection::vec((0u8..6, any::<u16>()), 0..60)
        ) {
            // Equal keys with different tags show whether ties keep their order.
            let mut short = items.clone();
            sort_short_by(&mut short, |a, b| a.0 < b.0);
            let mut standard = items.clone();
            standard.sort_by_key(|x| x.0);
            prop_assert_eq!(&short, &standard);
            let mut whole = items.clone();
            sort_short(&mut whole);
            let mut standard = items;
            standard.sort();
            prop_assert_eq!(whole, standard);
        }

        #[test]
        fn maps_are_those_collect_builds(
            pairs in prop::collection::vec((0u8..20, any::<u16>()), 0..60)
        ) {
            let collected: BTreeMap<u8, u16> = pairs.iter().copied().collect();
            prop_assert_eq!(map_of(pairs), collected);
        }
    }
}
