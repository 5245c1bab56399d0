import { Router } from 'express';
import { currentUser, requireSignedIn } from '../../http/auth';
import type { AppContext } from '../../http/context';
import { parse } from '../../http/validate';
import {
  saveTemplateBody,
  startSheetBody,
  templateParams,
  updateTemplateBody,
} from './templates.schemas';
import { templatesService } from './templates.service';
import type { FirmTemplatesResponse } from '../../../core/contract/sheets';

/**
 * The firm's template library (beside the built-in templates of /api/sheet-templates): list,
 * save a sheet or revision as one, rename or describe it, delete it, start a sheet from it.
 * Mounted at /api.
 */
export function createTemplatesRouter(ctx: AppContext): Router {
  const router = Router();

  router.get('/firm-templates', requireSignedIn, async (req, res) => {
    res.json({
      templates: await templatesService.list(ctx, currentUser(req)),
    } satisfies FirmTemplatesResponse);
  });

  router.post('/firm-templates', requireSignedIn, async (req, res) => {
    const input = parse(saveTemplateBody, req.body);
    const template = await templatesService.save(ctx, currentUser(req), input);
    res.status(201).json({ template });
  });

  router.patch('/firm-templates/:templateId', requireSignedIn, async (req, res) => {
    const { templateId } = parse(templateParams, req.params, 'params');
    const input = parse(updateTemplateBody, req.body);
    res.json({ template: await templatesService.update(ctx, currentUser(req), templateId, input) });
  });

  router.delete('/firm-templates/:templateId', requireSignedIn, async (req, res) => {
    const { templateId } = parse(templateParams, req.params, 'params');
    await templatesService.remove(ctx, currentUser(req), templateId);
    res.status(204).end();
  });

  router.post('/firm-templates/:templateId/sheets', requireSignedIn, async (req, res) => {
    const { templateId } = parse(templateParams, req.params, 'params');
    const input = parse(startSheetBody, req.body);
    const sheet = await templatesService.startSheet(ctx, currentUser(req), templateId, input);
    res.status(201).location(`/api/sheets/${sheet.id}`).json({ sheet });
  });

  return router;
}
