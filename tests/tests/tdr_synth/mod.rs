//! Test-only synthetic step traces: a lossless (or uniformly lossy) lattice
//! bounce diagram, finite rise-time edges, lumped C/L reflections, a loss
//! creep and seeded Gaussian noise. Nothing here is in the library.
#![allow(dead_code)]

/// A tiny deterministic PRNG (xorshift64*, Vigna, "An experimental
/// exploration of Marsaglia's xorshift generators, scrambled", ACM TOMS 2016).
pub struct Rng(u64);

impl Rng {
    pub fn new(seed: u64) -> Self {
        Rng(seed.wrapping_mul(0x9E37_79B9_7F4A_7C15) | 1)
    }
    pub fn next_u64(&mut self) -> u64 {
        let mut x = self.0;
        x ^= x >> 12;
        x ^= x << 25;
        x ^= x >> 27;
        self.0 = x;
        x.wrapping_mul(0x2545_F491_4F6C_DD1D)
    }
    /// Uniform in (0, 1).
    pub fn uniform(&mut self) -> f64 {
        ((self.next_u64() >> 11) as f64 + 0.5) / (1u64 << 53) as f64
    }
    /// Standard normal (Box–Muller).
    pub fn gauss(&mut self) -> f64 {
        let (u1, u2) = (self.uniform(), self.uniform());
        (-2.0 * u1.ln()).sqrt() * (2.0 * std::f64::consts::PI * u2).cos()
    }
}

/// How the last section ends.
#[derive(Clone, Copy, Debug)]
pub enum End {
    Open,
    Short,
    /// Terminated in a resistance, Ω (equal to the last section: matched).
    Ohms(f64),
}

/// Impulse reflection of a lattice of cells (equal delay, one time unit per
/// round trip), normalised to the incident wave: `h[k]` arrives after k round
/// trips. `cells` lists each cell's impedance; the source (Z_src, matched, so
/// returning waves are absorbed) sits before cell 0. `atten` is the one-way
/// amplitude factor per cell. Bounce diagram simulated in one-way ticks.
pub fn lattice_impulse(z_src: f64, cells: &[f64], end: End, atten: f64, n_rt: usize) -> Vec<f64> {
    let m = cells.len();
    let zl = |i: usize| if i == 0 { z_src } else { cells[i - 1] };
    // r[i]: interface i between zl(i) (left) and cell i (right), for waves from the left.
    let r: Vec<f64> = (0..m)
        .map(|i| (cells[i] - zl(i)) / (cells[i] + zl(i)))
        .collect();
    let gl = match end {
        End::Open => 1.0,
        End::Short => -1.0,
        End::Ohms(z) => (z - cells[m - 1]) / (z + cells[m - 1]),
    };
    // f[i]: forward wave arriving at the right end of cell i; g[i]: backward wave
    // arriving at the left end of cell i.
    let mut f = vec![0.0; m];
    let mut g = vec![0.0; m];
    let mut h = vec![0.0; n_rt];
    for tick in 0..2 * n_rt {
        let inc = if tick == 0 { 1.0 } else { 0.0 };
        let mut nf = vec![0.0; m];
        let mut ng = vec![0.0; m];
        for i in 0..m {
            let in_left = if i == 0 { inc } else { f[i - 1] };
            let in_right = g[i];
            nf[i] = atten * ((1.0 + r[i]) * in_left - r[i] * in_right);
            let out_left = r[i] * in_left + (1.0 - r[i]) * in_right;
            if i == 0 {
                if tick % 2 == 0 {
                    h[tick / 2] += out_left;
                }
            } else {
                ng[i - 1] = atten * out_left;
            }
        }
        ng[m - 1] = atten * gl * f[m - 1];
        f = nf;
        g = ng;
    }
    h
}

/// Builds cells from sections (impedance, cells).
pub fn cells(sections: &[(f64, usize)]) -> Vec<f64> {
    sections.iter().flat_map(|&(z, n)| vec![z; n]).collect()
}

/// Edge shape of the instrument.
#[derive(Clone, Copy, Debug)]
pub enum Edge {
    /// A jump at t ≥ 0.
    Ideal,
    /// Raised cosine with this 10–90 % rise time, s (full width = rise/0.5903).
    RaisedCosine(f64),
}

impl Edge {
    fn full_width(self) -> f64 {
        match self {
            Edge::Ideal => 0.0,
            // 10–90 % of 0.5(1 + sin(πt/T)) spans 2·asin(0.8)/π = 0.5903 T.
            Edge::RaisedCosine(r) => r / (2.0 * 0.8f64.asin() / std::f64::consts::PI),
        }
    }
    /// Step response at time t (0 → 1, 50 % at t = 0).
    pub fn step(self, t: f64, dt: f64) -> f64 {
        match self {
            Edge::Ideal => {
                if t > -1e-6 * dt {
                    1.0
                } else {
                    0.0
                }
            }
            Edge::RaisedCosine(_) => {
                let w = self.full_width();
                if t <= -w / 2.0 {
                    0.0
                } else if t >= w / 2.0 {
                    1.0
                } else {
                    0.5 * (1.0 + (std::f64::consts::PI * t / w).sin())
                }
            }
        }
    }
    /// Response to a reflection a·e^(−t/τ) (t ≥ 0) smoothed by the edge.
    pub fn exp(self, t: f64, tau: f64, dt: f64) -> f64 {
        match self {
            Edge::Ideal => {
                if t > -1e-6 * dt {
                    (-t.max(0.0) / tau).exp()
                } else {
                    0.0
                }
            }
            Edge::RaisedCosine(_) => {
                let w = self.full_width();
                let k = 400;
                let mut acc = 0.0;
                for j in 0..k {
                    let s = -w / 2.0 + (j as f64 + 0.5) * w / k as f64;
                    let dens =
                        std::f64::consts::PI / (2.0 * w) * (std::f64::consts::PI * s / w).cos();
                    let x = t - s;
                    if x >= 0.0 {
                        acc += dens * (-x / tau).exp() * w / k as f64;
                    }
                }
                acc
            }
        }
    }
}

/// A synthetic trace description.
#[derive(Clone, Debug)]
pub struct Synth {
    pub n: usize,
    pub dt_s: f64,
    /// Launch 50 % time, s.
    pub t0_s: f64,
    pub v_inc: f64,
    pub pre_v: f64,
    pub edge: Edge,
    /// Reflected steps: (round trip after t0, s; amplitude relative to V_inc).
    pub steps: Vec<(f64, f64)>,
    /// Lumped reflections: (round trip, s; amplitude ±1 scaled; τ, s): a·e^(−t/τ).
    pub lumped: Vec<(f64, f64, f64)>,
    /// Skin-effect steps (Wigington & Nahman, Proc. IRE 45(2):166–174, 1957):
    /// (round trip, s; amplitude; a, s^½) with response a·erfc(a/(2√(t − t_rt))).
    pub skin_steps: Vec<(f64, f64, f64)>,
    /// Linear creep after the launch, V_inc per s.
    pub creep_per_s: f64,
    /// Curving creep after the launch: (amplitude, V_inc; time constant, s)
    /// as A·(1 − e^(−t/T)).
    pub creep_exp: (f64, f64),
    pub noise_v: f64,
    pub seed: u64,
}

impl Synth {
    pub fn new(n: usize, dt_s: f64, t0_s: f64, edge: Edge) -> Self {
        Synth {
            n,
            dt_s,
            t0_s,
            v_inc: 1.0,
            pre_v: 0.0,
            edge,
            steps: vec![],
            lumped: vec![],
            skin_steps: vec![],
            creep_per_s: 0.0,
            creep_exp: (0.0, 1.0),
            noise_v: 0.0,
            seed: 1,
        }
    }
    /// Adds the arrivals of a lattice impulse response with unit round trip `unit_s`.
    pub fn with_lattice(mut self, h: &[f64], unit_s: f64) -> Self {
        for (k, &a) in h.iter().enumerate() {
            if a.abs() > 1e-15 {
                self.steps.push((k as f64 * unit_s, a));
            }
        }
        self
    }
    pub fn render(&self) -> Vec<f64> {
        let mut rng = Rng::new(self.seed);
        let dt = self.dt_s;
        (0..self.n)
            .map(|i| {
                let t = i as f64 * dt - self.t0_s;
                let mut v = self.edge.step(t, dt);
                for &(tr, a) in &self.steps {
                    v += a * self.edge.step(t - tr, dt);
                }
                for &(tr, a, tau) in &self.lumped {
                    v += a * self.edge.exp(t - tr, tau, dt);
                }
                for &(tr, amp, a) in &self.skin_steps {
                    let x = t - tr;
                    if x > 0.0 {
                        v += amp * erfc(a / (2.0 * x.sqrt()));
                    }
                }
                v += self.creep_per_s * t.max(0.0);
                if t > 0.0 {
                    v += self.creep_exp.0 * (1.0 - (-t / self.creep_exp.1).exp());
                }
                self.pre_v + self.v_inc * v + self.noise_v * rng.gauss()
            })
            .collect()
    }
}

/// Casts a trace to the scalar under test (test data preparation only).
pub fn to<T: echoline::Real>(x: &[f64]) -> Vec<T> {
    x.iter().map(|&v| T::lit(v)).collect()
}

/// erfc(x) for x ≥ 0, |error| ≤ 1.5e-7 (Abramowitz & Stegun, *Handbook of
/// Mathematical Functions*, 1964, eq. 7.1.26).
pub fn erfc(x: f64) -> f64 {
    let t = 1.0 / (1.0 + 0.327_591_1 * x);
    let poly = t
        * (0.254_829_592
            + t * (-0.284_496_736
                + t * (1.421_413_741 + t * (-1.453_152_027 + t * 1.061_405_429))));
    poly * (-x * x).exp()
}
