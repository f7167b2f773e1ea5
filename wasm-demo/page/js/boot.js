// Boot, last part: at the end of <body>, after js/main.js. Runs the later
// sections inflated by js/load.js, each as an inline script of its own, in
// their order. Whether they arrive before or after the core has started,
// Echo.section builds them in order (before: with the first ones; after: as
// they come).
'use strict';
ECHOLINE_SCRIPTS.then((texts) => {
  performance.mark('echoline:scripts-inflated');
  for (const text of texts) {
    const s = document.createElement('script');
    s.textContent = text;
    document.body.append(s);
  }
}, (e) => {
  const boot = document.getElementById('boot');
  boot.className = 'boot failed';
  boot.textContent = `The page sections could not be unpacked in this browser: ${(e && e.message) || e}`;
});
