// Browser test of the "Fault distance" velocity sources: a dielectric preset
// with its range, datasheet figures, the line of "Line design", and velocity
// calibration from one and from two known lengths, reused as a factor.
import { test, before, after } from 'node:test';
import assert from 'node:assert/strict';
import { join } from 'node:path';
import { open, assertQuiet, artifacts, close, C0 } from './harness.mjs';

let s;
let page;
before(async () => { s = await open(); page = s.page; await page.waitForSelector('#design [data-key="zc"]'); });
after(async () => { await s?.browser.close(); });

const val = async (key, attr = 'data-value') => Number(await page.locator(`#fault [data-key="${key}"]`).getAttribute(attr));
async function set(fields) {
  for (const [k, v] of Object.entries(fields)) {
    if (k === 'by') await page.selectOption('#fault-by', v);
    else if (k.startsWith('design-')) {
      if (k === 'design-geom') await page.selectOption(`#${k}`, v); else await page.fill(`#${k}`, v);
    } else await page.fill(`#fault-${k}`, v);
  }
}
// d = v·t/2 with t the round trip (common practice, no single source).
const half = (v, t) => (v * t) / 2;

test('dielectric preset: its velocity range shown and used', async () => {
  assert.ok(!(await page.locator('#fault-use-cal').isVisible()), 'calibration button only with a calibration');
  await set({ round_trip: '612 ns', by: 'foam-pe' });
  // Foamed PE: VF 0.78–0.88 (timing::presets, common practice, no single source).
  close(await val('velocity_range', 'data-vflo'), 0.78, 1e-9, 'preset VF low');
  close(await val('velocity_range', 'data-vfhi'), 0.88, 1e-9, 'preset VF high');
  const vf = await val('velocity', 'data-vf');
  close(await val('distance'), half(vf * C0, 612e-9), 1e-12, 'distance with the preset');
  assert.match(await page.locator('#fault-by option[value="foam-pe"]').textContent(), /0\.78–0\.88/);
  // The interval covers at least the velocity range at the same round trip.
  assert.ok(await val('interval', 'data-lo') <= half(0.78 * C0, 612e-9));
  assert.ok(await val('interval', 'data-hi') >= half(0.88 * C0, 612e-9));
});

test('datasheet figures: VF 0.83 within 0.81–0.85; a range not around it is refused in place', async () => {
  await set({ by: 'datasheet', ds_vf: '0.83', ds_lo: '0.81', ds_hi: '0.85' });
  close(await val('distance'), half(0.83 * C0, 612e-9), 1e-12, 'datasheet distance');
  await set({ ds_lo: '0.9' });
  assert.match(await page.locator('#fault-ds_lo-error').textContent(), /Datasheet lowest velocity factor/);
  await set({ ds_lo: '0.81' });
});

test('velocity from the line in "Line design"', async () => {
  // An ideal line of VF 0.7: group velocity 0.7·c0 (v = VF·c0).
  await set({ 'design-geom': 'ideal', 'design-z0': '50 ohm', 'design-vf': '0.7', 'design-freq': '10 MHz' });
  await set({ by: 'model', mtol: '1 %' });
  close(await val('velocity', 'data-vf'), 0.7, 1e-6, 'model VF');
  close(await val('distance'), half(0.7 * C0, 612e-9), 1e-6, 'model distance');
  close(await val('velocity_range', 'data-vfhi'), 0.707, 1e-6, 'model +1 %');
  assert.match(await page.locator('#fault [data-key="source"]').textContent(), /ideal line .* group velocity/);
  // A coax with PE (εr 2.25): VF ≈ 1/√2.25 = 0.667 (Pozar, Microwave
  // Engineering, 4th ed., 2012, §2.1; copper walls lower it slightly).
  await set({ 'design-geom': 'coax', 'design-d_in': '1 mm', 'design-d_out': '3.5 mm', 'design-er': '2.25', 'design-tand': '0', 'design-freq': '100 MHz' });
  close(await val('velocity', 'data-vf'), 1 / 1.5, 0.01, 'coax PE velocity factor');
});

test('calibration on one known length, then kept as factor ± tolerance', async () => {
  // v = 2L/t (timing::calibrate, common practice): 100 m, 1.01 µs.
  await set({ by: 'cal1', cal_l1: '100 m', cal_t1: '1.01 us', cal_dl: '0.1 m', dt: '1 ns', rise: '2 ns', round_trip: '612 ns' });
  const v = (2 * 100) / 1.01e-6;
  close(await val('velocity', 'data-vf'), v / C0, 1e-9, 'calibrated VF');
  close(await val('distance'), half(v, 612e-9), 1e-9, 'distance with the calibrated velocity');
  await page.locator('#fault').screenshot({ path: join(artifacts, 'section-fault-calibration.png') });
  assert.ok(await page.locator('#fault-use-cal').isVisible());
  await page.click('#fault-use-cal');
  assert.equal(await page.inputValue('#fault-by'), 'factor');
  close(Number(await page.inputValue('#fault-vf')), v / C0, 1e-5, 'VF kept');
  close(await val('distance'), half(v, 612e-9), 1e-5, 'same distance by factor');
});

test('calibration on two lengths removes the fixture offset', async () => {
  // 50 m and 150 m of VF 0.66 behind a 10 ns fixture: t = t0 + 2L/v; the
  // velocity from the difference, the offset t0 = t1 − 2L1/v (timing::calibrate).
  const v = 0.66 * C0;
  const t1 = 10e-9 + 100 / v;
  const t2 = 10e-9 + 300 / v;
  await set({ by: 'cal2', cal_l1: '50 m', cal_t1: `${t1} s`, cal_l2: '150 m', cal_t2: `${t2} s`, cal_dl: '0.05 m', round_trip: '612 ns' });
  close(await val('velocity', 'data-vf'), 0.66, 1e-9, 'two-length VF');
  close(await val('offset'), 10e-9, 1e-6, 'fixture offset');
  close(await val('distance'), half(v, 612e-9 - 10e-9), 1e-9, 'distance after removing the offset');
  await page.locator('#fault').screenshot({ path: join(artifacts, 'section-fault-two-lengths.png') });
  await set({ cal_l2: '40 m' });
  assert.match(await page.locator('#fault-cal_l2-error').textContent(), /Known length \(second cable\)/);
  await set({ cal_l2: '150 m', by: 'factor' });
});

test('no network, no errors', () => assertQuiet(s.requests, s.problems));
