//! The batch of the throughput benchmarks: `COUNT` random built-up members of about
//! eight parts each — rolled I sections with root fillets (one, or two side by side),
//! cover plates, round bars, bolt holes through the plates, now and then a web opening
//! and a stiffener plate that overlaps the web (so some files warn). A small seeded
//! generator (SplitMix64, Steele, Lea & Flood 2014) makes the same files on every run.

use std::fmt::Write;

/// Sections in the batch.
pub const COUNT: usize = 300;

/// SplitMix64: a 64-bit state advanced by a Weyl constant and mixed (Steele, Lea and
/// Flood, "Fast splittable pseudorandom number generators", OOPSLA 2014).
pub struct Rng(u64);

impl Rng {
    pub fn new(seed: u64) -> Rng {
        Rng(seed)
    }

    fn next_u64(&mut self) -> u64 {
        self.0 = self.0.wrapping_add(0x9e37_79b9_7f4a_7c15);
        let mut z = self.0;
        z = (z ^ (z >> 30)).wrapping_mul(0xbf58_476d_1ce4_e5b9);
        z = (z ^ (z >> 27)).wrapping_mul(0x94d0_49bb_1331_11eb);
        z ^ (z >> 31)
    }

    /// Uniform in [0, 1).
    pub fn unit(&mut self) -> f64 {
        (self.next_u64() >> 11) as f64 / (1u64 << 53) as f64
    }

    /// Uniform in [lo, hi), rounded to 0.5 mm (dimensions as a drawing gives them).
    fn dim(&mut self, lo: f64, hi: f64) -> f64 {
        (2.0 * (lo + (hi - lo) * self.unit())).round() / 2.0
    }

    /// Uniform in [lo, hi).
    fn within(&mut self, lo: f64, hi: f64) -> f64 {
        lo + (hi - lo) * self.unit()
    }

    fn chance(&mut self, p: f64) -> bool {
        self.unit() < p
    }
}

/// The text of section `k` of the batch (the same for the same `k` on every run).
pub fn section(k: usize) -> String {
    let mut g = Rng::new(0x6b65_726e_0000_0000 ^ k as u64);
    let mut t = String::new();
    let twin = g.chance(0.3);
    writeln!(
        t,
        "format = 1\ntitle = \"Loading bay member {k}\"\nunits = \"mm\"\n"
    )
    .unwrap();
    let d = g.dim(200.0, 600.0);
    let b = g.dim(0.35 * d, 0.6 * d);
    let tf = g.dim(8.0, 22.0);
    let tw = g.dim(5.0, 0.6 * tf);
    let r = g.dim(6.0, 0.45 * (b - tw).min(d - 2.0 * tf) / 2.0);
    writeln!(
        t,
        "[params]\nd = {d}\nb = {b}\ntf = {tf}\ntw = {tw}\nr = {r}\n"
    )
    .unwrap();
    // One I, or two side by side with a gap of a quarter flange.
    let xs: &[f64] = if twin { &[-0.625, 0.625] } else { &[0.0] };
    for (i, x) in xs.iter().enumerate() {
        writeln!(
            t,
            "[[parts]]\nname = \"I {i}\"\nshape = \"ibeam\"\nd = \"d\"\nb = \"b\"\ntf = \"tf\"\ntw = \"tw\"\nr = \"r\"\nat = [\"{x}*b\", 0]\n"
        )
        .unwrap();
    }
    let span = if twin { 2.25 } else { 1.0 };
    let mut plates = Vec::new();
    for (name, side) in [("cap", 1.0), ("sole", -1.0)] {
        if plates.is_empty() || g.chance(0.7) {
            let w = (2.0 * g.within(0.8, 1.3) * b * span).round() / 2.0;
            let tp = g.dim(8.0, 30.0);
            let anchor = if side > 0.0 { "bottom" } else { "top" };
            writeln!(
                t,
                "[[parts]]\nname = \"{name} plate\"\nshape = \"rect\"\nb = {w}\nh = {tp}\nanchor = \"{anchor}\"\nat = [0, \"{side}*d/2\"]\n"
            )
            .unwrap();
            plates.push((side, w, tp));
        }
    }
    // Bolt holes through the plates, in pairs about the middle.
    for &(side, w, tp) in &plates {
        let dh = g.dim(14.0, 26.0).min(0.8 * tp).max(6.0);
        let pairs = if g.chance(0.5) { 1 } else { 2 };
        for p in 0..pairs {
            let gauge = (0.3 + 0.25 * p as f64) * w;
            for s in [-0.5, 0.5] {
                writeln!(
                    t,
                    "[[parts]]\nname = \"hole\"\nshape = \"circle\"\nd = {dh}\nvoid = true\nat = [{}, \"{side}*(d/2 + {})\"]\n",
                    s * gauge,
                    tp / 2.0
                )
                .unwrap();
            }
        }
    }
    // Round bars under the lowest face, touching it at a point.
    let low = plates.iter().find(|p| p.0 < 0.0).map_or(0.0, |p| p.2);
    for s in [-0.25, 0.25] {
        if g.chance(0.6) {
            let db = g.dim(16.0, 40.0);
            writeln!(
                t,
                "[[parts]]\nname = \"bar\"\nshape = \"circle\"\nd = {db}\nat = [\"{s}*b\", \"-d/2 - {low} - {}\"]\n",
                db / 2.0
            )
            .unwrap();
        }
    }
    // A web opening now and then (flush with both faces of the web), and a stiffener that overlaps the web.
    if g.chance(0.3) {
        let dw = (2.0 * g.within(0.2, 0.45) * (d - 2.0 * tf - 2.0 * r)).round() / 2.0;
        writeln!(
            t,
            "[[parts]]\nname = \"web opening\"\nshape = \"rect\"\nb = \"tw\"\nh = {dw}\nvoid = true\nat = [\"{}*b\", 0]\n",
            xs[0]
        )
        .unwrap();
    }
    if g.chance(0.15) {
        writeln!(
            t,
            "[[parts]]\nname = \"stiffener\"\nshape = \"rect\"\nb = \"3*tw\"\nh = \"d/3\"\nat = [\"{}*b\", \"d/6\"]\n",
            xs[0]
        )
        .unwrap();
    }
    t
}
