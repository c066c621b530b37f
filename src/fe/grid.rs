//! Lookups the base mesh makes many times: points merged within a distance (a hash grid
//! of square cells of twice that size, with a cheap multiplicative hash for its integer keys),
//! and intervals along x found by a binary search over their sorted left ends.

use crate::geom::Pt;
use std::collections::HashMap;
use std::hash::{BuildHasherDefault, Hasher};

/// A hash of small integer keys (grid cells, node pairs): each word is mixed in by a
/// rotation, an exclusive or and a multiplication by an odd constant (2⁶⁴/φ, Knuth's
/// multiplicative hashing, The Art of Computer Programming vol. 3, §6.4; cited from
/// memory). Not for keys an adversary chooses to collide: the keys here are cells of
/// the section's own points.
#[derive(Default, Clone, Copy)]
pub struct Mix(u64);

const GOLDEN: u64 = 0x9e37_79b9_7f4a_7c15;

impl Hasher for Mix {
    fn finish(&self) -> u64 {
        self.0
    }

    fn write(&mut self, bytes: &[u8]) {
        for chunk in bytes.chunks(8) {
            let mut word = [0u8; 8];
            word[..chunk.len()].copy_from_slice(chunk);
            self.write_u64(u64::from_le_bytes(word));
        }
    }

    fn write_u64(&mut self, v: u64) {
        self.0 = (self.0.rotate_left(26) ^ v).wrapping_mul(GOLDEN);
    }

    fn write_u32(&mut self, v: u32) {
        self.write_u64(u64::from(v));
    }

    fn write_i64(&mut self, v: i64) {
        self.write_u64(v as u64);
    }
}

/// A hash map with the [`Mix`] hash.
pub type MixMap<K, V> = HashMap<K, V, BuildHasherDefault<Mix>>;

/// Points with a value each, found again by any point within `eps` of them. Each cell
/// of the grid holds the first and last of its points, which are chained in the order
/// they were inserted (one vector for all, no allocation per cell).
pub struct Near<T> {
    eps: f64,
    /// Cell → its first and last point, indices into `items`.
    cells: MixMap<(i64, i64), (u32, u32)>,
    /// The points, their values and the next point of the same cell (`u32::MAX`: none).
    items: Vec<(Pt, T, u32)>,
}

impl<T: Copy> Near<T> {
    pub fn new(eps: f64) -> Near<T> {
        Near::with_capacity(eps, 0)
    }

    /// A grid with room for `n` points.
    pub fn with_capacity(eps: f64, n: usize) -> Near<T> {
        Near {
            eps,
            cells: MixMap::with_capacity_and_hasher(n, Default::default()),
            items: Vec::with_capacity(n),
        }
    }

    /// The cell of a coordinate pair: squares of side `2·eps`.
    fn cell(&self, x: f64, y: f64) -> (i64, i64) {
        let side = 2.0 * self.eps;
        ((x / side).floor() as i64, (y / side).floor() as i64)
    }

    /// The values of the points within `eps` of `p`, cell by cell (rows of x, then y),
    /// in the order they were inserted within a cell. The cells searched are those
    /// that meet the square of half-side `1.01·eps` about `p` (a margin for rounding):
    /// two by two, or fewer.
    pub fn within(&self, p: Pt) -> impl Iterator<Item = T> + '_ {
        let reach = 1.01 * self.eps;
        let (x0, y0) = self.cell(p.x - reach, p.y - reach);
        let (x1, y1) = self.cell(p.x + reach, p.y + reach);
        let eps2 = self.eps * self.eps;
        (x0..=x1)
            .flat_map(move |x| (y0..=y1).map(move |y| (x, y)))
            .filter_map(|k| self.cells.get(&k))
            .flat_map(|&(first, _)| {
                std::iter::successors(Some(first), |&i| {
                    Some(self.items[i as usize].2).filter(|&n| n != u32::MAX)
                })
            })
            .map(|i| &self.items[i as usize])
            .filter(move |(q, _, _)| dist2(*q, p) <= eps2)
            .map(|&(_, t, _)| t)
    }

    /// The value of the first point within `eps` of `p` (the first of [`Near::within`]).
    pub fn find(&self, p: Pt) -> Option<T> {
        let reach = 1.01 * self.eps;
        let (x0, y0) = self.cell(p.x - reach, p.y - reach);
        let (x1, y1) = self.cell(p.x + reach, p.y + reach);
        let eps2 = self.eps * self.eps;
        for x in x0..=x1 {
            for y in y0..=y1 {
                let Some(&(mut i, _)) = self.cells.get(&(x, y)) else {
                    continue;
                };
                loop {
                    let (q, t, next) = self.items[i as usize];
                    if dist2(q, p) <= eps2 {
                        return Some(t);
                    }
                    if next == u32::MAX {
                        break;
                    }
                    i = next;
                }
            }
        }
        None
    }

    pub fn insert(&mut self, p: Pt, t: T) {
        let key = self.cell(p.x, p.y);
        let i = self.items.len() as u32;
        self.items.push((p, t, u32::MAX));
        let cell = self.cells.entry(key).or_insert((i, i));
        if cell.1 != i {
            self.items[cell.1 as usize].2 = i;
            cell.1 = i;
        }
    }
}

/// The squared distance between two points (for comparisons: no square root).
pub fn dist2(a: Pt, b: Pt) -> f64 {
    let (dx, dy) = (a.x - b.x, a.y - b.y);
    dx * dx + dy * dy
}

/// Intervals `[lo, hi]` along x, by index, for the ones that may hold a given x.
pub struct Spans {
    /// Indices by increasing `lo`.
    order: Vec<u32>,
    lo: Vec<f64>,
    /// The widest interval: an interval holding x starts no further left than x − this.
    widest: f64,
}

impl Spans {
    pub fn new(spans: impl Iterator<Item = (f64, f64)>) -> Spans {
        let mut items: Vec<(f64, u32)> = Vec::new();
        let mut widest: f64 = 0.0;
        for (i, (lo, hi)) in spans.enumerate() {
            items.push((lo, i as u32));
            widest = widest.max(hi - lo);
        }
        items.sort_by(|a, b| a.0.total_cmp(&b.0));
        Spans {
            order: items.iter().map(|&(_, i)| i).collect(),
            lo: items.iter().map(|&(lo, _)| lo).collect(),
            widest,
        }
    }

    /// Every interval within `pad` of `x` (and some that are not, to test further):
    /// those whose left end lies in `[x − widest − pad, x + pad]`.
    pub fn near(&self, x: f64, pad: f64) -> impl Iterator<Item = u32> + '_ {
        let from = self.lo.partition_point(|&lo| lo < x - self.widest - pad);
        let to = self.lo.partition_point(|&lo| lo <= x + pad);
        self.order[from..to.max(from)].iter().copied()
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn near_finds_every_point_within_eps_and_none_beyond() {
        let eps = 0.1;
        let mut g = Near::new(eps);
        let pts: Vec<Pt> = (0..200)
            .map(|i| {
                Pt::new(
                    (i as f64 * 0.037).sin() * 3.0,
                    (i as f64 * 0.051).cos() * 2.0,
                )
            })
            .collect();
        for (i, &p) in pts.iter().enumerate() {
            g.insert(p, i);
        }
        for q in [Pt::new(0.0, 0.0), Pt::new(1.3, -0.7), Pt::new(-2.9, 1.9)] {
            let mut found: Vec<usize> = g.within(q).collect();
            found.sort();
            let want: Vec<usize> = (0..pts.len()).filter(|&i| pts[i].dist(q) <= eps).collect();
            assert_eq!(found, want);
        }
    }

    #[test]
    fn spans_near_holds_every_interval_that_holds_x() {
        let spans: Vec<(f64, f64)> = (0..100)
            .map(|i| {
                let lo = (i as f64 * 0.73).sin() * 10.0;
                (lo, lo + (i % 7) as f64 * 0.5)
            })
            .collect();
        let s = Spans::new(spans.iter().copied());
        for x in [-10.0, -3.2, 0.0, 4.4, 9.9, 12.0] {
            let got: Vec<u32> = s.near(x, 0.01).collect();
            for (i, &(lo, hi)) in spans.iter().enumerate() {
                if lo - 0.01 <= x && x <= hi + 0.01 {
                    assert!(got.contains(&(i as u32)), "x {x}: interval {i} missing");
                }
            }
        }
    }
}
