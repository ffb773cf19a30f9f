import {
  type ArgumentsHost,
  BadRequestException,
  Catch,
  type ExceptionFilter,
  HttpException,
  HttpStatus,
  Logger,
} from '@nestjs/common';
import type { Request, Response } from 'express';
import {
  type FieldProblem,
  type ProblemDetails,
  ProblemException,
  problemType,
} from './problem.js';

const slugs: Record<number, string> = {
  400: 'bad-request',
  401: 'sign-in-required',
  403: 'forbidden',
  404: 'not-found',
  405: 'method-not-allowed',
  409: 'conflict',
  413: 'payload-too-large',
  415: 'unsupported-media-type',
  422: 'unprocessable',
  429: 'too-many-requests',
  500: 'internal-error',
  503: 'unavailable',
};

const titles: Record<number, string> = {
  400: 'The request is not valid',
  401: 'Sign-in required',
  403: 'Not allowed',
  404: 'Not found',
  405: 'Method not allowed',
  409: 'Conflict',
  413: 'Too large',
  415: 'Unsupported media type',
  422: 'Cannot be processed',
  429: 'Too many requests',
  500: 'Something went wrong on our side',
  503: 'Temporarily unavailable',
};

/** class-validator messages arrive as "field message"; split them into field problems. */
function fieldProblems(messages: string[]): FieldProblem[] {
  return messages.map((message) => {
    const property = /^property (\S+) should not exist$/.exec(message);
    if (property) return { field: property[1]!, message: 'is not an accepted field' };
    const [field, ...rest] = message.split(' ');
    return { field: field ?? '', message: rest.join(' ') || message };
  });
}

/**
 * Maps every error to RFC 9457 problem details (application/problem+json).
 * Unknown errors answer 500 without internals, and are logged with the request id.
 */
@Catch()
export class ProblemDetailsFilter implements ExceptionFilter {
  private readonly logger = new Logger('Problem');

  catch(exception: unknown, host: ArgumentsHost): void {
    const context = host.switchToHttp();
    const response = context.getResponse<Response>();
    const request = context.getRequest<Request>();
    if (response.headersSent) return;
    const instance = request.originalUrl?.split('?')[0];
    let problem: ProblemDetails;

    const bodyError = isBodyParserError(exception)
      ? exception
      : exception instanceof HttpException && isBodyParserError(exception.cause)
        ? exception.cause
        : null;

    if (exception instanceof ProblemException) {
      problem = exception.toProblem(instance);
    } else if (bodyError) {
      const status = bodyError.status;
      problem = {
        type: problemType(status === 413 ? 'payload-too-large' : 'malformed-body'),
        title: status === 413 ? titles[413]! : 'The request body could not be read',
        status,
        detail:
          status === 413
            ? 'The request body is larger than this endpoint accepts.'
            : 'The request body is not valid JSON.',
        instance,
      };
    } else if (exception instanceof HttpException) {
      const status = exception.getStatus();
      const body = exception.getResponse();
      const message =
        typeof body === 'object' && body !== null ? (body as { message?: unknown }).message : body;
      problem = {
        type: problemType(slugs[status] ?? 'error'),
        title: titles[status] ?? exception.name,
        status,
        instance,
      };
      if (exception instanceof BadRequestException && Array.isArray(message)) {
        problem.detail = 'Some fields are missing or not valid; see errors.';
        problem.errors = fieldProblems(message.map(String));
        problem.type = problemType('validation');
      } else if (typeof message === 'string' && message) {
        problem.detail = message;
      }
    } else {
      const requestId = (request as Request & { id?: string }).id;
      this.logger.error(
        { err: exception, requestId, path: instance },
        (exception as Error)?.stack ?? String(exception),
      );
      problem = {
        type: problemType('internal-error'),
        title: titles[500]!,
        status: HttpStatus.INTERNAL_SERVER_ERROR,
        detail: `The error was logged${requestId ? ` with request id ${requestId}` : ''}. Nothing you sent was lost; try again, and tell the Cairn team if it keeps happening.`,
        instance,
      };
    }
    response.status(problem.status).type('application/problem+json').json(problem);
  }
}

/** body-parser's errors carry a numeric status and a type such as "entity.parse.failed". */
function isBodyParserError(error: unknown): error is { status: number; type: string } {
  return (
    typeof error === 'object' &&
    error !== null &&
    typeof (error as { status?: unknown }).status === 'number' &&
    typeof (error as { type?: unknown }).type === 'string' &&
    (error as { type: string }).type.startsWith('entity.')
  );
}
