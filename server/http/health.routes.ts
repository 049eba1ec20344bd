import { databaseAnswers, type Db } from '../db/create-db.ts';
import type { ReadReplica } from '../db/read-replica.ts';
import { defineRoute, type Route } from './routes/route.ts';

/** What `GET /healthz` answers, 200 or 503. */
export interface HealthAnswer {
  status: 'ok' | 'degraded';
  database: 'ok' | 'unreachable';
  /** The reader for lag-tolerant reads (LAGBOOK_DB_READ_*), when one is set; a reader that is down never makes the answer 503 (reads fall back to the writer). */
  reader?: 'ok' | 'unreachable';
}

/**
 * `GET /healthz`: 200 when the database answers, 503 otherwise (for load balancers and scripts).
 * It chooses its own status, so it writes its answer itself (`stream`).
 */
export function healthRoutes(deps: { db: Db; reads?: Pick<ReadReplica, 'readerAnswers'> }): Route[] {
  return [
    defineRoute({
      method: 'get',
      path: '/healthz',
      auth: 'none',
      tag: 'service',
      summary: 'Liveness and database check for load balancers (200 ok, 503 degraded).',
      response: {
        status: 200,
        description:
          '`{ status: "ok", database: "ok" }`: the app runs and the database answers; with a reader set, `reader` says whether it answers ("ok" or "unreachable": reads then use the writer, still 200).',
      },
      errors: { 503: '`{ status: "degraded", database: "unreachable" }`: the app runs but the database does not answer (this body, not the error body).' },
      stream: true,
      handle: async (_input, { res }) => {
        const [ok, reader] = await Promise.all([databaseAnswers(deps.db), deps.reads ? deps.reads.readerAnswers() : null]);
        const answer: HealthAnswer = {
          status: ok ? 'ok' : 'degraded',
          database: ok ? 'ok' : 'unreachable',
          ...(reader === null ? {} : { reader: reader ? ('ok' as const) : ('unreachable' as const) }),
        };
        res.status(ok ? 200 : 503).json(answer);
      },
    }),
  ];
}
