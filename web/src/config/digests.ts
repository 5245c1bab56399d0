// What each digest covers, in the words every screen uses for it (the revision page, the print and
// /verify), so a checker comparing them reads one story: the text and results digests are the
// revision's own; the seal digest covers both and what the seal vouches for besides, and it is the
// one the signature signs (api/modules/seals/seal-payload.ts).

export const DIGEST_WORDS = {
  text: {
    label: 'Text digest',
    covers: 'SHA-256 of the sheet’s canonical text: every block’s source as issued',
  },
  results: {
    label: 'Results digest',
    covers: 'SHA-256 of the results frozen at issue',
  },
  seal: {
    label: 'Seal digest',
    covers:
      'SHA-256 over the text and results digests, the engine version, the revision, the project, the sheet and the principal: the digest the signature signs and /verify recomputes',
  },
} as const;
