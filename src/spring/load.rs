//! The six load components an element carries, as one value (a wrench: force and moment at
//! the element's load point).

use std::fmt;

use uom::si::force::newton;
use uom::si::length::meter;
use uom::si::torque::newton_meter;

use crate::units::{Force, Length, Torque};

/// One of the six load components in an element's frame: forces along and moments about X
/// (the element's axis), Y and Z.
///
/// ```
/// use gaugebook::LoadComponent;
/// assert_eq!(LoadComponent::ALL.len(), 6);
/// assert_eq!(LoadComponent::Mx.unit_symbol(), "N·m");
/// assert_eq!(LoadComponent::Fz.to_string(), "Fz");
/// ```
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash)]
pub enum LoadComponent {
    /// Force along X (the element's axis).
    Fx,
    /// Force along Y.
    Fy,
    /// Force along Z.
    Fz,
    /// Moment about X (torque for a shaft).
    Mx,
    /// Moment about Y.
    My,
    /// Moment about Z.
    Mz,
}

impl LoadComponent {
    /// The six components in the order Fx Fy Fz Mx My Mz (the order of response-matrix columns).
    ///
    /// ```
    /// assert_eq!(gaugebook::LoadComponent::ALL[3], gaugebook::LoadComponent::Mx);
    /// # Ok::<(), gaugebook::PhysicsError>(())
    /// ```
    pub const ALL: [LoadComponent; 6] = [
        LoadComponent::Fx,
        LoadComponent::Fy,
        LoadComponent::Fz,
        LoadComponent::Mx,
        LoadComponent::My,
        LoadComponent::Mz,
    ];

    /// Whether the component is a moment (N·m) rather than a force (N).
    ///
    /// ```
    /// assert!(gaugebook::LoadComponent::My.is_moment());
    /// ```
    pub fn is_moment(self) -> bool {
        matches!(
            self,
            LoadComponent::Mx | LoadComponent::My | LoadComponent::Mz
        )
    }

    /// The SI unit the component's values are in: "N" or "N·m".
    ///
    /// ```
    /// assert_eq!(gaugebook::LoadComponent::Fy.unit_symbol(), "N");
    /// ```
    pub fn unit_symbol(self) -> &'static str {
        if self.is_moment() { "N·m" } else { "N" }
    }

    /// The position of the component in [`LoadComponent::ALL`].
    ///
    /// ```
    /// assert_eq!(gaugebook::LoadComponent::Mz.index(), 5);
    /// ```
    pub fn index(self) -> usize {
        self as usize
    }
}

impl fmt::Display for LoadComponent {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(match self {
            LoadComponent::Fx => "Fx",
            LoadComponent::Fy => "Fy",
            LoadComponent::Fz => "Fz",
            LoadComponent::Mx => "Mx",
            LoadComponent::My => "My",
            LoadComponent::Mz => "Mz",
        })
    }
}

/// The load on an element: force and moment at its load point, in the element's frame.
///
/// Each element's documentation states where its load point is (usually the centre of the free
/// end) and which way X, Y, Z point.
///
/// ```
/// use gaugebook::{LoadComponent, Wrench};
/// use gaugebook::units::{Force, Length};
/// use uom::si::{force::newton, length::millimeter};
/// // 100 N along Z applied 20 mm beyond the load point along X adds My = −2 N·m.
/// let w = Wrench::force_at(
///     [Force::new::<newton>(0.0), Force::new::<newton>(0.0), Force::new::<newton>(100.0)],
///     [Length::new::<millimeter>(20.0), Length::new::<millimeter>(0.0), Length::new::<millimeter>(0.0)],
/// );
/// assert!((w.get(LoadComponent::My) + 2.0).abs() < 1e-12);
/// ```
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Wrench {
    /// Force along X.
    pub fx: Force,
    /// Force along Y.
    pub fy: Force,
    /// Force along Z.
    pub fz: Force,
    /// Moment about X.
    pub mx: Torque,
    /// Moment about Y.
    pub my: Torque,
    /// Moment about Z.
    pub mz: Torque,
}

impl Default for Wrench {
    fn default() -> Wrench {
        Wrench::zero()
    }
}

impl Wrench {
    /// No load.
    ///
    /// ```
    /// assert_eq!(gaugebook::Wrench::zero().get(gaugebook::LoadComponent::Fx), 0.0);
    /// ```
    pub fn zero() -> Wrench {
        Wrench {
            fx: Force::new::<newton>(0.0),
            fy: Force::new::<newton>(0.0),
            fz: Force::new::<newton>(0.0),
            mx: Torque::new::<newton_meter>(0.0),
            my: Torque::new::<newton_meter>(0.0),
            mz: Torque::new::<newton_meter>(0.0),
        }
    }

    /// One component at `value` in SI (N or N·m), the others zero.
    ///
    /// ```
    /// use gaugebook::{LoadComponent, Wrench};
    /// let w = Wrench::only(LoadComponent::Mx, 5.0);
    /// assert_eq!(w.get(LoadComponent::Mx), 5.0);
    /// assert_eq!(w.get(LoadComponent::Fx), 0.0);
    /// ```
    pub fn only(component: LoadComponent, value: f64) -> Wrench {
        Wrench::zero().with(component, value)
    }

    /// A force applied at `point` (relative to the load point), expressed at the load point:
    /// the same force plus the moment `point × force`.
    ///
    /// ```
    /// use gaugebook::{LoadComponent, Wrench};
    /// use gaugebook::units::{Force, Length};
    /// use uom::si::{force::newton, length::meter};
    /// let f = [Force::new::<newton>(0.0), Force::new::<newton>(10.0), Force::new::<newton>(0.0)];
    /// let p = [Length::new::<meter>(0.0), Length::new::<meter>(0.0), Length::new::<meter>(0.1)];
    /// // (0, 0, 0.1) × (0, 10, 0) = (−1, 0, 0)
    /// assert!((Wrench::force_at(f, p).get(LoadComponent::Mx) + 1.0).abs() < 1e-12);
    /// ```
    pub fn force_at(force: [Force; 3], point: [Length; 3]) -> Wrench {
        let [fx, fy, fz] = force.map(|f| f.get::<newton>());
        let [x, y, z] = point.map(|p| p.get::<meter>());
        Wrench::zero()
            .with(LoadComponent::Fx, fx)
            .with(LoadComponent::Fy, fy)
            .with(LoadComponent::Fz, fz)
            .with(LoadComponent::Mx, y * fz - z * fy)
            .with(LoadComponent::My, z * fx - x * fz)
            .with(LoadComponent::Mz, x * fy - y * fx)
    }

    /// A component's value in SI (N or N·m).
    ///
    /// ```
    /// use gaugebook::{LoadComponent, Wrench};
    /// assert_eq!(Wrench::only(LoadComponent::Fz, -3.0).get(LoadComponent::Fz), -3.0);
    /// ```
    pub fn get(&self, component: LoadComponent) -> f64 {
        match component {
            LoadComponent::Fx => self.fx.get::<newton>(),
            LoadComponent::Fy => self.fy.get::<newton>(),
            LoadComponent::Fz => self.fz.get::<newton>(),
            LoadComponent::Mx => self.mx.get::<newton_meter>(),
            LoadComponent::My => self.my.get::<newton_meter>(),
            LoadComponent::Mz => self.mz.get::<newton_meter>(),
        }
    }

    /// The same wrench with one component set to `value` in SI (N or N·m).
    ///
    /// ```
    /// use gaugebook::{LoadComponent, Wrench};
    /// let w = Wrench::zero().with(LoadComponent::Fy, 2.0);
    /// assert_eq!(w.get(LoadComponent::Fy), 2.0);
    /// ```
    pub fn with(mut self, component: LoadComponent, value: f64) -> Wrench {
        match component {
            LoadComponent::Fx => self.fx = Force::new::<newton>(value),
            LoadComponent::Fy => self.fy = Force::new::<newton>(value),
            LoadComponent::Fz => self.fz = Force::new::<newton>(value),
            LoadComponent::Mx => self.mx = Torque::new::<newton_meter>(value),
            LoadComponent::My => self.my = Torque::new::<newton_meter>(value),
            LoadComponent::Mz => self.mz = Torque::new::<newton_meter>(value),
        }
        self
    }

    /// Every component multiplied by `factor`.
    ///
    /// ```
    /// use gaugebook::{LoadComponent, Wrench};
    /// assert_eq!(Wrench::only(LoadComponent::Fz, 2.0).scaled(1.5).get(LoadComponent::Fz), 3.0);
    /// ```
    pub fn scaled(&self, factor: f64) -> Wrench {
        let mut w = *self;
        for c in LoadComponent::ALL {
            w = w.with(c, self.get(c) * factor);
        }
        w
    }

    /// The components in SI, in the order of [`LoadComponent::ALL`].
    ///
    /// ```
    /// use gaugebook::{LoadComponent, Wrench};
    /// assert_eq!(Wrench::only(LoadComponent::My, 1.0).to_array()[4], 1.0);
    /// ```
    pub fn to_array(&self) -> [f64; 6] {
        LoadComponent::ALL.map(|c| self.get(c))
    }
}

impl fmt::Display for Wrench {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        let parts: Vec<String> = LoadComponent::ALL
            .iter()
            .map(|&c| format!("{c} {} {}", self.get(c), c.unit_symbol()))
            .collect();
        f.write_str(&parts.join(", "))
    }
}
