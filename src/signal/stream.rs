//! A filter with state carried between calls, for logs that arrive in chunks (batches from a
//! reader, a live acquisition): feeding the chunks one after another gives exactly the output of
//! filtering the whole signal at once.

use super::filter::{SosFilter, check_signal, run};
use crate::PhysicsError;

/// A [`SosFilter`] plus its running state.
///
/// ```
/// use gaugebook::{StreamingFilter, SosFilter};
/// let f = SosFilter::from_sections(vec![[0.5, 0.5, 0.0, 1.0, 0.0, 0.0]])?;
/// let mut s = StreamingFilter::new(f.clone());
/// let (mut a, mut b) = (vec![2.0, 4.0], vec![6.0]);
/// s.process(&mut a)?;
/// s.process(&mut b)?;
/// assert_eq!([a, b].concat(), f.filter(&[2.0, 4.0, 6.0])?);
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
#[derive(Clone, Debug)]
pub struct StreamingFilter {
    filter: SosFilter,
    state: Vec<[f64; 2]>,
}

impl StreamingFilter {
    /// Starts from a zero state (as scipy.signal.sosfilt without `zi`).
    ///
    /// ```
    /// let f = gaugebook::SosFilter::from_sections(vec![[1.0, 0.0, 0.0, 1.0, -0.5, 0.0]])?;
    /// let mut s = gaugebook::StreamingFilter::new(f);
    /// let mut x = [1.0, 0.0];
    /// s.process(&mut x)?;
    /// assert_eq!(x, [1.0, 0.5]);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn new(filter: SosFilter) -> StreamingFilter {
        let state = vec![[0.0; 2]; filter.sections().len()];
        StreamingFilter { filter, state }
    }

    /// Starts settled on a constant input `level` (state = sosfilt_zi × level), so a signal that
    /// begins at `level` shows no start-up transient.
    ///
    /// ```
    /// let f = gaugebook::SosFilter::from_sections(vec![[0.5, 0.5, 0.0, 1.0, 0.0, 0.0]])?;
    /// let mut s = gaugebook::StreamingFilter::settled(f, 4.0);
    /// let mut x = [4.0, 4.0];
    /// s.process(&mut x)?;
    /// assert_eq!(x, [4.0, 4.0]);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn settled(filter: SosFilter, level: f64) -> StreamingFilter {
        let state = filter
            .initial_conditions()
            .iter()
            .map(|z| [z[0] * level, z[1] * level])
            .collect();
        StreamingFilter { filter, state }
    }

    /// Filters the next chunk in place. Errors on a non-finite sample (the chunk and the state
    /// are then left unchanged); an empty chunk is accepted and changes nothing.
    ///
    /// ```
    /// let f = gaugebook::SosFilter::from_sections(vec![[0.5, 0.5, 0.0, 1.0, 0.0, 0.0]])?;
    /// let mut s = gaugebook::StreamingFilter::new(f);
    /// s.process(&mut [])?;
    /// assert!(s.process(&mut [f64::NAN]).is_err());
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn process(&mut self, x: &mut [f64]) -> Result<(), PhysicsError> {
        if x.is_empty() {
            return Ok(());
        }
        check_signal(x)?;
        run(self.filter.sections(), &mut self.state, x);
        Ok(())
    }

    /// Clears the state back to zero.
    ///
    /// ```
    /// let f = gaugebook::SosFilter::from_sections(vec![[0.5, 0.5, 0.0, 1.0, 0.0, 0.0]])?;
    /// let mut s = gaugebook::StreamingFilter::new(f);
    /// s.process(&mut [2.0])?;
    /// s.reset();
    /// let mut x = [2.0];
    /// s.process(&mut x)?;
    /// assert_eq!(x, [1.0]);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn reset(&mut self) {
        self.state.iter_mut().for_each(|z| *z = [0.0; 2]);
    }

    /// The filter being run.
    ///
    /// ```
    /// let f = gaugebook::SosFilter::from_sections(vec![[0.5, 0.5, 0.0, 1.0, 0.0, 0.0]])?;
    /// assert_eq!(gaugebook::StreamingFilter::new(f.clone()).filter(), &f);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn filter(&self) -> &SosFilter {
        &self.filter
    }
}
