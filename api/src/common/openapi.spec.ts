import type { OpenAPIObject } from '@nestjs/swagger';
import { describe, expect, it } from 'vitest';
import { z } from 'zod';

import { toOpenApiSchema } from './api-contract.decorator.js';
import { withContractSchemas } from './openapi.js';

const Node: z.ZodType<{ name: string; children: unknown[] }> = z.object({
  name: z.string(),
  get children() {
    return z.array(Node);
  },
});

function documentAnswering(schema: object): OpenAPIObject {
  return {
    openapi: '3.0.0',
    info: { title: 't', version: '1' },
    paths: {
      '/tree': {
        get: { responses: { 200: { description: 'ok', content: { 'application/json': { schema } } }, 404: { description: 'missing' } } },
      },
    },
  };
}

describe(withContractSchemas.name, () => {
  it('should move a recursive schema’s definitions into components and point its references there', () => {
    const schema = toOpenApiSchema(z.object({ root: Node }), 'output');
    expect(JSON.stringify(schema)).toContain('#/definitions/');

    const sut = withContractSchemas(documentAnswering(schema));

    const text = JSON.stringify(sut);
    expect(text).not.toContain('#/definitions/');
    expect(text).not.toContain('"definitions"');
    const refs = [...text.matchAll(/"\$ref":"#\/components\/schemas\/([^"]+)"/g)].map((m) => m[1]!);
    expect(refs.length).toBeGreaterThan(1);
    for (const name of refs) expect(sut.components?.schemas, name).toHaveProperty(name);
  });

  it('should give every error answer, and a default one, the shared error shape', () => {
    const sut = withContractSchemas(documentAnswering({ type: 'object' }));
    const responses = sut.paths['/tree']!.get!.responses as Record<string, { content?: Record<string, { schema: object }> }>;

    const errorShape = { $ref: '#/components/schemas/ErrorResponse' };
    expect(responses['404']!.content!['application/json']!.schema).toEqual(errorShape);
    expect(responses.default!.content!['application/json']!.schema).toEqual(errorShape);
    expect(responses['200']!.content!['application/json']!.schema).toEqual({ type: 'object' });
    expect(sut.components?.schemas?.ErrorResponse).toMatchObject({ required: ['statusCode', 'error', 'message'] });
  });
});
