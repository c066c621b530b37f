//! Is a polygon simple? Signed area and a search for crossing edges.
//!
//! The crossing search buckets edges in a uniform grid of about one cell per edge, so
//! ordinary outlines (even of 100,000 vertices) are checked in linear time; only edges
//! sharing a cell are compared.

use super::contour::Pt;

/// The signed area of a polygon by the shoelace formula,
/// `A = ½ Σ (xᵢ yᵢ₊₁ − xᵢ₊₁ yᵢ)`, positive for counter-clockwise order.
pub fn signed_area(p: &[Pt]) -> f64 {
    let n = p.len();
    if n < 3 {
        return 0.0;
    }
    let o = p[0];
    (1..n - 1)
        .map(|i| p[i].sub(o).cross(p[i + 1].sub(o)))
        .sum::<f64>()
        / 2.0
}

/// The winding number of closed polygons `loops` about `p` (a counter-clockwise loop
/// around `p` counts +1, a clockwise one −1): the crossing test of Sunday, "Inclusion
/// of a point in a polygon" (2001). Nonzero means inside.
pub fn winding(loops: &[Vec<Pt>], p: Pt) -> i32 {
    let mut w = 0;
    for l in loops {
        for (i, &a) in l.iter().enumerate() {
            let b = l[(i + 1) % l.len()];
            let side = b.sub(a).cross(p.sub(a));
            if a.y <= p.y {
                if b.y > p.y && side > 0.0 {
                    w += 1;
                }
            } else if b.y <= p.y && side < 0.0 {
                w -= 1;
            }
        }
    }
    w
}

/// The first pair of edges `(i, j)` that cross or touch other than at a shared vertex of
/// neighbours (edge `i` runs from point `i` to point `i + 1`), or a repeated point, or
/// `None` if the polygon is simple.
pub fn first_crossing(p: &[Pt]) -> Option<(usize, usize)> {
    let n = p.len();
    if n < 3 {
        return None;
    }
    let (mut x0, mut x1, mut y0, mut y1) = (f64::MAX, f64::MIN, f64::MAX, f64::MIN);
    for q in p {
        x0 = x0.min(q.x);
        x1 = x1.max(q.x);
        y0 = y0.min(q.y);
        y1 = y1.max(q.y);
    }
    let cells = ((n as f64).sqrt().ceil() as usize).clamp(1, 1024);
    let (w, h) = (
        (x1 - x0).max(f64::MIN_POSITIVE),
        (y1 - y0).max(f64::MIN_POSITIVE),
    );
    let cell = |x: f64, y: f64| {
        let cx = (((x - x0) / w * cells as f64) as usize).min(cells - 1);
        let cy = (((y - y0) / h * cells as f64) as usize).min(cells - 1);
        (cx, cy)
    };
    let mut grid: Vec<Vec<u32>> = vec![Vec::new(); cells * cells];
    for i in 0..n {
        let (a, b) = (p[i], p[(i + 1) % n]);
        let (ca, cb) = (
            cell(a.x.min(b.x), a.y.min(b.y)),
            cell(a.x.max(b.x), a.y.max(b.y)),
        );
        for cx in ca.0..=cb.0 {
            for cy in ca.1..=cb.1 {
                grid[cy * cells + cx].push(i as u32);
            }
        }
    }
    let mut best: Option<(usize, usize)> = None;
    for bucket in &grid {
        for (k, &i) in bucket.iter().enumerate() {
            for &j in &bucket[k + 1..] {
                let (i, j) = (i.min(j) as usize, i.max(j) as usize);
                if edges_conflict(p, i, j) && best.is_none_or(|b| (i, j) < b) {
                    best = Some((i, j));
                }
            }
        }
    }
    best
}

/// Do edges `i < j` meet anywhere they should not?
fn edges_conflict(p: &[Pt], i: usize, j: usize) -> bool {
    let n = p.len();
    let (a, b) = (p[i], p[(i + 1) % n]);
    let (c, d) = (p[j], p[(j + 1) % n]);
    let adjacent = j == i + 1 || (i == 0 && j == n - 1);
    if adjacent {
        // Neighbours share one vertex; they conflict only if they fold back onto each other.
        let (shared, u, v) = if j == i + 1 { (b, a, d) } else { (a, b, c) };
        let (e1, e2) = (u.sub(shared), v.sub(shared));
        return e1.cross(e2) == 0.0 && e1.x * e2.x + e1.y * e2.y > 0.0 || a == b || c == d;
    }
    segments_touch(a, b, c, d)
}

/// Do closed segments `ab` and `cd` share any point? Exact sign tests on the
/// orientation determinants.
fn segments_touch(a: Pt, b: Pt, c: Pt, d: Pt) -> bool {
    let o = |p: Pt, q: Pt, r: Pt| q.sub(p).cross(r.sub(p));
    let (d1, d2, d3, d4) = (o(c, d, a), o(c, d, b), o(a, b, c), o(a, b, d));
    if ((d1 > 0.0 && d2 < 0.0) || (d1 < 0.0 && d2 > 0.0))
        && ((d3 > 0.0 && d4 < 0.0) || (d3 < 0.0 && d4 > 0.0))
    {
        return true;
    }
    let on = |p: Pt, q: Pt, r: Pt| {
        r.x >= p.x.min(q.x) && r.x <= p.x.max(q.x) && r.y >= p.y.min(q.y) && r.y <= p.y.max(q.y)
    };
    (d1 == 0.0 && on(c, d, a))
        || (d2 == 0.0 && on(c, d, b))
        || (d3 == 0.0 && on(a, b, c))
        || (d4 == 0.0 && on(a, b, d))
}

#[cfg(test)]
mod tests {
    use super::*;

    fn pts(v: &[(f64, f64)]) -> Vec<Pt> {
        v.iter().map(|&(x, y)| Pt::new(x, y)).collect()
    }

    #[test]
    fn square_is_simple_bowtie_is_not() {
        // Shoelace formula: a 5 × 6 rectangle has area 30, reversed −30.
        let sq = pts(&[(0.0, 0.0), (5.0, 0.0), (5.0, 6.0), (0.0, 6.0)]);
        assert_eq!(signed_area(&sq), 30.0);
        let mut rev = sq.clone();
        rev.reverse();
        assert_eq!(signed_area(&rev), -30.0);
        assert_eq!(first_crossing(&sq), None);
        let bow = pts(&[(0.0, 0.0), (1.0, 1.0), (1.0, 0.0), (0.0, 1.0)]);
        assert_eq!(first_crossing(&bow), Some((0, 2)));
    }

    #[test]
    fn repeated_vertex_and_spike_are_refused() {
        let rep = pts(&[(0.0, 0.0), (1.0, 0.0), (1.0, 0.0), (0.0, 1.0)]);
        assert!(first_crossing(&rep).is_some());
        let spike = pts(&[(0.0, 0.0), (2.0, 0.0), (1.0, 0.0), (0.0, 1.0)]);
        assert!(first_crossing(&spike).is_some());
    }

    #[test]
    fn large_regular_polygon_is_simple() {
        let n = 20_000;
        let p: Vec<Pt> = (0..n)
            .map(|i| {
                let t = i as f64 / n as f64 * std::f64::consts::TAU;
                Pt::new(t.cos(), t.sin())
            })
            .collect();
        assert_eq!(first_crossing(&p), None);
    }
}
