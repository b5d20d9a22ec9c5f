// The projection block's worker: it loads Go's wasm_exec.js and the
// seatsmith engine inside the worker, then runs studies in chunks of
// draws (globalThis.seatsmith.projectStart, projectRun, projectResult),
// posting progress after every chunk and checking for a cancel between
// chunks. Messages in: {type: "run", run, engine, runtime, block, config}
// and {type: "cancel", run}. Messages out: {type: "progress", run, done,
// total}, {type: "result", run, done, document, view, claims} and
// {type: "error", run, message}.
'use strict';

let ready = null;
const cancelled = new Set();
const CHUNK = 100;

function load(runtime, engine) {
  if (!ready) {
    ready = (async () => {
      importScripts(runtime);
      const go = new Go();
      const resp = await fetch(engine);
      if (!resp.ok) throw new Error('could not load the engine (' + resp.status + ')');
      const { instance } = await WebAssembly.instantiateStreaming(resp, go.importObject);
      go.run(instance);
      if (!self.seatsmith || typeof self.seatsmith.projectStart !== 'function') throw new Error('the engine did not start');
      return self.seatsmith;
    })();
    ready.catch(() => { ready = null; });
  }
  return ready;
}

const pause = () => new Promise((resolve) => setTimeout(resolve, 0));

async function run(m) {
  const post = (o) => self.postMessage(Object.assign({ run: m.run }, o));
  let api;
  try {
    api = await load(m.runtime, m.engine);
  } catch (err) {
    post({ type: 'error', message: String(err && err.message ? err.message : err) });
    return;
  }
  const st = api.projectStart(m.config);
  if (st && st.error) {
    post({ type: 'error', message: st.error.message });
    return;
  }
  try {
    let done = 0;
    post({ type: 'progress', done: 0, total: st.draws });
    while (done < st.draws) {
      await pause(); // let a cancel message in
      if (cancelled.has(m.run)) return;
      const r = api.projectRun({ id: st.id, draws: CHUNK });
      if (r.error) {
        post({ type: 'error', message: r.error.message });
        return;
      }
      done = r.done;
      post({ type: 'progress', done, total: st.draws });
    }
    const res = api.projectResult({ id: st.id, block: m.block });
    if (res.error) {
      post({ type: 'error', message: res.error.message });
      return;
    }
    post({ type: 'result', done, document: res.document, view: res.view, claims: res.claims });
  } finally {
    api.projectDrop({ id: st.id });
    cancelled.delete(m.run);
  }
}

self.onmessage = (e) => {
  const m = e.data || {};
  if (m.type === 'cancel') cancelled.add(m.run);
  else if (m.type === 'run') run(m);
};
