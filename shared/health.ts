/** Answer of `GET /api/health`. */
export interface HealthReport {
  status: 'ok' | 'degraded';
  database: 'up' | 'down';
  version: string;
  mode: 'local' | 'production';
}
