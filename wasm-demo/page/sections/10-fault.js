// Section: Fault distance. Round-trip time of a reflection and a cable given by
// its velocity factor ± tolerance → distance with its interval (core: timing).
'use strict';
Echo.section({
  id: 'fault',
  order: 10,
  title: 'Fault distance',
  lead: 'Distance to a reflection from its round-trip time and the cable’s velocity factor, with the interval the tolerances allow.',
  inputs: [
    { key: 'round_trip', label: 'Round-trip time', unit: 'time', value: '612 ns', param: 't_round_s',
      hint: 'From the launched edge to the reflection, e.g. 612 ns or 1.2 us' },
    { key: 'vf', label: 'Velocity factor', unit: 'number', value: '0.66', param: 'velocity_factor',
      hint: 'Fraction of the speed of light, e.g. 0.66 (solid PE) or 82 %' },
    { key: 'tol', label: 'Velocity factor tolerance (±)', unit: 'number', value: '0.02', param: 'tolerance',
      hint: 'Spread of the cable’s velocity factor, e.g. 0.02' },
    { key: 'dt', label: 'Sample interval', unit: 'time', value: '1 ns', param: 'sample_interval_s',
      hint: 'Time between samples of the trace' },
    { key: 'interp', label: 'Edge crossing interpolated between samples', type: 'check', value: true },
    { key: 'rise', label: 'Edge rise time (10–90 %)', unit: 'time', value: '2 ns', param: 'rise_time_s',
      hint: 'Of the reflected edge as seen on the trace' },
  ],
  compute(v, core, ctx) {
    const r = core.fault_distance(v.round_trip, v.vf, v.tol, v.dt, v.interp, v.rise);
    try {
      const imperial = ctx.system === 'imperial';
      const d = ctx.length(r.distance_m, r.distance_ft);
      const lo = ctx.length(r.lo_m, r.lo_ft);
      const hi = ctx.length(r.hi_m, r.hi_ft);
      const other = imperial ? `${Fmt.sig(r.distance_m)} m` : `${Fmt.sig(r.distance_ft)} ft`;
      const v1 = imperial
        ? (x) => `${Fmt.sig(x / 1e6)} ft/µs`
        : (x) => `${Fmt.sig(x / 1e6)} m/µs`;
      const vn = imperial ? r.v_nominal_ft_per_s : r.v_nominal_m_per_s;
      const vl = imperial ? r.v_lo_ft_per_s : r.v_lo_m_per_s;
      const vh = imperial ? r.v_hi_ft_per_s : r.v_hi_m_per_s;
      return {
        rows: [
          { key: 'distance', label: 'Distance to the reflection', text: d.text, value: d.value, main: true },
          { key: 'interval', label: 'Interval', text: `${lo.text.split(' ')[0]} to ${hi.text}`, data: { lo: lo.value, hi: hi.value } },
          { key: 'other', label: imperial ? 'In metres' : 'In feet', text: other, value: imperial ? r.distance_m : r.distance_ft },
          { key: 'dt_half', label: 'Timing uncertainty (±)', text: Fmt.si(r.t_half_width_s, 's'), value: r.t_half_width_s },
          { key: 'velocity', label: 'Velocity used', text: `${v1(vn)}`, value: vn, data: { lo: vl, hi: vh } },
          { key: 'velocity_range', label: 'Velocity range', text: `${Fmt.sig(vl / 1e6)} to ${v1(vh)}` },
        ],
        plot: { best: d.value, lo: lo.value, hi: hi.value, unit: imperial ? 'ft' : 'm' },
      };
    } finally {
      r.free();
    }
  },
  draw(host, out) {
    const p = out.plot;
    Plot.interval(host, { ...p, label: `Cable from the instrument: reflection at ${Fmt.sig(p.best)} ${p.unit}, interval ${Fmt.sig(p.lo)} to ${Fmt.sig(p.hi)} ${p.unit}` });
  },
});
