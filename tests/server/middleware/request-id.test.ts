import { describe, expect, it } from 'vitest';
import { loggablePath } from '../../../server/middleware/request-id';

describe('loggablePath', () => {
  it('masks one-time tokens and drops the query string', () => {
    const token = 'Zx3_k9-QpL2mN8vB4cT7yH1jR5wE6uI0oA2sD4fG6hJ';
    expect(loggablePath(`/api/invites/${token}/info?x=1`)).toBe('/api/invites/:token/info');
    expect(loggablePath(`/reset-password/${token}`)).toBe('/reset-password/:token');
    expect(loggablePath('/api/users/42')).toBe('/api/users/42');
  });
});
