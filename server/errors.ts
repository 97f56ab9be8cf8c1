// AppError: the one error type handlers throw; codes are stable snake_case strings the client switches on.

/** An error with an HTTP status and a stable code, sent as `{ error: { code, message, details? } }`. */
export class AppError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly details?: unknown,
  ) {
    super(message);
    this.name = 'AppError';
  }
}

/** 401: the route needs a signed-in user. */
export const unauthenticated = () => new AppError(401, 'unauthenticated', 'Sign in to continue');
/** 403: signed in, but the role may not do this. */
export const forbidden = () => new AppError(403, 'forbidden', 'Your role does not allow this');
/** 404: nothing with that id in the user's shop (another shop's record looks exactly like a missing one). */
export const notFound = (what = 'Record') => new AppError(404, 'not_found', `${what} not found`);
/** 400: a one-time link that is unknown, used or expired. */
export const tokenInvalid = () =>
  new AppError(400, 'token_invalid', 'This link is invalid, already used or expired; ask for a new one');
