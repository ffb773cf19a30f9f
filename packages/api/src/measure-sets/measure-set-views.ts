/** A measure-set version as the API sends it (dto/measure-set.dto.ts). */
import { canonicalJson } from './canonical.js';
import type { MeasureView } from './describe.js';
import type { MeasureSetDefinitionDto } from './dto/definition.dto.js';
import type {
  MeasureDto,
  MeasureSetActionsDto,
  MeasureSetDto,
  MeasureSetSummaryDto,
  MeasureSetUseDto,
} from './dto/measure-set.dto.js';
import type { MeasureSetRow } from './measure-set.repository.js';
import type { MeasureSetVersion } from './measure-sets.service.js';

export interface VersionContext {
  row: MeasureSetRow;
  defaultId: string;
  usedBy: MeasureSetUseDto[];
  actions: MeasureSetActionsDto;
}

const iso = (d: Date | string | null): string | null =>
  d === null ? null : new Date(d).toISOString();

export function toMeasureDto(m: MeasureView): MeasureDto {
  return {
    key: m.key,
    label: m.label,
    kind: m.kind,
    composite: m.composite,
    definition: m.definition,
    denominator: m.denominator,
    denominatorText: m.denominatorText,
    direction: m.direction,
    population: {
      types: [...m.population.types],
      minAge: m.population.minAge,
      maxAge: m.population.maxAge,
      text: m.populationText,
    },
    source: m.source,
    note: m.note,
    reads: m.reads.map((r) => r.field),
    components: [...m.components],
  };
}

export function toMeasureSetSummary(
  v: MeasureSetVersion,
  context: VersionContext,
): MeasureSetSummaryDto {
  const { row } = context;
  return {
    id: v.id,
    label: v.label,
    description: v.description,
    status: row.status,
    basedOn: row.based_on,
    shippedWithCairn: row.region_id === null,
    contentHash: row.content_hash,
    careProcesses: v.measures.filter((m) => m.kind === 'care_process').length,
    treatmentTargets: v.measures.filter((m) => m.kind === 'treatment_target').length,
    isDefault: v.id === context.defaultId,
    createdAt: iso(row.created_at)!,
    createdBy: row.created_by,
    publishedAt: iso(row.published_at),
    publishedBy: row.published_by,
    usedBy: context.usedBy,
    actions: context.actions,
  };
}

export function toMeasureSetDto(
  v: MeasureSetVersion,
  context: VersionContext & { suggestedDraftId: string | null; suggestedDraftLabel: string | null },
): MeasureSetDto {
  return {
    ...toMeasureSetSummary(v, context),
    eligibilityMinAge: v.compiled.eligibilityMinAge,
    retinalWindowMonths: v.compiled.retinalWindowMonths,
    breakdowns: v.compiled.dimensions.map((d) => ({
      key: d.key,
      label: d.label,
      categories: d.categories.map((c) => ({ key: c.key, label: c.label })),
    })),
    measures: v.measures.map(toMeasureDto),
    revision: context.row.revision,
    // Sent in the stored (canonical) form: what the hash is of.
    definition: JSON.parse(canonicalJson(v.definition)) as MeasureSetDefinitionDto,
    suggestedDraftId: context.suggestedDraftId,
    suggestedDraftLabel: context.suggestedDraftLabel,
  };
}
