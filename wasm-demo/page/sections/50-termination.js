// Section: Termination. A load at the end of a line over a frequency range:
// input impedance, Γ, VSWR, return loss and a Smith chart (core:
// network::{cascade, load, reflection}). The chart grid is drawn here; every
// point on it is the core's Γ.
'use strict';
(() => {
  const freqAxis = (hi) => {
    const [f, p] = hi >= 1e9 ? [1e9, 'GHz'] : hi >= 1e6 ? [1e6, 'MHz'] : hi >= 1e3 ? [1e3, 'kHz'] : [1, 'Hz'];
    return { fmt: (v) => Files.plain(v / f), unit: p };
  };
  const VSWR_TOP = 20;

  function call(core, v, f0, f1, n) {
    return JSON.parse(core.termination(v.load, v.r, v.x, v.l, v.c, v.use_r, v.use_l, v.use_c, v.line,
      v.z0, v.vf, v.rl, v.ll, v.gl, v.cl, v.cd, v.cD, v.er, v.td, v.len, v.zref, f0, f1, n));
  }

  Echo.section({
    id: 'termination',
    order: 50,
    wide: true,
    title: 'Termination',
    lead: 'A load at the end of a line: what the instrument end sees over a band of frequencies, and where it sits on a Smith chart.',
    inputs: [
      { key: 'load', label: 'Load at the far end', type: 'choice', value: 'r',
        options: [['open', 'open'], ['short', 'short'], ['r', 'resistor R'], ['rx', 'fixed R + jX'], ['series', 'series R–L–C'], ['parallel', 'parallel R–L–C']] },
      { key: 'r', label: 'R', unit: 'resistance', value: '100 Ω', param: 'r_ohm' },
      { key: 'x', label: 'X (for R + jX)', unit: 'resistance', value: '-25 Ω', param: 'x_ohm' },
      { key: 'l', label: 'L (series/parallel)', unit: 'inductance', value: '1 uH', param: 'l_h' },
      { key: 'c', label: 'C (series/parallel)', unit: 'capacitance', value: '1 nF', param: 'c_f' },
      { key: 'use_r', label: 'R–L–C: include R', type: 'check', value: true },
      { key: 'use_l', label: 'R–L–C: include L', type: 'check', value: true },
      { key: 'use_c', label: 'R–L–C: include C', type: 'check', value: true },
      { key: 'line', label: 'Line model', type: 'choice', value: 'lossless',
        options: [['lossless', 'lossless: Z0 and velocity factor'], ['rlgc', 'R, L, G, C per metre (constant)'], ['coax', 'copper coax from its diameters']] },
      { key: 'z0', label: 'Z0 (lossless)', unit: 'resistance', value: '50 Ω', param: 'z0_ohm' },
      { key: 'vf', label: 'Velocity factor (lossless)', unit: 'number', value: '0.66', param: 'velocity_factor' },
      { key: 'rl', label: 'R per metre', unit: 'resistance', value: '0.05 Ω', param: 'r_ohm_per_m' },
      { key: 'll', label: 'L per metre', unit: 'inductance', value: '250 nH', param: 'l_h_per_m' },
      { key: 'gl', label: 'G per metre', unit: 'conductance', value: '0 S', param: 'g_s_per_m' },
      { key: 'cl', label: 'C per metre', unit: 'capacitance', value: '100 pF', param: 'c_f_per_m' },
      { key: 'cd', label: 'Inner conductor diameter d', unit: 'length', value: '0.91 mm', param: 'inner_diameter_m' },
      { key: 'cD', label: 'Dielectric outer diameter D', unit: 'length', value: '2.95 mm', param: 'outer_diameter_m' },
      { key: 'er', label: 'Dielectric εr', unit: 'number', value: '2.25', param: 'eps_r' },
      { key: 'td', label: 'Dielectric tanδ', unit: 'number', value: '0.0002', param: 'tan_delta' },
      { key: 'len', label: 'Line length', unit: 'length', value: '2 m', param: 'length_m' },
      { key: 'zref', label: 'Reference impedance (instrument)', unit: 'resistance', value: '50 Ω', param: 'z_ref_ohm' },
      { key: 'f0', label: 'From', unit: 'frequency', value: '1 MHz', param: 'f_start_hz' },
      { key: 'f1', label: 'To', unit: 'frequency', value: '200 MHz', param: 'f_stop_hz' },
      { key: 'n', label: 'Points', unit: 'number', value: '400', param: 'points' },
      { key: 'fr', label: 'Readout at', unit: 'frequency', value: '100 MHz', param: 'freq_hz', hint: 'The figures below are at this frequency' },
    ],
    setup(card) {
      // Show only the fields the chosen load and line use.
      const show = () => {
        const load = document.getElementById('termination-load').value;
        const line = document.getElementById('termination-line').value;
        const rlc = load === 'series' || load === 'parallel';
        const vis = { r: ['r', 'rx'].includes(load) || rlc, x: load === 'rx', l: rlc, c: rlc, use_r: rlc, use_l: rlc, use_c: rlc,
          z0: line === 'lossless', vf: line === 'lossless', rl: line === 'rlgc', ll: line === 'rlgc', gl: line === 'rlgc', cl: line === 'rlgc',
          cd: line === 'coax', cD: line === 'coax', er: line === 'coax', td: line === 'coax' };
        for (const [k, on] of Object.entries(vis)) document.getElementById(`termination-${k}`).closest('.field').hidden = !on;
      };
      card.querySelector('#termination-load').addEventListener('change', show);
      card.querySelector('#termination-line').addEventListener('change', show);
      show();
    },
    compute(v, core, ctx) {
      const n = Math.round(v.n);
      const sweep = call(core, v, v.f0, v.f1, n);
      const one = call(core, v, v.fr, v.fr, 1);
      const open = one.zin_open[0] === 1;
      const zText = open ? 'open (∞)' : Fmt.ohms(one.zin_re[0], one.zin_im[0]);
      const g = one.gamma_mag[0];
      const vInf = one.vswr_inf[0] === 1;
      const rInf = one.rl_inf[0] === 1;
      return {
        rows: [
          { key: 'zin', label: `Input impedance at ${Fmt.si(v.fr, 'Hz')}`, text: zText, value: open ? null : one.zin_re[0],
            data: { im: open ? 'open' : one.zin_im[0], open: open ? 1 : 0 }, main: true },
          { key: 'gamma', label: 'Reflection Γ (magnitude ∠ angle)', text: `${Fmt.sig(g)} ∠ ${Fmt.sig(one.gamma_deg[0], 4)}°`, value: g,
            data: { re: one.gamma_re[0], im: one.gamma_im[0] } },
          { key: 'vswr', label: 'VSWR', text: vInf ? '∞ (all reflected)' : Fmt.sig(one.vswr[0]), value: vInf ? null : one.vswr[0], data: { inf: vInf ? 1 : 0 } },
          { key: 'rl', label: 'Return loss', text: rInf ? '∞ dB (matched)' : `${Fmt.sig(one.rl_db[0])} dB`, value: rInf ? null : one.rl_db[0], data: { inf: rInf ? 1 : 0 } },
        ],
        plot: sweep,
      };
    },
    draw(host, out) {
      host.textContent = '';
      const s = out.plot;
      const h = Echo.h;
      const fa = freqAxis(s.freq_hz[s.freq_hz.length - 1]);
      const x = { lo: s.freq_hz[0], hi: s.freq_hz[s.freq_hz.length - 1], title: `frequency (${fa.unit})`, fmt: fa.fmt };
      if (x.hi === x.lo) x.hi = x.lo + 1;
      const grid = h('div', { class: 'term-grid' });
      const smithBox = h('figure', { class: 'fig smith', id: 'termination-smith' });
      const plots = h('div', { class: 'term-plots' });
      grid.append(plots, smithBox);
      host.append(grid);
      const width = Math.max(260, Math.floor(((host.clientWidth || 900) - 330) / 2) - 8);
      const fig = (id, caption) => {
        const f = h('figure', { class: 'fig', id }, h('figcaption', { text: caption }));
        plots.append(f);
        return f;
      };
      const zre = s.zin_re.map((z, i) => (s.zin_open[i] ? NaN : z));
      const zim = s.zin_im.map((z, i) => (s.zin_open[i] ? NaN : z));
      const zr = Plot.extent([zre, zim]);
      const zSpan = Math.max(Math.abs(zr.lo), Math.abs(zr.hi));
      const zy = { lo: Math.max(zr.lo, -Math.min(zSpan, 2000)), hi: Math.min(zr.hi, 2000) };
      Plot.chart(fig('termination-zin', 'Input impedance: R (solid), X (second colour); gaps where open'), {
        width, height: 170, label: 'Input impedance against frequency', x, y: { ...zy, title: 'ohms', fmt: Files.plain },
        series: [{ xs: s.freq_hz, ys: zre, cls: 'today' }, { xs: s.freq_hz, ys: zim, cls: 'alt' }],
      });
      Plot.chart(fig('termination-gamma', 'Reflection magnitude |Γ|'), {
        width, height: 170, label: '|Γ| against frequency', x, y: { lo: 0, hi: 1.05, title: '|Γ|', fmt: Files.plain },
        series: [{ xs: s.freq_hz, ys: s.gamma_mag, cls: 'today' }], hlines: [{ y: 1, text: 'total reflection' }],
      });
      const allInf = s.vswr_inf.every((q) => q === 1);
      Plot.chart(fig('termination-vswr', allInf ? 'VSWR: ∞ at every frequency (|Γ| = 1)' : `VSWR (drawn up to ${VSWR_TOP}; ∞ at the top edge)`), {
        width, height: 170, label: 'VSWR against frequency', x, y: { lo: 1, hi: VSWR_TOP, title: 'VSWR', fmt: Files.plain },
        series: [{ xs: s.freq_hz, ys: s.vswr.map((q, i) => (s.vswr_inf[i] ? VSWR_TOP : Math.min(q, VSWR_TOP))), cls: 'today' }],
      });
      const rl = s.rl_db.map((q, i) => (s.rl_inf[i] ? NaN : q));
      const rlr = Plot.extent([rl, [0]]);
      Plot.chart(fig('termination-rl', s.rl_inf.some((q) => q === 1) ? 'Return loss (∞ dB where matched: gaps)' : 'Return loss'), {
        width, height: 170, label: 'Return loss against frequency', x, y: { lo: 0, hi: Math.max(1, rlr.hi), title: 'dB', fmt: Files.plain },
        series: [{ xs: s.freq_hz, ys: rl, cls: 'today' }],
      });
      smith(smithBox, s, out.rows[1].data);
    },
  });

  /** The Smith chart: grid of constant r and x drawn here, points from the core. */
  function smith(fig, s, marker) {
    const S = 300, R = 135, c = S / 2;
    const P = (gr, gi) => [c + R * gr, c - R * gi];
    const root = Plot.svg('svg', { viewBox: `0 0 ${S} ${S}`, width: S, height: S, role: 'img', class: 'chart smith-chart',
      'aria-label': `Smith chart: input reflection over ${s.freq_hz.length} frequencies` });
    root.append(Plot.svg('title', {}, 'Smith chart of the input reflection'));
    const clipId = 'smith-clip';
    const defs = Plot.svg('defs');
    const cp = Plot.svg('clipPath', { id: clipId });
    cp.append(Plot.svg('circle', { cx: c, cy: c, r: R }));
    defs.append(cp);
    root.append(defs);
    const g = Plot.svg('g', { 'clip-path': `url(#${clipId})` });
    // Constant-resistance circles: centre (r/(1+r), 0), radius 1/(1+r);
    // constant-reactance arcs: centre (1, 1/x), radius 1/|x| (chart geometry).
    for (const r of [0.2, 0.5, 1, 2, 5]) {
      const [cx, cy] = P(r / (1 + r), 0);
      g.append(Plot.svg('circle', { class: 'grid', cx, cy, r: R / (1 + r), fill: 'none' }));
    }
    for (const xv of [0.2, 0.5, 1, 2, 5, -0.2, -0.5, -1, -2, -5]) {
      const [cx, cy] = P(1, 1 / xv);
      g.append(Plot.svg('circle', { class: 'grid', cx, cy, r: R / Math.abs(xv), fill: 'none' }));
    }
    g.append(Plot.svg('line', { class: 'grid', x1: c - R, y1: c, x2: c + R, y2: c }));
    root.append(g);
    root.append(Plot.svg('circle', { class: 'frame', cx: c, cy: c, r: R, fill: 'none' }));
    for (const r of [0.2, 0.5, 1, 2, 5]) {
      const [tx] = P((r - 1) / (r + 1), 0);
      root.append(Plot.svg('text', { x: tx + 2, y: c - 3 }, String(r)));
    }
    root.append(Plot.svg('text', { x: c, y: c - R - 4, 'text-anchor': 'middle' }, '+jx'));
    root.append(Plot.svg('text', { x: c, y: c + R + 12, 'text-anchor': 'middle' }, '−jx'));
    root.append(Plot.svg('text', { x: c - R - 2, y: c + 14 }, 'short'));
    root.append(Plot.svg('text', { x: c + R + 2, y: c + 14, 'text-anchor': 'end' }, 'open'));
    let d = '';
    for (let i = 0; i < s.gamma_re.length; i++) {
      const [px, py] = P(s.gamma_re[i], s.gamma_im[i]);
      d += `${i ? 'L' : 'M'}${px.toFixed(1)},${py.toFixed(1)}`;
    }
    root.append(Plot.svg('path', { d, class: 'series today', fill: 'none' }));
    const [sx, sy] = P(s.gamma_re[0], s.gamma_im[0]);
    root.append(Plot.svg('circle', { cx: sx, cy: sy, r: 3.5, class: 'dot start' }));
    if (marker) {
      const [mx, my] = P(marker.re, marker.im);
      root.append(Plot.svg('circle', { cx: mx, cy: my, r: 5, class: 'dot readout', id: 'smith-readout', 'data-re': marker.re, 'data-im': marker.im }));
    }
    fig.append(Echo.h('figcaption', { text: 'Smith chart (Γ plane, normalised to the reference): ○ first frequency, ● readout frequency' }), root);
  }
})();
