// What the OpenAPI document says the service is.
import { serviceVersion } from '../version.ts';

export const openapiInfo = {
  title: 'parsimetry',
  version: serviceVersion,
  description:
    'One referee for competing regression models: fits candidates, scores every criterion under one published convention, ranks them and keeps a tamper-evident audit record. Criteria rank candidate models; they do not validate a model for a safety-relevant use — defer to domain review and local rules.',
};
