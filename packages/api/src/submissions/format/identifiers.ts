/**
 * Headings that look like direct identifiers. The checklist is the HIPAA
 * Safe Harbor list of identifiers (45 CFR 164.514(b)(2)(i)), with the names
 * used in UK and European records for the same things (national health
 * numbers, postcodes). A file with such a column is refused before any row
 * is read, so nothing identifying is ever stored.
 *
 * Headings are matched in their normalised form (header.ts): lower case,
 * words joined by '_'.
 */

export interface IdentifierRule {
  /** What the heading appears to hold, for the message */
  what: string;
  pattern: RegExp;
}

/** Cairn's own columns that contain identifier-like words but are allowed (year only, or a reference). */
const ALLOWED = new Set([
  'birth_year',
  'year_of_birth',
  'yob',
  'record_ref',
  'practice_name',
  'practice_code',
]);

export const IDENTIFIER_RULES: readonly IdentifierRule[] = [
  {
    what: 'names',
    pattern:
      /(^|_)(first|last|given|family|sur|fore|full|middle|maiden|patient|person|nick)?_?names?($|_)|(^|_)(surname|forename|initials)($|_)/,
  },
  {
    what: 'a full date of birth',
    pattern: /(^|_)(dob|date_of_birth|birth_date|birthdate|birthday|d_o_b)($|_)/,
  },
  { what: 'a date of death', pattern: /(^|_)(dod|date_of_death|death_date|deceased_date)($|_)/ },
  {
    what: 'admission or discharge dates',
    pattern: /(^|_)(admission|admitted|discharge|discharged)_?(date)?($|_)/,
  },
  {
    what: 'an address',
    pattern: /(^|_)(address|addr|street|house|flat|town|city|county|district)($|_)|address_line/,
  },
  {
    what: 'a postcode or ZIP code',
    pattern: /(^|_)(post_?code|postal_?code|zip|zip_?code|zipcode)($|_)/,
  },
  {
    what: 'telephone or fax numbers',
    pattern: /(^|_)(phone|telephone|tel|mobile|cell|fax)(_?(no|number))?($|_)/,
  },
  { what: 'e-mail addresses', pattern: /(^|_)(e_?mail|email_address)($|_)/ },
  {
    what: 'a national health or insurance number',
    pattern:
      /(^|_)(nhs|chi|hcn|ssn|social_security|national_insurance|ni_number|insurance|medicare|medicaid|health_plan|beneficiary|health_number|health_card|personal_number|personnummer)(_?(no|number|id))?($|_)/,
  },
  {
    what: 'a medical record or hospital number',
    pattern:
      /(^|_)(mrn|medical_record|hospital_number|hospital_no|case_number|chart_number|patient_id|patient_number)($|_)/,
  },
  {
    what: 'account, licence or certificate numbers',
    pattern: /(^|_)(account|licen[cs]e|certificate|passport|driving)(_?(no|number|id))?($|_)/,
  },
  {
    what: 'vehicle or device identifiers',
    pattern:
      /(^|_)(vehicle|registration_plate|number_plate|licence_plate|license_plate|device_id|serial_number|imei)($|_)/,
  },
  {
    what: 'web addresses or IP addresses',
    pattern: /(^|_)(url|website|web_address|ip|ip_address)($|_)/,
  },
  {
    what: 'photographs or biometric identifiers',
    pattern:
      /(^|_)(photo|photograph|image|picture|fingerprint|biometric|voice_print|retina_scan)($|_)/,
  },
];

/** What the heading looks like it holds, or null when it is not identifier-like. */
export function identifierKind(normalisedHeading: string): string | null {
  if (ALLOWED.has(normalisedHeading)) return null;
  for (const rule of IDENTIFIER_RULES) {
    if (rule.pattern.test(normalisedHeading)) return rule.what;
  }
  return null;
}

const EMAIL = /^[^\s@]+@[^\s@]+\.[a-z]{2,}$/i;

/** An e-mail address in a reference cell. */
export function looksLikeEmail(value: string): boolean {
  return EMAIL.test(value);
}

/**
 * A 10-digit number passing the modulus 11 check used by the UK's NHS
 * number (weights 10…2 on the first nine digits; 11 − remainder is the check
 * digit, 11 → 0, 10 → invalid). Random 10-digit references pass about one
 * time in eleven, so the file is refused only when most references pass.
 */
export function passesModulus11(value: string): boolean {
  const digits = value.replace(/[\s-]/g, '');
  if (!/^\d{10}$/.test(digits)) return false;
  let sum = 0;
  for (let i = 0; i < 9; i++) sum += Number(digits[i]) * (10 - i);
  const check = 11 - (sum % 11);
  if (check === 10) return false;
  return (check === 11 ? 0 : check) === Number(digits[9]);
}
