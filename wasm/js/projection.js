// The projection block of the seatsmith site. Every <div data-projection>
// holds its document (a <script type="application/json">), the controls,
// and the result the site build computed. This module enables the
// controls and runs the draws again in a Web Worker (projection-worker.js),
// which loads Go's wasm_exec.js and the engine inside the worker and
// makes the draws in chunks, so that the page stays responsive, shows
// progress and can cancel. The worker hands back the result as a tree of
// tags, attributes and text, built here with createElement and
// textContent: no HTML is parsed, so no text from the counts becomes
// markup.
//
// Test hooks: the root's data-state is "static" (built ahead), "running",
// "live" (the engine ran here) or "error" (the message is in the element
// with role="alert"); data-progress counts the draws made in the current
// run.

const SVG_NS = 'http://www.w3.org/2000/svg';
const TAGS = new Set(('a abbr button caption code col colgroup dd details div dl dt em fieldset figcaption figure form h2 h3 h4 ' +
  'input label legend li ol optgroup option output p section select small span strong summary table tbody td textarea tfoot th ' +
  'thead tr ul br hr mark b i sup sub svg g rect line text title desc path circle tspan').split(' '));
const URL_ATTRS = new Set(['href', 'src', 'xlink:href', 'action', 'formaction', 'srcset', 'style']);

function build(t, inSvg = false) {
  if (typeof t === 'string') return document.createTextNode(t);
  if (!Array.isArray(t) || typeof t[0] !== 'string' || !TAGS.has(t[0])) {
    throw new Error('the engine returned markup this page does not accept');
  }
  const svg = inSvg || t[0] === 'svg';
  const el = svg ? document.createElementNS(SVG_NS, t[0]) : document.createElement(t[0]);
  const attrs = t[1] || {};
  for (const k of Object.keys(attrs)) {
    if (/^on/i.test(k) || URL_ATTRS.has(k.toLowerCase()) || !/^[a-zA-Z][a-zA-Z0-9:._-]*$/.test(k)) continue;
    el.setAttribute(k, String(attrs[k]));
  }
  for (let i = 2; i < t.length; i++) el.appendChild(build(t[i], svg));
  return el;
}

function assetURL(name) {
  const m = document.querySelector('meta[name="' + name + '"]');
  return m && m.content ? new URL(m.content, document.baseURI).href : '';
}

function workerURL() {
  const s = document.querySelector('script[data-projection-worker]');
  if (s) return new URL(s.getAttribute('data-projection-worker'), document.baseURI).href;
  return new URL('projection-worker.js', import.meta.url).href;
}

let worker = null;
let nextRun = 1;
const blocks = new Map(); // run id → block

function getWorker() {
  if (worker) return worker;
  worker = new Worker(workerURL());
  worker.onmessage = (e) => {
    const m = e.data || {};
    const b = blocks.get(m.run);
    if (b) b.message(m);
  };
  worker.onerror = (e) => {
    e.preventDefault();
    for (const b of blocks.values()) b.fail('the background engine stopped: ' + (e.message || 'unknown error'));
    blocks.clear();
    worker = null;
  };
  return worker;
}

class Block {
  constructor(root) {
    this.root = root;
    this.id = root.id;
    const script = root.querySelector(':scope > script[type="application/json"]');
    this.doc = JSON.parse(script.textContent);
    this.form = root.querySelector('[data-role="projection-form"]');
    this.runButton = root.querySelector('[data-role="projection-run"]');
    this.cancelButton = root.querySelector('[data-role="projection-cancel"]');
    this.progress = root.querySelector('[data-role="projection-progress"]');
    this.bar = root.querySelector('[data-role="projection-progress-bar"]');
    this.status = root.querySelector('[data-role="projection-status"]');
    this.error = root.querySelector('[data-role="projection-error"]');
    this.run = 0;
    for (const el of this.form.querySelectorAll('fieldset, textarea')) el.disabled = false;
    this.runButton.disabled = false;
    const note = root.querySelector('#' + CSS.escape(this.id) + '-form-note');
    if (note) note.textContent = 'The draws run in the background of this page, in your browser; nothing is sent anywhere.';
    this.form.addEventListener('submit', (e) => {
      e.preventDefault();
      this.start();
    });
    this.cancelButton.addEventListener('click', () => this.cancel());
  }

  field(name) {
    const el = this.form.querySelector('[data-field="' + name + '"]');
    return el ? el.value : undefined;
  }

  config() {
    const c = Object.assign({}, this.doc);
    delete c.counts_file;
    for (const k of ['target', 'growth', 'error', 'rse', 'draws', 'seed', 'counts']) {
      const v = this.field(k);
      if (v !== undefined) c[k] = v;
    }
    if (this.doc.counts_file) c.counts_file = this.doc.counts_file;
    return c;
  }

  start() {
    if (this.run) this.cancel();
    const engine = assetURL('seatsmith-analysis-engine');
    const runtime = assetURL('seatsmith-runtime');
    this.run = nextRun++;
    blocks.set(this.run, this);
    this.showError('');
    this.root.setAttribute('data-state', 'running');
    this.root.setAttribute('data-progress', '0');
    this.setProgress(0, Number(this.field('draws')) || 0);
    this.status.textContent = 'Starting the engine…';
    this.runButton.disabled = true;
    this.cancelButton.disabled = false;
    getWorker().postMessage({ type: 'run', run: this.run, engine, runtime, block: this.id, config: this.config() });
  }

  cancel() {
    if (!this.run) return;
    if (worker) worker.postMessage({ type: 'cancel', run: this.run });
    blocks.delete(this.run);
    this.run = 0;
    this.finish();
    this.root.setAttribute('data-state', 'cancelled');
    this.status.textContent = 'Cancelled after ' + Number(this.root.getAttribute('data-progress') || 0).toLocaleString('en') +
      ' draws; the result below is from the previous run.';
  }

  finish() {
    this.runButton.disabled = false;
    this.cancelButton.disabled = true;
  }

  setProgress(done, total) {
    const pct = total > 0 ? Math.min(100, (100 * done) / total) : 0;
    this.bar.style.width = pct.toFixed(1) + '%';
    this.progress.setAttribute('aria-valuemax', String(total));
    this.progress.setAttribute('aria-valuenow', String(done));
    this.root.setAttribute('data-progress', String(done));
  }

  message(m) {
    if (m.run !== this.run) return;
    switch (m.type) {
      case 'progress':
        this.setProgress(m.done, m.total);
        this.status.textContent = m.done.toLocaleString('en') + ' of ' + m.total.toLocaleString('en') + ' draws made…';
        break;
      case 'result':
        blocks.delete(this.run);
        this.run = 0;
        this.finish();
        try {
          this.show(m.view, m.claims);
        } catch (err) {
          this.fail(String(err && err.message ? err.message : err));
          return;
        }
        this.setProgress(m.done, m.done);
        this.status.textContent = m.done.toLocaleString('en') + ' draws made in your browser.';
        this.root.setAttribute('data-state', 'live');
        break;
      case 'error':
        blocks.delete(this.run);
        this.run = 0;
        this.fail(m.message);
        break;
    }
  }

  show(view, claims) {
    const out = this.root.querySelector('[data-role="projection-output"]');
    const fresh = build(view);
    if (out) out.replaceWith(fresh);
    else this.root.appendChild(fresh);
    for (const c of claims || []) {
      for (const ref of document.querySelectorAll('[data-claim-ref="' + CSS.escape(c.id) + '"]')) {
        ref.setAttribute('data-holds', c.holds ? 'true' : 'false');
        ref.title = c.found;
      }
    }
  }

  showError(text) {
    this.error.textContent = text;
    this.error.hidden = !text;
  }

  fail(text) {
    this.finish();
    this.showError(text);
    this.status.textContent = '';
    this.root.setAttribute('data-state', 'error');
  }
}

function init() {
  for (const root of document.querySelectorAll('div[data-projection]')) {
    let b;
    try {
      b = new Block(root);
    } catch (err) {
      root.setAttribute('data-state', 'error');
      continue;
    }
    b.start();
  }
}

if (document.readyState === 'loading') document.addEventListener('DOMContentLoaded', init);
else init();
