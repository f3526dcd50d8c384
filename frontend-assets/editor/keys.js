// Keys on the plan. They act only while the plan canvas (or, for undo, redo, remove and help,
// the fault timeline) has the focus, so typing in a form or pressing Space on a checkbox never
// reaches a shortcut.
import { round } from './model.js';
import { $, canvas, editable, hooks, redo, state, undo } from './store.js';
import { cancelDraft, finishOutline, moveCursor, nudge, placeAtCursor, removePicked, setTool } from './tools.js';

const TOOL_KEYS = { s: 'pick', r: 'box-room', o: 'outline-room', d: 'door', f: 'fixture', z: 'zone', c: 'clutter', t: 'start', w: 'waypoint', p: 'place-fault', k: 'fault-target' };

/** Says where the keyboard cursor is, politely, for screen readers. */
function sayCursor(extra) {
  const c = state.cursor;
  const where = c ? `cursor x ${c[0].toFixed(2)} m, y ${c[1].toFixed(2)} m` : '';
  $('ed-cursor').textContent = [where, extra].filter((s) => s).join('. ');
}

/** The keyboard cursor starts at the middle of the view, on the grid. */
function ensureCursor() {
  if (!state.cursor) {
    const x = state.view.wx(canvas.clientWidth / 2);
    const y = state.view.wy(canvas.clientHeight / 2);
    state.cursor = [round(x, state.grid), round(y, state.grid)];
  }
}

function onKey(e) {
  if (e.ctrlKey || e.metaKey || e.altKey) {
    return;
  }
  const k = e.key;
  const drawing = editable && state.tool !== 'pick';
  if (k === 'Escape') {
    cancelDraft();
    sayCursor('Drawing cancelled');
    hooks.redraw();
  } else if ((k === 'Enter' || k === ' ') && drawing) {
    ensureCursor();
    sayCursor(placeAtCursor());
    hooks.refresh();
  } else if (k === 'Enter' && state.draft && state.tool === 'outline-room') {
    finishOutline();
  } else if (k === 'h' || k === '?') {
    $('ed-keys').showModal();
  } else if (k === 'u') {
    undo();
  } else if (k === 'U') {
    redo();
  } else if (k === 'x' || k === 'Delete' || k === 'Backspace') {
    removePicked();
  } else if (k === 'g') {
    state.snap = !state.snap;
    $('ed-snap').checked = state.snap;
  } else if (k === '+' || k === '=') {
    state.view.zoomAt(canvas.clientWidth / 2, canvas.clientHeight / 2, 1.25);
    hooks.redraw();
  } else if (k === '-') {
    state.view.zoomAt(canvas.clientWidth / 2, canvas.clientHeight / 2, 0.8);
    hooks.redraw();
  } else if (k === '0') {
    hooks.fit();
  } else if (k.startsWith('Arrow')) {
    const dx = k === 'ArrowLeft' ? -1 : k === 'ArrowRight' ? 1 : 0;
    const dy = k === 'ArrowDown' ? -1 : k === 'ArrowUp' ? 1 : 0;
    if (drawing) {
      ensureCursor();
      moveCursor(dx, dy, e.shiftKey);
      sayCursor('');
      hooks.redraw();
    } else {
      nudge(dx, dy);
    }
  } else if (TOOL_KEYS[k]) {
    setTool(TOOL_KEYS[k]);
  } else {
    return;
  }
  e.preventDefault();
}

const TIMELINE_KEYS = new Set(['u', 'U', 'x', 'Delete', 'Backspace', 'h', '?']);

export function wireKeys() {
  canvas.addEventListener('keydown', onKey);
  $('ed-track').addEventListener('keydown', (e) => {
    if (TIMELINE_KEYS.has(e.key)) {
      onKey(e);
    }
  });
}
