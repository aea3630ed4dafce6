export class AppError extends Error {
  constructor(
    public readonly status: number,
    public readonly code: string,
    message: string,
    public readonly details?: unknown,
  ) {
    super(message);
  }
}
export class BadInput extends AppError {
  constructor(message: string, details?: unknown) {
    super(400, 'bad_input', message, details);
  }
}
export class Unauthenticated extends AppError {
  constructor(message = 'Sign in to continue.') {
    super(401, 'unauthenticated', message);
  }
}
export class Forbidden extends AppError {
  constructor(message = 'Your role in this studio does not allow that.') {
    super(403, 'forbidden', message);
  }
}
export class NotFound extends AppError {
  constructor(message = 'Not found.') {
    super(404, 'not_found', message);
  }
}
export class Conflict extends AppError {
  constructor(message: string, details?: unknown) {
    super(409, 'conflict', message, details);
  }
}
export class Gone extends AppError {
  constructor(message: string) {
    super(410, 'gone', message);
  }
}
export class TooManyRequests extends AppError {
  constructor(message: string, public readonly retryAfterS: number) {
    super(429, 'too_many_requests', message);
  }
}
