// Browser test of the "Termination" section: input impedance, Γ, VSWR and
// return loss against the textbook formulas, open/short/matched shown in
// words, a series resonance, a bad entry, the Smith chart.
import { test, before, after } from 'node:test';
import assert from 'node:assert/strict';
import { join } from 'node:path';
import { open, assertQuiet, artifacts, close, shown, C0 } from './harness.mjs';

let s;
let page;
before(async () => { s = await open(); page = s.page; });
after(async () => { await s?.browser.close(); });

// Complex arithmetic for the reference values.
const cx = (re, im = 0) => ({ re, im });
const add = (a, b) => cx(a.re + b.re, a.im + b.im);
const sub = (a, b) => cx(a.re - b.re, a.im - b.im);
const mul = (a, b) => cx(a.re * b.re - a.im * b.im, a.re * b.im + a.im * b.re);
const div = (a, b) => { const d = b.re * b.re + b.im * b.im; return cx((a.re * b.re + a.im * b.im) / d, (a.im * b.re - a.re * b.im) / d); };
const abs = (a) => Math.hypot(a.re, a.im);
// Lossless line input impedance Zin = Z0 (ZL + jZ0 tan βl)/(Z0 + jZL tan βl),
// β = 2πf/(VF·c0) (Pozar, Microwave Engineering, 4th ed., 2012, §2.3, eq. 2.44).
function zinRef(zl, z0, vf, len, f) {
  const t = Math.tan((2 * Math.PI * f * len) / (vf * C0));
  return mul(cx(z0), div(add(zl, mul(cx(0, z0), cx(t))), add(cx(z0), mul(cx(0, t), zl))));
}
// Γ = (Z − Zr)/(Z + Zr), VSWR = (1+|Γ|)/(1−|Γ|), RL = −20 log10|Γ| (same source).
const gammaOf = (z, zr) => div(sub(z, cx(zr)), add(z, cx(zr)));

async function data(key, attr = 'data-value') {
  return page.locator(`#termination [data-key="${key}"]`).getAttribute(attr);
}
async function set(fields) {
  for (const [k, v] of Object.entries(fields)) {
    const sel = `#termination-${k}`;
    if (typeof v === 'boolean') { if (v) await page.check(sel); else await page.uncheck(sel); } else if (['load', 'line'].includes(k)) await page.selectOption(sel, v);
    else await page.fill(sel, v);
  }
}

test('100 Ω through a line: Zin, Γ, VSWR and return loss match the formulas', async () => {
  await set({ load: 'r', r: '100 ohm', line: 'lossless', z0: '50 ohm', vf: '0.66', len: '0.5 m', zref: '50 ohm', fr: '100 MHz' });
  const z = zinRef(cx(100), 50, 0.66, 0.5, 100e6);
  close(Number(await data('zin')), z.re, 1e-9, 'Re Zin');
  close(Number(await data('zin', 'data-im')), z.im, 1e-9, 'Im Zin', 1e-9);
  const g = gammaOf(z, 50);
  close(Number(await data('gamma', 'data-re')), g.re, 1e-9, 'Re Γ', 1e-12);
  close(Number(await data('gamma', 'data-im')), g.im, 1e-9, 'Im Γ', 1e-12);
  // |Γ| of a lossless line is that of the load: (100 − 50)/(100 + 50) = 1/3.
  close(Number(await data('gamma')), 1 / 3, 1e-9, '|Γ|');
  close(Number(await data('vswr')), 2, 1e-9, 'VSWR');
  close(Number(await data('rl')), 20 * Math.log10(3), 1e-9, 'return loss');
  assert.equal((await page.locator('#termination [data-key="vswr"]').textContent()).trim(), '2.000');
  assert.equal((await page.locator('#termination [data-key="rl"]').textContent()).trim(), '9.542 dB');
  const zt = (await page.locator('#termination [data-key="zin"]').textContent()).trim();
  close(shown(zt), z.re, 5e-4, 'Re Zin shown');
  // The readout point on the Smith chart is the core's Γ.
  close(Number(await page.locator('#smith-readout').getAttribute('data-re')), g.re, 1e-9, 'Smith point', 1e-12);
  await page.locator('#termination').screenshot({ path: join(artifacts, 'section-termination.png') });
});

test('quarter-wave line inverts the load: Zin = Z0²/ZL', async () => {
  // λ/4 at 100 MHz with VF 0.66 (Pozar 2012 §2.5): 25 Ω for 100 Ω on 50 Ω.
  const len = (0.66 * C0) / 100e6 / 4;
  await set({ len: `${len} m` });
  close(Number(await data('zin')), 25, 1e-9, 'quarter-wave Zin');
  close(Number(await data('zin', 'data-im')), 0, 0, 'quarter-wave Im Zin', 1e-6);
});

test('open, short and matched loads are shown in words, never NaN', async () => {
  await set({ load: 'open', len: '0.5 m' });
  assert.equal((await page.locator('#termination [data-key="vswr"]').textContent()).trim(), '∞ (all reflected)');
  assert.equal(await data('vswr', 'data-inf'), '1');
  assert.equal((await page.locator('#termination [data-key="rl"]').textContent()).trim(), '0 dB');
  // An open line: Zin = −jZ0·cot βl (Pozar 2012 §2.3).
  const cot = 1 / Math.tan((2 * Math.PI * 100e6 * 0.5) / (0.66 * C0));
  close(Number(await data('zin', 'data-im')), -50 * cot, 1e-9, 'open line reactance');
  await set({ fr: '0 Hz', f0: '0 Hz' });
  assert.equal((await page.locator('#termination [data-key="zin"]').textContent()).trim(), 'open (∞)');
  assert.equal(await data('zin', 'data-open'), '1');
  assert.match(await page.locator('#termination-vswr figcaption').textContent(), /∞ at every frequency/);
  await page.locator('#termination').screenshot({ path: join(artifacts, 'section-termination-open.png') });
  await set({ load: 'short', fr: '100 MHz', f0: '1 MHz' });
  const zs = zinRef(cx(0), 50, 0.66, 0.5, 100e6);
  close(Number(await data('zin', 'data-im')), zs.im, 1e-9, 'shorted line reactance jZ0 tan βl');
  assert.equal((await page.locator('#termination [data-key="vswr"]').textContent()).trim(), '∞ (all reflected)');
  await set({ load: 'r', r: '50 ohm' });
  assert.equal((await page.locator('#termination [data-key="rl"]').textContent()).trim(), '∞ dB (matched)');
  assert.equal((await page.locator('#termination [data-key="vswr"]').textContent()).trim(), '1.000');
  assert.ok(!/NaN|undefined/.test(await page.locator('#termination').textContent()), 'no NaN shown');
});

test('series R–L–C at resonance reads R', async () => {
  // f0 = 1/(2π√(LC)) (circuit theory; Pozar 2012 §6.1), zero line length.
  const f0 = 1 / (2 * Math.PI * Math.sqrt(1e-6 * 1e-9));
  await set({ load: 'series', r: '20 ohm', l: '1 uH', c: '1 nF', use_r: true, use_l: true, use_c: true, len: '0 m', fr: `${f0} Hz` });
  close(Number(await data('zin')), 20, 1e-9, 'R at resonance');
  close(Number(await data('zin', 'data-im')), 0, 0, 'X at resonance', 1e-6);
  // R + jX directly on an RLGC line with R = G = 0 and √(L/C) = 50 Ω
  // (Pozar 2012 §2.1): matched, so |Γ| is rounding only (return loss > 200 dB).
  await set({ load: 'rx', r: '50 ohm', x: '0 ohm', line: 'rlgc', rl: '0 ohm', ll: '250 nH', gl: '0 S', cl: '100 pF', len: '3 m', fr: '10 MHz' });
  assert.ok(Number(await data('gamma')) < 1e-9, 'matched RLGC line');
  const rl = await data('rl');
  assert.ok(rl === null || Number(rl) > 200, `return loss ${rl}`);
  // A 100 Ω load on that 50 Ω RLGC line: |Γ| = 1/3 at any length (lossless).
  await set({ r: '100 ohm' });
  close(Number(await data('gamma')), 1 / 3, 1e-9, '|Γ| through the RLGC line');
});

test('copper coax from its diameters, matched by its ideal Z0', async () => {
  // Z0 = η0/(2π√εr)·ln(D/d) (Pozar, Microwave Engineering, 4th ed., 2012, §2.2),
  // η0 = 376.730 Ω: 0.91/2.95 mm in PE (εr 2.25) is 47.0 Ω.
  const z0 = (376.730313412 / (2 * Math.PI * 1.5)) * Math.log(2.95 / 0.91);
  await set({ load: 'r', r: `${z0} ohm`, line: 'coax', cd: '0.91 mm', cD: '2.95 mm', er: '2.25', td: '0.0002', len: '5 m', zref: `${z0} ohm`, fr: '100 MHz' });
  assert.ok(Number(await data('gamma')) < 0.01, `|Γ| ${await data('gamma')}`);
  // A short at the end of 5 m of lossy coax returns less than all, |Γ| =
  // e^(−2αl); about 0.1–0.2 dB/m at 100 MHz for this size (value from memory).
  await set({ load: 'short' });
  const g = Number(await data('gamma'));
  assert.ok(g > 0.8 && g < 1, `|Γ| ${g}`);
  assert.notEqual((await page.locator('#termination [data-key="vswr"]').textContent()).trim(), '∞ (all reflected)');
  await page.fill('#termination-cd', '3 mm');
  assert.match(await page.locator('#termination-cd-error').textContent(), /^Inner conductor diameter d is outside its valid range/);
  await set({ cd: '0.91 mm', line: 'lossless', load: 'r', r: '100 ohm', zref: '50 ohm' });
});

test('a bad entry is marked in place; the last figures stay', async () => {
  const before = await data('zin');
  await page.fill('#termination-n', '0');
  assert.match(await page.locator('#termination-n-error').textContent(), /^Points is outside its valid range/);
  assert.equal(await data('zin'), before);
  await page.fill('#termination-n', '400');
  assert.equal(await page.locator('#termination .field.bad').count(), 0);
});

test('keyboard and dark theme', async () => {
  await set({ load: 'r', r: '100 ohm', line: 'lossless', len: '2 m', fr: '100 MHz' });
  await page.focus('#termination-load');
  await page.keyboard.press('ArrowDown'); // resistor → fixed R + jX
  assert.equal(await page.inputValue('#termination-load'), 'rx');
  assert.ok(await page.locator('#termination-x').isVisible(), 'X field shown for R + jX');
  await page.keyboard.press('ArrowUp');
  await page.evaluate(() => { document.documentElement.dataset.theme = 'dark'; });
  await page.locator('#termination').screenshot({ path: join(artifacts, 'section-termination-dark.png') });
  await page.evaluate(() => { delete document.documentElement.dataset.theme; });
});

test('termination section: no network, no errors', () => assertQuiet(s.requests, s.problems));
