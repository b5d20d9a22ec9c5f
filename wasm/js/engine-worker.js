// The seatsmith engine in a Web Worker, so that no computation can freeze
// the page. The site build serves this file after Go's wasm_exec.js, as one
// script (engine-worker.js); the page compiles the module and hands it over.
//
// Messages in:
//   {type: "start", module}              a compiled WebAssembly.Module: run it
//   {type: "call", id, fn, args}         call globalThis.seatsmith[fn](...args)
//   {type: "project", id, config, block, chunk}
//                                        a projection block's draws, chunk
//                                        by chunk (projectStart, projectRun,
//                                        projectResult)
//   {type: "cancel", id}                 stop a projection between chunks
// Messages out:
//   {type: "ready", version}             the engine has started
//   {type: "answer", id, value}          a call's or a projection's answer
//   {type: "progress", id, done, total}  draws made so far
//   {type: "dead", id, message}          the engine has stopped for good
//                                        (the Go program exited, or trapped):
//                                        the page starts a fresh worker
//
// A call runs to its end once started: the page stops long work by ending
// the worker and starting another.
'use strict';

let go = null; // the Go runtime of the engine
let api = null; // globalThis.seatsmith, once started
let said = ''; // the end of what the engine last wrote (a fatal error says why it stopped)
const cancelled = new Set();

// listen keeps the last two kilobytes the engine writes to its standard
// output and error, which wasm_exec.js passes to fs.writeSync.
function listen() {
  const fs = globalThis.fs;
  if (!fs || fs.seatsmithListening) return;
  const write = fs.writeSync.bind(fs);
  const text = new TextDecoder();
  fs.writeSync = (fd, buf) => {
    said = (said + text.decode(buf)).slice(-2048);
    return write(fd, buf);
  };
  fs.seatsmithListening = true;
}

// stopped reports whether the engine can no longer answer, with why.
function stopped(err) {
  if (!go || go.exited || err instanceof WebAssembly.RuntimeError) {
    const last = said.trim().split('\n').filter((l) => /error|panic|out of memory/i.test(l)).pop();
    return last || (err && err.message) || 'the engine stopped';
  }
  return '';
}

async function start(module) {
  listen();
  go = new Go();
  const instance = await WebAssembly.instantiate(module, go.importObject);
  go.run(instance).catch(() => {});
  api = self.seatsmith;
  if (!api || typeof api.methods !== 'function') throw new Error('the engine started but offers no API');
  self.postMessage({ type: 'ready', version: api.version });
}

function call(m) {
  let value;
  try {
    value = api[m.fn](...(m.args || []));
  } catch (err) {
    const why = stopped(err);
    if (why) return self.postMessage({ type: 'dead', id: m.id, message: why });
    value = { error: { message: String(err && err.message ? err.message : err) } };
  }
  const why = stopped();
  if (why) return self.postMessage({ type: 'dead', id: m.id, message: why });
  self.postMessage({ type: 'answer', id: m.id, value });
}

const pause = () => new Promise((resolve) => setTimeout(resolve, 0));

// project makes a projection block's draws in chunks, reporting progress
// after each and letting a cancel message in between them.
async function project(m) {
  const post = (o) => self.postMessage(Object.assign({ id: m.id }, o));
  const failed = (r) => r && r.error && post({ type: 'answer', value: r });
  const st = api.projectStart(m.config);
  if (failed(st)) return;
  try {
    let done = 0;
    post({ type: 'progress', done, total: st.draws });
    while (done < st.draws) {
      await pause();
      if (cancelled.has(m.id)) return;
      const r = api.projectRun({ id: st.id, draws: m.chunk || 100 });
      if (failed(r)) return;
      done = r.done;
      post({ type: 'progress', done, total: st.draws });
    }
    const res = api.projectResult({ id: st.id, block: m.block });
    if (failed(res)) return;
    post({ type: 'answer', value: Object.assign({ done }, res) });
  } finally {
    if (!stopped()) api.projectDrop({ id: st.id });
    cancelled.delete(m.id);
  }
}

self.onmessage = (e) => {
  const m = e.data || {};
  switch (m.type) {
    case 'start':
      start(m.module).catch((err) => self.postMessage({ type: 'dead', message: stopped(err) || String(err && err.message ? err.message : err) }));
      break;
    case 'call':
      call(m);
      break;
    case 'project':
      project(m).catch((err) => {
        const why = stopped(err);
        self.postMessage(why ? { type: 'dead', id: m.id, message: why } : { type: 'answer', id: m.id, value: { error: { message: String(err) } } });
      });
      break;
    case 'cancel':
      cancelled.add(m.id);
      break;
  }
};
