import { describe, expect, it } from 'vitest';
import { holdsWords, searchTerms } from '../../api/modules/search/search-terms';

// How typed words become a MariaDB boolean-mode full-text query. The rules checked here are
// MariaDB's for InnoDB full-text indexes (MariaDB Knowledge Base, "Full-Text Index Overview" and
// "Full-Text Index Stopwords", from memory): words shorter than innodb_ft_min_token_size (3 by
// default) and the default stopwords are not indexed; `+word*` requires a word starting so.

describe('searchTerms', () => {
  it('requires every word as a word start', () => {
    expect(searchTerms('Footfall  deck').booleanQuery).toBe('+footfall* +deck*');
  });

  it('leaves out words shorter than 3 characters and default stopwords, and says which', () => {
    // "of" is a stopword too, but its length already keeps it out.
    const terms = searchTerms('k1 the bearing of m');
    expect(terms.words).toEqual(['bearing']);
    expect(terms.skipped).toEqual([
      { word: 'k1', reason: 'short' },
      { word: 'the', reason: 'common' },
      { word: 'of', reason: 'short' },
      { word: 'm', reason: 'short' },
    ]);
  });

  it('passes no boolean-mode operator through', () => {
    const terms = searchTerms('+deck -(slab) "walk*" ~mass @3 <a >b');
    expect(terms.booleanQuery).toBe('+deck* +slab* +walk* +mass*');
    expect(terms.booleanQuery).not.toMatch(/[()"~@<>-]/);
  });

  it('keeps letters beyond ASCII and counts characters, not bytes', () => {
    // "Ω" is two bytes in UTF-8 and one character: "Ωab" has three.
    expect(searchTerms('Ωab façade').words).toEqual(['ωab', 'façade']);
  });

  it('takes each word once and at most ten words', () => {
    const many = Array.from({ length: 14 }, (_, i) => `word${i}`).join(' ');
    expect(searchTerms(`deck deck DECK ${many}`).words).toHaveLength(10);
    expect(searchTerms('deck deck DECK').booleanQuery).toBe('+deck*');
  });

  it('answers an empty query when nothing searchable was typed', () => {
    expect(searchTerms('a k1 !!').booleanQuery).toBe('');
  });
});

describe('holdsWords', () => {
  it('matches a word start, as the index does, not the middle of a word', () => {
    expect(holdsWords('k = 24 kN/mm # bearing pad', ['bear'])).toBe(true);
    expect(holdsWords('unbearable', ['bear'])).toBe(false);
    expect(holdsWords('Deck and slab', ['deck', 'slab'])).toBe(true);
    expect(holdsWords('Deck only', ['deck', 'slab'])).toBe(false);
  });
});
