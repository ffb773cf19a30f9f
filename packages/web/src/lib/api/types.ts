/**
 * The API's shapes, by name: aliases of the types generated from its OpenAPI
 * document (schema.ts, `npm run api:contract`). Never write a response shape
 * by hand; add an alias here when a screen needs a new one.
 */
import type { components } from './schema';

type Schemas = components['schemas'];

// ── names the API defines (roles, states, severities) ──
export type Role = Schemas['Role'];
export type UserStatus = Schemas['UserStatus'];
export type SessionEnd = Schemas['SessionEnd'];
export type QuarterStatus = Schemas['QuarterStatus'];
export type SubmissionStatus = Schemas['SubmissionStatus'];
export type SubmissionPhase = Schemas['SubmissionPhase'];
export type DateConvention = Schemas['DateConvention'];
export type IssueSeverity = Schemas['IssueSeverity'];
export type RowIssueSeverity = Schemas['RowIssueSeverity'];
export type IssueSort = Schemas['IssueSort'];
export type CoverageState = Schemas['CoverageState'];
export type AuditOutcome = Schemas['AuditOutcome'];
export type MailKind = Schemas['MailKind'];
export type OutboxState = Schemas['OutboxState'];
export {
  auditOutcomeValues,
  comparatorValues,
  coverageStateValues,
  denominatorKindValues,
  diabetesTypeValues,
  measureDirectionValues,
  issueSeverityValues,
  mailKindValues,
  outboxStateValues,
  roleValues,
  submissionStatusValues,
  userStatusValues,
} from './schema';

// ── problem details (every error answer; RFC 9457) ──
export type Problem = Schemas['ProblemDto'];
export type FieldProblem = Schemas['FieldProblemDto'];
export type UploadProblem = Schemas['UploadProblemDto'];

// ── resources ──
export type About = Schemas['AboutDto'];
export type Session = Schemas['SessionDto'];
export type Me = Schemas['MeDto'];
export type SignOut = Schemas['SignOutDto'];
export type PracticeRef = Schemas['PracticeRefDto'];
export type Practice = Schemas['PracticeDto'];
export type User = Schemas['UserDto'];
export type UserList = Schemas['UserListDto'];
export type UserOptions = Schemas['UserOptionsDto'];
export type NewUser = Schemas['CreateUserDto'];
export type UserChanges = Schemas['UpdateUserDto'];
export type AuditEvent = Schemas['AuditEventDto'];
export type AuditEventPage = Schemas['AuditEventPageDto'];
export type AuditAction = Schemas['AuditActionDto'];
export type Quarter = Schemas['QuarterDto'];
export type Submission = Schemas['SubmissionDto'];
export type SubmissionCounts = Schemas['SubmissionCountsDto'];
export type SubmissionActions = Schemas['SubmissionActionsDto'];
export type IssueCount = Schemas['IssueCountDto'];
export type SubmissionHistory = Schemas['SubmissionHistoryDto'];
export type QuarterSubmissions = Schemas['QuarterSubmissionsDto'];
export type UploadOptions = Schemas['UploadOptionsDto'];
export type UploadPractice = Schemas['UploadPracticeDto'];
export type Issue = Schemas['IssueDto'];
export type IssuePage = Schemas['IssuePageDto'];
export type Coverage = Schemas['CoverageDto'];
export type CoveragePractice = Schemas['CoveragePracticeDto'];
export type ExtractFormat = Schemas['ExtractFormatDto'];
export type FormatColumn = Schemas['FormatColumnDto'];

// ── audit quarters ──
export type AuditQuarters = Schemas['AuditQuartersDto'];
export type AuditQuarter = Schemas['AuditQuarterDto'];
export type NextQuarter = Schemas['NextQuarterDto'];
export type QuarterActions = Schemas['QuarterActionsDto'];
export type QuarterReport = Schemas['QuarterReportDto'];
export type MeasureSetRef = Schemas['MeasureSetRefDto'];
export type OpenQuarter = Schemas['OpenQuarterDto'];
export type QuarterChanges = Schemas['UpdateQuarterDto'];
export type ReopenQuarter = Schemas['ReopenQuarterDto'];

// ── measure sets ──
export type MeasureSetStatus = Schemas['MeasureSetStatus'];
export type MeasureSetSummary = Schemas['MeasureSetSummaryDto'];
export type MeasureSet = Schemas['MeasureSetDto'];
export type Measure = Schemas['MeasureDto'];
export type MeasureSetActions = Schemas['MeasureSetActionsDto'];
export type MeasureSetUse = Schemas['MeasureSetUseDto'];
export type MeasureSetChanges = Schemas['MeasureSetChangesDto'];
export type MeasureSetChange = Schemas['MeasureSetChangeDto'];
export type NewDraft = Schemas['CloneMeasureSetDto'];
export type SaveDraft = Schemas['SaveMeasureSetDraftDto'];
export type DiscardedMeasureSet = Schemas['DiscardedMeasureSetDto'];
export type MeasureSetDefinition = Schemas['MeasureSetDefinitionDto'];
export type CareProcessDefinition = MeasureSetDefinition['careProcesses'][number];
export type TargetDefinition = MeasureSetDefinition['targets'][number];
export type ConditionDefinition = Schemas['CompositeTargetDefinitionDto']['of'][number];
export type PopulationDefinition = Schemas['PopulationDefinitionDto'];
export type BloodPressureBand = Schemas['BloodPressureBandDto'];
export type DiabetesType = Schemas['DiabetesType'];
export type DenominatorKind = Schemas['DenominatorKind'];
export type MeasureDirection = Schemas['MeasureDirection'];
export type Comparator = Schemas['Comparator'];
export type Measurement = Schemas['Measurement'];
// ── mail: deliveries, recipients, mail preferences ──
export type OutboxCounts = Schemas['OutboxCountsDto'];
export type DeliverySource = Schemas['DeliverySourceDto'];
export type DeliverySourceList = Schemas['DeliverySourceListDto'];
export type DeliveryDetail = Schemas['DeliveryDetailDto'];
export type DeliveryMessage = Schemas['DeliveryMessageDto'];
export type ResendResult = Schemas['ResendResultDto'];
export type MailRecipients = Schemas['MailRecipientsDto'];
export type PracticeRecipients = Schemas['PracticeRecipientsDto'];
export type ExtraRecipient = Schemas['ExtraRecipientDto'];
export type NewExtraRecipient = Schemas['AddExtraRecipientDto'];
export type MailPreferences = Schemas['MailPreferencesDto'];
export type MailPreference = Schemas['MailPreferenceDto'];
export type MailPreferencesChange = Schemas['UpdateMailPreferencesDto'];
// ── digests ──
export type DigestReportRef = Schemas['DigestReportRefDto'];
export type DigestPreview = Schemas['DigestPreviewDto'];
export type DigestTestSend = Schemas['DigestTestSendDto'];
export type DigestSendResult = Schemas['DigestSendResultDto'];
export type DigestSchedule = Schemas['DigestScheduleDto'];
// ── results and benchmarks ──
export type TypeSplit = Schemas['TypeSplit'];
export type BuiltFrom = Schemas['BuiltFromDto'];
export type Locality = Schemas['LocalityDto'];
export type Interval = Schemas['IntervalDto'];
export type Flag = Schemas['FlagDto'];
export type FlagWithLimits = Schemas['FlagWithLimitsDto'];
export type CaseMix = Schemas['CaseMixDto'];
export type DataQualityCount = Schemas['DataQualityCountDto'];
export type RegionBenchmark = Schemas['RegionBenchmarkDto'];
export type RegionMeasure = Schemas['RegionMeasureDto'];
export type BenchmarkPractice = Schemas['BenchmarkPracticeDto'];
export type BenchmarkCell = Schemas['BenchmarkCellDto'];
export type MeasureFunnel = Schemas['MeasureFunnelDto'];
export type FunnelPoint = Schemas['FunnelPointDto'];
export type BenchmarkTrend = Schemas['BenchmarkTrendDto'];
export type RateTrend = Schemas['RateTrendDto'];
export type RunChartSignals = Schemas['RunChartSignalsDto'];
export type PracticeResults = Schemas['PracticeResultsDto'];
export type PracticeMeasureResult = Schemas['PracticeMeasureResultDto'];
export type PracticeSplitResult = Schemas['PracticeSplitResultDto'];
export type PracticeDetail = Schemas['PracticeDetailDto'];
export type PracticeResultsDetail = Schemas['PracticeResultsDetailDto'];
export type DetailMeasure = Schemas['DetailMeasureDto'];
export type DetailCell = Schemas['DetailCellDto'];
export type DisclosedCount = Schemas['DisclosedCountDto'];
export type KidneyGrid = Schemas['KidneyGridDto'];
export type Survival = Schemas['SurvivalDto'];
export type ValueHistogram = Schemas['ValueHistogramDto'];
export type RecallList = Schemas['RecallListDto'];
export type RecallItem = Schemas['RecallItemDto'];
export { typeSplitValues } from './schema';
// ── review cases and the outlier list ──
export type OutlierList = Schemas['OutlierListDto'];
export type OutlierRow = Schemas['OutlierRowDto'];
export type OutlierLevel = Schemas['OutlierLevel'];
export type OutlierAssessment = Schemas['OutlierAssessment'];
export type DrillDown = Schemas['DrillDownDto'];
export type DrillRecordPage = Schemas['DrillRecordPageDto'];
export type ReviewCase = Schemas['ReviewCaseDto'];
export type ReviewCaseSummary = Schemas['ReviewCaseSummaryDto'];
export type ReviewCaseList = Schemas['ReviewCaseListDto'];
export type CaseEntry = Schemas['CaseEntryDto'];
export type CaseEvidence = Schemas['CaseEvidenceDto'];
export type CaseStatus = Schemas['CaseStatus'];
export type CaseFinding = Schemas['CaseFinding'];
export type OpenCase = Schemas['OpenCaseDto'];
export type CaseTransition = Schemas['TransitionDto'];
export type CaseComment = Schemas['CommentDto'];

// ── reports: published snapshots, their parts, downloads ──
export type Report = Schemas['ReportDto'];
export type ReportList = Schemas['ReportListDto'];
export type ReportRegion = Schemas['ReportRegionDto'];
export type ReportPractice = Schemas['ReportPracticeDto'];
export type PeerTable = Schemas['PeerTableDto'];
export type DisclosedCell = Schemas['DisclosedCellDto'];
export type PublishReport = Schemas['PublishReportDto'];
export type WithdrawReport = Schemas['WithdrawReportDto'];
