/**
 * Classroom mode's live feed. The presenting trainer's roof is kept in `classes.live_state`
 * with a sequence number `live_seq`; each change sends `pg_notify('class_live', {classId, seq})`
 * in the same transaction. Every app process holds ONE dedicated listening connection (not one
 * per follower), reads the new state once per notification and fans it out to its own
 * server-sent-event streams. Because the notification goes through PostgreSQL, followers on
 * any process see a change made on any other.
 */
import type { Knex } from "knex";
import pg from "pg";
import { db } from "~/lib/db.server";

export const LIVE_CHANNEL = "class_live";

/** What the trainer presents. `spec` is a roof spec the engine accepted. */
export interface LiveContent {
  spec: unknown;
  title: string;
  /** Where the roof came from, e.g. "Lesson 3 · figure 2 of 4". */
  source: string;
  /** Which set of roofs the presenter steps through, so a reload resumes there. */
  deck: string;
  step: { index: number; count: number } | null;
  presenter: string;
  at: string;
}

/**
 * Where the class's session stands: `idle` before anything was presented (followers wait),
 * `live`, `paused` by the trainer (followers keep the last roof), `ended` when the trainer stopped.
 */
export const LIVE_PHASES = ["idle", "live", "paused", "ended"] as const;
export type LivePhase = (typeof LIVE_PHASES)[number];

export interface LiveSnapshot {
  classId: string;
  seq: number;
  state: LiveContent | null;
  phase: LivePhase;
}

export type LiveListener = (snapshot: LiveSnapshot) => void;
/** Told that a class's wall of hands up may have changed: it reads the wall and skips what it has sent. */
export type WallListener = () => void;

const encoder = new TextEncoder();
const frames = new WeakMap<LiveSnapshot, Uint8Array>();

/**
 * The server-sent event for a snapshot, serialised and encoded once per update however many
 * followers it goes to: the hub hands the same snapshot object to every listener.
 */
export function liveFrame(snap: LiveSnapshot): Uint8Array {
  let bytes = frames.get(snap);
  if (!bytes) {
    bytes = encoder.encode(
      `id: ${snap.seq}\nevent: state\ndata: ${JSON.stringify({ seq: snap.seq, state: snap.state, phase: snap.phase })}\n\n`,
    );
    frames.set(snap, bytes);
  }
  return bytes;
}

export async function readLiveState(classId: string): Promise<LiveSnapshot | null> {
  const row = await db()("classes").where({ id: classId }).first("live_seq", "live_state", "live_phase");
  return row
    ? {
        classId,
        seq: row.live_seq,
        state: (row.live_state as LiveContent | null) ?? null,
        phase: row.live_phase as LivePhase,
      }
    : null;
}

/**
 * Saves what the trainer presents and tells every listening process (on commit). This process's
 * own followers get it at once; the notification still comes back here, and streams skip what they sent.
 */
export async function publishLiveState(classId: string, content: LiveContent): Promise<number | null> {
  const seq = await db().transaction(async (trx) => {
    const { rows } = await trx.raw(
      `update classes set live_state = ?::jsonb, live_phase = 'live', live_seq = live_seq + 1 where id = ? returning live_seq`,
      [JSON.stringify(content), classId],
    );
    if (!rows.length) return null;
    const seq: number = rows[0].live_seq;
    await trx.raw(`select pg_notify(?, ?)`, [LIVE_CHANNEL, JSON.stringify({ classId, seq })]);
    return seq;
  });
  if (seq !== null) globalThis.__fallwrightLiveHub?.deliver({ classId, seq, state: content, phase: "live" });
  return seq;
}

export type PhaseChange =
  | { ok: true; seq: number }
  | { ok: false; reason: "missing" }
  | { ok: false; reason: "not-presenting"; phase: LivePhase };

/**
 * The trainer pauses, resumes or ends the session. Pausing or resuming needs a session that is
 * live or paused; ending always works and clears the class's hands up (they belong to the session).
 */
export async function setLivePhase(classId: string, phase: "live" | "paused" | "ended"): Promise<PhaseChange> {
  const result = await db().transaction(async (trx): Promise<PhaseChange & { snap?: LiveSnapshot; wall?: number }> => {
    const row = await trx("classes").where({ id: classId }).forUpdate().first("live_phase", "live_state");
    if (!row) return { ok: false, reason: "missing" };
    if (phase !== "ended" && (row.live_state == null || !["live", "paused"].includes(row.live_phase)))
      return { ok: false, reason: "not-presenting", phase: row.live_phase };
    const { rows } = await trx.raw(
      `update classes set live_phase = ?, live_seq = live_seq + 1 where id = ? returning live_seq`,
      [phase, classId],
    );
    const seq: number = rows[0].live_seq;
    await trx.raw(`select pg_notify(?, ?)`, [LIVE_CHANNEL, JSON.stringify({ classId, seq })]);
    let wall: number | undefined;
    if (phase === "ended") {
      const cleared = await trx("class_hand_ups").where({ class_id: classId }).del();
      if (cleared) wall = await bumpWall(trx, classId);
    }
    return {
      ok: true,
      seq,
      snap: { classId, seq, state: (row.live_state as LiveContent | null) ?? null, phase },
      wall,
    };
  });
  const hub = globalThis.__fallwrightLiveHub;
  if (result.ok && result.snap) hub?.deliver(result.snap);
  if (result.ok && result.wall !== undefined) hub?.deliverWall(classId);
  if (!result.ok) return result;
  return { ok: true, seq: result.seq };
}

/** Inside a transaction that changed the class's hands up: a new wall number, announced on commit. */
export async function bumpWall(trx: Knex.Transaction, classId: string): Promise<number> {
  const { rows } = await trx.raw(`update classes set wall_seq = wall_seq + 1 where id = ? returning wall_seq`, [
    classId,
  ]);
  const wall: number = rows[0].wall_seq;
  await trx.raw(`select pg_notify(?, ?)`, [LIVE_CHANNEL, JSON.stringify({ classId, wall })]);
  return wall;
}

interface HubOptions {
  connectionString: () => string;
  read: (classId: string) => Promise<LiveSnapshot | null>;
  /** How often the listening connection is checked with a query (a silent network drop sends no error). */
  probeMs?: number;
}

const BACKOFF_MS = [100, 250, 500, 1000, 2000, 5000];

/** One listening connection and the streams of this process that follow some class. */
export class LiveHub {
  private client: pg.Client | null = null;
  private connecting: Promise<void> | null = null;
  private closed = false;
  private failures = 0;
  private retry: ReturnType<typeof setTimeout> | null = null;
  private probe: ReturnType<typeof setInterval> | null = null;
  private readonly subs = new Map<string, Set<LiveListener>>();
  private readonly wallSubs = new Map<string, Set<WallListener>>();
  /** Per class: a read in flight, and whether another notification came while it ran. */
  private readonly reading = new Map<string, { again: boolean }>();
  private readonly streams = new Set<() => void>();
  /** Counts (re)connections; tests and logs use it. */
  connections = 0;

  constructor(private readonly options: HubOptions) {}

  /** Followers (open event streams) of any class in this process, for /metrics. */
  get subscriberCount(): number {
    let n = 0;
    for (const set of this.subs.values()) n += set.size;
    return n;
  }

  get listening(): boolean {
    return this.client !== null && this.connecting === null;
  }

  /** Follows one class; resolves once the listening connection is up. Returns the unsubscribe function. */
  subscribe(classId: string, listener: LiveListener): { ready: Promise<void>; unsubscribe: () => void } {
    let set = this.subs.get(classId);
    if (!set) this.subs.set(classId, (set = new Set()));
    set.add(listener);
    const ready = this.ensure().catch(() => {
      /* retried in the background; the stream still gets the state when the database is back */
    });
    return {
      ready,
      unsubscribe: () => {
        const s = this.subs.get(classId);
        s?.delete(listener);
        if (s && s.size === 0) this.subs.delete(classId);
      },
    };
  }

  /** Follows one class's wall of hands up (the trainer's streams); the listener reads the wall itself. */
  subscribeWall(classId: string, listener: WallListener): { ready: Promise<void>; unsubscribe: () => void } {
    let set = this.wallSubs.get(classId);
    if (!set) this.wallSubs.set(classId, (set = new Set()));
    set.add(listener);
    const ready = this.ensure().catch(() => {});
    return {
      ready,
      unsubscribe: () => {
        const s = this.wallSubs.get(classId);
        s?.delete(listener);
        if (s && s.size === 0) this.wallSubs.delete(classId);
      },
    };
  }

  deliverWall(classId: string) {
    for (const l of this.wallSubs.get(classId) ?? []) l();
  }

  /** Open event streams register how to end them, so shutdown does not wait for them. */
  trackStream(end: () => void): () => void {
    this.streams.add(end);
    return () => this.streams.delete(end);
  }

  private ensure(): Promise<void> {
    if (this.closed) return Promise.reject(new Error("live hub closed"));
    if (this.client && !this.connecting) return Promise.resolve();
    this.connecting ??= this.connect().finally(() => {
      this.connecting = null;
    });
    return this.connecting;
  }

  private async connect(): Promise<void> {
    const client = new pg.Client({
      connectionString: this.options.connectionString(),
      connectionTimeoutMillis: 3000,
      keepAlive: true,
    });
    client.on("error", (err) => this.lost(client, err));
    client.on("end", () => this.lost(client, null));
    client.on("notification", (msg) => {
      if (msg.channel !== LIVE_CHANNEL || !msg.payload) return;
      try {
        const { classId, wall } = JSON.parse(msg.payload) as { classId?: unknown; wall?: unknown };
        if (typeof classId !== "string") return;
        if (typeof wall === "number") this.deliverWall(classId);
        else if (this.subs.has(classId)) this.refresh(classId);
      } catch {
        /* not ours */
      }
    });
    try {
      await client.connect();
      await client.query(`listen ${LIVE_CHANNEL}`);
    } catch (err) {
      client.removeAllListeners("end");
      client.end().catch(() => {});
      this.scheduleReconnect();
      throw err;
    }
    if (this.closed) {
      await client.end().catch(() => {});
      return;
    }
    this.client = client;
    this.connections += 1;
    const reconnected = this.failures > 0 || this.connections > 1;
    this.failures = 0;
    this.startProbe(client);
    // Whatever changed while nobody was listening: read every followed class again.
    if (reconnected) {
      for (const classId of this.subs.keys()) this.refresh(classId);
      for (const classId of this.wallSubs.keys()) this.deliverWall(classId);
    }
  }

  private startProbe(client: pg.Client) {
    if (this.probe) clearInterval(this.probe);
    const every = this.options.probeMs ?? 30_000;
    this.probe = setInterval(() => {
      const timer = setTimeout(() => this.lost(client, new Error("probe timed out")), 5000);
      client
        .query("select 1")
        .catch((err: Error) => this.lost(client, err))
        .finally(() => clearTimeout(timer));
    }, every);
    this.probe.unref?.();
  }

  private lost(client: pg.Client, err: Error | null) {
    if (this.client !== client) return;
    this.client = null;
    if (this.probe) clearInterval(this.probe);
    this.probe = null;
    client.removeAllListeners("notification");
    client.end().catch(() => {});
    if (this.closed) return;
    console.warn(`[live] listening connection lost${err ? `: ${err.message}` : ""}; reconnecting`);
    this.scheduleReconnect();
  }

  private scheduleReconnect() {
    if (this.closed || this.retry) return;
    const wait = BACKOFF_MS[Math.min(this.failures, BACKOFF_MS.length - 1)];
    this.failures += 1;
    this.retry = setTimeout(() => {
      this.retry = null;
      if (this.subs.size === 0 && this.wallSubs.size === 0 && !this.client) {
        // Nobody follows anything: connect again on the next subscribe.
        this.failures = 0;
        return;
      }
      this.ensure().catch(() => {});
    }, wait);
    this.retry.unref?.();
  }

  /** Fans a snapshot out to this process's followers of its class. */
  deliver(snapshot: LiveSnapshot) {
    for (const l of this.subs.get(snapshot.classId) ?? []) l(snapshot);
  }

  /** Reads a class's state once however many notifications arrive meanwhile, then fans it out. */
  private refresh(classId: string) {
    const busy = this.reading.get(classId);
    if (busy) {
      busy.again = true;
      return;
    }
    const mark = { again: false };
    this.reading.set(classId, mark);
    void (async () => {
      try {
        do {
          mark.again = false;
          const snap = await this.options.read(classId);
          if (snap) this.deliver(snap);
        } while (mark.again && !this.closed);
      } catch (err) {
        console.warn(`[live] reading class ${classId} failed: ${(err as Error).message}`);
      } finally {
        this.reading.delete(classId);
      }
    })();
  }

  async close(): Promise<void> {
    this.closed = true;
    if (this.retry) clearTimeout(this.retry);
    if (this.probe) clearInterval(this.probe);
    for (const end of [...this.streams]) end();
    this.streams.clear();
    this.subs.clear();
    this.wallSubs.clear();
    const client = this.client;
    this.client = null;
    await this.connecting?.catch(() => {});
    if (client) {
      client.removeAllListeners("end");
      await client.end().catch(() => {});
    }
  }
}

declare global {
  var __fallwrightLiveHub: LiveHub | undefined;
}

/** This process's hub, made on first use and kept across dev-server reloads. */
export function liveHub(): LiveHub {
  globalThis.__fallwrightLiveHub ??= new LiveHub({
    connectionString: () => {
      const url = process.env.DATABASE_URL;
      if (!url) throw new Error("DATABASE_URL is not set");
      return url;
    },
    read: readLiveState,
  });
  return globalThis.__fallwrightLiveHub;
}

/** For shutdown: ends the listening connection and every open event stream of this process. */
export async function closeListeners(): Promise<void> {
  const hub = globalThis.__fallwrightLiveHub;
  globalThis.__fallwrightLiveHub = undefined;
  await hub?.close();
}
