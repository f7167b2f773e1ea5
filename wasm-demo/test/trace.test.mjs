// Browser test of the "Trace analysis" section: demo CSV through the file
// input and by drag-and-drop, events against the invented scenario's truth,
// cursor distance, baseline differences, profile, bad and huge files,
// exports, responsiveness on a 16,384-sample trace, print.
import { test, before, after } from 'node:test';
import assert from 'node:assert/strict';
import { readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { open, assertQuiet, artifacts, close, shown, C0, FT } from './harness.mjs';

let s;
let page;
before(async () => { s = await open(); page = s.page; });
after(async () => { await s?.browser.close(); });

// The demo scenario, as simulated by the core (wasm-demo/src/trace.rs): 120 m
// of 50 Ω line, VF 0.66, a 30 pF shunt C at 42 m, 38 Ω from 78 m to 82 m,
// open end. These are the scenario's own figures, not detector output.
const SCENE = { c_m: 42, c_f: 30e-12, wet_from_m: 78, wet_to_m: 82, wet_ohm: 38, end_m: 120, z0: 50, vf: 0.66 };
// Step reflection ρ = (Z2 − Z1)/(Z2 + Z1) (Pozar, Microwave Engineering, 4th ed., 2012, §2.3).
const rhoStep = (z1, z2) => (z2 - z1) / (z2 + z1);

async function events() {
  return page.$$eval('#trace-events tbody tr', (trs) => trs.map((tr) => ({
    kind: tr.dataset.kind, d: Number(tr.dataset.distanceM), lo: Number(tr.dataset.loM), hi: Number(tr.dataset.hiM),
    rho: Number(tr.dataset.rho), z: tr.dataset.z, c: tr.dataset.c === '' ? null : Number(tr.dataset.c),
    text: [...tr.cells].map((c) => c.textContent),
  })));
}
async function csvFile(name, text) {
  const p = join(artifacts, name);
  writeFileSync(p, text);
  return p;
}

test('caution visible before any analysis; empty state', async () => {
  assert.ok(await page.locator('#caution').isVisible());
  assert.match(await page.locator('#trace-caution').textContent(), /de-energise, discharge and lock out/);
  assert.ok(await page.locator('#trace-caution').isVisible());
  assert.equal((await page.locator('#trace [data-key="state"]').textContent()).trim(), 'none loaded');
  assert.equal(await page.locator('#trace-events').count(), 0);
});

test('demo CSV through the file input: events where the scenario puts them', async () => {
  const csv = await page.evaluate(() => wasm_bindgen.demo_csv(false));
  assert.match(csv, /^# Echoline trace\ntime_s,volts\n/);
  await page.setInputFiles('#trace-file', await csvFile('demo-trace.csv', csv));
  await page.waitForSelector('#trace-events tbody tr');
  assert.match(await page.locator('#trace-file-msg').textContent(), /Loaded demo-trace\.csv as the trace: 2,048 samples/);
  const ev = await events();
  assert.deepEqual(ev.map((e) => e.kind), ['Capacitive', 'ImpedanceDown', 'ImpedanceUp', 'OpenEnd']);
  const truth = [SCENE.c_m, SCENE.wet_from_m, SCENE.wet_to_m, SCENE.end_m];
  ev.forEach((e, i) => {
    // The scenario's position lies inside the interval shown, and the best
    // estimate within half a metre of it.
    assert.ok(e.lo <= truth[i] && truth[i] <= e.hi, `event ${i + 1}: ${truth[i]} m not in [${e.lo}, ${e.hi}]`);
    close(e.d, truth[i], 0, `event ${i + 1} distance`, 0.5);
    const [best, lo, hi] = e.text[2].replace(/[()–]/g, ' ').trim().split(/\s+/).map(Number);
    close(best, e.d, 5e-4, 'shown distance');
    close(lo, e.lo, 5e-4, 'shown lower end');
    close(hi, e.hi, 5e-4, 'shown upper end');
    close(shown(e.text[3]), e.d / FT, 5e-4, 'in feet');
  });
  close(ev[1].rho, rhoStep(SCENE.z0, SCENE.wet_ohm), 0, 'ρ into the wet stretch', 0.005);
  close(Number(ev[1].z), SCENE.wet_ohm, 0, 'impedance after', 0.5);
  assert.match(ev[1].text[5], /^38\.\d+ Ω$/);
  // Lumped C from the dip area, C = −2A/(Z·V_inc) (Johnson & Graham, High-Speed
  // Digital Design, 1993, value from memory): the scenario's 30 pF within 10 %.
  close(ev[0].c, SCENE.c_f, 0.1, 'shunt C');
  assert.match(ev[0].text[6], /pF$/);
  // The far end: Γ after it near +1 (an open), so a high impedance reading.
  assert.equal(ev[3].text[1], 'open end');
  assert.ok(ev[3].z === 'open' || Number(ev[3].z) > 1000, `far end impedance ${ev[3].z}`);
  await page.waitForSelector('#trace-profile-note');
  assert.match(await page.locator('#trace-profile-note').textContent(), /^\d+ cells, ends in an open\.$/);
  await page.locator('#trace').screenshot({ path: join(artifacts, 'section-trace.png') });
});

test('cursor readout: distance d = v·(t − t0)/2 from the core', async () => {
  const t0 = Number(await page.locator('#trace [data-key="t0"]').getAttribute('data-value'));
  const svg = page.locator('#trace .fig svg.cursorable');
  await svg.focus();
  for (let i = 0; i < 30; i++) await page.keyboard.press('ArrowRight');
  const r = page.locator('#trace-cursor');
  const t = Number(await r.getAttribute('data-time'));
  const d = Number(await r.getAttribute('data-distance'));
  // d = v·t/2 with v = VF·c0 (common practice, no single source).
  close(d, (0.66 * C0 * (t - t0)) / 2, 1e-9, 'cursor distance');
  assert.match(await r.textContent(), /round trip .* → [0-9.]+ m \([0-9.]+ to [0-9.]+ m\)/);
  close(shown((await r.textContent()).split('→')[1]), d, 5e-4, 'cursor distance shown');
  // Clicking a table row puts the cursor on that event.
  await page.click('#trace-events tbody tr:nth-child(2)');
  const ev = await events();
  close(Number(await r.getAttribute('data-distance')), ev[1].d, 1e-9, 'cursor on event 2');
});

test('baseline by drag-and-drop: differences listed', async () => {
  const base = await page.evaluate(() => wasm_bindgen.demo_csv(true));
  const today = await page.evaluate(() => wasm_bindgen.demo_csv(false));
  const dt = await page.evaluateHandle(([a, b]) => {
    const d = new DataTransfer();
    d.items.add(new File([a], 'dropped-trace.csv', { type: 'text/csv' }));
    d.items.add(new File([b], 'dropped-baseline.csv', { type: 'text/csv' }));
    return d;
  }, [today, base]);
  await page.dispatchEvent('#trace', 'drop', { dataTransfer: dt });
  await page.waitForSelector('#trace-changes li');
  const changes = await page.$$eval('#trace-changes li', (li) => li.map((x) => ({ kind: x.dataset.kind, d: Number(x.dataset.distanceM), text: x.textContent })));
  assert.deepEqual(changes.map((c) => c.kind), ['new', 'new', 'new', 'moved']);
  close(changes[0].d, SCENE.c_m, 0, 'new event at the crush', 0.5);
  assert.match(changes[3].text, /^moved: open end at 120\.\d m, shifted/);
  assert.equal(await page.locator('#trace [data-key="changes"]').getAttribute('data-value'), '4');
  await page.waitForSelector('#trace-profile-note');
  assert.equal(await page.locator('#trace-profile svg path.series.base').count(), 1, 'baseline profile overlaid');
  assert.equal(await page.locator('#trace .fig svg path.band.base').count(), 1, 'baseline trace overlaid');
  await page.locator('#trace').screenshot({ path: join(artifacts, 'section-trace-baseline.png') });
});

test('events export as CSV and JSON', async () => {
  const ev = await events();
  const [csvDl] = await Promise.all([page.waitForEvent('download'), page.click('#trace-export-csv')]);
  const lines = readFileSync(await csvDl.path(), 'utf8').trim().split('\n');
  assert.match(lines[0], /^n,kind,distance_m,lo_m,hi_m,distance_ft/);
  assert.equal(lines.length, ev.length + 1);
  assert.equal(Number(lines[2].split(',')[2]), ev[1].d);
  const [jsonDl] = await Promise.all([page.waitForEvent('download'), page.click('#trace-export-json')]);
  const j = JSON.parse(readFileSync(await jsonDl.path(), 'utf8'));
  assert.equal(j.format, 'echoline-trace-events');
  assert.equal(j.today.events.length, ev.length);
  assert.equal(j.today.events[3].distance_m, ev[3].d);
  assert.equal(j.changes.length, 4);
});

test('metres/feet toggle reaches the table and the cursor', async () => {
  await page.click('#system label:has(input[value="imperial"])');
  const ev = await events();
  const [best] = ev[0].text[2].split(' ');
  close(Number(best), ev[0].d / FT, 5e-4, 'distance in feet');
  assert.match(await page.locator('#trace-cursor').textContent(), / ft\)$/);
  await page.click('#system label:has(input[value="metric"])');
});

test('a bad file is refused naming its line, leaving a clean state', async () => {
  let bad = '# a bad trace\ntime_s,volts\n';
  for (let i = 0; i < 40; i++) bad += `${i}e-9,${i === 6 ? 'oops' : 0.5}\n`;
  await page.setInputFiles('#trace-file', await csvFile('bad-trace.csv', bad));
  await page.waitForFunction(() => /not loaded/.test(document.querySelector('#trace-file-msg').textContent));
  // Comment line 1, header line 2, sample i on line i + 3: "oops" on line 9, column 6.
  assert.equal(await page.locator('#trace-file-msg').textContent(),
    'bad-trace.csv not loaded: line 9, column 6: expected a number. No trace is loaded now.');
  assert.equal(await page.locator('#trace-events').count(), 0, 'no stale table');
  assert.equal((await page.locator('#trace [data-key="state"]').textContent()).trim(), 'none loaded');
  await page.locator('#trace').screenshot({ path: join(artifacts, 'section-trace-bad-file.png') });
  // Uneven times name the line too.
  let uneven = 'time_s,volts\n';
  for (let i = 0; i < 40; i++) uneven += `${(i === 20 ? 20.5 : i) * 1e-9},0\n`;
  await page.setInputFiles('#trace-file', await csvFile('uneven.csv', uneven));
  await page.waitForFunction(() => /line 22, column 1: expected evenly spaced/.test(document.querySelector('#trace-file-msg').textContent));
});

test('a huge file is refused with a message', async () => {
  // Over 1,000,000 samples (2 MB of text): refused by the core's parser.
  await page.setInputFiles('#trace-file', await csvFile('many.csv', '0\n'.repeat(1_000_001)));
  await page.waitForFunction(() => /not loaded/.test(document.querySelector('#trace-file-msg').textContent), null, { timeout: 20000 });
  assert.match(await page.locator('#trace-file-msg').textContent(), /more than 1,000,000 samples/);
  // Over 20 MB: refused before it is read.
  const big = join(tmpdir(), 'echoline-huge.csv');
  writeFileSync(big, Buffer.alloc(21 * 1024 * 1024, 0x30));
  await page.setInputFiles('#trace-file', big);
  await page.waitForFunction(() => /larger than 20 MB/.test(document.querySelector('#trace-file-msg').textContent));
  assert.equal(await page.locator('#trace-events').count(), 0);
});

test('a 16,384-sample trace: analysis and profile never block 50 ms', async () => {
  // An invented trace: launch at sample 200, a step to 75 Ω (Γ = 0.2, level
  // 1.2 V) at sample 9000, noise from a fixed pseudo-random sequence.
  let x = 12345;
  const rnd = () => { x = (1103515245 * x + 12345) % 2147483648; return x / 2147483648 - 0.5; };
  let csv = 'time_s,volts\n';
  for (let i = 0; i < 16384; i++) csv += `${(i * 0.5e-9).toExponential(6)},${(i >= 9000 ? 1.2 : i >= 200 ? 1 : 0) + 0.004 * rnd()}\n`;
  await page.evaluate(() => {
    window.__long = [];
    new PerformanceObserver((l) => { for (const e of l.getEntries()) window.__long.push(e.duration); }).observe({ type: 'longtask' });
  });
  await page.click('#trace-clear-base');
  await page.setInputFiles('#trace-file', await csvFile('long-trace.csv', csv));
  await page.waitForSelector('#trace-profile-note');
  await page.waitForTimeout(200);
  const long = await page.evaluate(() => window.__long);
  console.log(`# long tasks while loading and analysing 16,384 samples: ${JSON.stringify(long.map((d) => Math.round(d)))}`);
  assert.deepEqual(long.filter((d) => d > 50), [], 'tasks over 50 ms');
  const ev = await events();
  // d = v·t/2: 8800 samples of 0.5 ns after the launch at VF 0.66.
  const ref = (0.66 * C0 * 8800 * 0.5e-9) / 2;
  assert.ok(ev[0].lo <= ref && ref <= ev[0].hi, `step at ${ref} m within [${ev[0].lo}, ${ev[0].hi}]`);
  close(ev[0].rho, rhoStep(50, 75), 0, 'ρ of the 75 Ω step', 0.005);
  assert.match(await page.locator('#trace-profile-note').textContent(), /averaged in blocks of 8/);
});

test('dark theme, print report with inputs, plots, table and caution', async () => {
  await page.click('#trace-demo');
  await page.click('#trace-demo-base');
  await page.waitForSelector('#trace-profile-note');
  await page.evaluate(() => { document.documentElement.dataset.theme = 'dark'; });
  await page.locator('#trace').screenshot({ path: join(artifacts, 'section-trace-dark.png') });
  await page.evaluate(() => { delete document.documentElement.dataset.theme; });
  await page.emulateMedia({ media: 'print' });
  assert.ok(await page.locator('#caution').isVisible(), 'caution printed');
  assert.ok(await page.locator('#trace-events').isVisible(), 'event table printed');
  // The print layout resizes the page, which redraws the plots (the profile
  // in steps after the frame): wait for it.
  await page.waitForSelector('#trace-profile svg', { state: 'visible', timeout: 5000 });
  assert.ok(await page.locator('#trace-profile svg').isVisible(), 'profile printed');
  assert.ok(await page.locator('#trace-vf').isVisible(), 'inputs printed');
  assert.ok(!(await page.locator('#trace-demo').isVisible()), 'buttons not printed');
  await page.locator('#trace').screenshot({ path: join(artifacts, 'section-trace-print.png') });
  await page.emulateMedia({ media: 'screen' });
});

test('trace section: no network, no errors', () => assertQuiet(s.requests, s.problems));
