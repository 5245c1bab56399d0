import { useEffect } from 'react';
import { useSearchParams } from 'react-router-dom';
import { SearchResults } from '../../features/search/components/search-results';

export function SearchRoute() {
  const [params] = useSearchParams();
  const q = params.get('q') ?? '';

  useEffect(() => {
    document.title = q ? `“${q}” · Search · Modewright` : 'Search · Modewright';
  }, [q]);

  return (
    <div className="flex flex-col gap-4">
      <h1 className="text-2xl font-semibold">Search</h1>
      <SearchResults q={q} />
    </div>
  );
}
