//! Spring elements: closed-form strength-of-materials models of the bars, beams and shafts that
//! carry a transducer's gauges.
//!
//! Each element answers, for any of the six load components at its load point: the surface
//! strain tensor at a gauge site, the stress and its peak, stiffness and deflection, a first
//! natural-frequency estimate and margins at rated and overload. Each states its frame, its
//! sources and its range of validity, and refuses geometry outside that range with
//! [`PhysicsError::OutOfRange`](crate::PhysicsError::OutOfRange). Design estimates must be proven
//! by test; overload and lifting uses follow local codes and licensed practice.

mod bar;
mod cantilever;
mod column;
mod element;
mod load;
mod margin;
mod parallelogram;
pub(crate) mod section;
mod shear_web;
mod surface;
mod torque_shaft;

pub use cantilever::Cantilever;
pub use column::{Column, ColumnSection};
pub use element::{AttachedMass, Motion, PeakStress, SpringElement, Stiffness};
pub use load::{LoadComponent, Wrench};
pub use margin::{MARGIN_CAUTION, MarginAt, Margins, OverloadFactors};
pub use parallelogram::Parallelogram;
pub use shear_web::ShearWeb;
pub use surface::{Face, Part, Site, SurfaceStrain, SurfaceStress};
pub use torque_shaft::TorqueShaft;
