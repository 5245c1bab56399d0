import { PRODUCT_NAME } from '../../config/words';

/** The product's mark: a first-mode curve over its rest line, then the name. */
export function Wordmark({ large = false }: { large?: boolean }) {
  return (
    <span className="inline-flex items-center gap-2">
      <svg
        aria-hidden="true"
        viewBox="0 0 32 20"
        className={large ? 'h-7 w-11' : 'h-5 w-8'}
        fill="none"
      >
        <path
          d="M2 10 C 7 -1, 11 -1, 16 10 S 25 21, 30 10"
          className="stroke-accent"
          strokeWidth="2.4"
          strokeLinecap="round"
        />
        <line x1="2" y1="10" x2="30" y2="10" className="stroke-ink" strokeDasharray="2 2" />
      </svg>
      <span className={`font-semibold tracking-tight text-ink ${large ? 'text-2xl' : 'text-lg'}`}>
        {PRODUCT_NAME}
      </span>
    </span>
  );
}
