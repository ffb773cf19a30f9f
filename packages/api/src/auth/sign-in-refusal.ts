/**
 * Why a sign-in was refused: a stable code (sent to the web's refusal page
 * as /sign-in?refused=<code>, and kept in the audit trail) and a plain
 * explanation for the audit trail. The web has its own words for the person.
 */
export const REFUSAL_REASONS = {
  'no-response': 'no SAML response was posted',
  'not-saml': 'the posted SAML response is not readable XML',
  'response-unsigned': 'the response is not signed by the identity provider',
  'assertion-unsigned': 'the assertion is not signed by the identity provider',
  'signature-invalid':
    'a signature does not verify: the content was changed after signing, or it was signed with a key Cairn does not trust',
  'multiple-assertions':
    'the response carries more than one assertion (a signature wrapping attempt)',
  'no-assertion': 'the response carries no assertion',
  audience: 'the assertion is meant for another service (wrong audience)',
  destination: "the response was addressed to another service (Destination is not Cairn's ACS)",
  recipient: "the assertion's subject confirmation names another recipient",
  issuer: 'the response was issued by an identity provider Cairn does not trust',
  expired: 'the assertion has expired (NotOnOrAfter is in the past)',
  'not-yet-valid': 'the assertion is not valid yet (NotBefore is in the future)',
  unsolicited:
    'the response answers no request (no InResponseTo); Cairn accepts only answers to its own sign-in requests',
  'unknown-request': 'the response answers a request Cairn never made (unknown InResponseTo)',
  'request-expired': 'the response answers a sign-in request that is too old',
  replayed: 'the response was already used once (replay)',
  'idp-refused': 'the identity provider reported that the sign-in did not succeed',
  'missing-email': 'the assertion carries no e-mail address',
  'unknown-user': 'the person is not known to Cairn',
  deactivated: "the person's Cairn account is deactivated",
  'no-role': "the identity provider's role attribute names no Cairn role",
  'unknown-practice': 'the identity provider names practice codes Cairn does not know',
  'no-practice': 'a practice lead must have at least one practice',
  'no-region': 'Cairn has no region yet to add people to',
  throttled: 'too many sign-in attempts from this address',
  'idp-unavailable': "the identity provider's settings could not be read",
  'invalid-response': 'the response is not valid',
} as const;

export type RefusalCode = keyof typeof REFUSAL_REASONS;

/** A refused sign-in. `detail` goes to the audit trail (never to the browser). */
export class SignInRefused extends Error {
  constructor(
    readonly code: RefusalCode,
    readonly detail: Record<string, unknown> = {},
  ) {
    super(REFUSAL_REASONS[code]);
    this.name = 'SignInRefused';
  }
}
