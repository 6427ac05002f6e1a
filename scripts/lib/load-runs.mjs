// The load of `npm run load` and `npm run cluster:test`, driven by autocannon: readers of one
// notebook, and writers that each save their own cell again and again with a running
// baseRevision, so afterwards every answered save can be looked for among the revisions.
// Imported once npm packages are installed (autocannon, mysql2).
import autocannon from 'autocannon';
import mysql from 'mysql2/promise';

/** Nearest-rank percentiles of response times in ms. */
export function percentiles(samples) {
  const sorted = Float64Array.from(samples).sort();
  const at = (p) => (sorted.length ? sorted[Math.min(sorted.length - 1, Math.ceil((p / 100) * sorted.length) - 1)] : NaN);
  return { p50: at(50), p95: at(95), p99: at(99) };
}

/** Runs autocannon instances together; resolves with their results and every response's time and status. */
async function runAll(options) {
  const samples = [];
  let ok = 0;
  /** Answers other than 2xx, by status. */
  const refused = {};
  const instances = options.map((one) => {
    const instance = autocannon({ timeout: 30, ...one });
    instance.on('response', (_client, status, _bytes, ms) => {
      samples.push(ms);
      if (status >= 200 && status < 300) ok += 1;
      else refused[status] = (refused[status] ?? 0) + 1;
    });
    return instance;
  });
  const results = await Promise.all(instances);
  const seconds = Math.max(...results.map((r) => r.duration));
  return {
    responses: samples.length,
    ok,
    refused,
    errors: results.reduce((sum, r) => sum + r.errors, 0),
    timeouts: results.reduce((sum, r) => sum + r.timeouts, 0),
    perSecond: ok / seconds,
    ...percentiles(samples),
  };
}

/** `connections` readers of one notebook for `seconds`, signed in as `session`. */
export function readLoad({ url, session, notebookId, connections, seconds }) {
  return runAll([
    { url: `${url}/api/notebooks/${notebookId}`, connections, duration: seconds, headers: { cookie: session.cookie, accept: 'application/json' } },
  ]);
}

/** The text a writer saves: unique to its cell and its turn, so each save can be found afterwards. */
const textOf = (writer, turn) => `drive in\nR1 [in out] 1k\nC1 [out gnd] ${100 + (turn % 50)}n\nshow out\n# writer ${writer.cellId}, save ${turn}\n`;

/**
 * One connection per writer, for `seconds`. `writers` are { url, session, notebookId, cellId }
 * (a new cell at revision 1 each; its url says which server it goes through). Each keeps
 * its own baseRevision; a 409 (a save that went through unanswered, say) resynchronises it.
 * Returns the timing and, per writer, the texts answered 2xx and every text sent.
 */
export async function saveLoad({ writers, seconds }) {
  const state = writers.map((writer) => ({ ...writer, base: 1, turn: 0, pending: '', acknowledged: [], sent: [] }));
  const timing = await runAll(
    state.map((writer) => ({
      url: writer.url,
      connections: 1,
      duration: seconds,
      requests: [
        {
          method: 'PUT',
          path: `/api/notebooks/${writer.notebookId}/cells/${writer.cellId}`,
          headers: writer.session.writeHeaders(),
          setupRequest(request) {
            writer.turn += 1;
            writer.pending = textOf(writer, writer.turn);
            writer.sent.push(writer.pending);
            return { ...request, body: JSON.stringify({ text: writer.pending, baseRevision: writer.base }) };
          },
          onResponse(status, body) {
            if (status === 201) {
              writer.acknowledged.push(writer.pending);
              writer.base += 1;
            } else if (status === 409) {
              writer.base = JSON.parse(body).details?.current?.number ?? writer.base;
            }
          },
        },
      ],
    })),
  );
  return { timing, writers: state };
}

/** A mysql2 connection to the database of `env` (DATABASE_URL or DB_*). */
export function openDatabase(env) {
  if (env.DATABASE_URL) return mysql.createConnection({ uri: env.DATABASE_URL });
  return mysql.createConnection({ host: env.DB_HOST, port: Number(env.DB_PORT), user: env.DB_USER, password: env.DB_PASSWORD, database: env.DB_NAME });
}

/**
 * What became of the writers' saves, from the database: `lost` saves answered 2xx but not
 * stored, `doubled` texts stored twice in one cell, `unanswered` saves stored whose answer
 * never came (cut off at the end of the run, or timed out), and whether every cell holds
 * exactly its first revision plus the saves stored.
 */
export async function checkSaves(env, writers) {
  const db = await openDatabase(env);
  try {
    let lost = 0;
    let doubled = 0;
    let unanswered = 0;
    let acknowledged = 0;
    let countMismatch = 0;
    for (const writer of writers) {
      const [rows] = await db.query('SELECT number, text FROM cell_revisions WHERE cellId = ? ORDER BY number', [writer.cellId]);
      const stored = new Map();
      for (const row of rows) stored.set(row.text, (stored.get(row.text) ?? 0) + 1);
      const answered = new Set(writer.acknowledged);
      acknowledged += answered.size;
      for (const text of answered) if (!stored.has(text)) lost += 1;
      for (const count of stored.values()) if (count > 1) doubled += count - 1;
      const sentUnanswered = writer.sent.filter((text) => !answered.has(text) && stored.has(text)).length;
      unanswered += sentUnanswered;
      const numbers = rows.map((row) => row.number);
      const gapless = numbers.every((n, i) => n === i + 1);
      if (rows.length !== 1 + answered.size + sentUnanswered || !gapless) countMismatch += 1;
    }
    return { acknowledged, lost, doubled, unanswered, countMismatch };
  } finally {
    await db.end();
  }
}
