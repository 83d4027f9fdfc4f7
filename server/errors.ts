import type { ErrorRequestHandler, RequestHandler } from "express";
import * as v from "valibot";

import { check, type FieldErrors } from "../survey/validation";
import type { Logger } from "./logger";

export type { FieldErrors };

/** An error that is safe to show: its status, a stable code and a message that says what to fix. */
export class HttpError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly fields?: FieldErrors,
  ) {
    super(message);
  }
}

export const notFound = (what = "That") => new HttpError(404, "not_found", `${what} was not found.`);

/** Validates `input` against a shared valibot schema; a 400 names every bad field. */
export function parseInput<S extends v.GenericSchema>(schema: S, input: unknown, what = "request body"): v.InferOutput<S> {
  const result = check(schema, input);
  if (result.ok) return result.value;
  const first = Object.entries(result.errors)[0];
  const hint = first ? ` ${first[0] === "_" ? "" : `${first[0]}: `}${first[1][0]}` : "";
  throw new HttpError(400, "invalid_input", `The ${what} is not valid.${hint}`, result.errors);
}

export const apiNotFound: RequestHandler = (req) => {
  throw new HttpError(404, "no_such_route", `There is no API route ${req.method} ${req.path}.`);
};

interface BodyParserError extends Error {
  type?: string;
  status?: number;
}

/** The one error middleware: every failure leaves as {error: {code, message, fields?}}. */
export const errorHandler: ErrorRequestHandler = (err, req, res, _next) => {
  let status = 500;
  let body: { code: string; message: string; fields?: FieldErrors };
  if (err instanceof HttpError) {
    status = err.status;
    body = { code: err.code, message: err.message, ...(err.fields ? { fields: err.fields } : {}) };
  } else if ((err as BodyParserError)?.type === "entity.parse.failed") {
    status = 400;
    body = { code: "invalid_json", message: "The request body is not valid JSON." };
  } else if ((err as BodyParserError)?.type === "entity.too.large") {
    status = 413;
    body = { code: "too_large", message: "The request body is too large." };
  } else if (typeof (err as BodyParserError)?.status === "number" && (err as BodyParserError).status! < 500) {
    status = (err as BodyParserError).status!;
    body = { code: "bad_request", message: (err as Error).message || "The request was refused." };
  } else {
    body = { code: "internal", message: "Something went wrong on our side. Nothing you saved was lost; try again." };
  }
  if (status >= 500) (req.app?.locals.logger as Logger | undefined)?.error({ err, reqId: req.id }, "request failed");
  if (res.headersSent) return;
  res.status(status).json({ error: body });
};

/** A route parameter as a string (Express types allow arrays for wildcard segments). */
export function param(req: { params: Record<string, string | string[] | undefined> }, name: string): string {
  const value = req.params[name];
  if (typeof value !== "string" || value === "") throw new HttpError(400, "invalid_input", `The ${name} in the address is missing.`);
  if (value.length > 200 || value.includes("\u0000")) throw new HttpError(400, "invalid_input", `The ${name} in the address is not valid.`);
  return value;
}
