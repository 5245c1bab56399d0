import { useEffect, useId, useState, type FormEvent } from 'react';
import { useNavigate, useSearchParams } from 'react-router-dom';
import { paths } from '../../../config/paths';

/** The header's search box: opens the results page for what was typed. */
export function SearchBox() {
  const id = useId();
  const navigate = useNavigate();
  const [params] = useSearchParams();
  const current = params.get('q') ?? '';
  const [value, setValue] = useState(current);
  // Follows the results page's query (back and forward, a link to a search).
  useEffect(() => setValue(current), [current]);

  function submit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const q = value.trim();
    if (q) navigate(paths.search.href(q));
  }

  return (
    <form role="search" onSubmit={submit} className="flex items-center gap-1">
      <label htmlFor={id} className="sr-only">
        Search sheets and remarks
      </label>
      <input
        id={id}
        type="search"
        value={value}
        onChange={(e) => setValue(e.target.value)}
        placeholder="Search sheets and remarks"
        maxLength={200}
        className="w-44 rounded-sm border border-rule-strong bg-paper-sheet px-2 py-1 text-sm sm:w-60"
      />
      <button
        type="submit"
        className="rounded-sm border border-rule-strong px-2 py-1 text-sm font-medium text-ink-soft hover:text-ink"
      >
        Search
      </button>
    </form>
  );
}
