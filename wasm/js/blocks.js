// What the projection and election blocks' page scripts share: reading a
// block's document, putting the engine's view in place of the block's
// results, marking the claims it checked, and starting every block once
// the page has loaded.

import { build } from './bridge.js';

// readDoc is the block's document: the JSON in the root's own
// <script type="application/json">.
export function readDoc(root) {
  const script = root.querySelector(':scope > script[type="application/json"]');
  return JSON.parse(script.textContent);
}

// errorText is the message of err, whatever was thrown.
export function errorText(err) {
  return String(err && err.message ? err.message : err);
}

// showView builds the engine's view (a tree of tags, attributes and text;
// no HTML is parsed) in place of the root's element with data-role=role,
// and marks every reference on the page to a claim the engine checked.
export function showView(root, role, view, claims) {
  const out = root.querySelector('[data-role="' + role + '"]');
  const fresh = build(view);
  if (out) out.replaceWith(fresh);
  else root.appendChild(fresh);
  for (const c of claims || []) {
    for (const ref of document.querySelectorAll('[data-claim-ref="' + CSS.escape(c.id) + '"]')) {
      ref.setAttribute('data-holds', c.holds ? 'true' : 'false');
      ref.title = c.found;
    }
  }
}

// startBlocks makes a Block of every element matching selector, once the
// page has loaded, and calls the block's method (its first run). A root
// whose block cannot be made gets data-state="error".
export function startBlocks(selector, Block, method) {
  const init = () => {
    for (const root of document.querySelectorAll(selector)) {
      let b;
      try {
        b = new Block(root);
      } catch (err) {
        root.setAttribute('data-state', 'error');
        continue;
      }
      b[method]();
    }
  };
  if (document.readyState === 'loading') document.addEventListener('DOMContentLoaded', init);
  else init();
}
