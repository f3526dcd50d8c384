// The scenario editor: tools on the plan canvas, undo, the live check, saving as a new revision.
// The page carries the document and the links in data attributes of #editor, because the
// content security policy allows no inline scripts.
import {
  History, bounds, doorGeometry, freshId, itemOfPath, listOf, newFault, normalise, placeIds, pointInPolygon, rect, round,
  setPath, toSegment,
} from './model.js';
import { View, draw } from './plan.js';
import { applyField, renderProblems, renderProps, renderRoute, renderTimeline } from './panels.js';

const root = document.getElementById('editor');
const token = root.dataset.token;
const editable = root.dataset.editable === 'true';
const canvas = document.getElementById('ed-plan');
const ctx = canvas.getContext('2d');
const $ = (id) => document.getElementById(id);

let doc = normalise(JSON.parse(root.dataset.document));
let base = Number(root.dataset.base);
let dirty = false;
const history = new History();

const state = {
  view: new View(),
  pick: null,
  tool: 'pick',
  grid: 0.25,
  snap: true,
  draft: null,
  snapMark: null,
  labels: true,
  // wall pieces from the last check of the current document; null until it answers
  walls: null,
};

/** The CSRF header the layout puts on <body> for htmx; fetch() posts send the same. */
function csrfHeaders() {
  try {
    return JSON.parse(document.body.getAttribute('hx-headers') || '{}');
  } catch {
    return {};
  }
}

// ---- document changes, undo ----------------------------------------------------------------

function snapshot() {
  return JSON.stringify(doc);
}

/** Applies one change as one undo step. */
function change(mutate) {
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

function afterChange() {
  state.walls = null;
  setDirty(true);
  refresh();
  scheduleCheck();
}

function restore(json) {
  if (json === null) {
    return;
  }
  doc = normalise(JSON.parse(json));
  if (state.pick && !pickedItem()) {
    state.pick = null;
  }
  syncSettingsForms();
  afterChange();
}

function undo() {
  if (editable) {
    restore(history.undo(snapshot()));
  }
}

function redo() {
  if (editable) {
    restore(history.redo(snapshot()));
  }
}

function setDirty(on) {
  dirty = on;
  const d = $('ed-dirty');
  if (d) {
    d.textContent = on ? 'unsaved changes' : 'no unsaved changes';
    d.classList.toggle('bad', on);
  }
}

window.addEventListener('beforeunload', (e) => {
  if (dirty) {
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

function redraw() {
  const dpr = window.devicePixelRatio || 1;
  ctx.setTransform(dpr, 0, 0, dpr, 0, 0);
  draw(ctx, canvas.width / dpr, canvas.height / dpr, doc, state);
  // lets tests and tools map metres to canvas pixels
  canvas.dataset.view = JSON.stringify({ scale: state.view.scale, ox: state.view.ox, oy: state.view.oy, dpr });
}

function fit() {
  const dpr = window.devicePixelRatio || 1;
  state.view.fit(bounds(doc), canvas.width / dpr, canvas.height / dpr);
  redraw();
}

function pickedItem() {
  const p = state.pick;
  if (!p) {
    return null;
  }
  return p.list === 'start' ? doc.route.start : listOf(doc, p.list)[p.index] || null;
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

function refresh() {
  redraw();
  refreshFaultTriggers();
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

// ---- the live check ------------------------------------------------------------------------

let checkTimer = null;
let checkSeq = 0;

function scheduleCheck() {
  clearTimeout(checkTimer);
  $('ed-check-state').textContent = 'checking...';
  checkTimer = setTimeout(runCheck, 250);
}

async function runCheck() {
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
    if (snapshot() === sent) {
      state.walls = body.walls || null;
      redraw();
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
    pick(sel);
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

// ---- snapping and hit tests ----------------------------------------------------------------

function corners() {
  const out = [];
  for (const k of ['rooms', 'fixtures', 'floorZones', 'clutter']) {
    doc.site[k].forEach((item) => item.outline.forEach((c) => out.push(c)));
  }
  return out;
}

/** Canvas pixel to metres, snapped to a nearby corner first, else to the grid when snap is on. */
function snapped(px, py, exclude) {
  const x = state.view.wx(px);
  const y = state.view.wy(py);
  state.snapMark = null;
  if (!state.snap) {
    return [round(x), round(y)];
  }
  let best = null;
  let bestD = 10;
  for (const c of corners()) {
    if (c === exclude) {
      continue;
    }
    const d = Math.hypot(state.view.sx(c[0]) - px, state.view.sy(c[1]) - py);
    if (d < bestD) {
      bestD = d;
      best = c;
    }
  }
  if (best) {
    state.snapMark = best;
    return [best[0], best[1]];
  }
  return [round(x, state.grid), round(y, state.grid)];
}

function hit(px, py) {
  const v = state.view;
  const x = v.wx(px);
  const y = v.wy(py);
  const near = (ax, ay, r = 10) => Math.hypot(v.sx(ax) - px, v.sy(ay) - py) <= r;
  for (let i = doc.faults.length - 1; i >= 0; i--) {
    const f = doc.faults[i];
    if (f.kind === 'kidnap' && f.to && near(f.to.x, f.to.y, 12)) {
      return { list: 'faults', index: i, part: 'to' };
    }
    if (f.near && near(f.near.x, f.near.y, Math.max(10, f.near.radius * v.scale))) {
      return { list: 'faults', index: i, part: 'near' };
    }
  }
  for (let i = doc.route.waypoints.length - 1; i >= 0; i--) {
    if (near(doc.route.waypoints[i].x, doc.route.waypoints[i].y)) {
      return { list: 'waypoints', index: i };
    }
  }
  if (near(doc.route.start.x, doc.route.start.y, 12)) {
    return { list: 'start', index: 0 };
  }
  for (let i = doc.site.doors.length - 1; i >= 0; i--) {
    const g = doorGeometry(doc, doc.site.doors[i]);
    if (g && toSegment(x, y, g.a[0], g.a[1], g.b[0], g.b[1]).dist * v.scale < 8) {
      return { list: 'doors', index: i };
    }
  }
  // the picked outline's corners come first so they can be dragged
  const p = state.pick;
  if (p && ['rooms', 'fixtures', 'floorZones', 'clutter'].includes(p.list)) {
    const item = doc.site[p.list][p.index];
    const c = item ? item.outline.findIndex(([cx, cy]) => near(cx, cy, 7)) : -1;
    if (c >= 0) {
      return { list: p.list, index: p.index, corner: c };
    }
    // its walls too, so a double-click on one (to split it) keeps the outline picked
    const onEdge = item && item.outline.some((a, i) => {
      const b = item.outline[(i + 1) % item.outline.length];
      return toSegment(x, y, a[0], a[1], b[0], b[1]).dist * v.scale < 6;
    });
    if (onEdge) {
      return { list: p.list, index: p.index };
    }
  }
  for (const list of ['clutter', 'fixtures', 'floorZones', 'rooms']) {
    for (let i = doc.site[list].length - 1; i >= 0; i--) {
      if (pointInPolygon(x, y, doc.site[list][i].outline)) {
        return { list, index: i };
      }
    }
  }
  return null;
}

/** The nearest wall within reach of a pixel: room, wall number, distance along it. */
function nearestWall(px, py) {
  const x = state.view.wx(px);
  const y = state.view.wy(py);
  let best = null;
  doc.site.rooms.forEach((room) => {
    room.outline.forEach((a, i) => {
      const b = room.outline[(i + 1) % room.outline.length];
      const s = toSegment(x, y, a[0], a[1], b[0], b[1]);
      if (s.dist * state.view.scale < 12 && (!best || s.dist < best.dist)) {
        best = { room, wall: i, along: s.along, len: s.len, dist: s.dist };
      }
    });
  });
  return best;
}

// ---- tools ---------------------------------------------------------------------------------

const BOX_TOOLS = {
  'box-room': { list: 'rooms', prefix: 'room', name: 'Room' },
  fixture: { list: 'fixtures', prefix: 'fixture', name: 'Fixture' },
  zone: { list: 'floorZones', prefix: 'zone', name: 'Floor zone' },
  clutter: { list: 'clutter', prefix: 'clutter', name: 'Clutter' },
};

function setTool(tool) {
  if (!editable && tool !== 'pick') {
    notice('This is a view link: editing is refused.', 'bad');
    return;
  }
  state.tool = tool;
  state.draft = null;
  canvas.dataset.tool = tool;
  refresh();
}

function addOutline(tool, outline) {
  const t = BOX_TOOLS[tool] || BOX_TOOLS['box-room'];
  change((d) => {
    const list = d.site[t.list];
    const item = { id: freshId(list, t.prefix), name: `${t.name} ${list.length + 1}` };
    if (t.list === 'floorZones') {
      Object.assign(item, { surface: 'carpet', outline, slip: 0.05, noiseFactor: 1.5 });
    } else if (t.list === 'clutter') {
      Object.assign(item, { outline, appearAt: 0 });
    } else {
      item.outline = outline;
    }
    list.push(item);
    state.pick = { list: t.list, index: list.length - 1 };
  });
}

let drag = null;

function canvasPoint(e) {
  const r = canvas.getBoundingClientRect();
  return [e.clientX - r.left, e.clientY - r.top];
}

canvas.addEventListener('pointerdown', (e) => {
  canvas.focus();
  const [px, py] = canvasPoint(e);
  canvas.setPointerCapture(e.pointerId);
  const tool = state.tool;
  if (tool === 'pick' || !editable) {
    const h = hit(px, py);
    state.corner = h && h.corner !== undefined ? h : null;
    if (h) {
      state.pick = { list: h.list, index: h.index };
      drag = editable ? { kind: 'move', h, start: snapped(px, py), before: snapshot(), last: snapped(px, py) } : null;
    } else {
      state.pick = null;
      drag = { kind: 'pan', px, py, ox: state.view.ox, oy: state.view.oy };
    }
    refresh();
    return;
  }
  const p = snapped(px, py);
  if (BOX_TOOLS[tool]) {
    drag = { kind: 'box', start: p };
    state.draft = { points: [p, p, p, p], closed: true };
  } else if (tool === 'outline-room') {
    if (!state.draft) {
      state.draft = { points: [p, p], closed: false };
    } else {
      const first = state.draft.points[0];
      const pts = state.draft.points;
      if (pts.length > 3 && first[0] === p[0] && first[1] === p[1]) {
        finishOutline();
        return;
      }
      pts[pts.length - 1] = p;
      pts.push(p);
    }
  } else if (tool === 'door') {
    const w = nearestWall(px, py);
    if (!w) {
      notice('A door goes on a wall: click on or right next to a room wall.', 'bad');
      return;
    }
    const width = 0.9;
    const along = Math.max(Math.min(w.len - width / 2, round(w.along, state.snap ? state.grid : 0.001)), Math.min(width / 2, w.len / 2));
    change((d) => {
      d.site.doors.push({ id: freshId(d.site.doors, 'door'), room: w.room.id, wall: w.wall, along: round(along), width, mapped: 'open', actual: 'open' });
      state.pick = { list: 'doors', index: d.site.doors.length - 1 };
    });
  } else if (tool === 'start') {
    change((d) => {
      d.route.start.x = p[0];
      d.route.start.y = p[1];
      state.pick = { list: 'start', index: 0 };
    });
    // turning by dragging is a second undo step after the placing
    drag = { kind: 'heading', target: 'start', at: p, before: snapshot() };
  } else if (tool === 'waypoint') {
    change((d) => {
      const w = d.route.waypoints;
      w.push({ x: p[0], y: p[1], speed: w.length ? w[w.length - 1].speed : 0.5, dwell: 0 });
      state.pick = { list: 'waypoints', index: w.length - 1 };
    });
  } else if (tool === 'place-fault') {
    change((d) => {
      const f = newFault(d, $('ed-fault-kind').value);
      f.near = { x: p[0], y: p[1], radius: 1 };
      d.faults.push(f);
      state.pick = { list: 'faults', index: d.faults.length - 1 };
    });
  } else if (tool === 'kidnap-target') {
    let i = state.pick && state.pick.list === 'faults' && doc.faults[state.pick.index].kind === 'kidnap' ? state.pick.index : -1;
    if (i < 0) {
      i = doc.faults.findIndex((f) => f.kind === 'kidnap');
    }
    if (i < 0) {
      notice('Add a kidnap fault first (timeline below), then place where the robot is carried to.', 'bad');
      return;
    }
    change((d) => {
      d.faults[i].to = { x: p[0], y: p[1], heading: (d.faults[i].to && d.faults[i].to.heading) || 0 };
      state.pick = { list: 'faults', index: i };
    });
    drag = { kind: 'heading', target: 'kidnap', index: i, at: p, before: snapshot() };
  }
  redraw();
});

canvas.addEventListener('pointermove', (e) => {
  const [px, py] = canvasPoint(e);
  const exclude = drag && drag.kind === 'move' && drag.h.corner !== undefined
    ? doc.site[drag.h.list][drag.h.index].outline[drag.h.corner] : undefined;
  const p = snapped(px, py, exclude);
  $('ed-readout').textContent = `x ${state.view.wx(px).toFixed(2)} m, y ${state.view.wy(py).toFixed(2)} m`;
  if (drag && drag.kind === 'pan') {
    state.view.ox = drag.ox + px - drag.px;
    state.view.oy = drag.oy + py - drag.py;
  } else if (drag && drag.kind === 'box') {
    state.draft = { points: rect(drag.start[0], drag.start[1], p[0], p[1]), closed: true };
    const w = Math.abs(p[0] - drag.start[0]);
    const h = Math.abs(p[1] - drag.start[1]);
    $('ed-readout').textContent = `${w.toFixed(2)} m × ${h.toFixed(2)} m`;
  } else if (drag && drag.kind === 'move') {
    // the checked pieces no longer fit what is being moved: whole walls until the next check
    state.walls = null;
    moveBy(drag, p);
  } else if (drag && drag.kind === 'heading') {
    const raw = (Math.atan2(state.view.wy(py) - drag.at[1], state.view.wx(px) - drag.at[0]) * 180) / Math.PI;
    // with snap on, headings land on 15 degree steps like lengths land on the grid
    const heading = round(state.snap ? round(raw, 15) : raw, 0.1);
    if (Math.hypot(state.view.sx(drag.at[0]) - px, state.view.sy(drag.at[1]) - py) > 12) {
      const target = drag.target === 'start' ? doc.route.start : doc.faults[drag.index].to;
      target.heading = heading;
      $('ed-readout').textContent = `heading ${heading} deg`;
      drag.turned = true;
    }
  } else if (state.tool === 'outline-room' && state.draft) {
    const pts = state.draft.points;
    pts[pts.length - 1] = p;
    const a = pts[pts.length - 2];
    $('ed-readout').textContent = `${Math.hypot(p[0] - a[0], p[1] - a[1]).toFixed(2)} m`;
  }
  redraw();
});

function moveBy(dr, p) {
  const dx = p[0] - dr.last[0];
  const dy = p[1] - dr.last[1];
  if (dx === 0 && dy === 0) {
    return;
  }
  dr.last = p;
  dr.moved = true;
  const h = dr.h;
  const shift = (pt) => [round(pt[0] + dx), round(pt[1] + dy)];
  if (h.list === 'start') {
    Object.assign(doc.route.start, { x: round(doc.route.start.x + dx), y: round(doc.route.start.y + dy) });
  } else if (h.list === 'waypoints') {
    const w = doc.route.waypoints[h.index];
    Object.assign(w, { x: round(w.x + dx), y: round(w.y + dy) });
  } else if (h.list === 'faults') {
    const f = doc.faults[h.index];
    const t = h.part === 'to' ? f.to : f.near;
    Object.assign(t, { x: round(t.x + dx), y: round(t.y + dy) });
  } else if (h.list === 'doors') {
    const d = doc.site.doors[h.index];
    const g = doorGeometry(doc, d);
    if (g) {
      d.along = round(d.along + dx * g.ux + dy * g.uy);
    }
  } else if (h.corner !== undefined) {
    doc.site[h.list][h.index].outline[h.corner] = [p[0], p[1]];
  } else {
    const item = doc.site[h.list][h.index];
    item.outline = item.outline.map(shift);
  }
}

canvas.addEventListener('pointerup', () => {
  const dr = drag;
  drag = null;
  state.snapMark = null;
  if (!dr) {
    redraw();
    return;
  }
  if (dr.kind === 'box') {
    const pts = state.draft.points;
    state.draft = null;
    const w = Math.abs(pts[2][0] - pts[0][0]);
    const h = Math.abs(pts[2][1] - pts[0][1]);
    if (w > 0.01 && h > 0.01) {
      addOutline(state.tool, pts.map(([x, y]) => [x, y]));
    } else {
      notice('Drag from one corner to the opposite corner to draw.', 'bad');
    }
  } else if ((dr.kind === 'move' && dr.moved) || (dr.kind === 'heading' && dr.turned)) {
    const changed = snapshot();
    if (dr.before && changed !== dr.before) {
      history.record(dr.before);
      afterChange();
      return;
    }
    afterChange();
    return;
  }
  refresh();
});

canvas.addEventListener('dblclick', (e) => {
  if (state.tool === 'outline-room' && state.draft) {
    finishOutline();
  } else if (state.tool === 'pick' && editable) {
    const [px, py] = canvasPoint(e);
    splitWall(px, py);
  }
});

const OUTLINED = ['rooms', 'fixtures', 'floorZones', 'clutter'];

/** Double-click on an edge of the picked outline: a new corner there splits that wall in two. */
function splitWall(px, py) {
  const p = state.pick;
  if (!p || !OUTLINED.includes(p.list)) {
    return;
  }
  const item = doc.site[p.list][p.index];
  const x = state.view.wx(px);
  const y = state.view.wy(py);
  let best = -1;
  let bestS = null;
  item.outline.forEach((a, i) => {
    const b = item.outline[(i + 1) % item.outline.length];
    const s = toSegment(x, y, a[0], a[1], b[0], b[1]);
    if (s.dist * state.view.scale < 8 && (!bestS || s.dist < bestS.dist)) {
      best = i;
      bestS = s;
    }
  });
  if (best < 0) {
    return;
  }
  if (state.snap) {
    bestS.along = round(bestS.along, state.grid);
  }
  if (bestS.along < 0.01 || bestS.len - bestS.along < 0.01) {
    return;
  }
  const a = item.outline[best];
  const b = item.outline[(best + 1) % item.outline.length];
  const t = bestS.along / bestS.len;
  const corner = [round(a[0] + (b[0] - a[0]) * t), round(a[1] + (b[1] - a[1]) * t)];
  change((d) => {
    const o = d.site[p.list][p.index];
    o.outline.splice(best + 1, 0, corner);
    if (p.list === 'rooms') {
      // doors keep their place: later walls move up one number, the split wall's far half is new
      for (const door of d.site.doors.filter((x2) => x2.room === o.id)) {
        if (door.wall > best) {
          door.wall += 1;
        } else if (door.wall === best && door.along > bestS.along) {
          door.wall += 1;
          door.along = round(door.along - bestS.along);
        }
      }
    }
  });
  notice('Wall split: drag the new corner, or pick a corner and press x to join its two walls again.', '');
}

/** Removes the picked corner, joining its two walls; outlines keep at least three corners. */
function joinWalls() {
  const c = state.corner;
  const item = c && doc.site[c.list][c.index];
  if (!item || item.outline.length <= 3) {
    notice('An outline needs at least three corners.', 'bad');
    return;
  }
  change((d) => {
    const o = d.site[c.list][c.index];
    const n = o.outline.length;
    const prev = o.outline[(c.corner - 1 + n) % n];
    const here = o.outline[c.corner];
    const before = Math.hypot(here[0] - prev[0], here[1] - prev[1]);
    o.outline.splice(c.corner, 1);
    if (c.list === 'rooms') {
      // wall k runs from corner k to corner k + 1; the wall after the removed corner joins the
      // one before it, and the walls after it move down one number. Removing corner 0 joins the
      // closing wall (n - 1) and wall 0 into the new closing wall (n - 2).
      const joined = c.corner === 0 ? n - 2 : c.corner - 1;
      for (const door of d.site.doors.filter((x2) => x2.room === o.id)) {
        if (door.wall === c.corner) {
          door.wall = joined;
          door.along = round(door.along + before);
        } else if (c.corner === 0 && door.wall === n - 1) {
          door.wall = joined;
        } else if (door.wall > c.corner) {
          door.wall -= 1;
        }
      }
    }
  });
  state.corner = null;
}

function finishOutline() {
  const pts = state.draft.points.slice(0, -1).filter((p, i, a) => i === 0 || p[0] !== a[i - 1][0] || p[1] !== a[i - 1][1]);
  state.draft = null;
  if (pts.length < 3) {
    notice('A room needs at least three corners.', 'bad');
    redraw();
    return;
  }
  addOutline('box-room', pts);
}

canvas.addEventListener('wheel', (e) => {
  e.preventDefault();
  const [px, py] = canvasPoint(e);
  state.view.zoomAt(px, py, e.deltaY < 0 ? 1.15 : 1 / 1.15);
  redraw();
}, { passive: false });

function removePicked() {
  if (state.corner && state.pick && state.corner.list === state.pick.list && state.corner.index === state.pick.index) {
    joinWalls();
    return;
  }
  const p = state.pick;
  if (!p || p.list === 'start') {
    return;
  }
  change((d) => {
    const list = listOf(d, p.list);
    const gone = list[p.index];
    list.splice(p.index, 1);
    if (p.list === 'rooms' && gone) {
      // doors hang on their room's walls, so they go with it
      d.site.doors = d.site.doors.filter((x) => x.room !== gone.id);
    }
    state.pick = null;
  });
}

function nudge(dx, dy) {
  const p = state.pick;
  if (!p || !editable) {
    state.view.ox -= dx * 40;
    state.view.oy += dy * 40;
    redraw();
    return;
  }
  change(() => {
    const dr = { h: p, last: [0, 0] };
    moveBy(dr, [dx * state.grid, dy * state.grid]);
  });
}

// ---- keys ----------------------------------------------------------------------------------

const TOOL_KEYS = { s: 'pick', r: 'box-room', o: 'outline-room', d: 'door', f: 'fixture', z: 'zone', c: 'clutter', t: 'start', w: 'waypoint', p: 'place-fault', k: 'kidnap-target' };

document.addEventListener('keydown', (e) => {
  const tag = e.target.tagName;
  if (tag === 'INPUT' || tag === 'SELECT' || tag === 'TEXTAREA' || $('ed-keys').open || e.ctrlKey || e.metaKey || e.altKey) {
    return;
  }
  const onPlan = e.target === canvas || e.target === document.body;
  const k = e.key;
  if (k === 'Escape') {
    state.draft = null;
    drag = null;
    redraw();
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
    redraw();
  } else if (k === '-') {
    state.view.zoomAt(canvas.clientWidth / 2, canvas.clientHeight / 2, 0.8);
    redraw();
  } else if (k === '0') {
    fit();
  } else if (onPlan && k.startsWith('Arrow')) {
    e.preventDefault();
    const dx = k === 'ArrowLeft' ? -1 : k === 'ArrowRight' ? 1 : 0;
    const dy = k === 'ArrowDown' ? -1 : k === 'ArrowUp' ? 1 : 0;
    nudge(dx, dy);
  } else if (TOOL_KEYS[k]) {
    setTool(TOOL_KEYS[k]);
  } else {
    return;
  }
  e.preventDefault();
});

// ---- notices, saving -----------------------------------------------------------------------

function notice(text, tone, actions = []) {
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

async function save(e) {
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

/** After undo or redo, the settings inputs show what the document now holds. */
function syncSettingsForms() {
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

async function importImage(e) {
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
        const e = body.extent;
        d.site.rooms.push({ id: freshId(d.site.rooms, 'imported-area'), name: 'Imported area', outline: rect(e.x0, e.y0, e.x1, e.y1) });
      }
      for (const b of body.blocks) {
        d.site.fixtures.push({ id: freshId(d.site.fixtures, 'wall-block'), name: 'Imported wall', outline: rect(b.x0, b.y0, b.x1, b.y1) });
      }
    });
    msg.textContent = withRoom
      ? `Added ${body.blocks.length} wall block(s) as fixtures inside a room the size of the image.`
      : `Added ${body.blocks.length} wall block(s) as fixtures. Draw a room around them so the robot has a site.`;
    fit();
  } catch {
    msg.textContent = 'Not imported: no connection to the server.';
  }
}

// ---- wiring --------------------------------------------------------------------------------

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
