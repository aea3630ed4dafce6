// Every API route with the answer expected for an anonymous visitor and for each studio role.
// 'ok' means "let through" (any status but 401/403: the handler may still answer 404 or 422).
// The route-table test fails when the app registers a route that is missing here, or the reverse.
type Expect = 'ok' | 401 | 403;
export interface RouteRow {
  method: 'get' | 'post' | 'put' | 'patch' | 'delete';
  path: string;
  anon: Expect;
  owner: Expect;
  photographer: Expect;
  retoucher: Expect;
  guest: Expect;
  /** The route ends the caller's session; test it with a throw-away agent. */
  endsSession?: boolean;
}

const row = (method: RouteRow['method'], path: string, anon: Expect, owner: Expect, photographer: Expect, retoucher: Expect, guest: Expect, extra: Partial<RouteRow> = {}): RouteRow =>
  ({ method, path, anon, owner, photographer, retoucher, guest, ...extra });

export const ROUTE_TABLE: RouteRow[] = [
  //   method    path                                                   anon  owner photo retou guest
  row('get',    '/api/health',                                          'ok', 'ok', 'ok', 'ok', 'ok'),
  row('get',    '/api/auth/csrf',                                       'ok', 'ok', 'ok', 'ok', 'ok'),
  row('post',   '/api/auth/sign-in',                                    'ok', 'ok', 'ok', 'ok', 'ok'),
  row('post',   '/api/auth/sign-out',                                   'ok', 'ok', 'ok', 'ok', 'ok', { endsSession: true }),
  row('get',    '/api/auth/me',                                         401,  'ok', 'ok', 'ok', 'ok'),
  row('post',   '/api/auth/active-studio',                              401,  'ok', 'ok', 'ok', 'ok'),
  row('post',   '/api/auth/studios',                                    401,  'ok', 'ok', 'ok', 'ok'),
  row('post',   '/api/auth/password-reset',                             'ok', 'ok', 'ok', 'ok', 'ok'),
  row('post',   '/api/auth/password-reset/:token',                      'ok', 'ok', 'ok', 'ok', 'ok'),
  row('get',    '/api/auth/invitations/:token',                         'ok', 'ok', 'ok', 'ok', 'ok'),
  row('post',   '/api/auth/invitations/:token/accept',                  'ok', 'ok', 'ok', 'ok', 'ok'),
  row('get',    '/api/studios/:studioId/members',                       401,  'ok', 'ok', 'ok', 'ok'),
  row('patch',  '/api/studios/:studioId/members/:memberId',             401,  'ok', 403,  403,  403),
  row('delete', '/api/studios/:studioId/members/:memberId',             401,  'ok', 403,  403,  403),
  row('get',    '/api/studios/:studioId/invitations',                   401,  'ok', 403,  403,  403),
  row('post',   '/api/studios/:studioId/invitations',                   401,  'ok', 403,  403,  403),
  row('delete', '/api/studios/:studioId/invitations/:invitationId',     401,  'ok', 403,  403,  403),
  row('get',    '/api/studios/:studioId/dev/mail',                      401,  'ok', 403,  403,  403),
  row('get',    '/api/studios/:studioId/kit',                           401,  'ok', 'ok', 'ok', 'ok'),
  row('get',    '/api/studios/:studioId/kit/bodies',                    401,  'ok', 'ok', 'ok', 'ok'),
  row('post',   '/api/studios/:studioId/kit/bodies',                    401,  'ok', 'ok', 403,  403),
  row('patch',  '/api/studios/:studioId/kit/bodies/:bodyId',            401,  'ok', 'ok', 403,  403),
  row('delete', '/api/studios/:studioId/kit/bodies/:bodyId',            401,  'ok', 'ok', 403,  403),
  row('get',    '/api/studios/:studioId/kit/lenses',                    401,  'ok', 'ok', 'ok', 'ok'),
  row('post',   '/api/studios/:studioId/kit/lenses',                    401,  'ok', 'ok', 403,  403),
  row('patch',  '/api/studios/:studioId/kit/lenses/:lensId',            401,  'ok', 'ok', 403,  403),
  row('delete', '/api/studios/:studioId/kit/lenses/:lensId',            401,  'ok', 'ok', 403,  403),
  row('get',    '/api/studios/:studioId/kit/extension-sets',            401,  'ok', 'ok', 'ok', 'ok'),
  row('post',   '/api/studios/:studioId/kit/extension-sets',            401,  'ok', 'ok', 403,  403),
  row('patch',  '/api/studios/:studioId/kit/extension-sets/:extensionSetId', 401,  'ok', 'ok', 403,  403),
  row('delete', '/api/studios/:studioId/kit/extension-sets/:extensionSetId', 401,  'ok', 'ok', 403,  403),
  row('get',    '/api/studios/:studioId/kit/rails',                     401,  'ok', 'ok', 'ok', 'ok'),
  row('post',   '/api/studios/:studioId/kit/rails',                     401,  'ok', 'ok', 403,  403),
  row('patch',  '/api/studios/:studioId/kit/rails/:railId',             401,  'ok', 'ok', 403,  403),
  row('delete', '/api/studios/:studioId/kit/rails/:railId',             401,  'ok', 'ok', 403,  403),
  row('get',    '/api/studios/:studioId/plans',                         401,  'ok', 'ok', 'ok', 'ok'),
  row('post',   '/api/studios/:studioId/plans',                         401,  'ok', 'ok', 403,  403),
  row('post',   '/api/studios/:studioId/plans/preview',                 401,  'ok', 'ok', 'ok', 'ok'),
  row('get',    '/api/studios/:studioId/plans/:planId',                 401,  'ok', 'ok', 'ok', 'ok'),
  row('patch',  '/api/studios/:studioId/plans/:planId',                 401,  'ok', 'ok', 403,  403),
  row('delete', '/api/studios/:studioId/plans/:planId',                 401,  'ok', 'ok', 403,  403),
  row('post',   '/api/studios/:studioId/plans/:planId/duplicate',       401,  'ok', 'ok', 403,  403),
  row('get',    '/api/studios/:studioId/sessions',                                  401,  'ok', 'ok', 403,  'ok'),
  row('post',   '/api/studios/:studioId/sessions',                                  401,  'ok', 'ok', 403,  403),
  row('get',    '/api/studios/:studioId/sessions/:sessionId',                       401,  'ok', 'ok', 403,  'ok'),
  row('patch',  '/api/studios/:studioId/sessions/:sessionId',                       401,  'ok', 'ok', 403,  403),
  row('delete', '/api/studios/:studioId/sessions/:sessionId',                       401,  'ok', 403,  403,  403),
  row('get',    '/api/studios/:studioId/sessions/:sessionId/sorting',               401,  'ok', 'ok', 403,  'ok'),
  row('get',    '/api/studios/:studioId/sessions/:sessionId/files',                 401,  'ok', 'ok', 403,  'ok'),
  row('get',    '/api/studios/:studioId/sessions/:sessionId/imports',               401,  'ok', 'ok', 403,  'ok'),
  row('post',   '/api/studios/:studioId/sessions/:sessionId/imports',               401,  'ok', 'ok', 403,  403),
  row('post',   '/api/studios/:studioId/sessions/:sessionId/known-hashes',          401,  'ok', 'ok', 403,  403),
  row('post',   '/api/studios/:studioId/sessions/:sessionId/imports/:importId/files', 401, 'ok', 'ok', 403, 403),
  row('post',   '/api/studios/:studioId/sessions/:sessionId/imports/:importId/complete', 401, 'ok', 'ok', 403, 403),
  row('post',   '/api/studios/:studioId/sessions/:sessionId/regroup',               401,  'ok', 'ok', 403,  403),
  row('post',   '/api/studios/:studioId/sessions/:sessionId/undo',                  401,  'ok', 'ok', 403,  403),
  row('get',    '/api/studios/:studioId/sessions/:sessionId/frames/:frameId/preview/:size', 401, 'ok', 'ok', 403, 'ok'),
  row('post',   '/api/studios/:studioId/sessions/:sessionId/stacks/:stackId/split',      401, 'ok', 'ok', 403, 403),
  row('post',   '/api/studios/:studioId/sessions/:sessionId/stacks/:stackId/merge-next', 401, 'ok', 'ok', 403, 403),
  row('patch',  '/api/studios/:studioId/sessions/:sessionId/stacks/:stackId',            401, 'ok', 'ok', 403, 403),
  row('post',   '/api/studios/:studioId/sessions/:sessionId/stacks/:stackId/state',      401, 'ok', 'ok', 403, 403),
  row('post',   '/api/studios/:studioId/sessions/:sessionId/stacks/:stackId/order',      401, 'ok', 'ok', 403, 403),
  row('get',    '/api/studios/:studioId/sessions/:sessionId/stacks/:stackId/events',     401, 'ok', 'ok', 403, 'ok'),
  row('post',   '/api/studios/:studioId/sessions/:sessionId/frames/move',                401, 'ok', 'ok', 403, 403),
  row('post',   '/api/studios/:studioId/sessions/:sessionId/frames/exclusion',           401, 'ok', 'ok', 403, 403),
  // stack page, contact sheets, bundles (a retoucher passes the role check; the stack check answers 404/403 per stack)
  row('get',    '/api/studios/:studioId/stacks/:stackId',                                401, 'ok', 'ok', 'ok', 'ok'),
  row('get',    '/api/studios/:studioId/stacks/:stackId/frames/:frameId/preview/:size',  401, 'ok', 'ok', 'ok', 'ok'),
  row('get',    '/api/studios/:studioId/stacks/:stackId/contact-sheet.jpg',              401, 'ok', 'ok', 'ok', 'ok'),
  row('get',    '/api/studios/:studioId/stacks/:stackId/contact-sheet.pdf',              401, 'ok', 'ok', 'ok', 'ok'),
  row('post',   '/api/studios/:studioId/stacks/:stackId/contact-sheet',                  401, 'ok', 'ok', 403, 403),
  row('post',   '/api/studios/:studioId/stacks/:stackId/bundles',                        401, 'ok', 'ok', 403, 403),
  row('get',    '/api/studios/:studioId/stacks/:stackId/bundles/latest',                 401, 'ok', 'ok', 'ok', 'ok'),
  row('get',    '/api/studios/:studioId/bundles/:bundleId',                              401, 'ok', 'ok', 'ok', 'ok'),
  row('get',    '/api/studios/:studioId/bundles/:bundleId/download',                     401, 'ok', 'ok', 'ok', 403),
  row('post',   '/api/studios/:studioId/sessions/:sessionId/bundles',                    401, 'ok', 'ok', 403, 403),
  row('get',    '/api/studios/:studioId/sessions/:sessionId/bundles/latest',             401, 'ok', 'ok', 403, 'ok'),
  // stack checks (a retoucher passes the role check; the stack check answers 404/403 per stack) and the studio's limits
  row('get',    '/api/studios/:studioId/stacks/:stackId/checks',                         401, 'ok', 'ok', 'ok', 'ok'),
  row('get',    '/api/studios/:studioId/check-thresholds',                               401, 'ok', 'ok', 'ok', 'ok'),
  row('put',    '/api/studios/:studioId/check-thresholds',                               401, 'ok', 'ok', 403, 403),
  // hand-off: panel, steps, share links, the retoucher's list, bundle download, merged result
  row('get',    '/api/studios/:studioId/handoffs/mine',                                  401, 'ok', 'ok', 'ok', 'ok'),
  row('get',    '/api/studios/:studioId/stacks/:stackId/handoff',                        401, 'ok', 'ok', 'ok', 'ok'),
  row('post',   '/api/studios/:studioId/stacks/:stackId/handoff',                        401, 'ok', 'ok', 403, 403),
  row('post',   '/api/studios/:studioId/stacks/:stackId/handoff/take-back',              401, 'ok', 'ok', 403, 403),
  row('post',   '/api/studios/:studioId/stacks/:stackId/handoff/archive',                401, 'ok', 'ok', 403, 403),
  row('post',   '/api/studios/:studioId/stacks/:stackId/handoff/share-links',            401, 'ok', 'ok', 403, 403),
  row('delete', '/api/studios/:studioId/stacks/:stackId/handoff/share-links/:linkId',    401, 'ok', 'ok', 403, 403),
  row('get',    '/api/studios/:studioId/stacks/:stackId/handoff/bundle',                 401, 'ok', 'ok', 'ok', 403),
  row('post',   '/api/studios/:studioId/stacks/:stackId/handoff/bundle',                 401, 'ok', 'ok', 'ok', 403),
  row('post',   '/api/studios/:studioId/stacks/:stackId/handoff/merged',                 401, 'ok', 'ok', 'ok', 403),
  row('get',    '/api/studios/:studioId/stacks/:stackId/handoff/merged/file',            401, 'ok', 'ok', 'ok', 'ok'),
  row('get',    '/api/studios/:studioId/stacks/:stackId/handoff/merged/preview/:size',   401, 'ok', 'ok', 'ok', 'ok'),
  // share links for outside retouchers: public, the token is the credential
  row('get',    '/api/share/:token',                                                     'ok', 'ok', 'ok', 'ok', 'ok'),
  row('get',    '/api/share/:token/contact-sheet.jpg',                                   'ok', 'ok', 'ok', 'ok', 'ok'),
  row('get',    '/api/share/:token/bundle',                                              'ok', 'ok', 'ok', 'ok', 'ok'),
  row('post',   '/api/share/:token/bundle',                                              'ok', 'ok', 'ok', 'ok', 'ok'),
  row('post',   '/api/share/:token/merged',                                              'ok', 'ok', 'ok', 'ok', 'ok'),
];
