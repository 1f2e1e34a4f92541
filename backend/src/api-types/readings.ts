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
  /**
   * Share of non-zero cells in each row (row 0 first) at the bucket's last good
   * reading — of whichever instance reported last, unless one instance is asked for.
   */
  occupancy: number[] | null;
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
