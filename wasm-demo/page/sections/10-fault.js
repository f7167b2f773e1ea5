// Section: Fault distance. Round-trip time of a reflection and the cable's
// velocity (a factor ± tolerance, a dielectric preset, datasheet figures, the
// line of the design section, or a calibration on known lengths) → distance
// with its interval (core: timing, timing::presets, timing::calibrate).
'use strict';
(() => {
  const BY = ['vf', 'tol', 'ds_vf', 'ds_lo', 'ds_hi', 'mtol', 'cal_l1', 'cal_t1', 'cal_l2', 'cal_t2', 'cal_dl'];
  const USES = {
    factor: ['vf', 'tol'], datasheet: ['ds_vf', 'ds_lo', 'ds_hi'], model: ['mtol'],
    cal1: ['cal_l1', 'cal_t1', 'cal_dl'], cal2: ['cal_l1', 'cal_t1', 'cal_l2', 'cal_t2', 'cal_dl'],
  };
  let last = null;
  function show() {
    const by = document.getElementById('fault-by').value;
    const uses = new Set(USES[by] || []);
    for (const k of BY) document.getElementById(`fault-${k}`).closest('.field').hidden = !uses.has(k);
  }
  Echo.section({
    id: 'fault',
    order: 10,
    title: 'Fault distance',
    lead: 'Distance to a reflection from its round-trip time and the cable’s velocity, with the interval the tolerances allow.',
    inputs: [
      { key: 'round_trip', label: 'Round-trip time', unit: 'time', value: '612 ns', param: 't_round_s',
        hint: 'From the launched edge to the reflection, e.g. 612 ns or 1.2 us' },
      { key: 'by', label: 'Cable velocity from', type: 'choice', value: 'factor',
        options: [['factor', 'velocity factor ± tolerance'], ['solid-pe', 'solid polyethylene'], ['foam-pe', 'foamed polyethylene'],
          ['ptfe', 'solid PTFE'], ['foam-ptfe', 'foamed PTFE'], ['air', 'air-spaced'], ['twisted-pair', 'telephone pair / data cable'],
          ['xlpe', 'XLPE power cable'], ['paper', 'paper-insulated power cable'], ['datasheet', 'datasheet figures (VF and its range)'],
          ['model', 'the line in “Line design” (group velocity)'], ['cal1', 'calibration: one cable of known length'],
          ['cal2', 'calibration: two lengths (removes the fixture offset)']] },
      { key: 'vf', label: 'Velocity factor', unit: 'number', value: '0.66', param: 'velocity_factor',
        hint: 'Fraction of the speed of light, e.g. 0.66 (solid PE) or 82 %' },
      { key: 'tol', label: 'Velocity factor tolerance (±)', unit: 'number', value: '0.02', param: 'tolerance',
        hint: 'Spread of the cable’s velocity factor, e.g. 0.02' },
      { key: 'ds_vf', label: 'Datasheet velocity factor', unit: 'number', value: '0.83', param: 'ds_velocity_factor' },
      { key: 'ds_lo', label: 'Datasheet lowest velocity factor', unit: 'number', value: '0.81', param: 'ds_velocity_factor_lo' },
      { key: 'ds_hi', label: 'Datasheet highest velocity factor', unit: 'number', value: '0.85', param: 'ds_velocity_factor_hi' },
      { key: 'mtol', label: 'Model velocity tolerance (±, relative)', unit: 'number', value: '1 %', param: 'model_tolerance',
        hint: 'How far the real cable may be from the model' },
      { key: 'cal_l1', label: 'Known length (first cable)', unit: 'length', value: '100 m', param: ['cal_length_m', 'length1_m'] },
      { key: 'cal_t1', label: 'Its end reflection at', unit: 'time', value: '1.01 us', param: 'cal_t_round_s' },
      { key: 'cal_l2', label: 'Known length (second cable)', unit: 'length', value: '200 m', param: 'cal_length2_m' },
      { key: 'cal_t2', label: 'Its end reflection at', unit: 'time', value: '2.02 us', param: 'cal_t_round2_s' },
      { key: 'cal_dl', label: 'Length tolerance (±)', unit: 'length', value: '0.1 m', param: 'cal_length_tolerance_m' },
      { key: 'dt', label: 'Sample interval', unit: 'time', value: '1 ns', param: 'sample_interval_s',
        hint: 'Time between samples of the trace' },
      { key: 'interp', label: 'Edge crossing interpolated between samples', type: 'check', value: true },
      { key: 'rise', label: 'Edge rise time (10–90 %)', unit: 'time', value: '2 ns', param: 'rise_time_s',
        hint: 'Of the reflected edge as seen on the trace' },
    ],
    setup(card, api) {
      try {
        const presets = JSON.parse(api.core.velocity_presets()).presets;
        for (const o of document.querySelectorAll('#fault-by option')) {
          const p = presets.find((x) => x.name === o.value);
          if (p) o.textContent = `${p.description} (VF ${Fmt.sig(p.lo, 2)}–${Fmt.sig(p.hi, 2)})`;
        }
      } catch (_) { /* labels stay plain */ }
      document.getElementById('fault-by').addEventListener('change', show);
      show();
      // The design section publishes its line; recompute when it changes.
      document.addEventListener('echoline:design', () => { if (document.getElementById('fault-by').value === 'model') api.rerun(); });
      const use = Echo.h('button', { type: 'button', id: 'fault-use-cal', text: 'Use as factor ± tolerance' });
      use.style.display = 'none';
      use.addEventListener('click', () => {
        if (!last) return;
        document.getElementById('fault-vf').value = String(Number(last.vf_nominal.toPrecision(6)));
        document.getElementById('fault-tol').value = String(Number(last.vf_tolerance.toPrecision(3)));
        document.getElementById('fault-by').value = 'factor';
        show();
        document.getElementById('fault-by').dispatchEvent(new Event('change'));
      });
      api.parts.results.append(Echo.h('div', { class: 'file-tools no-print' }, use));
    },
    compute(v, core, ctx) {
      const d0 = Echo.shared.design;
      if (v.by === 'model' && !d0) throw new Error('the line of “Line design” is not ready yet');
      const nums = [v.round_trip, v.vf, v.tol, v.dt, v.interp ? 1 : 0, v.rise, v.ds_vf, v.ds_lo, v.ds_hi, v.mtol,
        v.cal_l1, v.cal_t1, v.cal_l2, v.cal_t2, v.cal_dl];
      const d = d0 || { geom: 'ideal', sub: 'thick', diel: 'constant', nums: new Array(24).fill(0) };
      const r = JSON.parse(core.fault_distance_by(v.by, d.geom, d.sub, d.diel, new Float64Array(d.nums), new Float64Array(nums)));
      last = r;
      const imperial = ctx.system === 'imperial';
      const dist = ctx.length(r.distance_m, r.distance_ft);
      const lo = ctx.length(r.lo_m, r.lo_ft);
      const hi = ctx.length(r.hi_m, r.hi_ft);
      const other = imperial ? `${Fmt.sig(r.distance_m)} m` : `${Fmt.sig(r.distance_ft)} ft`;
      const v1 = imperial ? (x) => `${Fmt.sig(x / 1e6)} ft/µs` : (x) => `${Fmt.sig(x / 1e6)} m/µs`;
      const vn = imperial ? r.v_nominal_ft_per_s : r.v_nominal_m_per_s;
      const vl = imperial ? r.v_lo_ft_per_s : r.v_lo_m_per_s;
      const vh = imperial ? r.v_hi_ft_per_s : r.v_hi_m_per_s;
      const source = document.querySelector(`#fault-by option[value="${v.by}"]`)?.textContent || v.by;
      const rows = [
        { key: 'distance', label: 'Distance to the reflection', text: dist.text, value: dist.value, main: true },
        { key: 'interval', label: 'Interval', text: `${lo.text.split(' ')[0]} to ${hi.text}`, data: { lo: lo.value, hi: hi.value } },
        { key: 'other', label: imperial ? 'In metres' : 'In feet', text: other, value: imperial ? r.distance_m : r.distance_ft },
        { key: 'dt_half', label: 'Timing uncertainty (±)', text: Fmt.si(r.t_half_width_s, 's'), value: r.t_half_width_s },
        { key: 'velocity', label: 'Velocity used', text: `${v1(vn)} (VF ${Fmt.sig(r.vf_nominal)})`, value: vn, data: { lo: vl, hi: vh, vf: r.vf_nominal } },
        { key: 'velocity_range', label: 'Velocity range', text: `${Fmt.sig(vl / 1e6)} to ${v1(vh)} (VF ${Fmt.sig(r.vf_lo, 3)}–${Fmt.sig(r.vf_hi, 3)})`,
          data: { vflo: r.vf_lo, vfhi: r.vf_hi } },
        { key: 'source', label: 'Velocity from', text: v.by === 'model' ? `${d.what} at ${Fmt.si(d.freq, 'Hz')}, ${r.kind} velocity` : source, note: true },
      ];
      if (r.offset_s !== null) {
        rows.push({ key: 'offset', label: 'Fixture offset removed', text: `${Fmt.si(r.offset_s, 's')} (${Fmt.si(r.offset_lo_s, 's')} to ${Fmt.si(r.offset_hi_s, 's')})`,
          value: r.offset_s, data: { t: r.t_used_s } });
      }
      document.getElementById('fault-use-cal').style.display = v.by === 'cal1' || v.by === 'cal2' ? '' : 'none';
      return { rows, plot: { best: dist.value, lo: lo.value, hi: hi.value, unit: imperial ? 'ft' : 'm' } };
    },
    draw(host, out) {
      const p = out.plot;
      Plot.interval(host, { ...p, label: `Cable from the instrument: reflection at ${Fmt.sig(p.best)} ${p.unit}, interval ${Fmt.sig(p.lo)} to ${Fmt.sig(p.hi)} ${p.unit}` });
    },
  });
})();
