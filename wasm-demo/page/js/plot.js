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


  /** Ticks for [lo, hi]: about `count` "nice" values inside the range. */
  function ticks(lo, hi, count) {
    if (!(hi > lo)) return [lo];
    const step = niceStep(hi - lo, count);
    const out = [];
    for (let v = Math.ceil(lo / step) * step; v <= hi + step * 1e-9; v += step) out.push(Number(v.toPrecision(12)));
    return out;
  }

  /**
   * An x–y chart. opts: { width, height, label, x: {lo, hi, title, fmt}, y: {lo, hi, title, fmt},
   * series: [{ xs, ys, cls, band: [ys2] }], marks: [{ x, text, cls }], hlines: [{ y, text }] }.
   * Values are drawn as given (the core computed them); returns the scales.
   */
  function chart(host, opts) {
    const W = Math.max(260, Math.round(opts.width || host.clientWidth || 520));
    const H = opts.height || 220;
    const M = { l: 54, r: 12, t: 12, b: 34 };
    const { x, y } = opts;
    const X = (v) => M.l + ((W - M.l - M.r) * (v - x.lo)) / (x.hi - x.lo || 1);
    const Y = (v) => H - M.b - ((H - M.t - M.b) * (v - y.lo)) / (y.hi - y.lo || 1);
    const root = svg('svg', { viewBox: `0 0 ${W} ${H}`, width: W, height: H, role: 'img', 'aria-label': opts.label, class: 'chart' });
    root.append(svg('title', {}, opts.label));
    const clip = `clip${Math.random().toString(36).slice(2, 8)}`;
    const defs = svg('defs');
    const cp = svg('clipPath', { id: clip });
    cp.append(svg('rect', { x: M.l, y: M.t, width: W - M.l - M.r, height: H - M.t - M.b }));
    defs.append(cp);
    root.append(defs);
    root.append(svg('rect', { class: 'frame', x: M.l, y: M.t, width: W - M.l - M.r, height: H - M.t - M.b }));
    const fx = x.fmt || ((v) => String(v));
    const fy = y.fmt || ((v) => String(v));
    for (const v of ticks(x.lo, x.hi, Math.max(3, Math.round((W - M.l) / 90)))) {
      root.append(svg('line', { class: 'grid', x1: X(v), y1: M.t, x2: X(v), y2: H - M.b }));
      root.append(svg('text', { x: X(v), y: H - M.b + 14, 'text-anchor': 'middle' }, fx(v)));
    }
    for (const v of ticks(y.lo, y.hi, 5)) {
      root.append(svg('line', { class: 'grid', x1: M.l, y1: Y(v), x2: W - M.r, y2: Y(v) }));
      root.append(svg('text', { x: M.l - 4, y: Y(v) + 4, 'text-anchor': 'end' }, fy(v)));
    }
    if (x.title) root.append(svg('text', { x: (M.l + W - M.r) / 2, y: H - 4, 'text-anchor': 'middle', class: 'axis-title' }, x.title));
    if (y.title) root.append(svg('text', { x: 12, y: M.t + (H - M.t - M.b) / 2, 'text-anchor': 'middle', class: 'axis-title', transform: `rotate(-90 12 ${M.t + (H - M.t - M.b) / 2})` }, y.title));
    const g = svg('g', { 'clip-path': `url(#${clip})` });
    for (const s of opts.series || []) {
      if (s.band) {
        // min/max envelope drawn as a filled band
        let d = '';
        for (let i = 0; i < s.xs.length; i++) d += `${i ? 'L' : 'M'}${X(s.xs[i]).toFixed(1)},${Y(s.band[i]).toFixed(1)}`;
        for (let i = s.xs.length - 1; i >= 0; i--) d += `L${X(s.xs[i]).toFixed(1)},${Y(s.ys[i]).toFixed(1)}`;
        g.append(svg('path', { d: `${d}Z`, class: `band ${s.cls || ''}` }));
      }
      let d = '';
      let pen = false;
      for (let i = 0; i < s.xs.length; i++) {
        const yv = s.ys[i];
        if (!Number.isFinite(yv)) { pen = false; continue; }
        d += `${pen ? 'L' : 'M'}${X(s.xs[i]).toFixed(1)},${Y(Math.max(y.lo - (y.hi - y.lo), Math.min(y.hi + (y.hi - y.lo), yv))).toFixed(1)}`;
        pen = true;
      }
      g.append(svg('path', { d, class: `series ${s.cls || ''}`, fill: 'none' }));
    }
    root.append(g);
    for (const m of opts.marks || []) {
      if (!(m.x >= x.lo && m.x <= x.hi)) continue;
      root.append(svg('line', { class: `mark ${m.cls || ''}`, x1: X(m.x), y1: M.t, x2: X(m.x), y2: H - M.b }));
      if (m.text) root.append(svg('text', { class: 'strong', x: X(m.x) + 3, y: M.t + 12 + (m.row || 0) * 12 }, m.text));
    }
    for (const l of opts.hlines || []) {
      if (!(l.y >= y.lo && l.y <= y.hi)) continue;
      root.append(svg('line', { class: 'ref', x1: M.l, y1: Y(l.y), x2: W - M.r, y2: Y(l.y) }));
      if (l.text) root.append(svg('text', { x: W - M.r - 3, y: Y(l.y) - 3, 'text-anchor': 'end' }, l.text));
    }
    host.append(root);
    return { root, X, Y, W, H, M, xOf: (px) => x.lo + ((px - M.l) * (x.hi - x.lo)) / (W - M.l - M.r) };
  }

  /** Range of finite values of several arrays, padded by `pad` of the span. */
  function extent(arrays, pad = 0.06) {
    let lo = Infinity, hi = -Infinity;
    for (const a of arrays) for (const v of a) if (Number.isFinite(v)) { if (v < lo) lo = v; if (v > hi) hi = v; }
    if (!Number.isFinite(lo)) return { lo: 0, hi: 1 };
    if (hi === lo) { lo -= 0.5; hi += 0.5; }
    const p = (hi - lo) * pad;
    return { lo: lo - p, hi: hi + p };
  }

  return { svg, niceStep, interval, chart, ticks, extent };
})();
