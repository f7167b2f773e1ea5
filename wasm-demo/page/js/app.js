// The page frame: sections, inputs, recomputation, persistence, theme, units.
// No physics here: inputs are parsed and every result computed by the core
// (the wasm bindings, `core` below); this file only moves text and numbers.
//
// A section is one file in page/sections/ calling Echo.section({...}):
//   id, title, lead          identity and one line of plain words
//   inputs: [{ key, label, unit | type: 'choice' | 'check', value, hint, param, options }]
//            unit: a dimension name of core's parse_quantity ("time", "length", …)
//            param: the core's parameter name, so a core error marks this field
//   compute(values, core, ctx) -> { rows: [{ key, label, text, value, data, main, note }], plot? }
//            value (and data: {name: number}) go into data-* attributes for tests
//   draw(host, result, ctx)  optional, draws result.plot into the section's plot area
//   setup(card, api)         optional, once after building: extra controls (files,
//            buttons); api.rerun() recomputes the section, api.parts its elements
//   planned: 'what it will do'  instead of inputs/compute: a place kept for later
'use strict';
const Echo = (() => {
  const STORE_KEY = 'echoline.page.v1';
  const FORMAT = 'echoline-page-inputs';
  const specs = [];
  const ui = new Map();
  const state = { system: 'metric', theme: 'auto', inputs: {} };
  let core = null;
  let firstResultMs = null;

  // Sections registered after start (the scripts js/boot.js unpacks) are
  // built and computed as they arrive, in the order of their files.
  let place = null;
  function section(spec) {
    specs.push(spec);
    if (place) {
      build(spec, place.main, place.nav, place.later);
      if (!spec.planned) run(spec);
      // Cards already drawn may have changed width: draw all again once
      // the late ones are in.
      clearTimeout(place.redraw);
      place.redraw = setTimeout(runAll, 0);
    }
  }

  function h(tag, attrs, ...children) {
    const e = document.createElement(tag);
    for (const [k, v] of Object.entries(attrs || {})) {
      if (v === false || v === undefined || v === null) continue;
      if (k === 'class') e.className = v;
      else if (k === 'text') e.textContent = v;
      else e.setAttribute(k, v === true ? '' : String(v));
    }
    for (const c of children) if (c !== null && c !== undefined) e.append(c);
    return e;
  }

  // ---- persistence ------------------------------------------------------
  function snapshot() {
    return { format: FORMAT, version: 1, system: state.system, theme: state.theme, inputs: state.inputs };
  }
  function adopt(s) {
    if (!s || typeof s !== 'object') return false;
    if (s.system === 'metric' || s.system === 'imperial') state.system = s.system;
    if (['auto', 'light', 'dark'].includes(s.theme)) state.theme = s.theme;
    if (s.inputs && typeof s.inputs === 'object') {
      for (const [sec, vals] of Object.entries(s.inputs)) {
        if (!vals || typeof vals !== 'object') continue;
        const into = (state.inputs[sec] ||= {});
        for (const [k, v] of Object.entries(vals)) {
          if (typeof v === 'string' || typeof v === 'boolean') into[k] = v;
        }
      }
    }
    return true;
  }
  function save() {
    try { localStorage.setItem(STORE_KEY, JSON.stringify(snapshot())); } catch (_) { /* storage off */ }
  }
  function restore() {
    try { adopt(JSON.parse(localStorage.getItem(STORE_KEY) || 'null')); } catch (_) { /* ignore */ }
  }

  // ---- building sections -----------------------------------------------
  function field(spec, f) {
    const id = `${spec.id}-${f.key}`;
    const saved = state.inputs[spec.id]?.[f.key];
    const hint = f.hint ? h('span', { class: 'hint', id: `${id}-hint`, text: f.hint }) : null;
    const error = h('span', { class: 'error', id: `${id}-error`, 'aria-live': 'polite' });
    const described = [hint && `${id}-hint`, `${id}-error`].filter(Boolean).join(' ');
    let control;
    if (f.type === 'choice') {
      control = h('select', { id, 'aria-describedby': described });
      for (const [value, text] of f.options) control.append(h('option', { value, text }));
      control.value = typeof saved === 'string' && f.options.some(([v]) => v === saved) ? saved : f.value;
    } else if (f.type === 'check') {
      control = h('input', { type: 'checkbox', id, 'aria-describedby': described });
      control.checked = typeof saved === 'boolean' ? saved : !!f.value;
      return { el: h('div', { class: 'field' }, h('label', {}, control, ` ${f.label}`), hint, error), control, error };
    } else {
      control = h('input', {
        type: 'text', id, autocomplete: 'off', spellcheck: 'false', inputmode: 'text',
        'aria-describedby': described, 'data-unit': f.unit,
      });
      control.value = typeof saved === 'string' ? saved : f.value;
    }
    return { el: h('div', { class: 'field' }, h('label', { for: id, text: f.label }), control, hint, error), control, error };
  }

  function build(spec, main, nav, later) {
    const title = h('h2', { id: `${spec.id}-title`, text: spec.title });
    const card = h('section', { class: `card${spec.wide ? ' wide' : ''}`, id: spec.id, 'aria-labelledby': `${spec.id}-title` }, title);
    nav.append(h('li', {}, h('a', { href: `#${spec.id}`, class: spec.planned ? 'later' : null, text: spec.title })));
    if (spec.planned) {
      card.classList.add('planned');
      title.append(h('span', { class: 'tag', text: 'coming' }));
      card.append(h('p', { class: 'lead', text: spec.planned }));
      later.append(card);
      return;
    }
    card.append(h('p', { class: 'lead', text: spec.lead }));
    const form = h('form', { class: 'inputs', 'aria-label': `${spec.title}: inputs` });
    form.addEventListener('submit', (e) => e.preventDefault());
    const fields = new Map();
    for (const f of spec.inputs) {
      const w = field(spec, f);
      fields.set(f.key, { spec: f, ...w });
      form.append(w.el);
      const ev = f.type === 'choice' || f.type === 'check' ? 'change' : 'input';
      w.control.addEventListener(ev, () => { run(spec); save(); });
    }
    const status = h('p', { class: 'status', role: 'status' });
    const rows = h('dl', { class: 'rows' });
    const plot = h('div', { class: 'plot' });
    const results = h('div', { class: 'results', 'aria-label': `${spec.title}: results`, 'aria-live': 'polite' }, status, rows, plot);
    card.append(h('div', { class: 'body' }, form, results));
    main.append(card);
    ui.set(spec.id, { fields, status, rows, plot, results });
    if (spec.setup) spec.setup(card, { rerun: () => run(spec), save, parts: { form, status, rows, plot, results }, core });
  }

  // ---- computing ---------------------------------------------------------
  function message(e) {
    return String((e && e.message) || e).replace(/^line 1, /, '');
  }
  function mark(w, msg) {
    w.el.classList.toggle('bad', !!msg);
    w.control.setAttribute('aria-invalid', msg ? 'true' : 'false');
    w.error.textContent = msg || '';
  }
  const ctx = {
    get system() { return state.system; },
    /** A length in the chosen system: values from the core in both units. */
    length(m, ft, n = 4) {
      return state.system === 'imperial'
        ? { text: `${Fmt.sig(ft, n)} ft`, value: ft }
        : { text: `${Fmt.sig(m, n)} m`, value: m };
    },
    fmt: Fmt,
  };

  function run(spec) {
    const u = ui.get(spec.id);
    const values = {};
    const saved = (state.inputs[spec.id] ||= {});
    let bad = 0;
    for (const [key, w] of u.fields) {
      const f = w.spec;
      if (f.type === 'check') { values[key] = w.control.checked; saved[key] = w.control.checked; continue; }
      saved[key] = w.control.value;
      if (f.type === 'choice') { values[key] = w.control.value; continue; }
      try {
        values[key] = core.parse_quantity(w.control.value, f.unit);
        mark(w, null);
      } catch (e) {
        mark(w, message(e));
        bad++;
      }
    }
    if (bad) {
      u.results.classList.add('stale');
      u.status.textContent = bad === 1
        ? 'Fix the marked entry; the figures below are for the last valid entries.'
        : `Fix the ${bad} marked entries; the figures below are for the last valid entries.`;
      return;
    }
    let out;
    try {
      out = spec.compute(values, core, ctx);
    } catch (e) {
      let msg = message(e);
      for (const w of u.fields.values()) {
        for (const p of [].concat(w.spec.param || [])) {
          if (msg.startsWith(`${p} `)) { msg = w.spec.label + msg.slice(p.length); mark(w, msg); }
        }
      }
      u.results.classList.add('stale');
      u.status.textContent = msg;
      return;
    }
    u.results.classList.remove('stale');
    u.status.textContent = '';
    u.rows.textContent = '';
    for (const r of out.rows) {
      const dd = h('dd', { 'data-key': r.key, 'data-value': Number.isFinite(r.value) ? String(r.value) : null, text: r.text });
      for (const [k, x] of Object.entries(r.data || {})) dd.dataset[k] = String(x);
      u.rows.append(h('div', { class: `row${r.main ? ' main' : ''}${r.note ? ' note' : ''}` }, h('dt', { text: r.label }), dd));
    }
    if (spec.draw) spec.draw(u.plot, out, ctx);
    if (firstResultMs === null) {
      firstResultMs = performance.now();
      document.documentElement.dataset.firstResultMs = firstResultMs.toFixed(1);
      const t = document.getElementById('timing');
      if (t) t.textContent = `First result ${firstResultMs.toFixed(0)} ms after opening.`;
    }
  }
  function runAll() { for (const s of specs) if (!s.planned) run(s); }

  // ---- page controls -------------------------------------------------------
  function applyTheme() {
    const root = document.documentElement;
    if (state.theme === 'auto') delete root.dataset.theme; else root.dataset.theme = state.theme;
    document.getElementById('theme').textContent = `Theme: ${state.theme}`;
  }
  function applySystem() {
    for (const r of document.querySelectorAll('#system input')) r.checked = r.value === state.system;
  }
  function refill() {
    for (const s of specs) {
      const u = ui.get(s.id);
      if (!u) continue;
      for (const [key, w] of u.fields) {
        const v = state.inputs[s.id]?.[key];
        if (w.spec.type === 'check') { if (typeof v === 'boolean') w.control.checked = v; } else if (typeof v === 'string') w.control.value = v;
      }
    }
  }
  function controls() {
    for (const r of document.querySelectorAll('#system input')) {
      r.addEventListener('change', () => { state.system = r.value; save(); runAll(); });
    }
    document.getElementById('theme').addEventListener('click', () => {
      state.theme = { auto: 'light', light: 'dark', dark: 'auto' }[state.theme];
      applyTheme(); save();
    });
    document.getElementById('export').addEventListener('click', () => {
      const blob = new Blob([JSON.stringify(snapshot(), null, 2)], { type: 'application/json' });
      const a = h('a', { href: URL.createObjectURL(blob), download: 'echoline-inputs.json' });
      document.body.append(a); a.click(); a.remove();
      setTimeout(() => URL.revokeObjectURL(a.href), 1000);
    });
    document.getElementById('import').addEventListener('change', async (e) => {
      const file = e.target.files && e.target.files[0];
      if (!file) return;
      const boot = document.getElementById('boot');
      try {
        const s = JSON.parse(await file.text());
        if (!s || s.format !== FORMAT) throw new Error('not an Echoline inputs file');
        adopt(s); refill(); applyTheme(); applySystem(); save(); runAll();
        boot.className = 'boot'; boot.textContent = `Loaded inputs from ${file.name}.`;
      } catch (err) {
        boot.className = 'boot failed'; boot.textContent = `Could not load ${file.name}: ${message(err)}`;
      }
      e.target.value = '';
    });
    document.getElementById('print').addEventListener('click', () => window.print());
    let resize = 0; // plots are drawn at the width they have: redraw after a resize
    window.addEventListener('resize', () => { clearTimeout(resize); resize = setTimeout(runAll, 150); });
    window.addEventListener('beforeprint', () => {
      const d = new Date();
      const p = (n) => String(n).padStart(2, '0');
      document.getElementById('printed-at').textContent =
        `Echoline report, ${d.getFullYear()}-${p(d.getMonth() + 1)}-${p(d.getDate())} ${p(d.getHours())}:${p(d.getMinutes())}.`;
    });
  }

  /** Starts the page once the core is ready. */
  function start(bindings) {
    core = bindings;
    restore();
    applyTheme();
    applySystem();
    const main = document.getElementById('sections');
    const nav = document.querySelector('#nav ul');
    const later = h('div', { class: 'planned-group', 'aria-label': 'Sections to come' });
    // Build and compute one section at a time: the first figures appear
    // before the later sections are even built.
    for (const s of specs.slice().sort((a, b) => (a.order ?? 50) - (b.order ?? 50))) {
      build(s, main, nav, later);
      if (!s.planned) run(s);
    }
    if (later.childElementCount) main.append(later);
    place = { main, nav, later };
    controls();
    // Plots are drawn at the width their card has; the first cards were drawn
    // before the later ones shared the row with them: draw again once all are in.
    setTimeout(runAll, 0);
    const v = document.getElementById('version');
    if (v) v.textContent = `Core bindings ${core.version()}.`;
  }

  /** A section's saved inputs (strings and booleans), persisted and exported with the rest. */
  function stateOf(id) { return (state.inputs[id] ||= {}); }

  return { section, start, h, ctx, message, stateOf, save, shared: {} };
})();
