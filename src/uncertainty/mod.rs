//! Measurement uncertainty: GUM budgets (JCGM 100:2008) and Monte Carlo propagation of
//! distributions (JCGM 101:2008), sharing one set of inputs and one column model.

mod distribution;
mod gum;
mod monte_carlo;
mod special;

pub use distribution::Distribution;
pub use gum::{Budget, Contribution, Expanded, GumResult, Input, sample_correlation};
pub use monte_carlo::{IntervalKind, McResult, MonteCarlo, Validation};
pub use special::{coverage_factor, ln_gamma, student_t_quantile, student_t_two_sided_tail};
