// Display formatting of the page (page/js/format.js): rounding, signs, prefixes.
import { test } from 'node:test';
import assert from 'node:assert/strict';
import { readFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

const src = readFileSync(join(dirname(fileURLToPath(import.meta.url)), '..', 'page', 'js', 'format.js'), 'utf8');
const Fmt = new Function(`${src}; return Fmt;`)();

test('significant digits, rounding carried before choosing decimals', () => {
  assert.equal(Fmt.sig(60.546), '60.55');
  assert.equal(Fmt.sig(999.96), '1000');
  assert.equal(Fmt.sig(0.66), '0.6600');
  assert.equal(Fmt.sig(12345.6), '12350');
  assert.equal(Fmt.sig(1.2e-5), '1.200×10⁻⁵');
  assert.equal(Fmt.sig(3.2e9), '3.200×10⁹');
});

test('signs: no negative zero, a real minus sign', () => {
  assert.equal(Fmt.sig(-0), '0');
  assert.equal(Fmt.sig(-1e-20 * 0), '0');
  assert.equal(Fmt.sig(-0.5), '\u22120.5000');
  assert.equal(Fmt.ohms(50, -0), '50.00 Ω');
  assert.equal(Fmt.ohms(50, -1.5), '50.00 \u2212 j1.500 Ω');
  assert.equal(Fmt.sig(Infinity), '∞');
  assert.equal(Fmt.sig(NaN), '—');
});

test('SI prefixes', () => {
  assert.equal(Fmt.si(325e-12, 's'), '325.0 ps');
  assert.equal(Fmt.si(999.96, 's'), '1.000 ks');
  assert.equal(Fmt.si(5.0036e-9, 's'), '5.004 ns');
  assert.equal(Fmt.si(1, 'V'), '1.000 V');
  assert.equal(Fmt.si(0, 's'), '0 s');
});
