/**
 * A planning input that cannot be computed: the server answers it with `status` and `code`
 * (400 invalid input, 409 conflict such as an exhausted pool), never a 500.
 */
export class PlanningError extends Error {
  readonly status: 400 | 409;
  readonly code: string;
  constructor(status: 400 | 409, code: string, message: string) {
    super(message);
    this.name = 'PlanningError';
    this.status = status;
    this.code = code;
  }
}

export function isPlanningError(e: unknown): e is PlanningError {
  return e instanceof PlanningError;
}
