// Section: Simulation. A cable described row by row (sections and lumped
// faults), a far end and an instrument → the trace it would record (core:
// tdr::sim::simulate over a network cascade), what the analysis finds in it,
// and an overlay on the trace loaded in "Trace analysis" to test a hypothesis.
'use strict';
(() => {
  // kind: [label, fields [key, label, unit, default]]
  const KINDS = {
    section: ['line section', [['len', 'length', 'length', '10 m'], ['z0', 'Z0', 'resistance', '50 Ω'], ['vf', 'VF', 'number', '0.66']]],
    shunt_c: ['shunt C (crush, water drop)', [['v', 'C', 'capacitance', '30 pF']]],
    series_l: ['series L (loop, bad joint)', [['v', 'L', 'inductance', '50 nH']]],
    series_r: ['series R (corroded joint)', [['v', 'R', 'resistance', '5 Ω']]],
    shunt_r: ['shunt R (insulation fault)', [['v', 'R', 'resistance', '500 Ω']]],
  };
  const CODE = { section: 0, shunt_c: 1, series_l: 2, series_r: 3, shunt_r: 4 };
  // The demo feeder of the trace section (invented): the hypothesis that matches it.
  const DEFAULT_ROWS = [
    { kind: 'section', len: '42 m', z0: '50 Ω', vf: '0.66' },
    { kind: 'shunt_c', v: '30 pF' },
    { kind: 'section', len: '36 m', z0: '50 Ω', vf: '0.66' },
    { kind: 'section', len: '4 m', z0: '38 Ω', vf: '0.66' },
    { kind: 'section', len: '38 m', z0: '50 Ω', vf: '0.66' },
  ];
  let list = null;
  let api = null;
  let sim = null; // the last simulated TraceFile (core memory)

  // The rows are kept as JSON text among the section's saved inputs, so they
  // persist and travel with "Save inputs…" / "Load inputs…".
  let rendered = null;
  function loadRows() {
    try {
      const r = JSON.parse(Echo.stateOf('simulation').rows || 'null');
      if (Array.isArray(r) && r.every((x) => x && KINDS[x.kind])) return r;
    } catch (_) { /* bad saved text: the default rows */ }
    return DEFAULT_ROWS.map((x) => ({ ...x }));
  }
  function rowsNow() {
    return [...list.querySelectorAll('.simrow')].map((li) => {
      const r = { kind: li.querySelector('select').value };
      for (const inp of li.querySelectorAll('input')) r[inp.dataset.key] = inp.value;
      return r;
    });
  }
  function saveRows() {
    rendered = JSON.stringify(rowsNow());
    Echo.stateOf('simulation').rows = rendered;
    Echo.save();
  }

  function renderRows(rows) {
    const h = Echo.h;
    list.textContent = '';
    rows.forEach((r, i) => {
      const n = i + 1;
      const sel = h('select', { 'aria-label': `Row ${n}: kind`, id: `sim-row${n}-kind` });
      for (const [k, [label]] of Object.entries(KINDS)) sel.append(h('option', { value: k, text: label }));
      sel.value = r.kind;
      const li = h('li', { class: 'simrow' }, h('span', { class: 'rown', text: `${n}.` }), sel);
      for (const [key, label, unit, def] of KINDS[r.kind][1]) {
        const inp = h('input', { type: 'text', 'data-key': key, 'data-unit': unit, id: `sim-row${n}-${key}`, 'aria-label': `Row ${n}: ${label}`,
          autocomplete: 'off', spellcheck: 'false', class: 'small' });
        inp.value = r[key] ?? def;
        li.append(h('label', { class: 'inline', for: inp.id, text: label }), inp);
        inp.addEventListener('input', () => { saveRows(); api.rerun(); });
      }
      const del = h('button', { type: 'button', class: 'icon', 'aria-label': `Remove row ${n}`, text: '✕' });
      del.addEventListener('click', () => { const rs = rowsNow(); rs.splice(i, 1); renderRows(rs); saveRows(); api.rerun(); });
      li.append(del);
      sel.addEventListener('change', () => { const rs = rowsNow(); rs[i] = { kind: sel.value }; renderRows(rs); saveRows(); api.rerun(); list.querySelector(`#sim-row${n}-kind`).focus(); });
      list.append(li);
    });
  }

  Echo.section({
    id: 'simulation',
    order: 60,
    wide: true,
    title: 'Simulation',
    lead: 'Describe a cable run with its faults, row by row from the instrument, and see the trace an instrument would record; lay it over a loaded trace to test what you think is down there.',
    inputs: [
      { key: 'end', label: 'Far end', type: 'choice', value: 'open', options: [['open', 'open'], ['short', 'short'], ['matched', 'matched (Z0 of the last section)'], ['r', 'resistor']] },
      { key: 'end_r', label: 'Far-end resistor', unit: 'resistance', value: '150 Ω', param: 'r_ohm' },
      { key: 'amp', label: 'Step amplitude (open circuit)', unit: 'voltage', value: '2 V', param: 'open_circuit_v', hint: 'Into a matched line the trace shows half' },
      { key: 'rise', label: 'Rise time (10–90 %)', unit: 'time', value: '2 ns', param: 'rise_time_s' },
      { key: 'zs', label: 'Source impedance', unit: 'resistance', value: '50 Ω', param: 'source_impedance_ohm' },
      { key: 'dt', label: 'Sample interval', unit: 'time', value: '1 ns', param: 'sample_interval_s' },
      { key: 'count', label: 'Samples', unit: 'number', value: '2048', param: 'count' },
      { key: 'noise', label: 'Noise (RMS)', unit: 'voltage', value: '2 mV', param: 'rms_v' },
      { key: 'vf', label: 'Velocity factor for the distances', unit: 'number', value: '0.66', param: 'velocity_factor' },
      { key: 'overlay', label: 'Overlay on the trace loaded in Trace analysis', type: 'check', value: true },
    ],
    setup(card, a) {
      api = a;
      const h = Echo.h;
      list = h('ol', { class: 'simrows', id: 'sim-rows', 'aria-label': 'Cable rows, from the instrument outward' });
      const add = h('button', { type: 'button', id: 'sim-add', text: 'Add a row' });
      add.addEventListener('click', () => { const rs = rowsNow(); rs.push({ kind: 'section' }); renderRows(rs); saveRows(); api.rerun(); });
      const reset = h('button', { type: 'button', id: 'sim-reset', text: 'Demo feeder rows' });
      reset.addEventListener('click', () => { renderRows(DEFAULT_ROWS.map((x) => ({ ...x }))); saveRows(); api.rerun(); });
      const toTrace = h('button', { type: 'button', id: 'sim-send', text: 'Analyse as a trace' });
      toTrace.addEventListener('click', () => { document.dispatchEvent(new CustomEvent('echoline:simulated')); });
      const box = h('fieldset', { class: 'rowsbox' }, h('legend', { text: 'The cable, from the instrument' }), list,
        h('div', { class: 'file-tools no-print' }, add, reset));
      a.parts.form.prepend(box);
      a.parts.results.append(h('div', { class: 'file-tools no-print' }, toTrace));
      renderRows(loadRows());
      rendered = Echo.stateOf('simulation').rows || null;
      const show = () => { document.getElementById('simulation-end_r').closest('.field').hidden = document.getElementById('simulation-end').value !== 'r'; };
      card.querySelector('#simulation-end').addEventListener('change', show);
      show();
      // A trace loaded or removed in Trace analysis changes the overlay.
      document.addEventListener('echoline:trace', () => api.rerun());
    },
    compute(v, core, ctx) {
      // Inputs loaded from a file may carry other rows.
      const saved = Echo.stateOf('simulation').rows;
      if (saved && saved !== rendered) { renderRows(loadRows()); rendered = saved; }
      const rows = rowsNow();
      const kind = [], A = [], B = [], C = [];
      for (const li of list.querySelectorAll('.simrow input')) li.classList.remove('bad');
      rows.forEach((r, i) => {
        const vals = {};
        for (const [key, label, unit] of KINDS[r.kind][1]) {
          try {
            vals[key] = core.parse_quantity(r[key] ?? '', unit);
          } catch (e) {
            document.getElementById(`sim-row${i + 1}-${key}`).classList.add('bad');
            throw new Error(`Row ${i + 1}, ${label}: ${Echo.message(e)}`);
          }
        }
        kind.push(CODE[r.kind]);
        if (r.kind === 'section') { A.push(vals.len); B.push(vals.z0); C.push(vals.vf); } else { A.push(vals.v); B.push(0); C.push(0); }
      });
      const end = { open: 0, short: 1, matched: 2, r: 3 }[v.end];
      let file;
      try {
        file = core.simulate_trace(new Uint8Array(kind), new Float64Array(A), new Float64Array(B), new Float64Array(C), end, v.end_r,
          v.amp, v.rise, v.zs, v.dt, Math.round(v.count), v.noise, 1);
      } catch (e) {
        const m = Echo.message(e);
        // Row values are named by the core's parameter (length_m, z0_ohm, …).
        if (/^(length_m|z0_ohm|velocity_factor|c_f|l_h|r_ohm|kind|rows)\b/.test(m) && !(v.end === 'r' && /^r_ohm/.test(m))) throw new Error(`A cable row: ${m}`);
        throw e;
      }
      if (sim) sim.free();
      sim = file;
      Echo.shared.simulated = file;
      // What the analysis finds in the simulated trace.
      let found = null;
      try {
        const rep = core.analyse_trace(file, 'factor', v.vf, 0, v.zs);
        try { found = JSON.parse(rep.json()).today; } finally { rep.free(); }
      } catch (e) {
        found = { error: Echo.message(e) };
      }
      const out = [
        { key: 'samples', label: 'Simulated trace', text: `${file.len.toLocaleString('en')} samples over ${Fmt.si(file.t_end_s, 's')}`, value: file.len, main: true },
      ];
      if (found.error) out.push({ key: 'analysis', label: 'Analysis of it', text: found.error, note: true });
      else {
        found.events.forEach((e, i) => {
          const d = ctx.length(e.distance_m, e.distance_ft);
          const extra = e.c_f != null ? `, ${Fmt.si(e.c_f, 'F')}` : e.l_h != null ? `, ${Fmt.si(e.l_h, 'H')}` : '';
          out.push({ key: `ev${i + 1}`, label: `${i + 1}. ${e.kind}`, text: `${d.text}, Γ after ${Fmt.sig(e.gamma_after, 3)}${extra}`, value: d.value,
            data: { kind: e.kind_id, gamma: e.gamma_after, settled: e.gamma_settled, lo: ctx.system === 'imperial' ? e.lo_ft : e.lo_m, hi: ctx.system === 'imperial' ? e.hi_ft : e.hi_m, c: e.c_f ?? '', rho: e.rho } });
        });
      }
      return { rows: out, plot: { file, overlay: v.overlay, found } };
    },
    draw(host, out) {
      host.textContent = '';
      const { file, overlay, found } = out.plot;
      const loaded = overlay && Echo.shared.trace ? Echo.shared.trace : null;
      const env = (f) => {
        const e = f.envelope(1200);
        const xs = [], lo = [], hi = [];
        for (let i = 0; i < e.length; i += 3) { xs.push(e[i]); lo.push(e[i + 1]); hi.push(e[i + 2]); }
        return { xs, lo, hi };
      };
      const a = env(file);
      const series = [];
      let b = null;
      let caption = 'Simulated trace';
      if (loaded) {
        b = env(loaded.file);
        caption = `Simulated trace (solid) over ${loaded.name} (band); both on their own time axes`;
        series.push({ xs: b.xs, ys: b.lo, band: b.hi, cls: 'today' });
      }
      series.push({ xs: a.xs, ys: a.lo, cls: 'sim' });
      const xr = Plot.extent([a.xs, b ? b.xs : []], 0);
      const yr = Plot.extent(b ? [a.lo, a.hi, b.lo, b.hi] : [a.lo, a.hi]);
      const tax = Files.timeAxis(xr.lo, xr.hi);
      const marks = found && found.events ? found.events.map((e, i) => ({ x: e.time_s, text: String(i + 1), cls: 'event', row: i % 2 })) : [];
      const fig = Echo.h('figure', { class: 'fig', id: 'simulation-plot', 'data-overlay': loaded ? loaded.name : '' }, Echo.h('figcaption', { text: caption }));
      host.append(fig);
      Plot.chart(fig, {
        width: Math.max(320, (host.clientWidth || 700) - 4), height: 240, label: caption,
        x: { ...xr, title: `time (${tax.unit})`, fmt: tax.fmt }, y: { ...yr, title: 'volts', fmt: Files.plain }, series, marks,
      });
    },
  });

  // "Analyse as a trace": hand the simulated trace to the trace section as
  // its trace (through a CSV the core writes and parses again).
  document.addEventListener('echoline:simulated', () => {
    const input = document.getElementById('trace-file');
    if (!input || !sim) return;
    const csv = wasm_bindgen.trace_csv(sim);
    const dt = new DataTransfer();
    dt.items.add(new File([csv], 'simulated.csv', { type: 'text/csv' }));
    input.files = dt.files;
    input.dispatchEvent(new Event('change'));
    document.getElementById('trace').scrollIntoView({ behavior: 'smooth' });
  });
})();
