// Number display for the page. Formatting only: every value arrives from the core.
'use strict';
const Fmt = (() => {
  const PREFIXES = [
    [1e12, 'T'], [1e9, 'G'], [1e6, 'M'], [1e3, 'k'], [1, ''],
    [1e-3, 'm'], [1e-6, 'µ'], [1e-9, 'n'], [1e-12, 'p'], [1e-15, 'f'],
  ];
  const MINUS = '\u2212';
  const SUP = { '-': '⁻', 0: '⁰', 1: '¹', 2: '²', 3: '³', 4: '⁴', 5: '⁵', 6: '⁶', 7: '⁷', 8: '⁸', 9: '⁹' };

  /** `x` to `n` significant digits, no exponent for ordinary magnitudes, no "-0". */
  function sig(x, n = 4) {
    if (Number.isNaN(x)) return '—';
    if (!Number.isFinite(x)) return x > 0 ? '∞' : MINUS + '∞';
    if (x === 0) return '0';
    const a = Math.abs(x);
    let s;
    const r = Number(a.toPrecision(n)); // rounded first: 999.96 → 1000, not 1000.0
    if (r >= 1e-4 && r < 1e6) {
      const digits = Math.max(0, n - 1 - Math.floor(Math.log10(r)));
      s = r.toFixed(Math.min(digits, 12));
    } else {
      const [m, e] = a.toExponential(n - 1).split('e');
      s = `${m}×10${[...String(Number(e))].map((c) => SUP[c]).join('')}`;
    }
    if (Number(s.split('×')[0]) === 0) return '0';
    return (x < 0 ? MINUS : '') + s;
  }

  /** `x` in `unit` with an SI prefix chosen so the number is in [1, 1000). */
  function si(x, unit, n = 4) {
    if (!Number.isFinite(x) || x === 0) return `${sig(x, n)} ${unit}`;
    const a = Math.abs(x);
    for (const [f, p] of PREFIXES) {
      if (a >= f * 0.9995) return `${sig(x / f, n)} ${p}${unit}`;
    }
    return `${sig(x, n)} ${unit}`;
  }

  /** A complex impedance "a + jb Ω" (signed zero shown as 0). */
  function ohms(re, im, n = 4) {
    if (!Number.isFinite(re)) return 'open (∞)';
    const s = sig(re, n);
    if (Math.abs(im) <= Math.abs(re) * 1e-12) return `${s} Ω`;
    return `${s} ${im < 0 ? MINUS : '+'} j${sig(Math.abs(im), n)} Ω`;
  }

  return { sig, si, ohms, MINUS };
})();
