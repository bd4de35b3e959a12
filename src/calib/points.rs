//! Calibration points: applied load against indication, grouped into series.
//!
//! A series is one pass over the load levels in one direction (ascending or descending) at one
//! mounting rotation. Loads are stored in SI (N for force, N·m for torque); the indication is a
//! plain number with a unit label, because a load cell reports mV/V, a force transducer behind an
//! amplifier reports counts or volts, and a torque sensor may report strain. Typed constructors
//! ([`CalibrationRun::push_force_series`]) take uom forces and [`OutputRatio`]s so the common case
//! stays unit-checked.

use crate::units::{Force, Torque};
use crate::{OutputRatio, PhysicsError, Strain};
use uom::si::force::newton;
use uom::si::torque::newton_meter;

/// What the applied load is: a force (N) or a torque (N·m).
///
/// ```
/// use gaugebook::LoadKind;
/// assert_eq!(LoadKind::Torque.si_unit(), "N·m");
/// ```
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum LoadKind {
    /// Force in newtons.
    Force,
    /// Torque in newton metres.
    Torque,
}

impl LoadKind {
    /// The SI unit the loads are stored in.
    ///
    /// ```
    /// assert_eq!(gaugebook::LoadKind::Force.si_unit(), "N");
    /// ```
    pub fn si_unit(self) -> &'static str {
        match self {
            LoadKind::Force => "N",
            LoadKind::Torque => "N·m",
        }
    }
}

/// The direction of a series of load steps.
///
/// ```
/// use gaugebook::Direction;
/// assert_ne!(Direction::Ascending, Direction::Descending);
/// ```
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Direction {
    /// Loads increasing from the first point to the last.
    Ascending,
    /// Loads decreasing from the first point to the last.
    Descending,
}

/// One reading: applied load (SI), indication, and where it belongs.
///
/// ```
/// use gaugebook::{CalibrationPoint, Direction};
/// let p = CalibrationPoint { load: 100.0, indication: 0.2, direction: Direction::Ascending,
///     series: 0, rotation_deg: 0.0 };
/// assert_eq!(p.load, 100.0);
/// ```
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct CalibrationPoint {
    /// Applied load in N or N·m (see [`LoadKind`]).
    pub load: f64,
    /// The instrument's indication, in the run's indication unit.
    pub indication: f64,
    /// Direction of the series the point belongs to.
    pub direction: Direction,
    /// Index of the series in the run, counting from 0 in the order pushed.
    pub series: usize,
    /// Mounting rotation of the transducer for this series, in degrees.
    pub rotation_deg: f64,
}

/// One series as pushed: its direction, rotation and points in order.
///
/// ```
/// use gaugebook::{CalibrationRun, Direction, LoadKind};
/// let mut run = CalibrationRun::new(LoadKind::Force, "mV/V");
/// run.push_series(&[0.0, 50.0, 100.0], &[0.0, 1.0, 2.0], Direction::Ascending, 0.0)?;
/// assert_eq!(run.series()[0].loads(), vec![0.0, 50.0, 100.0]);
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
#[derive(Clone, Debug, PartialEq)]
pub struct Series {
    /// Direction of the load steps.
    pub direction: Direction,
    /// Mounting rotation in degrees.
    pub rotation_deg: f64,
    /// The points in the order they were taken.
    pub points: Vec<CalibrationPoint>,
}

impl Series {
    /// The applied loads, in order.
    ///
    /// ```
    /// use gaugebook::{CalibrationRun, Direction, LoadKind};
    /// let mut run = CalibrationRun::new(LoadKind::Force, "mV/V");
    /// run.push_series(&[0.0, 100.0], &[0.01, 2.0], Direction::Ascending, 0.0)?;
    /// assert_eq!(run.series()[0].loads(), vec![0.0, 100.0]);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn loads(&self) -> Vec<f64> {
        self.points.iter().map(|p| p.load).collect()
    }

    /// The indications, in order.
    ///
    /// ```
    /// use gaugebook::{CalibrationRun, Direction, LoadKind};
    /// let mut run = CalibrationRun::new(LoadKind::Force, "mV/V");
    /// run.push_series(&[0.0, 100.0], &[0.01, 2.0], Direction::Ascending, 0.0)?;
    /// assert_eq!(run.series()[0].indications(), vec![0.01, 2.0]);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn indications(&self) -> Vec<f64> {
        self.points.iter().map(|p| p.indication).collect()
    }

    /// The indication at a load level (within `tol` of it, in load units), if the series has it.
    ///
    /// ```
    /// use gaugebook::{CalibrationRun, Direction, LoadKind};
    /// let mut run = CalibrationRun::new(LoadKind::Force, "mV/V");
    /// run.push_series(&[0.0, 100.0], &[0.0, 2.0], Direction::Ascending, 0.0)?;
    /// assert_eq!(run.series()[0].indication_at(100.0, 1e-9), Some(2.0));
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn indication_at(&self, load: f64, tol: f64) -> Option<f64> {
        self.points
            .iter()
            .find(|p| (p.load - load).abs() <= tol)
            .map(|p| p.indication)
    }
}

/// A calibration run: every series of one transducer, with the load kind and indication unit.
///
/// ```
/// use gaugebook::{CalibrationRun, Direction, OutputRatio};
/// use gaugebook::units::Force;
/// use uom::si::force::kilonewton;
/// let loads: Vec<Force> = [0.0, 5.0, 10.0].iter().map(|&f| Force::new::<kilonewton>(f)).collect();
/// let out: Vec<OutputRatio> = [0.0, 1.0, 2.0].iter().map(|&m| OutputRatio::from_mv_per_v(m)).collect();
/// let mut run = CalibrationRun::force_in_output_ratio();
/// run.push_force_series(&loads, &out, Direction::Ascending, 0.0)?;
/// assert_eq!(run.points().len(), 3);
/// assert_eq!(run.indication_unit(), "V/V");
/// # Ok::<(), gaugebook::PhysicsError>(())
/// ```
#[derive(Clone, Debug, PartialEq)]
pub struct CalibrationRun {
    load_kind: LoadKind,
    indication_unit: String,
    series: Vec<Series>,
}

impl CalibrationRun {
    /// An empty run with loads of `load_kind` and indications labelled `indication_unit`.
    ///
    /// ```
    /// use gaugebook::{CalibrationRun, LoadKind};
    /// let run = CalibrationRun::new(LoadKind::Torque, "counts");
    /// assert!(run.points().is_empty());
    /// ```
    pub fn new(load_kind: LoadKind, indication_unit: &str) -> CalibrationRun {
        CalibrationRun {
            load_kind,
            indication_unit: indication_unit.to_string(),
            series: vec![],
        }
    }

    /// An empty run of a load cell: force against bridge output in V/V.
    ///
    /// ```
    /// let run = gaugebook::CalibrationRun::force_in_output_ratio();
    /// assert_eq!(run.load_kind(), gaugebook::LoadKind::Force);
    /// ```
    pub fn force_in_output_ratio() -> CalibrationRun {
        CalibrationRun::new(LoadKind::Force, "V/V")
    }

    /// The load kind.
    ///
    /// ```
    /// use gaugebook::{CalibrationRun, Direction, LoadKind};
    /// let mut run = CalibrationRun::new(LoadKind::Force, "mV/V");
    /// run.push_series(&[0.0, 100.0], &[0.01, 2.0], Direction::Ascending, 0.0)?;
    /// assert_eq!(run.load_kind(), LoadKind::Force);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn load_kind(&self) -> LoadKind {
        self.load_kind
    }

    /// The unit label of the indications.
    ///
    /// ```
    /// use gaugebook::{CalibrationRun, Direction, LoadKind};
    /// let mut run = CalibrationRun::new(LoadKind::Force, "mV/V");
    /// run.push_series(&[0.0, 100.0], &[0.01, 2.0], Direction::Ascending, 0.0)?;
    /// assert_eq!(run.indication_unit(), "mV/V");
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn indication_unit(&self) -> &str {
        &self.indication_unit
    }

    /// The series in the order pushed.
    ///
    /// ```
    /// use gaugebook::{CalibrationRun, Direction, LoadKind};
    /// let mut run = CalibrationRun::new(LoadKind::Force, "mV/V");
    /// run.push_series(&[0.0, 100.0], &[0.01, 2.0], Direction::Ascending, 0.0)?;
    /// assert_eq!(run.series().len(), 1);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn series(&self) -> &[Series] {
        &self.series
    }

    /// Every point of every series.
    ///
    /// ```
    /// use gaugebook::{CalibrationRun, Direction, LoadKind};
    /// let mut run = CalibrationRun::new(LoadKind::Force, "mV/V");
    /// run.push_series(&[0.0, 100.0], &[0.01, 2.0], Direction::Ascending, 0.0)?;
    /// assert_eq!(run.points()[1].indication, 2.0);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn points(&self) -> Vec<CalibrationPoint> {
        self.series
            .iter()
            .flat_map(|s| s.points.iter().copied())
            .collect()
    }

    /// The series in one direction.
    ///
    /// ```
    /// use gaugebook::{CalibrationRun, Direction, LoadKind};
    /// let mut run = CalibrationRun::new(LoadKind::Force, "counts");
    /// run.push_series(&[0.0, 10.0], &[3.0, 1003.0], Direction::Ascending, 0.0)?;
    /// run.push_series(&[10.0, 0.0], &[1004.0, 4.0], Direction::Descending, 0.0)?;
    /// assert_eq!(run.series_in(Direction::Descending).len(), 1);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn series_in(&self, direction: Direction) -> Vec<&Series> {
        self.series
            .iter()
            .filter(|s| s.direction == direction)
            .collect()
    }

    /// Appends one series of plain numbers: loads in SI (N or N·m) and indications in the run's
    /// unit. Loads must be strictly monotonic in the stated direction; lengths must agree; at
    /// least two points; every value finite. Returns the series index.
    ///
    /// ```
    /// use gaugebook::{CalibrationRun, Direction, LoadKind};
    /// let mut run = CalibrationRun::new(LoadKind::Torque, "µε");
    /// let err = run.push_series(&[0.0, 20.0, 10.0], &[0.0, 1.0, 2.0], Direction::Ascending, 0.0);
    /// assert!(err.unwrap_err().to_string().contains("strictly increasing"));
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn push_series(
        &mut self,
        loads: &[f64],
        indications: &[f64],
        direction: Direction,
        rotation_deg: f64,
    ) -> Result<usize, PhysicsError> {
        if loads.len() != indications.len() {
            return Err(PhysicsError::Mismatch {
                what: "load and indication series lengths".into(),
                left: format!("{} loads", loads.len()),
                right: format!("{} indications", indications.len()),
            });
        }
        if loads.len() < 2 {
            return Err(PhysicsError::NotEnoughData {
                what: "a calibration series".into(),
                needed: 2,
                found: loads.len(),
            });
        }
        let unit = self.load_kind.si_unit();
        for (i, (&l, &r)) in loads.iter().zip(indications).enumerate() {
            crate::check_finite(&format!("load at point {i}"), l, unit)?;
            crate::check_finite(
                &format!("indication at point {i}"),
                r,
                &self.indication_unit,
            )?;
        }
        crate::check_finite("mounting rotation", rotation_deg, "°")?;
        for (i, w) in loads.windows(2).enumerate() {
            let ok = match direction {
                Direction::Ascending => w[1] > w[0],
                Direction::Descending => w[1] < w[0],
            };
            if !ok {
                let want = match direction {
                    Direction::Ascending => "strictly increasing",
                    Direction::Descending => "strictly decreasing",
                };
                return Err(PhysicsError::invalid(
                    format!("load sequence at point {}", i + 1),
                    format!("{} {unit} after {} {unit}", w[1], w[0]),
                    match direction {
                        Direction::Ascending => format!("{want} loads in an ascending series"),
                        Direction::Descending => format!("{want} loads in a descending series"),
                    },
                ));
            }
        }
        let series = self.series.len();
        let points = loads
            .iter()
            .zip(indications)
            .map(|(&load, &indication)| CalibrationPoint {
                load,
                indication,
                direction,
                series,
                rotation_deg,
            })
            .collect();
        self.series.push(Series {
            direction,
            rotation_deg,
            points,
        });
        Ok(series)
    }

    /// Appends a series of forces against bridge output ratios. The run must hold forces in V/V.
    ///
    /// ```
    /// use gaugebook::{CalibrationRun, Direction, LoadKind, OutputRatio};
    /// use gaugebook::units::Force;
    /// use uom::si::force::newton;
    /// let mut run = CalibrationRun::new(LoadKind::Force, "counts");
    /// let f = [Force::new::<newton>(0.0), Force::new::<newton>(1.0)];
    /// let o = [OutputRatio::new(0.0), OutputRatio::new(1e-3)];
    /// assert!(run.push_force_series(&f, &o, Direction::Ascending, 0.0).is_err());
    /// ```
    pub fn push_force_series(
        &mut self,
        loads: &[Force],
        outputs: &[OutputRatio],
        direction: Direction,
        rotation_deg: f64,
    ) -> Result<usize, PhysicsError> {
        self.expect_units(LoadKind::Force, "V/V")?;
        let l: Vec<f64> = loads.iter().map(|f| f.get::<newton>()).collect();
        let r: Vec<f64> = outputs.iter().map(|o| o.value()).collect();
        self.push_series(&l, &r, direction, rotation_deg)
    }

    /// Appends a series of torques against strain (m/m). The run must hold torques in m/m.
    ///
    /// ```
    /// use gaugebook::{CalibrationRun, Direction, LoadKind, Strain};
    /// use gaugebook::units::Torque;
    /// use uom::si::torque::newton_meter;
    /// let mut run = CalibrationRun::new(LoadKind::Torque, "m/m");
    /// let t = [Torque::new::<newton_meter>(0.0), Torque::new::<newton_meter>(50.0)];
    /// let e = [Strain::new(0.0), Strain::from_microstrain(500.0)];
    /// run.push_torque_series(&t, &e, Direction::Ascending, 0.0)?;
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn push_torque_series(
        &mut self,
        loads: &[Torque],
        strains: &[Strain],
        direction: Direction,
        rotation_deg: f64,
    ) -> Result<usize, PhysicsError> {
        self.expect_units(LoadKind::Torque, "m/m")?;
        let l: Vec<f64> = loads.iter().map(|t| t.get::<newton_meter>()).collect();
        let r: Vec<f64> = strains.iter().map(|e| e.value()).collect();
        self.push_series(&l, &r, direction, rotation_deg)
    }

    fn expect_units(&self, kind: LoadKind, unit: &str) -> Result<(), PhysicsError> {
        if self.load_kind != kind || self.indication_unit != unit {
            return Err(PhysicsError::Mismatch {
                what: "calibration run units".into(),
                left: format!(
                    "run of {} in {}",
                    self.load_kind.si_unit(),
                    self.indication_unit
                ),
                right: format!("series of {} in {unit}", kind.si_unit()),
            });
        }
        Ok(())
    }

    /// Builds a run from a test log's detected holds (see [`crate::find_holds`]): each hold's
    /// samples, less `settle` at each end, give one point (mean load, mean indication); the
    /// points are split into ascending and descending series where the load turns, the turning
    /// point belonging to both. Consecutive holds at the same load (within `tol`) keep the first.
    ///
    /// ```
    /// use gaugebook::{CalibrationRun, Direction, HoldCriteria, LoadKind, find_holds};
    /// // Load steps 0, 50, 100, 50, 0 N of 40 samples each, ramps of 10 between.
    /// let levels = [0.0, 50.0, 100.0, 50.0, 0.0];
    /// let mut load = vec![];
    /// for (k, &l) in levels.iter().enumerate() {
    ///     if k > 0 {
    ///         let prev: f64 = levels[k - 1];
    ///         load.extend((1..=10).map(|i| prev + (l - prev) * i as f64 / 11.0));
    ///     }
    ///     load.extend(std::iter::repeat(l).take(40));
    /// }
    /// let ind: Vec<f64> = load.iter().map(|l| 0.02 * l).collect();
    /// let holds = find_holds(&load, &HoldCriteria { tolerance: 0.5, min_samples: 30, settle_samples: 0 })?;
    /// let run = CalibrationRun::from_holds(LoadKind::Force, "mV/V", &load, &ind, &holds, 2, 1.0, 0.0)?;
    /// assert_eq!(run.series().len(), 2);
    /// assert_eq!(run.series_in(Direction::Descending)[0].loads(), vec![100.0, 50.0, 0.0]);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    #[allow(clippy::too_many_arguments)] // each argument is a distinct, named input of the log
    pub fn from_holds(
        load_kind: LoadKind,
        indication_unit: &str,
        load: &[f64],
        indication: &[f64],
        holds: &[crate::Hold],
        settle: usize,
        tol: f64,
        rotation_deg: f64,
    ) -> Result<CalibrationRun, PhysicsError> {
        if load.len() != indication.len() {
            return Err(PhysicsError::Mismatch {
                what: "load and indication column lengths".into(),
                left: format!("{} load samples", load.len()),
                right: format!("{} indication samples", indication.len()),
            });
        }
        let mut pts: Vec<(f64, f64)> = vec![];
        for h in holds {
            let (a, b) = (h.start + settle, h.end.saturating_sub(settle));
            if b <= a || b > load.len() {
                return Err(PhysicsError::invalid(
                    "hold range",
                    format!(
                        "samples {} … {} less {settle} settling each end",
                        h.start, h.end
                    ),
                    format!("a non-empty range within {} samples", load.len()),
                ));
            }
            let n = (b - a) as f64;
            let l = load[a..b].iter().sum::<f64>() / n;
            let r = indication[a..b].iter().sum::<f64>() / n;
            if pts.last().is_none_or(|&(pl, _)| (l - pl).abs() > tol) {
                pts.push((l, r));
            }
        }
        let mut run = CalibrationRun::new(load_kind, indication_unit);
        let mut start = 0;
        while start + 1 < pts.len() {
            let rising = pts[start + 1].0 > pts[start].0;
            let mut end = start + 1;
            while end + 1 < pts.len() && (pts[end + 1].0 > pts[end].0) == rising {
                end += 1;
            }
            let (l, r): (Vec<f64>, Vec<f64>) = pts[start..=end].iter().copied().unzip();
            let dir = if rising {
                Direction::Ascending
            } else {
                Direction::Descending
            };
            run.push_series(&l, &r, dir, rotation_deg)?;
            start = end;
        }
        if run.series.is_empty() {
            return Err(PhysicsError::NotEnoughData {
                what: "calibration points from holds".into(),
                needed: 2,
                found: pts.len(),
            });
        }
        Ok(run)
    }

    /// All loads and indications of the chosen direction(s) as two parallel vectors (for fits).
    ///
    /// ```
    /// use gaugebook::{CalibrationRun, Direction, LoadKind};
    /// let mut run = CalibrationRun::new(LoadKind::Force, "mV/V");
    /// run.push_series(&[0.0, 100.0], &[0.0, 2.0], Direction::Ascending, 0.0)?;
    /// run.push_series(&[100.0, 0.0], &[2.01, 0.01], Direction::Descending, 0.0)?;
    /// let (x, y) = run.xy(Some(Direction::Ascending));
    /// assert_eq!((x.len(), y[1]), (2, 2.0));
    /// assert_eq!(run.xy(None).0.len(), 4);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn xy(&self, direction: Option<Direction>) -> (Vec<f64>, Vec<f64>) {
        self.series
            .iter()
            .filter(|s| direction.is_none_or(|d| d == s.direction))
            .flat_map(|s| s.points.iter().map(|p| (p.load, p.indication)))
            .unzip()
    }

    /// The distinct load levels of the ascending series, sorted; levels within `tol` are merged.
    ///
    /// ```
    /// use gaugebook::{CalibrationRun, Direction, LoadKind};
    /// let mut run = CalibrationRun::new(LoadKind::Force, "mV/V");
    /// run.push_series(&[0.0, 50.0, 100.0], &[0.0, 1.0, 2.0], Direction::Ascending, 0.0)?;
    /// run.push_series(&[0.0, 100.0], &[0.0, 2.0], Direction::Ascending, 120.0)?;
    /// assert_eq!(run.load_levels(1e-9), vec![0.0, 50.0, 100.0]);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub fn load_levels(&self, tol: f64) -> Vec<f64> {
        let mut all: Vec<f64> = self
            .series_in(Direction::Ascending)
            .iter()
            .flat_map(|s| s.loads())
            .collect();
        all.sort_by(f64::total_cmp);
        let mut out: Vec<f64> = vec![];
        for l in all {
            if out.last().is_none_or(|&last| (l - last).abs() > tol) {
                out.push(l);
            }
        }
        out
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn mismatched_lengths_are_named() {
        let mut run = CalibrationRun::new(LoadKind::Force, "mV/V");
        let e = run
            .push_series(&[0.0, 1.0], &[0.0], Direction::Ascending, 0.0)
            .unwrap_err();
        assert_eq!(
            e.to_string(),
            "load and indication series lengths do not match: 2 loads versus 1 indications"
        );
    }

    #[test]
    fn too_few_points() {
        let mut run = CalibrationRun::new(LoadKind::Force, "mV/V");
        let e = run
            .push_series(&[0.0], &[0.0], Direction::Ascending, 0.0)
            .unwrap_err();
        assert!(matches!(
            e,
            PhysicsError::NotEnoughData {
                needed: 2,
                found: 1,
                ..
            }
        ));
    }

    #[test]
    fn descending_must_decrease() {
        let mut run = CalibrationRun::new(LoadKind::Force, "mV/V");
        let e = run
            .push_series(&[0.0, 1.0], &[0.0, 1.0], Direction::Descending, 0.0)
            .unwrap_err();
        assert!(e.to_string().contains("strictly decreasing"), "{e}");
    }

    #[test]
    fn nan_rejected() {
        let mut run = CalibrationRun::new(LoadKind::Force, "mV/V");
        assert!(
            run.push_series(&[0.0, f64::NAN], &[0.0, 1.0], Direction::Ascending, 0.0)
                .is_err()
        );
    }
}
