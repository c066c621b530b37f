//! Principal second moments and axes (Mohr's circle for second moments of area).
//!
//! About an axis at angle θ from +x, `I(θ) = avg + R·cos(2θ − φ)` with
//! `avg = (Ixx + Iyy)/2`, `R = √(((Ixx − Iyy)/2)² + Ixy²)`, `φ = atan2(−2Ixy, Ixx − Iyy)`;
//! so `I₁ = avg + R` about the axis at `θ = φ/2` and `I₂ = avg − R` at right angles
//! (Gere & Goodno, Mechanics of Materials, §12.8; Beer & Johnston, §9.9).

/// Principal second moments `i1 ≥ i2` and the angle (degrees, counter-clockwise from
/// +x, in (−90, 90]) of the axis about which the second moment is `i1`.
///
/// ```
/// use kern::props::Principal;
/// // A square rotated to its diagonal has Ixy = 0 and equal moments: no preferred axis.
/// let p = Principal::new(10.0, 10.0, 0.0);
/// assert_eq!((p.i1, p.i2, p.angle_deg), (10.0, 10.0, 0.0));
/// // Ixx = 5, Iyy = 3, Ixy = −1: avg 4, R = √2, axis at 22.5°.
/// let p = Principal::new(5.0, 3.0, -1.0);
/// assert!((p.i1 - (4.0 + 2f64.sqrt())).abs() < 1e-12 && (p.angle_deg - 22.5).abs() < 1e-12);
/// ```
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Principal {
    pub i1: f64,
    pub i2: f64,
    pub angle_deg: f64,
}

impl Principal {
    pub fn new(ixx: f64, iyy: f64, ixy: f64) -> Principal {
        let avg = (ixx + iyy) / 2.0;
        let half = (ixx - iyy) / 2.0;
        let r = half.hypot(ixy);
        // Below rounding noise the axes are undefined (a circle, a square): call it 0°.
        if r <= 1e-13 * avg.abs() {
            return Principal {
                i1: avg + r,
                i2: avg - r,
                angle_deg: 0.0,
            };
        }
        let mut angle = (-2.0 * ixy).atan2(ixx - iyy).to_degrees() / 2.0;
        if angle <= -90.0 {
            angle += 180.0;
        }
        Principal {
            i1: avg + r,
            i2: avg - r,
            angle_deg: angle + 0.0,
        }
    }

    /// The second moment about an axis at `deg` degrees from +x.
    pub fn about(ixx: f64, iyy: f64, ixy: f64, deg: f64) -> f64 {
        let (s, c) = deg.to_radians().sin_cos();
        ixx * c * c + iyy * s * s - 2.0 * ixy * s * c
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn principal_axis_carries_the_largest_moment() {
        for &(ixx, iyy, ixy) in &[
            (5.0, 3.0, -1.0),
            (3.0, 5.0, 1.0),
            (1.0, 1.0, 2.0),
            (4.0, 1.0, 0.0),
            (1.0, 4.0, 0.0),
        ] {
            let p = Principal::new(ixx, iyy, ixy);
            assert!(p.angle_deg > -90.0 && p.angle_deg <= 90.0);
            assert!((Principal::about(ixx, iyy, ixy, p.angle_deg) - p.i1).abs() < 1e-12);
            assert!((Principal::about(ixx, iyy, ixy, p.angle_deg + 90.0) - p.i2).abs() < 1e-12);
        }
        // A wide rectangle: the major axis is the y axis, reported as +90°.
        assert_eq!(Principal::new(1.0, 4.0, 0.0).angle_deg, 90.0);
        assert_eq!(Principal::new(1.0, 4.0, -0.0).angle_deg, 90.0);
    }
}
