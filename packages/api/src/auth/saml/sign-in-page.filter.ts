/**
 * For the browser-facing sign-in routes: whatever goes wrong before the
 * handler could answer (throttling, an unexpected error) sends the browser to
 * Cairn's sign-in page with a reason, never to a JSON error or a stack trace.
 */
import {
  type ArgumentsHost,
  Catch,
  type ExceptionFilter,
  HttpException,
  HttpStatus,
  Inject,
  Logger,
} from '@nestjs/common';
import type { Request, Response } from 'express';
import { SignInService } from '../sign-in.service.js';
import { SignInRefused } from '../sign-in-refusal.js';

@Catch()
export class SignInPageFilter implements ExceptionFilter {
  private readonly logger = new Logger('SignIn');

  constructor(@Inject(SignInService) private readonly signIn: SignInService) {}

  async catch(exception: unknown, host: ArgumentsHost): Promise<void> {
    const http = host.switchToHttp();
    const req = http.getRequest<Request>();
    const res = http.getResponse<Response>();
    const throttled =
      exception instanceof HttpException && exception.getStatus() === HttpStatus.TOO_MANY_REQUESTS;
    const refusal =
      exception instanceof SignInRefused
        ? exception
        : new SignInRefused(
            throttled
              ? 'throttled'
              : req.method === 'POST'
                ? 'invalid-response'
                : 'idp-unavailable',
            {
              message: exception instanceof Error ? exception.message : String(exception),
            },
          );
    if (!throttled && !(exception instanceof SignInRefused)) {
      this.logger.error({ err: exception, path: req.path }, 'sign-in route failed');
    }
    if (req.method === 'POST' || throttled) {
      await this.signIn
        .recordRefusal(
          refusal,
          { requestId: (req as Request & { id?: string }).id ?? null, ipAddress: req.ip ?? null },
          null,
        )
        .catch((error: unknown) =>
          this.logger.error({ err: error }, 'could not record a refused sign-in'),
        );
    }
    if (res.headersSent) return;
    res.redirect(303, `/sign-in?refused=${refusal.code}`);
  }
}
