/**
 * The access contract other modules code against, on test-only routes:
 * deny by default, @Roles, @PracticeScoped, auditors read-only unless
 * @AuditorMayWrite, CSRF on writes (multipart too), @CurrentUser and
 * PracticeAccess / canReadPractice in services.
 */
import {
  Controller,
  Get,
  Inject,
  Module,
  Param,
  Post,
  Put,
  UploadedFile,
  UseInterceptors,
} from '@nestjs/common';
import { FileInterceptor } from '@nestjs/platform-express';
import request from 'supertest';
import {
  AnySignedIn,
  AuditorMayWrite,
  type AuthUser,
  canReadPractice,
  CurrentUser,
  PracticeAccess,
  PracticeScoped,
  Public,
  Roles,
} from '../src/auth/index.js';
import { demoIds, seedDemoOrganisation, signInAs, type SignedInAgent } from './support/auth.js';
import { createTestApp, type TestApp } from './support/test-app.js';

@Controller('test-guard')
class GuardTestController {
  constructor(@Inject(PracticeAccess) private readonly access: PracticeAccess) {}

  @Get('undeclared')
  undeclared() {
    return { reached: true };
  }

  @Get('public')
  @Public()
  open(@CurrentUser() user: AuthUser | undefined) {
    return { user: user?.email ?? null };
  }

  @Get('practices/:practiceId')
  @AnySignedIn()
  @PracticeScoped()
  read(@Param('practiceId') practiceId: string, @CurrentUser() user: AuthUser) {
    return { practiceId: Number(practiceId), by: user.email };
  }

  @Post('practices/:practiceId/uploads')
  @Roles('practice_lead', 'regional_lead')
  @PracticeScoped()
  @UseInterceptors(FileInterceptor('file'))
  upload(@UploadedFile() file: { size: number } | undefined) {
    return { size: file?.size ?? null };
  }

  @Put('practices/:practiceId/notes')
  @Roles('auditor', 'regional_lead')
  @PracticeScoped()
  note() {
    return { noted: true };
  }

  @Post('review-notes')
  @Roles('auditor')
  @AuditorMayWrite()
  review(@CurrentUser() user: AuthUser) {
    return { by: user.role };
  }

  @Get('readable/:practiceId')
  @AnySignedIn()
  async readable(@Param('practiceId') practiceId: string, @CurrentUser() user: AuthUser) {
    return { canRead: await this.access.canRead(user, Number(practiceId)) };
  }
}

@Module({ controllers: [GuardTestController] })
class GuardTestModule {}

describe('access guard contract', () => {
  let t: TestApp;
  let ids: Awaited<ReturnType<typeof demoIds>>;
  let priya: SignedInAgent; // leads OV102
  let daniel: SignedInAgent; // leads OV101 and OV103
  let lead: SignedInAgent;
  let auditor: SignedInAgent;

  beforeAll(async () => {
    t = await createTestApp({ modules: [GuardTestModule] });
    await seedDemoOrganisation(t);
    ids = await demoIds(t);
    [priya, daniel, lead, auditor] = await Promise.all([
      signInAs(t, 'practice_lead_one'),
      signInAs(t, 'practice_lead_two'),
      signInAs(t, 'regional_lead'),
      signInAs(t, 'auditor'),
    ]);
  });
  afterAll(async () => {
    await t?.close();
  });

  it('refuses a route without a declaration to everyone', async () => {
    for (const agent of [request(t.http), lead]) {
      const res = await agent.get('/api/test-guard/undeclared').expect(403);
      expect(res.body.type).toBe('/api/problems/undeclared-route');
    }
  });

  it('gives public routes the signed-in person when there is one', async () => {
    expect((await request(t.http).get('/api/test-guard/public').expect(200)).body.user).toBeNull();
    expect((await priya.get('/api/test-guard/public').expect(200)).body.user).toBe(
      'priya.calloway@quarrybank.example',
    );
  });

  it('scopes practice routes: members, and region-wide roles, pass', async () => {
    const ov102 = ids.practice('OV102');
    await priya.get(`/api/test-guard/practices/${ov102}`).expect(200);
    await lead.get(`/api/test-guard/practices/${ov102}`).expect(200);
    await auditor.get(`/api/test-guard/practices/${ov102}`).expect(200);
    const other = await daniel.get(`/api/test-guard/practices/${ov102}`).expect(403);
    expect(other.body).toMatchObject({
      type: '/api/problems/practice-not-yours',
      practiceId: ov102,
    });
    expect(other.body.detail).toMatch(/You lead 2 practices/);
    await daniel.get(`/api/test-guard/practices/${ids.practice('OV101')}`).expect(200);
    await daniel.get(`/api/test-guard/practices/${ids.practice('OV103')}`).expect(200);
  });

  it('answers 404 for an unknown practice and 400 for an id that is not a number', async () => {
    const missing = await priya.get('/api/test-guard/practices/999999').expect(404);
    expect(missing.body.type).toBe('/api/problems/practice-not-found');
    const bad = await priya.get('/api/test-guard/practices/OV102').expect(400);
    expect(bad.body.type).toBe('/api/problems/bad-practice-id');
  });

  it('keeps auditors read-only, even on a route that lists them, unless @AuditorMayWrite', async () => {
    const ov102 = ids.practice('OV102');
    const res = await auditor.put(`/api/test-guard/practices/${ov102}/notes`).expect(403);
    expect(res.body.type).toBe('/api/problems/auditor-read-only');
    await lead.put(`/api/test-guard/practices/${ov102}/notes`).expect(200);
    expect((await auditor.post('/api/test-guard/review-notes').expect(201)).body.by).toBe(
      'auditor',
    );
  });

  it('needs the CSRF token on multipart uploads too, and scopes them', async () => {
    const ov102 = ids.practice('OV102');
    const file = Buffer.from('a,b\n1,2\n');
    const ok = await priya
      .post(`/api/test-guard/practices/${ov102}/uploads`)
      .attach('file', file, 'extract.csv')
      .expect(201);
    expect(ok.body.size).toBe(file.length);
    const noToken = await priya
      .post(`/api/test-guard/practices/${ov102}/uploads`)
      .set('X-CSRF-Token', 'not-the-session-token')
      .attach('file', file, 'extract.csv')
      .expect(403);
    expect(noToken.body.type).toBe('/api/problems/csrf');
    await daniel
      .post(`/api/test-guard/practices/${ov102}/uploads`)
      .attach('file', file, 'extract.csv')
      .expect(403);
    const role = await auditor
      .post(`/api/test-guard/practices/${ov102}/uploads`)
      .attach('file', file, 'x.csv')
      .expect(403);
    expect(role.body.type).toBe('/api/problems/role-not-allowed');
  });

  it('offers PracticeAccess and canReadPractice to services', async () => {
    expect(
      (await daniel.get(`/api/test-guard/readable/${ids.practice('OV102')}`)).body.canRead,
    ).toBe(false);
    expect(
      (await daniel.get(`/api/test-guard/readable/${ids.practice('OV101')}`)).body.canRead,
    ).toBe(true);
    expect(
      (await auditor.get(`/api/test-guard/readable/${ids.practice('OV407')}`)).body.canRead,
    ).toBe(true);
    expect((await auditor.get('/api/test-guard/readable/999999')).body.canRead).toBe(false);
    const user: AuthUser = {
      ...daniel.user,
      regionId: 1,
      practiceIds: [1, 3],
    } as unknown as AuthUser;
    expect(canReadPractice(user, { id: 1, regionId: 1 })).toBe(true);
    expect(canReadPractice(user, { id: 2, regionId: 1 })).toBe(false);
    expect(
      canReadPractice({ ...user, role: 'auditor', practiceIds: [] }, { id: 2, regionId: 1 }),
    ).toBe(true);
    expect(
      canReadPractice({ ...user, role: 'auditor', practiceIds: [] }, { id: 2, regionId: 9 }),
    ).toBe(false);
  });
});
