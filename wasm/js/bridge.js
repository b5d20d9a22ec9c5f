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
// The bridge loads Go's wasm_exec.js and the seatsmith engine (from the
// same folder as this file unless <meta name="seatsmith-engine"> and
// <meta name="seatsmith-runtime"> name other URLs, or from an inlined
// <script type="application/octet-stream" data-seatsmith-engine> block in a
// self-contained page), then renders each calculator with the engine's
// `calculator` function. The engine returns markup as a tree of tags, text
// and attributes; the bridge builds DOM nodes from it and never parses
// HTML, so names and other text from the user always show as text.
//
// data-seatsmith names the kind of block: "compact" or "full" for a
// calculator, "sweep" (seats across a range of house sizes), "growth" (two
// population counts) or "admit" (a new unit joins). The engine renders
// every kind; the bridge only keeps the edited scenario and its fields.
//
// Each calculator root carries data-state: "static" (rendered ahead of
// time), "live" (the engine has run here) or "error" (with the message
// shown). The edited scenario is kept in the URL fragment as
// #ID=BASE64URL(JSON), written once the reader pauses, so a link
// reproduces the same view.

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

async function instantiate(go, analysis) {
  const inline = document.querySelector('script[type="application/octet-stream"][data-seatsmith-engine]');
  if (inline) {
    let bytes = base64Bytes(inline.textContent);
    if (inline.getAttribute('data-encoding') === 'gzip') {
      const stream = new Blob([bytes]).stream().pipeThrough(new DecompressionStream('gzip'));
      bytes = await new Response(stream).arrayBuffer();
    }
    return (await WebAssembly.instantiate(bytes, go.importObject)).instance;
  }
  const url = analysis ? metaURL('seatsmith-analysis-engine', 'seatsmith-analysis.wasm') : metaURL('seatsmith-engine', 'seatsmith.wasm');
  if (WebAssembly.instantiateStreaming && /^https?:/.test(url)) {
    try {
      return (await WebAssembly.instantiateStreaming(fetch(url), go.importObject)).instance;
    } catch (e) {
      // A server that sends the wrong MIME type: fall back to a buffer.
    }
  }
  const resp = await fetch(url);
  if (!resp.ok) throw new Error('could not load the engine (' + resp.status + ')');
  return (await WebAssembly.instantiate(await resp.arrayBuffer(), go.importObject)).instance;
}

let enginePromise = null;

// engine loads the seatsmith engine once and resolves to its API object:
// the analysis module when analysis is true (a superset of the calculator
// module, for variation blocks and paradox claims), else the calculator
// module.
export function engine(analysis) {
  if (!enginePromise) {
    enginePromise = (async () => {
      if (!globalThis.Go) await loadScript(metaURL('seatsmith-runtime', 'wasm_exec.js'));
      const go = new globalThis.Go();
      const instance = await instantiate(go, analysis);
      go.run(instance).catch(() => {});
      for (let i = 0; i < 200 && !(globalThis.seatsmith && globalThis.seatsmith.calculator); i++) {
        await new Promise((r) => setTimeout(r, 10));
      }
      const api = globalThis.seatsmith;
      if (!api || typeof api.calculator !== 'function') throw new Error('the engine started but offers no calculator');
      return api;
    })();
  }
  return enginePromise;
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

function encodeScenario(obj) {
  const bytes = new TextEncoder().encode(JSON.stringify(obj));
  let bin = '';
  for (let i = 0; i < bytes.length; i += 0x8000) bin += String.fromCharCode.apply(null, bytes.subarray(i, i + 0x8000));
  return btoa(bin).replace(/\+/g, '-').replace(/\//g, '_').replace(/=+$/, '');
}

function decodeScenario(s) {
  if (!/^[A-Za-z0-9_-]*$/.test(s)) throw new Error('the link holds characters that are not part of a scenario');
  let b = s.replace(/-/g, '+').replace(/_/g, '/');
  while (b.length % 4) b += '=';
  let bytes;
  try {
    bytes = base64Bytes(b);
  } catch (e) {
    throw new Error('the link is damaged (not valid base64)');
  }
  let text;
  try {
    text = new TextDecoder('utf-8', { fatal: true }).decode(bytes);
  } catch (e) {
    throw new Error('the link is damaged (not valid text)');
  }
  let v;
  try {
    v = JSON.parse(text);
  } catch (e) {
    throw new Error('the link is damaged (not valid JSON)');
  }
  if (!v || typeof v !== 'object' || Array.isArray(v)) throw new Error('the link does not hold a scenario');
  return v;
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

class Calculator {
  constructor(root, api) {
    this.root = root;
    this.api = api;
    if (!root.id) root.id = 'calculator-' + ++counter;
    this.id = root.id;
    const mode = root.getAttribute('data-seatsmith');
    this.mode = MODES.has(mode) ? mode : 'compact';
    const data = root.querySelector('script[type="application/json"]');
    this.blockText = data ? data.textContent : '';
    this.scenario = null;
    this.timer = 0;
    this.marginTimer = 0;
    // The folded sections the reader opened or closed, by class, kept
    // through edits, errors included.
    this.folds = new Map();
  }

  call(extra) {
    // The scenario goes as JSON text: one string crosses into the engine
    // far faster than an object it must read member by member.
    const text = this.scenario == null ? null : JSON.stringify(this.scenario);
    // The seat order is laid out only while its section is open: for a
    // large house it is the longest part of the results.
    const order = this.folds.get('sc-order') === true || !!this.root.querySelector('details.sc-order[open]');
    const req = Object.assign({ block_text: this.blockText, id: this.id, mode: this.mode, scenario_text: text, order }, extra);
    let r;
    try {
      r = this.api.calculator(req);
    } catch (e) {
      r = { error: { message: String(e && e.message ? e.message : e) } };
    }
    if (!r || typeof r !== 'object') r = { error: { message: 'the engine gave no answer' } };
    if (!r.state) {
      // An error from the API layer itself: the request never reached the calculator.
      const m = r.error && r.error.message ? r.error.message : 'the engine gave no answer';
      r = { state: 'error', fatal: true, error: { message: m } };
    }
    return r;
  }

  start() {
    let linked = null;
    let linkError = '';
    const frag = fragmentParts();
    if (frag.has(this.id)) {
      try {
        linked = decodeScenario(frag.get(this.id));
      } catch (e) {
        linkError = e.message;
      }
    }
    this.scenario = linked;
    // Margins that need a search come at once for a small scenario (as the
    // page prerendered them) and on request for a large one.
    let r = this.call({ editor: true, margins: false });
    if (r.margins_pending && r.margins_auto) r = this.call({ editor: true });
    if (r.fatal) {
      this.fail(r.error.message);
      return;
    }
    this.apply(r, true);
    if (linkError) {
      this.notice('The numbers in this link could not be read: ' + linkError + '. Showing the page\u2019s own numbers.', true);
    }
    this.wire();
  }

  fail(message) {
    this.root.setAttribute('data-state', 'error');
    let box = this.root.querySelector('[data-role="engine-error"]');
    if (!box) {
      box = document.createElement('p');
      box.className = 'sc-error';
      box.setAttribute('role', 'alert');
      box.setAttribute('data-role', 'engine-error');
      this.root.insertBefore(box, this.root.firstChild);
    }
    box.textContent = 'The live calculator could not start: ' + message +
      (this.root.querySelector('[data-part="output"]') ? ' The numbers shown were computed when the page was built.' : '');
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
    if (r.scenario) this.scenario = r.scenario;
    if (withEditor && r.editor) this.replacePart('editor', r.editor);
    if (r.output) this.replacePart('output', r.output);
    const err = this.root.querySelector('[data-role="engine-error"]');
    if (err) err.remove();
    this.root.setAttribute('data-state', r.state === 'live' ? 'live' : 'error');
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

  // refresh recomputes after an edit. Margins that need a search (largest
  // remainders, thresholds) are left out so that typing stays quick, and
  // asked for once the reader pauses.
  refresh(withEditor, extra) {
    clearTimeout(this.marginTimer);
    const r = this.call(Object.assign({ editor: withEditor, margins: false }, extra || {}));
    if (r.fatal) {
      this.fail(r.error.message);
      return r;
    }
    const focus = document.activeElement;
    const key = focus && this.root.contains(focus) ? focus.getAttribute('data-field') || focus.getAttribute('data-action') : null;
    // The link is written before the results go into the page: the browser
    // records the page's layout with each history entry, and while the new
    // results are not yet laid out that would lay out the whole page first.
    if (r.scenario) this.scenario = r.scenario;
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
    parts.set(this.id, encodeScenario(this.scenario));
    const h = [...parts].map(([k, v]) => encodeURIComponent(k) + '=' + v).join('&');
    history.replaceState(history.state, '', '#' + h);
  }

  link() {
    const parts = fragmentParts();
    parts.set(this.id, encodeScenario(this.scenario));
    const u = new URL(location.href);
    u.hash = [...parts].map(([k, v]) => encodeURIComponent(k) + '=' + v).join('&');
    return u.href;
  }

  onAction(action, button) {
    const s = this.scenario;
    switch (action) {
      case 'add-unit': {
        s.units = Array.isArray(s.units) ? s.units : [];
        s.units.push({ name: 'Unit ' + (s.units.length + 1), population: '0' });
        this.refresh(true);
        const last = this.root.querySelector('[data-field="units.' + (s.units.length - 1) + '.name"]');
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
          this.refresh(true);
          const next = this.root.querySelector('[data-action="remove-unit"][data-index="' + Math.min(k, s.units.length - 1) + '"]');
          if (next) next.focus();
          this.notice('Removed unit ' + (k + 1) + '.', false);
        } else {
          this.notice('A scenario needs at least one unit.', true);
        }
        break;
      }
      case 'margins': {
        this.refresh(false, { margins: true });
        const t = this.root.querySelector('.sc-results-wrap .sc-scroll');
        if (t) t.focus();
        break;
      }
      case 'reset': {
        this.scenario = null;
        this.refresh(true);
        this.notice('Back to the page\u2019s own numbers.', false);
        break;
      }
      case 'use-csv': {
        const ta = this.root.querySelector('[data-field="csv"]');
        const text = ta ? ta.value : '';
        if (!text.trim()) {
          this.notice('Paste a CSV table first: a header row (name,population) and one row a unit.', true);
          break;
        }
        const r = this.refresh(true, { load: { name: 'pasted table', text } });
        if (!r.load_error) this.notice('Loaded ' + (this.scenario.units || []).length + ' units from the table.', false);
        break;
      }
      case 'export-csv':
      case 'export-json': {
        const r = this.call({ export: true });
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
    file.text().then((text) => {
      const r = this.refresh(true, { load: { name: file.name, text } });
      if (!r.load_error) this.notice('Loaded ' + file.name + '.', false);
    }, () => this.notice('The file could not be read.', true));
    input.value = '';
  }

  reloadFromFragment() {
    const frag = fragmentParts();
    if (!frag.has(this.id)) return;
    try {
      const v = decodeScenario(frag.get(this.id));
      if (JSON.stringify(v) === JSON.stringify(this.scenario)) return;
      this.scenario = v;
      this.refresh(true);
    } catch (e) {
      this.notice('The numbers in this link could not be read: ' + e.message + '.', true);
    }
  }
}

function ensureStyles(root) {
  if (getComputedStyle(root).getPropertyValue('--seatsmith-styled').trim()) return;
  if (document.querySelector('link[data-seatsmith-style]')) return;
  const l = document.createElement('link');
  l.rel = 'stylesheet';
  l.href = metaURL('seatsmith-style', 'seatsmith.css');
  l.setAttribute('data-seatsmith-style', '');
  document.head.appendChild(l);
}

// PARADOX_KINDS are the claim kinds that only the analysis module checks.
const PARADOX_KINDS = new Set(['no-alabama', 'no-quota-violation', 'population-paradox', 'no-population-paradox', 'new-states', 'no-new-states']);

// needsAnalysis reports whether a block needs the analysis module: a
// variation block (sweep, growth, admit) or a block with a paradox claim.
function needsAnalysis(root) {
  const mode = root.getAttribute('data-seatsmith');
  if (mode === 'sweep' || mode === 'growth' || mode === 'admit') return true;
  const data = root.querySelector('script[type="application/json"]');
  try {
    const b = JSON.parse(data ? data.textContent : '{}');
    return Array.isArray(b.claims) && b.claims.some((c) => c && PARADOX_KINDS.has(c.kind));
  } catch (e) {
    return false;
  }
}

// start makes every calculator on the page live.
export async function start() {
  const roots = [...document.querySelectorAll(ROOT)];
  if (!roots.length) return [];
  ensureStyles(roots[0]);
  let api;
  try {
    api = await engine(roots.some(needsAnalysis));
  } catch (e) {
    for (const root of roots) new Calculator(root, null).fail(e.message || String(e));
    return [];
  }
  const calcs = [];
  for (const root of roots) {
    const c = new Calculator(root, api);
    try {
      c.start();
    } catch (e) {
      c.fail(e.message || String(e));
    }
    calcs.push(c);
  }
  window.addEventListener('hashchange', () => calcs.forEach((c) => c.reloadFromFragment()));
  return calcs;
}

if (document.readyState === 'loading') document.addEventListener('DOMContentLoaded', () => start());
else start();
