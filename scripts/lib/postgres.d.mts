/** A private PostgreSQL cluster on 127.0.0.1 (see postgres.mjs). */
export interface PostgresCluster {
  /** A connection URL for database `db` as the `app` user. */
  url(db: string): string
  /** Whether this call started the server (so the caller should stop it). */
  startedHere: boolean
  /** Stops the server (fast shutdown), waiting until it is down. */
  stop(): void
}

/** Creates the cluster on first use and starts it when it is not running; `dir` defaults to `.data`. */
export function startPostgres(port: number, options?: { dir?: string }): PostgresCluster
