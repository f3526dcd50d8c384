// The editor's document and drawing state, undo steps and the notice line. Every module reads
// the document through the live binding `doc`; only this module replaces it.
import { History, listOf, normalise } from './model.js';
import { View } from './plan.js';

export const root = document.getElementById('editor');
export const token = root.dataset.token;
export const editable = root.dataset.editable === 'true';
export const canvas = document.getElementById('ed-plan');
export const $ = (id) => document.getElementById(id);

export let doc = normalise(JSON.parse(root.dataset.document));
export const history = new History();

/** What the plan shows and how the next pointer or key acts; `cursor` is the keyboard cursor in metres. */
export const state = {
  view: new View(),
  pick: null,
  tool: 'pick',
  grid: 0.25,
  snap: true,
  draft: null,
  snapMark: null,
  labels: true,
  cursor: null,
  // wall pieces from the last check of the current document; null until it answers
  walls: null,
};

/** What the other modules do after a change: set by editor.js (redraw, panels, the live check). */
export const hooks = {
  refresh() {},
  redraw() {},
  fit() {},
  pick() {},
  scheduleCheck() {},
  settingsChanged() {},
};

let dirty = false;

export function snapshot() {
  return JSON.stringify(doc);
}

/** Applies one change as one undo step. */
export function change(mutate) {
  if (!editable) {
    notice('This is a view link: editing is refused.', 'bad');
    return;
  }
  const before = snapshot();
  mutate(doc);
  if (snapshot() === before) {
    return;
  }
  history.record(before);
  afterChange();
}

export function afterChange() {
  state.walls = null;
  setDirty(true);
  hooks.refresh();
  hooks.scheduleCheck();
}

export function pickedItem() {
  const p = state.pick;
  if (!p) {
    return null;
  }
  return p.list === 'start' ? doc.route.start : listOf(doc, p.list)[p.index] || null;
}

function restore(json) {
  if (json === null) {
    return;
  }
  doc = normalise(JSON.parse(json));
  if (state.pick && !pickedItem()) {
    state.pick = null;
  }
  hooks.settingsChanged();
  afterChange();
}

export function undo() {
  if (editable) {
    restore(history.undo(snapshot()));
  }
}

export function redo() {
  if (editable) {
    restore(history.redo(snapshot()));
  }
}

export function isDirty() {
  return dirty;
}

export function setDirty(on) {
  dirty = on;
  const d = $('ed-dirty');
  if (d) {
    d.textContent = on ? 'unsaved changes' : 'no unsaved changes';
    d.classList.toggle('bad', on);
  }
}

export function notice(text, tone, actions = []) {
  const n = $('ed-notice');
  n.replaceChildren();
  n.className = `ed-notice ${tone || ''}`;
  const p = document.createElement('p');
  p.textContent = text;
  n.append(p);
  for (const [label, fn] of actions) {
    const b = document.createElement('button');
    b.type = 'button';
    b.textContent = label;
    b.className = 'quiet';
    b.addEventListener('click', fn);
    n.append(b);
  }
  n.hidden = false;
}
