// Runs a batch of calls against the seatsmith WebAssembly engine under
// Node, the way a page does: load wasm_exec.js, instantiate the module,
// start it, then call globalThis.seatsmith.
//
// usage: node harness.js WASM_EXEC_JS ENGINE_WASM CASES_JSON OUT_NDJSON
//
// CASES_JSON is an array of {fn, args} (arguments as JSON) or {fn, js} (a
// JavaScript expression that evaluates to the argument array, for values
// JSON cannot hold), with summary: true for a case whose answer is too
// large to write out whole. OUT_NDJSON gets one line first describing the
// API object, then one line per case: {type, ms, result} with the value
// returned (or, for a summary, its kind, error, state, skipped and number
// of units) and the milliseconds the call took,
// or {threw} when the call threw, plus exited: true if the Go program has
// stopped; and a last line {done, ms, exited}.
"use strict";

const fs = require("fs");
const [execJS, wasmPath, casesPath, outPath] = process.argv.slice(2);
require(execJS);

function summary(r) {
  if (!r || typeof r !== "object") return r;
  const units = Array.isArray(r.units) ? r.units.length : undefined;
  return { kind: r.kind, error: r.error, state: r.state, skipped: r.skipped, units };
}

async function main() {
  const go = new Go();
  const { instance } = await WebAssembly.instantiate(fs.readFileSync(wasmPath), go.importObject);
  go.run(instance); // the program installs its API before it first blocks
  const api = globalThis.seatsmith;
  const out = fs.openSync(outPath, "w");
  const write = (o) => fs.writeSync(out, JSON.stringify(o) + "\n");
  write({
    shape: api === undefined ? null : {
      version: api.version,
      caution: api.caution,
      frozen: Object.isFrozen(api),
      members: Object.keys(api).map((k) => [k, typeof api[k]]),
    },
  });
  const cases = JSON.parse(fs.readFileSync(casesPath, "utf8"));
  const started = Date.now();
  for (const c of cases) {
    let line;
    try {
      const args = c.js !== undefined ? (0, eval)(c.js) : c.args;
      const t0 = performance.now();
      const r = api[c.fn](...args);
      line = { type: r === null ? "null" : typeof r, ms: performance.now() - t0, result: c.summary ? summary(r) : r };
    } catch (e) {
      line = { threw: String((e && e.stack) || e) };
    }
    if (go.exited) line.exited = true;
    try {
      write(line);
    } catch (e) {
      write({ threw: "the result cannot be written as JSON: " + e });
    }
  }
  write({ done: cases.length, ms: Date.now() - started, exited: !!go.exited });
  fs.closeSync(out);
}

main().then(() => process.exit(0), (e) => {
  console.error(e);
  process.exit(1);
});
