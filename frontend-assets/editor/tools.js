// The drawing tools: placing items with the pointer or the keyboard cursor, moving them, splitting
// and joining walls, removing the picked item.
import { doorGeometry, freshId, listOf, newFault, rect, round, targetKindWords, targetOf, toSegment } from './model.js';
import { $, canvas, change, doc, editable, history, hooks, notice, snapshot, state, afterChange } from './store.js';
import { OUTLINED, hit, nearestWall, snapped } from './hits.js';

export const BOX_TOOLS = {
  'box-room': { list: 'rooms', prefix: 'room', name: 'Room' },
  fixture: { list: 'fixtures', prefix: 'fixture', name: 'Fixture' },
  zone: { list: 'floorZones', prefix: 'zone', name: 'Floor zone' },
  clutter: { list: 'clutter', prefix: 'clutter', name: 'Clutter' },
};

export function setTool(tool) {
  if (!editable && tool !== 'pick') {
    notice('This is a view link: editing is refused.', 'bad');
    return;
  }
  state.tool = tool;
  state.draft = null;
  canvas.dataset.tool = tool;
  hooks.refresh();
}

/** Adds a room, fixture, floor zone or clutter item with the outline given, and picks it. */
export function addOutline(tool, outline) {
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

/** Adds a door on a room's wall, kept inside the wall's length, and picks it. */
export function addDoor(roomId, wall, along, width) {
  change((d) => {
    d.site.doors.push({ id: freshId(d.site.doors, 'door'), room: roomId, wall, along: round(along), width, mapped: 'open', actual: 'open' });
    state.pick = { list: 'doors', index: d.site.doors.length - 1 };
  });
}

export function addWaypoint(x, y, speed) {
  change((d) => {
    const w = d.route.waypoints;
    w.push({ x, y, speed: speed > 0 ? speed : (w.length ? w[w.length - 1].speed : 0.5), dwell: 0 });
    state.pick = { list: 'waypoints', index: w.length - 1 };
  });
}

/**
 * Places with the current tool at pixel (px, py), already snapped to p (metres). Returns the drag
 * that follows a pointer press (a box being drawn, a heading being turned), or null.
 */
function placeAt(px, py, p) {
  const tool = state.tool;
  if (BOX_TOOLS[tool]) {
    state.draft = { points: [p, p, p, p], closed: true };
    return { kind: 'box', start: p };
  }
  if (tool === 'outline-room') {
    if (!state.draft) {
      state.draft = { points: [p, p], closed: false };
    } else {
      const first = state.draft.points[0];
      const pts = state.draft.points;
      if (pts.length > 3 && first[0] === p[0] && first[1] === p[1]) {
        finishOutline();
        return null;
      }
      pts[pts.length - 1] = p;
      pts.push(p);
    }
  } else if (tool === 'door') {
    const w = nearestWall(px, py);
    if (!w) {
      notice('A door goes on a wall: click on or right next to a room wall.', 'bad');
      return null;
    }
    const width = 0.9;
    const along = Math.max(Math.min(w.len - width / 2, round(w.along, state.snap ? state.grid : 0.001)), Math.min(width / 2, w.len / 2));
    addDoor(w.room.id, w.wall, along, width);
  } else if (tool === 'start') {
    change((d) => {
      d.route.start.x = p[0];
      d.route.start.y = p[1];
      state.pick = { list: 'start', index: 0 };
    });
    // turning by dragging is a second undo step after the placing
    return { kind: 'heading', target: 'start', at: p, before: snapshot() };
  } else if (tool === 'waypoint') {
    addWaypoint(p[0], p[1], 0);
  } else if (tool === 'place-fault') {
    change((d) => {
      const f = newFault(d, $('ed-fault-kind').value);
      f.near = { x: p[0], y: p[1], radius: 1 };
      d.faults.push(f);
      state.pick = { list: 'faults', index: d.faults.length - 1 };
    });
  } else if (tool === 'fault-target') {
    // the picked fault if its kind sets a pose on the plan, else the first fault whose kind does
    const hasTarget = (f) => f && targetOf(f.kind) !== '';
    let i = state.pick && state.pick.list === 'faults' && hasTarget(doc.faults[state.pick.index]) ? state.pick.index : -1;
    if (i < 0) {
      i = doc.faults.findIndex(hasTarget);
    }
    if (i < 0) {
      notice(`Add a ${targetKindWords()} fault first (timeline below), then place where the robot is carried to.`, 'bad');
      return null;
    }
    const key = targetOf(doc.faults[i].kind);
    change((d) => {
      d.faults[i][key] = { x: p[0], y: p[1], heading: (d.faults[i][key] && d.faults[i][key].heading) || 0 };
      state.pick = { list: 'faults', index: i };
    });
    return { kind: 'heading', target: key, index: i, at: p, before: snapshot() };
  }
  return null;
}

/**
 * Enter on the plan: places with the current tool at the keyboard cursor. A box takes two
 * presses (one corner, then the opposite one); an outline takes a press per corner and ends with
 * a second press on the same spot.
 */
export function placeAtCursor() {
  const c = state.cursor;
  const px = state.view.sx(c[0]);
  const py = state.view.sy(c[1]);
  if (BOX_TOOLS[state.tool]) {
    if (state.draft && state.draft.keyStart) {
      const s = state.draft.keyStart;
      state.draft = null;
      if (Math.abs(c[0] - s[0]) > 0.01 && Math.abs(c[1] - s[1]) > 0.01) {
        addOutline(state.tool, rect(s[0], s[1], c[0], c[1]));
        return `${BOX_TOOLS[state.tool].name} added.`;
      }
      return 'The opposite corner must differ in x and y: move the cursor and press Enter again.';
    }
    state.draft = { points: [c, c, c, c], closed: true, keyStart: c };
    return 'First corner set: move the cursor to the opposite corner and press Enter.';
  }
  if (state.tool === 'outline-room' && state.draft) {
    const pts = state.draft.points;
    const last = pts[pts.length - 2];
    if (last && last[0] === c[0] && last[1] === c[1]) {
      finishOutline();
      return 'Room finished.';
    }
    pts[pts.length - 1] = c;
    pts.push(c);
    return `Corner ${pts.length - 1} set; press Enter again here to finish the room.`;
  }
  placeAt(px, py, [c[0], c[1]]);
  return state.tool === 'outline-room' ? 'First corner set: move and press Enter for each corner.' : 'Placed.';
}

/** Arrow keys with a drawing tool: the cursor moves by the grid (with Shift, four steps). */
export function moveCursor(dx, dy, big) {
  const step = state.grid * (big ? 4 : 1);
  const c = state.cursor;
  state.cursor = [round(c[0] + dx * step), round(c[1] + dy * step)];
  const d = state.draft;
  if (d && d.keyStart) {
    d.points = rect(d.keyStart[0], d.keyStart[1], state.cursor[0], state.cursor[1]);
  } else if (d && state.tool === 'outline-room') {
    d.points[d.points.length - 1] = state.cursor;
  }
}

let drag = null;

export function cancelDraft() {
  state.draft = null;
  drag = null;
}

function canvasPoint(e) {
  const r = canvas.getBoundingClientRect();
  return [e.clientX - r.left, e.clientY - r.top];
}

function pointerDown(e) {
  canvas.focus();
  const [px, py] = canvasPoint(e);
  canvas.setPointerCapture(e.pointerId);
  if (state.tool === 'pick' || !editable) {
    const h = hit(px, py);
    state.corner = h && h.corner !== undefined ? h : null;
    if (h) {
      state.pick = { list: h.list, index: h.index };
      drag = editable ? { kind: 'move', h, start: snapped(px, py), before: snapshot(), last: snapped(px, py) } : null;
    } else {
      state.pick = null;
      drag = { kind: 'pan', px, py, ox: state.view.ox, oy: state.view.oy };
    }
    hooks.refresh();
    return;
  }
  const p = snapped(px, py);
  state.cursor = p;
  drag = placeAt(px, py, p);
  hooks.redraw();
}

function pointerMove(e) {
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
      const target = drag.target === 'start' ? doc.route.start : doc.faults[drag.index][drag.target];
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
  hooks.redraw();
}

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
    // the part is 'near' or the key of the pose the fault's kind sets down (hits.js)
    const t = f[h.part];
    if (t) {
      Object.assign(t, { x: round(t.x + dx), y: round(t.y + dy) });
    }
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

function pointerUp() {
  const dr = drag;
  drag = null;
  state.snapMark = null;
  if (!dr) {
    hooks.redraw();
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
    if (dr.before && snapshot() !== dr.before) {
      history.record(dr.before);
    }
    afterChange();
    return;
  }
  hooks.refresh();
}

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

export function finishOutline() {
  const pts = state.draft.points.slice(0, -1).filter((p, i, a) => i === 0 || p[0] !== a[i - 1][0] || p[1] !== a[i - 1][1]);
  state.draft = null;
  if (pts.length < 3) {
    notice('A room needs at least three corners.', 'bad');
    hooks.redraw();
    return;
  }
  addOutline('box-room', pts);
}

export function removePicked() {
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

/** Arrow keys with the pick tool: the picked item moves a grid step, else the view pans. */
export function nudge(dx, dy) {
  const p = state.pick;
  if (!p || !editable) {
    state.view.ox -= dx * 40;
    state.view.oy += dy * 40;
    hooks.redraw();
    return;
  }
  change(() => {
    moveBy({ h: p, last: [0, 0] }, [dx * state.grid, dy * state.grid]);
  });
}

export function wirePointer() {
  canvas.addEventListener('pointerdown', pointerDown);
  canvas.addEventListener('pointermove', pointerMove);
  canvas.addEventListener('pointerup', pointerUp);
  canvas.addEventListener('dblclick', (e) => {
    if (state.tool === 'outline-room' && state.draft) {
      finishOutline();
    } else if (state.tool === 'pick' && editable) {
      const [px, py] = canvasPoint(e);
      splitWall(px, py);
    }
  });
  canvas.addEventListener('wheel', (e) => {
    e.preventDefault();
    const [px, py] = canvasPoint(e);
    state.view.zoomAt(px, py, e.deltaY < 0 ? 1.15 : 1 / 1.15);
    hooks.redraw();
  }, { passive: false });
}
