import { afterEach, describe, expect, it, vi } from 'vitest';
import { createLogger } from '../../server/logger';

afterEach(() => vi.restoreAllMocks());

describe('logger', () => {
  it('writes JSON lines with fields in production mode and redacts secrets', () => {
    const lines: string[] = [];
    vi.spyOn(process.stdout, 'write').mockImplementation((chunk) => {
      lines.push(String(chunk));
      return true;
    });
    createLogger('info', true).child({ requestId: 'r-1' }).info('signed in', { userId: 7, password: 'hunter2-secret', sessionId: 'abc' });
    const entry = JSON.parse(lines[0]!);
    expect(entry).toMatchObject({ level: 'info', message: 'signed in', requestId: 'r-1', userId: 7 });
    expect(entry.password).toBe('[redacted]');
    expect(entry.sessionId).toBe('[redacted]');
    expect(lines.join('')).not.toContain('hunter2-secret');
  });

  it('drops lines below its level', () => {
    const write = vi.spyOn(process.stdout, 'write').mockImplementation(() => true);
    createLogger('warn', false).info('quiet');
    expect(write).not.toHaveBeenCalled();
  });
});
