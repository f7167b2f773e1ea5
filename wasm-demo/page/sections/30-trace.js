// Section: Trace analysis. A recorded step trace (CSV, parsed by the core) →
// events with distances, the layer-peeled impedance profile, and the changes
// against a baseline trace (core: tdr::{Trace, analyse, peel, compare}).
// This file keeps the loaded traces (handles to core memory) and draws.
'use strict';
(() => {
  const st = {
    trace: null, traceName: '', baseline: null, baseName: '',
    report: null, json: null, cursorT: null, job: 0, profiles: {}, core: null,
  };
  let api = null;
  let fileMsg = null;
  const kinds = { trace: 'trace', baseline: 'baseline' };

  function say(text, bad) {
    fileMsg.textContent = text;
    fileMsg.classList.toggle('bad', !!bad);
  }

  function setTrace(which, handle, name) {
    const old = st[which];
    if (old && old !== handle) old.free();
    st[which] = handle;
    st[which === 'trace' ? 'traceName' : 'baseName'] = handle ? name : '';
    if (which === 'trace') { st.cursorT = null; Echo.shared.trace = handle ? { file: handle, name } : null; }
    st.profiles = {};
    api.rerun();
    document.dispatchEvent(new CustomEvent('echoline:trace'));
  }

  /** The sample interval field, for one-column files (NaN if not valid). */
  function intervalField() {
    try { return st.core.parse_quantity(document.getElementById('trace-dt').value, 'time'); } catch (_) { return NaN; }
  }

  async function loadFile(file, which) {
    say(`Reading ${file.name}…`);
    try {
      const text = await Files.read(file);
      await new Promise((r) => setTimeout(r, 0)); // let the message paint
      const handle = st.core.parse_trace_csv(text, intervalField());
      say(`Analysing ${file.name} (${handle.len.toLocaleString('en')} samples)…`);
      await new Promise((r) => setTimeout(r, 0)); // parse and analysis in separate tasks
      setTrace(which, handle, file.name);
      say(`Loaded ${file.name} as the ${kinds[which]}: ${handle.len.toLocaleString('en')} samples.`);
    } catch (e) {
      setTrace(which, null, '');
      say(`${file.name} not loaded: ${Echo.message(e)}. No ${kinds[which]} is loaded now.`, true);
    }
  }

  function loadDemo(which) {
    const handle = st.core.demo_trace(which === 'baseline');
    setTrace(which, handle, which === 'baseline' ? 'demo baseline (same feeder, good condition)' : 'demo trace (Marrow Fen pump house feeder)');
    say(which === 'baseline'
      ? 'Demo baseline loaded: the same invented cable run without its faults, simulated by the core.'
      : 'Demo trace loaded: an invented 120 m feeder with two faults, simulated by the core.');
  }

  function eventsCsv(ev) {
    const head = 'n,kind,distance_m,lo_m,hi_m,distance_ft,lo_ft,hi_ft,round_trip_s,rho,rho_sigma,gamma_after,z_after_ohm,c_f,l_h,snr,clipped';
    const cell = (x) => (x === null || x === undefined ? '' : String(x));
    const rows = ev.map((e, i) => [i + 1, `"${e.kind}"`, e.distance_m, e.lo_m, e.hi_m, e.distance_ft, e.lo_ft, e.hi_ft,
      e.round_trip_s, e.rho, e.rho_sigma, e.gamma_after, e.z_open ? 'open' : e.z_ohm, e.c_f, e.l_h, e.snr, e.clipped].map(cell).join(','));
    return `${head}\n${rows.join('\n')}\n`;
  }

  Echo.section({
    id: 'trace',
    order: 30,
    wide: true,
    title: 'Trace analysis',
    lead: 'Load a recorded step trace (CSV of time_s,volts): reflections found and located, the impedance along the cable, and what changed against a baseline.',
    inputs: [
      { key: 'vby', label: 'Cable velocity', type: 'choice', value: 'factor',
        options: [['factor', 'velocity factor ± tolerance'], ['solid-pe', 'solid polyethylene'], ['foam-pe', 'foamed polyethylene'],
          ['ptfe', 'solid PTFE'], ['foam-ptfe', 'foamed PTFE'], ['air', 'air-spaced'], ['twisted-pair', 'telephone pair / data cable'],
          ['xlpe', 'XLPE power cable'], ['paper', 'paper-insulated power cable']] },
      { key: 'vf', label: 'Velocity factor', unit: 'number', value: '0.66', param: 'velocity_factor',
        hint: 'Used when velocity is by factor, e.g. 0.66' },
      { key: 'tol', label: 'Tolerance (±)', unit: 'number', value: '0.01', param: 'tolerance' },
      { key: 'zs', label: 'Instrument source impedance', unit: 'resistance', value: '50 Ω', param: 'source_ohm',
        hint: 'Reference for ρ and the impedance readings' },
      { key: 'dt', label: 'Sample interval (one-column files)', unit: 'time', value: '1 ns', param: 'sample_interval_s',
        hint: 'Used only for a file with a single column of volts' },
    ],
    setup(card, a) {
      api = a;
      st.core = a.core;
      // Preset options carry the core's velocity ranges.
      try {
        const presets = JSON.parse(a.core.velocity_presets()).presets;
        for (const o of document.querySelectorAll('#trace-vby option')) {
          const p = presets.find((x) => x.name === o.value);
          if (p) o.textContent = `${p.description} (VF ${Fmt.sig(p.lo, 2)}–${Fmt.sig(p.hi, 2)})`;
        }
      } catch (_) { /* labels stay plain */ }
      // The factor and tolerance fields matter only for "velocity factor ± tolerance".
      const vby = card.querySelector('#trace-vby');
      const show = () => {
        for (const k of ['vf', 'tol']) document.getElementById(`trace-${k}`).closest('.field').hidden = vby.value !== 'factor';
      };
      vby.addEventListener('change', show);
      show();
      const h = Echo.h;
      const pick = (id, label, which) => {
        const input = h('input', { type: 'file', id, accept: '.csv,text/csv,text/plain', class: 'visually-hidden' });
        input.addEventListener('change', () => { if (input.files[0]) loadFile(input.files[0], which); input.value = ''; });
        return [input, h('label', { class: 'button', for: id, text: label })];
      };
      const btn = (id, text, fn) => { const b = h('button', { type: 'button', id, text }); b.addEventListener('click', fn); return b; };
      fileMsg = h('p', { class: 'file-msg', id: 'trace-file-msg', role: 'status', 'aria-live': 'polite',
        text: 'No trace loaded. Choose a CSV file, drop one on this section, or load the demo.' });
      const tools = h('div', { class: 'file-tools no-print', role: 'group', 'aria-label': 'Trace files' },
        ...pick('trace-file', 'Open trace CSV…', 'trace'),
        ...pick('trace-base-file', 'Open baseline CSV…', 'baseline'),
        btn('trace-demo', 'Load demo trace', () => loadDemo('trace')),
        btn('trace-demo-base', 'Load demo baseline', () => loadDemo('baseline')),
        btn('trace-clear-base', 'Remove baseline', () => { setTrace('baseline', null, ''); say('Baseline removed.'); }),
        btn('trace-save-demo', 'Save demo CSV files', () => {
          Files.download('demo-trace.csv', a.core.demo_csv(false), 'text/csv');
          Files.download('demo-baseline.csv', a.core.demo_csv(true), 'text/csv');
        }));
      const caution = h('p', { class: 'inline-caution', id: 'trace-caution',
        text: 'Before connecting an instrument: de-energise, discharge and lock out the cable; never connect to live conductors.' });
      const exports = h('div', { class: 'file-tools no-print', role: 'group', 'aria-label': 'Export events' },
        btn('trace-export-csv', 'Events as CSV', () => { if (st.json) Files.download('events.csv', eventsCsv(st.json.today.events), 'text/csv'); }),
        btn('trace-export-json', 'Events as JSON', () => {
          if (st.json) Files.download('events.json', JSON.stringify({ format: 'echoline-trace-events', file: st.traceName, baseline: st.baseName || null, ...st.json }, null, 2), 'application/json');
        }));
      const body = card.querySelector('.body');
      card.insertBefore(h('div', { class: 'drop', id: 'trace-drop' }, caution, tools, fileMsg), body);
      a.parts.results.append(exports);
      Files.dropZone(card, (files) => {
        loadFile(files[0], 'trace');
        if (files[1]) loadFile(files[1], 'baseline');
      });
    },
    compute(v, core, ctx) {
      const vby = v.vby;
      for (const id of ['trace-export-csv', 'trace-export-json']) document.getElementById(id).disabled = !st.trace;
      document.getElementById('trace-clear-base').disabled = !st.baseline;
      if (!st.trace) {
        st.json = null;
        return { rows: [{ key: 'state', label: 'Trace', text: 'none loaded', note: true }], plot: null };
      }
      const rep = st.baseline
        ? core.analyse_against(st.trace, st.baseline, vby, v.vf, v.tol, v.zs)
        : core.analyse_trace(st.trace, vby, v.vf, v.tol, v.zs);
      if (st.report) st.report.free();
      st.report = rep;
      st.json = JSON.parse(rep.json());
      const t = st.json.today;
      const imperial = ctx.system === 'imperial';
      const L = (m, ft) => ctx.length(m, ft);
      const faults = t.events.filter((e) => e.kind_id !== 'EndOfTrace');
      const rows = [
        { key: 'events', label: `Events in ${st.traceName}`, text: `${faults.length} found`, value: faults.length, main: true },
        { key: 't0', label: 'Time zero (launch, 50 %)', text: Fmt.si(t.t_zero_s, 's'), value: t.t_zero_s },
        { key: 'incident', label: 'Incident step', text: Fmt.si(t.incident_v, 'V'), value: t.incident_v },
        { key: 'rise', label: 'Rise time (10–90 %)', text: Fmt.si(t.rise_time_s, 's'), value: t.rise_time_s },
        { key: 'noise', label: 'Noise (σ)', text: Fmt.si(t.noise_v, 'V'), value: t.noise_v },
        { key: 'dead', label: 'Dead zone', text: L(t.dead_zone_m, t.dead_zone_ft).text, value: imperial ? t.dead_zone_ft : t.dead_zone_m },
        { key: 'range', label: 'Range covered', text: L(t.range_m, t.range_ft).text, value: imperial ? t.range_ft : t.range_m },
      ];
      if (t.masked_by_dead_zone) rows.push({ key: 'masked', label: 'Note', text: 'a reflection may hide in the dead zone', note: true });
      if (t.clipped_samples) rows.push({ key: 'clipped', label: 'Clipped samples', text: String(t.clipped_samples), value: t.clipped_samples, note: true });
      if (st.json.changes) rows.push({ key: 'changes', label: `Changes against ${st.baseName}`, text: String(st.json.changes.length), value: st.json.changes.length });
      return { rows, plot: st.json };
    },
    draw(host, out, ctx) { draw(host, out.plot, ctx); },
  });

  // ---- drawing -----------------------------------------------------------
  function draw(host, json, ctx) {
    host.textContent = '';
    const job = ++st.job;
    if (!json || !st.trace) return;
    const h = Echo.h;
    const imperial = ctx.system === 'imperial';
    const unit = imperial ? 'ft' : 'm';
    const width = Math.max(320, (host.clientWidth || 700) - 4);

    // Trace and baseline, min/max envelopes from the core.
    const env = (f) => {
      const e = f.envelope(Math.min(1400, Math.round(width * 1.5)));
      const xs = [], lo = [], hi = [];
      for (let i = 0; i < e.length; i += 3) { xs.push(e[i]); lo.push(e[i + 1]); hi.push(e[i + 2]); }
      return { xs, lo, hi };
    };
    const a = env(st.trace);
    const b = st.baseline ? env(st.baseline) : null;
    const xr = { lo: st.trace.t_start_s, hi: st.trace.t_end_s };
    const yr = Plot.extent(b ? [a.lo, a.hi, b.lo, b.hi] : [a.lo, a.hi]);
    const tax = Files.timeAxis(xr.lo, xr.hi);
    const marks = json.today.events.map((e, i) => ({ x: e.time_s, text: String(i + 1), cls: 'event', row: i % 2 }));
    const wrap = h('figure', { class: 'fig' });
    const cap = h('figcaption', { text: `Trace${b ? ' (baseline dashed)' : ''}, events numbered as in the table. Move the cursor with the pointer or the arrow keys.` });
    wrap.append(cap);
    host.append(wrap);
    const series = [];
    if (b) series.push({ xs: b.xs, ys: b.lo, band: b.hi, cls: 'base' });
    series.push({ xs: a.xs, ys: a.lo, band: a.hi, cls: 'today' });
    const sc = Plot.chart(wrap, {
      width, height: 230, label: `Trace ${st.traceName}: ${json.today.events.length} events`,
      x: { ...xr, title: `time (${tax.unit})`, fmt: tax.fmt }, y: { ...yr, title: 'volts', fmt: Files.plain },
      series, marks,
    });
    const readout = h('p', { class: 'readout', id: 'trace-cursor', 'aria-live': 'polite' });
    wrap.append(readout);
    const svgEl = sc.root;
    svgEl.setAttribute('tabindex', '0');
    svgEl.classList.add('cursorable');
    const line = Plot.svg('line', { class: 'cursor', y1: sc.M.t, y2: sc.H - sc.M.b, x1: -10, x2: -10 });
    svgEl.append(line);
    const setCursor = (t) => {
      t = Math.min(xr.hi, Math.max(xr.lo, t));
      st.cursorT = t;
      const c = st.report.cursor(t);
      try {
        const x = sc.X(t);
        line.setAttribute('x1', x); line.setAttribute('x2', x);
        const d = ctx.length(c.distance_m, c.distance_ft);
        const lo = imperial ? c.lo_ft : c.lo_m;
        const hi = imperial ? c.hi_ft : c.hi_m;
        readout.dataset.distance = String(d.value);
        readout.dataset.time = String(c.time_s);
        readout.textContent = c.before_launch
          ? `Cursor ${Fmt.si(c.time_s, 's')}: before the launch (no distance).`
          : `Cursor ${Fmt.si(c.time_s, 's')}, round trip ${Fmt.si(c.round_trip_s, 's')} → ${d.text} (${Fmt.sig(lo)} to ${Fmt.sig(hi)} ${unit})`;
      } finally { c.free(); }
    };
    const fromPointer = (e) => {
      const r = svgEl.getBoundingClientRect();
      setCursor(sc.xOf(((e.clientX - r.left) * sc.W) / r.width));
    };
    svgEl.addEventListener('pointermove', fromPointer);
    svgEl.addEventListener('click', fromPointer);
    svgEl.addEventListener('keydown', (e) => {
      const step = (xr.hi - xr.lo) / (e.shiftKey ? 20 : 200);
      const t = st.cursorT ?? json.today.t_zero_s;
      if (e.key === 'ArrowRight') setCursor(t + step);
      else if (e.key === 'ArrowLeft') setCursor(t - step);
      else if (e.key === 'Home') setCursor(xr.lo);
      else if (e.key === 'End') setCursor(xr.hi);
      else return;
      e.preventDefault();
    });
    setCursor(st.cursorT ?? (json.today.events[0] ? json.today.events[0].time_s : json.today.t_zero_s));

    // Event table.
    const table = h('table', { class: 'events', id: 'trace-events' });
    table.append(h('caption', { text: `Events in ${st.traceName} (distance: best estimate and interval)` }));
    const head = h('tr', {});
    for (const c of ['#', 'Kind', `Distance (${unit})`, imperial ? 'In metres' : 'In feet', 'ρ', 'Impedance after', 'Lumped']) head.append(h('th', { scope: 'col', text: c }));
    table.append(h('thead', {}, head));
    const tb = h('tbody', {});
    json.today.events.forEach((e, i) => {
      const d = imperial ? [e.distance_ft, e.lo_ft, e.hi_ft] : [e.distance_m, e.lo_m, e.hi_m];
      const o = imperial ? [e.distance_m, 'm'] : [e.distance_ft, 'ft'];
      const lumped = e.c_f != null ? Fmt.si(e.c_f, 'F') : e.l_h != null ? Fmt.si(e.l_h, 'H') : '—';
      const z = e.z_open ? 'open (∞)' : Fmt.si(e.z_ohm, 'Ω');
      const tr = h('tr', { 'data-kind': e.kind_id, 'data-distance-m': e.distance_m, 'data-lo-m': e.lo_m, 'data-hi-m': e.hi_m, 'data-rho': e.rho, 'data-z': e.z_open ? 'open' : e.z_ohm, 'data-c': e.c_f ?? '', 'data-l': e.l_h ?? '' },
        h('td', { text: String(i + 1) }), h('td', { text: e.kind }),
        h('td', { class: 'num', text: `${Fmt.sig(d[0])} (${Fmt.sig(d[1])}–${Fmt.sig(d[2])})` }),
        h('td', { class: 'num', text: `${Fmt.sig(o[0])} ${o[1]}` }),
        h('td', { class: 'num', text: `${Fmt.sig(e.rho, 3)} ± ${Fmt.sig(e.rho_sigma, 1)}` }),
        h('td', { class: 'num', text: z }),
        h('td', { class: 'num', text: lumped }));
      tr.addEventListener('click', () => setCursor(e.time_s));
      tb.append(tr);
    });
    table.append(tb);
    host.append(h('div', { class: 'table-wrap' }, table));

    // Differences against the baseline.
    if (json.changes) {
      const list = h('ul', { class: 'changes', id: 'trace-changes' });
      if (!json.changes.length) list.append(h('li', { text: 'No differences beyond the noise and the timing intervals.' }));
      for (const c of json.changes) {
        const at = c.distance_m != null ? ctx.length(c.distance_m, c.distance_ft).text : '';
        let text = `${c.kind}: ${c.event || 'event'} at ${at}`;
        if (c.kind === 'moved') text += `, shifted ${Fmt.sig(imperial ? c.shift_ft : c.shift_m, 3)} ${unit}`;
        if (c.kind === 'moved' || c.kind === 'reflection changed') text += `, Δρ ${Fmt.sig(c.delta_rho, 2)}`;
        list.append(h('li', { 'data-kind': c.kind, 'data-distance-m': c.distance_m ?? '', text }));
      }
      host.append(h('h3', { class: 'sub', text: `Differences against ${st.baseName}` }), list);
    }

    // Impedance profile, computed after this frame in bounded steps.
    const pf = h('figure', { class: 'fig', id: 'trace-profile' });
    const progress = h('p', { class: 'progress', role: 'status' }, h('progress', { max: st.baseline ? 2 : 1, value: 0 }), ' Peeling the impedance profile…');
    pf.append(h('figcaption', { text: 'Impedance along the cable (layer peeling of the step trace)' }), progress);
    host.append(pf);
    const steps = [['today', st.trace]];
    if (st.baseline) steps.push(['baseline', st.baseline]);
    const done = {};
    const next = (k) => {
      if (job !== st.job) return; // superseded by a newer drawing
      if (k >= steps.length) { progress.remove(); drawProfile(pf, done, ctx, width); return; }
      const [name, file] = steps[k];
      try {
        const key = `${name}:${st.report.t_zero_s}`;
        done[name] = st.profiles[key] ||= JSON.parse(st.report.profile(file, 2048));
      } catch (e) {
        done[name] = { error: Echo.message(e) };
      }
      progress.firstChild.value = k + 1;
      setTimeout(() => next(k + 1), 0);
    };
    setTimeout(() => next(0), 0);
  }

  function drawProfile(fig, p, ctx, width) {
    const imperial = ctx.system === 'imperial';
    const unit = imperial ? 'ft' : 'm';
    if (p.today.error) { fig.append(Echo.h('p', { class: 'status', text: `Profile not available: ${p.today.error}` })); return; }
    const xsOf = (q) => (imperial ? q.distance_ft : q.distance_m);
    const series = [];
    if (p.baseline && !p.baseline.error) series.push({ xs: xsOf(p.baseline), ys: p.baseline.z_ohm, cls: 'base' });
    series.push({ xs: xsOf(p.today), ys: p.today.z_ohm, cls: 'today' });
    const xs = xsOf(p.today);
    // View: up to a little past the far end the analysis found (beyond an
    // open or short the peel only amplifies noise); the value scale from the
    // 1st to 99th percentile of the cells before that end (the rise to an
    // open leaves the top of the chart).
    const end = (st.json?.today.events || []).find((e) => e.kind_id === 'OpenEnd' || e.kind_id === 'Short');
    const xMax = end ? (imperial ? end.hi_ft : end.hi_m) * 1.06 : xs[xs.length - 1] || 1;
    const zMax = end ? (imperial ? end.lo_ft : end.lo_m) : xMax; // the scale from the cable before its end
    const zs = p.today.z_ohm.filter((z, i) => Number.isFinite(z) && xs[i] <= zMax);
    const sorted = zs.slice().sort((a, b) => a - b);
    const yr = Plot.extent([[sorted[Math.floor(sorted.length * 0.01)] ?? 0, sorted[Math.floor(sorted.length * 0.99)] ?? 1]], 0.2);
    Plot.chart(fig, {
      width, height: 200, label: `Impedance profile, ${p.today.cells} cells, ends: ${p.today.end}`,
      x: { lo: 0, hi: Math.min(xMax, xs[xs.length - 1] || 1), title: `distance (${unit})`, fmt: Files.plain },
      y: { ...yr, title: 'ohms', fmt: Files.plain }, series,
    });
    const note = p.today.end === 'open' ? 'ends in an open' : p.today.end === 'short' ? 'ends in a short' : 'to the end of the samples';
    fig.append(Echo.h('p', { class: 'note', id: 'trace-profile-note', 'data-cells': p.today.cells, 'data-block': p.today.block,
      text: `${p.today.cells} cells${p.today.block > 1 ? ` (samples averaged in blocks of ${p.today.block})` : ''}, ${note}.` }));
  }
})();
