// Snapping and hit tests: from a canvas pixel to metres, to an item, to the nearest wall.
import { doorGeometry, pointInPolygon, round, targetOf, toSegment } from './model.js';
import { doc, state } from './store.js';

export const OUTLINED = ['rooms', 'fixtures', 'floorZones', 'clutter'];

function corners() {
  const out = [];
  for (const k of OUTLINED) {
    doc.site[k].forEach((item) => item.outline.forEach((c) => out.push(c)));
  }
  return out;
}

/** Canvas pixel to metres, snapped to a nearby corner first, else to the grid when snap is on. */
export function snapped(px, py, exclude) {
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

export function hit(px, py) {
  const v = state.view;
  const x = v.wx(px);
  const y = v.wy(py);
  const near = (ax, ay, r = 10) => Math.hypot(v.sx(ax) - px, v.sy(ay) - py) <= r;
  for (let i = doc.faults.length - 1; i >= 0; i--) {
    const f = doc.faults[i];
    const key = targetOf(f.kind);
    if (key && f[key] && near(f[key].x, f[key].y, 12)) {
      return { list: 'faults', index: i, part: key };
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
  if (p && OUTLINED.includes(p.list)) {
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
export function nearestWall(px, py) {
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
