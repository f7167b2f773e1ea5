// Browser test of the "Line design" section: reference impedances of the
// geometries (the values named in tests/tests/geometry.rs and the reference
// notes), the cutoff and the validity warnings in words, a solved dimension
// and an unreachable target shown in place, a bad entry marked.
import { test, before, after } from 'node:test';
import assert from 'node:assert/strict';
import { join } from 'node:path';
import { open, assertQuiet, artifacts, close, shown, C0 } from './harness.mjs';

let s;
let page;
before(async () => { s = await open(); page = s.page; await page.waitForSelector('#design [data-key="zc"]'); });
after(async () => { await s?.browser.close(); });

const ETA0 = 376.730313668; // μ0·c0, Ω (CODATA 2018)
const val = async (key, attr = 'data-value') => Number(await page.locator(`#design [data-key="${key}"]`).getAttribute(attr));
const text = async (key) => (await page.locator(`#design [data-key="${key}"]`).textContent()).trim();
async function set(fields) {
  for (const [k, v] of Object.entries(fields)) {
    const sel = `#design-${k}`;
    if (['geom', 'sub', 'diel', 'metal'].includes(k)) await page.selectOption(sel, v);
    else await page.fill(sel, v);
  }
}

test('coax: 7 mm airline 50.0085 Ω, TE11 cutoff, solved inner diameter', async () => {
  // IEEE Std 287 7 mm airline, d 3.04 mm, D 7 mm (value from memory):
  // (η0/2π)·ln(D/d) = 50.0085 Ω (reference notes methods.md §1 [calc]).
  await set({ geom: 'coax', d_in: '3.04 mm', d_out: '7 mm', er: '1', tand: '0', metal: 'copper', freq: '10 GHz', target: '50 ohm' });
  close(await val('zc_closed'), 50.0085, 1e-6, 'closed-form Zc');
  close(await val('zc'), 50.0085, 4e-4, 'Zc with copper walls at 10 GHz');
  // TE11: approx 19.01 GHz, exact/approx − 1 = +2.07 % at b/a 2.3 (methods.md §1 [calc]).
  close(await val('cutoff'), 19.01e9 * 1.0207, 1e-3, 'TE11 cutoff');
  // Air line: VF 1 and delay 1/c0 per metre within the skin-effect correction.
  close(await val('vf'), 1, 1e-3, 'velocity factor');
  // d = D·exp(−2π·Z/η0), the inverse of the closed form (methods.md §1).
  close(await val('solve', 'data-m'), 7e-3 * Math.exp((-2 * Math.PI * 50) / ETA0), 1e-9, 'solved d');
  await page.click('#design-use');
  close(await val('zc_closed'), 50, 1e-5, 'Zc after using the solved d');
  await page.locator('#design').screenshot({ path: join(artifacts, 'section-design.png') });
  // 10 kΩ needs D/d beyond 10⁴: unreachable, shown in place, figures kept.
  await set({ target: '10 kohm' });
  assert.match(await text('solve'), /not possible: the target impedance cannot be reached/);
  assert.ok(Number.isFinite(await val('zc')), 'figures still shown');
});

test('microstrip εr 9.8, W/h 1: 49.29 Ω; 50 Ω width 0.9711 h', async () => {
  // Hammerstad & Jensen 1980 (reference notes methods.md §2 [calc]): 49.289 Ω
  // static, t = 0; the 50 Ω width W/h 0.9711 (static, same notes).
  await set({ geom: 'microstrip', w: '1 mm', h: '1 mm', t: '0 mm', er: '9.8', tand: '0', metal: 'perfect', freq: '1 MHz', target: '50 ohm' });
  close(await val('zc'), 49.289, 1e-4, 'microstrip Zc');
  await set({ freq: '0 Hz' });
  close(await val('solve'), 0.9711, 5e-4, 'solved width (mm, h = 1 mm)');
  assert.equal(await text('valid'), 'within the formulas’ range at this frequency');
  // W/h 0.05 is outside the published range of the formulas: said in words.
  await set({ w: '0.05 mm', freq: '1 MHz' });
  assert.match(await page.locator('#design .rows').textContent(), /outside the published range of the formula/);
  await set({ w: '1 mm' });
});

test('two-wire in air, D/d 2: 157.93 Ω', async () => {
  // Z0 = (η/π)·arcosh(D/d): 157.93 Ω at D/d 2 in air (methods.md §5 [calc]).
  await set({ geom: 'two-wire', wire: '1 mm', spacing: '2 mm', er: '1', tand: '0', metal: 'perfect', freq: '1 MHz', target: '300 ohm' });
  close(await val('zc'), (ETA0 / Math.PI) * Math.acosh(2), 1e-6, 'two-wire Zc');
  close(await val('zc'), 157.93, 5e-5, 'two-wire Zc, reference digits');
  // 300 Ω in air at D/d 6.1428 (same notes).
  close(await val('solve'), 6.1428, 1e-4, 'solved spacing (mm, d = 1 mm)');
  assert.equal(await text('cutoff'), 'none in this model');
});

test('stripline and coplanar waveguide in air', async () => {
  // Stripline W/b 1, t 0: Cohn 1954 exact Z·√εr = 65.354 Ω (methods.md §3 [calc]).
  await set({ geom: 'stripline', w: '1 mm', b: '1 mm', t: '0 mm', er: '1', tand: '0', metal: 'perfect', freq: '1 MHz', target: '50 ohm' });
  close(await val('zc'), 65.354, 1e-4, 'stripline Zc');
  // CPW, thick substrate, k = S/(S + 2W) = 0.5: 120.568 Ω with 30π for η0/4
  // (Wen 1969; methods.md §4 [calc]), i.e. 120.568·η0/(120π).
  await set({ geom: 'cpw', sub: 'thick', s: '1 mm', slot: '0.5 mm' });
  close(await val('zc'), (120.568 * ETA0) / (120 * Math.PI), 1e-5, 'CPW Zc');
  // The solved slot gives the target back (line::synth inverts the model).
  const slot = await val('solve');
  await page.click('#design-use');
  close(Number((await page.inputValue('#design-slot')).split(' ')[0]), slot, 1e-5, 'slot filled in');
  close(await val('zc'), 50, 1e-4, 'CPW at the solved slot');
});

test('waveguide: TE10 cutoff and the evanescent warning below it', async () => {
  // TE10 fc = c/(2a√εr) (methods.md §5): WR-90, a = 22.86 mm → 6.557 GHz.
  await set({ geom: 'waveguide', wg_a: '22.86 mm', wg_b: '10.16 mm', er: '1', tand: '0', metal: 'copper', freq: '10 GHz' });
  close(await val('cutoff'), C0 / (2 * 22.86e-3), 1e-9, 'TE10 cutoff');
  // Above cutoff: λg = λ/√(1 − (fc/f)²) (methods.md §5).
  const lam = C0 / 10e9;
  close(await val('wavelength'), lam / Math.sqrt(1 - (C0 / (2 * 22.86e-3) / 10e9) ** 2), 1e-3, 'guide wavelength');
  await set({ freq: '5 GHz' });
  assert.match(await page.locator('#design .rows').textContent(), /evanescent and does not propagate/);
});

test('ideal line and datasheet cable; a bad entry is marked in place', async () => {
  await set({ geom: 'ideal', z0: '75 ohm', vf: '0.8', freq: '100 MHz' });
  // v = VF·c0, delay 1/v (common practice, no single source).
  close(await val('delay'), 1 / (0.8 * C0), 1e-12, 'ideal delay per metre');
  await set({ geom: 'datasheet', z0: '50 ohm', vf: '0.85', f1: '100 MHz', a1: '6.6', f2: '1 GHz', a2: '22', freq: '100 MHz' });
  // The datasheet figure is what the model gives back at its own frequency.
  close(await val('loss'), 6.6, 0.01, 'datasheet loss at 100 MHz');
  await set({ geom: 'coax', d_in: '8 mm', d_out: '7 mm' });
  assert.match(await page.locator('#design-d_in-error').textContent(), /Inner conductor diameter/);
  await set({ d_in: '3.04 mm' });
  assert.equal(await page.locator('#design-d_in-error').textContent(), '');
});

test('no network, no errors', () => assertQuiet(s.requests, s.problems));
