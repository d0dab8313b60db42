// Error replies are RFC 9457 problem details, sent as application/problem+json;
// the route schemas describe their body, and this says so in the document
// (@fastify/swagger would otherwise list every response as application/json).
type Doc = { paths?: Record<string, Record<string, { responses?: Record<string, { content?: Record<string, unknown> }> }>> };

export function problemMediaTypes<T>(document: T): T {
  const paths = (document as Doc).paths ?? {};
  for (const operations of Object.values(paths)) {
    for (const operation of Object.values(operations)) {
      for (const [status, response] of Object.entries(operation?.responses ?? {})) {
        const content = response?.content;
        const schema = (content?.['application/json'] as { schema?: { $ref?: string } } | undefined)?.schema;
        if (Number(status) >= 400 && content && schema?.$ref === '#/components/schemas/Problem') {
          content['application/problem+json'] = content['application/json'];
          delete content['application/json'];
        }
      }
    }
  }
  return document;
}
