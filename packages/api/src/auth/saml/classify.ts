/** Turns node-saml's error messages into Cairn's refusal codes, with the facts behind them. */
import { SignInRefused } from '../sign-in-refusal.js';
import type { SamlRequestCache } from './request-cache.js';
import { responseFacts } from './inspect.js';

export async function classifySamlError(
  error: unknown,
  samlResponse: string | undefined,
  cache: SamlRequestCache,
  clockSkewMs: number,
): Promise<SignInRefused> {
  if (error instanceof SignInRefused) return error;
  const message = error instanceof Error ? error.message : String(error);
  if (!samlResponse) return new SignInRefused('no-response');
  const xml = Buffer.from(samlResponse, 'base64').toString('utf8');
  const facts = responseFacts(xml);
  const detail = {
    libraryMessage: message,
    inResponseTo: facts.inResponseTo,
    unverifiedSubject: facts.claimedSubject,
    unverifiedIssuer: facts.responseIssuer,
  };
  const refuse = (code: ConstructorParameters<typeof SignInRefused>[0]) =>
    new SignInRefused(code, detail);
  if (!facts.readable) return refuse('not-saml');
  // More than one assertion is a wrapping attempt, whatever else failed first.
  if (facts.assertionCount > 1) return refuse('multiple-assertions');
  if (/InResponseTo is missing/.test(message)) return refuse('unsolicited');
  if (
    /InResponseTo is not valid|SubjectInResponseTo is not valid|InResponseTo does not match/.test(
      message,
    )
  ) {
    const state = await cache.state(facts.inResponseTo);
    return refuse(
      state === 'used' ? 'replayed' : state === 'expired' ? 'request-expired' : 'unknown-request',
    );
  }
  if (/Invalid document signature/.test(message)) {
    return refuse(facts.responseSigned ? 'signature-invalid' : 'response-unsigned');
  }
  if (/^Invalid signature/.test(message)) {
    return refuse(facts.assertionSigned ? 'signature-invalid' : 'assertion-unsigned');
  }
  if (
    /Too many signatures|ID cannot refer|Referenced node|too many transforms|signed references|ref URI/.test(
      message,
    )
  ) {
    return refuse('signature-invalid');
  }
  if (/audience|AudienceRestriction/i.test(message)) return refuse('audience');
  if (/not yet valid/.test(message)) return refuse('not-yet-valid');
  if (/expired/.test(message)) return refuse('expired');
  if (/No valid subject confirmation/.test(message)) {
    const now = Date.now();
    if (facts.subjectNotOnOrAfter && Date.parse(facts.subjectNotOnOrAfter) <= now - clockSkewMs)
      return refuse('expired');
    if (facts.subjectNotBefore && Date.parse(facts.subjectNotBefore) > now + clockSkewMs)
      return refuse('not-yet-valid');
    return refuse('invalid-response');
  }
  if (/SAML provider returned/.test(message)) return refuse('idp-refused');
  if (/Missing SAML assertion/.test(message)) return refuse('no-assertion');
  return refuse('invalid-response');
}
