//! Torsion placeholder until the finite-element solver lands.
use crate::geom::{Piece, Pt};
use std::sync::atomic::AtomicBool;
use std::sync::Arc;
#[derive(Debug, Clone, Default)]
pub struct TorsionOptions {
    pub tol: f64,
    pub cancel: Option<Arc<AtomicBool>>,
}
#[derive(Debug, Clone)]
pub struct Torsion {
    pub j: f64,
    pub cw: f64,
    pub shear_centre: Pt,
    pub rel_error: f64,
    pub elements: usize,
    pub method: String,
    pub warnings: Vec<String>,
}
pub fn torsion(_p: &[Piece], _o: &TorsionOptions) -> Result<Torsion, String> {
    Err("not yet".into())
}
