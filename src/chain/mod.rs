//! The signal chain: excitation, amplifier and converter, and what they resolve in output
//! ratio, strain and load.

mod adc;
mod amplifier;
mod signal_chain;

pub use adc::{Adc, AdcReference};
pub use amplifier::{Amplifier, InputNoise};
pub use signal_chain::{PEAK_TO_PEAK_PER_RMS, SignalChain};
