/**
 * Cairn's extract format: every column of the quarterly extract, defined once.
 *
 * This module drives the XLSX and CSV templates (template/), the header
 * matcher and the row validator (validate/), and docs/extract-format.md
 * (format/docs.ts renders it; a test keeps the file in step). Change a column
 * here and everything else follows.
 *
 * Canonical units are those of the care record (@cairn/metrics, record.ts).
 * Conversions are the published ones of docs/methods.md §6 (IFCC–NGSP master
 * equation for HbA1c; molar masses for cholesterol, creatinine, ACR, glucose),
 * implemented in @cairn/metrics/src/units. Converted values are rounded to
 * the reporting precision of the canonical unit, as laboratories report them
 * (common practice): HbA1c whole mmol/mol, creatinine whole µmol/L,
 * cholesterol, ACR and glucose to 0.1.
 */
import {
  acrMgMmolFromMgG,
  cholesterolMmolLFromMgDl,
  creatinineUmolLFromMgDl,
  glucoseMmolLFromMgDl,
  hba1cMmolMolFromPercent,
} from '@cairn/metrics';

export type ColumnKind = 'ref' | 'year' | 'code' | 'date' | 'number' | 'yesno' | 'unit';

export interface UnitDef {
  /** The unit as written in the template and the drop-down, e.g. 'mmol/mol' */
  code: string;
  /** Other spellings accepted in a unit column, a heading suffix or after a value (compared lower-case, without spaces) */
  aliases: readonly string[];
  /** Conversion to the column's canonical unit (identity for the canonical unit) */
  toCanonical: (value: number) => number;
  /** The conversion rule and its source, in words (docs/methods.md §6); none for a canonical unit */
  rule?: string;
}

export interface CodeDef {
  value: string;
  label: string;
  /** Other spellings accepted (compared lower-case, without spaces, hyphens or underscores) */
  aliases: readonly string[];
}

export interface ColumnDef {
  /** The heading, as written in the template */
  key: string;
  kind: ColumnKind;
  /** Section of the data dictionary */
  group: 'person' | 'care process' | 'treatment and history' | 'diagnosis';
  /** What the column holds, in plain words */
  meaning: string;
  /** The file is refused when this column is missing */
  required: boolean;
  /** A blank cell is a row error */
  valueRequired: boolean;
  codes?: readonly CodeDef[];
  /** For numbers: accepted units, the canonical one first */
  units?: readonly UnitDef[];
  /** For numbers with units: the column that may name each row's unit */
  unitColumn?: string;
  /** For unit columns: the value column whose unit they give */
  unitFor?: string;
  /** Plausible range in the canonical unit (docs/methods.md §7, common practice) */
  range?: { min: number; max: number };
  /** Decimal places kept after a unit conversion */
  decimals?: number;
  /** Other headings accepted for this column (normalised form, see header.ts) */
  aliases?: readonly string[];
  example: string;
  /** Excel number format in the template */
  numFmt?: string;
  width?: number;
}

const round = (decimals: number) => (value: number) => {
  const factor = 10 ** decimals;
  return Math.round(value * factor) / factor;
};
const identity = (value: number) => value;

export const UNITS = {
  hba1cMmolMol: {
    code: 'mmol/mol',
    aliases: ['mmol/mol', 'mmolmol', 'mmol_mol', 'ifcc'],
    toCanonical: identity,
  },
  hba1cPercent: {
    code: '%',
    aliases: ['%', 'percent', 'pct', 'dcct', 'ngsp'],
    toCanonical: (v: number) => round(0)(hba1cMmolMolFromPercent(v)),
    rule: 'mmol/mol = (% − 2.15) × 10.929, rounded to a whole number (IFCC–NGSP master equation, Hoelzel et al., Clin Chem 2004;50:166–74)',
  },
  mmolL: { code: 'mmol/L', aliases: ['mmol/l', 'mmoll', 'mmol_l'], toCanonical: identity },
  cholesterolMgDl: {
    code: 'mg/dL',
    aliases: ['mg/dl', 'mgdl', 'mg_dl'],
    toCanonical: (v: number) => round(1)(cholesterolMmolLFromMgDl(v)),
    rule: 'mmol/L = mg/dL ÷ 38.67, to 0.1 (molar mass of cholesterol 386.65 g/mol)',
  },
  umolL: {
    code: 'umol/L',
    aliases: ['umol/l', 'µmol/l', 'μmol/l', 'umoll', 'umol_l', 'micromol/l'],
    toCanonical: identity,
  },
  creatinineMgDl: {
    code: 'mg/dL',
    aliases: ['mg/dl', 'mgdl', 'mg_dl'],
    toCanonical: (v: number) => round(0)(creatinineUmolLFromMgDl(v)),
    rule: 'µmol/L = mg/dL × 88.42, rounded to a whole number (molar mass of creatinine 113.12 g/mol)',
  },
  mgMmol: { code: 'mg/mmol', aliases: ['mg/mmol', 'mgmmol', 'mg_mmol'], toCanonical: identity },
  acrMgG: {
    code: 'mg/g',
    aliases: ['mg/g', 'mgg', 'mg_g', 'ug/mg', 'µg/mg'],
    toCanonical: (v: number) => round(1)(acrMgMmolFromMgG(v)),
    rule: 'mg/mmol = mg/g ÷ 8.84, to 0.1 (from the molar mass of creatinine)',
  },
  glucoseMgDl: {
    code: 'mg/dL',
    aliases: ['mg/dl', 'mgdl', 'mg_dl'],
    toCanonical: (v: number) => round(1)(glucoseMmolLFromMgDl(v)),
    rule: 'mmol/L = mg/dL ÷ 18.016, to 0.1 (molar mass of glucose 180.16 g/mol)',
  },
  kgM2: { code: 'kg/m2', aliases: ['kg/m2', 'kg/m²', 'kgm2', 'kg_m2'], toCanonical: identity },
  mmHg: { code: 'mmHg', aliases: ['mmhg', 'mm_hg'], toCanonical: identity },
} satisfies Record<string, UnitDef>;

const yesNo = 'yes or no (also accepted: y/n, true/false, 1/0); blank when not recorded';

/** The care processes of docs/methods.md §2, with the columns that hold each. */
export interface ProcessDef {
  key: string;
  label: string;
  dateColumn: string;
  /** Value columns that must accompany the date (none for foot and retinal checks) */
  valueColumns: readonly string[];
}

export const CARE_PROCESSES: readonly ProcessDef[] = [
  { key: 'hba1c', label: 'HbA1c', dateColumn: 'hba1c_date', valueColumns: ['hba1c_value'] },
  {
    key: 'blood_pressure',
    label: 'Blood pressure',
    dateColumn: 'bp_date',
    valueColumns: ['bp_systolic', 'bp_diastolic'],
  },
  {
    key: 'cholesterol',
    label: 'Total cholesterol',
    dateColumn: 'cholesterol_date',
    valueColumns: ['cholesterol_value'],
  },
  {
    key: 'serum_creatinine',
    label: 'Serum creatinine',
    dateColumn: 'creatinine_date',
    valueColumns: ['creatinine_value'],
  },
  {
    key: 'urine_albumin',
    label: 'Urine albumin:creatinine ratio (ACR)',
    dateColumn: 'acr_date',
    valueColumns: ['acr_value'],
  },
  {
    key: 'foot_surveillance',
    label: 'Foot risk assessment',
    dateColumn: 'foot_check_date',
    valueColumns: [],
  },
  { key: 'bmi', label: 'BMI', dateColumn: 'bmi_date', valueColumns: ['bmi_value'] },
  {
    key: 'smoking',
    label: 'Smoking status',
    dateColumn: 'smoking_date',
    valueColumns: ['smoking_status'],
  },
  {
    key: 'retinal_screening',
    label: 'Retinal screening',
    dateColumn: 'retinal_screening_date',
    valueColumns: [],
  },
];

const dateColumn = (
  key: string,
  what: string,
  example: string,
  aliases: string[] = [],
): ColumnDef => ({
  key,
  kind: 'date',
  group: 'care process',
  meaning: `Date of the most recent ${what} (Cairn keeps the month only). Blank when none was recorded.`,
  required: true,
  valueRequired: false,
  aliases,
  example,
  numFmt: 'yyyy-mm-dd',
  width: 14,
});

export const COLUMNS: readonly ColumnDef[] = [
  {
    key: 'record_ref',
    kind: 'ref',
    group: 'person',
    meaning:
      "The practice's own reference for the person, so that the practice can find them again (recall lists). Not a name, date of birth or national health number. Each person appears once.",
    required: true,
    valueRequired: true,
    aliases: ['record_reference', 'patient_ref', 'reference', 'ref'],
    example: 'QB-004217',
    width: 14,
  },
  {
    key: 'birth_year',
    kind: 'year',
    group: 'person',
    meaning: 'Year of birth (four digits). Never the full date of birth.',
    required: true,
    valueRequired: true,
    aliases: ['year_of_birth', 'yob'],
    range: { min: 1900, max: 9999 },
    example: '1958',
    numFmt: '0',
    width: 11,
  },
  {
    key: 'sex',
    kind: 'code',
    group: 'person',
    meaning: 'Sex as recorded. Blank is read as U (not recorded).',
    required: true,
    valueRequired: false,
    codes: [
      { value: 'F', label: 'female', aliases: ['female', 'f', 'woman'] },
      { value: 'M', label: 'male', aliases: ['male', 'm', 'man'] },
      {
        value: 'X',
        label: 'another or indeterminate',
        aliases: ['x', 'other', 'indeterminate', 'intersex'],
      },
      { value: 'U', label: 'not recorded', aliases: ['u', 'unknown', 'notrecorded', 'notknown'] },
    ],
    aliases: ['gender'],
    example: 'F',
    width: 6,
  },
  {
    key: 'diabetes_type',
    kind: 'code',
    group: 'person',
    meaning:
      'Type of diabetes. Blank when not recorded: the person is then kept but not counted in any measure.',
    required: true,
    valueRequired: false,
    codes: [
      {
        value: 'type1',
        label: 'type 1 diabetes',
        aliases: ['type1', 't1', '1', 't1dm', 'typei', 'dmtype1'],
      },
      {
        value: 'type2',
        label: 'type 2 diabetes',
        aliases: ['type2', 't2', '2', 't2dm', 'typeii', 'dmtype2'],
      },
      {
        value: 'other',
        label: 'another type (e.g. monogenic, after pancreatitis)',
        aliases: ['other', 'othertype'],
      },
    ],
    aliases: ['type_of_diabetes', 'diabetes'],
    example: 'type2',
    width: 13,
  },
  {
    key: 'diagnosis_year',
    kind: 'year',
    group: 'person',
    meaning: 'Year diabetes was diagnosed. Blank when not known.',
    required: true,
    valueRequired: false,
    aliases: ['year_of_diagnosis', 'diagnosed_year', 'year_diagnosed'],
    range: { min: 1900, max: 9999 },
    example: '2014',
    numFmt: '0',
    width: 14,
  },
  {
    key: 'deprivation_quintile',
    kind: 'code',
    group: 'person',
    meaning:
      'Deprivation quintile of the area where the person lives: 1 most deprived … 5 least deprived. Optional column.',
    required: false,
    valueRequired: false,
    codes: [1, 2, 3, 4, 5].map((q) => ({
      value: String(q),
      label: q === 1 ? 'most deprived' : q === 5 ? 'least deprived' : `quintile ${q}`,
      aliases: [String(q)],
    })),
    aliases: ['deprivation', 'imd_quintile'],
    example: '3',
    numFmt: '0',
    width: 12,
  },
  dateColumn('hba1c_date', 'HbA1c result', '2026-05-14'),
  {
    key: 'hba1c_value',
    kind: 'number',
    group: 'care process',
    meaning:
      'Most recent HbA1c result. mmol/mol unless hba1c_unit (or the heading, e.g. "hba1c_value (%)") says %; a value from 3 to 20 with no unit is read as %.',
    required: true,
    valueRequired: false,
    units: [UNITS.hba1cMmolMol, UNITS.hba1cPercent],
    unitColumn: 'hba1c_unit',
    range: { min: 20, max: 200 },
    decimals: 0,
    aliases: ['hba1c'],
    example: '58',
    numFmt: '0',
    width: 12,
  },
  {
    key: 'hba1c_unit',
    kind: 'unit',
    group: 'care process',
    meaning: 'Unit of hba1c_value: mmol/mol or %. Optional column; blank means mmol/mol.',
    required: false,
    valueRequired: false,
    unitFor: 'hba1c_value',
    example: 'mmol/mol',
    width: 11,
  },
  dateColumn('bp_date', 'blood pressure reading', '2026-05-14', ['blood_pressure_date']),
  {
    key: 'bp_systolic',
    kind: 'number',
    group: 'care process',
    meaning: 'Systolic blood pressure of that reading, mmHg.',
    required: true,
    valueRequired: false,
    units: [UNITS.mmHg],
    range: { min: 60, max: 260 },
    aliases: ['systolic', 'systolic_bp', 'sbp'],
    example: '134',
    numFmt: '0',
    width: 11,
  },
  {
    key: 'bp_diastolic',
    kind: 'number',
    group: 'care process',
    meaning: 'Diastolic blood pressure of that reading, mmHg.',
    required: true,
    valueRequired: false,
    units: [UNITS.mmHg],
    range: { min: 30, max: 160 },
    aliases: ['diastolic', 'diastolic_bp', 'dbp'],
    example: '78',
    numFmt: '0',
    width: 12,
  },
  dateColumn('cholesterol_date', 'total cholesterol result', '2026-03-02'),
  {
    key: 'cholesterol_value',
    kind: 'number',
    group: 'care process',
    meaning: 'Most recent total cholesterol. mmol/L unless cholesterol_unit says mg/dL.',
    required: true,
    valueRequired: false,
    units: [UNITS.mmolL, UNITS.cholesterolMgDl],
    unitColumn: 'cholesterol_unit',
    range: { min: 1, max: 20 },
    decimals: 1,
    aliases: ['total_cholesterol', 'cholesterol'],
    example: '4.6',
    numFmt: '0.0',
    width: 13,
  },
  {
    key: 'cholesterol_unit',
    kind: 'unit',
    group: 'care process',
    meaning: 'Unit of cholesterol_value: mmol/L or mg/dL. Optional column; blank means mmol/L.',
    required: false,
    valueRequired: false,
    unitFor: 'cholesterol_value',
    example: 'mmol/L',
    width: 11,
  },
  dateColumn('creatinine_date', 'serum creatinine result', '2026-03-02', ['serum_creatinine_date']),
  {
    key: 'creatinine_value',
    kind: 'number',
    group: 'care process',
    meaning:
      'Most recent serum creatinine. µmol/L (write umol/L) unless creatinine_unit says mg/dL.',
    required: true,
    valueRequired: false,
    units: [UNITS.umolL, UNITS.creatinineMgDl],
    unitColumn: 'creatinine_unit',
    range: { min: 20, max: 2000 },
    decimals: 0,
    aliases: ['serum_creatinine', 'creatinine'],
    example: '88',
    numFmt: '0',
    width: 12,
  },
  {
    key: 'creatinine_unit',
    kind: 'unit',
    group: 'care process',
    meaning: 'Unit of creatinine_value: umol/L or mg/dL. Optional column; blank means umol/L.',
    required: false,
    valueRequired: false,
    unitFor: 'creatinine_value',
    example: 'umol/L',
    width: 11,
  },
  dateColumn('acr_date', 'urine albumin:creatinine ratio (ACR)', '2026-03-02', [
    'urine_albumin_date',
  ]),
  {
    key: 'acr_value',
    kind: 'number',
    group: 'care process',
    meaning: 'Most recent urine albumin:creatinine ratio. mg/mmol unless acr_unit says mg/g.',
    required: true,
    valueRequired: false,
    units: [UNITS.mgMmol, UNITS.acrMgG],
    unitColumn: 'acr_unit',
    range: { min: 0, max: 3000 },
    decimals: 1,
    aliases: ['acr', 'urine_acr', 'albumin_creatinine_ratio'],
    example: '1.8',
    numFmt: '0.0',
    width: 10,
  },
  {
    key: 'acr_unit',
    kind: 'unit',
    group: 'care process',
    meaning: 'Unit of acr_value: mg/mmol or mg/g. Optional column; blank means mg/mmol.',
    required: false,
    valueRequired: false,
    unitFor: 'acr_value',
    example: 'mg/mmol',
    width: 10,
  },
  dateColumn('foot_check_date', 'foot risk assessment', '2025-11-20', [
    'foot_date',
    'foot_surveillance_date',
  ]),
  dateColumn('bmi_date', 'BMI measurement', '2026-05-14'),
  {
    key: 'bmi_value',
    kind: 'number',
    group: 'care process',
    meaning: 'Most recent body mass index, kg/m2.',
    required: true,
    valueRequired: false,
    units: [UNITS.kgM2],
    range: { min: 10, max: 90 },
    aliases: ['bmi'],
    example: '31.4',
    numFmt: '0.0',
    width: 10,
  },
  dateColumn('smoking_date', 'smoking status record', '2026-05-14'),
  {
    key: 'smoking_status',
    kind: 'code',
    group: 'care process',
    meaning: 'Smoking status as last recorded.',
    required: true,
    valueRequired: false,
    codes: [
      { value: 'current', label: 'smokes now', aliases: ['current', 'smoker', 'currentsmoker'] },
      {
        value: 'ex',
        label: 'used to smoke',
        aliases: ['ex', 'former', 'exsmoker', 'formersmoker'],
      },
      { value: 'never', label: 'has never smoked', aliases: ['never', 'neversmoked', 'nonsmoker'] },
    ],
    aliases: ['smoking'],
    example: 'never',
    width: 14,
  },
  dateColumn('retinal_screening_date', 'retinal (eye) screening', '2025-09-08', [
    'retinal_date',
    'eye_screening_date',
  ]),
  {
    key: 'on_statin',
    kind: 'yesno',
    group: 'treatment and history',
    meaning: `Currently prescribed a statin: ${yesNo}.`,
    required: true,
    valueRequired: false,
    aliases: ['statin'],
    example: 'yes',
    width: 10,
  },
  {
    key: 'on_insulin',
    kind: 'yesno',
    group: 'treatment and history',
    meaning: `Currently treated with insulin: ${yesNo}.`,
    required: true,
    valueRequired: false,
    aliases: ['insulin'],
    example: 'no',
    width: 10,
  },
  {
    key: 'insulin_start_year',
    kind: 'year',
    group: 'treatment and history',
    meaning: 'Year insulin was started. Blank when never started or not known.',
    required: true,
    valueRequired: false,
    aliases: ['year_insulin_started', 'insulin_year'],
    range: { min: 1900, max: 9999 },
    example: '',
    numFmt: '0',
    width: 17,
  },
  {
    key: 'cvd_history',
    kind: 'yesno',
    group: 'treatment and history',
    meaning: `Has had cardiovascular disease (heart attack, angina, stroke, TIA, peripheral arterial disease): ${yesNo}.`,
    required: true,
    valueRequired: false,
    aliases: ['cardiovascular_history', 'cvd'],
    example: 'no',
    width: 11,
  },
  {
    key: 'diagnostic_test',
    kind: 'code',
    group: 'diagnosis',
    meaning:
      'The test on which diabetes was diagnosed, where known. Optional column, used only for a data-quality check against the WHO thresholds.',
    required: false,
    valueRequired: false,
    codes: [
      {
        value: 'fasting_glucose',
        label: 'fasting plasma glucose',
        aliases: ['fastingglucose', 'fpg', 'fasting'],
      },
      {
        value: 'two_hour_glucose',
        label: '2-hour glucose of an oral glucose tolerance test',
        aliases: ['twohourglucose', '2hourglucose', 'ogtt', '2hglucose'],
      },
      {
        value: 'random_glucose',
        label: 'random plasma glucose',
        aliases: ['randomglucose', 'rpg', 'random'],
      },
      { value: 'hba1c', label: 'HbA1c', aliases: ['hba1c'] },
    ],
    example: 'hba1c',
    width: 16,
  },
  {
    key: 'diagnostic_value',
    kind: 'number',
    group: 'diagnosis',
    meaning:
      'Result of that diagnostic test: glucose in mmol/L (or mg/dL), HbA1c in mmol/mol (or %), as diagnostic_unit says. Optional column.',
    required: false,
    valueRequired: false,
    units: [UNITS.mmolL, UNITS.glucoseMgDl, UNITS.hba1cMmolMol, UNITS.hba1cPercent],
    unitColumn: 'diagnostic_unit',
    decimals: 1,
    example: '52',
    numFmt: '0.0',
    width: 15,
  },
  {
    key: 'diagnostic_unit',
    kind: 'unit',
    group: 'diagnosis',
    meaning:
      'Unit of diagnostic_value: mmol/L or mg/dL for glucose, mmol/mol or % for HbA1c. Optional column.',
    required: false,
    valueRequired: false,
    unitFor: 'diagnostic_value',
    example: 'mmol/mol',
    width: 14,
  },
];

export const COLUMN_BY_KEY: ReadonlyMap<string, ColumnDef> = new Map(
  COLUMNS.map((c) => [c.key, c]),
);

export function column(key: string): ColumnDef {
  const def = COLUMN_BY_KEY.get(key);
  if (!def) throw new Error(`no extract column ${key}`);
  return def;
}

export const REQUIRED_COLUMNS = COLUMNS.filter((c) => c.required).map((c) => c.key);

/** The units a unit column accepts: those of the value column it describes. */
export function unitsOf(def: ColumnDef): readonly UnitDef[] {
  if (def.units) return def.units;
  if (def.unitFor) return column(def.unitFor).units ?? [];
  return [];
}

/** Normalises a unit as written: lower case, no spaces; µ and μ kept as aliases list them. */
export function normaliseUnit(text: string): string {
  return text.trim().toLowerCase().replace(/\s+/g, '').replace(/²/g, '2');
}

/** The unit of `def` that `text` names, or null. */
export function findUnit(def: ColumnDef, text: string): UnitDef | null {
  const wanted = normaliseUnit(text);
  for (const unit of unitsOf(def)) {
    if (unit.aliases.some((a) => normaliseUnit(a) === wanted)) return unit;
  }
  return null;
}

/**
 * Diagnostic thresholds, canonical units: WHO 2006 for fasting and 2-hour glucose, WHO 2011 for
 * HbA1c; the random glucose threshold (with symptoms) is the ADA Standards of Care's diagnostic
 * criterion (recalled from memory; docs/methods.md §7).
 */
export const DIAGNOSTIC_THRESHOLDS: Record<string, { min: number; unit: string; source: string }> =
  {
    fasting_glucose: { min: 7.0, unit: 'mmol/L', source: 'WHO 2006' },
    two_hour_glucose: { min: 11.1, unit: 'mmol/L', source: 'WHO 2006' },
    random_glucose: { min: 11.1, unit: 'mmol/L', source: 'ADA Standards of Care, with symptoms' },
    hba1c: { min: 48, unit: 'mmol/mol', source: 'WHO 2011' },
  };
