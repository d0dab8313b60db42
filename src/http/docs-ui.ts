// How /docs presents the service: the service's own title and icon, no
// header bar of the documentation library (its logo and its box for loading
// another document's URL), and the operations listed folded so the page
// opens on the list of what the service does. The library (swagger-ui, served
// by @fastify/swagger-ui) is kept as it is; only its options are set here.
import type { FastifySwaggerUiOptions } from '@fastify/swagger-ui';
import { palette } from '../render/palette.ts';

/** Our icon: three bars of falling length, a ranking, in the report's clay and slate. */
const icon = `<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 16 16"><rect width="16" height="16" rx="3" fill="${palette.paper}"/><rect x="2" y="3" width="12" height="2.6" fill="${palette.weightBar}"/><rect x="2" y="6.7" width="8" height="2.6" fill="${palette.deltaBar}"/><rect x="2" y="10.4" width="4.5" height="2.6" fill="${palette.deltaBar}"/></svg>`;

const css = `
.swagger-ui .info { margin: 24px 0 12px; }
.swagger-ui .info .title { color: ${palette.ink}; }
.swagger-ui .info .description { max-width: 60rem; }
`;

export const docsUiOptions: FastifySwaggerUiOptions = {
  routePrefix: '/docs',
  uiConfig: {
    // BaseLayout: the operations without the library's top bar.
    layout: 'BaseLayout',
    docExpansion: 'list',
    defaultModelsExpandDepth: 0,
    displayRequestDuration: true,
  },
  theme: {
    title: 'parsimetry · API documentation',
    favicon: [{ filename: 'parsimetry.svg', rel: 'icon', sizes: 'any', type: 'image/svg+xml', content: Buffer.from(icon) }],
    css: [{ filename: 'parsimetry.css', content: css }],
  },
};
