import { describe, expect, it } from 'vitest';
import { likeContains } from '../../server/db/like.js';

describe('search patterns', () => {
  it('when a search holds %, _ or a backslash, then they are escaped so that they match only themselves', () => {
    expect(likeContains('100% corn_seed\\x')).toBe('%100\\% corn\\_seed\\\\x%');
    expect(likeContains('Hesketh')).toBe('%Hesketh%');
  });
});
