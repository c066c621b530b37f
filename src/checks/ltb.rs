//! Lateral-torsional buckling: the monosymmetry constants βx, βy of a section and the
//! elastic critical moment of a simply supported span of a section symmetric about an
//! axis parallel to y.
//!
//! Monosymmetry constants (Trahair, Flexural-Torsional Buckling of Structures, 1993,
//! ch. 7; Kitipornchai & Trahair, "Buckling properties of monosymmetric I-beams",
//! J. Struct. Div. ASCE 106, 1980), with centroidal coordinates X = x − x̄, Y = y − ȳ
//! (file frame, y up) and the shear centre (xs, ys):
//!
//! ```text
//! βx = (1/Ixx)·∫Y(X² + Y²) dA − 2(ys − ȳ)      βy = (1/Iyy)·∫X(X² + Y²) dA − 2(xs − x̄)
//! ```
//!
//! βx is 0 for a doubly symmetric section and negative when the larger flange is on +y.
//!
//! Elastic critical moment (Trahair 1993, ch. 7, uniform moment on a simple span, ends
//! free to warp and prevented from twisting, load at the shear centre), with a
//! moment-gradient factor c1 that the caller states:
//!
//! ```text
//! Mcr = c1·(π²EIy/L²)·( s·βx/2 + √((βx/2)² + Cw/Iy + G·J·L²/(π²EIy)) )
//! ```
//!
//! with s = −1 when the +y side is in compression and s = +1 when the −y side is. For
//! βx = 0 it is Timoshenko & Gere's `(π/L)·√(E·Iy·(G·J + π²·E·Cw/L²))` (Theory of
//! Elastic Stability, "lateral buckling of beams in pure bending").

use crate::geom::Pt;
use crate::props::cubic::Cubic;
use std::f64::consts::PI;

/// Which side of the section the bending moment compresses.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Compressed {
    /// The +y side (sagging under gravity loads on a simple span): s = −1.
    PlusY,
    /// The −y side (hogging): s = +1.
    MinusY,
}

impl Compressed {
    /// The sign s of the formula.
    pub fn s(self) -> f64 {
        match self {
            Compressed::PlusY => -1.0,
            Compressed::MinusY => 1.0,
        }
    }
}

/// The monosymmetry constants βx, βy (lengths) of a section with third moments `cubic`
/// about its centroid `centroid`, second moments `ixx`, `iyy` about centroidal axes and
/// shear centre `shear_centre`, all in one length unit and frame.
///
/// ```
/// use kern::checks::ltb::beta;
/// use kern::geom::{BoundaryIntegral, Contour, Pt};
/// use kern::props::{cubic::Cubic, Moments};
/// // A rectangle is doubly symmetric: βx = βy = 0 with the shear centre at the centroid.
/// let r = Contour::rounded_rect(0.0, 0.0, 4.0, 10.0, 0.0);
/// let m = Moments::of_contour(&r);
/// let c = m.centroidal().unwrap();
/// let k = Cubic::of_contour(&r).central(&m).unwrap();
/// let (bx, by) = beta(&k, c.ixx, c.iyy, Pt::new(c.cx, c.cy), Pt::new(c.cx, c.cy));
/// assert!(bx.abs() < 1e-12 && by.abs() < 1e-12);
/// ```
pub fn beta(cubic: &Cubic, ixx: f64, iyy: f64, centroid: Pt, shear_centre: Pt) -> (f64, f64) {
    let bx = (cubic.xxy + cubic.yyy) / ixx - 2.0 * (shear_centre.y - centroid.y);
    let by = (cubic.xxx + cubic.xyy) / iyy - 2.0 * (shear_centre.x - centroid.x);
    (bx, by)
}

/// Inputs of [`mcr`] in one consistent set of units (e.g. N, m, Pa): moduli `e`, `g`;
/// minor-axis second moment `iy`, torsion constant `j`, warping constant `cw`,
/// monosymmetry constant `beta_x`, span `l`, moment-gradient factor `c1`.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Buckling {
    pub e: f64,
    pub g: f64,
    pub iy: f64,
    pub j: f64,
    pub cw: f64,
    pub beta_x: f64,
    pub l: f64,
    pub c1: f64,
}

/// The elastic critical moment of the module's formula. `None` unless E, G, Iy, L, c1
/// are finite and > 0, J and Cw finite and ≥ 0, βx finite and the result positive.
///
/// ```
/// use kern::checks::ltb::{mcr, Buckling, Compressed};
/// // Narrow rectangle (Cw ≈ 0, βx = 0): Mcr = (π/L)·√(E·Iy·G·J).
/// let b = Buckling { e: 200e3, g: 80e3, iy: 1e6, j: 4e6, cw: 0.0, beta_x: 0.0, l: 4000.0, c1: 1.0 };
/// let m = mcr(&b, Compressed::PlusY).unwrap();
/// assert!((m - std::f64::consts::PI / 4000.0 * (200e3 * 1e6 * 80e3 * 4e6_f64).sqrt()).abs() < 1e-3);
/// ```
pub fn mcr(b: &Buckling, side: Compressed) -> Option<f64> {
    let positive = [b.e, b.g, b.iy, b.l, b.c1]
        .iter()
        .all(|v| v.is_finite() && *v > 0.0);
    let non_negative = [b.j, b.cw].iter().all(|v| v.is_finite() && *v >= 0.0);
    if !(positive && non_negative && b.beta_x.is_finite()) {
        return None;
    }
    let pe = PI * PI * b.e * b.iy / (b.l * b.l);
    let half = b.beta_x / 2.0;
    let root = (half * half + b.cw / b.iy + b.g * b.j / pe).sqrt();
    let m = b.c1 * pe * (side.s() * half + root);
    (m.is_finite() && m > 0.0).then_some(m)
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::geom::{BoundaryIntegral, Contour};
    use crate::props::Moments;

    fn close(a: f64, b: f64, tol: f64) -> bool {
        (a - b).abs() <= tol * b.abs()
    }

    fn timoshenko_gere(e: f64, g: f64, iy: f64, j: f64, cw: f64, l: f64) -> f64 {
        // Timoshenko & Gere, Theory of Elastic Stability (1961), eq. for a simply
        // supported I-beam in pure bending: Mcr = (π/L)·√(E·Iy·G·J·(1 + π²·E·Cw/(G·J·L²))).
        PI / l * (e * iy * g * j * (1.0 + PI * PI * e * cw / (g * j * l * l))).sqrt()
    }

    #[test]
    fn doubly_symmetric_reduces_to_timoshenko_and_gere() {
        // Hand calculation (our own numbers, N and mm): E = 200 000, G = 80 000, Iy = 1e7,
        // J = 2e5, Cw = 1e11, L = 5000: π/L = 6.2832e-4; √(E·Iy·G·J) = 1.78885e11;
        // 1 + π²·E·Cw/(G·J·L²) = 1.49348, √ = 1.22208; Mcr = 1.3736e8 N·mm.
        let b = Buckling {
            e: 2e5,
            g: 8e4,
            iy: 1e7,
            j: 2e5,
            cw: 1e11,
            beta_x: 0.0,
            l: 5000.0,
            c1: 1.0,
        };
        for side in [Compressed::PlusY, Compressed::MinusY] {
            let m = mcr(&b, side).unwrap();
            assert!(close(m, 1.3736e8, 1e-4));
            assert!(close(
                m,
                timoshenko_gere(2e5, 8e4, 1e7, 2e5, 1e11, 5000.0),
                1e-13
            ));
        }
        // c1 multiplies.
        let m = mcr(&Buckling { c1: 1.75, ..b }, Compressed::PlusY).unwrap();
        assert!(close(m, 1.75 * 1.3736e8, 1e-4));
        // J = 0 with Cw > 0 still buckles; J = Cw = 0 does not give a moment.
        assert!(mcr(&Buckling { j: 0.0, ..b }, Compressed::PlusY).is_some());
        assert!(mcr(
            &Buckling {
                j: 0.0,
                cw: 0.0,
                ..b
            },
            Compressed::PlusY
        )
        .is_none());
        for bad in [f64::NAN, -1.0, 0.0] {
            assert!(mcr(&Buckling { iy: bad, ..b }, Compressed::PlusY).is_none());
            assert!(mcr(&Buckling { c1: bad, ..b }, Compressed::PlusY).is_none());
        }
        assert!(mcr(
            &Buckling {
                beta_x: f64::NAN,
                ..b
            },
            Compressed::PlusY
        )
        .is_none());
    }

    #[test]
    fn wagner_effect_raises_mcr_with_the_larger_flange_in_compression() {
        // Trahair (1993), ch. 7: with βx < 0 (larger flange on +y) a sagging moment (+y in
        // compression, s = −1) gives the larger Mcr, and the two values multiply to
        // (π²EIy/L²)²·(Cw/Iy + GJL²/(π²EIy)) (product of the roots of the quadratic).
        let b = Buckling {
            e: 2e5,
            g: 8e4,
            iy: 1e7,
            j: 2e5,
            cw: 1e11,
            beta_x: -150.0,
            l: 5000.0,
            c1: 1.0,
        };
        let sag = mcr(&b, Compressed::PlusY).unwrap();
        let hog = mcr(&b, Compressed::MinusY).unwrap();
        assert!(sag > hog);
        let pe = PI * PI * 2e5 * 1e7 / 25e6;
        assert!(close(sag * hog, pe * pe * (1e4 + 8e4 * 2e5 / pe), 1e-12));
    }

    /// The sections of the two tests below: flanges `b1 × t` (top, centre-line at y = h)
    /// and `b2 × t` (bottom, centre-line at y = 0; `b2 = 0` for a tee), web `t` thick
    /// between them. Returns kern's parts and the thin-walled hand values (ȳ, ys, βx).
    ///
    /// Thin-walled derivation (Kitipornchai & Trahair 1980; Trahair 1993, ch. 7): the
    /// flanges as lines of area A1 = b1·t, A2 = b2·t at Y = h1 = h − ȳ and Y = −h2 = −ȳ with
    /// lateral second moments I1 = t·b1³/12, I2 = t·b2³/12; the web a line of area
    /// Aw = (h − t)·t and no lateral extent. Then
    ///   ∫Y³ dA + ∫X²Y dA = A1·h1³ + I1·h1 − A2·h2³ − I2·h2 + t·(h1⁴ − h2⁴)/4,
    /// the shear centre lies where the flanges' lateral bending balances,
    ///   ys = h·I1/(I1 + I2)   (from the bottom flange: nearer the larger; h for a tee),
    /// and βx = (∫Y³ dA + ∫X²Y dA)/Ixx − 2(ys − ȳ).
    fn flanged(b1: f64, b2: f64, h: f64, t: f64) -> (Vec<Contour>, f64, f64, f64) {
        // A tee's stem runs down to y = 0.
        let web_foot = if b2 > 0.0 { t / 2.0 } else { 0.0 };
        let mut parts = vec![
            Contour::rounded_rect(-b1 / 2.0, h - t / 2.0, b1 / 2.0, h + t / 2.0, 0.0),
            Contour::rounded_rect(-t / 2.0, web_foot, t / 2.0, h - t / 2.0, 0.0),
        ];
        if b2 > 0.0 {
            parts.push(Contour::rounded_rect(
                -b2 / 2.0,
                -t / 2.0,
                b2 / 2.0,
                t / 2.0,
                0.0,
            ));
        }
        let (a1, a2, aw) = (b1 * t, b2 * t, (h - t / 2.0 - web_foot) * t);
        let ybar = (a1 * h + aw * h / 2.0) / (a1 + a2 + aw);
        let (h1, h2) = (h - ybar, ybar);
        let (i1, i2) = (t * b1.powi(3) / 12.0, t * b2.powi(3) / 12.0);
        let ixx =
            a1 * h1 * h1 + a2 * h2 * h2 + t * h.powi(3) / 12.0 + aw * (h / 2.0 - ybar).powi(2);
        let cubic = a1 * h1.powi(3) + i1 * h1 - a2 * h2.powi(3) - i2 * h2
            + t * (h1.powi(4) - h2.powi(4)) / 4.0;
        let ys = h * i1 / (i1 + i2);
        let ys = if b2 > 0.0 { ys } else { h };
        (parts, ybar, ys, cubic / ixx - 2.0 * (ys - ybar))
    }

    /// kern's βx of the parts (exact third and second moments) with shear centre (0, ys).
    fn kern_beta(parts: &[Contour], ys: f64) -> (f64, f64) {
        let m = Moments::of_contours(parts);
        let c = m.centroidal().unwrap();
        let k = Cubic::of_contours(parts).central(&m).unwrap();
        beta(&k, c.ixx, c.iyy, Pt::new(c.cx, c.cy), Pt::new(0.0, ys))
    }

    #[test]
    fn monosymmetric_i_converges_to_the_thin_walled_value() {
        // Our own girder, larger flange on top (+y). kern's value (exact moments of the
        // plates) approaches the thin-walled one as the plates get thinner, the gap
        // closing about in proportion to the thickness; the shear centre is the
        // thin-walled one here (the finite-element one enters in tests/ltb.rs).
        let (b1, b2, h) = (300.0, 150.0, 600.0);
        let mut gaps = Vec::new();
        for t in [8.0, 4.0, 2.0, 1.0] {
            let (parts, _, ys, hand) = flanged(b1, b2, h, t);
            let (bx, by) = kern_beta(&parts, ys);
            gaps.push(((bx - hand) / hand).abs());
            assert!(by.abs() < 1e-9 * h);
            // Kitipornchai & Trahair's approximation βx ≈ 0.9·h·(2ρ − 1)·(1 − (Iy/Ix)²),
            // ρ = Iyc/Iy with the top flange in compression; docs/format.md's sign is the
            // opposite (negative with the larger flange on +y). An approximation that
            // leaves out most of the web's share: with this web (1.3 times the flanges'
            // area) it is within 25 % of the exact value.
            let (i1, i2) = (t * b1.powi(3) / 12.0, t * b2.powi(3) / 12.0);
            let m = Moments::of_contours(&parts).centroidal().unwrap();
            let rho = i1 / (i1 + i2);
            let kt = 0.9 * h * (2.0 * rho - 1.0) * (1.0 - ((i1 + i2) / m.ixx).powi(2));
            assert!(bx < 0.0 && close(-bx, kt, 0.25), "{bx} {kt}");
        }
        assert!(gaps[3] < 2e-3, "{gaps:?}");
        for w in gaps.windows(2) {
            assert!(w[1] < 0.7 * w[0], "{gaps:?}");
        }
        // Doubly symmetric: βx = 0 (Trahair 1993, ch. 7).
        let (parts, ybar, _, hand) = flanged(200.0, 200.0, h, 10.0);
        assert!(hand.abs() < 1e-9 * h);
        assert!(kern_beta(&parts, ybar).0.abs() < 1e-9 * h);
    }

    #[test]
    fn tee_with_the_flange_on_top_has_a_large_negative_beta() {
        // The stem's ∫Y³ is large and negative and the shear centre (flange centre-line,
        // thin-walled) lies above the centroid: βx < 0 and of the order of the depth.
        let (b, h, t) = (200.0, 200.0, 2.0);
        let (parts, _, ys, hand) = flanged(b, 0.0, h, t);
        let (bx, _) = kern_beta(&parts, ys);
        assert!(close(bx, hand, 2e-2), "{bx} {hand}");
        assert!(bx < -0.5 * h, "{bx}");
    }
}
