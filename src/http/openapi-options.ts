// The OpenAPI 3.1 document's frame: info, tags, the bearer scheme, and the
// finishing touches the route schemas cannot express themselves (problem
// media types, the refusals of the access layer, worked examples).
import type { FastifyDynamicSwaggerOptions } from '@fastify/swagger';
import { jsonSchemaTransform, jsonSchemaTransformObject } from 'fastify-type-provider-zod';
import { attachExamples } from './openapi-examples.ts';
import { openapiInfo } from './openapi-info.ts';
import { finishDocument } from './openapi-problems.ts';

export const openapiOptions: FastifyDynamicSwaggerOptions = {
  openapi: {
    openapi: '3.1.0',
    info: openapiInfo,
    tags: [
    { name: 'comparisons', description: 'Fit, score and rank candidate models' },
    { name: 'searches', description: 'Search subsets of a pool of terms; fold streamed rows into a data summary' },
    { name: 'audit', description: 'Stored comparisons, chain verification and replay' },
    { name: 'operations', description: 'Health and readiness' },
    ],
    components: {
    securitySchemes: {
      apiKey: {
      type: 'http',
      scheme: 'bearer',
      description: 'An API key from API_KEYS_FILE, sent as Authorization: Bearer <key>. With no keys configured the service is open (and listens on loopback only).',
      },
    },
    },
    security: [{ apiKey: [] }],
  },
  transform: jsonSchemaTransform,
  transformObject: (input) => attachExamples(finishDocument(jsonSchemaTransformObject(input))),
  };
