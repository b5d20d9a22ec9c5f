// Times calls of the calculator function in the seatsmith WebAssembly
// engine under Node, as the bridge makes them while a reader edits: the
// block's scenario edited (one population changed) and sent as JSON text,
// no editor, no costly margins, the seat order folded away.
//
// usage: node calls.js WASM_EXEC_JS ENGINE_WASM BLOCK_JSON CALLS OUT_JSON
//
// OUT_JSON gets {ms: [...]}: the milliseconds of each call, after ten
// calls that warm the engine up.
"use strict";

const fs = require("fs");
const [execJS, wasmPath, blockPath, calls, outPath] = process.argv.slice(2);
require(execJS);

async function main() {
  const go = new Go();
  const { instance } = await WebAssembly.instantiate(fs.readFileSync(wasmPath), go.importObject);
  go.run(instance);
  const api = globalThis.seatsmith;
  const block = fs.readFileSync(blockPath, "utf8");
  const scenario = JSON.parse(block);
  const req = { block_text: block, id: "fifty", mode: "full", scenario_text: "", editor: false, margins: false, order: false };
  const ms = [];
  for (let i = 0; i < 10 + Number(calls); i++) {
    const u = scenario.units[(i * 7) % scenario.units.length];
    u.population += ((i % 2) ? -1 : 1) * (1000 + 37 * i);
    req.scenario_text = JSON.stringify(scenario);
    const t0 = performance.now();
    const r = api.calculator(req);
    const t1 = performance.now();
    if (r.state !== "live") throw new Error("the calculator answered " + JSON.stringify(r).slice(0, 300));
    if (i >= 10) ms.push(t1 - t0);
  }
  fs.writeFileSync(outPath, JSON.stringify({ ms }));
  process.exit(0);
}

main().catch((e) => {
  console.error(e);
  process.exit(1);
});
