/**
 * Typed HTTP errors. Services throw these; the one error middleware turns them into
 * `{ error: { code, message, fields } }`.
 */
export class HttpError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly fields?: Record<string, string>,
  ) {
    super(message);
    this.name = 'HttpError';
  }
}

export class BadRequestError extends HttpError {
  constructor(message: string, fields?: Record<string, string>, code = 'invalid_request') {
    super(400, code, message, fields);
  }
}
export class UnauthenticatedError extends HttpError {
  constructor(message = 'Sign in to continue.') {
    super(401, 'unauthenticated', message);
  }
}
export class ForbiddenError extends HttpError {
  constructor(message = 'You do not have permission to do that.', code = 'forbidden') {
    super(403, code, message);
  }
}
export class NotFoundError extends HttpError {
  constructor(message = 'Not found.') {
    super(404, 'not_found', message);
  }
}
export class ConflictError extends HttpError {
  constructor(message: string, code = 'conflict') {
    super(409, code, message);
  }
}
export class GoneError extends HttpError {
  constructor(message: string, code = 'gone') {
    super(410, code, message);
  }
}
export class UnsupportedMediaTypeError extends HttpError {
  constructor(message = 'Send the body as application/json (or multipart/form-data for uploads).') {
    super(415, 'unsupported_media_type', message);
  }
}
export class UnprocessableError extends HttpError {
  constructor(message: string, fields?: Record<string, string>) {
    super(422, 'unprocessable', message, fields);
  }
}
export class ServiceUnavailableError extends HttpError {
  constructor(message: string, code = 'unavailable') {
    super(503, code, message);
  }
}
