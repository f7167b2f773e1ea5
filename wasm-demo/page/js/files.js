// Shared page helpers for files and time axes. Moving text and bytes only:
// parsing and every figure are the core's.
'use strict';
const Files = (() => {
  const MAX_BYTES = 20 * 1024 * 1024; // the core refuses larger texts too

  /** Offers `text` as a download named `name`. */
  function download(name, text, type = 'text/plain') {
    const blob = new Blob([text], { type });
    const a = Echo.h('a', { href: URL.createObjectURL(blob), download: name });
    document.body.append(a); a.click(); a.remove();
    setTimeout(() => URL.revokeObjectURL(a.href), 1000);
  }

  /** Reads a File as text, refusing one over 20 MB before reading it. */
  async function read(file) {
    if (file.size > MAX_BYTES) {
      throw new Error(`file refused: ${(file.size / 1048576).toFixed(1)} MB is larger than 20 MB (the page reads at most 20 MB)`);
    }
    return file.text();
  }

  /** Makes `zone` accept dropped files: onFiles(FileList). */
  function dropZone(zone, onFiles) {
    zone.addEventListener('dragover', (e) => { e.preventDefault(); zone.classList.add('dragging'); });
    zone.addEventListener('dragleave', (e) => { if (!zone.contains(e.relatedTarget)) zone.classList.remove('dragging'); });
    zone.addEventListener('drop', (e) => {
      e.preventDefault();
      zone.classList.remove('dragging');
      if (e.dataTransfer && e.dataTransfer.files && e.dataTransfer.files.length) onFiles(e.dataTransfer.files);
    });
  }

  /** A tick formatter for a time axis in seconds with one prefix for the whole axis. */
  function timeAxis(lo, hi) {
    const span = Math.max(Math.abs(lo), Math.abs(hi));
    const [f, p] = span < 1e-6 ? [1e-9, 'ns'] : span < 1e-3 ? [1e-6, 'µs'] : span < 1 ? [1e-3, 'ms'] : [1, 's'];
    return { fmt: (v) => plain(v / f), unit: p };
  }

  /** A tick formatter that trims trailing zeros. */
  const plain = (v) => (v === 0 ? '0' : Fmt.sig(v, 3).replace(/(\.\d*?)0+$/, '$1').replace(/\.$/, ''));

  return { download, read, dropZone, timeAxis, plain, MAX_BYTES };
})();
