/**
 * Calendar dates as the region reads and writes them: day, month, year
 * (DD/MM/YYYY, as every date Cairn shows). The API speaks ISO (YYYY-MM-DD);
 * these convert between the two, and say in words what is wrong with text
 * that is not a date. Display only: the API checks every rule about dates.
 */
export const REGION_DATE_FORMAT = 'DD/MM/YYYY';

/** '2027-02-14' → '14/02/2027' */
export function toRegionDate(iso: string): string {
  const match = /^(\d{4})-(\d{2})-(\d{2})/.exec(iso);
  return match ? `${match[3]}/${match[2]}/${match[1]}` : iso;
}

export type ParsedDate = { ok: true; iso: string } | { ok: false; message: string };

/** Reads DD/MM/YYYY (also D/M/YYYY, with - or . between): the ISO date, or why not. */
export function fromRegionDate(text: string, example = '14/02/2027'): ParsedDate {
  const trimmed = text.trim();
  if (!trimmed) return { ok: false, message: `Enter a date, for example ${example}.` };
  const match = /^(\d{1,2})[/.-](\d{1,2})[/.-](\d{4})$/.exec(trimmed);
  if (!match) {
    return {
      ok: false,
      message: `Write the date as ${REGION_DATE_FORMAT}, for example ${example}.`,
    };
  }
  const [day, month, year] = [Number(match[1]), Number(match[2]), Number(match[3])];
  const date = new Date(Date.UTC(year, month - 1, day));
  if (
    month < 1 ||
    month > 12 ||
    date.getUTCFullYear() !== year ||
    date.getUTCMonth() !== month - 1 ||
    date.getUTCDate() !== day
  ) {
    return { ok: false, message: `There is no ${trimmed} in the calendar.` };
  }
  const pad = (n: number) => String(n).padStart(2, '0');
  return { ok: true, iso: `${year}-${pad(month)}-${pad(day)}` };
}

/** '2027-02-14' → '14 Feb 2027' */
export function formatRegionDate(iso: string | null | undefined): string {
  if (!iso) return '—';
  return new Date(`${iso.slice(0, 10)}T12:00:00Z`).toLocaleDateString('en-GB', {
    dateStyle: 'medium',
    timeZone: 'UTC',
  });
}

/** '2025-10' → 'Oct 2025' */
export function formatRegionMonth(month: string): string {
  return new Date(`${month}-01T12:00:00Z`).toLocaleDateString('en-GB', {
    month: 'short',
    year: 'numeric',
    timeZone: 'UTC',
  });
}

export type ParsedTime = { ok: true; time: string } | { ok: false; message: string };

/** Reads a time of day on the 24-hour clock (HH:MM, also H:MM or HH.MM): 'HH:MM', or why not. */
export function fromRegionTime(text: string, example = '07:30'): ParsedTime {
  const trimmed = text.trim();
  if (!trimmed) return { ok: false, message: `Enter a time, for example ${example}.` };
  const match = /^(\d{1,2})[:.](\d{2})$/.exec(trimmed);
  const [hour, minute] = match ? [Number(match[1]), Number(match[2])] : [NaN, NaN];
  if (!match || hour > 23 || minute > 59) {
    return {
      ok: false,
      message: `Write the time as HH:MM on the 24-hour clock, for example ${example}.`,
    };
  }
  return { ok: true, time: `${String(hour).padStart(2, '0')}:${String(minute).padStart(2, '0')}` };
}
