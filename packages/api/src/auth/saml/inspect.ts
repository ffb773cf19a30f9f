/**
 * Reading facts out of a posted SAML response, for explaining a refusal and
 * for the checks node-saml leaves to its caller (Destination, Recipient,
 * Issuer). Facts used to decide access are read only from XML whose
 * signature node-saml has verified; the rest is labelled unverified.
 */
import { DOMParser } from '@xmldom/xmldom';

const PROTOCOL = 'urn:oasis:names:tc:SAML:2.0:protocol';
const ASSERTION = 'urn:oasis:names:tc:SAML:2.0:assertion';
const DSIG = 'http://www.w3.org/2000/09/xmldsig#';

type El = {
  localName: string | null;
  namespaceURI: string | null;
  getAttribute(name: string): string | null;
  childNodes: ArrayLike<unknown>;
  textContent: string | null;
  getElementsByTagNameNS(ns: string, name: string): ArrayLike<El>;
};

export function parseXml(xml: string): El | null {
  try {
    let failed = false;
    const doc = new DOMParser({
      errorHandler: {
        warning: () => undefined,
        error: () => {
          failed = true;
        },
        fatalError: () => {
          failed = true;
        },
      },
    }).parseFromString(xml, 'text/xml');
    const root = doc?.documentElement as unknown as El | null;
    return failed || !root ? null : root;
  } catch {
    return null;
  }
}

function children(el: El, ns: string, name: string): El[] {
  return Array.from(el.childNodes as ArrayLike<El>).filter(
    (n) => n && n.localName === name && n.namespaceURI === ns,
  );
}

export interface ResponseFacts {
  readable: boolean;
  isResponse: boolean;
  destination: string | null;
  inResponseTo: string | null;
  responseIssuer: string | null;
  responseSigned: boolean;
  assertionCount: number;
  assertionSigned: boolean;
  /** Unverified: what the response claims about the subject */
  claimedSubject: string | null;
  subjectNotBefore: string | null;
  subjectNotOnOrAfter: string | null;
  conditionsNotBefore: string | null;
  conditionsNotOnOrAfter: string | null;
}

export function responseFacts(xml: string): ResponseFacts {
  const root = parseXml(xml);
  const empty: ResponseFacts = {
    readable: false,
    isResponse: false,
    destination: null,
    inResponseTo: null,
    responseIssuer: null,
    responseSigned: false,
    assertionCount: 0,
    assertionSigned: false,
    claimedSubject: null,
    subjectNotBefore: null,
    subjectNotOnOrAfter: null,
    conditionsNotBefore: null,
    conditionsNotOnOrAfter: null,
  };
  if (!root) return empty;
  const isResponse = root.localName === 'Response' && root.namespaceURI === PROTOCOL;
  if (!isResponse) return { ...empty, readable: true };
  const assertions = children(root, ASSERTION, 'Assertion');
  const assertion = assertions[0];
  const subject = assertion ? children(assertion, ASSERTION, 'Subject')[0] : undefined;
  const confirmation = subject
    ? subject.getElementsByTagNameNS(ASSERTION, 'SubjectConfirmationData')[0]
    : undefined;
  const conditions = assertion ? children(assertion, ASSERTION, 'Conditions')[0] : undefined;
  return {
    readable: true,
    isResponse,
    destination: root.getAttribute('Destination') || null,
    inResponseTo: root.getAttribute('InResponseTo') || null,
    responseIssuer: children(root, ASSERTION, 'Issuer')[0]?.textContent?.trim() ?? null,
    responseSigned: children(root, DSIG, 'Signature').length > 0,
    assertionCount: assertions.length,
    assertionSigned: assertion ? children(assertion, DSIG, 'Signature').length > 0 : false,
    claimedSubject:
      (subject ? children(subject, ASSERTION, 'NameID')[0]?.textContent?.trim() : null) ?? null,
    subjectNotBefore: confirmation?.getAttribute('NotBefore') || null,
    subjectNotOnOrAfter: confirmation?.getAttribute('NotOnOrAfter') || null,
    conditionsNotBefore: conditions?.getAttribute('NotBefore') || null,
    conditionsNotOnOrAfter: conditions?.getAttribute('NotOnOrAfter') || null,
  };
}

/** The Recipient values of the (verified) assertion's bearer subject confirmations. */
export function assertionRecipients(assertionXml: string): string[] {
  const root = parseXml(assertionXml);
  if (!root) return [];
  return Array.from(root.getElementsByTagNameNS(ASSERTION, 'SubjectConfirmationData'))
    .map((el) => el.getAttribute('Recipient'))
    .filter((r): r is string => Boolean(r));
}
