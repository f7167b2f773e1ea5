// Browser test of the "Simulation" section: the trace of a described cable
// against the textbook levels (open +1, short −1, R → Γ), a lumped fault,
// the row editor, a bad row, the overlay on a loaded trace, and handing the
// simulated trace to the trace analysis.
import { test, before, after } from 'node:test';
import assert from 'node:assert/strict';
import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { open, assertQuiet, artifacts, close, C0 } from './harness.mjs';

let s;
let page;
before(async () => { s = await open(); page = s.page; });
after(async () => { await s?.browser.close(); });

// The rows live among the page's saved inputs (localStorage 'echoline.page.v1').
async function setRows(rows) {
  await page.evaluate((r) => {
    const s = JSON.parse(localStorage.getItem('echoline.page.v1') || '{"format":"echoline-page-inputs","version":1,"inputs":{}}');
    s.inputs.simulation = { ...(s.inputs.simulation || {}), rows: JSON.stringify(r) };
    localStorage.setItem('echoline.page.v1', JSON.stringify(s));
  }, rows);
  await page.reload();
  await page.waitForSelector('#simulation [data-key="samples"]');
}
async function found() {
  return page.$$eval('#simulation .rows dd[data-kind]', (dd) => dd.map((d) => ({
    kind: d.dataset.kind, d: Number(d.dataset.value), lo: Number(d.dataset.lo), hi: Number(d.dataset.hi),
    gamma: Number(d.dataset.gamma), settled: Number(d.dataset.settled), c: d.dataset.c === '' ? null : Number(d.dataset.c), text: d.textContent,
  })));
}
// Γ = (ZL − Z0)/(ZL + Z0): open +1, short −1 (Pozar, Microwave Engineering,
// 4th ed., 2012, §2.3); d = v·t/2 (common practice, no single source).
const gammaOf = (zl, z0) => (zl - z0) / (zl + z0);

test('open, short and resistive ends settle at Γ = +1, −1, (R − Z0)/(R + Z0)', async () => {
  await setRows([{ kind: 'section', len: '30 m', z0: '50 Ω', vf: '0.66' }]);
  await page.selectOption('#simulation-end', 'open');
  let ev = await found();
  assert.equal(ev.length, 1);
  assert.equal(ev[0].kind, 'OpenEnd');
  assert.ok(ev[0].lo <= 30 && 30 <= ev[0].hi, `30 m in [${ev[0].lo}, ${ev[0].hi}]`);
  close(ev[0].settled, 1, 0, 'open settles at +1', 0.02);
  await page.selectOption('#simulation-end', 'short');
  ev = await found();
  assert.equal(ev[0].kind, 'Short');
  close(ev[0].settled, -1, 0, 'short settles at −1', 0.02);
  await page.selectOption('#simulation-end', 'r');
  await page.fill('#simulation-end_r', '150 ohm');
  ev = await found();
  close(ev[0].gamma, gammaOf(150, 50), 0, 'Γ of 150 Ω on 50 Ω', 0.02);
  assert.ok(ev[0].lo <= 30 && 30 <= ev[0].hi);
  await page.selectOption('#simulation-end', 'matched');
  ev = await found();
  assert.deepEqual(ev.map((e) => e.kind), ['EndOfTrace'], 'a matched end reflects nothing');
  await page.selectOption('#simulation-end', 'open');
});

test('the row editor: add, change kind, remove; a shunt C is found and sized', async () => {
  await page.click('#sim-add');
  await page.selectOption('#sim-row2-kind', 'shunt_c');
  await page.fill('#sim-row2-v', '47 pF');
  await page.click('#sim-add');
  await page.fill('#sim-row3-len', '20 m');
  let ev = await found();
  assert.deepEqual(ev.map((e) => e.kind), ['Capacitive', 'OpenEnd']);
  assert.ok(ev[0].lo <= 30 && 30 <= ev[0].hi, 'the C at 30 m');
  // C = −2A/(Z·V_inc) from the dip area (Johnson & Graham, High-Speed Digital
  // Design, 1993, value from memory): the row's 47 pF within 10 %.
  close(ev[0].c, 47e-12, 0.1, 'shunt C');
  // The open end at 50 m, seen a little later: the shunt C delays what comes
  // after it by up to its time constant τ = C·Z0/2 = 1.2 ns each way, so up to
  // 2τ on the round trip, 0.23 m at VF 0.66 (first-order RC low-pass between
  // equal lines; common practice, no single source).
  const tau = (47e-12 * 50) / 2;
  assert.ok(ev[1].d >= 50 && ev[1].d <= 50 + (0.66 * C0 * 2 * tau) / 2 + 0.03, `open end at ${ev[1].d} m`);
  await page.click('button[aria-label="Remove row 2"]');
  ev = await found();
  assert.deepEqual(ev.map((e) => e.kind), ['OpenEnd']);
  // Rows persist across a reload, and travel in the exported inputs file.
  await page.reload();
  await page.waitForSelector('#simulation [data-key="samples"]');
  assert.equal(await page.inputValue('#sim-row2-len'), '20 m');
  const [download] = await Promise.all([page.waitForEvent('download'), page.click('#export')]);
  const saved = JSON.parse(readFileSync(await download.path(), 'utf8'));
  const rows = JSON.parse(saved.inputs.simulation.rows);
  assert.deepEqual(rows.map((r) => r.kind), ['section', 'section']);
  rows[1].len = '25 m';
  saved.inputs.simulation.rows = JSON.stringify(rows);
  const file = join(artifacts, 'inputs-simulation.json');
  writeFileSync(file, JSON.stringify(saved));
  await page.setInputFiles('#import', file);
  await page.waitForFunction(() => document.querySelector('#sim-row2-len')?.value === '25 m');
  ev = await found();
  assert.ok(ev[0].lo <= 55 && 55 <= ev[0].hi, 'open end at 30 + 25 m after the import');
  await page.locator('#simulation').screenshot({ path: join(artifacts, 'section-simulation-rows.png') });
});

test('a bad row value is named and marked; the last trace stays', async () => {
  const before = await page.locator('#simulation [data-key="samples"]').textContent();
  await page.fill('#sim-row1-len', '30 q');
  assert.match(await page.locator('#simulation .status').textContent(), /^Row 1, length: column 4: expected a unit of length/);
  assert.ok(await page.locator('#sim-row1-len.bad').count() === 1);
  assert.equal(await page.locator('#simulation [data-key="samples"]').textContent(), before);
  await page.fill('#sim-row1-len', '-3 m');
  assert.match(await page.locator('#simulation .status').textContent(), /^A cable row: length_m must not be negative/);
  await page.fill('#sim-row1-len', '30 m');
  assert.equal(await page.locator('#simulation .status').textContent(), '');
});

test('overlay on the demo trace: the demo feeder hypothesis matches its events', async () => {
  await page.click('#sim-reset');
  await page.click('#trace-demo');
  await page.waitForSelector('#simulation-plot[data-overlay^="demo trace"]');
  const sim = await found();
  const demo = await page.$$eval('#trace-events tbody tr', (trs) => trs.map((t) => ({ kind: t.dataset.kind, d: Number(t.dataset.distanceM) })));
  assert.deepEqual(sim.map((e) => e.kind), demo.map((e) => e.kind));
  sim.forEach((e, i) => assert.ok(e.lo <= demo[i].d && demo[i].d <= e.hi, `event ${i + 1}: ${demo[i].d} in [${e.lo}, ${e.hi}]`));
  assert.equal(await page.locator('#simulation-plot svg path.band.today').count(), 1, 'loaded trace drawn under');
  await page.locator('#simulation').screenshot({ path: join(artifacts, 'section-simulation.png') });
  await page.evaluate(() => { document.documentElement.dataset.theme = 'dark'; });
  await page.locator('#simulation').screenshot({ path: join(artifacts, 'section-simulation-dark.png') });
  await page.evaluate(() => { delete document.documentElement.dataset.theme; });
});

test('the simulated trace can be analysed in Trace analysis', async () => {
  await page.fill('#sim-row1-len', '40 m');
  await page.click('#sim-send');
  await page.waitForFunction(() => /Loaded simulated\.csv as the trace/.test(document.querySelector('#trace-file-msg').textContent));
  const first = await page.$eval('#trace-events tbody tr', (t) => ({ lo: Number(t.dataset.loM), hi: Number(t.dataset.hiM), kind: t.dataset.kind }));
  assert.equal(first.kind, 'Capacitive');
  // The C now sits at 40 m; the trace section uses its own VF 0.66 ± 0.01.
  assert.ok(first.lo <= 40 && 40 <= first.hi, `40 m in [${first.lo}, ${first.hi}]`);
  // Its time axis: 2048 samples at 1 ns, as simulated.
  assert.match(await page.locator('#trace-file-msg').textContent(), /2,048 samples/);
});

test('simulation section: no network, no errors', () => assertQuiet(s.requests, s.problems));
