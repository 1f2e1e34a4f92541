// A dump report as the server answers it, for the small matrix [[0,3,1,4],[2,0,5,1]] at E = 3 (tests/api/dumps).
export const REPORT = {
  id: 7,
  createdAt: '2026-12-01T09:30:00Z',
  uploadedBy: 'responder',
  sketch: { id: 3, service: 'checkout', sketch: 'per-card-limiter', team: 'payments' },
  fileName: 'limiter.csv',
  format: 'csv',
  byteSize: 16,
  width: 4,
  depth: 2,
  errorBudget: 3,
  confidence: 0.9,
  streamTotal: 8,
  streamTotalSource: 'largest row sum',
  rows: [
    { row: 0, sum: 8, mean: 2, zeroFraction: 0.25, nonzeroCells: 3, median: 2, shareAtOrAboveBudget: 0.5 },
    { row: 1, sum: 8, mean: 2, zeroFraction: 0.25, nonzeroCells: 3, median: 1.5, shareAtOrAboveBudget: 0.25 },
  ],
  rowSumsAgree: true,
  distinctEstimate: 5.545177444479562,
  distinctStandardError: 2.1,
  distinctSaturated: false,
  empiricalMissRisk: 0.125,
  markovMissRisk: 0.4444444444444444,
  load: 0.8433,
  capacity: 9.486,
  boundNow: 8.43,
  level: 'watch',
  verdict: 'Watch: the error budget still holds, but the sketch is past its watch line.',
  histogram: [
    { from: 0, to: 0, cells: 2 },
    { from: 1, to: 1, cells: 2 },
    { from: 2, to: 3, cells: 2 },
    { from: 4, to: 7, cells: 2 },
  ],
};

export const LIST_ITEM = { id: 7, createdAt: REPORT.createdAt, uploadedBy: 'responder', sketch: REPORT.sketch, fileName: 'limiter.csv', format: 'csv', byteSize: 16, width: 4, depth: 2, level: 'watch', load: 0.8433 };
