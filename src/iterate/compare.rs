//! Two designs side by side: the rows of the views ([`crate::report::rows::rows`])
//! of each, matched by symbol, both in the first one's output units, with the
//! change of each. Stresses are compared by magnitude: a compressive stress going
//! from −120 to −150 MPa is a larger stress, not a smaller number.

use crate::analysis::Analysis;
use crate::model::units::LengthUnit;
use crate::numfmt::Compare;
use crate::report::out::OutUnits;
use crate::report::rows::{rows, Notation, Row};

/// Which way a result moved from A to B.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Trend {
    Same,
    Higher,
    Lower,
    /// A stress whose magnitude grew.
    LargerMagnitude,
    /// A stress whose magnitude fell.
    SmallerMagnitude,
    OnlyA,
    OnlyB,
    /// Not formed on one side, or on both.
    NotFormed,
}

/// One result of both designs.
#[derive(Debug, Clone, PartialEq)]
pub struct Change {
    pub group: &'static str,
    pub symbol: String,
    pub unit: String,
    pub meaning: &'static str,
    pub a: Option<f64>,
    pub b: Option<f64>,
    /// Whether the result is a stress (compared by magnitude).
    pub stress: bool,
    /// How the change reads (the row's own rule, [`Row::compare`]).
    pub compare: Compare,
}

impl Change {
    /// The direction of the change; values within 1e-9 relative are the same.
    pub fn trend(&self) -> Trend {
        let (a, b) = match (self.a, self.b) {
            (Some(a), Some(b)) => (a, b),
            _ => return Trend::NotFormed,
        };
        let (x, y) = if self.stress {
            (a.abs(), b.abs())
        } else {
            (a, b)
        };
        if (y - x).abs() <= 1e-9 * x.abs().max(y.abs()) {
            Trend::Same
        } else if self.stress && y > x {
            Trend::LargerMagnitude
        } else if self.stress {
            Trend::SmallerMagnitude
        } else if y > x {
            Trend::Higher
        } else {
            Trend::Lower
        }
    }

    /// B − A, when both are formed.
    pub fn delta(&self) -> Option<f64> {
        Some(self.b? - self.a?)
    }
}

/// One row's values on each side, or that it is only on one.
#[derive(Debug, Clone, PartialEq)]
pub struct Compared {
    pub change: Change,
    /// `Trend::OnlyA` / `OnlyB` when the other design has no such row.
    pub trend: Trend,
}

/// The results of `a` and `b` side by side, in `a`'s order, then the rows only `b`
/// has; lengths in `units` (A's own unit when `None`), symbols in `notation`.
pub fn compare(
    a: &Analysis,
    b: &Analysis,
    units: Option<LengthUnit>,
    notation: Notation,
) -> Vec<Compared> {
    let ua = OutUnits::new(a.section.units, units).written(Default::default(), notation);
    let ub = OutUnits::new(b.section.units, Some(ua.length)).written(Default::default(), notation);
    let ra = rows(a, &ua);
    let rb = rows(b, &ub);
    let make = |r: &Row, va: Option<f64>, vb: Option<f64>| Change {
        group: r.group,
        symbol: r.symbol.clone(),
        unit: r.unit.clone(),
        meaning: r.meaning,
        a: va,
        b: vb,
        stress: r.compare == Compare::Magnitude,
        compare: r.compare,
    };
    let mut out: Vec<Compared> = ra
        .iter()
        .map(|r| match rb.iter().find(|o| o.symbol == r.symbol) {
            Some(o) => {
                let change = make(r, r.value, o.value);
                Compared {
                    trend: change.trend(),
                    change,
                }
            }
            None => Compared {
                change: make(r, r.value, None),
                trend: Trend::OnlyA,
            },
        })
        .collect();
    out.extend(
        rb.iter()
            .filter(|o| !ra.iter().any(|r| r.symbol == o.symbol))
            .map(|o| Compared {
                change: make(o, None, o.value),
                trend: Trend::OnlyB,
            }),
    );
    out
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::analysis::Options;

    fn plate(h: f64, mx: &str) -> Analysis {
        let t = format!("format = 1\nunits = \"mm\"\n[[parts]]\nshape = \"rect\"\nb = 100\nh = {h}\n[actions]\nMx = \"{mx}\"\n");
        crate::file::load::analyse(&t, &Options::default()).unwrap()
    }

    #[test]
    fn a_deeper_plate_is_stiffer_and_less_stressed() {
        let a = plate(200.0, "10 kN*m");
        let b = plate(300.0, "10 kN*m");
        let c = compare(&a, &b, None, Notation::Xy);
        let find = |s: &str| c.iter().find(|x| x.change.symbol == s).unwrap();
        // Ixx = b·h³/12 (Gere & Goodno, App. E case 1): 100·300³/12 − 100·200³/12.
        let ixx = find("Ixx");
        assert_eq!(ixx.trend, Trend::Higher);
        let d = ixx.change.delta().unwrap();
        assert!((d - 100.0 * (2.7e7 - 8e6) / 12.0).abs() < 1e-3, "{d}");
        // σ = M·c/I: the compressive stress is smaller in magnitude, though a higher number.
        let s = find("σmin");
        assert!(s.change.b.unwrap() > s.change.a.unwrap());
        assert_eq!(s.trend, Trend::SmallerMagnitude);
        assert_eq!(find("x̄").trend, Trend::Same);
    }
}
