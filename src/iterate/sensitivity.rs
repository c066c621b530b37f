//! Sensitivities: for every param, the rate of change of one result per unit of the
//! param and per kilogram per metre of mass it adds, by a central difference
//!
//! ```text
//! dR/dp ≈ (R(p + h) − R(p − h)) / (2h),   h = STEP · max(|p|, section size)
//! ```
//!
//! (truncation error h²·R'''/6: about 3e-9 relative for a power law such as b·h³/12
//! with STEP = 1e-4; the section size — the larger side of its bounding box — keeps
//! the step sensible for a param that is 0 now). Where p − h or p + h does not
//! compute, a one-sided difference (error of order h) is used and said. The rate per
//! mass is (dR/dp)/(dm/dp) from the same two analyses; a param that adds no mass (a
//! position) has none. Params are done in parallel.

use super::vary::{options_for, param_values, read, scope_for, Failure, Probe};
use crate::analysis::{Analysis, Options};
use crate::geom::{Resolution, Varying};
use crate::model::Document;
use crate::parallel::parallel_map;
use crate::report::rows::{Quantity, QUANTITIES};
use std::sync::atomic::{AtomicUsize, Ordering};

/// The relative step of the central difference.
pub const STEP: f64 = 1e-4;

/// How a rate was formed.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Difference {
    Central,
    /// p − h does not compute.
    Forward,
    /// p + h does not compute.
    Backward,
}

/// One param's rates.
#[derive(Debug, Clone, PartialEq)]
pub struct Rate {
    pub param: String,
    /// The param's value now.
    pub value: f64,
    /// The step h.
    pub step: f64,
    /// dR/dp, result units per file length unit (per unit of the param); `None` when
    /// neither side computes.
    pub per_unit: Option<f64>,
    /// dR/dm, result units per kg/m (lb/ft); `None` without a density or when the
    /// param adds no mass.
    pub per_mass: Option<f64>,
    pub difference: Option<Difference>,
    /// Why there is no rate, when there is none.
    pub failure: Option<Failure>,
}

/// The rates of every param for one result, ranked: largest |per mass| first, then
/// the params without one by |per unit|.
#[derive(Debug, Clone)]
pub struct Sensitivities {
    pub result: f64,
    /// Mass per length now (kg/m or lb/ft), with a density.
    pub mass: Option<f64>,
    pub rates: Vec<Rate>,
}

/// The mass per length quantity (the table's `mass_per_length`).
fn mass_quantity() -> &'static Quantity {
    QUANTITIES
        .iter()
        .find(|q| q.path == "mass_per_length")
        .expect("the table has mass_per_length")
}

/// The sensitivities of `q` to every param of `doc`. `Err` when the file itself does
/// not give `q`.
pub fn sensitivities(
    doc: &Document,
    q: &Quantity,
    opts: &Options,
) -> Result<Sensitivities, Failure> {
    sensitivities_counting(doc, q, opts, &AtomicUsize::new(0))
}

/// [`sensitivities`], counting in `done` the params finished so far (for a progress
/// line while it runs on another thread).
pub fn sensitivities_counting(
    doc: &Document,
    q: &Quantity,
    opts: &Options,
    done: &AtomicUsize,
) -> Result<Sensitivities, Failure> {
    let quick = options_for(q, opts);
    // The mass is one of the properties, which every scope computes.
    let scope = scope_for(q);
    let base = Analysis::of_document_in(doc.clone(), &quick, scope).map_err(Failure::Invalid)?;
    let result = read(q, &base).ok_or_else(|| Failure::NoResult(q.path.into()))?;
    let m = mass_quantity();
    let mass = read(m, &base);
    let b = base.props.bounds;
    let size = (b[1] - b[0]).max(b[3] - b[2]);
    let params = param_values(doc).map_err(Failure::Invalid)?;
    // What each param does not reach, from one resolution of the document (the
    // values are in the order of `doc.params`).
    let resolution = Resolution::new(doc);
    let work: Vec<(usize, f64)> = params.iter().map(|p| p.1).enumerate().collect();
    let one = |&(i, x): &(usize, f64)| -> Rate {
        let varying = Varying::of(&resolution, doc, i);
        let probe = Probe::with_varying(doc, varying, x, &quick, scope);
        let h = STEP * x.abs().max(size);
        let at = |x: f64| probe.analyse(x).map(|a| (read(q, &a), read(m, &a)));
        let (lo, hi) = (at(x - h), at(x + h));
        let mut rate = Rate {
            param: params[i].0.clone(),
            value: x,
            step: h,
            per_unit: None,
            per_mass: None,
            difference: None,
            failure: None,
        };
        let here = Ok((Some(result), mass));
        let (l, r, dx, how) = match (&lo, &hi) {
            (Ok(_), Ok(_)) => (&lo, &hi, 2.0 * h, Difference::Central),
            (Err(_), Ok(_)) => (&here, &hi, h, Difference::Forward),
            (Ok(_), Err(_)) => (&lo, &here, h, Difference::Backward),
            (Err(f), Err(_)) => {
                rate.failure = Some(f.clone());
                return rate;
            }
        };
        let (Ok((Some(rl), ml)), Ok((Some(rr), mr))) = (l, r) else {
            rate.failure = Some(Failure::NoResult(q.path.into()));
            return rate;
        };
        let d = (rr - rl) / dx;
        rate.per_unit = Some(d);
        rate.difference = Some(how);
        if let (Some(ml), Some(mr), Some(m0)) = (ml, mr, mass) {
            let dm = (mr - ml) / dx;
            // A mass change below the rounding of the mass itself is no change.
            if (mr - ml).abs() > 1e-12 * m0.abs() {
                rate.per_mass = Some(d / dm);
            }
        }
        rate
    };
    let counted = |w: &(usize, f64)| {
        let rate = one(w);
        done.fetch_add(1, Ordering::Relaxed);
        rate
    };
    let mut rates: Vec<Rate> = parallel_map(&work, counted)
        .into_iter()
        .zip(&params)
        .map(|(r, (name, x))| {
            r.unwrap_or_else(|panic| Rate {
                param: name.clone(),
                value: *x,
                step: 0.0,
                per_unit: None,
                per_mass: None,
                difference: None,
                failure: Some(Failure::Internal(panic)),
            })
        })
        .collect();
    let key = |r: &Rate| match (r.per_mass, r.per_unit) {
        (Some(pm), _) => (0, -pm.abs()),
        (None, Some(pu)) => (1, -pu.abs()),
        _ => (2, 0.0),
    };
    rates.sort_by(|a, b| {
        let (ka, kb) = (key(a), key(b));
        ka.0.cmp(&kb.0).then(ka.1.total_cmp(&kb.1))
    });
    Ok(Sensitivities {
        result,
        mass,
        rates,
    })
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::iterate::vary::result_key;

    #[test]
    fn rates_of_a_rectangle_match_the_derivatives_of_its_closed_form() {
        let text = "format = 1\nunits = \"mm\"\n[params]\nb = 100\nh = 300\nx = 0\n[[materials]]\nname = \"steel\"\nE = \"200 GPa\"\ndensity = \"7850 kg/m3\"\n[[parts]]\nshape = \"rect\"\nb = \"b\"\nh = \"h\"\nat = [\"x\", 0]\n";
        let d = crate::file::parse(text).unwrap();
        let q = result_key("inertia.xx").unwrap();
        let s = sensitivities(&d, q, &Options::default()).unwrap();
        // Ixx = b·h³/12: ∂/∂h = b·h²/4, ∂/∂b = h³/12 (Gere & Goodno, App. E case 1);
        // m = ρ·b·h, so ∂m/∂h = ρ·b and ∂m/∂b = ρ·h (kg/m with b, h in mm: ρ·1e-6).
        let rho = 7850.0 * 1e-6;
        let get = |n: &str| s.rates.iter().find(|r| r.param == n).unwrap();
        let h = get("h");
        let want = 100.0 * 300.0f64.powi(2) / 4.0;
        assert!((h.per_unit.unwrap() - want).abs() <= 1e-6 * want);
        let pm = want / (rho * 100.0);
        assert!((h.per_mass.unwrap() - pm).abs() <= 1e-6 * pm);
        let b = get("b");
        let want = 300.0f64.powi(3) / 12.0;
        assert!((b.per_unit.unwrap() - want).abs() <= 1e-6 * want);
        // Moving the plate sideways changes neither Ixx nor the mass.
        let x = get("x");
        assert!(x.per_unit.unwrap().abs() <= 1e-6);
        assert_eq!(x.per_mass, None);
        // Depth buys more Ixx per kg than width: ranked first.
        assert_eq!(s.rates[0].param, "h");
        assert_eq!(s.rates.last().unwrap().param, "x");
    }
}
