/**
 * RFC 9457 problem details: the one shape every error response of the service has.
 */

import type { FastifyReply } from 'fastify';

export const PROBLEM_CONTENT_TYPE = 'application/problem+json';

export interface FieldError {
  field: string;
  message: string;
}

export interface Problem {
  type: string;
  title: string;
  status: number;
  detail: string;
  instance?: string;
  errors?: FieldError[];
}

const TITLES: Record<number, string> = {
  400: 'Invalid request',
  401: 'Authentication required',
  403: 'Forbidden',
  404: 'Not found',
  405: 'Method not allowed',
  406: 'Not acceptable',
  408: 'Request timeout',
  409: 'Conflict',
  413: 'Request body too large',
  414: 'URI too long',
  415: 'Unsupported media type',
  422: 'The model cannot answer',
  429: 'Too many requests',
  500: 'Internal error',
  503: 'Service unavailable',
};

/** Problem type URIs are relative references documented in the README. */
export function problemType(status: number): string {
  return status === 400 ? '/problems/invalid-request' : `/problems/http-${status}`;
}

export function makeProblem(status: number, detail: string, errors?: FieldError[], instance?: string): Problem {
  return {
    type: problemType(status),
    title: TITLES[status] ?? (status >= 500 ? 'Server error' : 'Request error'),
    status,
    detail,
    ...(instance ? { instance } : {}),
    ...(errors && errors.length ? { errors } : {}),
  };
}

export function sendProblem(reply: FastifyReply, problem: Problem): FastifyReply {
  return reply.code(problem.status).type(PROBLEM_CONTENT_TYPE).send(JSON.stringify(problem));
}

/** An error a route throws to answer with a problem (a 4xx the schema cannot express). */
export class HttpProblem extends Error {
  /** Mirrors `status` for plugins that read `statusCode` from what they throw. */
  readonly statusCode: number;
  constructor(
    readonly status: number,
    message: string,
    readonly errors?: FieldError[],
    readonly headers?: Record<string, string>,
  ) {
    super(message);
    this.statusCode = status;
  }
}
