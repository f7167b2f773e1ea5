// Section: Line check. The ideal lossless line from its impedance and a
// velocity factor or permittivity → Zc, εeff, velocity, delay, wavelength
// (core: line::lossless, line::properties).
'use strict';
Echo.section({
  id: 'line',
  order: 20,
  title: 'Line check',
  lead: 'Figures of an ideal lossless line at one frequency: what a cable of this impedance and dielectric should show.',
  inputs: [
    { key: 'z0', label: 'Characteristic impedance', unit: 'resistance', value: '50 Ω', param: 'z0_ohm',
      hint: 'e.g. 50 Ω, 75 ohm, 100 ohm' },
    { key: 'by', label: 'Dielectric given by', type: 'choice', value: 'vf',
      options: [['vf', 'velocity factor'], ['eps', 'relative permittivity εr']] },
    { key: 'value', label: 'Velocity factor or εr', unit: 'number', value: '0.66', param: ['velocity_factor', 'eps_r'],
      hint: 'Velocity factor 0.66 (solid PE), 0.82 (foam); or εr 2.25 (PE)' },
    { key: 'freq', label: 'Frequency', unit: 'frequency', value: '100 MHz', param: 'freq_hz',
      hint: 'e.g. 100 MHz, 2.4 GHz' },
  ],
  compute(v, core, ctx) {
    const r = core.line_check(v.z0, v.value, v.by === 'eps', v.freq);
    try {
      const imperial = ctx.system === 'imperial';
      const wl = ctx.length(r.wavelength_m, r.wavelength_ft);
      const q = ctx.length(r.wavelength_m / 4, r.wavelength_ft / 4);
      return {
        rows: [
          { key: 'zc', label: 'Characteristic impedance Zc', text: Fmt.ohms(r.zc_re_ohm, r.zc_im_ohm), value: r.zc_re_ohm, main: true },
          { key: 'eps_eff', label: 'Effective permittivity εeff', text: Fmt.sig(r.eps_eff), value: r.eps_eff },
          { key: 'vf', label: 'Velocity factor', text: Fmt.sig(r.velocity_factor), value: r.velocity_factor },
          imperial
            ? { key: 'velocity', label: 'Velocity', text: `${Fmt.sig(r.velocity_ft_per_s / 1e6)} ft/µs`, value: r.velocity_ft_per_s }
            : { key: 'velocity', label: 'Velocity', text: `${Fmt.sig(r.velocity_m_per_s / 1e6)} m/µs`, value: r.velocity_m_per_s },
          imperial
            ? { key: 'delay', label: 'Delay per foot', text: `${Fmt.si(r.delay_s_per_ft, 's')}/ft`, value: r.delay_s_per_ft }
            : { key: 'delay', label: 'Delay per metre', text: `${Fmt.si(r.delay_s_per_m, 's')}/m`, value: r.delay_s_per_m },
          { key: 'wavelength', label: 'Wavelength in the line', text: wl.text, value: wl.value },
          { key: 'quarter', label: 'Quarter wavelength', text: q.text, value: q.value },
          { key: 'atten', label: 'Attenuation', text: `${Fmt.sig(r.atten_db_per_m)} dB/m (ideal line)`, value: r.atten_db_per_m, note: true },
        ],
      };
    } finally {
      r.free();
    }
  },
});
