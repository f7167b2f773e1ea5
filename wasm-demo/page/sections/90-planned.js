// Places kept for the sections to come. Each becomes a section file of its own
// (page/sections/NN-name.js) with its bindings in wasm-demo/src/<name>.rs when
// its core API lands; delete its line here then.
'use strict';
for (const [id, order, title, planned] of [
  ['sweep', 40, 'Sweep analysis', 'Load a frequency sweep: return loss and distance to each reflection from the sweep.'],
]) {
  Echo.section({ id, order, title, planned });
}
