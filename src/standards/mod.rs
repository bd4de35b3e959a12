//! Class evaluation against published standards: OIML R 60:2021 (load cells), ASTM E74-18
//! (force-measuring instruments) and ISO 376:2011 (force-proving instruments), one file each,
//! sharing the [`ClassVerdict`] type.
//!
//! A computed class verdict is not a type approval or a legal-for-trade certificate; that
//! follows local regulation.

mod astm_e74;
mod iso_376;
mod oiml_r60;
mod verdict;

pub use astm_e74::{E74Result, evaluate_e74};
pub use iso_376::{
    Iso376Class, Iso376Data, Iso376Limits, Iso376Result, Iso376Step, classify_iso376,
};
pub use oiml_r60::{OimlClass, R60Extras, R60LoadCell, evaluate_r60};
pub use verdict::{Check, ClassVerdict, ErrorPoint, VERDICT_CAUTION};
