/**
 * Cairn's API types, generated from its OpenAPI document (openapi.json beside this file)
 * by openapi-typescript. Do not edit: change the API's DTO classes, then run
 * `npm run api:contract`.
 */

export interface paths {
  '/api/about': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    /** What this deployment is (public, for the landing page) */
    get: operations['AboutController_about'];
    put?: never;
    post?: never;
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/api/users': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    /** The region's people, filtered by search text, role, status or practice */
    get: operations['UsersController_list'];
    put?: never;
    /** Adds a person who may then sign in */
    post: operations['UsersController_create'];
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/api/users/options': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    /** What the users screen offers: the practices that can be assigned */
    get: operations['UsersController_options'];
    put?: never;
    post?: never;
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/api/users/{userId}': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    get: operations['UsersController_get'];
    put?: never;
    post?: never;
    delete?: never;
    options?: never;
    head?: never;
    /** Renames a person or changes their role (a practice lead's practices go with the old role) */
    patch: operations['UsersController_update'];
    trace?: never;
  };
  '/api/users/{userId}/practices/{practiceId}': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    get?: never;
    /** Makes a practice lead a lead of one more practice */
    put: operations['UsersController_assign'];
    post?: never;
    /** Removes a practice from a practice lead */
    delete: operations['UsersController_remove'];
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/api/users/{userId}/deactivate': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    get?: never;
    put?: never;
    /** Deactivates a person: their sessions end and they cannot sign in */
    post: operations['UsersController_deactivate'];
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/api/users/{userId}/reactivate': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    get?: never;
    put?: never;
    /** Lets a deactivated person sign in again */
    post: operations['UsersController_reactivate'];
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/api/audit-events': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    /** The region's audit trail (and events not tied to any region, such as refused sign-ins), newest first */
    get: operations['AuditTrailController_list'];
    put?: never;
    post?: never;
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/api/audit-events/actions': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    /** The actions recorded so far, with counts (for the filter) */
    get: operations['AuditTrailController_actions'];
    put?: never;
    post?: never;
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/api/session': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    /** The current session: the signed-in person (or null) and the CSRF token */
    get: operations['SessionController_session'];
    put?: never;
    post?: never;
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/api/me': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    /** The signed-in person: role, region and practices */
    get: operations['SessionController_getMe'];
    put?: never;
    post?: never;
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/api/auth/saml/metadata': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    /** Cairn's SAML service provider metadata (for the identity provider) */
    get: operations['SamlController_metadata'];
    put?: never;
    post?: never;
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/api/auth/saml/login': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    /** Starts sign-in: redirects to the identity provider with a SAML AuthnRequest (returnTo: a path in Cairn to come back to) */
    get: operations['SamlController_login'];
    put?: never;
    post?: never;
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/api/auth/saml/acs': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    get?: never;
    put?: never;
    /** Assertion consumer service (SAML HTTP-POST binding): completes sign-in */
    post: operations['SamlController_acs'];
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/api/auth/saml/slo': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    /** Single logout service (SAML HTTP-Redirect binding) */
    get: operations['SamlController_slo'];
    put?: never;
    post?: never;
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/api/auth/sign-out': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    get?: never;
    put?: never;
    /** Signs out: ends the session (and at the identity provider, where it offers single logout) */
    post: operations['SamlController_signOut'];
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/api/health': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    /** Process and database status (200 when healthy, 503 problem details when not) */
    get: operations['HealthController_check'];
    put?: never;
    post?: never;
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/api/measure-sets': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    /** The measure-set versions you read: published ones, and your region’s drafts (regional lead, auditor), each with where it is used */
    get: operations['MeasureSetsController_list'];
    put?: never;
    post?: never;
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/api/measure-sets/{measureSetId}': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    /** One measure-set version: every care process and treatment target, its definition in words, population, denominator, direction and guideline, and the definition as stored */
    get: operations['MeasureSetsController_get'];
    /** Save a draft’s whole definition (regional lead); refused with every problem and its field when the measure set is not valid */
    put: operations['MeasureSetsController_save'];
    post?: never;
    /** Discard a draft (regional lead); a published version is kept */
    delete: operations['MeasureSetsController_discard'];
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/api/measure-sets/{measureSetId}/changes': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    /** The differences from the version it was started from, in words */
    get: operations['MeasureSetsController_changes'];
    put?: never;
    post?: never;
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/api/measure-sets/{measureSetId}/drafts': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    get?: never;
    put?: never;
    /** Start a draft from a published version (regional lead) */
    post: operations['MeasureSetsController_clone'];
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/api/measure-sets/{measureSetId}/publish': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    get?: never;
    put?: never;
    /** Publish a draft as a new version, fixed for good (regional lead) */
    post: operations['MeasureSetsController_publish'];
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/api/quarters': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    /** The audit quarters of your region, latest first */
    get: operations['QuartersController_list'];
    put?: never;
    /** Open an audit quarter for submissions (regional lead) */
    post: operations['QuartersController_open'];
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/api/quarters/{quarterId}': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    /** One audit quarter */
    get: operations['QuartersController_get'];
    put?: never;
    post?: never;
    delete?: never;
    options?: never;
    head?: never;
    /** Move the deadline of a quarter, or change its measure-set version while it is open and no report has been published from it (regional lead) */
    patch: operations['QuartersController_update'];
    trace?: never;
  };
  '/api/quarters/{quarterId}/close': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    get?: never;
    put?: never;
    /** Close a quarter to practice uploads (regional lead) */
    post: operations['QuartersController_close'];
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/api/quarters/{quarterId}/reopen': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    get?: never;
    put?: never;
    /** Reopen a closed quarter, optionally with a new deadline (regional lead) */
    post: operations['QuartersController_reopen'];
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/api/extracts/template.xlsx': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    /** The extract template as XLSX: data sheet with drop-downs, data dictionary, instructions */
    get: operations['ExtractsController_templateXlsx'];
    put?: never;
    post?: never;
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/api/extracts/template.csv': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    /** The extract template as CSV (headings only, UTF-8) */
    get: operations['ExtractsController_templateCsv'];
    put?: never;
    post?: never;
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/api/extracts/format': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    /** Cairn's extract format: every column, its allowed values and units, and every issue code */
    get: operations['ExtractsController_format'];
    put?: never;
    post?: never;
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/api/extracts/upload-options': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    /** Where you may send extracts: the practices, and for each the audit quarters it may take one for */
    get: operations['ExtractsController_uploadOptions'];
    put?: never;
    post?: never;
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/api/practices/{practiceId}/quarters/{quarterId}/extracts': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    get?: never;
    put?: never;
    /**
     * Upload an extract (.xlsx or .csv, in a part named "file") for a practice and audit quarter
     * @description Answers 202 with the new submission, in status processing; poll it for progress and the report.
     */
    post: operations['SubmissionsController_upload'];
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/api/practices/{practiceId}/submissions': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    /** A practice's submissions by audit quarter, with status, counts, who and when */
    get: operations['SubmissionsController_history'];
    put?: never;
    post?: never;
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/api/practices/{practiceId}/submissions/{submissionId}': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    /** One submission: status, progress, summary of its validation report */
    get: operations['SubmissionsController_get'];
    put?: never;
    post?: never;
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/api/practices/{practiceId}/submissions/{submissionId}/issues': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    /** The issues of a validation report, filtered, sorted and paged */
    get: operations['SubmissionsController_issues'];
    put?: never;
    post?: never;
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/api/practices/{practiceId}/submissions/{submissionId}/report.json': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    /** The whole validation report as JSON (summary and every issue) */
    get: operations['SubmissionsController_reportJson'];
    put?: never;
    post?: never;
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/api/practices/{practiceId}/submissions/{submissionId}/rejected-rows.xlsx': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    /** The refused rows as given, with a column of Cairn’s issues, as XLSX */
    get: operations['SubmissionsController_rejectedRows'];
    put?: never;
    post?: never;
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/api/practices/{practiceId}/submissions/{submissionId}/confirm': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    get?: never;
    put?: never;
    /** Confirm: make this submission current for its practice and quarter (the previous one is superseded) */
    post: operations['SubmissionsController_confirm'];
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/api/practices/{practiceId}/submissions/{submissionId}/cancel': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    get?: never;
    put?: never;
    /** Cancel a submission that is processing, awaiting confirmation or failed */
    post: operations['SubmissionsController_cancel'];
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/api/practices/{practiceId}/submissions/{submissionId}/retry': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    get?: never;
    put?: never;
    /** Check a failed submission again (its file is kept for this) */
    post: operations['SubmissionsController_retry'];
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/api/quarters/{quarterId}/coverage': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    /** Submission coverage of a quarter: which practices have a current submission, which are awaiting confirmation, which have none */
    get: operations['CoverageController_coverage'];
    put?: never;
    post?: never;
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/api/quarters/{quarterId}/benchmark': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    /**
     * Every practice on every measure of an audit quarter, with the region’s statistics
     * @description Read from the practices’ current submissions for the quarter; `builtFrom` says which set. Practices come in pages (`page`, `pageSize`; `page` in the answer says how many there are), each page with the region’s statistics, the measures and the coverage; pages with the same `builtFrom.resultId` belong together. Practices without a current submission are listed in `coverage.missing`, never counted as zero. 404 quarter-not-found, 404 locality-not-found; 400 for a bad split, page or page size, or a page past the last. Sent with an ETag; If-None-Match with it gives 304 while nothing it was built from has changed.
     */
    get: operations['BenchmarkController_region'];
    put?: never;
    post?: never;
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/api/quarters/{quarterId}/benchmark/measures/{measureKey}': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    /**
     * One measure’s funnel plot: every practice’s point, the limits as curves, over-dispersion
     * @description 404 measure-not-found naming the measure set’s measures.
     */
    get: operations['BenchmarkController_funnel'];
    put?: never;
    post?: never;
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/api/quarters/{quarterId}/benchmark/trend': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    /**
     * One measure over every quarter of the region up to this one: the region and every practice
     * @description Each quarter with its own measure set; a quarter whose measure set lacks the measure, or without a current submission, is a gap (no rate), never a zero. Run-chart signals per series.
     */
    get: operations['BenchmarkController_trend'];
    put?: never;
    post?: never;
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/api/practices/{practiceId}/quarters/{quarterId}/results': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    /**
     * A practice's results for an audit quarter, against the region, with its trend
     * @description Every measure and split: its own figures, the region's rate, median and limits at its n, its flags, change since the previous quarter, trend with run-chart signals and improvement potential; data-quality flags (the breakdowns, kidney grid, time to insulin and value histograms are on results/detail). Other practices appear only as region aggregates and unnamed points, under disclosure control for practice leads. A practice without a current submission: state no-current-submission, with the upload action. Sent with an ETag; If-None-Match with it gives 304 while nothing it was built from has changed.
     */
    get: operations['PracticeResultsController_get'];
    put?: never;
    post?: never;
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/api/practices/{practiceId}/quarters/{quarterId}/results/detail': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    /**
     * A practice's detail for an audit quarter, against the region
     * @description Per measure and split, the practice's figures by breakdown category (age band, sex, deprivation, duration) beside the region's; the kidney grid (GFR × albuminuria categories); time from diagnosis to insulin (Kaplan–Meier) and value histograms, the practice against the region. The region's counts are under disclosure control for practice leads. builtFrom names the stored result it was built from, the same as the results it goes with. A practice without a current submission: state no-current-submission and no detail. Sent with an ETag; If-None-Match with it gives 304 while nothing it was built from has changed.
     */
    get: operations['PracticeResultsController_detail'];
    put?: never;
    post?: never;
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/api/practices/{practiceId}/quarters/{quarterId}/recall-list': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    /**
     * A practice's records that count against it on one care process or treatment target in an audit quarter, paged
     * @description Read from the practice's current submission for the quarter. The practice's own leads see its record references; regional leads and auditors see pseudonyms. 404 no-current-submission when the practice has no confirmed extract for the quarter.
     */
    get: operations['RecallListController_list'];
    put?: never;
    post?: never;
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/api/practices/{practiceId}/quarters/{quarterId}/recall-list.csv': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    /** The whole recall list of a measure as CSV (UTF-8) */
    get: operations['RecallListController_csv'];
    put?: never;
    post?: never;
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/api/practices/{practiceId}/quarters/{quarterId}/recall-list.xlsx': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    /** The whole recall list of a measure as XLSX, with a sheet about the measure */
    get: operations['RecallListController_xlsx'];
    put?: never;
    post?: never;
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/api/quarter-overview': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    /** The audit quarters of your region with deadline, measure set, coverage (regional lead, auditor) and published reports, what you may do with each, and the quarter that would open next */
    get: operations['QuarterOverviewController_get'];
    put?: never;
    post?: never;
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/api/quarters/{quarterId}/reports': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    get?: never;
    put?: never;
    /**
     * Publish the quarter’s benchmark as a report that never changes afterwards
     * @description Freezes the benchmark of the quarter’s current submissions (every practice’s results, the region’s, funnels, trends) with the measure-set version, the submissions, the publisher, the time and the release note; its content hash is the SHA-256 of those canonical bytes. An earlier published report of the quarter stays readable, marked replaced. 409 nothing-to-publish when no extract is confirmed; 409 benchmark-changed when one was confirmed while publishing.
     */
    post: operations['PublishReportController_publish'];
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/api/reports': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    /** The region’s reports, newest first (withdrawn ones as tombstones) */
    get: operations['ReportsController_list'];
    put?: never;
    post?: never;
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/api/reports/{reportId}': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    /** A report’s identity and standing (its permanent address) */
    get: operations['ReportsController_get'];
    put?: never;
    post?: never;
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/api/reports/{reportId}/region': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    /**
     * The region’s figures of a report, exactly as published
     * @description 410 report-withdrawn with the tombstone when it was withdrawn.
     */
    get: operations['ReportsController_region'];
    put?: never;
    post?: never;
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/api/reports/{reportId}/practices/{practiceId}': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    /**
     * One practice’s part of a report, exactly as published
     * @description Its own figures in full; for practice leads the region’s figures and other practices under disclosure control. State not-in-report when the practice had no confirmed extract then.
     */
    get: operations['ReportsController_practice'];
    put?: never;
    post?: never;
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/api/reports/{reportId}/data-pack.xlsx': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    /** The region’s data pack of a report (XLSX): other practices under disclosure control */
    get: operations['ReportsController_regionPack'];
    put?: never;
    post?: never;
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/api/reports/{reportId}/practices/{practiceId}/data-pack.xlsx': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    /** One practice’s data pack of a report (XLSX): its figures in full, others protected */
    get: operations['ReportsController_practicePack'];
    put?: never;
    post?: never;
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/api/reports/{reportId}/report.pdf': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    /** The region’s report as PDF: every measure and its funnel plot */
    get: operations['ReportsController_regionPdf'];
    put?: never;
    post?: never;
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/api/reports/{reportId}/practices/{practiceId}/report.pdf': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    /** One practice’s report as PDF, as its leads see it */
    get: operations['ReportsController_practicePdf'];
    put?: never;
    post?: never;
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/api/reports/{reportId}/withdraw': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    get?: never;
    put?: never;
    /** Withdraw a report: its figures are no longer served; a tombstone keeps the reason */
    post: operations['ReportsController_withdraw'];
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/api/mail/deliveries': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    /** Every source of the region's e-mail (latest first) with its messages' counts by state */
    get: operations['DeliveriesController_list'];
    put?: never;
    post?: never;
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/api/mail/deliveries/{kind}/{sourceId}': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    /** One source's messages: each recipient, state, times, and the server's reply */
    get: operations['DeliveriesController_detail'];
    put?: never;
    post?: never;
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/api/mail/deliveries/{kind}/{sourceId}/resend': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    get?: never;
    put?: never;
    /** Sends a source's failed messages again */
    post: operations['DeliveriesController_resendFailed'];
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/api/mail/messages/{messageId}/resend': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    get?: never;
    put?: never;
    /** Sends one failed message again */
    post: operations['DeliveriesController_resendMessage'];
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/api/mail/recipients': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    /** Each active practice's mail recipients: its leads (and what they opted out of) and the extra addresses */
    get: operations['MailRecipientsController_list'];
    put?: never;
    post?: never;
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/api/practices/{practiceId}/mail-recipients': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    get?: never;
    put?: never;
    /** Adds an address to a practice's mail recipients */
    post: operations['MailRecipientsController_add'];
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/api/practices/{practiceId}/mail-recipients/{recipientId}': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    get?: never;
    put?: never;
    post?: never;
    /** Removes an extra address from a practice's mail recipients */
    delete: operations['MailRecipientsController_remove'];
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/api/me/mail-preferences': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    /** Every kind of e-mail Cairn sends, and whether you receive it */
    get: operations['MailPreferencesController_get'];
    /** Chooses the kinds of e-mail you do not want */
    put: operations['MailPreferencesController_set'];
    post?: never;
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/api/quarters/{quarterId}/outliers': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    /**
     * Every practice × measure beyond the chosen limits, strongest evidence first, with why
     * @description Read from the quarter’s stored benchmark (basis). 404 quarter-not-found, measure-not-found, locality-not-found; 400 for a bad level, split or assessment.
     */
    get: operations['OutliersController_list'];
    put?: never;
    post?: never;
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/api/quarters/{quarterId}/outliers/practices/{practiceId}/measures/{measureKey}': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    /** One practice × measure: by diabetes type with trends, breakdowns against the region, histogram, data-quality flags */
    get: operations['OutliersController_drillDown'];
    put?: never;
    post?: never;
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/api/quarters/{quarterId}/outliers/practices/{practiceId}/measures/{measureKey}/records': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    /** The de-identified records behind the result, paged (pseudonyms only) */
    get: operations['OutliersController_records'];
    put?: never;
    post?: never;
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/api/quarters/{quarterId}/outliers/practices/{practiceId}/measures/{measureKey}/evidence.xlsx': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    /** The evidence as XLSX: about, by type, breakdowns, trend, data quality, records */
    get: operations['OutliersController_evidence'];
    put?: never;
    post?: never;
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/api/review-cases': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    /** Review cases the reader may see (practice leads: their practices’ only), newest first */
    get: operations['ReviewCasesController_list'];
    put?: never;
    /**
     * Open a review case on a practice × measure × quarter, freezing its current figures
     * @description 409 case-already-open (with its caseId) when one is not closed yet; 409 no-figures-to-review without a current submission.
     */
    post: operations['ReviewCasesController_open'];
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/api/review-cases/{caseId}': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    /** One review case: frozen figures, timeline (internal notes only for the region’s side), allowed actions */
    get: operations['ReviewCasesController_get'];
    put?: never;
    post?: never;
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/api/review-cases/{caseId}/transitions': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    get?: never;
    put?: never;
    /**
     * Ask the practice, close with a finding, or reopen
     * @description 409 case-changed (with the case as it is) when expectedVersion is not the current version; 409 case-closed or case-wrong-state when the action does not apply.
     */
    post: operations['ReviewCasesController_transition'];
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/api/review-cases/{caseId}/comments': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    get?: never;
    put?: never;
    /** Add a comment the practice sees, or (auditors) an internal note; append-only */
    post: operations['ReviewCasesController_comment'];
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/api/review-cases/{caseId}/answers': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    get?: never;
    put?: never;
    /**
     * The practice’s answer, with up to 5 attachments checked by content and size
     * @description 413 attachment-too-large, 415 attachment-type-not-allowed or attachment-name-misleading, 422 empty-text, 409 case-closed or case-changed; nothing is stored on any of them.
     */
    post: operations['ReviewCasesController_answer'];
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/api/review-cases/{caseId}/files/{fileId}': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    /** Download an attachment of a review case */
    get: operations['ReviewCasesController_file'];
    put?: never;
    post?: never;
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/api/digests': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    /** The reports digests can be made from, latest first */
    get: operations['DigestsController_list'];
    put?: never;
    post?: never;
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/api/digests/{reportId}/practices/{practiceId}/preview': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    /**
     * A practice's digest as it will be sent: subject, recipients, text part, attachment
     * @description The HTML part is served alone at htmlPath, for a sandboxed frame.
     */
    get: operations['DigestsController_preview'];
    put?: never;
    post?: never;
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/api/digests/{reportId}/practices/{practiceId}/preview.html': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    /** A practice's digest: the HTML part alone, exactly as sent */
    get: operations['DigestsController_previewHtml'];
    put?: never;
    post?: never;
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/api/digests/{reportId}/practices/{practiceId}/test': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    get?: never;
    put?: never;
    /** Sends a practice's digest to the signed-in regional lead alone, now */
    post: operations['DigestsController_sendTest'];
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/api/digests/{reportId}/send': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    get?: never;
    put?: never;
    /** Queues every practice's digests (practices queued before are left alone) */
    post: operations['DigestsController_sendAll'];
    delete?: never;
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
  '/api/digests/{reportId}/schedule': {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    /** When the digests are to be sent, or were */
    get: operations['DigestsController_scheduleOf'];
    /** Sends the digests at a time (sets or moves it) */
    put: operations['DigestsController_schedule'];
    post?: never;
    /** Cancels the scheduled sending */
    delete: operations['DigestsController_cancel'];
    options?: never;
    head?: never;
    patch?: never;
    trace?: never;
  };
}
export type webhooks = Record<string, never>;
export interface components {
  schemas: {
    FieldProblemDto: {
      /**
       * @description The field concerned
       * @example practiceIds.0
       */
      field: string;
      /** @example must be a whole number */
      message: string;
    };
    ProblemDto: {
      /**
       * @description Kind of problem
       * @example /api/problems/validation
       */
      type: string;
      /** @example The request is not valid */
      title: string;
      /** @example 400 */
      status: number;
      /** @description What happened here, in plain words */
      detail?: string;
      instance?: string;
      /** @description Field problems (validation) */
      errors?: components['schemas']['FieldProblemDto'][];
    };
    AboutDto: {
      /** @example Cairn */
      product: string;
      /** @example 0.1.0 */
      version: string;
      /** @description The region this deployment serves */
      regionName: string | null;
      /** @example 30 */
      practices: number;
      /** @example 4 */
      localities: number;
      /** @description The caution every screen that could steer care carries */
      clinicalCaution: string;
    };
    /** @enum {string} */
    Role: 'regional_lead' | 'practice_lead' | 'auditor';
    /** @enum {string} */
    UserStatus: 'active' | 'deactivated';
    PracticeRefDto: {
      /** @example 12 */
      id: number;
      /**
       * @description The practice's code in Cairn
       * @example OV102
       */
      code: string;
      /** @example Quarrybank Surgery */
      name: string;
    };
    UserDto: {
      id: number;
      /** @example priya.calloway@quarrybank.example */
      email: string;
      /** @example Priya Calloway */
      displayName: string;
      role: components['schemas']['Role'];
      status: components['schemas']['UserStatus'];
      /** @description Practices this person leads (practice leads), by code */
      practices: components['schemas']['PracticeRefDto'][];
      /** @description ISO 8601, or null if never signed in */
      lastSignInAt: string | null;
      /** @description ISO 8601 */
      createdAt: string;
    };
    UserListDto: {
      users: components['schemas']['UserDto'][];
      /** @description True when roles and practices come from the identity provider at each sign-in (changes made here last until the person's next sign-in) */
      trustIdpRoles: boolean;
    };
    PracticeDto: {
      /** @example 12 */
      id: number;
      /**
       * @description The practice's code in Cairn
       * @example OV102
       */
      code: string;
      /** @example Quarrybank Surgery */
      name: string;
      /** @example Harnleigh Fold */
      localityName: string | null;
    };
    UserOptionsDto: {
      /** @description The region's practices, by code */
      practices: components['schemas']['PracticeDto'][];
      trustIdpRoles: boolean;
    };
    CreateUserDto: {
      /** @example new.lead@practice.example */
      email: string;
      /** @example Alex Example */
      displayName: string;
      role: components['schemas']['Role'];
      /** @description Practice ids (practice leads only) */
      practiceIds?: number[];
    };
    UpdateUserDto: {
      displayName?: string;
      /** @description Changing a practice lead's role removes their practices */
      role?: components['schemas']['Role'];
    };
    /** @enum {string} */
    AuditOutcome: 'success' | 'refused' | 'failed';
    AuditEventDto: {
      id: number;
      /** @description ISO 8601 */
      occurredAt: string;
      /**
       * @description For support and filters
       * @example auth.sign_in
       */
      action: string;
      /**
       * @description The action in words
       * @example Signed in
       */
      actionLabel: string;
      outcome: components['schemas']['AuditOutcome'];
      actorUserId: number | null;
      /** @example imogen.varley@ostrevale.example */
      actorLabel: string;
      /**
       * @description The name of the person the label names, when they are a user of the region
       * @example Imogen Varley
       */
      actorName: string | null;
      /** @description The practice concerned */
      practice: components['schemas']['PracticeRefDto'] | null;
      subjectType: string | null;
      subjectId: string | null;
      summary: string;
      /** @description What the event recorded beyond its summary; its keys depend on the action */
      detail: {
        [key: string]: unknown;
      } | null;
      requestId: string | null;
      ipAddress: string | null;
    };
    AuditEventPageDto: {
      /** @description Newest first */
      events: components['schemas']['AuditEventDto'][];
      /** @description Pass as `before` for the next (older) page; null when there is none */
      nextBefore: number | null;
    };
    AuditActionDto: {
      /** @example auth.sign_in */
      action: string;
      /**
       * @description The action in words
       * @example Signed in
       */
      label: string;
      /**
       * @description The group it belongs to, as a filter prefix
       * @example auth.
       */
      group: string;
      /**
       * @description The group in words
       * @example Sign-ins and sign-outs
       */
      groupLabel: string;
      count: number;
    };
    MeDto: {
      id: number;
      /** @example priya.calloway@quarrybank.example */
      email: string;
      /** @example Priya Calloway */
      displayName: string;
      role: components['schemas']['Role'];
      /** @example Ostrevale */
      regionName: string;
      /** @description The practices this person leads (practice leads only), by code */
      practices: components['schemas']['PracticeRefDto'][];
      /** @description When the session ends at the latest (absolute timeout), ISO 8601 */
      sessionExpiresAt: string;
    };
    /**
     * @description Set when a session ended on this request (why the person is signed out)
     * @enum {string}
     */
    SessionEnd: 'idle' | 'absolute' | 'deactivated' | 'removed';
    SessionDto: {
      /** @description The signed-in person, or null */
      user: components['schemas']['MeDto'] | null;
      /** @description Send this as the X-CSRF-Token header on every state-changing request; null when signed out */
      csrfToken: string | null;
      /** @description Set when a session ended on this request (why the person is signed out) */
      sessionEnded: components['schemas']['SessionEnd'] | null;
      /** @description True when sign-in goes through the local fake identity provider (development) */
      localSignIn: boolean;
    };
    SignOutDto: {
      /**
       * @description Where to send the browser: the identity provider's single logout (which returns to Cairn), or Cairn's signed-out page
       * @example /sign-in?signedOut=1
       */
      redirectUrl: string;
    };
    HealthProcessDto: {
      /** @enum {string} */
      status: 'up';
      pid: number;
      /** @description ISO 8601 */
      startedAt: string;
      uptimeSeconds: number;
      rssMegabytes: number;
      /** @example v20.20.2 */
      node: string;
    };
    HealthDatabaseDto: {
      /** @enum {string} */
      status: 'up' | 'down';
      /** @description MariaDB server version */
      server?: string;
      /** @description Last migration */
      schema?: string | null;
    };
    HealthDto: {
      /** @enum {string} */
      status: 'ok';
      process: components['schemas']['HealthProcessDto'];
      database: components['schemas']['HealthDatabaseDto'];
    };
    /**
     * @description draft: being edited, used by nothing; published: fixed for good
     * @enum {string}
     */
    MeasureSetStatus: 'draft' | 'published';
    /** @enum {string} */
    MeasureSetUseKind: 'quarter' | 'report';
    MeasureSetUseDto: {
      kind: components['schemas']['MeasureSetUseKind'];
      id: number;
      /** @example 2026 Q3 */
      label: string;
      /**
       * @description The quarter’s or report’s status
       * @example open
       */
      status: string;
    };
    MeasureSetActionsDto: {
      /** @description Start a draft from this published version */
      clone: boolean;
      /** @description Change this draft */
      edit: boolean;
      /** @description Publish this draft as a new version */
      publish: boolean;
      /** @description Discard this draft */
      discard: boolean;
    };
    MeasureSetSummaryDto: {
      /** @example cairn-default-2026.1 */
      id: string;
      /** @example Cairn default measure set 2026.1 */
      label: string;
      description: string | null;
      /** @description draft: being edited, used by nothing; published: fixed for good */
      status: components['schemas']['MeasureSetStatus'];
      /** @description The version this one was started from */
      basedOn: string | null;
      /** @description Shipped with Cairn (config/measure-sets/) and read by every region */
      shippedWithCairn: boolean;
      /** @description SHA-256 (hex) of the definition as stored */
      contentHash: string;
      /** @example 10 */
      careProcesses: number;
      /** @example 10 */
      treatmentTargets: number;
      /** @description The version a new audit quarter gets by default */
      isDefault: boolean;
      /** @description ISO 8601 */
      createdAt: string;
      /** @description Who started it (Cairn itself for a shipped version) */
      createdBy: string;
      /** @description ISO 8601 */
      publishedAt: string | null;
      publishedBy: string | null;
      /** @description The quarters (and reports) that use it */
      usedBy: components['schemas']['MeasureSetUseDto'][];
      actions: components['schemas']['MeasureSetActionsDto'];
    };
    /** @enum {string} */
    BreakdownKey: 'age_band' | 'sex' | 'deprivation' | 'duration';
    BreakdownCategoryDto: {
      /** @example 40-64 */
      key: string;
      /** @example 40–64 */
      label: string;
    };
    BreakdownDto: {
      key: components['schemas']['BreakdownKey'];
      /** @example Age band */
      label: string;
      categories: components['schemas']['BreakdownCategoryDto'][];
    };
    /** @enum {string} */
    MeasureKind: 'care_process' | 'treatment_target';
    /**
     * @description eligible: everyone in the population counts (no result counts against); measured: only those with a result
     * @enum {string}
     */
    DenominatorKind: 'eligible' | 'measured';
    /**
     * @description Whether a higher or a lower rate is better
     * @enum {string}
     */
    MeasureDirection: 'higher' | 'lower';
    /** @enum {string} */
    DiabetesType: 'type1' | 'type2' | 'other';
    MeasurePopulationDto: {
      types: components['schemas']['DiabetesType'][];
      /** @description Youngest age included, at the end of the review window; null for no bound */
      minAge: number | null;
      /** @description Oldest age included; null for no bound */
      maxAge: number | null;
      /** @example Eligible people with any type of diabetes, aged 40–75 */
      text: string;
    };
    /**
     * @description The record fields the measure reads
     * @enum {string}
     */
    ReadingField:
      | 'hba1c'
      | 'bloodPressure'
      | 'cholesterol'
      | 'serumCreatinine'
      | 'urineAlbumin'
      | 'footSurveillance'
      | 'bmi'
      | 'smoking'
      | 'retinalScreening'
      | 'onStatin'
      | 'onInsulin'
      | 'cvdHistory';
    MeasureDto: {
      /** @example hba1c_le_53 */
      key: string;
      /** @example HbA1c 53 mmol/mol (7.0 %) or below */
      label: string;
      kind: components['schemas']['MeasureKind'];
      /** @description True when the measure combines others */
      composite: boolean;
      /**
       * @description What meets the measure, in words
       * @example Latest HbA1c in the review window 53 mmol/mol or below
       */
      definition: string;
      /** @description eligible: everyone in the population counts (no result counts against); measured: only those with a result */
      denominator: components['schemas']['DenominatorKind'];
      /** @description The denominator in words */
      denominatorText: string;
      /** @description Whether a higher or a lower rate is better */
      direction: components['schemas']['MeasureDirection'];
      population: components['schemas']['MeasurePopulationDto'];
      /** @description The guideline or rule the measure comes from */
      source: string;
      note: string | null;
      /** @description The record fields the measure reads */
      reads: components['schemas']['ReadingField'][];
      /** @description Keys of the measures a composite combines (empty otherwise) */
      components: string[];
    };
    PopulationDefinitionDto: {
      types: components['schemas']['DiabetesType'][];
      /** @description Youngest age included; null: none */
      minAge: number | null;
      /** @description Oldest age included; null: none */
      maxAge: number | null;
    };
    /**
     * @description The record field whose month must lie in the window
     * @enum {string}
     */
    CareProcessField:
      | 'hba1c'
      | 'bloodPressure'
      | 'cholesterol'
      | 'serumCreatinine'
      | 'urineAlbumin'
      | 'footSurveillance'
      | 'bmi'
      | 'smoking'
      | 'retinalScreening';
    /** @enum {string} */
    MeasureWindow: 'review' | 'retinal';
    RecordedProcessDefinitionDto: {
      /** @example hba1c_le_53 */
      key: string;
      label: string;
      /** @description The guideline or rule the measure comes from */
      source: string;
      denominator: components['schemas']['DenominatorKind'];
      direction: components['schemas']['MeasureDirection'];
      population: components['schemas']['PopulationDefinitionDto'];
      note?: string;
      /** @enum {string} */
      rule: 'recorded';
      /** @description The record field whose month must lie in the window */
      field: components['schemas']['CareProcessField'];
      window: components['schemas']['MeasureWindow'];
    };
    CompositeProcessDefinitionDto: {
      /** @example hba1c_le_53 */
      key: string;
      label: string;
      /** @description The guideline or rule the measure comes from */
      source: string;
      denominator: components['schemas']['DenominatorKind'];
      direction: components['schemas']['MeasureDirection'];
      population: components['schemas']['PopulationDefinitionDto'];
      note?: string;
      /** @enum {string} */
      rule: 'allOf';
      /** @description Keys of the recorded care processes that must all be complete */
      of: string[];
    };
    /** @enum {string} */
    Measurement:
      | 'hba1c'
      | 'systolic'
      | 'diastolic'
      | 'cholesterol'
      | 'serumCreatinine'
      | 'urineAlbumin'
      | 'bmi';
    /** @enum {string} */
    Comparator: 'lt' | 'le' | 'gt' | 'ge';
    ValueTargetDefinitionDto: {
      /** @example hba1c_le_53 */
      key: string;
      label: string;
      /** @description The guideline or rule the measure comes from */
      source: string;
      denominator: components['schemas']['DenominatorKind'];
      direction: components['schemas']['MeasureDirection'];
      population: components['schemas']['PopulationDefinitionDto'];
      note?: string;
      /** @enum {string} */
      rule: 'value';
      measurement: components['schemas']['Measurement'];
      comparator: components['schemas']['Comparator'];
      threshold: number;
    };
    BloodPressureBandDto: {
      /** @description The band applies from this age */
      minAge: number;
      /** @example 140 */
      systolicBelow: number;
      /** @example 90 */
      diastolicBelow: number;
    };
    BloodPressureTargetDefinitionDto: {
      /** @example hba1c_le_53 */
      key: string;
      label: string;
      /** @description The guideline or rule the measure comes from */
      source: string;
      denominator: components['schemas']['DenominatorKind'];
      direction: components['schemas']['MeasureDirection'];
      population: components['schemas']['PopulationDefinitionDto'];
      note?: string;
      /** @enum {string} */
      rule: 'bloodPressure';
      bands: components['schemas']['BloodPressureBandDto'][];
    };
    /** @enum {string} */
    FlagField: 'onStatin' | 'onInsulin' | 'cvdHistory';
    FlagTargetDefinitionDto: {
      /** @example hba1c_le_53 */
      key: string;
      label: string;
      /** @description The guideline or rule the measure comes from */
      source: string;
      denominator: components['schemas']['DenominatorKind'];
      direction: components['schemas']['MeasureDirection'];
      population: components['schemas']['PopulationDefinitionDto'];
      note?: string;
      /** @enum {string} */
      rule: 'flag';
      flag: components['schemas']['FlagField'];
      equals: boolean;
    };
    ValueConditionDto: {
      /** @enum {string} */
      rule: 'value';
      measurement: components['schemas']['Measurement'];
      comparator: components['schemas']['Comparator'];
      /** @description In the measurement’s canonical unit */
      threshold: number;
    };
    BloodPressureConditionDto: {
      /** @enum {string} */
      rule: 'bloodPressure';
      bands: components['schemas']['BloodPressureBandDto'][];
    };
    FlagConditionDto: {
      /** @enum {string} */
      rule: 'flag';
      flag: components['schemas']['FlagField'];
      /** @description The recorded value that meets the target */
      equals: boolean;
    };
    TargetRefConditionDto: {
      /** @enum {string} */
      rule: 'target';
      /** @description Key of a target defined before this one */
      key: string;
    };
    /** @enum {string} */
    CompositeRule: 'anyOf' | 'allOf';
    CompositeTargetDefinitionDto: {
      /** @example hba1c_le_53 */
      key: string;
      label: string;
      /** @description The guideline or rule the measure comes from */
      source: string;
      denominator: components['schemas']['DenominatorKind'];
      direction: components['schemas']['MeasureDirection'];
      population: components['schemas']['PopulationDefinitionDto'];
      note?: string;
      rule: components['schemas']['CompositeRule'];
      of: (
        | components['schemas']['ValueConditionDto']
        | components['schemas']['BloodPressureConditionDto']
        | components['schemas']['FlagConditionDto']
        | components['schemas']['TargetRefConditionDto']
      )[];
    };
    EligibilityDefinitionDto: {
      /** @example 12 */
      minAge: number;
    };
    BreakdownBandsDto: {
      /**
       * @example [
       *       12,
       *       40,
       *       65,
       *       80
       *     ]
       */
      ageBands: number[];
      /**
       * @example [
       *       0,
       *       2,
       *       7,
       *       15
       *     ]
       */
      durationBands: number[];
    };
    MeasureSetDefinitionDto: {
      /** @example cairn-default-2026.1 */
      id: string;
      label: string;
      description?: string;
      eligibility: components['schemas']['EligibilityDefinitionDto'];
      /** @example 12 */
      retinalWindowMonths: number;
      breakdowns: components['schemas']['BreakdownBandsDto'];
      careProcesses: (
        | components['schemas']['RecordedProcessDefinitionDto']
        | components['schemas']['CompositeProcessDefinitionDto']
      )[];
      targets: (
        | components['schemas']['ValueTargetDefinitionDto']
        | components['schemas']['BloodPressureTargetDefinitionDto']
        | components['schemas']['FlagTargetDefinitionDto']
        | components['schemas']['CompositeTargetDefinitionDto']
      )[];
    };
    MeasureSetDto: {
      /** @example cairn-default-2026.1 */
      id: string;
      /** @example Cairn default measure set 2026.1 */
      label: string;
      description: string | null;
      /** @description draft: being edited, used by nothing; published: fixed for good */
      status: components['schemas']['MeasureSetStatus'];
      /** @description The version this one was started from */
      basedOn: string | null;
      /** @description Shipped with Cairn (config/measure-sets/) and read by every region */
      shippedWithCairn: boolean;
      /** @description SHA-256 (hex) of the definition as stored */
      contentHash: string;
      /** @example 10 */
      careProcesses: number;
      /** @example 10 */
      treatmentTargets: number;
      /** @description The version a new audit quarter gets by default */
      isDefault: boolean;
      /** @description ISO 8601 */
      createdAt: string;
      /** @description Who started it (Cairn itself for a shipped version) */
      createdBy: string;
      /** @description ISO 8601 */
      publishedAt: string | null;
      publishedBy: string | null;
      /** @description The quarters (and reports) that use it */
      usedBy: components['schemas']['MeasureSetUseDto'][];
      actions: components['schemas']['MeasureSetActionsDto'];
      /**
       * @description Youngest age counted at all, at the end of the review window
       * @example 12
       */
      eligibilityMinAge: number;
      /**
       * @description Months a retinal screening counts for
       * @example 12
       */
      retinalWindowMonths: number;
      breakdowns: components['schemas']['BreakdownDto'][];
      /** @description Care processes first, then treatment targets */
      measures: components['schemas']['MeasureDto'][];
      /** @description Saves of a draft so far; send it back when saving */
      revision: number;
      /** @description The definition, as stored */
      definition: components['schemas']['MeasureSetDefinitionDto'];
      /** @description An unused id for a draft started from this version (when the caller may start one) */
      suggestedDraftId: string | null;
      /** @description A label for that draft */
      suggestedDraftLabel: string | null;
    };
    /** @enum {string} */
    MeasureChangeKind: 'added' | 'removed' | 'changed';
    MeasureSetChangeDto: {
      kind: components['schemas']['MeasureChangeKind'];
      /** @description The measure; null for the set itself */
      measureKey: string | null;
      measureLabel: string | null;
      /**
       * @description Path within the measure (or the set); null when the measure was added or removed
       * @example threshold
       */
      field: string | null;
      /** @example Threshold */
      fieldLabel: string;
      /** @example 53 */
      before: string | null;
      /** @example 50 */
      after: string | null;
    };
    MeasureSetChangesDto: {
      id: string;
      /** @description The version compared with */
      basedOn: string | null;
      basedOnLabel: string | null;
      /** @description Empty when nothing differs */
      changes: components['schemas']['MeasureSetChangeDto'][];
    };
    CloneMeasureSetDto: {
      /** @example cairn-default-2026.2 */
      id: string;
      /** @example Cairn default measure set 2026.2 */
      label: string;
    };
    SaveMeasureSetDraftDto: {
      /** @description The revision the change was made to */
      revision: number;
      definition: components['schemas']['MeasureSetDefinitionDto'];
    };
    PublishMeasureSetDto: {
      /** @description The revision being published, as last read */
      revision: number;
    };
    DiscardedMeasureSetDto: {
      /** @description The draft discarded */
      id: string;
      /** @description The version it was started from */
      basedOn: string | null;
    };
    /**
     * @description Closed: closed to practice uploads (a regional lead can still correct it)
     * @enum {string}
     */
    QuarterStatus: 'open' | 'closed';
    QuarterDto: {
      id: number;
      regionId: number;
      /** @example 2026 */
      year: number;
      /**
       * @example 3
       * @enum {number}
       */
      quarter: 1 | 2 | 3 | 4;
      /** @example 2026 Q3 */
      label: string;
      /**
       * @description First month of the review window
       * @example 2025-10
       */
      windowStart: string;
      /**
       * @description Last month of the review window
       * @example 2026-09
       */
      windowEnd: string;
      /** @example cairn-default-2026.1 */
      measureSetId: string;
      /** @example 2026-12-16 */
      submissionDeadline: string;
      /** @description Closed: closed to practice uploads (a regional lead can still correct it) */
      status: components['schemas']['QuarterStatus'];
      /** @description ISO 8601 */
      openedAt: string;
      /** @description ISO 8601 */
      closedAt: string | null;
    };
    OpenQuarterDto: {
      /** @example 2026 */
      year: number;
      /**
       * @example 4
       * @enum {number}
       */
      quarter: 1 | 2 | 3 | 4;
      /**
       * @description Default: a fixed number of days after the quarter ends
       * @example 2027-03-18
       */
      submissionDeadline?: string;
      /** @example cairn-default-2026.1 */
      measureSetId?: string;
    };
    ReopenQuarterDto: {
      /**
       * @description A new deadline (YYYY-MM-DD); the current one is kept when not given
       * @example 2027-02-14
       */
      submissionDeadline?: string;
    };
    UpdateQuarterDto: {
      /**
       * @description YYYY-MM-DD
       * @example 2027-02-14
       */
      submissionDeadline?: string;
      /** @example cairn-default-2026.2 */
      measureSetId?: string;
    };
    ExtractLimitsDto: {
      maxBytes: number;
      maxRows: number;
    };
    FormatColumnDto: {
      /** @example hba1c_value */
      key: string;
      /** @example care process */
      group: string;
      meaning: string;
      /** @description The values allowed, in words */
      allowed: string;
      /** @description Whether column and value are needed, in words */
      required: string;
      columnRequired: boolean;
      valueRequired: boolean;
      units: string[];
      codes: string[] | null;
      example: string;
    };
    /** @enum {string} */
    IssueSeverity: 'refusal' | 'error' | 'warning' | 'flag';
    IssueCodeDto: {
      code: string;
      severity: components['schemas']['IssueSeverity'];
      title: string;
    };
    ExtractFormatDto: {
      limits: components['schemas']['ExtractLimitsDto'];
      columns: components['schemas']['FormatColumnDto'][];
      issueCodes: components['schemas']['IssueCodeDto'][];
    };
    UploadPracticeDto: {
      practice: components['schemas']['PracticeDto'];
      /** @description The audit quarters an extract may be sent to for this practice (the upload action) */
      quarterIds: number[];
    };
    UploadOptionsDto: {
      /** @description The practices the signed-in person may send extracts for, by code */
      practices: components['schemas']['UploadPracticeDto'][];
      /** @description The region's audit quarters, latest first */
      quarters: components['schemas']['QuarterDto'][];
    };
    /** @enum {string} */
    DateConvention: 'day_first' | 'month_first';
    /** @enum {string} */
    SubmissionStatus:
      | 'processing'
      | 'rejected'
      | 'awaiting_confirmation'
      | 'accepted'
      | 'superseded'
      | 'cancelled'
      | 'failed';
    /**
     * @description While processing: waiting for a reader, still arriving, or being read
     * @enum {string}
     */
    SubmissionPhase: 'queued' | 'uploading' | 'reading';
    SubmissionFileDto: {
      /** @example q3-extract.xlsx */
      name: string;
      sizeBytes: number;
      /** @description SHA-256 of the file, hex */
      sha256: string | null;
      /**
       * @description xlsx or csv
       * @example xlsx
       */
      kind: string | null;
      /** @description The sheet read (workbooks) */
      sheetName: string | null;
      dateConvention: components['schemas']['DateConvention'] | null;
      /** @description The delimiter found (CSV) */
      delimiter: string | null;
      /** @description The text encoding found (CSV) */
      encoding: string | null;
      /** @description Whether the file itself is still kept (only while it is checked, or to retry) */
      kept: boolean;
    };
    SubmissionProgressDto: {
      rowsDone: number;
      /** @description Null until the rows are counted */
      rowsTotal: number | null;
    };
    SubmissionCountsDto: {
      rowsRead: number;
      rowsAccepted: number;
      rowsRejected: number;
      rowsBlank: number;
      errors: number;
      warnings: number;
      flags: number;
    };
    IssueCountDto: {
      /** @example out_of_range */
      code: string;
      severity: components['schemas']['IssueSeverity'];
      title: string;
      count: number;
    };
    SubmissionRefusalProblemDto: {
      /**
       * @description For support; not shown
       * @example missing_columns
       */
      code: string;
      /** @example Required columns missing */
      title: string;
      message: string;
      fix: string;
      /** @description Facts behind the refusal (which columns, which limit); keys depend on the code */
      detail: {
        [key: string]: unknown;
      } | null;
    };
    SubmissionRefusalDto: {
      /**
       * @description For support; not shown
       * @example missing_columns
       */
      code: string;
      /** @example Required columns missing */
      title: string;
      message: string;
      fix: string;
      /** @description Facts behind the refusal (which columns, which limit); keys depend on the code */
      detail: {
        [key: string]: unknown;
      } | null;
      /** @description Every reason found, the primary one (code, title…) first: all the problems of the heading row (columns that identify people, units not recognised, repeated and missing columns) are reported together */
      problems: components['schemas']['SubmissionRefusalProblemDto'][];
    };
    SubmissionFailureDto: {
      message: string;
      attempts: number;
      /** @description The file is still kept, so it can be checked again */
      canRetry: boolean;
    };
    SubmissionActionsDto: {
      /** @description Make it current (it awaits confirmation) */
      confirm: boolean;
      /** @description Cancel it (processing, awaiting confirmation, failed) */
      cancel: boolean;
      /** @description Check it again (failed, file kept) */
      retry: boolean;
      /** @description Send a new extract for the same practice and audit quarter */
      upload: boolean;
    };
    SubmissionDto: {
      id: number;
      status: components['schemas']['SubmissionStatus'];
      /** @example Awaiting confirmation */
      statusLabel: string;
      /** @description While processing: waiting for a reader, still arriving, or being read */
      phase: components['schemas']['SubmissionPhase'] | null;
      /** @description The current submission of its practice and quarter */
      isCurrent: boolean;
      practice: components['schemas']['PracticeRefDto'];
      quarter: components['schemas']['QuarterDto'];
      /** @description The file itself is not kept once checked */
      file: components['schemas']['SubmissionFileDto'];
      /** @description Who uploaded it: the person's name (or what Cairn did, e.g. demo seeding) */
      uploadedBy: string;
      /** @description ISO 8601 */
      uploadedAt: string;
      processingStartedAt: string | null;
      processedAt: string | null;
      confirmedAt: string | null;
      confirmedBy: string | null;
      cancelledAt: string | null;
      cancelledBy: string | null;
      supersededAt: string | null;
      supersededBySubmissionId: number | null;
      failedAt: string | null;
      /** @description A real progress bar while processing */
      progress: components['schemas']['SubmissionProgressDto'];
      /** @description Rows read, accepted, refused, blank; errors, warnings, flags (once checked) */
      counts: components['schemas']['SubmissionCountsDto'] | null;
      /** @description Issues by code, errors first */
      issuesByCode: components['schemas']['IssueCountDto'][];
      /** @description Why the file was refused */
      refusal: components['schemas']['SubmissionRefusalDto'] | null;
      /** @description Why processing failed, and whether it can be retried */
      failure: components['schemas']['SubmissionFailureDto'] | null;
      /** @description Where the headings were found */
      headerRow: number | null;
      columnsFound: string[];
      /** @description Columns not in Cairn's format, ignored */
      columnsIgnored: string[];
      actions: components['schemas']['SubmissionActionsDto'];
    };
    UploadProblemDto: {
      /**
       * @description Kind of problem
       * @example /api/problems/validation
       */
      type: string;
      /** @example The request is not valid */
      title: string;
      /** @example 400 */
      status: number;
      /** @description What happened here, in plain words */
      detail?: string;
      instance?: string;
      /** @description Field problems (validation) */
      errors?: components['schemas']['FieldProblemDto'][];
      /** @enum {string} */
      code?: 'identical_extract' | 'file_too_large';
      /** @description How to fix it */
      fix?: string;
      /** @description The earlier identical submission, or the rejected one kept in the history */
      submissionId?: number;
      submissionStatus?: components['schemas']['SubmissionStatus'];
      maxBytes?: number;
      sha256?: string;
    };
    PracticeQuarterActionsDto: {
      /** @description Send an extract for this practice and quarter */
      upload: boolean;
    };
    QuarterSubmissionsDto: {
      quarter: components['schemas']['QuarterDto'];
      currentSubmissionId: number | null;
      /** @description Latest first */
      submissions: components['schemas']['SubmissionDto'][];
      actions: components['schemas']['PracticeQuarterActionsDto'];
    };
    SubmissionHistoryDto: {
      practice: components['schemas']['PracticeRefDto'];
      /** @description Every audit quarter, latest first */
      quarters: components['schemas']['QuarterSubmissionsDto'][];
    };
    /** @enum {string} */
    RowIssueSeverity: 'error' | 'warning' | 'flag';
    /** @enum {string} */
    IssueSort: 'row' | '-row' | 'severity' | '-severity' | 'code' | '-code' | 'column' | '-column';
    IssueColumnCountDto: {
      column: string;
      count: number;
    };
    IssueDto: {
      seq: number;
      severity: components['schemas']['IssueSeverity'];
      code: string;
      title: string;
      /** @description Row of the file */
      row: number | null;
      /** @description Heading as given */
      column: string | null;
      /** @description Cairn's column key */
      columnKey: string | null;
      /** @description The value given (record references pseudonymised outside the practice) */
      value: string | null;
      message: string;
      fix: string;
    };
    IssuePageDto: {
      /** @description Issues matching the filter */
      total: number;
      offset: number;
      limit: number;
      /** @description False when record references are shown as pseudonyms (anyone outside the practice) */
      recordRefsShown: boolean;
      /** @description Issues per column (all of them) */
      columns: components['schemas']['IssueColumnCountDto'][];
      items: components['schemas']['IssueDto'][];
    };
    ReportIssueDto: {
      row: number | null;
      column: string | null;
      columnKey: string | null;
      value: string | null;
      severity: components['schemas']['IssueSeverity'];
      code: string;
      title: string;
      message: string;
      fix: string;
    };
    ValidationReportFileDto: {
      submission: components['schemas']['SubmissionDto'];
      recordRefsShown: boolean;
      /** @description Every issue, in the order found */
      issues: components['schemas']['ReportIssueDto'][];
    };
    CoverageTotalsDto: {
      practices: number;
      /** @description Practices with a current submission */
      current: number;
      /** @description Of the practices with a current submission, those with another extract waiting */
      currentWithWaiting: number;
      /** @description Practices with no current submission yet but an extract waiting */
      awaitingConfirmation: number;
      /** @description Practices with neither */
      none: number;
      /** @description Records in current submissions */
      records: number;
    };
    /** @enum {string} */
    CoverageState: 'current' | 'awaiting_confirmation' | 'none';
    CoverageCurrentDto: {
      submissionId: number;
      records: number | null;
      confirmedAt: string | null;
      confirmedBy: string | null;
    };
    CoverageWaitingDto: {
      submissionId: number;
      status: components['schemas']['SubmissionStatus'];
      uploadedAt: string;
    };
    CoverageProblemDto: {
      submissionId: number;
      status: components['schemas']['SubmissionStatus'];
      /** @description The refusal code, if refused (for support) */
      code: string | null;
      /**
       * @description Why, in words
       * @example Required columns missing
       */
      reason: string;
      uploadedAt: string;
    };
    CoveragePracticeDto: {
      practice: components['schemas']['PracticeDto'];
      state: components['schemas']['CoverageState'];
      current: components['schemas']['CoverageCurrentDto'] | null;
      /** @description Extracts being checked or awaiting confirmation */
      waiting: components['schemas']['CoverageWaitingDto'][];
      /** @description The latest refused or failed extract still outstanding */
      lastProblem: components['schemas']['CoverageProblemDto'] | null;
    };
    CoverageDto: {
      quarter: components['schemas']['QuarterDto'];
      totals: components['schemas']['CoverageTotalsDto'];
      practices: components['schemas']['CoveragePracticeDto'][];
    };
    /** @enum {string} */
    TypeSplit: 'all' | 'type1' | 'type2_other';
    /**
     * @description no-accepted-submissions: nobody has a current submission for the quarter yet
     * @enum {string}
     */
    BenchmarkState: 'results' | 'no-accepted-submissions';
    LocalityDto: {
      /** @example HRN */
      code: string;
      /** @example Harnleigh Fold */
      name: string;
    };
    BuiltFromDto: {
      /** @description The stored result (benchmark_results) */
      resultId: number;
      quarterId: number;
      /** @example 2026 Q3 */
      quarterLabel: string;
      /** @example cairn-default-2026.1 */
      measureSetId: string;
      /** @description Current submissions it was built from */
      submissions: number;
      /** @description SHA-256 (hex) of the sorted ids of those submissions: results with the same key were built from the same set */
      submissionsKey: string;
      /** @description When it was built (ISO 8601) */
      builtAt: string;
      /** @description Milliseconds the build took */
      buildMs: number;
    };
    OverdispersionDto: {
      /** @description φ: mean of the Winsorised z² */
      phi: number | null;
      /** @description τ²: the additive between-unit variance */
      tau2: number | null;
      /** @description I·φ above the χ²(I − 1) 95 % point */
      present: boolean;
      /** @description I·φ */
      statistic: number | null;
      /** @description The χ²(I − 1) 95 % point */
      critical: number | null;
    };
    RegionMeasureDto: {
      /** @example hba1c */
      measure: string;
      /** @description Σ events over every practice */
      events: number;
      /** @description Σ n over every practice */
      n: number;
      /** @description θ₀: the pooled regional rate Σ events / Σ n, the funnel’s target */
      theta0: number | null;
      /** @description Median of the practices’ rates (n > 0) */
      median: number | null;
      /** @description Practices with n > 0 */
      practices: number;
      /** @description null when θ₀ is 0, 1 or unknown */
      overdispersion: components['schemas']['OverdispersionDto'] | null;
    };
    RecordCountsDto: {
      total: number;
      /** @description Known diabetes type and old enough */
      eligible: number;
      /** @description Left out: diabetes type not known */
      unknownType: number;
      /** @description Left out: under the youngest age counted */
      underAge: number;
    };
    DataQualityCountDto: {
      /** @example type1_not_on_insulin */
      code: string;
      /** @example Type 1 diabetes but not on insulin */
      title: string;
      /** @description Records of the submission it flagged */
      count: number;
    };
    IntervalDto: {
      /** @description null when there is nothing to estimate */
      lower: number | null;
      upper: number | null;
    };
    /**
     * @description within the 95 % limits; notable: beyond them; outlier: beyond the 99.8 % limits. null when n = 0
     * @enum {string}
     */
    FunnelBand: 'within' | 'notable' | 'outlier';
    /**
     * @description Which side of the limits the rate lies beyond; null when within
     * @enum {string}
     */
    FunnelSide: 'above' | 'below';
    /**
     * @description The side read through the measure’s direction: better or worse than expected
     * @enum {string}
     */
    FlagAssessment: 'better' | 'worse';
    FlagDto: {
      /** @description within the 95 % limits; notable: beyond them; outlier: beyond the 99.8 % limits. null when n = 0 */
      band: components['schemas']['FunnelBand'] | null;
      /** @description Which side of the limits the rate lies beyond; null when within */
      side: components['schemas']['FunnelSide'] | null;
      /** @description The side read through the measure’s direction: better or worse than expected */
      assessment: components['schemas']['FlagAssessment'] | null;
    };
    CaseMixDto: {
      /** @description O: events observed */
      observed: number;
      /** @description E: events expected from the region’s stratum rates (indirect standardisation) */
      expected: number;
      /** @description O/E; null when E = 0 */
      ratio: number | null;
      /** @description Exact (Garwood) 95 % interval of O/E */
      interval: components['schemas']['IntervalDto'];
      /** @description (O/E) × the region’s rate */
      adjustedRate: number | null;
    };
    BenchmarkCellDto: {
      /** @example hba1c */
      measure: string;
      /** @description The denominator: eligible or measured, as the measure declares */
      n: number;
      events: number;
      /** @description events / n; null when n = 0 */
      rate: number | null;
      /** @description Wilson 95 % interval of the rate */
      interval: components['schemas']['IntervalDto'];
      /** @description Against the exact binomial funnel limits */
      exact: components['schemas']['FlagDto'];
      /** @description Against the over-dispersion-adjusted limits */
      adjusted: components['schemas']['FlagDto'];
      caseMix: components['schemas']['CaseMixDto'];
      /** @description Records to change to reach the region’s median rate (0 at or beyond it); null when n = 0 */
      improvementPotential: number | null;
    };
    BenchmarkPracticeDto: {
      practice: components['schemas']['PracticeDto'];
      /** @example HRN */
      localityCode: string | null;
      /** @description The current submission its figures come from */
      submissionId: number;
      records: components['schemas']['RecordCountsDto'];
      /** @description Clinical data-quality flags of its submission (every check, 0 included) */
      dataQuality: components['schemas']['DataQualityCountDto'][];
      /** @description One per measure, in `measures` order */
      cells: components['schemas']['BenchmarkCellDto'][];
    };
    BenchmarkPageDto: {
      /** @description This page, from 1 */
      page: number;
      /** @description Practices per page */
      pageSize: number;
      /** @description Pages in all (at least 1) */
      pages: number;
      /** @description Practices with a current submission in all pages (of the locality when filtered) */
      total: number;
    };
    BenchmarkCoverageDto: {
      /** @description Active practices of the region (of the locality when filtered) */
      practices: number;
      /** @description Practices with a current submission for the quarter */
      withSubmission: number;
      /** @description Active practices without a current submission: missing, never counted as zero */
      missing: components['schemas']['PracticeDto'][];
    };
    RegionBenchmarkDto: {
      /** @description no-accepted-submissions: nobody has a current submission for the quarter yet */
      state: components['schemas']['BenchmarkState'];
      quarter: components['schemas']['QuarterDto'];
      /** @example cairn-default-2026.1 */
      measureSetId: string;
      split: components['schemas']['TypeSplit'];
      /** @description The locality filter, if any */
      locality: components['schemas']['LocalityDto'] | null;
      /** @description The region’s localities (for a filter) */
      localities: components['schemas']['LocalityDto'][];
      /** @description null when there is no result */
      builtFrom: components['schemas']['BuiltFromDto'] | null;
      /** @description Care processes first, then treatment targets */
      measures: components['schemas']['MeasureDto'][];
      /** @description One per measure, in `measures` order */
      region: components['schemas']['RegionMeasureDto'][];
      /** @description Practices with a current submission, by code: this page of them */
      practices: components['schemas']['BenchmarkPracticeDto'][];
      /** @description Which page of the practices this is */
      page: components['schemas']['BenchmarkPageDto'];
      coverage: components['schemas']['BenchmarkCoverageDto'];
      /** @description The clinical caution to show with these figures */
      caution: string;
    };
    FunnelOverdispersionDto: {
      /** @description φ: mean of the Winsorised z² */
      phi: number | null;
      /** @description τ²: the additive between-unit variance */
      tau2: number | null;
      /** @description I·φ above the χ²(I − 1) 95 % point */
      present: boolean;
      /** @description I·φ */
      statistic: number | null;
      /** @description The χ²(I − 1) 95 % point */
      critical: number | null;
      /** @description The z-scores’ 10th and 90th percentiles the Winsorising clips to */
      bounds: components['schemas']['IntervalDto'] | null;
    };
    FlagWithLimitsDto: {
      /** @description within the 95 % limits; notable: beyond them; outlier: beyond the 99.8 % limits. null when n = 0 */
      band: components['schemas']['FunnelBand'] | null;
      /** @description Which side of the limits the rate lies beyond; null when within */
      side: components['schemas']['FunnelSide'] | null;
      /** @description The side read through the measure’s direction: better or worse than expected */
      assessment: components['schemas']['FlagAssessment'] | null;
      /** @description The 95 % limits at this n */
      inner: components['schemas']['IntervalDto'];
      /** @description The 99.8 % limits at this n */
      outer: components['schemas']['IntervalDto'];
    };
    FunnelPointDto: {
      practice: components['schemas']['PracticeDto'];
      localityCode: string | null;
      n: number;
      events: number;
      rate: number | null;
      /** @description Wilson 95 % interval */
      interval: components['schemas']['IntervalDto'];
      /** @description (rate − θ₀) / √(θ₀(1 − θ₀)/n) */
      z: number | null;
      /** @description Exact binomial limits at its n, and its flag */
      exact: components['schemas']['FlagWithLimitsDto'];
      /** @description Over-dispersion-adjusted limits at its n, and its flag */
      adjusted: components['schemas']['FlagWithLimitsDto'];
      caseMix: components['schemas']['CaseMixDto'];
      improvementPotential: number | null;
    };
    FunnelLimitCurvesDto: {
      /** @description 95 % lower limit at each n of the grid */
      innerLower: number[];
      innerUpper: number[];
      /** @description 99.8 % lower limit at each n of the grid */
      outerLower: number[];
      outerUpper: number[];
    };
    FunnelCurvesDto: {
      /** @description The grid of n the curves are drawn at */
      n: number[];
      /** @description Exact binomial limits */
      exact: components['schemas']['FunnelLimitCurvesDto'];
      /** @description Over-dispersion-adjusted limits; null when no over-dispersion is present */
      adjusted: components['schemas']['FunnelLimitCurvesDto'] | null;
    };
    MeasureFunnelDto: {
      state: components['schemas']['BenchmarkState'];
      quarter: components['schemas']['QuarterDto'];
      measureSetId: string;
      builtFrom: components['schemas']['BuiltFromDto'] | null;
      measure: components['schemas']['MeasureDto'];
      split: components['schemas']['TypeSplit'];
      /** @description null when there is no result */
      region: components['schemas']['RegionMeasureDto'] | null;
      /** @description φ, τ², whether present, the χ² statistic and its critical value */
      overdispersion: components['schemas']['FunnelOverdispersionDto'] | null;
      /** @description Every practice with a current submission */
      points: components['schemas']['FunnelPointDto'][];
      /** @description null when θ₀ is 0, 1 or unknown */
      curves: components['schemas']['FunnelCurvesDto'] | null;
      /** @description Active practices without a current submission */
      missing: components['schemas']['PracticeDto'][];
      caution: string;
    };
    TrendQuarterDto: {
      quarterId: number;
      /** @example 2026 Q2 */
      quarterLabel: string;
      /** @description The measure set of that quarter */
      measureSetId: string;
      /** @description What that quarter’s figures were built from; null: no current submission then */
      builtFrom: components['schemas']['BuiltFromDto'] | null;
      /** @description Whether that quarter’s measure set has the measure */
      hasMeasure: boolean;
    };
    /**
     * @description value: figures below; no-submission: no current submission that quarter (a gap); not-in-measure-set: that quarter’s measure set has no such measure (a gap)
     * @enum {string}
     */
    TrendPointState: 'value' | 'no-submission' | 'not-in-measure-set';
    TrendPointDto: {
      /** @description value: figures below; no-submission: no current submission that quarter (a gap); not-in-measure-set: that quarter’s measure set has no such measure (a gap) */
      state: components['schemas']['TrendPointState'];
      events: number;
      n: number;
      /** @description null for a gap or n = 0 */
      rate: number | null;
    };
    RunsLimitsDto: {
      lower: number;
      upper: number;
    };
    /** @enum {string} */
    ShiftSide: 'above' | 'below';
    RunShiftDto: {
      /** @description Index of the first point (into points) */
      start: number;
      /** @description Index of the last point */
      end: number;
      /** @description Points in the shift */
      length: number;
      side: components['schemas']['ShiftSide'];
    };
    /** @enum {string} */
    TrendDirection: 'up' | 'down';
    RunTrendDto: {
      /** @description Index of the first point (into points) */
      start: number;
      /** @description Index of the last point */
      end: number;
      length: number;
      direction: components['schemas']['TrendDirection'];
    };
    RunChartSignalsDto: {
      /** @description The centre line (median of the rates) */
      median: number | null;
      /** @description Points neither missing nor on the median */
      usefulObservations: number;
      runs: number;
      /** @description Fewest and most runs expected by chance; null under 10 useful points */
      runsLimits: components['schemas']['RunsLimitsDto'] | null;
      tooFewRuns: boolean;
      tooManyRuns: boolean;
      /** @description 6 or more points on one side of the median */
      shifts: components['schemas']['RunShiftDto'][];
      /** @description 5 or more points all going up or all down */
      trends: components['schemas']['RunTrendDto'][];
    };
    RateTrendDto: {
      /** @description Oldest quarter first: points[i] is the response’s quarters[i] */
      points: components['schemas']['TrendPointDto'][];
      signals: components['schemas']['RunChartSignalsDto'];
    };
    PracticeTrendDto: {
      practice: components['schemas']['PracticeDto'];
      trend: components['schemas']['RateTrendDto'];
    };
    BenchmarkTrendDto: {
      /** @description The latest quarter of the series */
      quarter: components['schemas']['QuarterDto'];
      measure: components['schemas']['MeasureDto'];
      split: components['schemas']['TypeSplit'];
      /** @description Every quarter of the region up to this one, oldest first */
      quarters: components['schemas']['TrendQuarterDto'][];
      /** @description The region’s pooled rate per quarter */
      region: components['schemas']['RateTrendDto'];
      /** @description Every practice of the region, by code */
      practices: components['schemas']['PracticeTrendDto'][];
    };
    /**
     * @description no-current-submission: the practice has no confirmed extract for the quarter
     * @enum {string}
     */
    PracticeResultsState: 'results' | 'no-current-submission';
    PracticeSubmissionRefDto: {
      id: number;
      /** @description Records it holds */
      records: number;
      /** @description ISO 8601 */
      confirmedAt: string;
    };
    ResultsActionsDto: {
      /** @description Whether the reader may upload an extract for this practice and quarter */
      upload: boolean;
      /** @example /extracts/upload?practice=12&quarter=8 */
      uploadPath: string | null;
    };
    /**
     * @description applied: region figures and peers are under disclosure control (counts 1–4 as “< 5”, rates of fewer than 10 withheld); none: the reader may see every practice
     * @enum {string}
     */
    PeerDisclosure: 'applied' | 'none';
    SeriesQuarterDto: {
      quarterId: number;
      /** @example 2026 Q2 */
      quarterLabel: string;
      /** @description The measure set of that quarter */
      measureSetId: string;
      /** @description What that quarter’s figures were built from; null: no current submission then */
      builtFrom: components['schemas']['BuiltFromDto'] | null;
    };
    OwnFiguresDto: {
      n: number;
      events: number;
      rate: number | null;
      /** @description Wilson 95 % interval */
      interval: components['schemas']['IntervalDto'];
      /** @description The exact funnel limits at its n and its flag */
      exact: components['schemas']['FlagWithLimitsDto'];
      /** @description The over-dispersion-adjusted limits at its n and its flag */
      adjusted: components['schemas']['FlagWithLimitsDto'];
      caseMix: components['schemas']['CaseMixDto'];
    };
    DisclosedCountDto: {
      /** @description null when suppressed */
      value: number | null;
      /**
       * @description The count as printed: the number, “< 5” or “withheld”
       * @example < 5
       */
      display: string;
    };
    RegionFiguresDto: {
      /** @description θ₀: the region’s pooled rate */
      rate: number | null;
      /** @description Median of the practices’ rates */
      median: number | null;
      events: components['schemas']['DisclosedCountDto'];
      n: components['schemas']['DisclosedCountDto'];
      /** @description Practices with n > 0 */
      practices: number;
      /** @description Over-dispersion present (the adjusted limits are wider) */
      overdispersion: boolean;
    };
    ChangeDto: {
      previousQuarterId: number;
      previousQuarterLabel: string;
      previousRate: number;
      /** @description This quarter’s rate minus the previous (a proportion) */
      difference: number;
    };
    ImprovementDto: {
      /** @description k: records that would need this done (higher is better) or no longer counted (lower is better) to bring the practice to the region median; 0 at or beyond it; null when n = 0 */
      records: number | null;
      /** @description The region median it is measured against */
      median: number | null;
    };
    PeerPointsDto: {
      /** @description n of each other practice shown, ascending */
      n: number[];
      /** @description Its rate (same order) */
      rate: number[];
      /** @description Other practices not shown: n under 10 or 1–4 events (disclosure control), or n = 0 */
      withheld: number;
    };
    PracticeSplitResultDto: {
      split: components['schemas']['TypeSplit'];
      own: components['schemas']['OwnFiguresDto'];
      region: components['schemas']['RegionFiguresDto'];
      /** @description null when the previous quarter has no rate to compare */
      change: components['schemas']['ChangeDto'] | null;
      improvement: components['schemas']['ImprovementDto'];
      /** @description Every quarter of the region up to this one, with run-chart signals */
      trend: components['schemas']['RateTrendDto'];
      /** @description The region’s pooled rate over the same quarters */
      regionTrend: components['schemas']['RateTrendDto'];
      /** @description The other practices as unnamed points */
      peers: components['schemas']['PeerPointsDto'];
    };
    PracticeMeasureResultDto: {
      measure: components['schemas']['MeasureDto'];
      /** @description all; type 1; type 2 and other */
      splits: components['schemas']['PracticeSplitResultDto'][];
    };
    PracticeResultsDto: {
      /** @description no-current-submission: the practice has no confirmed extract for the quarter */
      state: components['schemas']['PracticeResultsState'];
      /** @description What the state means, in words */
      message: string | null;
      practice: components['schemas']['PracticeDto'];
      quarter: components['schemas']['QuarterDto'];
      measureSetId: string;
      submission: components['schemas']['PracticeSubmissionRefDto'] | null;
      builtFrom: components['schemas']['BuiltFromDto'] | null;
      actions: components['schemas']['ResultsActionsDto'];
      /** @description applied: region figures and peers are under disclosure control (counts 1–4 as “< 5”, rates of fewer than 10 withheld); none: the reader may see every practice */
      disclosure: components['schemas']['PeerDisclosure'];
      records: components['schemas']['RecordCountsDto'] | null;
      /** @description Every quarter of the region up to this one, oldest first: the quarters of every trend below */
      quarters: components['schemas']['SeriesQuarterDto'][];
      /** @description Care processes first, then treatment targets */
      measures: components['schemas']['PracticeMeasureResultDto'][];
      /** @description Clinical data-quality flags of its current submission */
      dataQuality: components['schemas']['DataQualityCountDto'][];
      caution: string;
    };
    DetailOwnCountsDto: {
      events: number;
      n: number;
      rate: number | null;
      /** @description Wilson 95 % interval */
      interval: components['schemas']['IntervalDto'];
    };
    DetailRegionCountsDto: {
      events: components['schemas']['DisclosedCountDto'];
      n: components['schemas']['DisclosedCountDto'];
      /** @description null when n = 0 or withheld */
      rate: number | null;
    };
    DetailCellDto: {
      /** @description Category key (“everyone” for the whole split) */
      category: string;
      practice: components['schemas']['DetailOwnCountsDto'];
      /** @description The region, this practice included */
      region: components['schemas']['DetailRegionCountsDto'];
    };
    DetailBreakdownDto: {
      /** @example age_band */
      breakdown: string;
      /** @description One per category, in the breakdown’s order */
      cells: components['schemas']['DetailCellDto'][];
    };
    DetailSplitDto: {
      split: components['schemas']['TypeSplit'];
      everyone: components['schemas']['DetailCellDto'];
      breakdowns: components['schemas']['DetailBreakdownDto'][];
    };
    DetailMeasureDto: {
      measure: string;
      splits: components['schemas']['DetailSplitDto'][];
    };
    KidneyRowDto: {
      /**
       * @description A row of `rows`
       * @example G3a
       */
      row: string;
      /** @description The practice’s count per albuminuria column */
      practice: number[];
      /** @description The region’s count per column, this practice included, as shown */
      region: components['schemas']['DisclosedCountDto'][];
    };
    KidneySplitDto: {
      split: components['schemas']['TypeSplit'];
      /** @description One per GFR row, in `rows` order */
      rows: components['schemas']['KidneyRowDto'][];
    };
    KidneyGridDto: {
      /** @description GFR categories (KDIGO 2012) and why eGFR is unknown */
      rows: string[];
      /** @description Albuminuria categories (KDIGO 2012) and no ACR */
      columns: string[];
      splits: components['schemas']['KidneySplitDto'][];
    };
    SurvivalStepDto: {
      /** @description Whole years since diagnosis */
      time: number;
      atRisk: components['schemas']['DisclosedCountDto'];
      events: components['schemas']['DisclosedCountDto'];
      /** @description S(t); null when withheld */
      survival: number | null;
      /** @description Greenwood standard error */
      standardError: number | null;
    };
    SurvivalDto: {
      /** @description People with type 2 in the estimate */
      n: components['schemas']['DisclosedCountDto'];
      /** @description Insulin starts */
      events: components['schemas']['DisclosedCountDto'];
      /** @description Left out for incomplete or inconsistent insulin data */
      excluded: number;
      /** @description Median years to insulin; null when survival stays above ½ */
      median: number | null;
      /** @description Kaplan–Meier steps */
      steps: components['schemas']['SurvivalStepDto'][];
    };
    ProgressionDto: {
      practice: components['schemas']['SurvivalDto'];
      /** @description The region, this practice included */
      region: components['schemas']['SurvivalDto'];
      /** @description A rule of thumb of the field for type 2 (years from diagnosis to insulin), for reference only */
      ruleOfThumbYears: number;
    };
    HistogramCountsDto: {
      notRecorded: components['schemas']['DisclosedCountDto'];
      /** @description Below the first edge */
      below: components['schemas']['DisclosedCountDto'];
      /** @description Bin i: edges[i] ≤ value < edges[i + 1] */
      bins: components['schemas']['DisclosedCountDto'][];
      /** @description At or above the last edge */
      above: components['schemas']['DisclosedCountDto'];
    };
    HistogramSplitDto: {
      split: components['schemas']['TypeSplit'];
      practice: components['schemas']['HistogramCountsDto'];
      region: components['schemas']['HistogramCountsDto'];
    };
    ValueHistogramDto: {
      /** @example hba1c */
      key: string;
      /** @example HbA1c */
      label: string;
      /** @example mmol/mol */
      unit: string;
      edges: number[];
      splits: components['schemas']['HistogramSplitDto'][];
    };
    PracticeDetailDto: {
      /** @description The breakdowns and their categories */
      breakdowns: components['schemas']['BreakdownDto'][];
      /** @description Per measure and split, by breakdown category */
      measures: components['schemas']['DetailMeasureDto'][];
      kidney: components['schemas']['KidneyGridDto'];
      /** @description Type 2: time from diagnosis to insulin */
      progression: components['schemas']['ProgressionDto'];
      values: components['schemas']['ValueHistogramDto'][];
    };
    PracticeResultsDetailDto: {
      /** @description no-current-submission: the practice has no confirmed extract for the quarter, so no detail */
      state: components['schemas']['PracticeResultsState'];
      /** @description The practice the detail is of */
      practice: components['schemas']['PracticeDto'];
      /** @description The audit quarter the detail is of */
      quarter: components['schemas']['QuarterDto'];
      /** @description The stored result the detail was built from: the same resultId as the results it goes with; null without a current submission */
      builtFrom: components['schemas']['BuiltFromDto'] | null;
      /** @description applied: the region’s counts are under disclosure control (counts 1–4 as “< 5”, rates of fewer than 10 withheld); none: shown in full */
      disclosure: components['schemas']['PeerDisclosure'];
      /** @description Breakdowns, kidney grid, time to insulin and value histograms, the practice against the region; null without a current submission or without the sums to build it from */
      detail: components['schemas']['PracticeDetailDto'] | null;
      /** @description The clinical caution to show with these figures */
      caution: string;
    };
    RecallSubmissionDto: {
      /** @description The current submission the list is read from */
      id: number;
      /** @description Records it holds */
      records: number;
      /** @description ISO 8601 */
      confirmedAt: string;
    };
    /**
     * @description Which reference `reference` holds: the practice’s own, or the pseudonym
     * @enum {string}
     */
    RecordReferenceKind: 'record_ref' | 'pseudonym';
    RecallCountsDto: {
      /** @description Eligible records of the split */
      eligible: number;
      /** @description Records in the measure’s denominator (n) */
      denominator: number;
      /** @description Records on the list: those that count against the practice on this measure (higher is better: n − met; lower is better: the records counted) */
      listed: number;
    };
    /** @enum {string} */
    Sex: 'F' | 'M' | 'X' | 'U';
    /** @enum {string} */
    RecallReason: 'not_recorded' | 'not_measured' | 'not_met' | 'adverse_result';
    RecallMissingPartDto: {
      /** @example bp_target */
      key: string;
      label: string;
    };
    RecallReadingDto: {
      field: components['schemas']['ReadingField'];
      /** @example HbA1c */
      label: string;
      /**
       * @description Month last recorded; null when never recorded, or for a yes/no fact
       * @example 2026-03
       */
      month: string | null;
      /** @description Recorded in the measure’s window (a yes/no fact: recorded at all) */
      counts: boolean;
      /** @example 62 mmol/mol */
      value: string | null;
      /** @description The value’s numbers in canonical units (blood pressure: systolic, diastolic) */
      numbers: number[];
      /** @example 62 mmol/mol in 2026-03 */
      text: string;
    };
    RecallItemDto: {
      /** @description Row of the extract the record came from */
      row: number;
      /** @description The practice’s own record reference (its leads) or the record’s pseudonym (everyone else); see recordReferences */
      reference: string;
      /** @example 1961 */
      birthYear: number;
      /** @description Age at the end of the review window */
      age: number;
      /** @example 40–64 */
      ageBand: string;
      sex: components['schemas']['Sex'];
      diabetesType: components['schemas']['DiabetesType'];
      reason: components['schemas']['RecallReason'];
      /** @example Latest result does not meet the target */
      reasonText: string;
      /** @description Month the measure’s field was last recorded (measures of one field) */
      lastRecorded: string | null;
      /** @description The value that fails the target, “not measured”, or the recorded value */
      value: string | null;
      /** @description Parts of a composite not met */
      missing: components['schemas']['RecallMissingPartDto'][];
      readings: components['schemas']['RecallReadingDto'][];
      /** @description The line explained in one sentence */
      detail: string;
    };
    RecallListDto: {
      practice: components['schemas']['PracticeRefDto'];
      quarter: components['schemas']['QuarterDto'];
      /** @example cairn-default-2026.1 */
      measureSetId: string;
      measure: components['schemas']['MeasureDto'];
      split: components['schemas']['TypeSplit'];
      submission: components['schemas']['RecallSubmissionDto'];
      /** @description Which reference `reference` holds: the practice’s own, or the pseudonym */
      recordReferences: components['schemas']['RecordReferenceKind'];
      counts: components['schemas']['RecallCountsDto'];
      /** @description Lines on the whole list (counts.listed) */
      total: number;
      offset: number;
      limit: number;
      /** @description This page, in extract row order */
      items: components['schemas']['RecallItemDto'][];
    };
    MeasureSetRefDto: {
      /** @example cairn-default-2026.1 */
      id: string;
      /** @example Cairn default measure set 2026.1 */
      label: string;
    };
    QuarterReportDto: {
      id: number;
      label: string;
      /** @example published */
      status: string;
      /** @description ISO 8601 */
      publishedAt: string;
    };
    QuarterActionsDto: {
      close: boolean;
      reopen: boolean;
      changeDeadline: boolean;
      /** @description Only while the quarter is open and no report has been published from it */
      changeMeasureSet: boolean;
    };
    AuditQuarterDto: {
      quarter: components['schemas']['QuarterDto'];
      measureSet: components['schemas']['MeasureSetRefDto'];
      /** @description Practices with a current submission, awaiting confirmation, or none (regional lead and auditor; null for others) */
      coverage: components['schemas']['CoverageTotalsDto'] | null;
      /** @description Reports published from it, newest first */
      reports: components['schemas']['QuarterReportDto'][];
      actions: components['schemas']['QuarterActionsDto'];
    };
    NextQuarterDto: {
      /** @example 2026 */
      year: number;
      /**
       * @example 4
       * @enum {number}
       */
      quarter: 1 | 2 | 3 | 4;
      /** @example 2026 Q4 */
      label: string;
      /**
       * @description First month of the review window
       * @example 2026-01
       */
      windowStart: string;
      /**
       * @description Last month of the review window
       * @example 2026-12
       */
      windowEnd: string;
      /**
       * @description Last day of the quarter
       * @example 2026-12-31
       */
      quarterEnd: string;
      /** @example 2027-02-14 */
      defaultDeadline: string;
      /** @example cairn-default-2026.1 */
      defaultMeasureSetId: string | null;
    };
    AuditQuartersActionsDto: {
      /** @description Open the next quarter */
      open: boolean;
    };
    AuditQuartersDto: {
      /** @description Latest first */
      quarters: components['schemas']['AuditQuarterDto'][];
      next: components['schemas']['NextQuarterDto'];
      /** @description The published measure-set versions a quarter of the region may use */
      measureSets: components['schemas']['MeasureSetRefDto'][];
      actions: components['schemas']['AuditQuartersActionsDto'];
    };
    PublishReportDto: {
      /**
       * @description What readers should know about this report (kept with it for good)
       * @example Second quarter of the new foot-surveillance measure; OV303 had not submitted.
       */
      releaseNote: string;
    };
    /** @enum {string} */
    ReportStatus: 'published' | 'replaced' | 'withdrawn';
    ReportRefDto: {
      id: number;
      /** @example 2026 Q3 · report 2 */
      label: string;
    };
    ReportWithdrawalDto: {
      /** @description ISO 8601 */
      at: string;
      /** @example Imogen Varley */
      by: string;
      reason: string;
    };
    ReportActionsDto: {
      /** @description The reader may withdraw this report */
      withdraw: boolean;
      /** @description The reader may read the region’s figures, data pack and PDF */
      region: boolean;
    };
    ReportDto: {
      id: number;
      /** @example 2026 Q3 · report 1 */
      label: string;
      /** @description The how-manieth report of its quarter (1, 2, …) */
      sequence: number;
      quarterId: number;
      /** @example 2026 Q3 */
      quarterLabel: string;
      /** @example cairn-default-2026.1 */
      measureSetId: string;
      status: components['schemas']['ReportStatus'];
      /** @description ISO 8601 */
      publishedAt: string;
      /** @example Imogen Varley */
      publishedBy: string;
      releaseNote: string;
      /**
       * @description SHA-256 (hex) of the report’s canonical bytes
       * @example 3f1c…
       */
      contentHash: string;
      /** @description Submissions the figures were computed from */
      submissionCount: number;
      /** @description The report that replaced it */
      replacedBy: components['schemas']['ReportRefDto'] | null;
      withdrawal: components['schemas']['ReportWithdrawalDto'] | null;
      /**
       * @description The report’s permanent page
       * @example /reports/12
       */
      permalink: string;
      /** @description The practices whose part the reader may open: every practice of the report for regional leads and auditors, their own for practice leads */
      practices: components['schemas']['PracticeDto'][];
      actions: components['schemas']['ReportActionsDto'];
    };
    ReportListActionsDto: {
      /** @description The reader may publish a report of the quarter asked for (false without one) */
      publish: boolean;
    };
    ReportListDto: {
      /** @description Newest first */
      reports: components['schemas']['ReportDto'][];
      actions: components['schemas']['ReportListActionsDto'];
    };
    /** @enum {string} */
    DisclosureSuppression: 'none' | 'primary' | 'secondary';
    DisclosedCellDto: {
      /** @description null when suppressed */
      value: number | null;
      /** @example < 5 */
      display: string;
      suppression: components['schemas']['DisclosureSuppression'];
    };
    PeerRowDto: {
      practice: components['schemas']['PracticeDto'];
      /** @description The reader’s own practice (shown in full) */
      own: boolean;
      /** @description People who met the measure */
      met: components['schemas']['DisclosedCellDto'];
      /** @description People who did not */
      notMet: components['schemas']['DisclosedCellDto'];
      /** @description The denominator (met + not met) */
      n: components['schemas']['DisclosedCellDto'];
      /** @description met / n; null when withheld */
      rate: number | null;
    };
    PeerTableDto: {
      /** @example hba1c_target */
      measure: string;
      /** @example all */
      split: string;
      rows: components['schemas']['PeerRowDto'][];
      met: components['schemas']['DisclosedCellDto'];
      notMet: components['schemas']['DisclosedCellDto'];
      n: components['schemas']['DisclosedCellDto'];
      rate: number | null;
      /** @description No suppression pattern could protect every count: the table is withheld */
      withheld: boolean;
    };
    ReportRegionDto: {
      report: components['schemas']['ReportDto'];
      /** @description Every practice on every measure: everyone, type 1, type 2 and other */
      splits: components['schemas']['RegionBenchmarkDto'][];
      /** @description Each measure’s funnel (everyone) */
      funnels: components['schemas']['MeasureFunnelDto'][];
      /** @description Each measure over the quarters up to this one */
      trends: components['schemas']['BenchmarkTrendDto'][];
      /** @description Each measure’s table under disclosure control, as handed beyond the practices */
      peerTables: components['schemas']['PeerTableDto'][];
      caution: string;
    };
    /** @enum {string} */
    ReportPracticeState: 'results' | 'not-in-report';
    PracticeResultsWithDetailDto: {
      /** @description no-current-submission: the practice has no confirmed extract for the quarter */
      state: components['schemas']['PracticeResultsState'];
      /** @description What the state means, in words */
      message: string | null;
      practice: components['schemas']['PracticeDto'];
      quarter: components['schemas']['QuarterDto'];
      measureSetId: string;
      submission: components['schemas']['PracticeSubmissionRefDto'] | null;
      builtFrom: components['schemas']['BuiltFromDto'] | null;
      actions: components['schemas']['ResultsActionsDto'];
      /** @description applied: region figures and peers are under disclosure control (counts 1–4 as “< 5”, rates of fewer than 10 withheld); none: the reader may see every practice */
      disclosure: components['schemas']['PeerDisclosure'];
      records: components['schemas']['RecordCountsDto'] | null;
      /** @description Every quarter of the region up to this one, oldest first: the quarters of every trend below */
      quarters: components['schemas']['SeriesQuarterDto'][];
      /** @description Care processes first, then treatment targets */
      measures: components['schemas']['PracticeMeasureResultDto'][];
      /** @description Clinical data-quality flags of its current submission */
      dataQuality: components['schemas']['DataQualityCountDto'][];
      caution: string;
      /** @description Breakdowns, kidney grid, time to insulin and value histograms, the practice against the region */
      detail: components['schemas']['PracticeDetailDto'] | null;
    };
    ReportPracticeDto: {
      report: components['schemas']['ReportDto'];
      practice: components['schemas']['PracticeDto'];
      state: components['schemas']['ReportPracticeState'];
      /** @description Why there are no results */
      message: string | null;
      /** @description As frozen: in full for the region’s readers, under disclosure control for practice leads */
      results: components['schemas']['PracticeResultsWithDetailDto'] | null;
      /** @description Each measure: this practice in full, every other practice under disclosure control */
      peers: components['schemas']['PeerTableDto'][];
      caution: string;
    };
    WithdrawReportDto: {
      /** @example A practice’s extract was found to hold another quarter’s records. */
      reason: string;
    };
    /** @enum {string} */
    MailKind: 'quarter_opened' | 'deadline_reminder' | 'review_case_question' | 'digest';
    OutboxCountsDto: {
      queued: number;
      sending: number;
      sent: number;
      failed: number;
      total: number;
    };
    DeliverySourceActionsDto: {
      /** @description Whether failed messages can be sent again */
      resendFailed: boolean;
    };
    DeliverySourceDto: {
      kind: components['schemas']['MailKind'];
      /** @description What the messages are about (an audit quarter id) */
      sourceId: number;
      /** @example 2026 Q4 opening message */
      label: string;
      /** @description When the first message was queued, ISO 8601 */
      firstQueuedAt: string;
      /** @description The latest queueing or attempt, ISO 8601 */
      lastActivityAt: string;
      /** @description Practices the source was sent for */
      practices: number;
      /** @description Practices that had nobody to write to (no active lead receiving this kind) */
      practicesWithoutRecipients: number;
      counts: components['schemas']['OutboxCountsDto'];
      actions: components['schemas']['DeliverySourceActionsDto'];
    };
    DeliverySourceListDto: {
      /** @description Latest first */
      sources: components['schemas']['DeliverySourceDto'][];
    };
    /** @enum {string} */
    OutboxState: 'queued' | 'sending' | 'sent' | 'failed';
    DeliveryMessageActionsDto: {
      /** @description Whether this (failed) message can be sent again */
      resend: boolean;
    };
    DeliveryMessageDto: {
      id: number;
      practice: components['schemas']['PracticeRefDto'];
      /** @example priya.calloway@quarrybank.example */
      recipient: string;
      /** @description The person's name, when a lead */
      recipientName: string | null;
      state: components['schemas']['OutboxState'];
      /** @description Attempts so far (since the last resend) */
      attempts: number;
      /** @description Times the message was taken up again after its sender stopped mid-send (it may then have arrived twice, with the same Message-ID) */
      resumed: number;
      /** @description ISO 8601 */
      queuedAt: string;
      /** @description The next attempt (queued), ISO 8601 */
      nextAttemptAt: string | null;
      /** @description ISO 8601 */
      lastAttemptAt: string | null;
      /** @description When the server accepted it, ISO 8601 */
      sentAt: string | null;
      /** @description ISO 8601 */
      failedAt: string | null;
      /** @description The server's reply to the last failed attempt, or what went wrong */
      lastError: string | null;
      /** @description Its SMTP reply code, if any */
      lastReplyCode: number | null;
      /** @example <outbox-42.region-1@cairn.example.org> */
      messageId: string | null;
      actions: components['schemas']['DeliveryMessageActionsDto'];
    };
    DeliveryDetailDto: {
      source: components['schemas']['DeliverySourceDto'];
      /** @description Failed first, then by practice */
      messages: components['schemas']['DeliveryMessageDto'][];
      /** @description Practices that had nobody to write to */
      practicesWithoutRecipients: components['schemas']['PracticeRefDto'][];
    };
    ResendResultDto: {
      /** @description Messages queued again */
      resent: number;
      delivery: components['schemas']['DeliveryDetailDto'];
    };
    PracticeLeadRecipientDto: {
      userId: number;
      displayName: string;
      email: string;
      /** @description Kinds of e-mail this lead chose not to receive (on their profile) */
      optedOut: components['schemas']['MailKind'][];
    };
    ExtraRecipientActionsDto: {
      remove: boolean;
    };
    ExtraRecipientDto: {
      id: number;
      /** @example reception@quarrybank.example */
      address: string;
      /** @example Practice manager */
      note: string | null;
      /** @description Who added it (e-mail address) */
      addedBy: string;
      /** @description ISO 8601 */
      addedAt: string;
      actions: components['schemas']['ExtraRecipientActionsDto'];
    };
    PracticeRecipientsActionsDto: {
      /** @description Whether another address can be added */
      addRecipient: boolean;
    };
    PracticeRecipientsDto: {
      practice: components['schemas']['PracticeDto'];
      /** @description Active practice leads */
      leads: components['schemas']['PracticeLeadRecipientDto'][];
      /** @description Addresses the regional lead added */
      extras: components['schemas']['ExtraRecipientDto'][];
      actions: components['schemas']['PracticeRecipientsActionsDto'];
    };
    MailRecipientsDto: {
      /** @description The region's active practices */
      practices: components['schemas']['PracticeRecipientsDto'][];
      /** @description Extra addresses a practice may have at most */
      maxExtrasPerPractice: number;
    };
    AddExtraRecipientDto: {
      /** @example reception@quarrybank.example */
      address: string;
      /** @description Who this is, for the regional lead (e.g. "Practice manager") */
      note?: string;
    };
    MailPreferenceDto: {
      kind: components['schemas']['MailKind'];
      /** @example Submission deadline reminders */
      label: string;
      description: string;
      /** @description Who is sent it */
      sentTo: components['schemas']['Role'][];
      /** @description Whether your role is sent this kind */
      appliesToYou: boolean;
      /** @description False when you chose not to receive it */
      receive: boolean;
    };
    MailPreferencesDto: {
      preferences: components['schemas']['MailPreferenceDto'][];
    };
    UpdateMailPreferencesDto: {
      /** @description Every kind of e-mail you do not want (an empty list: receive them all) */
      optedOut: components['schemas']['MailKind'][];
    };
    /** @enum {string} */
    OutlierLevel: 'outer' | 'inner';
    /** @enum {string} */
    OutlierAssessment: 'worse' | 'better';
    /** @enum {string} */
    EvidenceOrigin: 'draft' | 'report';
    OutlierBasisDto: {
      origin: components['schemas']['EvidenceOrigin'];
      resultId: number;
      key: string;
      measureSetId: string;
      builtAt: string;
    };
    OutlierMeasureDto: {
      key: string;
      label: string;
      /** @enum {string} */
      direction: 'higher' | 'lower';
      /** @description The guideline behind it */
      source: string;
    };
    CaseEvidenceDto: {
      /** @description draft: the draft benchmark; report: a published report */
      origin: components['schemas']['EvidenceOrigin'];
      /** @description The stored result or snapshot it was read from */
      resultId: number;
      /** @description What identifies its inputs */
      key: string;
      measureSetId: string;
      /** @description When the benchmark was built (ISO 8601) */
      builtAt: string;
      n: number;
      events: number;
      rate: number | null;
      /** @description Lower end of the 95 % interval */
      intervalLower: number | null;
      intervalUpper: number | null;
      /** @description θ₀: the region’s rate */
      theta0: number | null;
      innerLower: number | null;
      innerUpper: number | null;
      outerLower: number | null;
      outerUpper: number | null;
      /** @description within, notable or outlier */
      band: string | null;
      /** @description better or worse than expected */
      assessment: string | null;
      z: number | null;
      phi: number | null;
      tau2: number | null;
      /** @description Case mix O/E */
      observedExpected: number | null;
      /** @description Why it was flagged, in words, when the case opened */
      reason: string;
    };
    /** @enum {string} */
    CaseStatus: 'open' | 'awaiting_practice' | 'responded' | 'closed';
    OpenCaseRefDto: {
      id: number;
      status: components['schemas']['CaseStatus'];
    };
    OutlierRowDto: {
      practice: components['schemas']['PracticeDto'];
      localityCode: string | null;
      measure: components['schemas']['OutlierMeasureDto'];
      /** @enum {string} */
      band: 'notable' | 'outlier';
      /** @enum {string} */
      side: 'above' | 'below';
      assessment: components['schemas']['OutlierAssessment'];
      /** @description The rate judged (crude or case-mix adjusted) */
      rate: number;
      /** @description The limit it lies beyond */
      limit: number;
      /** @description Strength of evidence: z under the limits used */
      z: number;
      evidence: components['schemas']['CaseEvidenceDto'];
      /** @description Consecutive quarters flagged on this side, this one included */
      flaggedQuarters: number;
      /** @description A case not yet closed */
      openCase: components['schemas']['OpenCaseRefDto'] | null;
    };
    OutlierListDto: {
      /** @enum {string} */
      state: 'results' | 'no-accepted-submissions';
      quarter: components['schemas']['QuarterDto'];
      basis: components['schemas']['OutlierBasisDto'] | null;
      level: components['schemas']['OutlierLevel'];
      caseMix: boolean;
      split: components['schemas']['TypeSplit'];
      measures: components['schemas']['OutlierMeasureDto'][];
      localities: components['schemas']['LocalityDto'][];
      /** @description Strongest evidence first */
      rows: components['schemas']['OutlierRowDto'][];
      /** @description Practices judged */
      practices: number;
      /** @description Whether the reader may open cases */
      mayOpenCases: boolean;
      caution: string;
    };
    DrillSplitDto: {
      split: components['schemas']['TypeSplit'];
      own: components['schemas']['OwnFiguresDto'];
      region: components['schemas']['RegionFiguresDto'];
      /** @description null when the previous quarter has no rate to compare */
      change: components['schemas']['ChangeDto'] | null;
      improvement: components['schemas']['ImprovementDto'];
      /** @description Every quarter of the region up to this one, with run-chart signals */
      trend: components['schemas']['RateTrendDto'];
      /** @description The region’s pooled rate over the same quarters */
      regionTrend: components['schemas']['RateTrendDto'];
    };
    DrillBreakdownDto: {
      breakdown: components['schemas']['BreakdownDto'];
      cells: components['schemas']['DetailBreakdownDto'];
    };
    DrillDownDto: {
      practice: components['schemas']['PracticeDto'];
      quarter: components['schemas']['QuarterDto'];
      measure: components['schemas']['MeasureDto'];
      split: components['schemas']['TypeSplit'];
      basis: components['schemas']['OutlierBasisDto'];
      /** @description Its figures and why, in words */
      evidence: components['schemas']['CaseEvidenceDto'];
      /** @description By diabetes type: all, type 1, type 2 and other (trend with run-chart signals) */
      splits: components['schemas']['DrillSplitDto'][];
      /** @description The quarters of each trend’s points, oldest first */
      trendQuarters: string[];
      everyone: components['schemas']['DetailCellDto'] | null;
      /** @description Age band, sex, deprivation, duration: practice against region per category */
      breakdowns: components['schemas']['DrillBreakdownDto'][];
      /** @description Values against the region */
      histogram: components['schemas']['ValueHistogramDto'] | null;
      dataQuality: components['schemas']['DataQualityCountDto'][];
      /** @description Cases on this practice × measure not closed */
      openCases: components['schemas']['OpenCaseRefDto'][];
      mayOpenCase: boolean;
      caution: string;
    };
    DrillRecordDto: {
      /** @description The record’s pseudonym (never the practice’s reference) */
      pseudonym: string;
      birthYear: number;
      /** @description At the end of the review window */
      age: number;
      sex: string;
      diabetesType: string;
      deprivationQuintile: number | null;
      /** @enum {string} */
      outcome: 'met' | 'not_met' | 'unknown';
      /** @description What the measure reads, with months */
      readings: string;
    };
    DrillRecordPageDto: {
      /** @description Records in the measure’s denominator */
      total: number;
      page: number;
      pageSize: number;
      records: components['schemas']['DrillRecordDto'][];
    };
    CaseSubjectQuarterDto: {
      id: number;
      /** @example 2026 Q3 */
      label: string;
    };
    CaseSubjectMeasureDto: {
      key: string;
      label: string;
      /** @description The guideline behind it */
      source: string;
    };
    /** @enum {string} */
    CaseFinding:
      | 'data_quality_issue'
      | 'explained_by_case_mix'
      | 'genuine_variation_improving'
      | 'genuine_variation_action_agreed'
      | 'no_concern';
    CaseReopenedDto: {
      /** @description When it was last reopened */
      at: string;
      /** @description Who reopened it (a name) */
      by: string;
      /** @description The finding it was closed with before that reopen */
      previousFinding: components['schemas']['CaseFinding'] | null;
      previousFindingLabel: string | null;
      /** @description When it was closed before that */
      previousClosedAt: string | null;
    };
    ReviewCaseSummaryDto: {
      id: number;
      title: string;
      practice: components['schemas']['PracticeDto'];
      quarter: components['schemas']['CaseSubjectQuarterDto'];
      measure: components['schemas']['CaseSubjectMeasureDto'];
      split: components['schemas']['TypeSplit'];
      status: components['schemas']['CaseStatus'];
      /** @description The state in words */
      statusLabel: string;
      /** @description Changes with every state change; send it back as expectedVersion */
      version: number;
      finding: components['schemas']['CaseFinding'] | null;
      findingLabel: string | null;
      openedBy: string;
      openedAt: string;
      updatedAt: string;
      closedAt: string | null;
      /** @description Set once the case has been reopened: the close it undid */
      reopened: components['schemas']['CaseReopenedDto'] | null;
    };
    FindingOptionDto: {
      key: components['schemas']['CaseFinding'];
      label: string;
    };
    ReviewCaseListDto: {
      cases: components['schemas']['ReviewCaseSummaryDto'][];
      /** @description The findings a case may be closed with */
      findings: components['schemas']['FindingOptionDto'][];
      /** @description Whether the reader may open cases */
      mayOpen: boolean;
    };
    OpenCaseDto: {
      quarterId: number;
      practiceId: number;
      measureKey: string;
      /** @default all */
      split: components['schemas']['TypeSplit'];
      /** @description Judge the case-mix adjusted rate */
      caseMix?: boolean;
      /** @description Why it is opened: an internal note */
      note?: string;
    };
    CaseActionsDto: {
      /** @description Send a question to the practice (auditor) */
      ask: boolean;
      /** @description Answer, with attachments (the practice’s leads) */
      answer: boolean;
      /** @description Add a comment the practice sees */
      comment: boolean;
      /** @description Add an internal note the practice never sees */
      note: boolean;
      /** @description Close with a finding (auditor) */
      close: boolean;
      /** @description Reopen a closed case (auditor) */
      reopen: boolean;
    };
    /** @enum {string} */
    CaseEntryKind: 'opened' | 'question' | 'answer' | 'note' | 'state';
    /**
     * @description practice: the practice sees it; internal: only the region’s side
     * @enum {string}
     */
    CaseEntryVisibility: 'practice' | 'internal';
    CaseFileDto: {
      id: number;
      fileName: string;
      /** @description Judged from the content */
      mediaType: string;
      sizeBytes: number;
      /** @description Where to download it */
      path: string;
    };
    CaseEntryDto: {
      id: number;
      kind: components['schemas']['CaseEntryKind'];
      /** @description practice: the practice sees it; internal: only the region’s side */
      visibility: components['schemas']['CaseEntryVisibility'];
      body: string;
      fromStatus: components['schemas']['CaseStatus'] | null;
      toStatus: components['schemas']['CaseStatus'] | null;
      finding: components['schemas']['CaseFinding'] | null;
      /** @description Who wrote it */
      authorName: string;
      /** @description Their role then */
      authorRole: string;
      /** @description When (ISO 8601) */
      at: string;
      files: components['schemas']['CaseFileDto'][];
    };
    ReviewCaseDto: {
      id: number;
      title: string;
      practice: components['schemas']['PracticeDto'];
      quarter: components['schemas']['CaseSubjectQuarterDto'];
      measure: components['schemas']['CaseSubjectMeasureDto'];
      split: components['schemas']['TypeSplit'];
      status: components['schemas']['CaseStatus'];
      /** @description The state in words */
      statusLabel: string;
      /** @description Changes with every state change; send it back as expectedVersion */
      version: number;
      finding: components['schemas']['CaseFinding'] | null;
      findingLabel: string | null;
      openedBy: string;
      openedAt: string;
      updatedAt: string;
      closedAt: string | null;
      /** @description Set once the case has been reopened: the close it undid */
      reopened: components['schemas']['CaseReopenedDto'] | null;
      /** @description The figures that prompted it, frozen */
      evidence: components['schemas']['CaseEvidenceDto'];
      actions: components['schemas']['CaseActionsDto'];
      /** @description Every step, oldest first */
      timeline: components['schemas']['CaseEntryDto'][];
      /** @description The clinical caution */
      caution: string;
    };
    /** @enum {string} */
    CaseTransition: 'ask' | 'close' | 'reopen';
    TransitionDto: {
      action: components['schemas']['CaseTransition'];
      /** @description The version the change was made from */
      expectedVersion: number;
      /** @description ask: the question (required); close and reopen: a remark the practice sees */
      message: string;
      /** @description close: required */
      finding?: components['schemas']['CaseFinding'];
    };
    CommentDto: {
      body: string;
      /** @description internal notes: auditors only */
      visibility: components['schemas']['CaseEntryVisibility'];
    };
    AnswerFormDto: {
      /** @description The answer */
      text: string;
      expectedVersion: number;
      /** @description Up to 5 files (PDF, XLSX, CSV, PNG, JPEG), 10 MB each, in parts named "files" */
      files?: string[];
    };
    DigestReportRefDto: {
      /** @description The source id of its digests */
      id: number;
      /** @example 2026 Q3 results */
      label: string;
      quarterId: number;
      quarterLabel: string;
      /** Format: date-time */
      publishedAt: string;
      /** @description Practices with a part in it */
      practices: number;
    };
    DigestRecipientDto: {
      address: string;
      name: string | null;
      /** @description A practice lead (false: an extra address) */
      isUser: boolean;
    };
    DigestAttachmentDto: {
      /** @example cairn-report-7-2026-Q3-OV102.xlsx */
      filename: string;
      contentType: string;
      bytes: number;
    };
    DigestPreviewDto: {
      report: components['schemas']['DigestReportRefDto'];
      practice: components['schemas']['PracticeDto'];
      /** @description Whom the preview is addressed to (the first recipient); null when none */
      addressedTo: components['schemas']['DigestRecipientDto'] | null;
      /** @description Everyone who will receive it */
      recipients: components['schemas']['DigestRecipientDto'][];
      from: string;
      subject: string;
      /** @description The plain-text part, as sent */
      text: string;
      /** @description Where the HTML part is served alone, as sent (for a sandboxed frame) */
      htmlPath: string;
      /** @description The practice’s data pack of the report (as on the report’s page); null when it has no figures in the report */
      attachment: components['schemas']['DigestAttachmentDto'] | null;
      /** @description False until a module that runs review cases counts them: every count is 0 */
      reviewCasesCounted: boolean;
    };
    DigestTestSendDto: {
      to: string;
      messageId: string;
      /** @description The mail server's reply */
      reply: string;
    };
    DigestSendResultDto: {
      report: components['schemas']['DigestReportRefDto'];
      /** @description Practices whose digests were queued now */
      practices: number;
      /** @description Messages queued now */
      messages: number;
      /** @description Practices whose digests were queued before (never queued twice) */
      alreadyQueued: number;
    };
    /** @enum {string} */
    DigestScheduleState: 'none' | 'scheduled' | 'sent' | 'cancelled';
    DigestScheduleDto: {
      report: components['schemas']['DigestReportRefDto'];
      state: components['schemas']['DigestScheduleState'];
      /** Format: date-time */
      sendAt: string | null;
      scheduledBy: string | null;
      /** Format: date-time */
      ranAt: string | null;
      outcome: string | null;
    };
    ScheduleDigestsDto: {
      /**
       * Format: date-time
       * @description When to send (in the future, at most a year ahead)
       * @example 2026-12-10T08:00:00Z
       */
      sendAt: string;
    };
  };
  responses: never;
  parameters: never;
  requestBodies: never;
  headers: never;
  pathItems: never;
}
export type $defs = Record<string, never>;
export interface operations {
  AboutController_about: {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    requestBody?: never;
    responses: {
      200: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['AboutDto'];
        };
      };
      /** @description RFC 9457 problem details */
      default: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ProblemDto'];
        };
      };
    };
  };
  UsersController_list: {
    parameters: {
      query?: {
        /** @description Part of a name or e-mail address */
        search?: string;
        role?: components['schemas']['Role'];
        status?: components['schemas']['UserStatus'];
        /** @description Only people who lead this practice */
        practiceId?: number;
      };
      header?: never;
      path?: never;
      cookie?: never;
    };
    requestBody?: never;
    responses: {
      200: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['UserListDto'];
        };
      };
      /** @description RFC 9457 problem details */
      default: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ProblemDto'];
        };
      };
    };
  };
  UsersController_create: {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    requestBody: {
      content: {
        'application/json': components['schemas']['CreateUserDto'];
      };
    };
    responses: {
      201: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['UserDto'];
        };
      };
      /** @description RFC 9457 problem details */
      default: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ProblemDto'];
        };
      };
    };
  };
  UsersController_options: {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    requestBody?: never;
    responses: {
      200: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['UserOptionsDto'];
        };
      };
      /** @description RFC 9457 problem details */
      default: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ProblemDto'];
        };
      };
    };
  };
  UsersController_get: {
    parameters: {
      query?: never;
      header?: never;
      path: {
        userId: number;
      };
      cookie?: never;
    };
    requestBody?: never;
    responses: {
      200: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['UserDto'];
        };
      };
      /** @description RFC 9457 problem details */
      default: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ProblemDto'];
        };
      };
    };
  };
  UsersController_update: {
    parameters: {
      query?: never;
      header?: never;
      path: {
        userId: number;
      };
      cookie?: never;
    };
    requestBody: {
      content: {
        'application/json': components['schemas']['UpdateUserDto'];
      };
    };
    responses: {
      200: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['UserDto'];
        };
      };
      /** @description RFC 9457 problem details */
      default: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ProblemDto'];
        };
      };
    };
  };
  UsersController_assign: {
    parameters: {
      query?: never;
      header?: never;
      path: {
        userId: number;
        practiceId: number;
      };
      cookie?: never;
    };
    requestBody?: never;
    responses: {
      200: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['UserDto'];
        };
      };
      /** @description RFC 9457 problem details */
      default: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ProblemDto'];
        };
      };
    };
  };
  UsersController_remove: {
    parameters: {
      query?: never;
      header?: never;
      path: {
        userId: number;
        practiceId: number;
      };
      cookie?: never;
    };
    requestBody?: never;
    responses: {
      200: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['UserDto'];
        };
      };
      /** @description RFC 9457 problem details */
      default: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ProblemDto'];
        };
      };
    };
  };
  UsersController_deactivate: {
    parameters: {
      query?: never;
      header?: never;
      path: {
        userId: number;
      };
      cookie?: never;
    };
    requestBody?: never;
    responses: {
      200: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['UserDto'];
        };
      };
      /** @description RFC 9457 problem details */
      default: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ProblemDto'];
        };
      };
    };
  };
  UsersController_reactivate: {
    parameters: {
      query?: never;
      header?: never;
      path: {
        userId: number;
      };
      cookie?: never;
    };
    requestBody?: never;
    responses: {
      200: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['UserDto'];
        };
      };
      /** @description RFC 9457 problem details */
      default: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ProblemDto'];
        };
      };
    };
  };
  AuditTrailController_list: {
    parameters: {
      query?: {
        /** @description Exact action, or a prefix ending in "." (e.g. "auth.") */
        action?: string;
        outcome?: components['schemas']['AuditOutcome'];
        /** @description Part of who acted (an e-mail address) or of the summary */
        search?: string;
        practiceId?: number;
        /** @description From this date or time (ISO 8601) */
        from?: string;
        /** @description Up to and including this date (ISO 8601) */
        to?: string;
        /** @description Only events older than this id (paging) */
        before?: number;
        limit?: number;
      };
      header?: never;
      path?: never;
      cookie?: never;
    };
    requestBody?: never;
    responses: {
      200: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['AuditEventPageDto'];
        };
      };
      /** @description RFC 9457 problem details */
      default: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ProblemDto'];
        };
      };
    };
  };
  AuditTrailController_actions: {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    requestBody?: never;
    responses: {
      200: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['AuditActionDto'][];
        };
      };
      /** @description RFC 9457 problem details */
      default: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ProblemDto'];
        };
      };
    };
  };
  SessionController_session: {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    requestBody?: never;
    responses: {
      200: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['SessionDto'];
        };
      };
      /** @description RFC 9457 problem details */
      default: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ProblemDto'];
        };
      };
    };
  };
  SessionController_getMe: {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    requestBody?: never;
    responses: {
      200: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['MeDto'];
        };
      };
      /** @description RFC 9457 problem details */
      default: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ProblemDto'];
        };
      };
    };
  };
  SamlController_metadata: {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    requestBody?: never;
    responses: {
      200: {
        headers: {
          [name: string]: unknown;
        };
        content?: never;
      };
      /** @description RFC 9457 problem details */
      default: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ProblemDto'];
        };
      };
    };
  };
  SamlController_login: {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    requestBody?: never;
    responses: {
      200: {
        headers: {
          [name: string]: unknown;
        };
        content?: never;
      };
      /** @description RFC 9457 problem details */
      default: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ProblemDto'];
        };
      };
    };
  };
  SamlController_acs: {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    requestBody?: never;
    responses: {
      303: {
        headers: {
          [name: string]: unknown;
        };
        content?: never;
      };
      /** @description RFC 9457 problem details */
      default: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ProblemDto'];
        };
      };
    };
  };
  SamlController_slo: {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    requestBody?: never;
    responses: {
      200: {
        headers: {
          [name: string]: unknown;
        };
        content?: never;
      };
      /** @description RFC 9457 problem details */
      default: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ProblemDto'];
        };
      };
    };
  };
  SamlController_signOut: {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    requestBody?: never;
    responses: {
      200: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['SignOutDto'];
        };
      };
      /** @description RFC 9457 problem details */
      default: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ProblemDto'];
        };
      };
    };
  };
  HealthController_check: {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    requestBody?: never;
    responses: {
      200: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['HealthDto'];
        };
      };
      /** @description RFC 9457 problem details */
      default: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ProblemDto'];
        };
      };
    };
  };
  MeasureSetsController_list: {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    requestBody?: never;
    responses: {
      200: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['MeasureSetSummaryDto'][];
        };
      };
      /** @description RFC 9457 problem details */
      default: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ProblemDto'];
        };
      };
    };
  };
  MeasureSetsController_get: {
    parameters: {
      query?: never;
      header?: never;
      path: {
        measureSetId: string;
      };
      cookie?: never;
    };
    requestBody?: never;
    responses: {
      200: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['MeasureSetDto'];
        };
      };
      /** @description RFC 9457 problem details */
      default: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ProblemDto'];
        };
      };
    };
  };
  MeasureSetsController_save: {
    parameters: {
      query?: never;
      header?: never;
      path: {
        measureSetId: string;
      };
      cookie?: never;
    };
    requestBody: {
      content: {
        'application/json': components['schemas']['SaveMeasureSetDraftDto'];
      };
    };
    responses: {
      200: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['MeasureSetDto'];
        };
      };
      /** @description RFC 9457 problem details */
      default: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ProblemDto'];
        };
      };
    };
  };
  MeasureSetsController_discard: {
    parameters: {
      query?: never;
      header?: never;
      path: {
        measureSetId: string;
      };
      cookie?: never;
    };
    requestBody?: never;
    responses: {
      200: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['DiscardedMeasureSetDto'];
        };
      };
      /** @description RFC 9457 problem details */
      default: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ProblemDto'];
        };
      };
    };
  };
  MeasureSetsController_changes: {
    parameters: {
      query?: never;
      header?: never;
      path: {
        measureSetId: string;
      };
      cookie?: never;
    };
    requestBody?: never;
    responses: {
      200: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['MeasureSetChangesDto'];
        };
      };
      /** @description RFC 9457 problem details */
      default: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ProblemDto'];
        };
      };
    };
  };
  MeasureSetsController_clone: {
    parameters: {
      query?: never;
      header?: never;
      path: {
        measureSetId: string;
      };
      cookie?: never;
    };
    requestBody: {
      content: {
        'application/json': components['schemas']['CloneMeasureSetDto'];
      };
    };
    responses: {
      201: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['MeasureSetDto'];
        };
      };
      /** @description RFC 9457 problem details */
      default: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ProblemDto'];
        };
      };
    };
  };
  MeasureSetsController_publish: {
    parameters: {
      query?: never;
      header?: never;
      path: {
        measureSetId: string;
      };
      cookie?: never;
    };
    requestBody: {
      content: {
        'application/json': components['schemas']['PublishMeasureSetDto'];
      };
    };
    responses: {
      200: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['MeasureSetDto'];
        };
      };
      /** @description RFC 9457 problem details */
      default: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ProblemDto'];
        };
      };
    };
  };
  QuartersController_list: {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    requestBody?: never;
    responses: {
      200: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['QuarterDto'][];
        };
      };
      /** @description RFC 9457 problem details */
      default: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ProblemDto'];
        };
      };
    };
  };
  QuartersController_open: {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    requestBody: {
      content: {
        'application/json': components['schemas']['OpenQuarterDto'];
      };
    };
    responses: {
      201: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['QuarterDto'];
        };
      };
      /** @description RFC 9457 problem details */
      default: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ProblemDto'];
        };
      };
    };
  };
  QuartersController_get: {
    parameters: {
      query?: never;
      header?: never;
      path: {
        quarterId: number;
      };
      cookie?: never;
    };
    requestBody?: never;
    responses: {
      200: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['QuarterDto'];
        };
      };
      /** @description RFC 9457 problem details */
      default: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ProblemDto'];
        };
      };
    };
  };
  QuartersController_update: {
    parameters: {
      query?: never;
      header?: never;
      path: {
        quarterId: number;
      };
      cookie?: never;
    };
    requestBody: {
      content: {
        'application/json': components['schemas']['UpdateQuarterDto'];
      };
    };
    responses: {
      200: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['QuarterDto'];
        };
      };
      /** @description RFC 9457 problem details */
      default: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ProblemDto'];
        };
      };
    };
  };
  QuartersController_close: {
    parameters: {
      query?: never;
      header?: never;
      path: {
        quarterId: number;
      };
      cookie?: never;
    };
    requestBody?: never;
    responses: {
      200: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['QuarterDto'];
        };
      };
      /** @description RFC 9457 problem details */
      default: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ProblemDto'];
        };
      };
    };
  };
  QuartersController_reopen: {
    parameters: {
      query?: never;
      header?: never;
      path: {
        quarterId: number;
      };
      cookie?: never;
    };
    requestBody: {
      content: {
        'application/json': components['schemas']['ReopenQuarterDto'];
      };
    };
    responses: {
      200: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['QuarterDto'];
        };
      };
      /** @description RFC 9457 problem details */
      default: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ProblemDto'];
        };
      };
    };
  };
  ExtractsController_templateXlsx: {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    requestBody?: never;
    responses: {
      /** @description The template workbook */
      200: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet': string;
        };
      };
      /** @description RFC 9457 problem details */
      default: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ProblemDto'];
        };
      };
    };
  };
  ExtractsController_templateCsv: {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    requestBody?: never;
    responses: {
      /** @description The headings, UTF-8 */
      200: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'text/csv': string;
        };
      };
      /** @description RFC 9457 problem details */
      default: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ProblemDto'];
        };
      };
    };
  };
  ExtractsController_format: {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    requestBody?: never;
    responses: {
      200: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ExtractFormatDto'];
        };
      };
      /** @description RFC 9457 problem details */
      default: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ProblemDto'];
        };
      };
    };
  };
  ExtractsController_uploadOptions: {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    requestBody?: never;
    responses: {
      200: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['UploadOptionsDto'];
        };
      };
      /** @description RFC 9457 problem details */
      default: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ProblemDto'];
        };
      };
    };
  };
  SubmissionsController_upload: {
    parameters: {
      query?: {
        /** @description How text dates such as 04/05/2026 are written in the file; without it such dates are refused as ambiguous */
        dateConvention?: components['schemas']['DateConvention'];
      };
      header?: never;
      path: {
        practiceId: number;
        quarterId: number;
      };
      cookie?: never;
    };
    requestBody?: never;
    responses: {
      202: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['SubmissionDto'];
        };
      };
      /** @description Identical to an earlier file */
      409: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['UploadProblemDto'];
        };
      };
      /** @description Over the size limit */
      413: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['UploadProblemDto'];
        };
      };
      /** @description RFC 9457 problem details */
      default: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ProblemDto'];
        };
      };
    };
  };
  SubmissionsController_history: {
    parameters: {
      query?: never;
      header?: never;
      path: {
        practiceId: number;
      };
      cookie?: never;
    };
    requestBody?: never;
    responses: {
      200: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['SubmissionHistoryDto'];
        };
      };
      /** @description RFC 9457 problem details */
      default: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ProblemDto'];
        };
      };
    };
  };
  SubmissionsController_get: {
    parameters: {
      query?: never;
      header?: never;
      path: {
        practiceId: number;
        submissionId: number;
      };
      cookie?: never;
    };
    requestBody?: never;
    responses: {
      200: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['SubmissionDto'];
        };
      };
      /** @description RFC 9457 problem details */
      default: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ProblemDto'];
        };
      };
    };
  };
  SubmissionsController_issues: {
    parameters: {
      query?: {
        offset?: number;
        limit?: number;
        severity?: components['schemas']['RowIssueSeverity'];
        code?: string;
        /** @description The heading as given in the file */
        column?: string;
        row?: number;
        sort?: components['schemas']['IssueSort'];
      };
      header?: never;
      path: {
        practiceId: number;
        submissionId: number;
      };
      cookie?: never;
    };
    requestBody?: never;
    responses: {
      200: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['IssuePageDto'];
        };
      };
      /** @description RFC 9457 problem details */
      default: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ProblemDto'];
        };
      };
    };
  };
  SubmissionsController_reportJson: {
    parameters: {
      query?: never;
      header?: never;
      path: {
        practiceId: number;
        submissionId: number;
      };
      cookie?: never;
    };
    requestBody?: never;
    responses: {
      /** @description Sent as an attachment */
      200: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ValidationReportFileDto'];
        };
      };
      /** @description RFC 9457 problem details */
      default: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ProblemDto'];
        };
      };
    };
  };
  SubmissionsController_rejectedRows: {
    parameters: {
      query?: never;
      header?: never;
      path: {
        practiceId: number;
        submissionId: number;
      };
      cookie?: never;
    };
    requestBody?: never;
    responses: {
      /** @description The refused rows, and an about sheet */
      200: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet': string;
        };
      };
      /** @description RFC 9457 problem details */
      default: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ProblemDto'];
        };
      };
    };
  };
  SubmissionsController_confirm: {
    parameters: {
      query?: never;
      header?: never;
      path: {
        practiceId: number;
        submissionId: number;
      };
      cookie?: never;
    };
    requestBody?: never;
    responses: {
      200: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['SubmissionDto'];
        };
      };
      /** @description RFC 9457 problem details */
      default: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ProblemDto'];
        };
      };
    };
  };
  SubmissionsController_cancel: {
    parameters: {
      query?: never;
      header?: never;
      path: {
        practiceId: number;
        submissionId: number;
      };
      cookie?: never;
    };
    requestBody?: never;
    responses: {
      200: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['SubmissionDto'];
        };
      };
      /** @description RFC 9457 problem details */
      default: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ProblemDto'];
        };
      };
    };
  };
  SubmissionsController_retry: {
    parameters: {
      query?: never;
      header?: never;
      path: {
        practiceId: number;
        submissionId: number;
      };
      cookie?: never;
    };
    requestBody?: never;
    responses: {
      200: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['SubmissionDto'];
        };
      };
      /** @description RFC 9457 problem details */
      default: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ProblemDto'];
        };
      };
    };
  };
  CoverageController_coverage: {
    parameters: {
      query?: never;
      header?: never;
      path: {
        quarterId: number;
      };
      cookie?: never;
    };
    requestBody?: never;
    responses: {
      200: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['CoverageDto'];
        };
      };
      /** @description RFC 9457 problem details */
      default: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ProblemDto'];
        };
      };
    };
  };
  BenchmarkController_region: {
    parameters: {
      query?: {
        /** @description Diabetes types: all; type 1; type 2 and other */
        split?: components['schemas']['TypeSplit'];
        /** @description Only the practices of this locality (the region’s statistics stay the region’s) */
        locality?: string;
        /** @description Which page of the practices (by code); the region’s figures come with every page */
        page?: number;
        /** @description Practices per page */
        pageSize?: number;
      };
      header?: never;
      path: {
        quarterId: number;
      };
      cookie?: never;
    };
    requestBody?: never;
    responses: {
      200: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['RegionBenchmarkDto'];
        };
      };
      /** @description RFC 9457 problem details */
      default: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ProblemDto'];
        };
      };
    };
  };
  BenchmarkController_funnel: {
    parameters: {
      query?: {
        /** @description Diabetes types: all; type 1; type 2 and other */
        split?: components['schemas']['TypeSplit'];
      };
      header?: never;
      path: {
        quarterId: number;
        measureKey: string;
      };
      cookie?: never;
    };
    requestBody?: never;
    responses: {
      200: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['MeasureFunnelDto'];
        };
      };
      /** @description RFC 9457 problem details */
      default: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ProblemDto'];
        };
      };
    };
  };
  BenchmarkController_trend: {
    parameters: {
      query: {
        /** @description Diabetes types: all; type 1; type 2 and other */
        split?: components['schemas']['TypeSplit'];
        /** @description Key of a measure of the quarter’s measure set */
        measure: string;
      };
      header?: never;
      path: {
        quarterId: number;
      };
      cookie?: never;
    };
    requestBody?: never;
    responses: {
      200: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['BenchmarkTrendDto'];
        };
      };
      /** @description RFC 9457 problem details */
      default: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ProblemDto'];
        };
      };
    };
  };
  PracticeResultsController_get: {
    parameters: {
      query?: never;
      header?: never;
      path: {
        practiceId: number;
        quarterId: number;
      };
      cookie?: never;
    };
    requestBody?: never;
    responses: {
      200: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['PracticeResultsDto'];
        };
      };
      /** @description RFC 9457 problem details */
      default: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ProblemDto'];
        };
      };
    };
  };
  PracticeResultsController_detail: {
    parameters: {
      query?: never;
      header?: never;
      path: {
        practiceId: number;
        quarterId: number;
      };
      cookie?: never;
    };
    requestBody?: never;
    responses: {
      200: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['PracticeResultsDetailDto'];
        };
      };
      /** @description RFC 9457 problem details */
      default: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ProblemDto'];
        };
      };
    };
  };
  RecallListController_list: {
    parameters: {
      query: {
        /** @description Key of a measure of the quarter’s measure set */
        measure: string;
        split?: components['schemas']['TypeSplit'];
        offset?: number;
        limit?: number;
      };
      header?: never;
      path: {
        practiceId: number;
        quarterId: number;
      };
      cookie?: never;
    };
    requestBody?: never;
    responses: {
      200: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['RecallListDto'];
        };
      };
      /** @description RFC 9457 problem details */
      default: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ProblemDto'];
        };
      };
    };
  };
  RecallListController_csv: {
    parameters: {
      query: {
        /** @description Key of a measure of the quarter’s measure set */
        measure: string;
        split?: components['schemas']['TypeSplit'];
      };
      header?: never;
      path: {
        practiceId: number;
        quarterId: number;
      };
      cookie?: never;
    };
    requestBody?: never;
    responses: {
      /** @description The recall list, one line per record, UTF-8 */
      200: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'text/csv': string;
        };
      };
      /** @description RFC 9457 problem details */
      default: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ProblemDto'];
        };
      };
    };
  };
  RecallListController_xlsx: {
    parameters: {
      query: {
        /** @description Key of a measure of the quarter’s measure set */
        measure: string;
        split?: components['schemas']['TypeSplit'];
      };
      header?: never;
      path: {
        practiceId: number;
        quarterId: number;
      };
      cookie?: never;
    };
    requestBody?: never;
    responses: {
      /** @description The recall list, and a sheet about the measure */
      200: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet': string;
        };
      };
      /** @description RFC 9457 problem details */
      default: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ProblemDto'];
        };
      };
    };
  };
  QuarterOverviewController_get: {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    requestBody?: never;
    responses: {
      200: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['AuditQuartersDto'];
        };
      };
      /** @description RFC 9457 problem details */
      default: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ProblemDto'];
        };
      };
    };
  };
  PublishReportController_publish: {
    parameters: {
      query?: never;
      header?: never;
      path: {
        quarterId: number;
      };
      cookie?: never;
    };
    requestBody: {
      content: {
        'application/json': components['schemas']['PublishReportDto'];
      };
    };
    responses: {
      201: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ReportDto'];
        };
      };
      /** @description RFC 9457 problem details */
      default: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ProblemDto'];
        };
      };
    };
  };
  ReportsController_list: {
    parameters: {
      query?: {
        /** @description Only the reports of this audit quarter */
        quarterId?: number;
      };
      header?: never;
      path?: never;
      cookie?: never;
    };
    requestBody?: never;
    responses: {
      200: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ReportListDto'];
        };
      };
      /** @description RFC 9457 problem details */
      default: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ProblemDto'];
        };
      };
    };
  };
  ReportsController_get: {
    parameters: {
      query?: never;
      header?: never;
      path: {
        reportId: number;
      };
      cookie?: never;
    };
    requestBody?: never;
    responses: {
      200: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ReportDto'];
        };
      };
      /** @description RFC 9457 problem details */
      default: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ProblemDto'];
        };
      };
    };
  };
  ReportsController_region: {
    parameters: {
      query?: never;
      header?: never;
      path: {
        reportId: number;
      };
      cookie?: never;
    };
    requestBody?: never;
    responses: {
      200: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ReportRegionDto'];
        };
      };
      /** @description RFC 9457 problem details */
      default: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ProblemDto'];
        };
      };
    };
  };
  ReportsController_practice: {
    parameters: {
      query?: never;
      header?: never;
      path: {
        reportId: number;
        practiceId: number;
      };
      cookie?: never;
    };
    requestBody?: never;
    responses: {
      200: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ReportPracticeDto'];
        };
      };
      /** @description RFC 9457 problem details */
      default: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ProblemDto'];
        };
      };
    };
  };
  ReportsController_regionPack: {
    parameters: {
      query?: never;
      header?: never;
      path: {
        reportId: number;
      };
      cookie?: never;
    };
    requestBody?: never;
    responses: {
      /** @description About, region, measures by practice, funnel data, breakdowns, trends */
      200: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet': string;
        };
      };
      /** @description RFC 9457 problem details */
      default: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ProblemDto'];
        };
      };
    };
  };
  ReportsController_practicePack: {
    parameters: {
      query?: never;
      header?: never;
      path: {
        reportId: number;
        practiceId: number;
      };
      cookie?: never;
    };
    requestBody?: never;
    responses: {
      /** @description About, your results, measures by practice, funnel data, breakdowns, trends */
      200: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet': string;
        };
      };
      /** @description RFC 9457 problem details */
      default: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ProblemDto'];
        };
      };
    };
  };
  ReportsController_regionPdf: {
    parameters: {
      query?: never;
      header?: never;
      path: {
        reportId: number;
      };
      cookie?: never;
    };
    requestBody?: never;
    responses: {
      /** @description The region’s report */
      200: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/pdf': string;
        };
      };
      /** @description RFC 9457 problem details */
      default: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ProblemDto'];
        };
      };
    };
  };
  ReportsController_practicePdf: {
    parameters: {
      query?: never;
      header?: never;
      path: {
        reportId: number;
        practiceId: number;
      };
      cookie?: never;
    };
    requestBody?: never;
    responses: {
      /** @description The practice’s report */
      200: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/pdf': string;
        };
      };
      /** @description RFC 9457 problem details */
      default: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ProblemDto'];
        };
      };
    };
  };
  ReportsController_withdraw: {
    parameters: {
      query?: never;
      header?: never;
      path: {
        reportId: number;
      };
      cookie?: never;
    };
    requestBody: {
      content: {
        'application/json': components['schemas']['WithdrawReportDto'];
      };
    };
    responses: {
      200: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ReportDto'];
        };
      };
      /** @description RFC 9457 problem details */
      default: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ProblemDto'];
        };
      };
    };
  };
  DeliveriesController_list: {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    requestBody?: never;
    responses: {
      200: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['DeliverySourceListDto'];
        };
      };
      /** @description RFC 9457 problem details */
      default: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ProblemDto'];
        };
      };
    };
  };
  DeliveriesController_detail: {
    parameters: {
      query?: never;
      header?: never;
      path: {
        kind: string;
        sourceId: number;
      };
      cookie?: never;
    };
    requestBody?: never;
    responses: {
      200: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['DeliveryDetailDto'];
        };
      };
      /** @description RFC 9457 problem details */
      default: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ProblemDto'];
        };
      };
    };
  };
  DeliveriesController_resendFailed: {
    parameters: {
      query?: never;
      header?: never;
      path: {
        kind: string;
        sourceId: number;
      };
      cookie?: never;
    };
    requestBody?: never;
    responses: {
      200: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ResendResultDto'];
        };
      };
      /** @description RFC 9457 problem details */
      default: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ProblemDto'];
        };
      };
    };
  };
  DeliveriesController_resendMessage: {
    parameters: {
      query?: never;
      header?: never;
      path: {
        messageId: number;
      };
      cookie?: never;
    };
    requestBody?: never;
    responses: {
      200: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ResendResultDto'];
        };
      };
      /** @description RFC 9457 problem details */
      default: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ProblemDto'];
        };
      };
    };
  };
  MailRecipientsController_list: {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    requestBody?: never;
    responses: {
      200: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['MailRecipientsDto'];
        };
      };
      /** @description RFC 9457 problem details */
      default: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ProblemDto'];
        };
      };
    };
  };
  MailRecipientsController_add: {
    parameters: {
      query?: never;
      header?: never;
      path: {
        practiceId: number;
      };
      cookie?: never;
    };
    requestBody: {
      content: {
        'application/json': components['schemas']['AddExtraRecipientDto'];
      };
    };
    responses: {
      201: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['PracticeRecipientsDto'];
        };
      };
      /** @description RFC 9457 problem details */
      default: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ProblemDto'];
        };
      };
    };
  };
  MailRecipientsController_remove: {
    parameters: {
      query?: never;
      header?: never;
      path: {
        practiceId: number;
        recipientId: number;
      };
      cookie?: never;
    };
    requestBody?: never;
    responses: {
      200: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['PracticeRecipientsDto'];
        };
      };
      /** @description RFC 9457 problem details */
      default: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ProblemDto'];
        };
      };
    };
  };
  MailPreferencesController_get: {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    requestBody?: never;
    responses: {
      200: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['MailPreferencesDto'];
        };
      };
      /** @description RFC 9457 problem details */
      default: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ProblemDto'];
        };
      };
    };
  };
  MailPreferencesController_set: {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    requestBody: {
      content: {
        'application/json': components['schemas']['UpdateMailPreferencesDto'];
      };
    };
    responses: {
      200: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['MailPreferencesDto'];
        };
      };
      /** @description RFC 9457 problem details */
      default: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ProblemDto'];
        };
      };
    };
  };
  OutliersController_list: {
    parameters: {
      query?: {
        /** @description outer: beyond the 99.8 % limits; inner: beyond the 95 % limits too */
        level?: components['schemas']['OutlierLevel'];
        /** @description Judge the case-mix adjusted rate */
        caseMix?: boolean;
        split?: components['schemas']['TypeSplit'];
        /** @description Only this measure (its key) */
        measure?: string;
        /** @description worse or better than expected */
        assessment?: components['schemas']['OutlierAssessment'];
        /** @description Only this locality (its code) */
        locality?: string;
      };
      header?: never;
      path: {
        quarterId: number;
      };
      cookie?: never;
    };
    requestBody?: never;
    responses: {
      200: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['OutlierListDto'];
        };
      };
      /** @description RFC 9457 problem details */
      default: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ProblemDto'];
        };
      };
    };
  };
  OutliersController_drillDown: {
    parameters: {
      query?: {
        /** @description Diabetes types: all; type 1; type 2 and other */
        split?: components['schemas']['TypeSplit'];
      };
      header?: never;
      path: {
        quarterId: number;
        practiceId: number;
        measureKey: string;
      };
      cookie?: never;
    };
    requestBody?: never;
    responses: {
      200: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['DrillDownDto'];
        };
      };
      /** @description RFC 9457 problem details */
      default: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ProblemDto'];
        };
      };
    };
  };
  OutliersController_records: {
    parameters: {
      query?: {
        /** @description Diabetes types: all; type 1; type 2 and other */
        split?: components['schemas']['TypeSplit'];
        page?: number;
        pageSize?: number;
      };
      header?: never;
      path: {
        quarterId: number;
        practiceId: number;
        measureKey: string;
      };
      cookie?: never;
    };
    requestBody?: never;
    responses: {
      200: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['DrillRecordPageDto'];
        };
      };
      /** @description RFC 9457 problem details */
      default: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ProblemDto'];
        };
      };
    };
  };
  OutliersController_evidence: {
    parameters: {
      query?: never;
      header?: never;
      path: {
        quarterId: number;
        practiceId: number;
        measureKey: string;
      };
      cookie?: never;
    };
    requestBody?: never;
    responses: {
      /** @description The evidence workbook */
      200: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet': string;
        };
      };
      /** @description RFC 9457 problem details */
      default: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ProblemDto'];
        };
      };
    };
  };
  ReviewCasesController_list: {
    parameters: {
      query?: {
        status?: components['schemas']['CaseStatus'];
        quarterId?: number;
        practiceId?: number;
      };
      header?: never;
      path?: never;
      cookie?: never;
    };
    requestBody?: never;
    responses: {
      200: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ReviewCaseListDto'];
        };
      };
      /** @description RFC 9457 problem details */
      default: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ProblemDto'];
        };
      };
    };
  };
  ReviewCasesController_open: {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    requestBody: {
      content: {
        'application/json': components['schemas']['OpenCaseDto'];
      };
    };
    responses: {
      200: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ReviewCaseDto'];
        };
      };
      /** @description RFC 9457 problem details */
      default: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ProblemDto'];
        };
      };
    };
  };
  ReviewCasesController_get: {
    parameters: {
      query?: never;
      header?: never;
      path: {
        caseId: number;
      };
      cookie?: never;
    };
    requestBody?: never;
    responses: {
      200: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ReviewCaseDto'];
        };
      };
      /** @description RFC 9457 problem details */
      default: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ProblemDto'];
        };
      };
    };
  };
  ReviewCasesController_transition: {
    parameters: {
      query?: never;
      header?: never;
      path: {
        caseId: number;
      };
      cookie?: never;
    };
    requestBody: {
      content: {
        'application/json': components['schemas']['TransitionDto'];
      };
    };
    responses: {
      200: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ReviewCaseDto'];
        };
      };
      /** @description RFC 9457 problem details */
      default: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ProblemDto'];
        };
      };
    };
  };
  ReviewCasesController_comment: {
    parameters: {
      query?: never;
      header?: never;
      path: {
        caseId: number;
      };
      cookie?: never;
    };
    requestBody: {
      content: {
        'application/json': components['schemas']['CommentDto'];
      };
    };
    responses: {
      200: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ReviewCaseDto'];
        };
      };
      /** @description RFC 9457 problem details */
      default: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ProblemDto'];
        };
      };
    };
  };
  ReviewCasesController_answer: {
    parameters: {
      query?: never;
      header?: never;
      path: {
        caseId: number;
      };
      cookie?: never;
    };
    requestBody: {
      content: {
        'multipart/form-data': components['schemas']['AnswerFormDto'];
      };
    };
    responses: {
      200: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ReviewCaseDto'];
        };
      };
      /** @description RFC 9457 problem details */
      default: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ProblemDto'];
        };
      };
    };
  };
  ReviewCasesController_file: {
    parameters: {
      query?: never;
      header?: never;
      path: {
        caseId: number;
        fileId: number;
      };
      cookie?: never;
    };
    requestBody?: never;
    responses: {
      /** @description The file as it was received */
      200: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/octet-stream': string;
        };
      };
      /** @description RFC 9457 problem details */
      default: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ProblemDto'];
        };
      };
    };
  };
  DigestsController_list: {
    parameters: {
      query?: never;
      header?: never;
      path?: never;
      cookie?: never;
    };
    requestBody?: never;
    responses: {
      200: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['DigestReportRefDto'][];
        };
      };
      /** @description RFC 9457 problem details */
      default: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ProblemDto'];
        };
      };
    };
  };
  DigestsController_preview: {
    parameters: {
      query?: never;
      header?: never;
      path: {
        reportId: number;
        practiceId: number;
      };
      cookie?: never;
    };
    requestBody?: never;
    responses: {
      200: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['DigestPreviewDto'];
        };
      };
      /** @description RFC 9457 problem details */
      default: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ProblemDto'];
        };
      };
    };
  };
  DigestsController_previewHtml: {
    parameters: {
      query?: never;
      header?: never;
      path: {
        reportId: number;
        practiceId: number;
      };
      cookie?: never;
    };
    requestBody?: never;
    responses: {
      /** @description The HTML part */
      200: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'text/html': string;
        };
      };
      /** @description RFC 9457 problem details */
      default: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ProblemDto'];
        };
      };
    };
  };
  DigestsController_sendTest: {
    parameters: {
      query?: never;
      header?: never;
      path: {
        reportId: number;
        practiceId: number;
      };
      cookie?: never;
    };
    requestBody?: never;
    responses: {
      200: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['DigestTestSendDto'];
        };
      };
      /** @description RFC 9457 problem details */
      default: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ProblemDto'];
        };
      };
    };
  };
  DigestsController_sendAll: {
    parameters: {
      query?: never;
      header?: never;
      path: {
        reportId: number;
      };
      cookie?: never;
    };
    requestBody?: never;
    responses: {
      200: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['DigestSendResultDto'];
        };
      };
      /** @description RFC 9457 problem details */
      default: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ProblemDto'];
        };
      };
    };
  };
  DigestsController_scheduleOf: {
    parameters: {
      query?: never;
      header?: never;
      path: {
        reportId: number;
      };
      cookie?: never;
    };
    requestBody?: never;
    responses: {
      200: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['DigestScheduleDto'];
        };
      };
      /** @description RFC 9457 problem details */
      default: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ProblemDto'];
        };
      };
    };
  };
  DigestsController_schedule: {
    parameters: {
      query?: never;
      header?: never;
      path: {
        reportId: number;
      };
      cookie?: never;
    };
    requestBody: {
      content: {
        'application/json': components['schemas']['ScheduleDigestsDto'];
      };
    };
    responses: {
      200: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['DigestScheduleDto'];
        };
      };
      /** @description RFC 9457 problem details */
      default: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ProblemDto'];
        };
      };
    };
  };
  DigestsController_cancel: {
    parameters: {
      query?: never;
      header?: never;
      path: {
        reportId: number;
      };
      cookie?: never;
    };
    requestBody?: never;
    responses: {
      200: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['DigestScheduleDto'];
        };
      };
      /** @description RFC 9457 problem details */
      default: {
        headers: {
          [name: string]: unknown;
        };
        content: {
          'application/json': components['schemas']['ProblemDto'];
        };
      };
    };
  };
}
type FlattenedDeepRequired<T> = {
  [K in keyof T]-?: FlattenedDeepRequired<
    T[K] extends unknown[] | undefined | null ? Extract<T[K], unknown[]>[number] : T[K]
  >;
};
type ReadonlyArray<T> = [Exclude<T, undefined>] extends [unknown[]]
  ? Readonly<Exclude<T, undefined>>
  : Readonly<Exclude<T, undefined>[]>;
export const roleValues: ReadonlyArray<FlattenedDeepRequired<components>['schemas']['Role']> = [
  'regional_lead',
  'practice_lead',
  'auditor',
];
export const userStatusValues: ReadonlyArray<
  FlattenedDeepRequired<components>['schemas']['UserStatus']
> = ['active', 'deactivated'];
export const auditOutcomeValues: ReadonlyArray<
  FlattenedDeepRequired<components>['schemas']['AuditOutcome']
> = ['success', 'refused', 'failed'];
export const sessionEndValues: ReadonlyArray<
  FlattenedDeepRequired<components>['schemas']['SessionEnd']
> = ['idle', 'absolute', 'deactivated', 'removed'];
export const healthProcessDtoStatusValues: ReadonlyArray<
  FlattenedDeepRequired<components>['schemas']['HealthProcessDto']['status']
> = ['up'];
export const healthDatabaseDtoStatusValues: ReadonlyArray<
  FlattenedDeepRequired<components>['schemas']['HealthDatabaseDto']['status']
> = ['up', 'down'];
export const healthDtoStatusValues: ReadonlyArray<
  FlattenedDeepRequired<components>['schemas']['HealthDto']['status']
> = ['ok'];
export const measureSetStatusValues: ReadonlyArray<
  FlattenedDeepRequired<components>['schemas']['MeasureSetStatus']
> = ['draft', 'published'];
export const measureSetUseKindValues: ReadonlyArray<
  FlattenedDeepRequired<components>['schemas']['MeasureSetUseKind']
> = ['quarter', 'report'];
export const breakdownKeyValues: ReadonlyArray<
  FlattenedDeepRequired<components>['schemas']['BreakdownKey']
> = ['age_band', 'sex', 'deprivation', 'duration'];
export const measureKindValues: ReadonlyArray<
  FlattenedDeepRequired<components>['schemas']['MeasureKind']
> = ['care_process', 'treatment_target'];
export const denominatorKindValues: ReadonlyArray<
  FlattenedDeepRequired<components>['schemas']['DenominatorKind']
> = ['eligible', 'measured'];
export const measureDirectionValues: ReadonlyArray<
  FlattenedDeepRequired<components>['schemas']['MeasureDirection']
> = ['higher', 'lower'];
export const diabetesTypeValues: ReadonlyArray<
  FlattenedDeepRequired<components>['schemas']['DiabetesType']
> = ['type1', 'type2', 'other'];
export const readingFieldValues: ReadonlyArray<
  FlattenedDeepRequired<components>['schemas']['ReadingField']
> = [
  'hba1c',
  'bloodPressure',
  'cholesterol',
  'serumCreatinine',
  'urineAlbumin',
  'footSurveillance',
  'bmi',
  'smoking',
  'retinalScreening',
  'onStatin',
  'onInsulin',
  'cvdHistory',
];
export const careProcessFieldValues: ReadonlyArray<
  FlattenedDeepRequired<components>['schemas']['CareProcessField']
> = [
  'hba1c',
  'bloodPressure',
  'cholesterol',
  'serumCreatinine',
  'urineAlbumin',
  'footSurveillance',
  'bmi',
  'smoking',
  'retinalScreening',
];
export const measureWindowValues: ReadonlyArray<
  FlattenedDeepRequired<components>['schemas']['MeasureWindow']
> = ['review', 'retinal'];
export const recordedProcessDefinitionDtoRuleValues: ReadonlyArray<
  FlattenedDeepRequired<components>['schemas']['RecordedProcessDefinitionDto']['rule']
> = ['recorded'];
export const compositeProcessDefinitionDtoRuleValues: ReadonlyArray<
  FlattenedDeepRequired<components>['schemas']['CompositeProcessDefinitionDto']['rule']
> = ['allOf'];
export const measurementValues: ReadonlyArray<
  FlattenedDeepRequired<components>['schemas']['Measurement']
> = ['hba1c', 'systolic', 'diastolic', 'cholesterol', 'serumCreatinine', 'urineAlbumin', 'bmi'];
export const comparatorValues: ReadonlyArray<
  FlattenedDeepRequired<components>['schemas']['Comparator']
> = ['lt', 'le', 'gt', 'ge'];
export const valueTargetDefinitionDtoRuleValues: ReadonlyArray<
  FlattenedDeepRequired<components>['schemas']['ValueTargetDefinitionDto']['rule']
> = ['value'];
export const bloodPressureTargetDefinitionDtoRuleValues: ReadonlyArray<
  FlattenedDeepRequired<components>['schemas']['BloodPressureTargetDefinitionDto']['rule']
> = ['bloodPressure'];
export const flagFieldValues: ReadonlyArray<
  FlattenedDeepRequired<components>['schemas']['FlagField']
> = ['onStatin', 'onInsulin', 'cvdHistory'];
export const flagTargetDefinitionDtoRuleValues: ReadonlyArray<
  FlattenedDeepRequired<components>['schemas']['FlagTargetDefinitionDto']['rule']
> = ['flag'];
export const valueConditionDtoRuleValues: ReadonlyArray<
  FlattenedDeepRequired<components>['schemas']['ValueConditionDto']['rule']
> = ['value'];
export const bloodPressureConditionDtoRuleValues: ReadonlyArray<
  FlattenedDeepRequired<components>['schemas']['BloodPressureConditionDto']['rule']
> = ['bloodPressure'];
export const flagConditionDtoRuleValues: ReadonlyArray<
  FlattenedDeepRequired<components>['schemas']['FlagConditionDto']['rule']
> = ['flag'];
export const targetRefConditionDtoRuleValues: ReadonlyArray<
  FlattenedDeepRequired<components>['schemas']['TargetRefConditionDto']['rule']
> = ['target'];
export const compositeRuleValues: ReadonlyArray<
  FlattenedDeepRequired<components>['schemas']['CompositeRule']
> = ['anyOf', 'allOf'];
export const measureChangeKindValues: ReadonlyArray<
  FlattenedDeepRequired<components>['schemas']['MeasureChangeKind']
> = ['added', 'removed', 'changed'];
export const quarterStatusValues: ReadonlyArray<
  FlattenedDeepRequired<components>['schemas']['QuarterStatus']
> = ['open', 'closed'];
export const quarterDtoQuarterValues: ReadonlyArray<
  FlattenedDeepRequired<components>['schemas']['QuarterDto']['quarter']
> = [1, 2, 3, 4];
export const openQuarterDtoQuarterValues: ReadonlyArray<
  FlattenedDeepRequired<components>['schemas']['OpenQuarterDto']['quarter']
> = [1, 2, 3, 4];
export const issueSeverityValues: ReadonlyArray<
  FlattenedDeepRequired<components>['schemas']['IssueSeverity']
> = ['refusal', 'error', 'warning', 'flag'];
export const dateConventionValues: ReadonlyArray<
  FlattenedDeepRequired<components>['schemas']['DateConvention']
> = ['day_first', 'month_first'];
export const submissionStatusValues: ReadonlyArray<
  FlattenedDeepRequired<components>['schemas']['SubmissionStatus']
> = [
  'processing',
  'rejected',
  'awaiting_confirmation',
  'accepted',
  'superseded',
  'cancelled',
  'failed',
];
export const submissionPhaseValues: ReadonlyArray<
  FlattenedDeepRequired<components>['schemas']['SubmissionPhase']
> = ['queued', 'uploading', 'reading'];
export const uploadProblemDtoCodeValues: ReadonlyArray<
  FlattenedDeepRequired<components>['schemas']['UploadProblemDto']['code']
> = ['identical_extract', 'file_too_large'];
export const rowIssueSeverityValues: ReadonlyArray<
  FlattenedDeepRequired<components>['schemas']['RowIssueSeverity']
> = ['error', 'warning', 'flag'];
export const issueSortValues: ReadonlyArray<
  FlattenedDeepRequired<components>['schemas']['IssueSort']
> = ['row', '-row', 'severity', '-severity', 'code', '-code', 'column', '-column'];
export const coverageStateValues: ReadonlyArray<
  FlattenedDeepRequired<components>['schemas']['CoverageState']
> = ['current', 'awaiting_confirmation', 'none'];
export const typeSplitValues: ReadonlyArray<
  FlattenedDeepRequired<components>['schemas']['TypeSplit']
> = ['all', 'type1', 'type2_other'];
export const benchmarkStateValues: ReadonlyArray<
  FlattenedDeepRequired<components>['schemas']['BenchmarkState']
> = ['results', 'no-accepted-submissions'];
export const funnelBandValues: ReadonlyArray<
  FlattenedDeepRequired<components>['schemas']['FunnelBand']
> = ['within', 'notable', 'outlier'];
export const funnelSideValues: ReadonlyArray<
  FlattenedDeepRequired<components>['schemas']['FunnelSide']
> = ['above', 'below'];
export const flagAssessmentValues: ReadonlyArray<
  FlattenedDeepRequired<components>['schemas']['FlagAssessment']
> = ['better', 'worse'];
export const trendPointStateValues: ReadonlyArray<
  FlattenedDeepRequired<components>['schemas']['TrendPointState']
> = ['value', 'no-submission', 'not-in-measure-set'];
export const shiftSideValues: ReadonlyArray<
  FlattenedDeepRequired<components>['schemas']['ShiftSide']
> = ['above', 'below'];
export const trendDirectionValues: ReadonlyArray<
  FlattenedDeepRequired<components>['schemas']['TrendDirection']
> = ['up', 'down'];
export const practiceResultsStateValues: ReadonlyArray<
  FlattenedDeepRequired<components>['schemas']['PracticeResultsState']
> = ['results', 'no-current-submission'];
export const peerDisclosureValues: ReadonlyArray<
  FlattenedDeepRequired<components>['schemas']['PeerDisclosure']
> = ['applied', 'none'];
export const recordReferenceKindValues: ReadonlyArray<
  FlattenedDeepRequired<components>['schemas']['RecordReferenceKind']
> = ['record_ref', 'pseudonym'];
export const sexValues: ReadonlyArray<FlattenedDeepRequired<components>['schemas']['Sex']> = [
  'F',
  'M',
  'X',
  'U',
];
export const recallReasonValues: ReadonlyArray<
  FlattenedDeepRequired<components>['schemas']['RecallReason']
> = ['not_recorded', 'not_measured', 'not_met', 'adverse_result'];
export const nextQuarterDtoQuarterValues: ReadonlyArray<
  FlattenedDeepRequired<components>['schemas']['NextQuarterDto']['quarter']
> = [1, 2, 3, 4];
export const reportStatusValues: ReadonlyArray<
  FlattenedDeepRequired<components>['schemas']['ReportStatus']
> = ['published', 'replaced', 'withdrawn'];
export const disclosureSuppressionValues: ReadonlyArray<
  FlattenedDeepRequired<components>['schemas']['DisclosureSuppression']
> = ['none', 'primary', 'secondary'];
export const reportPracticeStateValues: ReadonlyArray<
  FlattenedDeepRequired<components>['schemas']['ReportPracticeState']
> = ['results', 'not-in-report'];
export const mailKindValues: ReadonlyArray<
  FlattenedDeepRequired<components>['schemas']['MailKind']
> = ['quarter_opened', 'deadline_reminder', 'review_case_question', 'digest'];
export const outboxStateValues: ReadonlyArray<
  FlattenedDeepRequired<components>['schemas']['OutboxState']
> = ['queued', 'sending', 'sent', 'failed'];
export const outlierLevelValues: ReadonlyArray<
  FlattenedDeepRequired<components>['schemas']['OutlierLevel']
> = ['outer', 'inner'];
export const outlierAssessmentValues: ReadonlyArray<
  FlattenedDeepRequired<components>['schemas']['OutlierAssessment']
> = ['worse', 'better'];
export const evidenceOriginValues: ReadonlyArray<
  FlattenedDeepRequired<components>['schemas']['EvidenceOrigin']
> = ['draft', 'report'];
export const outlierMeasureDtoDirectionValues: ReadonlyArray<
  FlattenedDeepRequired<components>['schemas']['OutlierMeasureDto']['direction']
> = ['higher', 'lower'];
export const caseStatusValues: ReadonlyArray<
  FlattenedDeepRequired<components>['schemas']['CaseStatus']
> = ['open', 'awaiting_practice', 'responded', 'closed'];
export const outlierRowDtoBandValues: ReadonlyArray<
  FlattenedDeepRequired<components>['schemas']['OutlierRowDto']['band']
> = ['notable', 'outlier'];
export const outlierRowDtoSideValues: ReadonlyArray<
  FlattenedDeepRequired<components>['schemas']['OutlierRowDto']['side']
> = ['above', 'below'];
export const outlierListDtoStateValues: ReadonlyArray<
  FlattenedDeepRequired<components>['schemas']['OutlierListDto']['state']
> = ['results', 'no-accepted-submissions'];
export const drillRecordDtoOutcomeValues: ReadonlyArray<
  FlattenedDeepRequired<components>['schemas']['DrillRecordDto']['outcome']
> = ['met', 'not_met', 'unknown'];
export const caseFindingValues: ReadonlyArray<
  FlattenedDeepRequired<components>['schemas']['CaseFinding']
> = [
  'data_quality_issue',
  'explained_by_case_mix',
  'genuine_variation_improving',
  'genuine_variation_action_agreed',
  'no_concern',
];
export const caseEntryKindValues: ReadonlyArray<
  FlattenedDeepRequired<components>['schemas']['CaseEntryKind']
> = ['opened', 'question', 'answer', 'note', 'state'];
export const caseEntryVisibilityValues: ReadonlyArray<
  FlattenedDeepRequired<components>['schemas']['CaseEntryVisibility']
> = ['practice', 'internal'];
export const caseTransitionValues: ReadonlyArray<
  FlattenedDeepRequired<components>['schemas']['CaseTransition']
> = ['ask', 'close', 'reopen'];
export const digestScheduleStateValues: ReadonlyArray<
  FlattenedDeepRequired<components>['schemas']['DigestScheduleState']
> = ['none', 'scheduled', 'sent', 'cancelled'];
