// Small hand-written SVG plots. Drawing only: positions are scaled from values
// the core computed; no physics here.
'use strict';
const Plot = (() => {
  const NS = 'http://www.w3.org/2000/svg';
  function svg(tag, attrs, text) {
    const e = document.createElementNS(NS, tag);
    for (const [k, v] of Object.entries(attrs || {})) e.setAttribute(k, String(v));
    if (text !== undefined) e.textContent = text;
    return e;
  }

  /** A "nice" axis step (1, 2 or 5 × 10^k) giving about `count` ticks up to `max`. */
  function niceStep(max, count) {
    const raw = max / count;
    const p = 10 ** Math.floor(Math.log10(raw));
    const m = raw / p;
    return (m <= 1 ? 1 : m <= 2 ? 2 : m <= 5 ? 5 : 10) * p;
  }

  /**
   * A cable drawn from the instrument (0) outward, with the interval [lo, hi]
   * as a band and the best estimate as a mark. All values in one display unit.
   */
  function interval(host, { best, lo, hi, unit, label }) {
    host.textContent = '';
    if (![best, lo, hi].every(Number.isFinite) || hi <= 0) return;
    const W = Math.max(240, Math.round(host.clientWidth || 320)), H = 74, L = 4, R = 4, y = 30;
    const step = niceStep(hi * 1.15, 5);
    const max = Math.ceil((hi * 1.08) / step) * step;
    const X = (v) => L + ((W - L - R) * v) / max;
    const root = svg('svg', { viewBox: `0 0 ${W} ${H}`, width: W, height: H, role: 'img', 'aria-label': label });
    root.append(svg('title', {}, label));
    root.append(svg('rect', { class: 'band', x: X(lo), y: y - 11, width: Math.max(6, X(hi) - X(lo)), height: 22, rx: 3 }));
    root.append(svg('line', { class: 'cable', x1: X(0), y1: y, x2: X(max), y2: y }));
    root.append(svg('line', { class: 'mark', x1: X(best), y1: y - 16, x2: X(best), y2: y + 16 }));
    root.append(svg('text', { class: 'strong', x: X(best), y: y - 19, 'text-anchor': 'middle' }, 'fault?'));
    const ticks = Math.round(max / step);
    for (let i = 0; i <= ticks; i++) {
      const v = i * step;
      const t = Number(v.toPrecision(6));
      const last = i === ticks;
      root.append(svg('line', { class: 'axis', x1: X(v), y1: y + 18, x2: X(v), y2: y + 23 }));
      root.append(svg('text', { x: X(v), y: y + 36, 'text-anchor': i === 0 ? 'start' : last ? 'end' : 'middle' },
        last ? `${t} ${unit}` : `${t}`));
    }
    root.append(svg('text', { x: X(0), y: y - 19 }, 'instrument'));
    host.append(root);
  }

  return { svg, niceStep, interval };
})();
