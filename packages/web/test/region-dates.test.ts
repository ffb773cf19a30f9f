import { describe, expect, it } from 'vitest';
import { fromRegionDate, fromRegionTime } from '../src/lib/region-dates';

describe('dates and times as the region writes them', () => {
  it('reads a day in DD/MM/YYYY and refuses one the calendar lacks', () => {
    expect(fromRegionDate('14/02/2027')).toEqual({ ok: true, iso: '2027-02-14' });
    expect(fromRegionDate('1.3.2027')).toEqual({ ok: true, iso: '2027-03-01' });
    expect(fromRegionDate('31/02/2027')).toEqual({
      ok: false,
      message: 'There is no 31/02/2027 in the calendar.',
    });
    expect(fromRegionDate('2027-02-14')).toEqual({
      ok: false,
      message: 'Write the date as DD/MM/YYYY, for example 14/02/2027.',
    });
  });

  it('reads a time on the 24-hour clock and says what is wrong with one it cannot read', () => {
    expect(fromRegionTime('07:30')).toEqual({ ok: true, time: '07:30' });
    expect(fromRegionTime(' 7.05 ')).toEqual({ ok: true, time: '07:05' });
    expect(fromRegionTime('23:59')).toEqual({ ok: true, time: '23:59' });
    expect(fromRegionTime('')).toEqual({ ok: false, message: 'Enter a time, for example 07:30.' });
    for (const wrong of ['24:00', '12:60', '7pm', '0730', '12:5']) {
      expect(fromRegionTime(wrong)).toEqual({
        ok: false,
        message: 'Write the time as HH:MM on the 24-hour clock, for example 07:30.',
      });
    }
  });
});
