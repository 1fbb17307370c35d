//! One stable sort for the whole crate (wasm size).
//!
//! Each `slice::sort_by` on a new element type or comparator compiles the standard
//! library's driftsort anew (4–8 KB of wasm each; a dozen call sites made about 70 KB).
//! Here the only instantiation sorts `u32` indices through a `dyn` comparator; other
//! slices are sorted as a permutation of their indices, then permuted in place.
//! Stable like `sort_by`: equal elements keep their order.

use core::cmp::Ordering;

/// Sorts `v` stably by `cmp`; the same result as `v.sort_by(cmp)`.
pub fn sort_by<T>(v: &mut [T], cmp: impl Fn(&T, &T) -> Ordering) {
    if v.len() < 2 {
        return;
    }
    debug_assert!(v.len() <= u32::MAX as usize);
    let mut perm: Vec<u32> = (0..v.len() as u32).collect();
    sort_indices(&mut perm, &|a, b| cmp(&v[a as usize], &v[b as usize]));
    permute(v, &mut perm);
}

/// Sorts `idx` stably by `cmp` (called with two elements of `idx`): the crate's one
/// instantiation of the standard library's stable sort.
#[inline(never)]
pub fn sort_indices(idx: &mut [u32], cmp: &dyn Fn(u32, u32) -> Ordering) {
    idx.sort_by(|&a, &b| cmp(a, b));
}

/// Sorts `u32` values ascending (stable and unstable sorts agree on plain integers).
pub fn sort_u32(v: &mut [u32]) {
    sort_indices(v, &|a, b| a.cmp(&b));
}

/// Reorders `v` so that position k holds the element that was at `perm[k]`, following
/// the permutation's cycles with swaps; `perm` is used up (left as the identity).
fn permute<T>(v: &mut [T], perm: &mut [u32]) {
    for start in 0..v.len() {
        let mut cur = start;
        loop {
            let src = perm[cur] as usize;
            perm[cur] = cur as u32;
            if src == start {
                break;
            }
            v.swap(cur, src);
            cur = src;
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn same_as_std_stable_sort() {
        // Keys with many ties, so stability shows.
        let mut seed = 12345u64;
        for n in [0usize, 1, 2, 3, 7, 20, 100, 1000] {
            let v: Vec<(u32, u32)> = (0..n as u32)
                .map(|i| {
                    seed = seed.wrapping_mul(6364136223846793005).wrapping_add(1442695040888963407);
                    ((seed >> 60) as u32, i)
                })
                .collect();
            let mut a = v.clone();
            let mut b = v.clone();
            a.sort_by(|x, y| x.0.cmp(&y.0));
            sort_by(&mut b, |x, y| x.0.cmp(&y.0));
            assert_eq!(a, b, "n = {n}");
            let mut c: Vec<u32> = v.iter().map(|p| p.0 * 1000 + p.1).collect();
            let mut d = c.clone();
            c.sort_unstable();
            sort_u32(&mut d);
            assert_eq!(c, d);
        }
    }
}
