//! A DXF file read in place: its pairs, and an index of what this tool needs.
//!
//! [`File::scan`] makes one pass over the file's group-code pairs, ASCII or
//! binary, and keeps byte spans, not copies: where each section, table,
//! table record and block starts and ends, the header variables, and the
//! model-space entities on the layers the caller asks about. Everything else
//! is passed over without being decoded — and stays in the bytes, so that
//! [`crate::write`] can copy it unchanged.
//!
//! Only [`crate::read`] and [`crate::write`] use this module.

mod encode;
mod extents;
mod index;
mod ocs;
mod pairs;
mod text;

pub use encode::Encoder;
pub use extents::Bounds;
pub use index::{
    BlockDef, EntityRef, File, HeaderVar, PARALLEL_FROM, Record, ScanOptions, SpanPairs, Table, names_match,
};
pub use ocs::ocs_to_wcs;
pub use pairs::{BINARY_SENTINEL, Format, Kind, Pair, Pairs, kind_of};
pub use text::{TextEncoding, unescape_unicode};

use thiserror::Error;

/// A DXF release, from the header variable `$ACADVER`.
#[derive(Clone, Copy, Debug, PartialEq, Eq, PartialOrd, Ord, Hash)]
pub enum Release {
    /// AC1009.
    R12,
    /// AC1012.
    R13,
    /// AC1014.
    R14,
    /// AC1015.
    R2000,
    /// AC1018.
    R2004,
    /// AC1021.
    R2007,
    /// AC1024.
    R2010,
    /// AC1027.
    R2013,
    /// AC1032.
    R2018,
}

impl Release {
    /// The release an `$ACADVER` string names (DXF reference, header variables).
    #[must_use]
    pub fn from_acadver(s: &str) -> Option<Release> {
        Some(match s.trim() {
            "AC1009" => Release::R12,
            "AC1012" => Release::R13,
            "AC1014" => Release::R14,
            "AC1015" => Release::R2000,
            "AC1018" => Release::R2004,
            "AC1021" => Release::R2007,
            "AC1024" => Release::R2010,
            "AC1027" => Release::R2013,
            "AC1032" => Release::R2018,
            _ => return None,
        })
    }

    /// The release's usual name.
    #[must_use]
    pub fn name(self) -> &'static str {
        match self {
            Release::R12 => "R12",
            Release::R13 => "R13",
            Release::R14 => "R14",
            Release::R2000 => "R2000",
            Release::R2004 => "R2004",
            Release::R2007 => "R2007",
            Release::R2010 => "R2010",
            Release::R2013 => "R2013",
            Release::R2018 => "R2018",
        }
    }

    /// True for R13 and later: subclass markers, owner handles, BLOCK_RECORDs.
    #[must_use]
    pub fn has_subclasses(self) -> bool {
        self >= Release::R13
    }
}

/// Why a file could not be read as a DXF drawing.
#[derive(Debug, Error, PartialEq)]
pub enum DxfError {
    /// Zero bytes.
    #[error("the file is empty; export the drawing again as DXF")]
    Empty,
    /// Does not start like a DXF file.
    #[error("this is not a DXF file ({detail}); export the drawing as DXF (ASCII or binary)")]
    NotDxf {
        /// What was found instead.
        detail: String,
    },
    /// Ends in the middle of something.
    #[error("the file is truncated at {location} ({detail}); save or copy the drawing again")]
    Truncated {
        /// Line number or byte offset.
        location: String,
        /// What was cut off.
        detail: String,
    },
    /// A group code that is not a number.
    #[error(
        "the group code at {location} is '{text}', not a number: the file is damaged; open and save it again in CAD"
    )]
    BadCode {
        /// Line number or byte offset.
        location: String,
        /// The offending text.
        text: String,
    },
    /// Sections or tables that do not nest as the DXF reference says.
    #[error("the file's structure is broken at {location}: {detail}; open and save it again in CAD")]
    Structure {
        /// Line number or byte offset.
        location: String,
        /// What is wrong.
        detail: String,
    },
    /// A version this tool does not read.
    #[error(
        "the drawing's version $ACADVER = '{acadver}' is not one this tool reads (R12 to R2018: AC1009 to AC1032); save it as one of those"
    )]
    Version {
        /// The version string found.
        acadver: String,
    },
}
