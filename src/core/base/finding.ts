/** A finding: something about the inputs or a result worth telling the user, with a stable code and the field it is about. */
export type Severity = 'info' | 'warning' | 'danger';

export interface Finding {
  /** stable machine-readable code, e.g. "kt-ke-mismatch" */
  code: string;
  severity: Severity;
  /** project path the finding is about, e.g. "nameplate.Kt" */
  field?: string;
  message: string;
}
