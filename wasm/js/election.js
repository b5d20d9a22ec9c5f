// The election block of the seatsmith site. Every <div data-election>
// holds its document (a <script type="application/json">), the controls
// (the threshold, the compensatory seats, every district's seats and every
// party's votes in it) and the results the site build computed. This
// module enables the controls and, after every edit, asks the page's
// analysis engine (which the bridge runs in a Web Worker) for the results
// under the three systems again. The engine hands them back as a tree of
// tags, attributes and text, built by the bridge with createElement and
// textContent: no HTML is parsed, so no name becomes markup.
//
// Test hooks: the root's data-state is "static" (built ahead), "live" (the
// engine computed it here) or "error" (the message is in the element with
// role="alert"; the results shown are the last good ones).

import { engineFor } from './bridge.js';
import { errorText, readDoc, showView, startBlocks } from './blocks.js';

const PAUSE = 150; // ms after the last keystroke before computing

class Block {
  constructor(root) {
    this.root = root;
    this.id = root.id;
    this.doc = readDoc(root);
    this.form = root.querySelector('[data-role="election-form"]');
    this.error = root.querySelector('[data-role="election-error"]');
    this.timer = 0;
    for (const fs of this.form.querySelectorAll('fieldset')) fs.disabled = false;
    const note = root.querySelector('#' + CSS.escape(this.id) + '-form-note');
    if (note) note.textContent = 'Change a number and the three results below follow, computed in your browser; nothing is sent anywhere.';
    this.form.addEventListener('submit', (e) => {
      e.preventDefault();
      this.compute();
    });
    this.form.addEventListener('input', () => {
      clearTimeout(this.timer);
      this.timer = setTimeout(() => this.compute(), PAUSE);
    });
  }

  // current is the block's document with the reader's numbers in it.
  current() {
    const d = JSON.parse(JSON.stringify(this.doc));
    for (const el of this.form.querySelectorAll('[data-field]')) {
      const v = el.value.trim();
      switch (el.dataset.field) {
        case 'threshold':
          if (v === '') delete d.threshold;
          else d.threshold = v;
          break;
        case 'compensatory':
          d.compensatory = v;
          break;
        case 'seats':
          if (d.districts && d.districts[+el.dataset.district]) d.districts[+el.dataset.district].seats = v;
          break;
        case 'votes':
          if (d.votes && d.votes[+el.dataset.row]) d.votes[+el.dataset.row].votes = v;
          break;
      }
    }
    return d;
  }

  async compute() {
    clearTimeout(this.timer);
    let r;
    try {
      r = await engineFor(true).call('election', [{ block: this.id, doc: JSON.stringify(this.current()) }], { owner: this });
    } catch (err) {
      r = { error: { message: errorText(err) } };
    }
    if (r === null) return; // superseded by a later edit
    if (!r || r.error) {
      this.fail(r && r.error && r.error.message ? r.error.message : 'the engine gave no answer');
      return;
    }
    try {
      showView(this.root, 'election-output', r.view, r.claims);
    } catch (err) {
      this.fail(errorText(err));
      return;
    }
    this.showError('');
    this.root.setAttribute('data-state', 'live');
  }

  showError(text) {
    this.error.textContent = text ? 'Not computed: ' + text + ' The results below are from the last numbers that worked.' : '';
    this.error.hidden = !text;
  }

  fail(text) {
    this.showError(text);
    this.root.setAttribute('data-state', 'error');
  }
}

startBlocks('div[data-election]', Block, 'compute');
