import { Router } from 'express';
import { currentUser, requireSignedIn } from '../../http/auth';
import type { AppContext } from '../../http/context';
import { parse } from '../../http/validate';
import { searchQuery } from './search.schemas';
import { searchService } from './search.service';
import type { SearchAnswer } from '../../../core/contract/search';

/** Mounted at /api/search: GET ?q=… across the projects the person may open. */
export function createSearchRouter({ db }: AppContext): Router {
  const router = Router();
  router.get('/', requireSignedIn, async (req, res) => {
    const { q } = parse(searchQuery, req.query, 'query');
    res.json((await searchService.search(db, currentUser(req), q)) satisfies SearchAnswer);
  });
  return router;
}
