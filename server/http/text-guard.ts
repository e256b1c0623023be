/** Requests carrying NUL characters: refused before any route sees them (PostgreSQL cannot store U+0000). */
import type { RequestHandler } from 'express';
import { findNul, NUL_MESSAGE } from '../../contracts/text';
import { errors, type AppError } from './errors';

/** A URL whose path holds an encoded NUL (`%00`) names nothing: 404, before any id reaches a query. */
export const refuseNulInPath: RequestHandler = (req, _res, next) => {
  if (/%00/i.test(req.path) || req.path.includes('\u0000')) return next(errors.not_found(undefined, 'Nothing is found at a URL that holds a NUL character (%00).'));
  next();
};

/** A body (JSON or multipart fields) with a NUL in any text: 422 naming the field. */
export function nulProblem(body: unknown): AppError | null {
  const path = findNul(body);
  return path ? errors.invalid(`${path}: ${NUL_MESSAGE}`, [{ path, message: NUL_MESSAGE }]) : null;
}

/** After the JSON parser: refuse a body with a NUL in any string. */
export const refuseNulInBody: RequestHandler = (req, _res, next) => {
  next(nulProblem(req.body) ?? undefined);
};
