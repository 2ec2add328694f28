/** The one error type services throw; the error handler turns it into JSON. */
export class AppError extends Error {
  constructor(
    readonly code: string,
    readonly status: number,
    message: string,
    readonly details?: unknown,
  ) {
    super(message);
    this.name = 'AppError';
  }
}

export const notFound = (what: string) => new AppError('not_found', 404, `${what} was not found.`);
export const forbidden = (message = 'You do not have access to this.') =>
  new AppError('forbidden', 403, message);
export const unauthenticated = () =>
  new AppError('unauthenticated', 401, 'Please sign in to continue.');
