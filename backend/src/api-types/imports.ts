/** One column of an inventory file: the same fields as registering one sketch. */
export interface InventoryColumn {
  name: string;
  required: 'yes' | 'no' | 'targetUrl or instances';
  kind: 'text' | 'number' | 'instances';
  meaning: string;
  example: string;
}

export interface RowProblem {
  field?: string;
  code: string;
  /** The status a single registration would answer: 400, 403 (another team's) or 409 (exists). */
  status: number;
  message: string;
}

/** What importing one row of the file would do, or why it cannot. */
export interface RowVerdict {
  line: number;
  service: string | null;
  sketch: string | null;
  team: string | null;
  targets: string | null;
  newService: boolean;
  ok: boolean;
  problems: RowProblem[];
}

/** The preview, and the body of a refused import beside its error. */
export interface ImportPreview {
  rows: RowVerdict[];
  ready: number;
  withProblems: number;
}

export interface ImportSummary {
  imported: number;
  servicesCreated: string[];
  sketches: { line: number; id: number; service: string; sketch: string; team: string }[];
}
