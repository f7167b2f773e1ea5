// Boot, second half: instantiate the core from the module compiled by
// page/js/load.js (wasm-bindgen's no-modules init, given an object) and start.
'use strict';
(async () => {
  const boot = document.getElementById('boot');
  try {
    const module = await ECHOLINE_MODULE;
    performance.mark('echoline:core-compiled');
    await wasm_bindgen({ module_or_path: module });
    performance.mark('echoline:core-ready');
    Echo.start(wasm_bindgen);
    boot.textContent = '';
  } catch (e) {
    boot.className = 'boot failed';
    boot.textContent = `The computing core could not start in this browser: ${(e && e.message) || e}`;
  }
})();
