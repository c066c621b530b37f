//! Is a polygon simple? Signed area and a search for crossing edges.
//!
//! The crossing search buckets edges in a uniform grid of about one cell per edge, so
//! ordinary outlines (even of 100,000 vertices) are checked in about linear time (the
//! buckets are sorted, O(n log n)); only edges sharing a cell are compared.

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

/// A closed polygon with the corners that matter: every corner farther than `tol` from
/// the simplified outline is kept (Douglas & Peucker, "Algorithms for the reduction of
/// the number of points required to represent a digitized line", 1973), applied to the
/// two chains between corner 0 and the corner farthest from it. Iterative, so long
/// outlines cannot exhaust the stack.
pub fn simplify_closed(p: &[Pt], tol: f64) -> Vec<Pt> {
    let n = p.len();
    if n <= 4 || tol <= 0.0 {
        return p.to_vec();
    }
    let far = (1..n)
        .max_by(|&i, &j| p[0].dist(p[i]).total_cmp(&p[0].dist(p[j])))
        .unwrap_or(n / 2);
    let mut keep = vec![false; n];
    keep[0] = true;
    keep[far] = true;
    let mut stack = vec![(0, far), (far, n)];
    while let Some((a, b)) = stack.pop() {
        let (pa, pb) = (p[a], p[b % n]);
        let d = pb.sub(pa);
        let len = d.x.hypot(d.y);
        let dist = |q: Pt| {
            if len == 0.0 {
                q.dist(pa)
            } else {
                d.cross(q.sub(pa)).abs() / len
            }
        };
        let worst = ((a + 1)..b)
            .map(|i| (dist(p[i]), i))
            .max_by(|x, y| x.0.total_cmp(&y.0));
        if let Some((e, i)) = worst {
            if e > tol {
                keep[i] = true;
                stack.push((a, i));
                stack.push((i, b));
            }
        }
    }
    p.iter()
        .zip(&keep)
        .filter(|(_, &k)| k)
        .map(|(q, _)| *q)
        .collect()
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
///
/// Edges are hashed into square cells about twice the mean edge length; only edges
/// sharing a cell are compared, so ordinary outlines cost O(n log n) (the sort of the
/// cell keys). The few edges that span many cells are compared with every edge whose
/// box they meet.
pub fn first_crossing(p: &[Pt]) -> Option<(usize, usize)> {
    let n = p.len();
    if n < 3 {
        return None;
    }
    let edge = |i: usize| (p[i], p[(i + 1) % n]);
    let (mut x0, mut y0) = (f64::MAX, f64::MAX);
    let mut total = 0.0;
    for i in 0..n {
        let (a, b) = edge(i);
        x0 = x0.min(a.x);
        y0 = y0.min(a.y);
        total += a.dist(b);
    }
    let size = (2.0 * total / n as f64).max(f64::MIN_POSITIVE);
    let cell = |v: f64, o: f64| (((v - o) / size).floor()).clamp(0.0, u32::MAX as f64) as u64;
    let mut keys: Vec<(u64, u32)> = Vec::with_capacity(2 * n);
    let mut long: Vec<usize> = Vec::new();
    for i in 0..n {
        let (a, b) = edge(i);
        let (cx0, cx1) = (cell(a.x.min(b.x), x0), cell(a.x.max(b.x), x0));
        let (cy0, cy1) = (cell(a.y.min(b.y), y0), cell(a.y.max(b.y), y0));
        if (cx1 - cx0 + 1).saturating_mul(cy1 - cy0 + 1) > 64 {
            long.push(i);
            continue;
        }
        for cx in cx0..=cx1 {
            for cy in cy0..=cy1 {
                keys.push(((cx << 32) | cy, i as u32));
            }
        }
    }
    keys.sort_unstable();
    let mut best: Option<(usize, usize)> = None;
    let mut consider = |i: usize, j: usize| {
        let (i, j) = (i.min(j), i.max(j));
        if i != j && best.is_none_or(|b| (i, j) < b) && edges_conflict(p, i, j) {
            best = Some((i, j));
        }
    };
    for run in keys.chunk_by(|a, b| a.0 == b.0) {
        for (k, &(_, i)) in run.iter().enumerate() {
            for &(_, j) in &run[k + 1..] {
                consider(i as usize, j as usize);
            }
        }
    }
    for &i in &long {
        let (a, b) = edge(i);
        let bx = [a.x.min(b.x), a.x.max(b.x), a.y.min(b.y), a.y.max(b.y)];
        for j in 0..n {
            let (c, d) = edge(j);
            if c.x.max(d.x) >= bx[0]
                && c.x.min(d.x) <= bx[1]
                && c.y.max(d.y) >= bx[2]
                && c.y.min(d.y) <= bx[3]
            {
                consider(i, j);
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
    fn simplifying_keeps_corners_and_drops_what_lies_on_the_line() {
        // A square with 99 extra points along each side comes back as its 4 corners;
        // a fine circle keeps more points the smaller the tolerance.
        let mut sq = Vec::new();
        for (a, b) in [
            ((0.0, 0.0), (1.0, 0.0)),
            ((1.0, 0.0), (1.0, 1.0)),
            ((1.0, 1.0), (0.0, 1.0)),
            ((0.0, 1.0), (0.0, 0.0)),
        ] {
            for k in 0..100 {
                let t = k as f64 / 100.0;
                sq.push(Pt::new(a.0 + t * (b.0 - a.0), a.1 + t * (b.1 - a.1)));
            }
        }
        let s = simplify_closed(&sq, 1e-9);
        assert_eq!(s.len(), 4, "{s:?}");
        let circle: Vec<Pt> = (0..10_000)
            .map(|i| {
                let t = i as f64 / 10_000.0 * std::f64::consts::TAU;
                Pt::new(t.cos(), t.sin())
            })
            .collect();
        let coarse = simplify_closed(&circle, 1e-3).len();
        let fine = simplify_closed(&circle, 1e-5).len();
        // Chord sagitta r(1 − cos(θ/2)) ≤ tol gives about π/√(2·tol) points.
        assert!(
            coarse > 40 && coarse < 200 && fine > coarse * 5,
            "{coarse} {fine}"
        );
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
