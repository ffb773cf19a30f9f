import { gunzipSync } from 'node:zlib';
import { encodeAnswer } from './answer-encoding.js';

describe('encodeAnswer', () => {
  it('sends non-integers to six figures, integers and strings exactly, and its gzip is of the same bytes', async () => {
    const answer = {
      rate: 0.8571428571428571,
      n: 14,
      limits: [0.5120499370447547, 0.9999999999999999],
      label: 'HbA1c 0.123456789',
      none: null,
    };
    const { plain, gzip } = await encodeAnswer(answer);
    expect(plain.toString('utf8')).toBe(
      '{"rate":0.857143,"n":14,"limits":[0.51205,1],"label":"HbA1c 0.123456789","none":null}',
    );
    expect(gunzipSync(gzip).equals(plain)).toBe(true);
  });
});
