// Section: Line design. A geometry (or datasheet figures, or an ideal line)
// with its dimensions and materials → Zc, εeff, velocity, delay, loss,
// cutoff and validity warnings, and one dimension solved for a target
// impedance (core: line::{coax, microstrip, stripline, cpw, two_wire,
// waveguide, datasheet, lossless}, line::properties, line::synth).
'use strict';
(() => {
  // Which fields each geometry uses (the rest are hidden).
  const MATERIAL = ['er', 'tand', 'diel', 'metal', 'sigma', 'freq', 'target'];
  const USES = {
    coax: ['d_in', 'd_out', 'shield', ...MATERIAL],
    microstrip: ['w', 'h', 't', ...MATERIAL],
    stripline: ['w', 'b', 't', ...MATERIAL],
    cpw: ['s', 'slot', 'sub', 'h', 't', ...MATERIAL],
    'two-wire': ['wire', 'spacing', ...MATERIAL],
    'twisted-pair': ['wire', 'ins', 'twists', ...MATERIAL],
    waveguide: ['wg_a', 'wg_b', 'er', 'tand', 'diel', 'metal', 'sigma', 'freq'],
    datasheet: ['z0', 'vf', 'f1', 'a1', 'f2', 'a2', 'freq'],
    ideal: ['z0', 'vf', 'freq'],
  };
  // The dimension the core solves, by geometry: the field it fills.
  const SOLVED = { d_inner: ['d_in', 'Inner diameter d'], width: ['w', 'Strip width W'], slot: ['slot', 'Slot width'],
    spacing: ['spacing', 'Centre spacing D'], insulation: ['ins', 'Insulation wall'] };
  // Core parameter names that two geometries share for different fields.
  const RENAME = { waveguide: { width_m: 'wg_width_m', height_m: 'wg_height_m' }, stripline: { spacing_m: 'ground_spacing_m' } };
  let st = { solved: null };

  function show() {
    const g = document.getElementById('design-geom').value;
    const uses = new Set(USES[g] || []);
    for (const el of document.querySelectorAll('#design form .field')) {
      const key = el.querySelector('[id^="design-"]').id.slice('design-'.length);
      if (key === 'geom') continue;
      let on = uses.has(key);
      if (key === 'h' && g === 'cpw') on = document.getElementById('design-sub').value !== 'thick';
      if (key === 'sigma') on = on && document.getElementById('design-metal').value === 'custom';
      el.hidden = !on;
    }
  }

  Echo.section({
    id: 'design',
    order: 25,
    wide: true,
    title: 'Line design',
    lead: 'A line from its cross-section and materials: what it should measure, whether the formulas hold there, and the dimension that gives a target impedance.',
    inputs: [
      { key: 'geom', label: 'Line', type: 'choice', value: 'coax',
        options: [['coax', 'coaxial cable'], ['microstrip', 'microstrip'], ['stripline', 'stripline'], ['cpw', 'coplanar waveguide'],
          ['two-wire', 'two-wire line'], ['twisted-pair', 'twisted pair'], ['waveguide', 'rectangular waveguide'],
          ['datasheet', 'cable from datasheet figures'], ['ideal', 'ideal line (Z0 and velocity)']] },
      { key: 'd_in', label: 'Inner conductor diameter d', unit: 'length', value: '1.52 mm', param: 'inner_diameter_m' },
      { key: 'd_out', label: 'Outer conductor inside diameter D', unit: 'length', value: '3.5 mm', param: 'outer_diameter_m' },
      { key: 'shield', label: 'Shield wall', unit: 'length', value: '0.2 mm', param: 'shield_thickness_m' },
      { key: 'wire', label: 'Wire diameter d', unit: 'length', value: '0.5 mm', param: 'wire_diameter_m' },
      { key: 'spacing', label: 'Centre spacing D', unit: 'length', value: '1 mm', param: 'spacing_m' },
      { key: 'ins', label: 'Insulation wall', unit: 'length', value: '0.2 mm', param: 'insulation_thickness_m' },
      { key: 'twists', label: 'Twists per metre', unit: 'number', value: '40', param: 'twists_per_m' },
      { key: 'w', label: 'Strip width W', unit: 'length', value: '1 mm', param: 'width_m' },
      { key: 'b', label: 'Ground-plane spacing b', unit: 'length', value: '1 mm', param: 'ground_spacing_m' },
      { key: 's', label: 'Centre strip S', unit: 'length', value: '1 mm', param: 'strip_width_m' },
      { key: 'slot', label: 'Slot width', unit: 'length', value: '0.5 mm', param: 'slot_width_m' },
      { key: 'sub', label: 'Substrate', type: 'choice', value: 'finite',
        options: [['thick', 'thick (much deeper than the slots)'], ['finite', 'height h, air below'], ['backed', 'height h on a ground plane']] },
      { key: 'h', label: 'Substrate height h', unit: 'length', value: '1 mm', param: 'height_m' },
      { key: 't', label: 'Metal thickness t', unit: 'length', value: '0 mm', param: 'thickness_m', hint: '0 for a thin strip (perfect conductor)' },
      { key: 'wg_a', label: 'Broad wall a', unit: 'length', value: '22.86 mm', param: 'wg_width_m' },
      { key: 'wg_b', label: 'Narrow wall b', unit: 'length', value: '10.16 mm', param: 'wg_height_m' },
      { key: 'z0', label: 'Impedance Z0', unit: 'resistance', value: '50 Ω', param: 'z0_ohm' },
      { key: 'vf', label: 'Velocity factor', unit: 'number', value: '0.85', param: 'velocity_factor' },
      { key: 'f1', label: 'Loss figure 1: frequency', unit: 'frequency', value: '100 MHz', param: 'freq_hz_1' },
      { key: 'a1', label: 'Loss figure 1: dB per 100 m', unit: 'number', value: '6.6', param: 'atten_db_per_m' },
      { key: 'f2', label: 'Loss figure 2: frequency (0: none)', unit: 'frequency', value: '1 GHz', param: 'freq_hz_2' },
      { key: 'a2', label: 'Loss figure 2: dB per 100 m', unit: 'number', value: '22' },
      { key: 'er', label: 'Relative permittivity εr', unit: 'number', value: '2.25', param: 'eps_r', hint: 'PE 2.25, PTFE 2.1, FR-4 ≈ 4.4, alumina 9.8' },
      { key: 'tand', label: 'Loss tangent tanδ', unit: 'number', value: '0.0002', param: 'tan_delta' },
      { key: 'diel', label: 'Dielectric model', type: 'choice', value: 'debye',
        options: [['debye', 'causal (wideband Debye, fitted at the frequency)'], ['constant', 'constant εr and tanδ']] },
      { key: 'metal', label: 'Conductors', type: 'choice', value: 'copper',
        options: [['copper', 'copper'], ['perfect', 'perfect (no conductor loss)'], ['custom', 'conductivity below']] },
      { key: 'sigma', label: 'Conductivity σ (S/m)', unit: 'number', value: '3.5e7', param: 'conductivity_s_per_m', hint: 'aluminium ≈ 3.5e7, brass ≈ 1.5e7' },
      { key: 'freq', label: 'Frequency', unit: 'frequency', value: '100 MHz', param: 'freq_hz' },
      { key: 'target', label: 'Target impedance', unit: 'resistance', value: '50 Ω', param: 'target_z0_ohm' },
    ],
    setup(card) {
      for (const k of ['geom', 'sub', 'metal']) document.getElementById(`design-${k}`).addEventListener('change', show);
      show();
      const use = Echo.h('button', { type: 'button', id: 'design-use', text: 'Use the solved dimension', disabled: true });
      use.addEventListener('click', () => {
        if (!st.solved) return;
        const input = document.getElementById(`design-${st.solved.field}`);
        input.value = `${Fmt.sig(st.solved.mm, 6)} mm`;
        input.dispatchEvent(new Event('input'));
      });
      card.querySelector('.results').append(Echo.h('div', { class: 'file-tools no-print' }, use));
    },
    compute(v, core, ctx) {
      const g = v.geom;
      const sigma = v.metal === 'copper' ? NaN : v.metal === 'perfect' ? 0 : v.sigma;
      const dIn = g === 'coax' ? v.d_in : v.wire;
      const height = g === 'stripline' ? v.b : v.h;
      // In the order of wasm-demo/src/design.rs NUMBERS.
      const nums = [dIn, v.d_out, v.shield, v.spacing, v.ins, v.twists, v.w, height, v.t, v.s, v.slot, v.wg_a, v.wg_b,
        v.z0, v.vf, v.f1, v.a1, v.f2, v.a2, v.er, v.tand, sigma, v.freq, v.target];
      let j;
      try {
        j = JSON.parse(core.line_design(g, v.sub, v.diel, new Float64Array(nums)));
      } catch (e) {
        let msg = Echo.message(e);
        for (const [from, to] of Object.entries(RENAME[g] || {})) if (msg.startsWith(`${from} `)) msg = to + msg.slice(from.length);
        throw new Error(msg);
      }
      // The fault-distance section can take its velocity from this line.
      Echo.shared.design = { geom: g, sub: v.sub, diel: v.diel, nums, what: document.querySelector(`#design-geom option[value="${g}"]`)?.textContent || g, freq: v.freq };
      document.dispatchEvent(new CustomEvent('echoline:design'));
      const imperial = ctx.system === 'imperial';
      const rows = [];
      const zc = j.zc_open ? { text: 'open (∞)', value: null } : { text: Fmt.ohms(j.zc_re_ohm, j.zc_im_ohm), value: j.zc_re_ohm };
      rows.push({ key: 'zc', label: 'Characteristic impedance Zc', text: zc.text, value: zc.value, main: true, data: { im: j.zc_im_ohm } });
      if (j.zc_closed_form_ohm !== null) rows.push({ key: 'zc_closed', label: 'Zc without conductor loss (closed form)', text: Fmt.ohms(j.zc_closed_form_ohm, 0), value: j.zc_closed_form_ohm });
      rows.push(
        { key: 'eps_eff', label: 'Effective permittivity εeff', text: Fmt.sig(j.eps_eff), value: j.eps_eff },
        { key: 'vf', label: 'Velocity factor', text: Fmt.sig(j.velocity_factor), value: j.velocity_factor },
        imperial
          ? { key: 'delay', label: 'Delay per foot (phase, group)', text: `${Fmt.si(j.delay_s_per_ft, 's')}/ft, ${Fmt.si(j.group_delay_s_per_ft, 's')}/ft`, value: j.delay_s_per_ft }
          : { key: 'delay', label: 'Delay per metre (phase, group)', text: `${Fmt.si(j.delay_s_per_m, 's')}/m, ${Fmt.si(j.group_delay_s_per_m, 's')}/m`, value: j.delay_s_per_m },
        imperial
          ? { key: 'loss', label: 'Loss at the frequency', text: `${Fmt.sig(j.atten_db_per_100ft)} dB/100 ft`, value: j.atten_db_per_100ft }
          : { key: 'loss', label: 'Loss at the frequency', text: `${Fmt.sig(j.atten_db_per_100m)} dB/100 m`, value: j.atten_db_per_100m },
        { key: 'split', label: 'of which conductor, dielectric', text: `${Fmt.sig(j.atten_conductor_db_per_m * 100, 3)}, ${Fmt.sig(j.atten_dielectric_db_per_m * 100, 3)} dB/100 m`,
          value: j.atten_conductor_db_per_m, note: true },
        { key: 'wavelength', label: 'Wavelength in the line', text: ctx.length(j.wavelength_m, j.wavelength_ft).text, value: imperial ? j.wavelength_ft : j.wavelength_m },
      );
      rows.push(j.cutoff_hz === null
        ? { key: 'cutoff', label: 'Cutoff', text: 'none in this model', note: true }
        : { key: 'cutoff', label: `Cutoff (${j.cutoff_what})`, text: Fmt.si(j.cutoff_hz, 'Hz'), value: j.cutoff_hz });
      if (j.warnings.length) {
        j.warnings.forEach((w, i) => rows.push({ key: `warning${i}`, label: i ? '' : 'Validity', text: w, note: true, data: { warning: '1' } }));
      } else {
        rows.push({ key: 'valid', label: 'Validity', text: 'within the formulas’ range at this frequency', note: true });
      }
      st.solved = null;
      if (j.solve) {
        const [field, what] = SOLVED[j.solve.what] || ['', j.solve.what];
        if (j.solve.error) {
          let msg = j.solve.error.replace(/^target_z0_ohm /, 'the target impedance ');
          rows.push({ key: 'solve', label: `${what} for ${Fmt.si(v.target, 'Ω')}`, text: `not possible: ${msg}`, note: true, data: { error: '1' } });
        } else {
          st.solved = { field, mm: j.solve.mm };
          rows.push({ key: 'solve', label: `${what} for ${Fmt.si(v.target, 'Ω')}`,
            text: imperial ? `${Fmt.sig(j.solve.mil, 5)} mil` : `${Fmt.sig(j.solve.mm, 5)} mm`,
            value: imperial ? j.solve.mil : j.solve.mm, data: { m: j.solve.m } });
        }
      }
      const use = document.getElementById('design-use');
      if (use) use.disabled = !st.solved;
      return { rows };
    },
  });
})();
