//! A filter with state carried between calls, for logs that arrive in chunks (batches from a
//! reader, a live acquisition): feeding the chunks one after another gives exactly the output of
//! filtering the whole signal at once.

use super::filter::{SosFilter, check_signal, run, run4};
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

/// One [`SosFilter`] run over several channels of a log that arrive in chunks, each channel with
/// its own state: the same output as one [`StreamingFilter`] per channel, but four channels go
/// through the cascade together, which is several times faster than one after another (each
/// recursion waits on its own last output; four independent ones fill those waits).
///
/// ```
/// use gaugebook::{SosFilter, StreamingBank, StreamingFilter};
/// let f = SosFilter::from_sections(vec![[0.2, 0.4, 0.2, 1.0, -0.5, 0.1]])?;
/// let mut bank = StreamingBank::new(f.clone(), 5);
/// let mut x: Vec<Vec<f64>> = (0..5).map(|k| vec![k as f64, 1.0, -2.0]).collect();
/// let mut y = x.clone();
/// let mut parts: Vec<&mut [f64]> = x.iter_mut().map(|v| &mut v[..]).collect();
/// bank.process(&mut parts)?;
/// for v in y.iter_mut() {
///     StreamingFilter::new(f.clone()).process(v)?;
/// }
/// assert_eq!(x, y);
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
#[derive(Clone, Debug)]
pub struct StreamingBank {
    filter: SosFilter,
    /// Per group of four channels, per section, one [z0, z1] per channel (unused lanes of the
    /// last group stay zero).
    state: Vec<Vec<[[f64; 2]; 4]>>,
    channels: usize,
}

impl StreamingBank {
    /// A bank for `channels` channels, every state zero (as scipy.signal.sosfilt without `zi`).
    ///
    /// ```
    /// let f = gaugebook::SosFilter::from_sections(vec![[1.0, 0.0, 0.0, 1.0, 0.0, 0.0]])?;
    /// assert_eq!(gaugebook::StreamingBank::new(f, 3).channels(), 3);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn new(filter: SosFilter, channels: usize) -> StreamingBank {
        let groups = channels.div_ceil(4);
        let state = vec![vec![[[0.0; 2]; 4]; filter.sections().len()]; groups];
        StreamingBank {
            filter,
            state,
            channels,
        }
    }

    /// The number of channels.
    ///
    /// ```
    /// let f = gaugebook::SosFilter::from_sections(vec![[1.0, 0.0, 0.0, 1.0, 0.0, 0.0]])?;
    /// assert_eq!(gaugebook::StreamingBank::new(f, 0).channels(), 0);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn channels(&self) -> usize {
        self.channels
    }

    /// Filters the next chunk of every channel in place (one slice per channel, all of one
    /// length). Errors on a wrong number of channels, unequal lengths or a non-finite sample,
    /// and then changes neither the chunks nor the states.
    ///
    /// ```
    /// let f = gaugebook::SosFilter::from_sections(vec![[0.5, 0.5, 0.0, 1.0, 0.0, 0.0]])?;
    /// let mut bank = gaugebook::StreamingBank::new(f, 2);
    /// let (mut a, mut b) = ([2.0, 4.0], [0.0, 2.0]);
    /// bank.process(&mut [&mut a[..], &mut b[..]])?;
    /// assert_eq!((a, b), ([1.0, 3.0], [0.0, 1.0]));
    /// assert!(bank.process(&mut [&mut a[..]]).is_err());
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn process(&mut self, chunks: &mut [&mut [f64]]) -> Result<(), PhysicsError> {
        if chunks.len() != self.channels {
            return Err(PhysicsError::invalid(
                "number of channels given to the filter bank",
                chunks.len(),
                format!("{} channels", self.channels),
            ));
        }
        let n = chunks.first().map_or(0, |c| c.len());
        if let Some(c) = chunks.iter().find(|c| c.len() != n) {
            return Err(PhysicsError::invalid(
                "chunk length of a channel",
                c.len(),
                format!("{n} samples, the length of the first channel's chunk"),
            ));
        }
        if n == 0 {
            return Ok(());
        }
        for c in chunks.iter() {
            check_signal(c)?;
        }
        let sections = self.filter.sections();
        for (group, state) in chunks.chunks_mut(4).zip(self.state.iter_mut()) {
            if group.len() == 4 {
                run4(sections, state, group);
            } else {
                for (k, c) in group.iter_mut().enumerate() {
                    let mut z: Vec<[f64; 2]> = state.iter().map(|s| s[k]).collect();
                    run(sections, &mut z, c);
                    for (s, zk) in state.iter_mut().zip(z) {
                        s[k] = zk;
                    }
                }
            }
        }
        Ok(())
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::FilterBand;
    use crate::units::Frequency;
    use uom::si::frequency::hertz;

    /// The bank is a faster arrangement of the same arithmetic: its output must equal one
    /// streaming filter per channel bit for bit, whatever the chunking (closed-form identity:
    /// the same operations in the same order).
    #[test]
    fn bank_equals_one_filter_per_channel() {
        let hz = Frequency::new::<hertz>;
        let f = SosFilter::butterworth(4, FilterBand::LowPass, hz(50.0), hz(1000.0)).unwrap();
        let n = 5000;
        let signal = |k: usize| -> Vec<f64> {
            (0..n)
                .map(|i| ((i * (k + 3)) as f64 * 0.013).sin() + (k as f64) * 0.1)
                .collect()
        };
        let mut bank = StreamingBank::new(f.clone(), 5);
        let mut got: Vec<Vec<f64>> = (0..5).map(signal).collect();
        let mut start = 0;
        for len in [1, 7, 2048, 3, 2941] {
            let mut parts: Vec<&mut [f64]> =
                got.iter_mut().map(|v| &mut v[start..start + len]).collect();
            bank.process(&mut parts).unwrap();
            start += len;
        }
        assert_eq!(start, n);
        for (k, g) in got.iter().enumerate() {
            let mut want = signal(k);
            StreamingFilter::new(f.clone()).process(&mut want).unwrap();
            assert_eq!(g, &want, "channel {k}");
        }
    }

    #[test]
    fn bank_rejects_bad_chunks_and_leaves_them() {
        let f = SosFilter::from_sections(vec![[0.5, 0.5, 0.0, 1.0, 0.0, 0.0]]).unwrap();
        let mut bank = StreamingBank::new(f, 2);
        let (mut a, mut b) = ([1.0, 2.0], [f64::NAN, 0.0]);
        assert!(bank.process(&mut [&mut a[..], &mut b[..]]).is_err());
        assert_eq!(a, [1.0, 2.0]);
        let mut c = [1.0];
        assert!(bank.process(&mut [&mut a[..], &mut c[..]]).is_err());
        // The state is still zero: the first output is b0 · x.
        let (mut a, mut b) = ([2.0], [4.0]);
        bank.process(&mut [&mut a[..], &mut b[..]]).unwrap();
        assert_eq!((a, b), ([1.0], [2.0]));
    }
}
