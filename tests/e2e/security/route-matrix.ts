// The authorisation matrix: every route handler and server action × every kind of caller → the
// status the running app must answer. security-matrix.spec.ts walks all of it over HTTP with real
// sign-ins, and fails when a route exists without a row here (or a row names no route).
//
// How a cell is probed: GETs are sent as they are (reads); every other method carries a body the
// route's schema refuses (a JSON array, or a query string over its limits), so a caller who passes
// the session, membership and role checks gets 400 and nothing is written. Child ids that a
// DELETE would act on point at nothing, so an allowed caller gets 404 from the child lookup.
import type { EngagementRole } from "../../../lib/auth/roles";

// "client" is the client's own contact (grade client, membership role client on the engagement, issue 9).
export const ACTORS = [
  "signedOut",
  "viewer",
  "staff",
  "senior",
  "manager",
  "partner",
  "admin",
  "otherEngagement",
  "otherFirm",
  "client",
] as const;
export type Actor = (typeof ACTORS)[number];
export type Expected = Record<Actor, number>;

/** What a cell sends: a path with [params] filled from the fixtures, an optional query and body. */
export interface Probe {
  path?: string;
  query?: string;
  body?: string;
  contentType?: string;
}
/** A body the schema accepts, for the cross-engagement and cross-firm checks (which must 404 before any work). */
export type ValidBody = (ids: Record<string, number>) => unknown;

export interface MatrixRow {
  route: string;
  expect: Expected;
  probe?: Probe;
  validBody?: ValidBody;
}

const REFUSED_BODY = "[]";
const LONG_NAME = "x".repeat(300); // over every fileName limit (255)

/** An auditor's engagement route: 401 signed out, 404 for everyone not on the engagement and for the client contact (outside the auditor ranks), 403 below `least`. */
function onEngagement(least: EngagementRole, allowed: number): Expected {
  const rank = ["viewer", "staff", "senior", "manager", "partner"];
  const member = (role: EngagementRole) => (rank.indexOf(role) >= rank.indexOf(least) ? allowed : 403);
  return {
    signedOut: 401,
    viewer: member("viewer"),
    staff: member("staff"),
    senior: member("senior"),
    manager: member("manager"),
    partner: member("partner"),
    admin: 404,
    otherEngagement: 404,
    otherFirm: 404,
    client: 404,
  };
}
/** Any signed-in user. */
const signedIn = (allowed: number): Expected => ({
  signedOut: 401,
  viewer: allowed,
  staff: allowed,
  senior: allowed,
  manager: allowed,
  partner: allowed,
  admin: allowed,
  otherEngagement: allowed,
  otherFirm: allowed,
  client: allowed,
});
/** Members of the audit firm (withAuditor): the client contact is refused. */
const auditors = (allowed: number): Expected => ({ ...signedIn(allowed), client: 403 });
/** Firm administrators (of their own firm: the other firm's caller is its admin). */
const firmAdmin = (allowed: number): Expected => ({
  signedOut: 401,
  viewer: 403,
  staff: 403,
  senior: 403,
  manager: 403,
  partner: 403,
  admin: allowed,
  otherEngagement: 403,
  otherFirm: allowed,
  client: 403,
});
const everyone = (status: number): Expected => ({ ...signedIn(status), signedOut: status });

const E = "/api/engagements/[engagementId]";
const REQUEST_NEED = "invoice";
const S = `${E}/samples/[sampleId]`;
const MS = `${E}/misstatements`;
const mapping = {
  itemRefColumn: "Invoice",
  bookValueColumn: "Amount",
  descriptionColumn: "Customer",
  dateColumn: "Due",
};
const musParams = {
  method: "mus",
  confidence: 0.95,
  tolerableMisstatement: "60000",
  expectedMisstatement: "8000",
  factorMode: "exact",
};

export const ROUTE_MATRIX: MatrixRow[] = [
  { route: "GET /api/me", expect: signedIn(200) },
  { route: "GET /api/me/inbox", expect: auditors(200) }, // issue 19: the reviewer's inbox across engagements
  { route: "GET /api/engagements", expect: signedIn(200) },
  // Creating an engagement needs the manager or partner grade (the other firm's caller is a partner).
  { route: "POST /api/engagements", expect: { ...signedIn(403), manager: 400, partner: 400, otherFirm: 400 } },
  { route: "GET /api/users", expect: auditors(200) },
  { route: "POST /api/users", expect: firmAdmin(400) },
  { route: "GET /api/firm/methodology", expect: firmAdmin(200) },
  { route: "PUT /api/firm/methodology", expect: firmAdmin(400) },
  { route: "PATCH /api/users/[userId]", expect: firmAdmin(400) },
  { route: "POST /api/users/[userId]/password", expect: firmAdmin(400) },
  { route: "GET /api/firm/mail-outbox", expect: firmAdmin(200) },
  { route: "GET /api/health", expect: everyone(200) },

  // The client's side (issue 9): a client contact's own request lists; nothing here exists for the probe's list id.
  // Everyone signed in may ask for "my request lists" (an auditor has none); a list id not addressed to the caller is 404 to all.
  { route: "GET /api/requests", expect: signedIn(200) },
  { route: "GET /api/requests/[listId]", expect: signedIn(404), probe: { path: "/api/requests/2147483000" } },
  {
    route: "GET /api/requests/[listId]/files/[fileId]",
    expect: signedIn(404),
    probe: { path: "/api/requests/2147483000/files/2147483000" },
  },
  {
    route: "PATCH /api/requests/[listId]/items/[requestItemId]",
    expect: signedIn(404),
    probe: { path: "/api/requests/2147483000/items/2147483000" },
  },
  {
    route: "POST /api/requests/[listId]/items/[requestItemId]/files",
    expect: signedIn(404),
    probe: {
      path: "/api/requests/2147483000/items/2147483000/files",
      query: "fileName=probe.txt",
      body: "probe",
      contentType: "text/plain",
    },
  },
  // Public by design (the invitation token is the credential): a refused body is 400 for everyone.
  {
    route: "POST /api/invitations/[token]",
    expect: everyone(400),
    probe: { path: "/api/invitations/not-a-real-invitation-token" },
  },

  { route: `GET ${E}`, expect: onEngagement("viewer", 200) },
  { route: `PATCH ${E}`, expect: onEngagement("manager", 400) },
  { route: `GET ${E}/members`, expect: onEngagement("viewer", 200) },
  { route: `POST ${E}/members`, expect: onEngagement("manager", 400) },
  { route: `PATCH ${E}/members/[userId]`, expect: onEngagement("manager", 400) },
  {
    route: `DELETE ${E}/members/[userId]`,
    expect: onEngagement("manager", 404),
    probe: { path: `${E}/members/2147483000` },
  },

  { route: `GET ${E}/populations`, expect: onEngagement("viewer", 200) },
  { route: `GET ${E}/populations/[populationId]`, expect: onEngagement("viewer", 200) },
  // issue 19: the fixture's population is used by its sample, so an allowed caller gets 409 and nothing is deleted
  { route: `DELETE ${E}/populations/[populationId]`, expect: onEngagement("senior", 409) },
  {
    route: `POST ${E}/populations/[populationId]/archive`,
    expect: onEngagement("senior", 400),
    validBody: () => ({ archived: false }),
  },
  { route: `GET ${E}/populations/[populationId]/items`, expect: onEngagement("viewer", 200) },
  { route: `GET ${E}/populations/[populationId]/original`, expect: onEngagement("viewer", 200) },
  { route: `GET ${E}/populations/[populationId]/profile`, expect: onEngagement("viewer", 200) },
  {
    route: `POST ${E}/populations/[populationId]/reconciliation`,
    expect: onEngagement("senior", 400),
    validBody: () => ({ controlTotal: "1.00", controlCount: 1 }),
  },
  {
    route: `POST ${E}/populations/uploads`,
    expect: onEngagement("senior", 400),
    probe: { query: `fileName=${LONG_NAME}`, body: "a,b\n1,2\n", contentType: "text/csv" },
  },
  { route: `GET ${E}/populations/uploads/[uploadId]`, expect: onEngagement("senior", 200) },
  {
    route: `POST ${E}/populations/uploads/[uploadId]/load`,
    expect: onEngagement("senior", 400),
    validBody: () => ({ name: "Cross-engagement probe", mapping }),
  },
  { route: `GET ${E}/populations/uploads/[uploadId]/problems`, expect: onEngagement("senior", 200) },

  { route: `GET ${E}/samples`, expect: onEngagement("viewer", 200) },
  { route: `POST ${E}/samples`, expect: onEngagement("senior", 400) },
  { route: `POST ${E}/samples/plan-preview`, expect: onEngagement("staff", 400) },
  { route: `GET ${S}`, expect: onEngagement("viewer", 200) },
  {
    route: `PATCH ${S}`,
    expect: onEngagement("senior", 400),
    validBody: (ids) => ({
      populationId: ids.populationId,
      name: "Probe",
      objective: "Cross-engagement probe",
      assertion: "Existence",
      direction: "overstatement",
      params: musParams,
    }),
  },
  { route: `GET ${S}/audit`, expect: onEngagement("staff", 200) },
  // Client request lists, the team's side (issue 9). No list exists in the fixtures: list ids point at nothing.
  { route: `GET ${E}/client-contacts`, expect: onEngagement("viewer", 200) },
  { route: `POST ${E}/client-contacts`, expect: onEngagement("senior", 400) },
  { route: `GET ${S}/requests`, expect: onEngagement("viewer", 200) },
  {
    route: `POST ${S}/requests`,
    expect: onEngagement("senior", 400),
    validBody: (ids) => ({
      title: "Cross-engagement probe",
      contactUserId: ids.clientUserId,
      dueDate: "2026-12-31",
      items: "all",
      needs: [REQUEST_NEED],
    }),
  },
  {
    route: `GET ${S}/requests/[listId]`,
    expect: onEngagement("viewer", 404),
    probe: { path: `${S}/requests/2147483000` },
  },
  {
    route: `GET ${S}/requests/[listId]/files/[fileId]`,
    expect: onEngagement("viewer", 404),
    probe: { path: `${S}/requests/2147483000/files/2147483000` },
  },
  {
    route: `POST ${S}/requests/[listId]/files/[fileId]/accept`,
    expect: onEngagement("staff", 400),
    probe: { path: `${S}/requests/2147483000/files/2147483000/accept` },
  },
  {
    route: `POST ${S}/requests/[listId]/files/[fileId]/return`,
    expect: onEngagement("staff", 400),
    probe: { path: `${S}/requests/2147483000/files/2147483000/return` },
  },
  // Estimator advisor (issue 7). The fixtures hold no advisor run: run ids point at nothing, so allowed callers get the run's 404.
  { route: `GET ${S}/advisor`, expect: onEngagement("viewer", 200) },
  {
    route: `POST ${S}/advisor`,
    expect: onEngagement("senior", 400),
    validBody: () => ({
      scenario: { kind: "pattern", misstatedPercent: 5, tainting: "spread", overstatementPercent: 100 },
      sampleSizes: [30],
      trials: 200,
      seed: 1,
    }),
  },
  {
    route: `GET ${S}/advisor/[runId]`,
    expect: onEngagement("viewer", 404),
    probe: { path: `${S}/advisor/2147483000` },
  },
  {
    route: `DELETE ${S}/advisor/[runId]`,
    expect: onEngagement("senior", 404),
    probe: { path: `${S}/advisor/2147483000` },
  },
  {
    route: `POST ${S}/advisor/[runId]/adopt`,
    expect: onEngagement("senior", 400),
    probe: { path: `${S}/advisor/2147483000/adopt` },
  },
  { route: `POST ${S}/draw`, expect: onEngagement("senior", 400), validBody: () => ({}) },
  // The auditor's conclusion and response (issue 13): read by any member, written by the preparer (staff/senior; checked inside).
  { route: `GET ${S}/conclusion`, expect: onEngagement("viewer", 200) },
  {
    route: `PUT ${S}/conclusion`,
    expect: onEngagement("staff", 400),
    validBody: () => ({ conclusion: "Cross-engagement probe, must not apply", responses: [] }),
  },
  { route: `GET ${S}/evaluation`, expect: onEngagement("viewer", 200) },
  {
    route: `POST ${S}/extend`,
    expect: onEngagement("senior", 400),
    validBody: () => ({ additional: 1, reason: "Cross-engagement probe" }),
  },
  { route: `GET ${S}/items`, expect: onEngagement("viewer", 200) },
  {
    route: `PATCH ${S}/items/[itemId]`,
    expect: onEngagement("staff", 400),
    validBody: (ids) => ({ version: ids.itemVersion, status: "done", auditedValue: "1.00" }),
  },
  {
    route: `POST ${S}/results`,
    expect: onEngagement("staff", 400),
    validBody: (ids) => ({
      rows: [{ itemId: ids.itemId, version: ids.itemVersion, status: "done", auditedValue: "1.00" }],
    }),
  }, // issue 19: paste, agreed to book, undo
  { route: `GET ${S}/items/[itemId]/evidence`, expect: onEngagement("viewer", 200) },
  {
    route: `POST ${S}/items/[itemId]/evidence`,
    expect: onEngagement("viewer", 400),
    probe: { query: `fileName=${LONG_NAME}`, body: "probe", contentType: "text/plain" },
  },
  { route: `GET ${S}/items/[itemId]/evidence/[evidenceId]`, expect: onEngagement("viewer", 200) },
  // Only staff and above remove evidence (a client contact only their own uploads, on the client side).
  {
    route: `DELETE ${S}/items/[itemId]/evidence/[evidenceId]`,
    expect: onEngagement("staff", 404),
    probe: { path: `${S}/items/[itemId]/evidence/2147483000` },
  },
  {
    route: `POST ${S}/items/[itemId]/replace`,
    expect: onEngagement("senior", 400),
    validBody: () => ({ reason: "Cross-engagement probe" }),
  },
  {
    route: `POST ${S}/items/[itemId]/anomaly`,
    expect: onEngagement("staff", 400),
    validBody: () => ({ justification: "Cross-engagement probe of an anomaly mark" }),
  },
  {
    route: `DELETE ${S}/items/[itemId]/anomaly`,
    expect: onEngagement("staff", 404),
    probe: { path: `${S}/items/2147483000/anomaly` },
  },
  {
    route: `POST ${S}/items/[itemId]/anomaly/acceptance`,
    expect: onEngagement("manager", 400),
    validBody: () => ({ confirm: true }),
  },
  { route: `POST ${S}/picks`, expect: onEngagement("senior", 400), validBody: () => ({ rowNumber: 2 }) },
  {
    route: `DELETE ${S}/picks/[itemId]`,
    expect: onEngagement("senior", 404),
    probe: { path: `${S}/picks/2147483000` },
  },
  { route: `POST ${S}/lock`, expect: onEngagement("manager", 400), validBody: () => ({}) },
  { route: `GET ${S}/notes`, expect: onEngagement("viewer", 200) },
  {
    route: `POST ${S}/notes`,
    expect: onEngagement("manager", 400),
    validBody: () => ({ text: "Cross-engagement probe" }),
  },
  {
    route: `POST ${S}/notes/[noteId]/answer`,
    expect: onEngagement("staff", 400),
    validBody: () => ({ answer: "Cross-engagement probe" }),
  },
  { route: `POST ${S}/notes/[noteId]/clear`, expect: onEngagement("manager", 400), validBody: () => ({}) },
  { route: `GET ${S}/recipe`, expect: onEngagement("viewer", 200) },
  { route: `POST ${S}/reperform`, expect: onEngagement("staff", 400), validBody: () => ({}) },
  { route: `POST ${S}/sign-off`, expect: onEngagement("staff", 400), validBody: () => ({ as: "preparer" }) },
  {
    route: `POST ${S}/unlock`,
    expect: onEngagement("partner", 400),
    validBody: () => ({ reason: "Cross-engagement probe, must not apply" }),
  },
  { route: `GET ${S}/workbook`, expect: onEngagement("viewer", 200) },
  {
    route: `POST ${S}/workbook`,
    expect: onEngagement("staff", 400),
    probe: { query: `fileName=${LONG_NAME}`, body: "probe", contentType: "application/octet-stream" },
  },
  { route: `GET ${S}/workpaper`, expect: onEngagement("viewer", 200) },

  // The summary of misstatements (issue 16). The fixtures hold no entry: entry ids point at nothing, so allowed callers get the entry's 404.
  { route: `GET ${MS}`, expect: onEngagement("viewer", 200) },
  {
    route: `POST ${MS}/entries`,
    expect: onEngagement("staff", 400),
    validBody: () => ({
      kind: "judgemental",
      account: "Probe",
      assertion: "Valuation",
      description: "Cross-engagement probe",
      amount: "1.00",
      incomeEffect: "1.00",
      balanceEffect: "1.00",
    }),
  },
  {
    route: `PATCH ${MS}/entries/[entryId]`,
    expect: onEngagement("staff", 400),
    probe: { path: `${MS}/entries/2147483000` },
  },
  {
    route: `DELETE ${MS}/entries/[entryId]`,
    expect: onEngagement("staff", 404),
    probe: { path: `${MS}/entries/2147483000` },
  },
  {
    route: `GET ${MS}/entries/[entryId]/evidence`,
    expect: onEngagement("viewer", 404),
    probe: { path: `${MS}/entries/2147483000/evidence` },
  },
  {
    route: `POST ${MS}/entries/[entryId]/evidence`,
    expect: onEngagement("viewer", 400),
    probe: {
      path: `${MS}/entries/2147483000/evidence`,
      query: `fileName=${LONG_NAME}`,
      body: "probe",
      contentType: "text/plain",
    },
  },
  {
    route: `GET ${MS}/entries/[entryId]/evidence/[evidenceId]`,
    expect: onEngagement("viewer", 404),
    probe: { path: `${MS}/entries/2147483000/evidence/2147483000` },
  },
  // Only staff and above remove an entry's evidence (viewers 403 before the lookup).
  {
    route: `DELETE ${MS}/entries/[entryId]/evidence/[evidenceId]`,
    expect: onEngagement("staff", 404),
    probe: { path: `${MS}/entries/2147483000/evidence/2147483000` },
  },
  {
    route: `PUT ${MS}/settings`,
    expect: onEngagement("manager", 400),
    validBody: () => ({ clearlyTrivial: "1000", approachingShare: 0.75 }),
  },
  {
    route: `POST ${MS}/corrections`,
    expect: onEngagement("staff", 400),
    validBody: (ids) => ({ sampleId: ids.sampleId, part: "factual", corrected: null }),
  },
  { route: `POST ${MS}/sign-off`, expect: onEngagement("staff", 400), validBody: () => ({ as: "preparer" }) },
  { route: `GET ${MS}/notes`, expect: onEngagement("viewer", 200) },
  {
    route: `POST ${MS}/notes`,
    expect: onEngagement("manager", 400),
    validBody: () => ({ text: "Cross-engagement probe" }),
  },
  {
    route: `POST ${MS}/notes/[noteId]/answer`,
    expect: onEngagement("staff", 400),
    probe: { path: `${MS}/notes/2147483000/answer` },
  },
  {
    route: `POST ${MS}/notes/[noteId]/clear`,
    expect: onEngagement("manager", 400),
    probe: { path: `${MS}/notes/2147483000/clear` },
  },
  { route: `POST ${MS}/lock`, expect: onEngagement("manager", 400), validBody: () => ({}) },
  {
    route: `POST ${MS}/unlock`,
    expect: onEngagement("partner", 400),
    validBody: () => ({ reason: "Cross-engagement probe, must not apply" }),
  },
  { route: `GET ${MS}/workbook`, expect: onEngagement("viewer", 200) },
  { route: `GET ${MS}/workpaper`, expect: onEngagement("viewer", 200) },

  // next-auth's own endpoints are public by design; the probe reads the provider list / posts a sign-out without its CSRF token.
  { route: "GET /api/auth/[...nextauth]", expect: everyone(200), probe: { path: "/api/auth/providers" } },
  {
    route: "POST /api/auth/[...nextauth]",
    expect: everyone(302),
    probe: { path: "/api/auth/signout", body: "", contentType: "application/x-www-form-urlencoded" },
  },
];

/** Server actions ("use server"): none today. Add one row per action, keyed "action <file>#<export>". */
export const ACTION_MATRIX: { action: string; expect: Expected }[] = [];

export const REFUSED = REFUSED_BODY;
