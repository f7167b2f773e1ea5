// Boot, first half. Inlined at the top of <head>, right after the base64 wasm,
// so the module inflates and compiles (asynchronously, off the main thread) while the rest
// of the page is parsed. No fetch, no module scripts: the file opens from
// file:// with no network. main.js hands the compiled module to the
// wasm-bindgen glue.
'use strict';
performance.mark('echoline:load');
/** Bytes of a base64 text (the browser's own decoder where it has one). */
function fromBase64(b64) {
  if (typeof Uint8Array.fromBase64 === 'function') return Uint8Array.fromBase64(b64);
  const bin = atob(b64);
  const bytes = new Uint8Array(bin.length);
  for (let i = 0; i < bin.length; i++) bytes[i] = bin.charCodeAt(i);
  return bytes;
}
/** The bytes inflated by the browser's gzip decoder, as a stream (made in
 * this page: no Blob, which would go through the browser's blob store). */
function inflate(bytes) {
  const source = new ReadableStream({ start(c) { c.enqueue(bytes); c.close(); } });
  return source.pipeThrough(new DecompressionStream('gzip'));
}
const ECHOLINE_MODULE = (() => {
  const bytes = fromBase64(document.getElementById('core-wasm').textContent);
  // Stored gzip-compressed by the build (tools/inline.mjs); inflated here
  // by the browser itself, no network involved.
  // Compiled as it inflates (streaming compilation needs the wasm MIME type).
  const inflated = inflate(bytes);
  return WebAssembly.compileStreaming(new Response(inflated, { headers: { 'Content-Type': 'application/wasm' } }));
})();
// The later page sections, stored the same way (one text,
// NUL between scripts); js/boot.js runs them once the body is parsed.
// Inflated once the core is compiled: they are not needed for the first
// figures and would compete with the core's inflation on this thread.
const ECHOLINE_SCRIPTS = ECHOLINE_MODULE.catch(() => {}).then(() => {
  const bytes = fromBase64(document.getElementById('page-scripts').textContent);
  const inflated = inflate(bytes);
  return new Response(inflated).text().then((t) => t.split('\0'));
});
// Keep an early failure from being reported as unhandled; main.js shows it.
ECHOLINE_MODULE.catch(() => {});
ECHOLINE_SCRIPTS.catch(() => {});
