// Runs projection studies in the seatsmith WebAssembly engine under Node,
// the way the page's worker does: projectStart, then projectRun in chunks,
// then projectResult.
//
// usage: node project.js WASM_EXEC_JS ENGINE_WASM CASES_JSON OUT_NDJSON
//
// CASES_JSON is an array of {config, chunk}; OUT_NDJSON gets one line per
// case: {document, claims, ms} (ms: the milliseconds the draws took) or
// {error}.
"use strict";

const fs = require("fs");
const [execJS, wasmPath, casesPath, outPath] = process.argv.slice(2);
require(execJS);

async function main() {
  const go = new Go();
  const { instance } = await WebAssembly.instantiate(fs.readFileSync(wasmPath), go.importObject);
  go.run(instance);
  const api = globalThis.seatsmith;
  const out = fs.openSync(outPath, "w");
  for (const c of JSON.parse(fs.readFileSync(casesPath, "utf8"))) {
    const st = api.projectStart(c.config);
    if (st.error) {
      fs.writeSync(out, JSON.stringify({ error: st.error }) + "\n");
      continue;
    }
    const t0 = performance.now();
    let done = 0;
    while (done < st.draws) {
      const r = api.projectRun({ id: st.id, draws: c.chunk });
      if (r.error) throw new Error(r.error.message);
      done = r.done;
    }
    const ms = performance.now() - t0;
    const res = api.projectResult({ id: st.id, block: "b" });
    api.projectDrop({ id: st.id });
    fs.writeSync(out, JSON.stringify({ document: res.document, claims: res.claims, ms }) + "\n");
  }
  fs.closeSync(out);
}

main().then(() => process.exit(0), (e) => {
  console.error(e);
  process.exit(1);
});
