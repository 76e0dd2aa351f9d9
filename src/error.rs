//! The library's error: one variant per stage, each carrying its stage's
//! typed error (whose message says what is wrong, where, and what to do).

use thiserror::Error;

use crate::dxf::DxfError;
use crate::read::ReadError;
use crate::solve::SolveError;
use crate::write::WriteError;

/// Anything that stops a drawing from being processed.
#[derive(Debug, Error)]
pub enum Error {
    /// The file is not a readable DXF drawing.
    #[error(transparent)]
    Dxf(#[from] DxfError),
    /// The drawing does not describe a structure.
    #[error(transparent)]
    Read(#[from] ReadError),
    /// The structure read cannot be solved as it is.
    #[error(transparent)]
    Model(#[from] crate::model::ModelError),
    /// A condition given by the user cannot be used as given.
    #[error("{0}")]
    Condition(String),
    /// No funicular meets the conditions.
    #[error(transparent)]
    Solve(#[from] SolveError),
    /// The arch's faces do not make an arch.
    #[error(transparent)]
    Outline(#[from] crate::arch::outline::OutlineError),
    /// The arch cannot be cut into voussoirs as asked.
    #[error(transparent)]
    Slice(#[from] crate::arch::slice::SliceError),
    /// A thrust-line computation failed.
    #[error(transparent)]
    Thrust(#[from] crate::arch::thrust::ThrustError),
    /// The members cannot be sized as asked.
    #[error(transparent)]
    Sizing(#[from] crate::sizing::SizingError),
    /// The output could not be written.
    #[error(transparent)]
    Write(#[from] WriteError),
}
