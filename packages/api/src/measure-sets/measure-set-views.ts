/** A decoded measure-set version as the API sends it (dto/measure-set.dto.ts). */
import type { MeasureView } from './describe.js';
import type { MeasureDto, MeasureSetDto, MeasureSetSummaryDto } from './dto/measure-set.dto.js';
import type { MeasureSetVersion } from './measure-sets.service.js';

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

export function toMeasureSetSummary(v: MeasureSetVersion, defaultId: string): MeasureSetSummaryDto {
  return {
    id: v.id,
    label: v.label,
    description: v.description,
    careProcesses: v.measures.filter((m) => m.kind === 'care_process').length,
    treatmentTargets: v.measures.filter((m) => m.kind === 'treatment_target').length,
    isDefault: v.id === defaultId,
  };
}

export function toMeasureSetDto(v: MeasureSetVersion, defaultId: string): MeasureSetDto {
  return {
    ...toMeasureSetSummary(v, defaultId),
    eligibilityMinAge: v.compiled.eligibilityMinAge,
    retinalWindowMonths: v.compiled.retinalWindowMonths,
    breakdowns: v.compiled.dimensions.map((d) => ({
      key: d.key,
      label: d.label,
      categories: d.categories.map((c) => ({ key: c.key, label: c.label })),
    })),
    measures: v.measures.map(toMeasureDto),
  };
}
