// Inlines the page into one self-contained HTML file: styles, the wasm-bindgen
// glue (--target no-modules), the optimised wasm as base64, and the page
// scripts, in order. No module scripts, no fetch: it opens from file://.
//
// usage: node tools/inline.mjs <glue.js> <module.wasm> <out.html>
import { readFileSync, writeFileSync, readdirSync, mkdirSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { gzipSync } from 'node:zlib';
import { fileURLToPath } from 'node:url';

const here = dirname(fileURLToPath(import.meta.url));
const page = join(here, '..', 'page');
const [glue, wasm, out] = process.argv.slice(2);
if (!glue || !wasm || !out) {
  console.error('usage: node tools/inline.mjs <glue.js> <module.wasm> <out.html>');
  process.exit(2);
}
const read = (p) => readFileSync(p, 'utf8');
// A script's text must not close its element early.
const safe = (js) => js.replace(/<\/(script)/gi, '<\\/$1').replace(/<!--/g, '<\\!--');
// Whole-line comments, blank lines and indentation dropped (the sources and
// the glue have no multi-line string literals, so no text changes meaning):
// about a sixth of the file. Line breaks stay, so automatic semicolons too.
function compact(js) {
  const out = [];
  let inBlock = false;
  for (const raw of js.split('\n')) {
    const t = raw.trim();
    if (inBlock) { if (t.endsWith('*/')) inBlock = false; continue; }
    if (t.startsWith('/*')) {
      const close = t.indexOf('*/', 2);
      if (close === -1) { inBlock = true; continue; }
      if (close === t.length - 2) continue;
    }
    if (t === '' || t.startsWith('//')) continue;
    out.push(t);
  }
  return out.join('\n');
}

// After the glue: the frame, then every section file in name order, then
// js/main.js (js/load.js goes into <head>, see below).
const sections = readdirSync(join(page, 'sections')).filter((f) => f.endsWith('.js')).sort();
// Inline, in order: what the first figures need (the frame and the first
// section). The other sections are stored compressed and run after it.
const FIRST = 1;
const scripts = [
  'js/format.js',
  'js/plot.js',
  'js/app.js',
  'js/files.js',
  ...sections.slice(0, FIRST).map((f) => `sections/${f}`),
  'js/main.js',
];
const later = sections.slice(FIRST).map((f) => `sections/${f}`);

const template = read(join(page, 'index.html'));
const css = read(join(page, 'style.css'));
// The wasm is stored gzip-compressed (page/js/load.js inflates it with the
// browser's DecompressionStream): about half the bytes of plain base64.
const b64 = gzipSync(readFileSync(wasm), { level: 9 }).toString('base64');
const script = (s) => `<script>\n// ${s}\n${safe(compact(read(join(page, s))))}\n</script>`;
// The later sections, stored gzip-compressed: one text, the scripts
// separated by NUL (which none contains). js/load.js inflates them while the
// page parses; js/boot.js runs each as an inline script of its own, in order,
// once the core has started (the page's CSP allows inline scripts; nothing is
// evaluated from a string).
const laterScripts = later.map((s) => `// ${s}\n${compact(read(join(page, s)))}`);
for (const t of laterScripts) if (t.includes('\0')) throw new Error('a script contains NUL');
const js64 = gzipSync(Buffer.from(laterScripts.join('\0'), 'utf8'), { level: 9 }).toString('base64');
// In <head>: the wasm and the scripts as base64, and js/load.js, which
// starts compiling the one and inflating the other.
const early = [
  `<script type="application/octet-stream" id="core-wasm" data-encoding="gzip">${b64}</script>`,
  `<script type="application/octet-stream" id="page-scripts" data-encoding="gzip">${js64}</script>`,
  script('js/load.js'),
];
// At the end of <body>: the wasm-bindgen glue, the first scripts, and the
// boot script that runs the inflated ones.
const parts = [`<script>\n${safe(compact(read(glue)))}\n</script>`, ...scripts.map(script), script('js/boot.js')];
for (const marker of ['<!--@CORE-->', '<!--@STYLES-->', '<!--@SCRIPTS-->']) {
  if (!template.includes(marker)) throw new Error(`template lacks ${marker}`);
}
const html = template
  .replace('<!--@CORE-->', () => early.join('\n'))
  .replace('<!--@STYLES-->', () => `<style>\n${css}\n</style>`)
  .replace('<!--@SCRIPTS-->', () => parts.join('\n'));
mkdirSync(dirname(out), { recursive: true });
writeFileSync(out, html);
const kb = (n) => `${(n / 1024).toFixed(1)} KB`;
console.log(`${out}: ${kb(Buffer.byteLength(html))} (wasm ${kb(readFileSync(wasm).length)}, gzip+base64 ${kb(b64.length)}; scripts gzip+base64 ${kb(js64.length)})`);
