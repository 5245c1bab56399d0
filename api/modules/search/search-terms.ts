/**
 * InnoDB's default full-text stopword list (INFORMATION_SCHEMA.INNODB_FT_DEFAULT_STOPWORD, from
 * memory): these words are never indexed, so a search must not require them.
 */
const STOPWORDS = new Set(
  (
    'a about an are as at be by com de en for from how i in is it la of on or that the this to ' +
    'was what when where who will with und www'
  ).split(' '),
);

/** innodb_ft_min_token_size's default: shorter words are not in the index. */
export const MIN_WORD_LENGTH = 3;
const MAX_WORDS = 10;

export interface SearchTerms {
  /** The words searched for, lower case. */
  words: string[];
  /** The words left out, and why, for the person to see. */
  skipped: { word: string; reason: 'short' | 'common' }[];
  /** MariaDB boolean-mode query: every word required, as a word or the start of one. */
  booleanQuery: string;
}

/**
 * Splits what the person typed into the words the full-text index knows. Operators of boolean
 * mode (+ - < > ( ) ~ * " @) never pass through: only letters, digits and underscores make a word.
 */
export function searchTerms(typed: string): SearchTerms {
  const words: string[] = [];
  const skipped: SearchTerms['skipped'] = [];
  for (const raw of typed.toLowerCase().match(/[\p{L}\p{N}_]+/gu) ?? []) {
    if (words.includes(raw) || skipped.some((s) => s.word === raw)) continue;
    if ([...raw].length < MIN_WORD_LENGTH) skipped.push({ word: raw, reason: 'short' });
    else if (STOPWORDS.has(raw)) skipped.push({ word: raw, reason: 'common' });
    else if (words.length < MAX_WORDS) words.push(raw);
  }
  return { words, skipped, booleanQuery: words.map((w) => `+${w}*`).join(' ') };
}

/** True when `text` holds every word (as a word start), the way the boolean query matched. */
export function holdsWords(text: string, words: readonly string[]): boolean {
  const lower = text.toLowerCase();
  return words.every((w) => new RegExp(`(^|[^\\p{L}\\p{N}_])${escape(w)}`, 'u').test(lower));
}

/** True when `text` holds at least one of the words. */
export function holdsAnyWord(text: string, words: readonly string[]): boolean {
  return words.some((w) => holdsWords(text, [w]));
}

function escape(word: string): string {
  return word.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');
}
