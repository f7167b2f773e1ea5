//! Baseline comparison: what changed between today's trace and a reference
//! trace of the same cable in good condition.
//!
//! Events are matched as mutual nearest neighbours of the same polarity of ρ
//! (same sign; open and short ends also match each other's kind family by
//! sign) within a search window. Then, with δt_a, δt_b the two timing
//! half-widths and σ_a, σ_b the two ρ standard deviations:
//!
//! * **moved**: |t_a − t_b| > δt_a + δt_b (the intervals do not overlap);
//! * **ρ changed**: |ρ_a − ρ_b| > max(k·√(σ_a² + σ_b²), Δρ_min);
//! * **new**: a today event with no match; **gone**: a reference event with
//!   no match.
//!
//! End-of-trace markers are ignored. Common practice, no single source.
//! O(n·m) time, no memory beyond the result list (capacity `N`, overflow is
//! [`Error::Capacity`]). For changes too small to detect on either trace
//! alone, analyse the difference trace ([`super::trace::Difference`]).

use heapless::Vec;

use crate::error::{self, Error, Result};
use crate::scalar::Real;
use crate::tdr::detect::{Event, EventKind};

/// Tolerances for [`compare`].
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct CompareSettings<T> {
    /// Largest time shift searched for a match, s (> 0).
    pub match_window_s: T,
    /// ρ difference threshold in combined standard deviations (default 6).
    pub k_sigma: T,
    /// Smallest ρ difference reported whatever the noise (default 0.01).
    pub min_delta_rho: T,
}

impl<T: Real> CompareSettings<T> {
    /// Defaults with a given match window, s.
    pub fn with_window(match_window_s: T) -> Self {
        CompareSettings {
            match_window_s,
            k_sigma: T::lit(6.0),
            min_delta_rho: T::lit(0.01),
        }
    }
}

/// What changed.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum ChangeKind {
    /// Present today, not in the reference.
    New,
    /// In the reference, not today.
    Gone,
    /// Matched, but the time intervals do not overlap.
    Moved,
    /// Matched in place, but ρ differs beyond noise.
    RhoChanged,
}

/// One difference between today and the reference.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Change<T> {
    /// What changed.
    pub kind: ChangeKind,
    /// Index in today's events, if any.
    pub today: Option<usize>,
    /// Index in the reference events, if any.
    pub reference: Option<usize>,
    /// Today's round trip minus the reference's, s (0 if unmatched).
    pub shift_s: T,
    /// Today's ρ minus the reference's (0 if unmatched).
    pub delta_rho: T,
}

fn usable<T: Real>(e: &Event<T>) -> bool {
    !matches!(e.kind, EventKind::EndOfTrace)
}

/// Nearest usable event in `list` to `e` of the same ρ sign within the window.
fn nearest<T: Real>(e: &Event<T>, list: &[Event<T>], window_s: T) -> Option<usize> {
    let mut best: Option<(usize, T)> = None;
    for (i, c) in list.iter().enumerate() {
        if !usable(c) || (c.rho > T::zero()) != (e.rho > T::zero()) {
            continue;
        }
        let dt = (c.round_trip_s - e.round_trip_s).abs();
        if dt <= window_s && best.map_or(true, |(_, b)| dt < b) {
            best = Some((i, dt));
        }
    }
    best.map(|(i, _)| i)
}

/// Compares today's events with a reference's.
pub fn compare<T: Real, const N: usize>(
    today: &[Event<T>],
    reference: &[Event<T>],
    settings: &CompareSettings<T>,
) -> Result<Vec<Change<T>, N>> {
    let window = error::positive(settings.match_window_s, "match_window_s")?;
    let k = error::positive(settings.k_sigma, "k_sigma")?;
    let min_d = error::non_negative(settings.min_delta_rho, "min_delta_rho")?;
    let mut out = Vec::new();
    let full = || Error::Capacity {
        what: "changes",
        capacity: N,
    };
    for (ia, a) in today.iter().enumerate() {
        if !usable(a) {
            continue;
        }
        let m = nearest(a, reference, window)
            .filter(|&ib| reference.get(ib).and_then(|b| nearest(b, today, window)) == Some(ia));
        let Some(ib) = m else {
            out.push(Change {
                kind: ChangeKind::New,
                today: Some(ia),
                reference: None,
                shift_s: T::zero(),
                delta_rho: T::zero(),
            })
            .map_err(|_| full())?;
            continue;
        };
        let Some(b) = reference.get(ib) else { continue };
        let shift = a.round_trip_s - b.round_trip_s;
        let d_rho = a.rho - b.rho;
        let kind = if shift.abs() > a.t_half_width_s + b.t_half_width_s {
            Some(ChangeKind::Moved)
        } else if d_rho.abs()
            > (k * (a.rho_sigma * a.rho_sigma + b.rho_sigma * b.rho_sigma).sqrt()).max(min_d)
        {
            Some(ChangeKind::RhoChanged)
        } else {
            None
        };
        if let Some(kind) = kind {
            out.push(Change {
                kind,
                today: Some(ia),
                reference: Some(ib),
                shift_s: shift,
                delta_rho: d_rho,
            })
            .map_err(|_| full())?;
        }
    }
    for (ib, b) in reference.iter().enumerate() {
        if !usable(b) {
            continue;
        }
        let matched = nearest(b, today, window).is_some_and(|ia| {
            today.get(ia).and_then(|a| nearest(a, reference, window)) == Some(ib)
        });
        if !matched {
            out.push(Change {
                kind: ChangeKind::Gone,
                today: None,
                reference: Some(ib),
                shift_s: T::zero(),
                delta_rho: T::zero(),
            })
            .map_err(|_| full())?;
        }
    }
    Ok(out)
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::tdr::detect::Lumped;
    use crate::timing::Distance;
    use crate::value::{Extended, Impedance};

    fn ev(t: f64, rho: f64) -> Event<f64> {
        let d = Distance {
            distance_m: 0.0,
            lo_m: 0.0,
            hi_m: 0.0,
        };
        Event {
            kind: if rho > 0.0 {
                EventKind::ImpedanceUp
            } else {
                EventKind::ImpedanceDown
            },
            round_trip_s: t,
            t_half_width_s: 1e-9,
            distance: d,
            rho,
            rho_sigma: 0.001,
            gamma_after: 0.0,
            z_after: Impedance::ohms(50.0),
            gamma_settled: 0.0,
            lumped: Lumped::None,
            snr: Extended::Infinite,
            clipped: false,
        }
    }

    #[test]
    fn matches_by_sign_and_nearest() {
        let r = [ev(100e-9, 0.1), ev(200e-9, -0.1)];
        // Same events, tiny shifts: no change.
        let t = [ev(100.5e-9, 0.1), ev(200.5e-9, -0.1)];
        let c = compare::<f64, 4>(&t, &r, &CompareSettings::with_window(20e-9)).unwrap();
        assert!(c.is_empty());
        // Polarity flipped at 200 ns: one new, one gone.
        let t = [ev(100e-9, 0.1), ev(200e-9, 0.1)];
        let c = compare::<f64, 4>(&t, &r, &CompareSettings::with_window(20e-9)).unwrap();
        assert_eq!(c.len(), 2);
        assert_eq!((c[0].kind, c[0].today), (ChangeKind::New, Some(1)));
        assert_eq!((c[1].kind, c[1].reference), (ChangeKind::Gone, Some(1)));
        assert_eq!(
            compare::<f64, 4>(&t, &r, &CompareSettings::with_window(0.0)).err(),
            Some(Error::NotPositive("match_window_s"))
        );
    }
}
