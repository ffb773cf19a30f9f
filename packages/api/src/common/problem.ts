/**
 * RFC 9457 problem details: the one shape every API error takes.
 * `type` is a stable URI under /api/problems/ naming the kind of problem;
 * `errors[]` lists field-level problems of a validation failure.
 */
import { HttpException, HttpStatus } from '@nestjs/common';

export interface FieldProblem {
  /** JSON pointer-like path of the field, e.g. "practiceIds.0" */
  field: string;
  message: string;
}

export interface ProblemDetails {
  type: string;
  title: string;
  status: number;
  detail?: string;
  instance?: string;
  errors?: FieldProblem[];
  [extension: string]: unknown;
}

export const problemType = (slug: string) => `/api/problems/${slug}`;

/** Throw from a service to answer with a specific problem. */
export class ProblemException extends HttpException {
  constructor(
    status: HttpStatus | number,
    readonly slug: string,
    title: string,
    detail?: string,
    readonly extensions: Record<string, unknown> = {},
  ) {
    super({ title, detail }, status);
  }

  toProblem(instance?: string): ProblemDetails {
    const body = this.getResponse() as { title: string; detail?: string };
    return {
      type: problemType(this.slug),
      title: body.title,
      status: this.getStatus(),
      ...(body.detail ? { detail: body.detail } : {}),
      ...(instance ? { instance } : {}),
      ...this.extensions,
    };
  }
}
