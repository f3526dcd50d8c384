// The scenario as the browser edits it: the file-format document itself (metres, seconds,
// degrees), an undo history of whole snapshots, and the mapping between field paths in
// validation messages and the items drawn on the plan.

/** Item lists of the site plan that hold outlines, in drawing order. */
export const OUTLINE_LISTS = ['floorZones', 'rooms', 'fixtures', 'clutter'];

let faultKindsCache = null;

/**
 * Fault kinds as the server lists them (scenario.FaultKind: name, label, mark, fields) and the
 * words of their fixed choices, from the editor element's data-fault-kinds: the browser never
 * spells a kind itself, so a kind added on the server is one the editor can create and edit.
 */
export function faultKinds() {
  if (!faultKindsCache) {
    const root = typeof document === 'undefined' ? null : document.getElementById('editor');
    const data = root && root.dataset.faultKinds ? JSON.parse(root.dataset.faultKinds) : {};
    faultKindsCache = { kinds: data.kinds || [], choices: data.choices || {} };
  }
  return faultKindsCache;
}

export function faultKind(name) {
  return faultKinds().kinds.find((k) => k.name === name);
}

/**
 * The key of the pose a fault of this kind sets on the plan ('to': where the robot is set down),
 * or '' when it sets none; the server derives it from the kind's fields.
 */
export function targetOf(kind) {
  return faultKind(kind)?.target || '';
}

/** The labels of the kinds that set a pose on the plan, in words ("kidnap"). */
export function targetKindWords() {
  return faultKinds().kinds.filter((k) => k.target).map((k) => k.label).join(' or ');
}

export const SURFACES = ['tile', 'carpet', 'rug', 'threshold-strip', 'rubber-mat', 'wet-floor'];

/** Undo history of whole-document snapshots; documents are small enough that diffs buy nothing. */
export class History {
  constructor(limit = 200) {
    this.undoStack = [];
    this.redoStack = [];
    this.limit = limit;
  }

  record(snapshot) {
    this.undoStack.push(snapshot);
    if (this.undoStack.length > this.limit) {
      this.undoStack.shift();
    }
    this.redoStack = [];
  }

  undo(current) {
    if (!this.undoStack.length) {
      return null;
    }
    this.redoStack.push(current);
    return this.undoStack.pop();
  }

  redo(current) {
    if (!this.redoStack.length) {
      return null;
    }
    this.undoStack.push(current);
    return this.redoStack.pop();
  }
}

/** Makes sure the lists the editor adds to exist. */
export function normalise(doc) {
  doc.site = doc.site || {};
  for (const k of ['rooms', 'doors', 'fixtures', 'floorZones', 'clutter']) {
    doc.site[k] = doc.site[k] || [];
  }
  doc.route = doc.route || { start: { x: 0, y: 0, heading: 0 }, waypoints: [] };
  doc.route.waypoints = doc.route.waypoints || [];
  doc.faults = doc.faults || [];
  return doc;
}

/** An id not yet used in the list: prefix-1, prefix-2, ... */
export function freshId(list, prefix) {
  const used = new Set(list.map((x) => x.id));
  let n = list.length + 1;
  while (used.has(`${prefix}-${n}`)) {
    n++;
  }
  return `${prefix}-${n}`;
}

/**
 * The item a validation path points at, e.g. "site.doors[2].width" -> {list: 'doors', index: 2}.
 * Returns null for paths that name no drawn item (settings, the whole route).
 */
export function itemOfPath(path) {
  let m = /^site\.(rooms|doors|fixtures|floorZones|clutter)\[(\d+)\]/.exec(path);
  if (m) {
    return { list: m[1], index: Number(m[2]) };
  }
  m = /^route\.waypoints\[(\d+)\]/.exec(path);
  if (m) {
    return { list: 'waypoints', index: Number(m[1]) };
  }
  if (/^route\.start/.test(path)) {
    return { list: 'start', index: 0 };
  }
  m = /^faults\[(\d+)\]/.exec(path);
  if (m) {
    return { list: 'faults', index: Number(m[1]) };
  }
  return null;
}

/** The path prefix of an item, the inverse of itemOfPath. */
export function pathOfItem(sel) {
  if (!sel) {
    return '';
  }
  if (sel.list === 'waypoints') {
    return `route.waypoints[${sel.index}]`;
  }
  if (sel.list === 'start') {
    return 'route.start';
  }
  if (sel.list === 'faults') {
    return `faults[${sel.index}]`;
  }
  return `site.${sel.list}[${sel.index}]`;
}

/** The list an item selection refers to inside the document. */
export function listOf(doc, name) {
  if (name === 'waypoints') {
    return doc.route.waypoints;
  }
  if (name === 'faults') {
    return doc.faults;
  }
  return doc.site[name];
}

export function rect(x0, y0, x1, y1) {
  const ax = Math.min(x0, x1);
  const bx = Math.max(x0, x1);
  const ay = Math.min(y0, y1);
  const by = Math.max(y0, y1);
  return [[ax, ay], [bx, ay], [bx, by], [ax, by]];
}

export function round(v, step = 0.001) {
  // + 0 turns -0 into 0 so the file never shows "-0"
  return Number((Math.round(v / step) * step).toFixed(6)) + 0;
}

export function pointInPolygon(x, y, outline) {
  let inside = false;
  for (let i = 0, j = outline.length - 1; i < outline.length; j = i++) {
    const [xi, yi] = outline[i];
    const [xj, yj] = outline[j];
    if ((yi > y) !== (yj > y) && x < ((xj - xi) * (y - yi)) / (yj - yi) + xi) {
      inside = !inside;
    }
  }
  return inside;
}

/** Distance from p to segment a-b and the distance along a-b of the nearest point. */
export function toSegment(px, py, ax, ay, bx, by) {
  const dx = bx - ax;
  const dy = by - ay;
  const len = Math.hypot(dx, dy);
  if (len === 0) {
    return { dist: Math.hypot(px - ax, py - ay), along: 0, len };
  }
  const t = Math.max(0, Math.min(1, ((px - ax) * dx + (py - ay) * dy) / (len * len)));
  return { dist: Math.hypot(px - ax - t * dx, py - ay - t * dy), along: t * len, len };
}

/** Ends of wall `wall` of a room outline. */
export function wallEnds(room, wall) {
  const o = room.outline;
  return [o[wall % o.length], o[(wall + 1) % o.length]];
}

/** The door's centre and direction on its wall, or null when its room or wall does not exist. */
export function doorGeometry(doc, door) {
  const room = doc.site.rooms.find((r) => r.id === door.room);
  if (!room || !(door.wall >= 0 && door.wall < room.outline.length)) {
    return null;
  }
  const [a, b] = wallEnds(room, door.wall);
  const len = Math.hypot(b[0] - a[0], b[1] - a[1]) || 1;
  const ux = (b[0] - a[0]) / len;
  const uy = (b[1] - a[1]) / len;
  const cx = a[0] + ux * door.along;
  const cy = a[1] + uy * door.along;
  const h = (door.width || 0) / 2;
  return { cx, cy, ux, uy, a: [cx - ux * h, cy - uy * h], b: [cx + ux * h, cy + uy * h] };
}

/** Rough timing of the route (no acceleration), enough to scale the fault timeline. */
export function routeTimes(doc) {
  const r = doc.route;
  const times = [];
  let t = 0;
  let prev = [r.start.x, r.start.y];
  for (const w of r.waypoints) {
    const d = Math.hypot(w.x - prev[0], w.y - prev[1]);
    t += d / Math.max(0.01, w.speed || 0.5);
    times.push({ arrive: t, x: w.x, y: w.y, from: prev });
    t += w.dwell || 0;
    prev = [w.x, w.y];
  }
  return { legs: times, end: t + (r.settle || 0) };
}

/** Where the route puts the robot at time t (rough, as routeTimes). */
export function positionAt(doc, t) {
  const r = doc.route;
  let prevT = 0;
  let prev = [r.start.x, r.start.y];
  for (const w of r.waypoints) {
    const d = Math.hypot(w.x - prev[0], w.y - prev[1]);
    const arrive = prevT + d / Math.max(0.01, w.speed || 0.5);
    if (t <= arrive) {
      const f = arrive === prevT ? 1 : (t - prevT) / (arrive - prevT);
      return [prev[0] + (w.x - prev[0]) * f, prev[1] + (w.y - prev[1]) * f];
    }
    prevT = arrive + (w.dwell || 0);
    prev = [w.x, w.y];
    if (t <= prevT) {
      return prev;
    }
  }
  return prev;
}

/** Bounding box of everything on the plan. */
export function bounds(doc) {
  const xs = [];
  const ys = [];
  for (const k of OUTLINE_LISTS) {
    for (const item of doc.site[k]) {
      for (const [x, y] of item.outline || []) {
        xs.push(x);
        ys.push(y);
      }
    }
  }
  xs.push(doc.route.start.x);
  ys.push(doc.route.start.y);
  for (const w of doc.route.waypoints) {
    xs.push(w.x);
    ys.push(w.y);
  }
  if (xs.length < 2) {
    return { x0: 0, y0: 0, x1: 10, y1: 8 };
  }
  return { x0: Math.min(...xs), y0: Math.min(...ys), x1: Math.max(...xs), y1: Math.max(...ys) };
}

/** A new fault of a kind with values that pass the checks where the document allows it. */
/** Follows an item's id change into everything that names it, so that a rename breaks nothing. */
export function renameReferences(doc, list, from, to) {
  if (list === 'rooms') {
    for (const door of doc.site.doors) {
      if (door.room === from) {
        door.room = to;
      }
    }
  }
  for (const f of doc.faults) {
    if ((list === 'rooms' || list === 'floorZones') && f.enters === from) {
      f.enters = to;
    } else {
      for (const field of faultKind(f.kind)?.fields || []) {
        if (field.type === 'ref' && field.source === list && f[field.key] === from) {
          f[field.key] = to;
        }
      }
    }
  }
}

/** Ids a fault can be triggered on entering: the plan's rooms and floor zones. */
export function placeIds(doc) {
  return [...doc.site.rooms.map((r) => r.id), ...(doc.site.floorZones || []).map((z) => z.id)];
}

export function newFault(doc, kind) {
  const f = { id: freshId(doc.faults, kind), kind };
  for (const field of faultKind(kind)?.fields || []) {
    const refs = field.type === 'ref' ? doc.site[field.source] || [] : null;
    setPath(f, field.key, refs ? (refs.length ? refs[0].id : '') : field.initial);
  }
  if (f.to) {
    // a fault that carries the robot somewhere starts by carrying it to the middle of the plan
    const b = bounds(doc);
    Object.assign(f.to, { x: round((b.x0 + b.x1) / 2, 0.25), y: round((b.y0 + b.y1) / 2, 0.25) });
  }
  return f;
}

/** Editable fields of each kind of item: [key, label, type, choices]. Keys may be dotted. */
export function fieldsOf(doc, sel) {
  const ids = (list) => list.map((x) => x.id);
  switch (sel.list) {
    case 'rooms':
      return [['id', 'Id', 'text'], ['name', 'Name', 'text']];
    case 'doors':
      return [
        ['id', 'Id', 'text'],
        ['room', 'Room', 'choice', ids(doc.site.rooms)],
        ['wall', 'Wall number', 'int'],
        ['along', 'Centre along the wall (m)', 'num'],
        ['width', 'Clear width (m)', 'num'],
        ['mapped', 'On the map', 'choice', ['open', 'closed']],
        ['actual', 'In reality at the start', 'choice', ['open', 'closed']],
      ];
    case 'fixtures':
      return [['id', 'Id', 'text'], ['name', 'Name', 'text']];
    case 'floorZones':
      return [
        ['id', 'Id', 'text'],
        ['name', 'Name', 'text'],
        ['surface', 'Surface', 'choice', SURFACES],
        ['slip', 'Slip, share of wheel motion lost (0 to 1)', 'num'],
        ['noiseFactor', 'Wheel noise factor (at least 0)', 'num'],
      ];
    case 'clutter':
      return [
        ['id', 'Id', 'text'],
        ['name', 'Name', 'text'],
        ['appearAt', 'Appears at (s)', 'num'],
        ['vanishAt', 'Vanishes at (s, empty = never)', 'num?'],
      ];
    case 'start':
      return [['x', 'x (m)', 'num'], ['y', 'y (m)', 'num'], ['heading', 'Heading (deg, counter-clockwise from east)', 'num']];
    case 'waypoints':
      return [['x', 'x (m)', 'num'], ['y', 'y (m)', 'num'], ['speed', 'Speed on the leg here (m/s)', 'num'], ['dwell', 'Dwell (s)', 'num']];
    case 'faults':
      return faultFields(doc, listOf(doc, 'faults')[sel.index]);
    default:
      return [];
  }
}

function faultFields(doc, f) {
  const out = [['id', 'Id', 'text']];
  if ('near' in f) {
    out.push(['near.x', 'Near x (m)', 'num'], ['near.y', 'Near y (m)', 'num'], ['near.radius', 'Within (m)', 'num']);
  } else if ('enters' in f) {
    out.push(['enters', 'When entering', 'choice', placeIds(doc)]);
  } else {
    out.push(['at', 'At (s)', 'num']);
  }
  const { choices } = faultKinds();
  for (const field of faultKind(f.kind)?.fields || []) {
    if (field.type === 'number') {
      out.push([field.key, field.label, 'num']);
    } else if (field.type === 'bool') {
      out.push([field.key, field.label, 'bool']);
    } else if (field.type === 'choice') {
      out.push([field.key, field.label, 'choice', choices[field.source] || []]);
    } else if (field.type === 'ref') {
      out.push([field.key, field.label, 'choice', (doc.site[field.source] || []).map((x) => x.id)]);
    }
  }
  return out;
}

export function getPath(obj, key) {
  return key.split('.').reduce((o, k) => (o == null ? undefined : o[k]), obj);
}

export function setPath(obj, key, value) {
  const parts = key.split('.');
  let o = obj;
  for (let i = 0; i < parts.length - 1; i++) {
    o[parts[i]] = o[parts[i]] || {};
    o = o[parts[i]];
  }
  if (value === undefined) {
    delete o[parts[parts.length - 1]];
  } else {
    o[parts[parts.length - 1]] = value;
  }
}
