import { describe, expect, it } from 'vitest';
import { mentionedEmails } from './mentions';

describe('mentionedEmails', () => {
  it('finds @-prefixed addresses at the start, mid-sentence and before punctuation, lower-cased, once each', () => {
    expect(mentionedEmails('@Ada@Example.org look at the knee near 3 T, and @bo.li@uni-x.edu. Again @ada@example.org!')).toEqual(['ada@example.org', 'bo.li@uni-x.edu']);
  });

  it('does not take a plain address or an address without a domain suffix for a mention', () => {
    expect(mentionedEmails('write to ada@example.org or @localhost@box')).toEqual([]);
  });
});
