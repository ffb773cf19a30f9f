/**
 * Cairn's local fake SAML identity provider (development and tests only),
 * built on samlify. It stands in for an organisation's single sign-on:
 *
 *   GET  /idp/metadata  its SAML metadata (entity ID, SSO/SLO URLs, signing certificate)
 *   GET  /idp/sso       HTTP-Redirect AuthnRequest from Cairn → Cairn's persona picker
 *   POST /idp/sso       the chosen persona → a signed Response posted back to Cairn's ACS
 *   GET  /idp/slo       HTTP-Redirect LogoutRequest from Cairn → LogoutResponse back
 *
 * Each assertion carries e-mail, display name, role and practice codes as
 * attributes (names from auth.attributes, role values from auth.roleMapping).
 * `buildLoginResponse` also takes overrides, so tests can craft the wrong
 * answers Cairn must refuse (wrong audience, expired, unsigned, other key…).
 * It keeps no state: the pending request travels in the picker's form.
 */
import { randomUUID } from 'node:crypto';
import express, { type Request, type Response, type Router } from 'express';
import samlify from 'samlify';
import type { CairnConfig } from '../../config/config.schema.js';
import { fakeIdpEndpoints, spEndpoints } from '../../auth/saml/endpoints.js';
import { ensureSigningIdentity, type SigningIdentity } from './identity.js';
import { loadPersonas, type Persona } from './personas.js';
import { autoPostPage, idpErrorPage, pickerPage, signedOutPage } from './pages.js';

// The fake trusts its own XML; samlify refuses to parse without a validator.
samlify.setSchemaValidator({ validate: () => Promise.resolve('skipped for the local fake') });

const POST = 'urn:oasis:names:tc:SAML:2.0:bindings:HTTP-POST';
const REDIRECT = 'urn:oasis:names:tc:SAML:2.0:bindings:HTTP-Redirect';
const RSA_SHA256 = 'http://www.w3.org/2001/04/xmldsig-more#rsa-sha256';
const SUCCESS = 'urn:oasis:names:tc:SAML:2.0:status:Success';

export interface LoginResponseOptions {
  persona: Persona;
  /** The AuthnRequest id this answers; null for an unsolicited response */
  inResponseTo: string | null;
  relayState?: string;
  // Overrides, for tests that need a wrong answer:
  audience?: string;
  destination?: string;
  recipient?: string;
  issuer?: string;
  issueInstant?: Date;
  notBefore?: Date;
  notOnOrAfter?: Date;
  subjectNotOnOrAfter?: Date;
  signAssertion?: boolean;
  signResponse?: boolean;
  signingIdentity?: SigningIdentity;
  /** Replaces the attribute values (by attribute Name) */
  attributes?: Record<string, string[]>;
}

export interface BuiltResponse {
  /** Base64 of the XML, as posted in the SAMLResponse form field */
  samlResponse: string;
  xml: string;
  id: string;
  assertionId: string;
}

export interface FakeIdp {
  entityId: string;
  ssoUrl: string;
  sloUrl: string;
  identity: SigningIdentity;
  personas: Persona[];
  metadataXml: string;
  router: Router;
  /** An express app serving the router under /idp (tests drive it in-process with supertest) */
  app: express.Express;
  findPersona(keyOrEmail: string): Persona | undefined;
  parseLoginRequest(query: Record<string, unknown>): Promise<{ id: string; acsUrl: string | null }>;
  buildLoginResponse(options: LoginResponseOptions): Promise<BuiltResponse>;
  buildCancelledResponse(inResponseTo: string | null): BuiltResponse;
}

const xmlEscape = (value: string) =>
  value.replace(
    /[&<>"']/g,
    (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&apos;' })[c]!,
  );

const samlId = () => `_${randomUUID().replace(/-/g, '')}`;

export async function createFakeIdp(
  config: CairnConfig,
  dataDir: string,
  options: { personas?: Persona[] } = {},
): Promise<FakeIdp> {
  const endpoints = fakeIdpEndpoints(config);
  const sp = spEndpoints(config);
  const identity = await ensureSigningIdentity(dataDir);
  const personas = options.personas ?? loadPersonas();

  const idpEntity = (signing: SigningIdentity = identity) =>
    samlify.IdentityProvider({
      entityID: endpoints.entityId,
      privateKey: signing.privateKey,
      signingCert: signing.cert,
      requestSignatureAlgorithm: RSA_SHA256,
      nameIDFormat: [config.auth.nameIdFormat],
      singleSignOnService: [{ Binding: REDIRECT, Location: endpoints.ssoUrl }],
      singleLogoutService: [{ Binding: REDIRECT, Location: endpoints.sloUrl }],
    });
  const spEntity = (
    flags: { assertion: boolean; message: boolean } = { assertion: true, message: true },
  ) =>
    samlify.ServiceProvider({
      entityID: sp.entityId,
      wantAssertionsSigned: flags.assertion,
      wantMessageSigned: flags.message,
      assertionConsumerService: [{ Binding: POST, Location: sp.acsUrl }],
      singleLogoutService: [{ Binding: REDIRECT, Location: sp.sloUrl }],
    });
  const defaultIdp = idpEntity();
  const metadataXml = defaultIdp.getMetadata();

  const attributeValues = (persona: Persona): Record<string, string[]> => ({
    [config.auth.attributes.email]: [persona.email],
    [config.auth.attributes.displayName]: [persona.displayName],
    [config.auth.attributes.role]: [config.auth.roleMapping[persona.role][0] ?? persona.role],
    [config.auth.attributes.practices]: persona.practices,
  });

  const buildLoginResponse = async (o: LoginResponseOptions): Promise<BuiltResponse> => {
    const now = o.issueInstant ?? new Date();
    const later = new Date(now.getTime() + 5 * 60_000);
    const id = samlId();
    const assertionId = samlId();
    const attributes = { ...attributeValues(o.persona), ...(o.attributes ?? {}) };
    const attributeXml = Object.entries(attributes)
      .filter(([, values]) => values.length > 0)
      .map(
        ([name, values]) =>
          `<saml:Attribute Name="${xmlEscape(name)}" NameFormat="urn:oasis:names:tc:SAML:2.0:attrname-format:uri">` +
          values
            .map(
              (v) =>
                `<saml:AttributeValue xsi:type="xs:string">${xmlEscape(v)}</saml:AttributeValue>`,
            )
            .join('') +
          '</saml:Attribute>',
      )
      .join('');
    const inResponseTo = o.inResponseTo ? ` InResponseTo="${xmlEscape(o.inResponseTo)}"` : '';
    const issuer = xmlEscape(o.issuer ?? endpoints.entityId);
    const notBefore = o.notBefore
      ? ` NotBefore="${o.notBefore.toISOString()}"`
      : ` NotBefore="${now.toISOString()}"`;
    const xml =
      `<samlp:Response xmlns:samlp="urn:oasis:names:tc:SAML:2.0:protocol" xmlns:saml="urn:oasis:names:tc:SAML:2.0:assertion" ID="${id}" Version="2.0" IssueInstant="${now.toISOString()}" Destination="${xmlEscape(o.destination ?? sp.acsUrl)}"${inResponseTo}>` +
      `<saml:Issuer>${issuer}</saml:Issuer>` +
      `<samlp:Status><samlp:StatusCode Value="${SUCCESS}"/></samlp:Status>` +
      `<saml:Assertion xmlns:xsi="http://www.w3.org/2001/XMLSchema-instance" xmlns:xs="http://www.w3.org/2001/XMLSchema" ID="${assertionId}" Version="2.0" IssueInstant="${now.toISOString()}">` +
      `<saml:Issuer>${issuer}</saml:Issuer>` +
      `<saml:Subject><saml:NameID Format="${xmlEscape(config.auth.nameIdFormat)}">${xmlEscape(o.persona.email)}</saml:NameID>` +
      `<saml:SubjectConfirmation Method="urn:oasis:names:tc:SAML:2.0:cm:bearer"><saml:SubjectConfirmationData NotOnOrAfter="${(o.subjectNotOnOrAfter ?? o.notOnOrAfter ?? later).toISOString()}" Recipient="${xmlEscape(o.recipient ?? sp.acsUrl)}"${inResponseTo}/></saml:SubjectConfirmation></saml:Subject>` +
      `<saml:Conditions${notBefore} NotOnOrAfter="${(o.notOnOrAfter ?? later).toISOString()}"><saml:AudienceRestriction><saml:Audience>${xmlEscape(o.audience ?? sp.entityId)}</saml:Audience></saml:AudienceRestriction></saml:Conditions>` +
      `<saml:AuthnStatement AuthnInstant="${now.toISOString()}" SessionIndex="${samlId()}"><saml:AuthnContext><saml:AuthnContextClassRef>urn:oasis:names:tc:SAML:2.0:ac:classes:PasswordProtectedTransport</saml:AuthnContextClassRef></saml:AuthnContext></saml:AuthnStatement>` +
      (attributeXml ? `<saml:AttributeStatement>${attributeXml}</saml:AttributeStatement>` : '') +
      `</saml:Assertion></samlp:Response>`;

    const signAssertion = o.signAssertion ?? true;
    const signResponse = o.signResponse ?? true;
    if (!signAssertion && !signResponse) {
      return { samlResponse: Buffer.from(xml).toString('base64'), xml, id, assertionId };
    }
    // samlify signs the assertion when the SP wants it, and the message when the SP
    // wants it or when the assertion is not signed.
    const result = await idpEntity(o.signingIdentity ?? identity).createLoginResponse(
      spEntity({ assertion: signAssertion, message: signResponse }),
      { extract: { request: { id: o.inResponseTo ?? '' } } },
      'post',
      { email: o.persona.email },
      { relayState: o.relayState, customTagReplacement: () => ({ id, context: xml }) },
    );
    const signed = Buffer.from(result.context, 'base64').toString('utf8');
    return { samlResponse: result.context, xml: signed, id, assertionId };
  };

  const buildCancelledResponse = (inResponseTo: string | null): BuiltResponse => {
    const id = samlId();
    const now = new Date().toISOString();
    const xml =
      `<samlp:Response xmlns:samlp="urn:oasis:names:tc:SAML:2.0:protocol" xmlns:saml="urn:oasis:names:tc:SAML:2.0:assertion" ID="${id}" Version="2.0" IssueInstant="${now}" Destination="${xmlEscape(sp.acsUrl)}"${inResponseTo ? ` InResponseTo="${xmlEscape(inResponseTo)}"` : ''}>` +
      `<saml:Issuer>${xmlEscape(endpoints.entityId)}</saml:Issuer>` +
      `<samlp:Status><samlp:StatusCode Value="urn:oasis:names:tc:SAML:2.0:status:Responder"><samlp:StatusCode Value="urn:oasis:names:tc:SAML:2.0:status:AuthnFailed"/></samlp:StatusCode>` +
      `<samlp:StatusMessage>The sign-in was cancelled</samlp:StatusMessage></samlp:Status></samlp:Response>`;
    const signed = samlify.SamlLib.constructSAMLSignature({
      rawSamlMessage: xml,
      isMessageSigned: true,
      isBase64Output: false,
      privateKey: identity.privateKey,
      // samlify wants the certificate's base64 body, as its metadata holds it
      signingCert: defaultIdp.entityMeta.getX509Certificate('signing') as string,
      signatureAlgorithm: RSA_SHA256,
      signatureConfig: {
        prefix: 'ds',
        location: {
          reference: "/*[local-name(.)='Response']/*[local-name(.)='Issuer']",
          action: 'after',
        },
      },
    });
    return {
      samlResponse: Buffer.from(signed).toString('base64'),
      xml: signed,
      id,
      assertionId: '',
    };
  };

  const parseLoginRequest = async (query: Record<string, unknown>) => {
    const parsed = await defaultIdp.parseLoginRequest(spEntity(), 'redirect', { query });
    const request = parsed.extract.request as Record<string, string> | undefined;
    const issuer = parsed.extract.issuer;
    if (!request?.id) throw new Error('the request has no ID');
    if (issuer !== sp.entityId) {
      throw new Error(
        `the request comes from ${String(issuer)}, not from Cairn (${sp.entityId}); check auth.sp.entityId`,
      );
    }
    const acsUrl = request.assertionConsumerServiceUrl ?? null;
    if (acsUrl && acsUrl !== sp.acsUrl) {
      throw new Error(`the request asks for an answer at ${acsUrl}, but Cairn's is ${sp.acsUrl}`);
    }
    return { id: request.id, acsUrl };
  };

  const findPersona = (keyOrEmail: string) =>
    personas.find((p) => p.key === keyOrEmail || p.email === keyOrEmail.toLowerCase());

  const str = (value: unknown) => (typeof value === 'string' ? value : undefined);

  const router = express.Router();
  router.use(express.urlencoded({ extended: false, limit: '200kb' }));

  router.get('/metadata', (_req, res) => {
    res.type('application/samlmetadata+xml').send(metadataXml);
  });

  router.get('/sso', async (req: Request, res: Response) => {
    const samlRequest = str(req.query.SAMLRequest);
    if (!samlRequest) {
      res
        .status(400)
        .type('html')
        .send(
          idpErrorPage(
            'No sign-in request',
            'Start from Cairn: choose “Sign in” on its start page.',
          ),
        );
      return;
    }
    try {
      await parseLoginRequest({ SAMLRequest: samlRequest, RelayState: str(req.query.RelayState) });
    } catch (error) {
      res
        .status(400)
        .type('html')
        .send(idpErrorPage('This sign-in request cannot be answered', (error as Error).message));
      return;
    }
    res.type('html').send(
      pickerPage({
        personas,
        samlRequest,
        relayState: str(req.query.RelayState) ?? '',
        roleValue: (p) => config.auth.roleMapping[p.role][0] ?? p.role,
        cairnUrl: config.server.publicUrl,
      }),
    );
  });

  router.post('/sso', async (req: Request, res: Response) => {
    const body = (req.body ?? {}) as Record<string, unknown>;
    const samlRequest = str(body.SAMLRequest);
    const relayState = str(body.RelayState) ?? '';
    let request: { id: string };
    try {
      if (!samlRequest) throw new Error('the form did not carry the sign-in request');
      request = await parseLoginRequest({ SAMLRequest: samlRequest, RelayState: relayState });
    } catch (error) {
      res
        .status(400)
        .type('html')
        .send(idpErrorPage('This sign-in request cannot be answered', (error as Error).message));
      return;
    }
    let built: BuiltResponse;
    if (body.action === 'cancel') {
      built = buildCancelledResponse(request.id);
    } else {
      const persona = findPersona(str(body.persona) ?? '');
      if (!persona) {
        res
          .status(400)
          .type('html')
          .send(
            idpErrorPage('Unknown persona', 'Choose one of the people listed on the sign-in page.'),
          );
        return;
      }
      built = await buildLoginResponse({ persona, inResponseTo: request.id, relayState });
    }
    res.type('html').send(autoPostPage(sp.acsUrl, built.samlResponse, relayState));
  });

  router.get('/slo', async (req: Request, res: Response) => {
    const samlRequest = str(req.query.SAMLRequest);
    if (!samlRequest) {
      res.type('html').send(signedOutPage(config.server.publicUrl));
      return;
    }
    try {
      const parsed = await defaultIdp.parseLogoutRequest(spEntity(), 'redirect', {
        query: { SAMLRequest: samlRequest, RelayState: str(req.query.RelayState) },
      });
      const answer = defaultIdp.createLogoutResponse(
        spEntity(),
        parsed as never,
        'redirect',
        str(req.query.RelayState) ?? '',
      );
      res.redirect(302, answer.context);
    } catch (error) {
      res
        .status(400)
        .type('html')
        .send(idpErrorPage('This sign-out request cannot be answered', (error as Error).message));
    }
  });

  const app = express();
  app.disable('x-powered-by');
  app.use('/idp', router);

  return {
    entityId: endpoints.entityId,
    ssoUrl: endpoints.ssoUrl,
    sloUrl: endpoints.sloUrl,
    identity,
    personas,
    metadataXml,
    router,
    app,
    findPersona,
    parseLoginRequest,
    buildLoginResponse,
    buildCancelledResponse,
  };
}
