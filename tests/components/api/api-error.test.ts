import { describe, expect, it } from 'vitest';
import { ApiError, apiErrorFrom, errorMessage, isRetryable, networkErrorStatus } from '../../../components/api/api-error';

describe('apiErrorFrom', () => {
  it('keeps the server code, message and field problems word for word', () => {
    const e = apiErrorFrom(422, {
      error: { code: 'validation', message: 'Check the highlighted fields.', fields: [{ path: 'name', message: 'A team name needs at least 2 characters.' }] },
    });
    expect(e).toBeInstanceOf(ApiError);
    expect(e.status).toBe(422);
    expect(e.code).toBe('validation');
    expect(e.message).toBe('Check the highlighted fields.');
    expect(e.fields).toEqual([{ path: 'name', message: 'A team name needs at least 2 characters.' }]);
  });

  it('gives an empty field list when the server sent none', () => {
    const e = apiErrorFrom(409, { error: { code: 'last_owner', message: 'A team needs at least one owner.' } });
    expect(e.fields).toEqual([]);
    expect(e.code).toBe('last_owner');
  });

  it('says which status came back when the body is not the shared error shape', () => {
    const e = apiErrorFrom(502, '<html>Bad gateway</html>');
    expect(e.code).toBe('unexpected_response');
    expect(e.message).toContain('502');
  });

  it('flags a 401 as "no session" and nothing else', () => {
    expect(apiErrorFrom(401, { error: { code: 'unauthenticated', message: 'Sign in first.' } }).isUnauthenticated).toBe(true);
    expect(apiErrorFrom(403, { error: { code: 'forbidden', message: 'Not for your role.' } }).isUnauthenticated).toBe(false);
  });
});

describe('isRetryable', () => {
  it('retries network failures and server errors', () => {
    expect(isRetryable(new ApiError(networkErrorStatus, 'network', 'offline'))).toBe(true);
    expect(isRetryable(new ApiError(503, 'unavailable', 'down'))).toBe(true);
  });

  it('never retries a refusal (4xx) or an error that is not an ApiError', () => {
    for (const status of [400, 401, 403, 404, 409, 422, 429]) expect(isRetryable(new ApiError(status, 'x', 'y'))).toBe(false);
    expect(isRetryable(new Error('boom'))).toBe(false);
  });
});

describe('errorMessage', () => {
  it('shows an error message as it is, and a plain sentence for a thrown non-error', () => {
    expect(errorMessage(new ApiError(409, 'last_owner', 'A team needs at least one owner.'))).toBe('A team needs at least one owner.');
    expect(errorMessage('nope')).toBe('Something went wrong. Try again.');
  });
});
