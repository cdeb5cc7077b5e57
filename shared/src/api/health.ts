/** Answer of `GET /api/health`: the running version and a real database round trip. */
export interface HealthResponse {
  status: 'ok' | 'degraded';
  version: string;
  database: {
    status: 'up' | 'down';
    /** Round-trip time of `select 1`, in milliseconds; null when the database is down. */
    latencyMs: number | null;
    /** Server version reported by PostgreSQL; null when the database is down. */
    serverVersion: string | null;
  };
  /** Server clock at the time of the answer, ISO 8601. */
  time: string;
}
