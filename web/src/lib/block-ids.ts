/**
 * Block ids the editor makes (`b` and 12 hex digits, features/editor/lib/blocks.ts) mean nothing
 * to a reader; ids an author or a template gave (`deck-data`) do, and are worth showing.
 */
export function isGeneratedBlockId(id: string): boolean {
  return /^b[0-9a-f]{12}$/.test(id);
}
