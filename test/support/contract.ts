import 'reflect-metadata';

import { RequestMethod } from '@nestjs/common';
import { METHOD_METADATA, PATH_METADATA } from '@nestjs/common/constants.js';
import { ModulesContainer } from '@nestjs/core';
import type { NestExpressApplication } from '@nestjs/platform-express';
import type { Response } from 'supertest';
import { expect } from 'vitest';

import { API_CONTRACT, type ApiContractSpec, isZodSchema } from '../../api/src/common/api-contract.decorator.js';
import { ErrorResponseSchema } from '../../api/src/domain/http/error-response.schema.js';

/** Every route the app serves, keyed like the authorization matrix (`GET /api/jobs/:id`), with its contract. */
export function contractRoutes(app: NestExpressApplication): Map<string, ApiContractSpec | undefined> {
  const routes = new Map<string, ApiContractSpec | undefined>();
  for (const module of app.get(ModulesContainer).values()) {
    for (const wrapper of module.controllers.values()) {
      const type = wrapper.metatype as (new (...args: never[]) => object) | null;
      if (!type) continue;
      const bases = [Reflect.getMetadata(PATH_METADATA, type) as string | string[]].flat();
      const prototype = type.prototype as Record<string, unknown>;
      for (const name of Object.getOwnPropertyNames(prototype)) {
        const handler = prototype[name];
        if (typeof handler !== 'function' || name === 'constructor') continue;
        const paths = Reflect.getMetadata(PATH_METADATA, handler) as string | string[] | undefined;
        if (paths === undefined) continue;
        const method = RequestMethod[Reflect.getMetadata(METHOD_METADATA, handler) as RequestMethod];
        for (const base of bases) {
          for (const path of [paths].flat()) {
            const full = ['/api', base, path].map((part) => part.replace(/^\/+|\/+$/g, '')).filter(Boolean).join('/');
            routes.set(`${method} /${full}`, Reflect.getMetadata(API_CONTRACT, handler) as ApiContractSpec | undefined);
          }
        }
      }
    }
  }
  return routes;
}

/**
 * Checks an answer against the route's contract: a declared status, and a JSON body that the declared
 * zod schema parses back to exactly the same value (an extra, missing or mistyped field fails), or a
 * file of a declared media type. Errors must have the shared error shape.
 */
export function expectAnswerMatchesContract(contract: ApiContractSpec | undefined, route: string, res: Response): void {
  expect(contract, `${route} has no @ApiContract`).toBeDefined();
  if (res.status >= 400) {
    const declared = contract!.responses[res.status];
    const schema = declared && isZodSchema(declared) ? declared : ErrorResponseSchema;
    expect(schema.safeParse(res.body).error?.issues ?? [], `${route} → ${res.status}`).toEqual([]);
    return;
  }
  if (res.status === 304) return;
  const declared = contract!.responses[res.status];
  expect(declared, `${route} answered ${res.status}, which its contract does not declare`).toBeDefined();
  if (isZodSchema(declared)) {
    const parsed = declared.safeParse(res.body);
    expect(parsed.error?.issues ?? [], `${route} → ${res.status}: ${JSON.stringify(res.body).slice(0, 500)}`).toEqual([]);
    // zod drops keys it does not know: what survives parsing must be the whole answer.
    expect(parsed.data, `${route}: the answer has fields the schema does not declare`).toEqual(res.body);
  } else if (declared!.kind === 'file') {
    const type = String(res.headers['content-type'] ?? '').split(';')[0]!.trim();
    // `*/*`: a stored file served with its own type (an e-mail attachment).
    if (!declared!.contentTypes.includes('*/*')) expect(declared!.contentTypes, `${route}: answered ${type}`).toContain(type);
    expect(type, `${route}: a file answer names its type`).not.toBe('');
  } else {
    expect(res.text ?? '', `${route} should answer no body`).toBe('');
  }
}
