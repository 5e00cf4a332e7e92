// The client part of the API document: released reports read with a client's personal token
// (`Authorization: Bearer ect_<prefix>.<secret>`, made on the portal's API tokens page).

const tokenOnly = [{ clientToken: [] }];
const plain = (description: string) => ({ description, content: { "application/json": { schema: { type: "object", properties: { error: { type: "string" } } } } } });
const refusals = {
  "401": plain("No token, not a token, unknown, revoked or expired: `error` says which in a sentence"),
  "404": plain("No such report for your organisation (another client's report answers the same)"),
};
const numberParam = { name: "number", in: "path", required: true, description: "the report number, e.g. R-0007", schema: { type: "string", maxLength: 80 } };
const revisionParam = { name: "revision", in: "query", required: false, description: "a revision; without it the valid revision, else the newest", schema: { type: "integer", minimum: 1 } };
const curl = (path: string) => `curl -H "Authorization: Bearer $EMFOLIO_TOKEN" "https://lab.example${path}"`;

export const reportPaths = {
  "/api/v1/reports": {
    get: {
      summary: "Released reports of one of your units, every revision with its status", security: tokenOnly,
      parameters: [{ name: "serial", in: "query", required: true, description: "the unit's serial, exactly", schema: { type: "string", maxLength: 80 } }],
      responses: {
        "200": { description: "`{ serial, reports: [{ number, revision, status (valid | superseded | withdrawn), serial, model, disposition, overall, releasedAt, withdrawnAt, sha256, sizeBytes, lab, pdf, csv }] }`" },
        "400": plain("`serial` missing or too long"), ...refusals,
      },
      "x-codeSamples": [{ lang: "curl", source: curl("/api/v1/reports?serial=KG45-260301") }],
    },
  },
  "/api/v1/reports/{number}": {
    get: { summary: "Every revision of one report with its status", security: tokenOnly, parameters: [numberParam], responses: { "200": { description: "`{ number, revisions: [...] }`" }, ...refusals } },
  },
  "/api/v1/reports/{number}/pdf": {
    get: {
      summary: "The stored PDF of a revision (checked against its sha256); X-Report-Status says valid, superseded or withdrawn, and a revision that is not valid says so in its file name",
      security: tokenOnly, parameters: [numberParam, revisionParam],
      responses: { "200": { description: "application/pdf" }, ...refusals },
      "x-codeSamples": [{ lang: "curl", source: `${curl("/api/v1/reports/R-0007/pdf")} -o R-0007.pdf` }],
    },
  },
  "/api/v1/reports/{number}/csv": {
    get: {
      summary: "The results of a revision as CSV: one row per check of each step of record, with number, revision, status and disposition",
      security: tokenOnly, parameters: [numberParam, revisionParam], responses: { "200": { description: "text/csv" }, ...refusals },
    },
  },
};

export const clientTokenScheme = {
  type: "http", scheme: "bearer",
  description: "A client's personal API token (ect_<prefix>.<secret>), made by the client's administrator on the portal's API tokens page; revocable, with an expiry",
};
