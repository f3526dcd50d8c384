// The scenario editor's entry: draws the plan, rebuilds the panels after each change and wires
// the page. The page carries the document and the links in data attributes of #editor, because
// the content security policy allows no inline scripts. The work is split by concern: store.js
// (document, drawing state, undo), hits.js (snapping, hit tests), tools.js (tools, pointer),
// keys.js (keys on the plan), items.js (the plan in words, adding by coordinates), server.js
// (check, save, settings forms, import).
import { bounds, newFault, placeIds, setPath } from './model.js';
import { COLOURS, draw } from './plan.js';
import { applyField, renderProps, renderRoute, renderTimeline } from './panels.js';
import { $, canvas, change, doc, editable, history, hooks, isDirty, redo, root, state, undo } from './store.js';
import { importImage, runCheck, save, scheduleCheck, syncSettingsForms, wireSettingsForms } from './server.js';
import { removePicked, setTool, wirePointer } from './tools.js';
import { wireKeys } from './keys.js';
import { renderItems, wireItems } from './items.js';

const ctx = canvas.getContext('2d');

window.addEventListener('beforeunload', (e) => {
  if (isDirty()) {
    e.preventDefault();
    e.returnValue = '';
  }
});

// ---- drawing -------------------------------------------------------------------------------

function resize() {
  const r = canvas.getBoundingClientRect();
  const dpr = window.devicePixelRatio || 1;
  canvas.width = Math.max(200, Math.round(r.width * dpr));
  canvas.height = Math.max(200, Math.round(r.height * dpr));
  redraw();
}

/** The keyboard cursor: a cross with a ring, drawn over the plan while a drawing tool is on. */
function drawCursor() {
  const c = state.cursor;
  if (!c || state.tool === 'pick') {
    return;
  }
  const x = state.view.sx(c[0]);
  const y = state.view.sy(c[1]);
  ctx.save();
  ctx.strokeStyle = COLOURS.pick;
  ctx.lineWidth = 2;
  ctx.beginPath();
  ctx.moveTo(x - 12, y);
  ctx.lineTo(x + 12, y);
  ctx.moveTo(x, y - 12);
  ctx.lineTo(x, y + 12);
  ctx.stroke();
  ctx.beginPath();
  ctx.arc(x, y, 6, 0, 2 * Math.PI);
  ctx.stroke();
  ctx.restore();
}

function redraw() {
  const dpr = window.devicePixelRatio || 1;
  ctx.setTransform(dpr, 0, 0, dpr, 0, 0);
  draw(ctx, canvas.width / dpr, canvas.height / dpr, doc, state);
  drawCursor();
  // lets tests and tools map metres to canvas pixels
  canvas.dataset.view = JSON.stringify({ scale: state.view.scale, ox: state.view.ox, oy: state.view.oy, dpr });
  canvas.dataset.cursor = state.cursor ? state.cursor.join(',') : '';
}

function fit() {
  const dpr = window.devicePixelRatio || 1;
  state.view.fit(bounds(doc), canvas.width / dpr, canvas.height / dpr);
  redraw();
}

/** The fault form's trigger choices: a time, or entering any room or floor zone of the plan. */
function refreshFaultTriggers() {
  const when = $('ed-fault-when');
  if (!when) {
    return;
  }
  const ids = placeIds(doc);
  const keep = ids.includes(when.value) ? when.value : '';
  when.replaceChildren(new Option('at the time given', ''), ...ids.map((id) => new Option(`on entering ${id}`, id)));
  when.value = keep;
  $('ed-fault-at').disabled = keep !== '';
}

const REBUILT = ['ed-route', 'ed-props', 'ed-items', 'ed-track'];
const FOCUSABLE = 'button, input, select, textarea, a[href], [tabindex]';

/**
 * Rebuilding a panel drops the element that had the focus; this notes which panel and which
 * control (by position) had it, and focuses the same place in the rebuilt panel.
 */
function keepingFocus(rebuild) {
  const active = document.activeElement;
  const host = active && REBUILT.map((id) => $(id)).find((h) => h && h !== active && h.contains(active));
  const at = host ? [...host.querySelectorAll(FOCUSABLE)].indexOf(active) : -1;
  rebuild();
  if (host && !host.contains(document.activeElement)) {
    const now = [...host.querySelectorAll(FOCUSABLE)];
    const target = now[Math.min(at, now.length - 1)];
    if (target) {
      target.focus();
    }
  }
}

function refresh() {
  keepingFocus(() => {
    redraw();
    refreshFaultTriggers();
    renderItems();
    renderProps($('ed-props'), doc, state.pick, editable, (key, value) => change((d) => applyField(d, state.pick, key, value)));
    renderRoute($('ed-route'), doc, state.pick, editable, {
      pick: (sel) => pick(sel),
      set: (sel, key, value) => change((d) => applyField(d, sel, key, value)),
      remove: (sel) => change((d) => d.route.waypoints.splice(sel.index, 1)),
      settle: (v) => change((d) => setPath(d.route, 'settle', v)),
    });
    renderTimeline($('ed-track'), $('ed-places'), doc, state.pick, editable, {
      pick: (i) => pick({ list: 'faults', index: i }),
      moveTo: (i, at, keepFocus) => {
        change((d) => {
          d.faults[i].at = at;
        });
        pick({ list: 'faults', index: i });
        if (keepFocus) {
          const m = document.querySelector(`.ed-marker[data-index="${i}"]`);
          if (m) {
            m.focus();
          }
        }
      },
    });
  });
  for (const b of document.querySelectorAll('#ed-tools [data-tool]')) {
    b.setAttribute('aria-pressed', String(b.dataset.tool === state.tool));
  }
  const u = $('ed-undo');
  if (u) {
    u.disabled = history.undoStack.length === 0;
    $('ed-redo').disabled = history.redoStack.length === 0;
    $('ed-delete').disabled = !state.pick || state.pick.list === 'start';
  }
}

function pick(sel) {
  state.pick = sel;
  refresh();
}

Object.assign(hooks, { refresh, redraw, fit, pick, scheduleCheck, settingsChanged: syncSettingsForms });

// ---- wiring --------------------------------------------------------------------------------

wirePointer();
wireKeys();
wireItems();
wireSettingsForms();
for (const b of document.querySelectorAll('#ed-tools [data-tool]')) {
  b.addEventListener('click', () => setTool(b.dataset.tool));
}
if (editable) {
  $('ed-undo').addEventListener('click', undo);
  $('ed-redo').addEventListener('click', redo);
  $('ed-delete').addEventListener('click', removePicked);
  $('ed-save').addEventListener('submit', save);
  $('ed-fault-when').addEventListener('change', (e) => {
    $('ed-fault-at').disabled = e.target.value !== '';
  });
  $('ed-fault-add').addEventListener('submit', (e) => {
    e.preventDefault();
    const at = Number($('ed-fault-at').value);
    const enters = $('ed-fault-when').value;
    change((d) => {
      const f = newFault(d, $('ed-fault-kind').value);
      if (enters) {
        f.enters = enters;
      } else {
        f.at = Number.isFinite(at) && at >= 0 ? at : 0;
      }
      d.faults.push(f);
      state.pick = { list: 'faults', index: d.faults.length - 1 };
    });
  });
  const imp = $('ed-import');
  if (imp) {
    imp.addEventListener('submit', importImage);
  }
}
$('ed-snap').addEventListener('change', (e) => {
  state.snap = e.target.checked;
});
$('ed-grid').addEventListener('change', (e) => {
  state.grid = Number(e.target.value);
  redraw();
});
$('ed-fit').addEventListener('click', fit);
$('ed-help').addEventListener('click', () => $('ed-keys').showModal());
for (const b of document.querySelectorAll('[data-copy]')) {
  b.addEventListener('click', async () => {
    const input = $(b.dataset.copy);
    const url = new URL(input.value, window.location.origin).href;
    let ok = false;
    try {
      await navigator.clipboard.writeText(url);
      ok = true;
    } catch {
      input.select();
      ok = document.execCommand && document.execCommand('copy');
    }
    $('ed-copy-state').textContent = ok ? `Copied ${url}` : `Select and copy: ${url}`;
  });
}

new ResizeObserver(() => resize()).observe(canvas);
resize();
fit();
refresh();
runCheck();
root.dataset.ready = 'true';
