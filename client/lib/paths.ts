/** Every client URL in one place; components never build links by hand. */
export const paths = {
  home: () => "/",
  forbidden: (role?: string) => (role ? `/forbidden?role=${encodeURIComponent(role)}` : "/forbidden"),
  signIn: (opts: { returnTo?: string; error?: string } = {}) => `/sign-in${qs({ return_to: opts.returnTo, error: opts.error })}`,
  adminUsers: () => "/admin/people",
  apiTokens: () => "/account/tokens",
  translate: () => "/translate",
  forecast: () => "/forecast",
  consistency: () => "/consistency",
  sheets: () => "/sheets",
  sheet: (id: number) => `/sheets/${id}`,
  sharedSheet: (token: string) => `/shared/${encodeURIComponent(token)}`,
  catalogue: () => "/catalogue",
  theory: (slug: string) => `/catalogue/${encodeURIComponent(slug)}`,
  submit: (opts: { target?: string } = {}) => (opts.target ? `/submit?target=${encodeURIComponent(opts.target)}` : "/submit"),
  editSubmission: (id: number) => `/submit/${id}`,
  mySubmissions: () => "/my-submissions",
  reviewQueue: () => "/review",
  review: (id: number) => `/review/${id}`,
  outbox: () => "/dev/outbox",
} as const;

/** Query string from defined, non-empty values only (so URLs never carry "b=undefined"). */
function qs(params: Record<string, string | number | boolean | undefined>): string {
  const sp = new URLSearchParams();
  for (const [k, v] of Object.entries(params)) if (v !== undefined && v !== "") sp.set(k, String(v));
  const s = sp.toString();
  return s ? `?${s}` : "";
}

export const apiPaths = {
  health: () => "/api/health",
  /** The machine-readable API document, generated from the route table. */
  openapi: () => "/api/v1/openapi.json",
  consistency: () => "/api/v1/consistency",
  consistencyCoupling: () => "/api/v1/consistency/coupling",
  consistencyJob: () => "/api/v1/jobs/consistency",
  job: (id: string) => `/api/v1/jobs/${encodeURIComponent(id)}`,
  me: () => "/api/v1/me",
  session: () => "/api/v1/session",
  csrf: () => "/api/v1/csrf",
  tokens: () => "/api/v1/tokens",
  token: (id: number) => `/api/v1/tokens/${id}`,
  adminUsers: () => "/api/v1/admin/users",
  adminUserRoles: (login: string) => `/api/v1/admin/users/${encodeURIComponent(login)}/roles`,
  adminAudit: (opts: { limit?: number; subject?: string } = {}) => `/api/v1/admin/audit${qs(opts)}`,
  /** Full-page navigations (not fetched): the server redirects to GitHub and back. */
  githubSignIn: (opts: { returnTo?: string; loginHint?: string } = {}) => `/auth/github${qs({ return_to: opts.returnTo, login_hint: opts.loginHint })}`,
  signOut: () => "/auth/signout",
  convert: () => "/api/v1/convert",
  convertTable: () => "/api/v1/convert/table",
  convertSamples: () => "/api/v1/convert/samples",
  convertEvents: () => "/api/v1/convert/events",
  jobsPreview: () => "/api/v1/jobs/preview",
  jobsSamples: () => "/api/v1/jobs/samples",
  jobSamplesCsv: (id: string) => `/api/v1/jobs/${encodeURIComponent(id)}/samples.csv`,
  forecasts: () => "/api/v1/forecasts",
  forecastJob: () => "/api/v1/jobs/forecast",
  forecastCurves: () => "/api/v1/forecasts/curves",
  forecastCurve: (id: number) => `/api/v1/forecasts/curves/${id}`,
  sheets: () => "/api/v1/sheets",
  sheet: (id: number) => `/api/v1/sheets/${id}`,
  sheetShare: (id: number) => `/api/v1/sheets/${id}/share`,
  sheetRecords: (id: number) => `/api/v1/sheets/${id}/records`,
  sheetRecord: (id: number, record: number, version: number) => `/api/v1/sheets/${id}/records/${record}?version=${version}`,
  sheetRetranslationPreview: (id: number) => `/api/v1/sheets/${id}/retranslation/preview`,
  sheetRetranslation: (id: number) => `/api/v1/sheets/${id}/retranslation`,
  sheetExport: (id: number, format: "csv" | "json" | "latex" | "bibtex") => `/api/v1/sheets/${id}/export?format=${format}`,
  sharedSheet: (token: string) => `/api/v1/shared/${encodeURIComponent(token)}`,
  sharedSheetExport: (token: string, format: "csv" | "json" | "latex" | "bibtex") => `/api/v1/shared/${encodeURIComponent(token)}/export?format=${format}`,
  theories: (filters: Record<string, string | number | undefined> = {}) => `/api/v1/theories${qs(filters)}`,
  theory: (slug: string) => `/api/v1/theories/${encodeURIComponent(slug)}`,
  theoryRevisions: (slug: string) => `/api/v1/theories/${encodeURIComponent(slug)}/revisions`,
  theoryRetirement: (slug: string, action: "retire" | "restore") => `/api/v1/theories/${encodeURIComponent(slug)}/${action}`,
  theoryRevision: (slug: string, n: number) => `/api/v1/theories/${encodeURIComponent(slug)}/revisions/${n}`,
  submissions: (filters: { mine?: boolean; status?: string } = {}) => `/api/v1/submissions${qs({ mine: filters.mine ? 1 : undefined, status: filters.status })}`,
  submission: (id: number) => `/api/v1/submissions/${id}`,
  submissionAction: (id: number, action: "submit" | "start-review" | "decision" | "withdraw" | "comments") => `/api/v1/submissions/${id}/${action}`,
  parseBibtex: () => "/api/v1/references/parse-bibtex",
  expressionCheck: () => "/api/v1/expressions/check",
  expressionDerive: () => "/api/v1/expressions/derive",
  outbox: () => "/api/v1/dev/outbox",
} as const;
