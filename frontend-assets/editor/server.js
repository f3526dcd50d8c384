// Calls to the server: the live check, saving a revision, the settings forms (htmx) and the
// floor plan import.
import { freshId, itemOfPath, listOf, rect } from './model.js';
import { renderProblems } from './panels.js';
import { $, canvas, change, doc, hooks, notice, root, setDirty, snapshot, state, token } from './store.js';

let base = Number(root.dataset.base);

/** The CSRF header the layout puts on <body> for htmx; fetch() posts send the same. */
export function csrfHeaders() {
  try {
    return JSON.parse(document.body.getAttribute('hx-headers') || '{}');
  } catch {
    return {};
  }
}

// ---- the live check ------------------------------------------------------------------------

let checkTimer = null;
let checkSeq = 0;

export function scheduleCheck() {
  clearTimeout(checkTimer);
  $('ed-check-state').textContent = 'checking...';
  checkTimer = setTimeout(runCheck, 250);
}

export async function runCheck() {
  const seq = ++checkSeq;
  const sent = snapshot();
  try {
    const res = await fetch(`/s/${token}/editor/check`, {
      method: 'POST',
      headers: { 'Content-Type': 'application/json', ...csrfHeaders() },
      body: sent,
    });
    if (seq !== checkSeq) {
      return;
    }
    if (!res.ok) {
      $('ed-check-state').textContent = `check unavailable (${res.status})`;
      return;
    }
    const body = await res.json();
    // the pieces count only for the document they were cut from
    if (snapshot() === sent) {
      state.walls = body.walls || null;
      hooks.redraw();
    }
    renderProblems($('ed-problems'), $('ed-check-state'), body.problems, pickPath);
    root.dataset.checked = String(seq);
  } catch {
    $('ed-check-state').textContent = 'check unavailable: no connection';
  }
}

/** Picks what a problem's path refers to; settings paths open and focus their form field. */
function pickPath(path) {
  const sel = itemOfPath(path);
  if (sel && (sel.list === 'start' || listOf(doc, sel.list)[sel.index])) {
    hooks.pick(sel);
    canvas.focus();
    return;
  }
  const m = /^(robot|rangefinder|localizer)\.?([\w.]*)/.exec(path);
  if (m) {
    const form = $(`settings-${m[1]}`);
    if (form) {
      form.closest('details').open = true;
      const input = form.querySelector(`[name="${(m[2] || '').split('.').slice(0, 2).join('_')}"]`) || form.querySelector('input, select');
      if (input) {
        input.focus();
      }
    }
  }
}

// ---- saving --------------------------------------------------------------------------------

export async function save(e) {
  e.preventDefault();
  const message = $('ed-message').value.trim() || 'Edited in the editor';
  const button = $('ed-save-button');
  button.disabled = true;
  const sent = JSON.stringify(doc, null, 2);
  try {
    const res = await fetch(`/api/s/${token}/revisions?base=${base}&message=${encodeURIComponent(message)}`, {
      method: 'POST',
      headers: { 'Content-Type': 'application/json', Accept: 'application/json' },
      body: sent,
    });
    const body = await res.json().catch(() => ({}));
    if (res.status === 201) {
      base = body.number;
      $('ed-revision').textContent = `revision ${base}`;
      $('ed-message').value = '';
      setDirty(false);
      // what was stored, so a check after a reload can compare against it
      root.dataset.savedDocument = sent;
      notice(`Saved as revision ${base}.`, 'good');
    } else if (res.status === 409) {
      notice(`${body.detail || 'Not saved: someone saved a newer revision.'} Reload to see theirs (your changes here are dropped), or keep editing and copy what you need first.`, 'bad', [
        ['Reload the latest revision', () => { setDirty(false); window.location.reload(); }],
        ['Keep editing', () => { $('ed-notice').hidden = true; }],
      ]);
    } else if (res.status === 422) {
      notice('Not saved: the scenario has errors. They are listed under Check; click one to find it.', 'bad');
      renderProblems($('ed-problems'), $('ed-check-state'), body.problems || [], pickPath);
    } else if (res.status === 403) {
      notice('Not saved: this is a view link, editing is refused.', 'bad');
    } else if (res.status === 404) {
      notice('Not saved: this link was revoked or the scenario is gone.', 'bad');
    } else {
      notice(`Not saved: ${body.detail || `the server answered ${res.status}`}.`, 'bad');
    }
  } catch {
    notice('Not saved: no connection to the server. Your changes are still here; try again.', 'bad');
  } finally {
    button.disabled = false;
  }
}

// ---- settings forms (server-rendered, checked by htmx) -------------------------------------

export function wireSettingsForms() {
  document.body.addEventListener('htmx:configRequest', (e) => {
    const form = e.detail.elt;
    if (form && form.classList && form.classList.contains('settings-form')) {
      e.detail.parameters.document = JSON.stringify(doc);
    }
  });
  document.body.addEventListener('htmx:afterSettle', (e) => {
    const form = e.detail.elt && e.detail.elt.classList && e.detail.elt.classList.contains('settings-form')
      ? e.detail.elt : null;
    const taken = form || document.querySelector('.settings-form[data-section-json]');
    if (taken && taken.dataset.sectionJson) {
      const section = taken.dataset.section;
      const value = JSON.parse(taken.dataset.sectionJson);
      delete taken.dataset.sectionJson;
      change((d) => {
        d[section] = value;
      });
    }
  });
}

/** After undo or redo, the settings inputs show what the document now holds. */
export function syncSettingsForms() {
  // the gates and variants forms are lists; their rows come back from the server on their next change
  for (const form of document.querySelectorAll('.settings-form:not(.gates-form):not(.variants-form)')) {
    const section = doc[form.dataset.section] || {};
    for (const input of form.querySelectorAll('input, select')) {
      const value = input.name.split('_').reduce((o, k) => (o == null ? undefined : o[k]), section);
      input.value = value === undefined || value === null ? '' : String(value);
    }
  }
}

// ---- floor plan import ---------------------------------------------------------------------

export async function importImage(e) {
  e.preventDefault();
  const form = e.target;
  const msg = $('ed-import-msg');
  msg.textContent = 'Reading the image...';
  try {
    const res = await fetch(`/s/${token}/editor/import`, { method: 'POST', headers: csrfHeaders(), body: new FormData(form) });
    const body = await res.json().catch(() => ({}));
    if (res.status === 413) {
      msg.textContent = 'Not imported: the file is larger than the 2 MB upload limit.';
      return;
    }
    if (!res.ok) {
      msg.textContent = `Not imported: ${body.message || body.detail || `the server answered ${res.status}`}`;
      return;
    }
    if (!body.blocks.length && !$('ed-import-room').checked) {
      msg.textContent = 'No dark pixels found, so nothing was added.';
      return;
    }
    const withRoom = $('ed-import-room').checked && body.extent;
    change((d) => {
      if (withRoom) {
        const x = body.extent;
        d.site.rooms.push({ id: freshId(d.site.rooms, 'imported-area'), name: 'Imported area', outline: rect(x.x0, x.y0, x.x1, x.y1) });
      }
      for (const b of body.blocks) {
        d.site.fixtures.push({ id: freshId(d.site.fixtures, 'wall-block'), name: 'Imported wall', outline: rect(b.x0, b.y0, b.x1, b.y1) });
      }
    });
    msg.textContent = withRoom
      ? `Added ${body.blocks.length} wall block(s) as fixtures inside a room the size of the image.`
      : `Added ${body.blocks.length} wall block(s) as fixtures. Draw a room around them so the robot has a site.`;
    hooks.fit();
  } catch {
    msg.textContent = 'Not imported: no connection to the server.';
  }
}
