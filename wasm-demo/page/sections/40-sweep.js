// Section: Sweep analysis. A reflection sweep (Touchstone .sNp or CSV, read
// by the core) → reflection against distance with its peaks (core:
// sweep::read_reflection, sweep::dtf, sweep::peaks). This file keeps the
// loaded sweep (a handle to core memory) and draws.
'use strict';
(() => {
  const st = { file: null, name: '', fileName: '', text: null, zref: null, json: null, core: null };
  let api = null;
  let fileMsg = null;

  function say(text, bad) {
    fileMsg.textContent = text;
    fileMsg.classList.toggle('bad', !!bad);
  }
  function setFile(handle, name, text, zref, fileName = name) {
    if (st.file && st.file !== handle) st.file.free();
    Object.assign(st, { file: handle, name: handle ? name : '', fileName: handle ? fileName : '', text: handle ? text : null, zref: handle ? zref : null });
    api.rerun();
  }
  function zrefField() {
    try { return st.core.parse_quantity(document.getElementById('sweep-zref').value, 'resistance'); } catch (_) { return 50; }
  }
  async function loadFile(file) {
    say(`Reading ${file.name}…`);
    try {
      const text = await Files.read(file);
      await new Promise((r) => setTimeout(r, 0)); // let the message paint
      const z = zrefField();
      const handle = st.core.parse_sweep(text, file.name, z);
      setFile(handle, file.name, text, z);
      say(`Loaded ${file.name}: ${handle.len.toLocaleString('en')} points, ${Fmt.si(handle.f_start_hz, 'Hz')} to ${Fmt.si(handle.f_stop_hz, 'Hz')}.`);
    } catch (e) {
      setFile(null, '', null, null);
      say(`${file.name} not loaded: ${String((e && e.message) || e)}. No sweep is loaded now.`, true);
    }
  }
  function loadDemo() {
    const text = st.core.demo_sweep_text();
    const z = zrefField();
    const handle = st.core.parse_sweep(text, 'demo_feeder.s1p', z);
    setFile(handle, 'demo sweep (relay-site antenna feeder)', text, z, 'demo_feeder.s1p');
    say(`Demo sweep loaded: an invented 35 m antenna feeder, ${handle.len} points, read by the core.`);
  }
  function peaksCsv(j) {
    const head = 'n,distance_m,lo_m,hi_m,distance_ft,lo_ft,hi_ft,rho,value,return_loss_db';
    const rows = j.peaks.map((p, i) => [i + 1, p.distance_m, p.lo_m, p.hi_m, p.distance_ft, p.lo_ft, p.hi_ft, p.rho, p.value, p.return_loss_db].join(','));
    return `${head}\n${rows.join('\n')}\n`;
  }

  Echo.section({
    id: 'sweep',
    order: 40,
    wide: true,
    title: 'Sweep analysis',
    lead: 'Load a reflection sweep (Touchstone .s1p/.s2p or CSV): the reflection against distance along the cable, and the places it reflects.',
    inputs: [
      { key: 'mode', label: 'Transform', type: 'choice', value: 'band',
        options: [['band', 'band-pass (any sweep, |Γ|)'], ['impulse', 'low-pass impulse (harmonic sweep, signed)'], ['step', 'low-pass step (harmonic sweep, level)']] },
      { key: 'window', label: 'Window', type: 'choice', value: 'hann',
        options: [['rect', 'rectangular (sharpest, high side lobes)'], ['hann', 'Hann'], ['hamming', 'Hamming'], ['kaiser', 'Kaiser (β below)']] },
      { key: 'beta', label: 'Kaiser β', unit: 'number', value: '6', param: 'beta', hint: 'Larger β: lower side lobes, wider peaks' },
      { key: 'vby', label: 'Cable velocity', type: 'choice', value: 'factor',
        options: [['factor', 'velocity factor ± tolerance'], ['solid-pe', 'solid polyethylene'], ['foam-pe', 'foamed polyethylene'],
          ['ptfe', 'solid PTFE'], ['foam-ptfe', 'foamed PTFE'], ['air', 'air-spaced'], ['twisted-pair', 'telephone pair / data cable'],
          ['xlpe', 'XLPE power cable'], ['paper', 'paper-insulated power cable']] },
      { key: 'vf', label: 'Velocity factor', unit: 'number', value: '0.88', param: 'velocity_factor', hint: 'e.g. 0.88 (foam coax), 0.66 (solid PE)' },
      { key: 'tol', label: 'Tolerance (±)', unit: 'number', value: '0.01', param: 'tolerance' },
      { key: 'zoom', label: 'Zoom onto a stretch of cable (band-pass)', type: 'check', value: false },
      { key: 'start', label: 'Zoom from', unit: 'length', value: '0 m', param: 'start_m' },
      { key: 'stop', label: 'Zoom to', unit: 'length', value: '40 m', param: 'stop_m' },
      { key: 'thr', label: 'List reflections from |Γ|', unit: 'number', value: '0.02', param: 'threshold', hint: '0.02 is a 34 dB return loss' },
      { key: 'zref', label: 'Reference impedance', unit: 'resistance', value: '50 Ω', param: 'z_ref_ohm', hint: 'Γ of the file renormalised to this' },
    ],
    setup(card, a) {
      api = a;
      st.core = a.core;
      try {
        const presets = JSON.parse(a.core.velocity_presets()).presets;
        for (const o of document.querySelectorAll('#sweep-vby option')) {
          const p = presets.find((x) => x.name === o.value);
          if (p) o.textContent = `${p.description} (VF ${Fmt.sig(p.lo, 2)}–${Fmt.sig(p.hi, 2)})`;
        }
      } catch (_) { /* labels stay plain */ }
      const byId = (k) => document.getElementById(`sweep-${k}`).closest('.field');
      const show = () => {
        const vby = document.getElementById('sweep-vby').value;
        for (const k of ['vf', 'tol']) byId(k).hidden = vby !== 'factor';
        byId('beta').hidden = document.getElementById('sweep-window').value !== 'kaiser';
        const zoom = document.getElementById('sweep-zoom');
        const band = document.getElementById('sweep-mode').value === 'band';
        zoom.disabled = !band;
        for (const k of ['start', 'stop']) byId(k).hidden = !(band && zoom.checked);
      };
      for (const k of ['vby', 'window', 'zoom', 'mode']) document.getElementById(`sweep-${k}`).addEventListener('change', show);
      show();
      const h = Echo.h;
      const input = h('input', { type: 'file', id: 'sweep-file', accept: '.s1p,.s2p,.s3p,.s4p,.ts,.csv,.txt,text/plain', class: 'visually-hidden' });
      input.addEventListener('change', () => { if (input.files[0]) loadFile(input.files[0]); input.value = ''; });
      const btn = (id, text, fn) => { const b = h('button', { type: 'button', id, text }); b.addEventListener('click', fn); return b; };
      fileMsg = h('p', { class: 'file-msg', id: 'sweep-file-msg', role: 'status', 'aria-live': 'polite',
        text: 'No sweep loaded. Choose a Touchstone or CSV file, drop one on this section, or load the demo.' });
      const tools = h('div', { class: 'file-tools no-print', role: 'group', 'aria-label': 'Sweep files' },
        input, h('label', { class: 'button', for: 'sweep-file', text: 'Open sweep file…' }),
        btn('sweep-demo', 'Load demo sweep', loadDemo),
        btn('sweep-save-demo', 'Save demo .s1p', () => Files.download('demo_feeder.s1p', a.core.demo_sweep_text())));
      const caution = h('p', { class: 'inline-caution', id: 'sweep-caution',
        text: 'Before connecting an analyser: de-energise, discharge and lock out the cable; never connect to live conductors.' });
      const exports = h('div', { class: 'file-tools no-print', role: 'group', 'aria-label': 'Export peaks' },
        btn('sweep-export-csv', 'Peaks as CSV', () => { if (st.json) Files.download('sweep-peaks.csv', peaksCsv(st.json), 'text/csv'); }),
        btn('sweep-export-json', 'Peaks as JSON', () => {
          if (!st.json) return;
          const { x_m, x_ft, y, ...rest } = st.json;
          Files.download('sweep-peaks.json', JSON.stringify({ format: 'echoline-sweep-peaks', file: st.name, ...rest }, null, 2), 'application/json');
        }));
      card.insertBefore(h('div', { class: 'drop', id: 'sweep-drop' }, caution, tools, fileMsg), card.querySelector('.body'));
      a.parts.results.append(exports);
      Files.dropZone(card, (files) => loadFile(files[0]));
    },
    compute(v, core, ctx) {
      for (const id of ['sweep-export-csv', 'sweep-export-json']) document.getElementById(id).disabled = !st.file;
      if (!st.file) {
        st.json = null;
        return { rows: [{ key: 'state', label: 'Sweep', text: 'none loaded', note: true }], plot: null };
      }
      if (v.zref !== st.zref) {
        // The reference impedance changes Γ of a Touchstone file: read it again.
        const again = core.parse_sweep(st.text, st.fileName, v.zref);
        st.file.free();
        st.file = again;
        st.zref = v.zref;
      }
      const zoom = v.zoom && v.mode === 'band';
      const j = JSON.parse(core.analyse_sweep(st.file, v.mode, v.window, v.beta, v.vby, v.vf, v.tol, zoom, v.start, v.stop, v.thr));
      st.json = j;
      const imperial = ctx.system === 'imperial';
      const L = (m, ft) => ctx.length(m, ft);
      const vel = j.velocity;
      const vtext = vel.lo_m_per_s === vel.hi_m_per_s
        ? `VF ${Fmt.sig(vel.factor)}`
        : `VF ${Fmt.sig(vel.factor)} (${Fmt.sig(vel.lo_m_per_s / 299792458, 3)}–${Fmt.sig(vel.hi_m_per_s / 299792458, 3)})`;
      const rows = [
        { key: 'peaks', label: `Reflections in ${st.name}`, text: `${j.peaks.length} above |Γ| ${Fmt.sig(v.thr, 2)}`, value: j.peaks.length, main: true },
        { key: 'sweep', label: 'Sweep', text: `${j.points} points, ${Fmt.si(j.f_start_hz, 'Hz')} to ${Fmt.si(j.f_stop_hz, 'Hz')}`, value: j.points },
        { key: 'range', label: 'Alias-free range', text: L(j.range_m, j.range_ft).text, value: imperial ? j.range_ft : j.range_m },
        { key: 'resolution', label: `Resolution (${j.mode})`, text: L(j.resolution_m, j.resolution_ft).text,
          value: imperial ? j.resolution_ft : j.resolution_m, data: { m: j.resolution_m } },
        { key: 'window', label: 'Window 6 dB width, side lobe', text: `${Fmt.sig(j.k6_bins, 3)} bins, ${Fmt.sig(j.side_lobe_db, 3)} dB`, value: j.k6_bins },
        { key: 'velocity', label: 'Velocity', text: `${vtext}, ${vel.kind === 'factor' ? 'a constant factor' : `${vel.kind} velocity of a model`}`, value: vel.factor },
      ];
      return { rows, plot: j };
    },
    draw(host, out, ctx) {
      host.textContent = '';
      const j = out.plot;
      if (!j) return;
      const h = Echo.h;
      const imperial = ctx.system === 'imperial';
      const unit = imperial ? 'ft' : 'm';
      const width = Math.max(320, (host.clientWidth || 700) - 4);
      const xs = imperial ? j.x_ft : j.x_m;
      const fig = h('figure', { class: 'fig', id: 'sweep-plot' });
      const what = j.mode === 'band-pass' ? '|Γ| against distance' : j.mode === 'low-pass impulse' ? 'impulse response (+ rises, − falls in impedance)' : 'step response (reflection level)';
      fig.append(h('figcaption', { text: `${what}; reflections numbered as in the table.` }));
      host.append(fig);
      const yr = Plot.extent([j.y, j.mode === 'band-pass' ? [0] : []]);
      const marks = j.peaks.map((p, i) => ({ x: imperial ? p.distance_ft : p.distance_m, text: String(i + 1), cls: 'event', row: i % 2 }));
      Plot.chart(fig, {
        width, height: 230, label: `Sweep ${st.name}: ${what}, ${j.peaks.length} reflections`,
        x: { lo: xs[0], hi: xs[xs.length - 1], title: `distance (${unit})`, fmt: Files.plain },
        y: { ...yr, title: j.mode === 'band-pass' ? '|Γ|' : 'Γ', fmt: Files.plain },
        series: [{ xs, ys: j.y, cls: 'today' }], marks,
      });
      const table = h('table', { class: 'events', id: 'sweep-peaks' });
      table.append(h('caption', { text: `Reflections in ${st.name} (distance: best estimate and interval)` }));
      const head = h('tr', {});
      for (const c of ['#', `Distance (${unit})`, imperial ? 'In metres' : 'In feet', '|Γ|', j.mode === 'band-pass' ? 'Return loss' : 'Sign, return loss']) head.append(h('th', { scope: 'col', text: c }));
      table.append(h('thead', {}, head));
      const tb = h('tbody', {});
      j.peaks.forEach((p, i) => {
        const d = imperial ? [p.distance_ft, p.lo_ft, p.hi_ft] : [p.distance_m, p.lo_m, p.hi_m];
        const o = imperial ? [p.distance_m, 'm'] : [p.distance_ft, 'ft'];
        const sign = j.mode === 'band-pass' ? '' : p.value >= 0 ? 'impedance up, ' : 'impedance down, ';
        tb.append(h('tr', { 'data-distance-m': p.distance_m, 'data-lo-m': p.lo_m, 'data-hi-m': p.hi_m, 'data-rho': p.rho, 'data-rl': p.return_loss_db },
          h('td', { text: String(i + 1) }),
          h('td', { class: 'num', text: `${Fmt.sig(d[0])} (${Fmt.sig(d[1])}–${Fmt.sig(d[2])})` }),
          h('td', { class: 'num', text: `${Fmt.sig(o[0])} ${o[1]}` }),
          h('td', { class: 'num', text: Fmt.sig(p.rho, 3) }),
          h('td', { class: 'num', text: `${sign}${Fmt.sig(p.return_loss_db, 3)} dB` })));
      });
      if (!j.peaks.length) tb.append(h('tr', {}, h('td', { colspan: 5, text: 'No reflection above the threshold.' })));
      table.append(tb);
      host.append(h('div', { class: 'table-wrap' }, table));
    },
  });
})();
