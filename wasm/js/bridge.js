// seatsmith bridge: makes the calculator blocks of a page live.
//
// A page adds one module script and, for each calculator, a block holding
// its scenario as JSON:
//
//   <script type="module" src="/seatsmith/bridge.js"></script>
//   <div class="seatsmith" id="assembly" data-seatsmith="compact">
//     <script type="application/json">{"seats": 40, "method": "webster", "units": [...]}</script>
//   </div>
//
// or, the same block, <seatsmith-calculator id="assembly" mode="compact">
// with the JSON script inside. In a page whose stylesheet styles
// calculators (it sets --seatsmith-styled, as the site's does) a block
// stays in the page; anywhere else each block gets its own shadow root
// holding the calculator and its stylesheet (seatsmith.css beside this
// file, or <meta name="seatsmith-style">), so that neither the page's
// styles nor the calculator's reach the other. The page themes it through
// the inherited custom properties --seatsmith-accent, --seatsmith-ink,
// --seatsmith-bg and --seatsmith-font. A block that cannot start (no
// WebAssembly, no shadow DOM, an engine that cannot be fetched, as from a
// page opened from a file) keeps what it shows (the prerendered result,
// or the scenario's units as a plain table) with one line saying why.
//
// The bridge compiles the seatsmith engine (from the same folder as this
// file unless <meta name="seatsmith-engine"> names another URL, or from an
// inlined <script type="application/octet-stream" data-seatsmith-engine>
// block in a self-contained page) as soon as it runs, and runs it in a Web
// Worker (engine-worker.js beside this file, or <meta
// name="seatsmith-worker">), so that no computation freezes the page. Each
// calculator asks the engine's `calculator` function for its results; the
// engine returns markup as a tree of tags, text and attributes; the bridge
// builds DOM nodes from it and never parses HTML, so names and other text
// from the user always show as text. An edit that arrives while work runs
// supersedes it; long work shows its progress and can be stopped; an
// engine that stops is started afresh for the next edit. Where no worker
// can run (an old browser, a page opened from disk whose policy forbids
// it), the engine runs in the page itself, with Go's wasm_exec.js (beside
// this file, or <meta name="seatsmith-runtime">).
//
// data-seatsmith names the kind of block: "compact" or "full" for a
// calculator, "sweep" (seats across a range of house sizes), "growth" (two
// population counts) or "admit" (a new unit joins). The engine renders
// every kind; the bridge only keeps the edited scenario and its fields.
//
// Each calculator root carries data-state: "static" (rendered ahead of
// time), "live" (the engine has run here) or "error" (with the message
// shown), and data-busy="true" while the engine works for it. The edited
// scenario, and a pinned baseline, are kept in the URL fragment as
// #ID=PAYLOAD, the short form the engine writes and reads (see
// calc.EncodeLink), written once the reader pauses, so a link reproduces
// the same view. When the engine's first answer has been put in place (the
// first calculator goes live), the page's performance timeline gets the
// mark "seatsmith-live".
//
// Other scripts may import findBlocks (where the blocks are), Calculator
// (one block made live inside its root), engineFor (the page's engine) and
// build (a render tree as DOM nodes).

const ROOT = '[data-seatsmith]';
const SVG_NS = 'http://www.w3.org/2000/svg';
const TAGS = new Set(('a abbr button caption code col colgroup dd details div dl dt em fieldset ' +
  'figcaption figure form h2 h3 h4 input label legend li ol optgroup option output p section select ' +
  'small span strong summary table tbody td textarea tfoot th thead tr ul br hr mark b i sup sub ' +
  'svg g rect line text title desc path circle tspan').split(' '));
const URL_ATTRS = new Set(['href', 'src', 'action', 'formaction', 'xlink:href', 'srcdoc', 'style']);
// The kinds of block: calculators (compact, full) and studies of a scenario
// across house sizes (sweep), between two population counts (growth) and
// with a unit added (admit).
const MODES = new Set(['compact', 'full', 'sweep', 'growth', 'admit']);

// LINK_PAUSE is how long after the last edit, in milliseconds, the link
// in the address bar catches up with the scenario.
const LINK_PAUSE = 400;

const here = import.meta.url;

function metaURL(name, file) {
  const m = document.querySelector('meta[name="' + name + '"]');
  return new URL(m && m.content ? m.content : file, m && m.content ? document.baseURI : here).href;
}

// build turns a render tree into DOM nodes. Unknown tags, event-handler
// attributes and URL-bearing attributes are refused.
export function build(t, inSvg = false) {
  if (typeof t === 'string') return document.createTextNode(t);
  if (!Array.isArray(t) || typeof t[0] !== 'string' || !TAGS.has(t[0])) {
    throw new Error('the engine returned markup this page does not accept');
  }
  const svg = inSvg || t[0] === 'svg';
  const el = svg ? document.createElementNS(SVG_NS, t[0]) : document.createElement(t[0]);
  const attrs = t[1] || {};
  for (const k of Object.keys(attrs)) {
    if (canSet(k)) el.setAttribute(k, String(attrs[k]));
  }
  for (let i = 2; i < t.length; i++) el.appendChild(build(t[i], svg));
  return el;
}

// settable caches, by attribute name, whether build sets an attribute:
// event handlers, URL-bearing attributes and odd names are refused.
const settable = new Map();

function canSet(k) {
  let ok = settable.get(k);
  if (ok === undefined) {
    ok = !(/^on/i.test(k) || URL_ATTRS.has(k.toLowerCase()) || !/^[a-zA-Z][a-zA-Z0-9:._-]*$/.test(k));
    settable.set(k, ok);
  }
  return ok;
}

// checkTree throws, as build would, if t holds a tag build refuses.
function checkTree(t) {
  if (typeof t === 'string') return;
  if (!Array.isArray(t) || typeof t[0] !== 'string' || !TAGS.has(t[0])) {
    throw new Error('the engine returned markup this page does not accept');
  }
  for (let i = 2; i < t.length; i++) checkTree(t[i]);
}

// patch makes the DOM node el what build(t) would make, changing only what
// differs, and returns the node now in el's place. Keeping the nodes that
// stay the same keeps the browser from styling and laying out the whole
// result again after every edit. When old is the tree el was made from, the
// two trees are compared in JavaScript and the DOM is touched only where
// they differ, never read, which makes an edit that changes a few numbers
// in a result of thousands of nodes cheap; where the shapes differ, or
// without old, the DOM itself is compared.
function patch(el, t, inSvg, old) {
  if (old !== undefined && old === t) return el;
  const known = Array.isArray(old) && Array.isArray(t) && old[0] === t[0];
  if (typeof t === 'string') {
    if (el.nodeType === Node.TEXT_NODE) {
      if (el.data !== t) el.data = t;
      return el;
    }
    const n = document.createTextNode(t);
    el.replaceWith(n);
    return n;
  }
  const svg = inSvg || t[0] === 'svg';
  const ns = svg ? SVG_NS : 'http://www.w3.org/1999/xhtml';
  if (!known && (el.nodeType !== Node.ELEMENT_NODE || el.localName !== t[0] || el.namespaceURI !== ns)) {
    const n = build(t, inSvg);
    el.replaceWith(n);
    return n;
  }
  const attrs = t[1] || {};
  if (known) {
    const before = old[1] || {};
    for (const k of Object.keys(attrs)) {
      if (attrs[k] !== before[k] && canSet(k)) el.setAttribute(k, String(attrs[k]));
    }
    for (const k of Object.keys(before)) {
      if (!Object.hasOwn(attrs, k) && canSet(k)) el.removeAttribute(k);
    }
  } else {
    let n = 0;
    for (const k of Object.keys(attrs)) {
      if (!canSet(k)) continue;
      n++;
      const v = String(attrs[k]);
      if (el.getAttribute(k) !== v) el.setAttribute(k, v);
    }
    if (el.attributes.length !== n) {
      for (const a of [...el.attributes]) {
        if (!Object.hasOwn(attrs, a.name) || !canSet(a.name)) el.removeAttribute(a.name);
      }
    }
  }
  let c = el.firstChild;
  for (let i = 2; i < t.length; i++) {
    if (c) {
      const next = c.nextSibling;
      patch(c, t[i], svg, known && i < old.length ? old[i] : undefined);
      c = next;
    } else el.appendChild(build(t[i], svg));
  }
  while (c) {
    const next = c.nextSibling;
    c.remove();
    c = next;
  }
  return el;
}

function loadScript(src) {
  return new Promise((resolve, reject) => {
    const s = document.createElement('script');
    s.src = src;
    s.onload = () => resolve();
    s.onerror = () => reject(new Error('could not load ' + src));
    document.head.appendChild(s);
  });
}

function base64Bytes(text) {
  const bin = atob(text.replace(/\s+/g, ''));
  const out = new Uint8Array(bin.length);
  for (let i = 0; i < bin.length; i++) out[i] = bin.charCodeAt(i);
  return out;
}

// engineBytes returns the bytes of an engine inlined in the page (the
// offline file), or null.
async function inlineBytes() {
  const inline = document.querySelector('script[type="application/octet-stream"][data-seatsmith-engine]');
  if (!inline) return null;
  let bytes = base64Bytes(inline.textContent);
  if (inline.getAttribute('data-encoding') === 'gzip') {
    const stream = new Blob([bytes]).stream().pipeThrough(new DecompressionStream('gzip'));
    bytes = await new Response(stream).arrayBuffer();
  }
  return bytes;
}

// compileEngine fetches and compiles the calculator module, or the analysis
// module (a superset, for variation blocks, paradox claims and
// projections), compiling while the bytes arrive where the server allows.
async function compileEngine(analysis) {
  const bytes = await inlineBytes();
  if (bytes) return WebAssembly.compile(bytes);
  const url = analysis ? metaURL('seatsmith-analysis-engine', 'seatsmith-analysis.wasm') : metaURL('seatsmith-engine', 'seatsmith.wasm');
  if (WebAssembly.compileStreaming && /^https?:/.test(url)) {
    try {
      return await WebAssembly.compileStreaming(fetch(url));
    } catch (e) {
      // A server that sends the wrong MIME type, or an error: try again
      // from a buffer, which says which.
    }
  }
  let resp;
  try {
    resp = await fetch(url);
  } catch (e) {
    if (location.protocol === 'file:') throw new Error(FROM_FILE);
    throw new Error('could not fetch the engine from ' + url + ' (' + (e && e.message ? e.message : e) + '). Reload the page when the network is back.');
  }
  if (!resp.ok) throw new Error('could not load the engine (' + resp.status + ' for ' + url + ').');
  return WebAssembly.compile(await resp.arrayBuffer());
}

// FROM_FILE says why a page opened from a file on disk cannot fetch the
// engine, and what to do.
const FROM_FILE = 'the page was opened from a file, and a browser fetches the engine only from a web server. ' +
  'Open it through one (for example go run ./tools/sitebuild serve), or use offline.html, the calculator in one file that works from disk.';

// workerURL returns the URL of the engine's worker script: the page's
// (meta), one built from the inlined runtime and worker source of a
// self-contained page, or engine-worker.js beside this file.
function workerURL() {
  const m = document.querySelector('meta[name="seatsmith-worker"]');
  if (m && m.content) return new URL(m.content, document.baseURI).href;
  const src = document.querySelector('script[type="text/plain"][data-seatsmith-worker]');
  const runtime = document.querySelector('script[data-seatsmith-runtime]');
  if (src && runtime) return URL.createObjectURL(new Blob([runtime.textContent, '\n', src.textContent], { type: 'text/javascript' }));
  return new URL('engine-worker.js', here).href;
}

// LONG is how long, in milliseconds, a job may run before the reader sees
// it working and can stop it, and before an edit that supersedes it ends
// the worker rather than waiting for it.
const LONG = 400;

// EngineStopped is the error of a job whose engine stopped for good (the
// Go program exited or trapped): the next job starts a fresh engine.
export class EngineStopped extends Error {}

// An Engine runs jobs on one module, one at a time, in a Web Worker (or,
// where none can run, in the page). A job belongs to an owner (a
// calculator, a projection block): a new job of an owner supersedes its
// waiting ones, which resolve to null, and its running one, which the
// engine ends by starting a fresh worker if it is long (asked as long, or
// running for LONG ms) and otherwise lets finish, its answer then ignored
// by the owner.
class Engine {
  constructor(analysis) {
    this.analysis = analysis;
    this.module = compileEngine(analysis);
    this.module.catch(() => {}); // reported by the first job
    this.worker = null;
    this.ready = null; // resolves once the worker's engine has started
    this.page = null; // the engine in the page, when no worker can run
    this.noWorker = typeof Worker !== 'function';
    this.queue = [];
    this.job = null;
    this.ids = 0;
    // Start the worker at once, while the module downloads.
    if (!this.noWorker) this.boot();
  }

  // boot starts a worker and hands it the module once compiled.
  boot() {
    let w;
    try {
      w = new Worker(workerURL());
    } catch (e) {
      this.noWorker = true;
      return;
    }
    this.worker = w;
    let started = false;
    this.ready = new Promise((resolve, reject) => {
      w.onmessage = (e) => {
        const m = e.data || {};
        if (m.type === 'ready') {
          started = true;
          resolve();
        } else if (m.type === 'dead' && m.id === undefined) reject(new EngineStopped(m.message));
        else this.message(w, m);
      };
      w.onerror = (e) => {
        e.preventDefault();
        if (this.worker !== w) return;
        // A worker that never started (a script that cannot load, a policy
        // that forbids it) makes the engine run in the page instead.
        if (!started) reject(new Error('no worker: ' + (e.message || 'it did not start')));
        else this.stopped(w, 'the engine\u2019s worker failed: ' + (e.message || 'unknown error'));
      };
    });
    this.ready.catch(() => {});
    this.module.then((module) => w.postMessage({ type: 'start', module }), () => {});
  }

  // call runs globalThis.seatsmith[fn](...args) and resolves to its answer,
  // or to null when superseded. opts: owner, long.
  call(fn, args, opts) {
    return this.enqueue({ type: 'call', fn, args }, opts || {});
  }

  // project runs a projection block's draws; opts.progress(done, total)
  // hears of each chunk.
  project(config, block, opts) {
    return this.enqueue({ type: 'project', config, block, chunk: 100 }, opts || {});
  }

  enqueue(msg, opts) {
    return new Promise((resolve, reject) => {
      const job = { msg, owner: opts.owner, long: !!opts.long, progress: opts.progress, resolve, reject, id: ++this.ids };
      if (job.owner) {
        this.queue = this.queue.filter((q) => {
          if (q.owner !== job.owner) return true;
          q.resolve(null);
          return false;
        });
        const run = this.job;
        if (run && run.owner === job.owner && (run.long || performance.now() - run.started > LONG)) this.restart();
      }
      this.queue.push(job);
      this.pump();
    });
  }

  // stop ends the owner's work: waiting jobs resolve to null, a running one
  // ends with its worker. It reports whether anything was running.
  stop(owner) {
    this.queue = this.queue.filter((q) => {
      if (q.owner !== owner) return true;
      q.resolve(null);
      return false;
    });
    if (this.job && this.job.owner === owner) {
      if (this.job.msg.type === 'project' && this.worker) {
        this.worker.postMessage({ type: 'cancel', id: this.job.id });
        this.job.resolve(null);
        this.job = null;
        this.pump();
      } else this.restart();
      return true;
    }
    return false;
  }

  // restart ends the worker and its running job (which resolves to null),
  // and starts another for the jobs waiting.
  restart() {
    const run = this.job;
    this.job = null;
    if (this.worker) this.worker.terminate();
    this.worker = null;
    this.ready = null;
    this.page = null;
    if (run) run.resolve(null);
    this.pump();
  }

  // stopped is called when the engine stopped for good while running a
  // job: the job fails with EngineStopped, and the next job gets a fresh
  // engine.
  stopped(worker, message) {
    if (worker && worker !== this.worker) return;
    if (this.worker) this.worker.terminate();
    this.worker = null;
    this.ready = null;
    this.page = null;
    const run = this.job;
    this.job = null;
    if (run) run.reject(new EngineStopped(message));
    this.pump();
  }

  async pump() {
    if (this.job || !this.queue.length) return;
    const job = this.queue.shift();
    this.job = job;
    job.started = performance.now();
    try {
      await this.module;
      if (!this.noWorker) {
        if (!this.worker) this.boot();
        try {
          await this.ready;
        } catch (e) {
          if (!(e instanceof EngineStopped) && this.job === job) {
            this.noWorker = true; // no worker can run here: use the page
            if (this.worker) this.worker.terminate();
            this.worker = null;
          } else throw e;
        }
      }
      if (this.job !== job) return; // superseded while the engine started
      if (!this.noWorker) {
        this.worker.postMessage(Object.assign({ id: job.id }, job.msg));
        return; // answered by message
      }
      await this.inPage(job);
    } catch (e) {
      if (this.job !== job) return;
      this.job = null;
      job.reject(e instanceof EngineStopped ? e : new Error(e && e.message ? e.message : String(e)));
      this.pump();
    }
  }

  // message handles a worker's answer, progress or death.
  message(worker, m) {
    const job = this.job;
    if (worker !== this.worker || !job || m.id !== job.id) return;
    if (m.type === 'progress') {
      if (job.progress) job.progress(m.done, m.total);
      return;
    }
    if (m.type === 'dead') {
      this.stopped(worker, m.message);
      return;
    }
    this.job = null;
    job.resolve(m.value);
    this.pump();
  }

  // inPage runs a job on an engine in the page.
  async inPage(job) {
    if (!this.page) {
      if (!globalThis.Go) await loadScript(metaURL('seatsmith-runtime', 'wasm_exec.js'));
      const go = new globalThis.Go();
      const instance = await WebAssembly.instantiate(await this.module, go.importObject);
      go.run(instance).catch(() => {});
      if (!globalThis.seatsmith) throw new Error('the engine started but offers no API');
      this.page = { go, api: globalThis.seatsmith };
    }
    await new Promise((r) => setTimeout(r, 0)); // let the page draw first
    if (this.job !== job) return;
    const { go, api } = this.page;
    let value;
    const m = job.msg;
    try {
      if (m.type === 'call') value = api[m.fn](...m.args);
      else {
        const st = api.projectStart(m.config);
        if (st.error) value = st;
        else {
          let r = { done: 0 };
          while (!r.error && r.done < st.draws) {
            r = api.projectRun({ id: st.id, draws: 1000 });
            if (job.progress && !r.error) job.progress(r.done, st.draws);
            await new Promise((res) => setTimeout(res, 0));
            if (this.job !== job) return;
          }
          value = r.error ? r : Object.assign({ done: r.done }, api.projectResult({ id: st.id, block: m.block }));
          api.projectDrop({ id: st.id });
        }
      }
    } catch (e) {
      if (!go.exited) throw e;
    }
    if (go.exited) throw new EngineStopped('the engine stopped');
    if (this.job !== job) return;
    this.job = null;
    job.resolve(value);
    this.pump();
  }
}

const engines = new Map();

// engineFor returns the page's engine: the analysis module when analysis
// is true, else the calculator module. Each is loaded once.
export function engineFor(analysis) {
  const key = analysis ? 'analysis' : 'calculator';
  if (!engines.has(key)) engines.set(key, new Engine(analysis));
  return engines.get(key);
}

// Fragment: "#id=payload&id2=payload2"; other fragments are left alone.
function fragmentParts() {
  const h = location.hash.replace(/^#/, '');
  const parts = new Map();
  if (!h) return parts;
  for (const p of h.split('&')) {
    const i = p.indexOf('=');
    if (i <= 0) continue;
    let key;
    try {
      key = decodeURIComponent(p.slice(0, i));
    } catch (e) {
      continue; // not one of ours
    }
    parts.set(key, p.slice(i + 1));
  }
  return parts;
}

function download(name, type, text) {
  const url = URL.createObjectURL(new Blob([text], { type }));
  const a = document.createElement('a');
  a.href = url;
  a.download = name;
  document.body.appendChild(a);
  a.click();
  a.remove();
  setTimeout(() => URL.revokeObjectURL(url), 1000);
}

let counter = 0;
let wentLive = false;

// A Calculator makes one block live inside its root element: it keeps the
// scenario being edited, asks the engine for results after each edit and
// renders them into the root. The block's element (host) holds its
// <script type="application/json">; the root is the host itself in a page
// that styles calculators (holding, when prerendered, the editor and
// results, data-part="editor" and data-part="output"), or an element in the
// host's shadow root.
export class Calculator {
  constructor(root, engine, host) {
    this.root = root;
    this.host = host || root;
    this.engine = engine;
    if (!this.host.id) this.host.id = 'calculator-' + ++counter;
    this.id = this.host.id;
    const mode = modeOf(this.host);
    this.mode = MODES.has(mode) ? mode : 'compact';
    const data = this.host.querySelector('script[type="application/json"]');
    this.blockText = data ? data.textContent : '';
    this.scenario = null;
    // The pinned baseline (a scenario) later edits are compared with, the
    // link's payload the engine last wrote, and a table waiting for its
    // columns to be chosen.
    this.baseline = null;
    this.linkPayload = '';
    this.pendingTable = null;
    this.timer = 0;
    this.marginTimer = 0;
    this.ticket = 0; // the last request asked: an answer to an older one is dropped
    this.wired = false;
    // The folded sections the reader opened or closed, by class, kept
    // through edits, errors included.
    this.folds = new Map();
  }

  // ask sends a request to the engine and resolves to its answer, or to
  // null when a later request superseded it, the reader stopped it or the
  // engine stopped (which it then says). long marks work that may take
  // long (margins on request, loads, exports).
  async ask(extra, long) {
    // The scenario goes as JSON text: one string crosses into the engine
    // far faster than an object it must read member by member.
    const text = this.scenario == null ? null : JSON.stringify(this.scenario);
    // The seat order is laid out only while its section is open: for a
    // large house it is the longest part of the results.
    const order = this.folds.get('sc-order') === true || !!this.root.querySelector('details.sc-order[open]');
    const req = Object.assign({ block_text: this.blockText, id: this.id, mode: this.mode, scenario_text: text, order }, extra);
    if (this.baseline && !req.link) req.baseline_text = JSON.stringify(this.baseline);
    const ticket = ++this.ticket;
    this.working(true, extra && extra.margins === true ? 'margins' : 'results');
    let r;
    try {
      r = await this.engine.call('calculator', [req], { owner: this, long });
    } catch (e) {
      if (ticket !== this.ticket) return null;
      this.working(false);
      if (e instanceof EngineStopped) {
        this.stoppedEngine(e.message);
        return null;
      }
      r = { error: { message: String(e && e.message ? e.message : e) } };
    }
    if (ticket !== this.ticket) return null;
    this.working(false);
    if (r === null) return null;
    if (!r || typeof r !== 'object') r = { error: { message: 'the engine gave no answer' } };
    if (!r.state) {
      // An error from the API layer itself: the request never reached the calculator.
      const m = r.error && r.error.message ? r.error.message : 'the engine gave no answer';
      r = { state: 'error', fatal: true, error: { message: m } };
    }
    return r;
  }

  // working shows that the engine works for this calculator: data-busy at
  // once, and after LONG ms a line with the time taken and a Stop button.
  working(on, what) {
    clearTimeout(this.busyTimer);
    clearInterval(this.busyClock);
    const line = this.root.querySelector('[data-role="busy"]');
    if (!on) {
      this.root.removeAttribute('data-busy');
      if (line) line.remove();
      return;
    }
    this.root.setAttribute('data-busy', 'true');
    if (line) line.remove();
    const since = performance.now();
    this.busyTimer = setTimeout(() => {
      const p = document.createElement('p');
      p.className = 'sc-busy';
      p.setAttribute('role', 'status');
      p.setAttribute('data-role', 'busy');
      p.setAttribute('data-work', what);
      const bar = document.createElement('progress');
      bar.setAttribute('aria-label', 'Working');
      const label = document.createElement('span');
      const stop = document.createElement('button');
      stop.type = 'button';
      stop.className = 'sc-button';
      stop.setAttribute('data-action', 'stop');
      stop.textContent = 'Stop';
      p.append(bar, ' ', label, ' ', stop);
      const tick = () => {
        const s = Math.round((performance.now() - since) / 1000);
        label.textContent = (what === 'margins' ? 'Computing the margins' : 'Computing') + '\u2026 ' + s + ' s. You can keep editing: an edit replaces this computation.';
      };
      tick();
      this.busyClock = setInterval(tick, 1000);
      this.root.insertBefore(p, this.root.querySelector('[data-part="output"]') || null);
    }, LONG);
  }

  // stop ends the work running for this calculator, keeping the results
  // shown.
  stop() {
    this.ticket++;
    this.working(false);
    clearTimeout(this.marginTimer);
    this.engine.stop(this);
    this.notice('Stopped. The results shown are those of the last finished computation.', false);
  }

  // stoppedEngine says that the engine stopped; the next edit starts a
  // fresh one.
  stoppedEngine(message) {
    this.alert('The engine stopped (' + message + '). It starts again with your next edit; the results shown are those of the last finished computation.');
  }

  // begin starts the calculator unless it failed already; a failure shows
  // in the calculator.
  begin() {
    if (!this.engine) return Promise.resolve();
    return this.start().catch((e) => this.fail(e.message || String(e)));
  }

  async start() {
    const frag = fragmentParts();
    const link = frag.has(this.id) ? { link: frag.get(this.id) } : {};
    // Costly margins (bounds under largest remainders, thresholds) come
    // at once for a small scenario (as the page prerendered them) and on
    // request for a large one.
    let r = await this.ask(Object.assign({ editor: true, margins: false }, link));
    const linkError = r && r.link_error;
    if (r && !r.fatal) this.keep(r);
    if (r && r.margins_pending && r.margins_auto) r = (await this.ask({ editor: true })) || r;
    // The second answer is for the scenario the link gave, or the page's.
    if (linkError && r) r.link_error = linkError;
    if (!r) {
      this.wire();
      return;
    }
    if (r.fatal) {
      this.fail(r.error.message);
      return;
    }
    this.apply(r, true);
    this.wire();
  }

  // alert shows a message in the calculator's alert line.
  alert(text) {
    let box = this.root.querySelector('[data-role="engine-error"]');
    if (!box) {
      box = document.createElement('p');
      box.className = 'sc-error';
      box.setAttribute('role', 'alert');
      box.setAttribute('data-role', 'engine-error');
      this.root.insertBefore(box, this.root.firstChild);
    }
    box.textContent = text;
  }

  // setState puts data-state on the root and on the block's element.
  setState(state) {
    this.root.setAttribute('data-state', state);
    if (this.host !== this.root) this.host.setAttribute('data-state', state);
  }

  // fail says, in one line in place of the "not live" note, why the
  // calculator cannot start; the numbers shown stay.
  fail(message) {
    this.setState('error');
    for (const n of this.root.querySelectorAll('[data-role="static-note"], [data-role="not-live"]')) n.remove();
    const shown = this.root.querySelector('[data-part="output"]') ? ' The numbers shown were computed when the page was built.'
      : this.root.querySelector('[data-role="fallback-units"]') ? ' The table shows the scenario\u2019s own numbers.' : '';
    this.alert('The live calculator could not start: ' + message + shown);
  }

  // replacePart puts the part built from tree in place of the current one.
  // The results are patched in place; the editor is built anew, so that
  // every field shows the value the engine read.
  replacePart(name, tree) {
    const old = this.root.querySelector('[data-part="' + name + '"]');
    if (!old) {
      const el = build(tree);
      this.root.appendChild(el);
      return el;
    }
    // Folded sections stay as the reader left them.
    const folds = new Map([...old.querySelectorAll('details[class]')].map((d) => [d.classList[0], d.open]));
    for (const [cls, open] of this.folds) folds.set(cls, open);
    let el;
    if (name === 'output') {
      checkTree(tree);
      // The tree last put in place describes the node still there, unless
      // something else has replaced it since.
      el = patch(old, tree, false, this.outputEl === old ? this.outputTree : undefined);
      this.outputEl = el;
      this.outputTree = tree;
    } else {
      el = build(tree);
      old.replaceWith(el);
    }
    for (const [cls, open] of folds) {
      const same = el.querySelector('details.' + CSS.escape(cls));
      if (same && same.open !== open) same.open = open;
    }
    return el;
  }

  apply(r, withEditor) {
    this.keep(r);
    if (withEditor && r.editor) this.replacePart('editor', r.editor);
    if (r.output) this.replacePart('output', r.output);
    const err = this.root.querySelector('[data-role="engine-error"]');
    if (err) err.remove();
    if (r.editor || r.output) {
      for (const n of this.root.querySelectorAll('[data-role="not-live"], [data-role="fallback-units"]')) n.remove();
    }
    this.setState(r.state === 'live' ? 'live' : 'error');
    if (!wentLive && r.state === 'live') {
      wentLive = true;
      performance.mark('seatsmith-live');
    }
    for (const el of this.root.querySelectorAll('[aria-invalid]')) {
      el.removeAttribute('aria-invalid');
      el.removeAttribute('aria-errormessage');
    }
    if (r.error && r.error.field) {
      const el = this.root.querySelector('[data-part="editor"] [data-field="' + CSS.escape(r.error.field) + '"]');
      if (el) {
        el.setAttribute('aria-invalid', 'true');
        el.setAttribute('aria-errormessage', this.id + '-error');
      }
    }
    for (const c of r.claims || []) {
      for (const ref of document.querySelectorAll('[data-claim-ref="' + CSS.escape(c.id) + '"]')) {
        ref.setAttribute('data-holds', c.holds ? 'true' : 'false');
        ref.setAttribute('title', (c.holds ? 'Holds. ' : 'Does not hold with these numbers. ') + c.found + '.');
      }
    }
    if (r.link_error) this.notice('The numbers in this link could not be read: ' + r.link_error + '. Showing the page\u2019s own numbers.', true);
    if (r.load_error) {
      const where = r.load_error.line ? ' (line ' + r.load_error.line + (r.load_error.field ? ', ' + r.load_error.field : '') + ')' : '';
      this.notice('The table could not be read' + where + ': ' + r.load_error.message, true);
    }
  }

  notice(text, isError) {
    const n = this.root.querySelector('[data-role="notice"]');
    if (!n) return;
    n.textContent = text;
    n.classList.toggle('sc-note-error', !!isError);
    if (isError) n.setAttribute('data-error', 'true');
    else n.removeAttribute('data-error');
  }

  wire() {
    if (this.wired) return;
    this.wired = true;
    const root = this.root;
    addEventListener('pagehide', () => {
      if (this.linkTimer) this.saveFragment();
    });
    root.addEventListener('submit', (e) => e.preventDefault());
    // toggle does not bubble, so it is caught on its way down. An opened
    // seat order that was left out is asked for.
    root.addEventListener('toggle', (e) => {
      const d = e.target;
      if (!d.matches || !d.matches('details[class]')) return;
      this.folds.set(d.classList[0], d.open);
      if (d.open && d.matches('details.sc-order') && d.querySelector('[data-role="order-pending"]')) this.refresh(false);
    }, true);
    this.wireDrop();
    root.addEventListener('input', (e) => this.onField(e, false));
    root.addEventListener('change', (e) => this.onField(e, true));
    root.addEventListener('click', (e) => {
      const b = e.target.closest('button[data-action]');
      if (b && root.contains(b)) this.onAction(b.getAttribute('data-action'), b);
    });
  }

  onField(e, committed) {
    const el = e.target;
    if (el.matches('input[type="file"][data-action="load-file"]')) {
      if (committed && el.files && el.files[0]) this.loadFile(el.files[0], el);
      return;
    }
    const f = el.getAttribute && el.getAttribute('data-field');
    if (!f || f === 'csv') return;
    if (!this.setField(f, el.value)) return;
    // An answer to a request sent before this edit is stale: the scenario
    // it carries back would undo the edit.
    this.ticket++;
    clearTimeout(this.timer);
    clearTimeout(this.marginTimer);
    if (committed || el.tagName === 'SELECT') this.refresh(false);
    else this.timer = setTimeout(() => this.refresh(false), 150);
  }

  setField(f, value) {
    const s = this.scenario || {};
    const v = String(value);
    const put = (obj, key) => {
      if (v.trim() === '') delete obj[key];
      else obj[key] = v;
    };
    const m = /^units\.(\d+)\.(name|population|min|max|later)$/.exec(f);
    if (m) {
      const u = Array.isArray(s.units) ? s.units[Number(m[1])] : null;
      if (!u || typeof u !== 'object' || Array.isArray(u)) return false;
      if (m[2] === 'name') u.name = v;
      else if (m[2] === 'population') u.population = v;
      else put(u, m[2]); // a blank later population keeps the first one
      return true;
    }
    const a = /^admit\.(name|population|added)$/.exec(f);
    if (a) {
      if (!s.admit || typeof s.admit !== 'object' || Array.isArray(s.admit)) s.admit = {};
      put(s.admit, a[1]);
      return true;
    }
    switch (f) {
      case 'seats':
      case 'min':
      case 'max':
      case 'threshold':
      case 'method':
      case 'from':
      case 'to':
        put(s, f);
        return true;
      case 'methods':
        s.methods = [...this.root.querySelectorAll('input[type="checkbox"][data-field="methods"]')].filter((c) => c.checked).map((c) => c.value);
        return true;
      case 'tie-kind':
      case 'tie-seed': {
        const kind = this.root.querySelector('[data-field="tie-kind"]').value;
        const seed = this.root.querySelector('[data-field="tie-seed"]').value.trim();
        if (kind === 'order') s.tie = 'order';
        else if (kind === 'lot') s.tie = 'lot:' + (seed || '1');
        else delete s.tie;
        return true;
      }
    }
    return false;
  }

  // refresh recomputes after an edit and resolves to the answer (null when
  // superseded). Costly margins (bounds under largest remainders,
  // thresholds) are left out so that typing stays quick, and asked for
  // once the reader pauses.
  async refresh(withEditor, extra, long) {
    clearTimeout(this.marginTimer);
    const r = await this.ask(Object.assign({ editor: withEditor, margins: false }, extra || {}), long);
    if (!r) return null;
    if (r.fatal) {
      this.fail(r.error.message);
      return r;
    }
    // Inside a shadow root the document's active element is the host.
    const focus = this.root.getRootNode().activeElement;
    const key = focus && this.root.contains(focus) ? focus.getAttribute('data-field') || focus.getAttribute('data-action') : null;
    // The link is written before the results go into the page: the browser
    // records the page's layout with each history entry, and while the new
    // results are not yet laid out that would lay out the whole page first.
    this.keep(r);
    this.saveFragmentSoon();
    this.apply(r, withEditor);
    if (withEditor && key) {
      const again = this.root.querySelector('[data-field="' + CSS.escape(key) + '"], [data-action="' + CSS.escape(key) + '"]');
      if (again) again.focus();
    }
    if (r.margins_pending && r.margins_auto) this.marginTimer = setTimeout(() => this.refresh(false, { margins: true }), 600);
    return r;
  }

  // saveFragmentSoon writes the link once the reader pauses: the browser
  // records the state of every form field with each history entry, which
  // on a page of fifty units takes longer than a frame, too long to do at
  // every edit. A page being left gets its link at once.
  saveFragmentSoon() {
    clearTimeout(this.linkTimer);
    this.linkTimer = setTimeout(() => this.saveFragment(), LINK_PAUSE);
  }

  saveFragment() {
    clearTimeout(this.linkTimer);
    this.linkTimer = 0;
    const parts = fragmentParts();
    parts.set(this.id, this.linkPayload);
    const h = [...parts].map(([k, v]) => encodeURIComponent(k) + '=' + v).join('&');
    history.replaceState(history.state, '', '#' + h);
  }

  link() {
    const parts = fragmentParts();
    parts.set(this.id, this.linkPayload);
    const u = new URL(location.href);
    u.hash = [...parts].map(([k, v]) => encodeURIComponent(k) + '=' + v).join('&');
    return u.href;
  }

  async onAction(action, button) {
    const s = this.scenario;
    switch (action) {
      case 'stop':
        this.stop();
        break;
      case 'add-unit': {
        s.units = Array.isArray(s.units) ? s.units : [];
        s.units.push({ name: 'Unit ' + (s.units.length + 1), population: '0' });
        const n = s.units.length;
        if (!(await this.refresh(true))) break;
        const last = this.root.querySelector('[data-field="units.' + (n - 1) + '.name"]');
        if (last) {
          last.focus();
          last.select();
        }
        break;
      }
      case 'remove-unit': {
        const k = Number(button.getAttribute('data-index'));
        if (Array.isArray(s.units) && s.units.length > 1) {
          s.units.splice(k, 1);
          const n = s.units.length;
          if (!(await this.refresh(true))) break;
          const next = this.root.querySelector('[data-action="remove-unit"][data-index="' + Math.min(k, n - 1) + '"]');
          if (next) next.focus();
          this.notice('Removed unit ' + (k + 1) + '.', false);
        } else {
          this.notice('A scenario needs at least one unit.', true);
        }
        break;
      }
      case 'margins': {
        if (!(await this.refresh(false, { margins: true }, true))) break;
        const t = this.root.querySelector('.sc-results-wrap .sc-scroll');
        if (t) t.focus();
        break;
      }
      case 'reset': {
        this.scenario = null;
        if (await this.refresh(true)) this.notice('Back to the page\u2019s own numbers.', false);
        break;
      }
      case 'use-csv': {
        const ta = this.root.querySelector('[data-field="csv"]');
        const text = ta ? ta.value : '';
        if (!text.trim()) {
          this.notice('Paste a table first: cells copied from a spreadsheet, or CSV lines, one unit a line.', true);
          break;
        }
        await this.offerTable('pasted table', text, 'always');
        break;
      }
      case 'use-columns':
        await this.useColumns();
        break;
      case 'cancel-columns':
        this.closeChooser();
        this.notice('The table was not loaded.', false);
        break;
      case 'pin':
      case 'unpin':
        await this.pin(action === 'pin');
        break;
      case 'export-csv':
      case 'export-json': {
        const r = await this.ask({ export: true }, true);
        if (!r) break;
        if (r.state !== 'live' || !r.csv) {
          this.notice('Fix the numbers first: there are no results to export.', true);
          break;
        }
        if (action === 'export-csv') download(this.id + '-results.csv', 'text/csv;charset=utf-8', r.csv);
        else download(this.id + '-scenario.json', 'application/json', r.json);
        this.notice('Downloaded.', false);
        break;
      }
      case 'copy-link': {
        const href = this.link();
        this.saveFragment();
        const shown = () => this.notice('Link to these numbers: ' + href, false);
        if (navigator.clipboard && window.isSecureContext) {
          navigator.clipboard.writeText(href).then(() => this.notice('Link copied. It holds these numbers: anyone who opens it sees the same view.', false), shown);
        } else shown();
        break;
      }
    }
  }

  loadFile(file, input) {
    if (file.size > 20 * 1024 * 1024) {
      this.notice('That file is larger than 20 MB.', true);
      return;
    }
    file.text().then((text) => this.offerTable(file.name, text, 'unsure'), () => this.notice('The file could not be read.', true));
    if (input) input.value = '';
  }

  reloadFromFragment() {
    const frag = fragmentParts();
    if (!frag.has(this.id) || frag.get(this.id) === this.linkPayload) return;
    this.refresh(true, { link: frag.get(this.id) });
  }

  // --- Tables in, baseline against proposal ---

  // keep takes from an answer what the calculator keeps between edits: the
  // scenario, the baseline in effect and the link's payload.
  keep(r) {
    if (r.scenario) this.scenario = r.scenario;
    if (r.state) this.baseline = r.baseline || null;
    if (typeof r.link === 'string') this.linkPayload = r.link;
  }

  // pin keeps the current scenario as the baseline later edits are
  // compared with (on), or clears it.
  async pin(on) {
    this.baseline = on ? JSON.parse(JSON.stringify(this.scenario || {})) : null;
    const r = await this.refresh(true, {}, true);
    if (!r) return;
    const again = this.root.querySelector('[data-action="' + (on ? 'unpin' : 'pin') + '"]');
    if (again) again.focus();
    this.notice(on ? 'Pinned these numbers as the baseline: edits now show what changes against it.' : 'Unpinned the baseline.', false);
  }

  // offerTable sends a pasted or dropped table to the engine, which loads
  // it or, when the columns are to be chosen first (choose: always after
  // a paste, unsure for a file), answers with the column chooser.
  async offerTable(name, text, choose) {
    this.closeChooser();
    // A paste keeps its text in the editor while the columns are chosen;
    // a file that may load at once rebuilds the editor with its units.
    const withEditor = choose !== 'always';
    const r = await this.refresh(withEditor, { load: { name, text, choose } }, true);
    if (!r || r.load_error) return;
    if (r.chooser) {
      this.pendingTable = { name, text };
      this.showChooser(r.chooser);
      return;
    }
    if (!withEditor) await this.refresh(true, {});
    this.notice('Loaded ' + (this.scenario.units || []).length + ' units from ' + name + '.', false);
  }

  showChooser(tree) {
    const loader = this.root.querySelector('[data-part="editor"] details.sc-csv');
    if (loader) loader.open = true;
    const slot = this.root.querySelector('[data-part="editor"] [data-role="chooser-slot"]');
    if (!slot) return;
    slot.replaceChildren(build(tree));
    const first = slot.querySelector('select');
    if (first) first.focus();
  }

  closeChooser() {
    this.pendingTable = null;
    const slot = this.root.querySelector('[data-role="chooser-slot"]');
    if (slot) slot.replaceChildren();
  }

  // useColumns loads the waiting table with the columns chosen.
  async useColumns() {
    const t = this.pendingTable;
    if (!t) return;
    const columns = {};
    for (const sel of this.root.querySelectorAll('[data-role="chooser"] select[data-column]')) {
      columns[sel.getAttribute('data-column')] = Number(sel.value);
    }
    const r = await this.refresh(true, { load: { name: t.name, text: t.text, columns } }, true);
    if (!r || r.load_error) {
      // The editor was built anew: the chooser stays for another choice.
      if (r && r.load_error) {
        this.pendingTable = t;
        const again = await this.refresh(false, { load: { name: t.name, text: t.text, choose: 'always' } }, true);
        if (again && again.chooser) this.showChooser(again.chooser);
      }
      return;
    }
    this.pendingTable = null;
    this.notice('Loaded ' + (this.scenario.units || []).length + ' units from ' + t.name + '.', false);
  }

  // wireDrop lets a file be dropped onto the editor.
  wireDrop() {
    const onEditor = (e) => e.target && e.target.closest && e.target.closest('[data-part="editor"]') && this.root.contains(e.target);
    this.root.addEventListener('dragover', (e) => {
      if (!onEditor(e) || !e.dataTransfer || ![...e.dataTransfer.types].includes('Files')) return;
      e.preventDefault();
      e.dataTransfer.dropEffect = 'copy';
      this.root.setAttribute('data-drop', 'true');
    });
    this.root.addEventListener('dragleave', (e) => {
      if (!e.relatedTarget || !this.root.contains(e.relatedTarget)) this.root.removeAttribute('data-drop');
    });
    this.root.addEventListener('drop', (e) => {
      this.root.removeAttribute('data-drop');
      if (!onEditor(e) || !e.dataTransfer || !e.dataTransfer.files.length) return;
      e.preventDefault();
      this.loadFile(e.dataTransfer.files[0], null);
    });
  }
}

// PARADOX_KINDS are the claim kinds that only the analysis module checks.
const PARADOX_KINDS = new Set(['no-alabama', 'no-quota-violation', 'population-paradox', 'no-population-paradox', 'new-states', 'no-new-states']);

// needsAnalysis reports whether a block needs the analysis module: a
// variation block (sweep, growth, admit) or a block with a paradox claim.
function needsAnalysis(host) {
  const mode = modeOf(host);
  if (mode === 'sweep' || mode === 'growth' || mode === 'admit') return true;
  const b = blockDoc(host);
  return !!b && Array.isArray(b.claims) && b.claims.some((c) => c && PARADOX_KINDS.has(c.kind));
}

// ELEMENT is the calculator's own element, <seatsmith-calculator mode="…">,
// the same block as <div class="seatsmith" data-seatsmith="…">.
const ELEMENT = 'seatsmith-calculator';

// modeOf returns a block's kind: the element's mode attribute, or
// data-seatsmith.
function modeOf(host) {
  return host.getAttribute('data-seatsmith') || host.getAttribute('mode') || 'compact';
}

// blockDoc returns a block's scenario as the page wrote it, or null.
function blockDoc(host) {
  const data = host.querySelector('script[type="application/json"]');
  try {
    const b = JSON.parse(data ? data.textContent : '');
    return b && typeof b === 'object' && !Array.isArray(b) ? b : null;
  } catch (e) {
    return null;
  }
}

// findBlocks returns the calculator blocks in scope (a document, an
// element or a shadow root): either form of block.
export function findBlocks(scope) {
  return [...(scope || document).querySelectorAll(ROOT + ', ' + ELEMENT)];
}

// styledByPage reports whether the page's own stylesheet styles
// calculators (it sets --seatsmith-styled, as the site's does): its blocks
// then stay in the page, as prerendered.
function styledByPage(host) {
  return host.localName !== ELEMENT && !!getComputedStyle(host).getPropertyValue('--seatsmith-styled').trim();
}

// The calculators' stylesheet (seatsmith.css beside this file, or <meta
// name="seatsmith-style">), fetched once and shared by every shadow root.
let sheet = null;

function calculatorSheet() {
  if (!sheet) {
    const url = metaURL('seatsmith-style', 'seatsmith.css');
    sheet = fetch(url).then((r) => {
      if (!r.ok) throw new Error(r.status + ' for ' + url);
      return r.text();
    }).then((text) => {
      const s = new CSSStyleSheet();
      s.replaceSync(text);
      return s;
    });
  }
  return sheet;
}

// defaultFontSize is the reader's default font size (the keyword medium,
// which no page's root rule changes) in pixels, measured in shadow.
function defaultFontSize(shadow) {
  const probe = document.createElement('span');
  probe.style.fontSize = 'medium';
  shadow.appendChild(probe);
  const size = getComputedStyle(probe).fontSize;
  probe.remove();
  return /^[0-9.]+px$/.test(size) ? size : '16px';
}

// isolate gives a block its own shadow root holding the calculator's root
// and stylesheet, so that the page's styles and the calculator's leave
// each other alone; the page's content in the block (a line for readers
// whose browser cannot run the calculator) is no longer shown. It returns
// the root, or null where the browser has no shadow DOM.
function isolate(host) {
  if (typeof host.attachShadow !== 'function' || host.shadowRoot) return null;
  const shadow = host.attachShadow({ mode: 'open' });
  const root = document.createElement('div');
  root.className = 'seatsmith';
  root.setAttribute('data-seatsmith', modeOf(host));
  root.setAttribute('data-state', 'static');
  host.setAttribute('data-state', 'static');
  const show = () => {
    if (!root.isConnected) shadow.appendChild(root);
  };
  // The stylesheet's lengths follow --sc-root-size, not the host page's
  // root font size: it is the reader's default font size, measured here.
  const rootSize = ':host { --sc-root-size: ' + defaultFontSize(shadow) + '; }';
  if ('adoptedStyleSheets' in shadow && typeof CSSStyleSheet.prototype.replaceSync === 'function') {
    const own = new CSSStyleSheet();
    own.replaceSync(rootSize);
    // The root goes in once styled, so that it never shows unstyled.
    calculatorSheet().then((s) => {
      shadow.adoptedStyleSheets = [...shadow.adoptedStyleSheets, s, own];
    }, () => {}).then(show);
  } else {
    const l = document.createElement('link');
    l.rel = 'stylesheet';
    l.href = metaURL('seatsmith-style', 'seatsmith.css');
    const st = document.createElement('style');
    st.textContent = rootSize;
    shadow.append(l, st);
    show();
  }
  return root;
}

// COUNTS names the number of each unit by the block's count member.
const COUNTS = { population: 'Population', votes: 'Votes', students: 'Students', applications: 'Applications' };

// showNotLive puts into a root that has no prerendered result the line
// that the calculator is not live yet and the scenario's units as a plain
// table, which stay if it cannot start.
function showNotLive(root, host) {
  const line = document.createElement('p');
  line.className = 'sc-static-note';
  line.setAttribute('data-role', 'not-live');
  line.textContent = 'Not live yet: the calculator is starting.';
  root.appendChild(line);
  const b = blockDoc(host);
  if (!b || !Array.isArray(b.units) || !b.units.length) return;
  const t = document.createElement('table');
  t.setAttribute('data-role', 'fallback-units');
  const cap = document.createElement('caption');
  cap.textContent = (typeof b.title === 'string' && b.title ? b.title + ': ' : '') +
    (b.seats !== undefined ? String(b.seats) + ' seats' : 'the units');
  const head = document.createElement('tr');
  for (const h of ['Unit', COUNTS[b.count] || COUNTS.population]) {
    const th = document.createElement('th');
    th.scope = 'col';
    th.textContent = h;
    head.appendChild(th);
  }
  const thead = document.createElement('thead');
  thead.appendChild(head);
  const body = document.createElement('tbody');
  for (const u of b.units) {
    if (!u || typeof u !== 'object') continue;
    const tr = document.createElement('tr');
    const th = document.createElement('th');
    th.scope = 'row';
    th.textContent = String(u.name ?? '');
    const td = document.createElement('td');
    td.className = 'num';
    td.textContent = String(u.population ?? '');
    tr.append(th, td);
    body.appendChild(tr);
  }
  t.append(cap, thead, body);
  root.appendChild(t);
}

// mounted are the blocks already given a Calculator.
const mounted = new WeakSet();
const calcs = [];
// pageAnalysis: the page's first blocks need the analysis module, which
// then serves every block (it does all the calculator module does).
let pageAnalysis = false;

// NO_WASM is why a browser without WebAssembly cannot run the engine.
const NO_WASM = 'this browser has no WebAssembly, which the engine needs. Open the page in a current browser (or one where WebAssembly is allowed).';

// mount makes a Calculator of a block: in the page when the page styles
// calculators, else in its own shadow root.
function mount(host) {
  if (mounted.has(host)) return null;
  mounted.add(host);
  let root = host;
  let why = '';
  if (!styledByPage(host)) {
    root = isolate(host);
    if (!root) {
      // No shadow DOM: the block shows what it can in the page itself.
      root = host;
      for (const n of [...host.childNodes]) if (!(n.localName === 'script')) n.remove();
      why = 'this browser is too old for it (it has no custom elements or shadow DOM). Open the page in a current browser.';
    }
  }
  if (!root.querySelector('[data-part="output"]')) showNotLive(root, host);
  if (typeof WebAssembly !== 'object' || typeof WebAssembly.compile !== 'function') why = why || NO_WASM;
  const c = new Calculator(root, why ? null : engineFor(pageAnalysis || needsAnalysis(host)), host);
  calcs.push(c);
  if (why) c.fail(why);
  return c;
}

// start makes every calculator on the page live. The engine is fetched
// and compiled at once, while the calculators wait for it. Blocks added
// later in <seatsmith-calculator> elements start as they join the page.
export async function start() {
  const hosts = findBlocks(document);
  pageAnalysis = hosts.some(needsAnalysis);
  const own = hosts.map(mount).filter((c) => c);
  if (window.customElements && !customElements.get(ELEMENT)) {
    customElements.define(ELEMENT, class extends HTMLElement {
      connectedCallback() {
        const c = mount(this);
        if (c) c.begin();
      }
    });
  }
  window.addEventListener('hashchange', () => calcs.forEach((c) => c.reloadFromFragment()));
  await Promise.all(own.map((c) => c.begin()));
  return own;
}

if (document.readyState === 'loading') document.addEventListener('DOMContentLoaded', () => start());
else start();
