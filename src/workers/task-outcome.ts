/**
 * What a compute task returns: its output, or an error as data (thrown errors lose their fields
 * across the thread boundary). `errors` name the offending fields of the request.
 */
export interface TaskError {
  status: number;
  detail: string;
  errors?: { field: string; message: string }[];
}

export type TaskOutcome<O> = { ok: true; output: O } | { ok: false; error: TaskError };
