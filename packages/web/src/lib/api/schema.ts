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
    /** Every measure-set version Cairn knows */
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
    /** One measure-set version: every care process and treatment target, its definition in words, population, denominator, direction and guideline */
    get: operations['MeasureSetsController_get'];
    put?: never;
    post?: never;
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
    patch?: never;
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
    /** Reopen a closed quarter (regional lead) */
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
    MeasureSetSummaryDto: {
      /** @example cairn-default-2026.1 */
      id: string;
      /** @example Cairn default measure set 2026.1 */
      label: string;
      description: string | null;
      /** @example 10 */
      careProcesses: number;
      /** @example 10 */
      treatmentTargets: number;
      /** @description The version a new audit quarter gets by default */
      isDefault: boolean;
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
    MeasureSetDto: {
      /** @example cairn-default-2026.1 */
      id: string;
      /** @example Cairn default measure set 2026.1 */
      label: string;
      description: string | null;
      /** @example 10 */
      careProcesses: number;
      /** @example 10 */
      treatmentTargets: number;
      /** @description The version a new audit quarter gets by default */
      isDefault: boolean;
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
    RecallPracticeDto: {
      /** @example 12 */
      id: number;
      /** @example OV102 */
      code: string;
      /** @example Quarrybank Surgery */
      name: string;
    };
    RecallQuarterDto: {
      id: number;
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
      practice: components['schemas']['RecallPracticeDto'];
      quarter: components['schemas']['RecallQuarterDto'];
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
