import { describe, expect, it } from 'vitest';
import { paths, safeNext } from '../../../src/app/paths';

describe('safeNext (where sign-in sends the user afterwards)', () => {
  it('keeps a local path with its query', () => {
    expect(safeNext('/outbox/12?x=1')).toBe('/outbox/12?x=1');
  });

  it.each([
    ['another origin', 'https://elsewhere.test/phish'],
    ['a protocol-relative address', '//elsewhere.test/phish'],
    ['a relative path', 'team'],
    ['the sign-in page itself', '/sign-in?next=%2Fteam'],
    ['the sign-out page', '/sign-out'],
    ['nothing', null],
  ])('falls back to Cases for %s', (_what, next) => {
    expect(safeNext(next)).toBe(paths.cases);
  });
});
