// The projection block of the seatsmith site. Every <div data-projection>
// holds its document (a <script type="application/json">), the controls,
// and the result the site build computed. This module enables the
// controls and runs the draws again on the page's analysis engine, which
// the bridge runs in a Web Worker: the draws are made in chunks, so that
// the page stays responsive, shows progress and can cancel. The engine
// hands back the result as a tree of tags, attributes and text, built by
// the bridge with createElement and textContent: no HTML is parsed, so no
// text from the counts becomes markup.
//
// Test hooks: the root's data-state is "static" (built ahead), "running",
// "live" (the engine ran here), "cancelled" or "error" (the message is in
// the element with role="alert"); data-progress counts the draws made in
// the current run.

import { engineFor } from './bridge.js';
import { errorText, readDoc, showView, startBlocks } from './blocks.js';

class Block {
  constructor(root) {
    this.root = root;
    this.id = root.id;
    this.doc = readDoc(root);
    this.form = root.querySelector('[data-role="projection-form"]');
    this.runButton = root.querySelector('[data-role="projection-run"]');
    this.cancelButton = root.querySelector('[data-role="projection-cancel"]');
    this.progress = root.querySelector('[data-role="projection-progress"]');
    this.bar = root.querySelector('[data-role="projection-progress-bar"]');
    this.status = root.querySelector('[data-role="projection-status"]');
    this.error = root.querySelector('[data-role="projection-error"]');
    this.running = false;
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

  async start() {
    if (this.running) this.cancel();
    this.running = true;
    this.showError('');
    this.root.setAttribute('data-state', 'running');
    this.root.setAttribute('data-progress', '0');
    this.setProgress(0, Number(this.field('draws')) || 0);
    this.status.textContent = 'Starting the engine\u2026';
    this.runButton.disabled = true;
    this.cancelButton.disabled = false;
    const progress = (done, total) => {
      this.setProgress(done, total);
      this.status.textContent = done.toLocaleString('en') + ' of ' + total.toLocaleString('en') + ' draws made\u2026';
    };
    let r;
    try {
      r = await engineFor(true).project(this.config(), this.id, { owner: this, progress });
    } catch (err) {
      r = { error: { message: errorText(err) } };
    }
    if (r === null) return; // cancelled, or another run started
    this.running = false;
    if (r.error) {
      this.fail(r.error.message);
      return;
    }
    this.finish();
    try {
      showView(this.root, 'projection-output', r.view, r.claims);
    } catch (err) {
      this.fail(errorText(err));
      return;
    }
    this.setProgress(r.done, r.done);
    this.status.textContent = r.done.toLocaleString('en') + ' draws made in your browser.';
    this.root.setAttribute('data-state', 'live');
  }

  cancel() {
    if (!this.running) return;
    this.running = false;
    engineFor(true).stop(this);
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

startBlocks('div[data-projection]', Block, 'start');
