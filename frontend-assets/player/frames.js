// Frames of one run, fetched a chunk at a time as the cursor needs them, so a long run plays
// without loading everything; a small cache keeps memory flat on long runs.

const KEEP_CHUNKS = 12;

// A server building as many scenes and chunks as it allows answers 503 with Retry-After; the
// player waits that long (at most 10 s) and asks again, twice, before it shows the message.
const BUSY_RETRIES = 2;

export async function getJson(url, retries = BUSY_RETRIES) {
  const r = await fetch(url, { headers: { Accept: 'application/json' }, credentials: 'same-origin' });
  if (r.status === 503 && retries > 0) {
    const wait = Math.min(10, Number(r.headers.get('Retry-After')) || 5);
    await new Promise((done) => { setTimeout(done, wait * 1000); });
    return getJson(url, retries - 1);
  }
  if (!r.ok) {
    let detail = '';
    try { detail = (await r.json()).detail || ''; } catch (e) { detail = ''; }
    throw new Error(detail || `The server answered ${r.status}.`);
  }
  return r.json();
}

export class RunFrames {
  constructor(base, scene) {
    this.base = base;
    this.scene = scene;
    this.perChunk = Math.max(1, scene.framesPerChunk || 50);
    this.count = scene.frameCount || 0;
    this.chunks = new Map();
    this.pending = new Map();
    this.onLoaded = () => {};
  }

  chunkOf(i) {
    return Math.floor(i / this.perChunk);
  }

  /** The frame if its chunk is here, else null (and the chunk is asked for). */
  frame(i) {
    if (i < 0 || i >= this.count) {
      return null;
    }
    const c = this.chunkOf(i);
    const chunk = this.chunks.get(c);
    if (chunk) {
      this.chunks.delete(c);
      this.chunks.set(c, chunk);
      return chunk.frames[i - chunk.first] || null;
    }
    this.request(c);
    return null;
  }

  /** Asks for the chunk of frame i and the one after, ahead of playback. */
  prefetch(i) {
    const c = this.chunkOf(i);
    this.request(c);
    if ((i % this.perChunk) > this.perChunk / 2) {
      this.request(c + 1);
    }
  }

  request(c) {
    if (c < 0 || c * this.perChunk >= this.count || this.chunks.has(c) || this.pending.has(c)) {
      return this.pending.get(c) || Promise.resolve();
    }
    const p = getJson(`${this.base}/frames/${c}/json`)
      .then((chunk) => {
        this.chunks.set(c, chunk);
        while (this.chunks.size > KEEP_CHUNKS) {
          this.chunks.delete(this.chunks.keys().next().value);
        }
        this.onLoaded(c);
      })
      .finally(() => this.pending.delete(c));
    this.pending.set(c, p);
    return p;
  }
}
