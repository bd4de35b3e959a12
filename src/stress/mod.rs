//! Plane stress: isotropic elastic constants, Hooke's law from measured strains, principal
//! stresses and the von Mises equivalent stress.

mod elastic;
mod plane;
mod von_mises;

pub use elastic::Elastic;
pub use plane::{PlaneStress, PrincipalStresses};
