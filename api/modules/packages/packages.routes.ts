import type { PackageResponse } from '../../../core/contract/print';
import { Router, type Request } from 'express';
import { currentUser } from '../../http/auth';
import type { AppContext } from '../../http/context';
import { AppError } from '../../http/errors';
import { parse } from '../../http/validate';
import { SESSION_COOKIE } from '../auth/auth.routes';
import { renderPdf } from './packages.pdf';
import { packageQuery } from './packages.schemas';
import { packagesService } from './packages.service';

function sessionCookie(req: Request): { name: string; value: string } | null {
  for (const part of (req.headers.cookie ?? '').split(';')) {
    const [name, ...rest] = part.trim().split('=');
    if (name === SESSION_COOKIE) return { name, value: rest.join('=') };
  }
  return null;
}

/** This server's own address for the socket the request came in on (loopback stays loopback). */
function serverOrigin(req: Request): string {
  const address = (req.socket.localAddress ?? '127.0.0.1').replace(/^::ffff:/, '');
  const host = address.includes(':') ? `[${address}]` : address;
  return `http://${host}:${req.socket.localPort}`;
}

/**
 * Mounted at /api/projects/:projectId/package: GET / (the package as JSON for the print view) and
 * GET /pdf (the same page printed to PDF by the server's Chromium).
 */
export function createPackagesRouter(ctx: AppContext): Router {
  const router = Router({ mergeParams: true });
  const canRead = ctx.access.requireProject('project.read');

  router.get('/', canRead, async (req, res) => {
    const { revisions } = parse(packageQuery, req.query, 'query');
    const projectId = Number(req.params.projectId);
    res.json(
      (await packagesService.compose(
        ctx,
        currentUser(req),
        projectId,
        revisions,
      )) satisfies PackageResponse,
    );
  });

  router.get('/pdf', canRead, async (req, res) => {
    const { revisions } = parse(packageQuery, req.query, 'query');
    const projectId = Number(req.params.projectId);
    // Composed first: a bad choice of revisions is refused before any browser starts.
    const pkg = await packagesService.compose(ctx, currentUser(req), projectId, revisions);
    if (pkg.parts.length === 0) {
      throw new AppError(
        422,
        'EMPTY_PACKAGE',
        'Nothing to bind: no sheet of this project has a sealed revision yet. Choose the revisions to include in the print view.',
        { field: 'revisions' },
      );
    }
    const chosen = pkg.parts.map((p) => p.revision.id).join(',');
    const pdf = await renderPdf({
      origin: serverOrigin(req),
      publicOrigin: `${req.protocol}://${req.get('host') ?? `${ctx.config.host}:${ctx.config.port}`}`,
      path: `/projects/${projectId}/package?revisions=${chosen}`,
      cookie: sessionCookie(req),
    });
    const file = `${pkg.project.jobNumber.replace(/[^A-Za-z0-9_-]/g, '_')}-calculation-package.pdf`;
    res
      .type('application/pdf')
      .set('Content-Disposition', `attachment; filename="${file}"`)
      .send(pdf);
  });

  return router;
}
