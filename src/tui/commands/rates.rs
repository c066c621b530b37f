//! What buys the most (`w`): for a typed result (`Ixx` by default), every param's rate
//! of change per unit of the param and per kg/m of mass it adds, ranked by
//! [`crate::iterate::sensitivity`] (central differences with the step it states), in a
//! window over the screen that scrolls. A result that needs the torsion solve (J, Cw,
//! the shear areas…) is ranked as a [`background`] job, parallel over the params.

use super::background;
use super::seek::{quantity, shown};
use crate::analysis::Options;
use crate::fe::TorsionOptions;
use crate::iterate::sensitivity::{
    sensitivities, sensitivities_counting, Difference, Sensitivities, STEP,
};
use crate::iterate::vary::needs_torsion;
use crate::report::out::OutUnits;
use crate::report::rows::{Dim, Quantity};
use crate::tui::app::{App, LineEdit, Mode, Target};
use crate::tui::listing::Listing;
use std::sync::atomic::AtomicBool;
use std::sync::Arc;

/// Starts typing the result to rank the params by.
pub fn begin(app: &mut App) {
    if app.analysis.document.params.is_empty() {
        return app.note("the section has no [params] to rank (o adds one)");
    }
    app.mode = Mode::Typing {
        target: Target::Rates,
        line: LineEdit::new(""),
    };
    app.note("rank the params by which result? (Enter alone: Ixx)");
}

/// Ranks the params by their rate for the result named `key` and opens the window; a
/// result that needs the torsion solve (two per param) is ranked in the background
/// and the key returns at once.
pub fn open(app: &mut App, key: &str) -> Result<(), String> {
    let key = match key.trim() {
        "" => "Ixx",
        k => k,
    }
    .to_string();
    let q = quantity(&key)?;
    let a = &app.analysis;
    // Values are read in the file's own units (iterate), so labelled in them too.
    let u = OutUnits::new(a.section.units, None).written(app.config.numbers, app.config.notation);
    let unit = a.section.units.name();
    if !needs_torsion(q) {
        let s = sensitivities(&a.document, q, &Options::default()).map_err(|f| f.message())?;
        app.message = None;
        app.mode = Mode::Rates(listing(&key, q, &u, unit, &s));
        return Ok(());
    }
    let cancel = Arc::new(AtomicBool::new(false));
    let opts = Options {
        torsion: Some(TorsionOptions {
            cancel: Some(cancel.clone()),
            ..TorsionOptions::default()
        }),
        ..Options::default()
    };
    let doc = a.document.clone();
    let total = doc.params.len();
    background::start(
        app,
        format!("ranking of the params by {key}"),
        "params",
        "Each param needs two torsion solves, so this takes longer than a ranking without torsion.",
        total,
        cancel,
        move |done| {
            let s = sensitivities_counting(&doc, q, &opts, done);
            Box::new(move |app: &mut App| match s {
                Ok(s) => app.mode = Mode::Rates(listing(&key, q, &u, unit, &s)),
                Err(f) => app.error(format!("refused: {}", f.message())),
            })
        },
    );
    Ok(())
}

/// The window of the rates `s` of the result `key` (`q`), numbers in `u`, lengths in `unit`.
fn listing(key: &str, q: &Quantity, u: &OutUnits, unit: &str, s: &Sensitivities) -> Listing {
    let per = |x: f64| match q.dim {
        Dim::Fraction | Dim::One => u.num(x, 3),
        d => format!("{} {}", u.num(x, 3), d.label(u)),
    };
    let mass_unit = u.mass().name;
    let head = vec![format!(
        "{key} = {} now{}",
        shown(s.result, q, u),
        s.mass.map_or(String::new(), |m| format!(
            ", mass {} {mass_unit}",
            u.num(m, 4)
        ))
    )];
    let mut lines = Vec::new();
    for r in &s.rates {
        let name = crate::text::clean(&r.param);
        let line = match (r.per_unit, &r.failure) {
            (Some(d), _) => {
                let mass = r.per_mass.map_or("adds no mass".into(), |pm| {
                    format!("{} per {mass_unit} it adds", per(pm))
                });
                let side = match r.difference {
                    Some(Difference::Forward) => " (one-sided: below does not compute)",
                    Some(Difference::Backward) => " (one-sided: above does not compute)",
                    _ => "",
                };
                format!("{name}: {} per {unit} of {name}, {mass}{side}", per(d))
            }
            (None, Some(f)) => format!("{name}: no rate ({})", f.message()),
            (None, None) => format!("{name}: no rate"),
        };
        lines.push(line);
    }
    lines.push(String::new());
    lines.push(format!(
        "Central differences, step {STEP:e} of the value (or of the section's size); ranked by the rate per mass, then per unit."
    ));
    Listing::new(format!("What buys the most {key}"), head, lines)
}
