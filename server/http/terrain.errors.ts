/**
 * The terrain core's refusals as API errors: every TerrainError code (terrain/errors.ts) answers 422 under its own
 * code, with the caller's message and the engine's reason as the field problem.
 */
import { TERRAIN_ERROR_CODES, type TerrainError, type TerrainErrorCode } from '../../terrain/errors';
import { defineErrors, type AppError, type ErrorDeclaration } from './errors';

const refusal: ErrorDeclaration<[message: string, field: string, reason: string]> = {
  status: 422,
  message: (message) => message,
  fields: (_message, field, reason) => [{ path: field, message: reason }],
};

const terrainErrors = defineErrors('terrain', Object.fromEntries(TERRAIN_ERROR_CODES.map((code) => [code, refusal])) as Record<TerrainErrorCode, typeof refusal>);

/** A TerrainError as a 422 under its code; `message` is the whole message, `field` the input at fault. */
export function terrainRefusal(err: TerrainError, field: string, message = err.message): AppError {
  return terrainErrors[err.code](message, field, err.message);
}
