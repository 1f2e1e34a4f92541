/** One bucket of a sketch's readings chart (GET /api/v1/sketches/:id/readings). */
export interface HistoryPoint {
  /** Start of the bucket. */
  t: string;
  totalMin: number | null;
  totalMax: number | null;
  totalLast: number | null;
  /** Highest load in the bucket, against the sketch's current error budget and confidence. */
  loadMax: number | null;
  /** Level of the bucket's last reading ('unreachable' for a failed one). */
  level: string | null;
  readings: number;
  failures: number;
}

export interface HistoryMarker {
  t: string;
  kind: 'reset' | 'resize';
  instance: string;
  width: number | null;
  depth: number | null;
}

export interface SketchHistory {
  sketchId: number;
  instance: string | null;
  from: string;
  to: string;
  bucketSeconds: number;
  points: HistoryPoint[];
  markers: HistoryMarker[];
}
