import { Router } from 'express';
import { currentUser, requireSignedIn } from '../../http/auth';
import type { AppContext } from '../../http/context';
import { parse } from '../../http/validate';
import {
  createSheetBody,
  draftBody,
  parseIfMatch,
  projectParams,
  sheetParams,
  updateSheetBody,
} from './sheets.schemas';
import { missingIfMatch, sheetsService } from './sheets.service';

/**
 * Sheets in a project (DESIGN §4): list, create (empty or from a template), read, rename, save
 * the draft with optimistic concurrency, delete a never-issued draft. Mounted at /api.
 */
export function createSheetsRouter({ db }: AppContext): Router {
  const router = Router();

  router.get('/sheet-templates', requireSignedIn, (_req, res) => {
    res.json({ templates: sheetsService.templates() });
  });

  router.get('/projects/:projectId/sheets', requireSignedIn, async (req, res) => {
    const { projectId } = parse(projectParams, req.params, 'params');
    res.json({ sheets: await sheetsService.list(db, currentUser(req), projectId) });
  });

  router.post('/projects/:projectId/sheets', requireSignedIn, async (req, res) => {
    const { projectId } = parse(projectParams, req.params, 'params');
    const input = parse(createSheetBody, req.body);
    const sheet = await sheetsService.create(db, currentUser(req), projectId, input);
    res.status(201).location(`/api/sheets/${sheet.id}`).json({ sheet });
  });

  router.get('/sheets/:sheetId', requireSignedIn, async (req, res) => {
    const { sheetId } = parse(sheetParams, req.params, 'params');
    const sheet = await sheetsService.get(db, currentUser(req), sheetId);
    res.set('ETag', `"${sheet.draftVersion}"`).json({ sheet });
  });

  router.patch('/sheets/:sheetId', requireSignedIn, async (req, res) => {
    const { sheetId } = parse(sheetParams, req.params, 'params');
    const input = parse(updateSheetBody, req.body);
    res.json({ sheet: await sheetsService.update(db, currentUser(req), sheetId, input) });
  });

  router.put('/sheets/:sheetId/draft', requireSignedIn, async (req, res) => {
    const { sheetId } = parse(sheetParams, req.params, 'params');
    const version = parseIfMatch(req.get('if-match'));
    if (version === null) throw missingIfMatch();
    const input = parse(draftBody, req.body);
    const saved = await sheetsService.saveDraft(db, currentUser(req), sheetId, version, input);
    res.set('ETag', `"${saved.draftVersion}"`).json(saved);
  });

  router.delete('/sheets/:sheetId', requireSignedIn, async (req, res) => {
    const { sheetId } = parse(sheetParams, req.params, 'params');
    await sheetsService.remove(db, currentUser(req), sheetId);
    res.status(204).end();
  });

  return router;
}
