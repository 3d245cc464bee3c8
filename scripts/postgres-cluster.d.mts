// Types of postgres-cluster.mjs, which plain node runs for `npm test` and TypeScript code imports.

/** The newest installed server's bin folder (Debian keeps each major version apart), or null. */
export function postgresBinDir(): string | null

export interface PostgresCluster {
  /** The `postgres` maintenance database. */
  url: string
  stop: () => void
}

/** Starts a cluster and returns its URL and a stop function. */
export function startPostgresCluster(): Promise<PostgresCluster>
