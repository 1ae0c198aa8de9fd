import { toErrorResponse } from './errors';

/** Wraps a route handler so that every failure answers in the API's one error shape. */
export function apiHandler<C>(handle: (request: Request, context: C) => Promise<Response>) {
  return async (request: Request, context: C): Promise<Response> => {
    try {
      return await handle(request, context);
    } catch (error) {
      return toErrorResponse(error);
    }
  };
}

export const noStore = { 'Cache-Control': 'no-store' } as const;
