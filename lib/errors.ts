// Errors that carry their HTTP meaning, thrown by services and turned into responses by
// one wrapper (lib/http/api.ts) or into form messages (lib/validation/action.ts).
export class AppError extends Error {
  constructor(
    message: string,
    readonly status: number,
    readonly details?: Record<string, unknown>,
  ) {
    super(message);
    this.name = new.target.name;
  }
}

export class NotFoundError extends AppError {
  constructor(message = 'Not found.') {
    super(message, 404);
  }
}

export class ForbiddenError extends AppError {
  constructor(message = 'You are not allowed to do that.') {
    super(message, 403);
  }
}

/** A refused or stale step: the current state goes back with it so the screen can catch up. */
export class ConflictError extends AppError {
  constructor(message: string, details?: Record<string, unknown>) {
    super(message, 409, details);
  }
}

export class ValidationError extends AppError {
  constructor(
    message: string,
    readonly fieldErrors: Record<string, string[]> = {},
  ) {
    super(message, 422, { fieldErrors });
  }
}
