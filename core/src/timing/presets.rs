//! Velocity presets by dielectric, as ranges.
//!
//! For a TEM cable v = c0/√εeff, so the velocity factor follows from the
//! insulation. The ranges below are **common practice, no single source**:
//! typical figures of the trade for each kind of insulation, wide enough to hold
//! the spread between makers and constructions. A preset is a starting point
//! until the cable is calibrated (see [`super::calibrate`]); the velocity error
//! maps one-to-one onto the distance error.
//!
//! | name | insulation | velocity factor (nominal, range) |
//! | --- | --- | --- |
//! | `solid-pe` | solid polyethylene (εr 2.25–2.3) | 0.66, 0.65–0.67 |
//! | `foam-pe` | foamed polyethylene | 0.83, 0.78–0.88 |
//! | `ptfe` | solid PTFE | 0.70, 0.69–0.71 |
//! | `foam-ptfe` | foamed PTFE | 0.80, 0.75–0.85 |
//! | `air` | air-spaced (helical or disc spacers) | 0.91, 0.85–0.97 |
//! | `twisted-pair` | PE telephone pair / data cable | 0.67, 0.64–0.70 |
//! | `xlpe` | XLPE medium-voltage power cable | 160 m/µs, 150–170 m/µs (VF 0.50–0.57) |
//! | `paper` | paper-insulated power cable | 155 m/µs, 150–160 m/µs (VF 0.50–0.53) |
//!
//! Power-cable practice often quotes half the velocity (≈ 80 m/µs for XLPE),
//! so that the one-way distance is v/2 × the round-trip time; the velocities
//! here are always the full propagation velocity.

use crate::error::{Error, Result};
use crate::scalar::Real;
use crate::timing::{VelocityKind, VelocityRange};

/// A kind of cable insulation with a typical velocity range.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash)]
pub enum Preset {
    /// Solid polyethylene (εr 2.25–2.3): VF 0.66 (0.65–0.67).
    SolidPe,
    /// Foamed polyethylene: VF 0.78–0.88.
    FoamPe,
    /// Solid PTFE: VF 0.69–0.71.
    Ptfe,
    /// Foamed PTFE: VF 0.75–0.85.
    FoamPtfe,
    /// Air-spaced: VF 0.85–0.97.
    Air,
    /// Polyethylene-insulated telephone pair or data cable: VF 0.64–0.70.
    TwistedPair,
    /// XLPE medium-voltage power cable: 150–170 m/µs.
    Xlpe,
    /// Paper-insulated power cable: 150–160 m/µs.
    Paper,
}

impl Preset {
    /// Every preset, in table order.
    pub const ALL: [Preset; 8] = [
        Preset::SolidPe,
        Preset::FoamPe,
        Preset::Ptfe,
        Preset::FoamPtfe,
        Preset::Air,
        Preset::TwistedPair,
        Preset::Xlpe,
        Preset::Paper,
    ];

    /// The stable machine name (`"solid-pe"`, `"foam-pe"`, `"ptfe"`,
    /// `"foam-ptfe"`, `"air"`, `"twisted-pair"`, `"xlpe"`, `"paper"`).
    pub const fn name(self) -> &'static str {
        match self {
            Preset::SolidPe => "solid-pe",
            Preset::FoamPe => "foam-pe",
            Preset::Ptfe => "ptfe",
            Preset::FoamPtfe => "foam-ptfe",
            Preset::Air => "air",
            Preset::TwistedPair => "twisted-pair",
            Preset::Xlpe => "xlpe",
            Preset::Paper => "paper",
        }
    }

    /// A short description in words, for a page or a report.
    pub const fn description(self) -> &'static str {
        match self {
            Preset::SolidPe => "solid polyethylene",
            Preset::FoamPe => "foamed polyethylene",
            Preset::Ptfe => "solid PTFE",
            Preset::FoamPtfe => "foamed PTFE",
            Preset::Air => "air-spaced",
            Preset::TwistedPair => "polyethylene telephone pair / data cable",
            Preset::Xlpe => "XLPE medium-voltage power cable",
            Preset::Paper => "paper-insulated power cable",
        }
    }

    /// The preset of a machine name (exact, lower case). Unknown names give
    /// [`Error::Undefined`]`("preset")`.
    pub fn from_name(name: &str) -> Result<Preset> {
        Preset::ALL
            .into_iter()
            .find(|p| p.name() == name)
            .ok_or(Error::Undefined("preset"))
    }

    /// The velocity range, m/s (kind [`VelocityKind::Factor`]).
    pub fn velocity<T: Real>(self) -> VelocityRange<T> {
        let c0 = T::c0();
        let (n, lo, hi) = match self {
            Preset::SolidPe => (T::lit(0.66) * c0, T::lit(0.65) * c0, T::lit(0.67) * c0),
            Preset::FoamPe => (T::lit(0.83) * c0, T::lit(0.78) * c0, T::lit(0.88) * c0),
            Preset::Ptfe => (T::lit(0.70) * c0, T::lit(0.69) * c0, T::lit(0.71) * c0),
            Preset::FoamPtfe => (T::lit(0.80) * c0, T::lit(0.75) * c0, T::lit(0.85) * c0),
            Preset::Air => (T::lit(0.91) * c0, T::lit(0.85) * c0, T::lit(0.97) * c0),
            Preset::TwistedPair => (T::lit(0.67) * c0, T::lit(0.64) * c0, T::lit(0.70) * c0),
            Preset::Xlpe => (T::lit(160e6), T::lit(150e6), T::lit(170e6)),
            Preset::Paper => (T::lit(155e6), T::lit(150e6), T::lit(160e6)),
        };
        VelocityRange {
            nominal_m_per_s: n,
            lo_m_per_s: lo,
            hi_m_per_s: hi,
            kind: VelocityKind::Factor,
        }
    }
}

impl core::str::FromStr for Preset {
    type Err = Error;
    fn from_str(s: &str) -> Result<Preset> {
        Preset::from_name(s)
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn names_round_trip_and_ranges_are_ordered() {
        for p in Preset::ALL {
            assert_eq!(Preset::from_name(p.name()), Ok(p));
            let v = p.velocity::<f64>();
            assert!(v.lo_m_per_s < v.nominal_m_per_s && v.nominal_m_per_s < v.hi_m_per_s);
            assert!(v.hi_m_per_s < 299_792_458.0);
            let v32 = p.velocity::<f32>();
            assert!(v32.lo_m_per_s < v32.nominal_m_per_s && v32.nominal_m_per_s < v32.hi_m_per_s);
        }
        assert_eq!(
            Preset::from_name("Solid-PE"),
            Err(Error::Undefined("preset"))
        );
        assert_eq!("xlpe".parse::<Preset>(), Ok(Preset::Xlpe));
    }
}
