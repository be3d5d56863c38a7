/** Every API route, in one list: app.ts mounts it, openapi.ts documents it. */
import type { Route } from '../http/route';
import { areaRoutes } from './areas';
import { conflictRoutes } from './conflicts';
import { estimateRoutes } from './estimate';
import { exchangeRoutes } from './exchange';
import { followUpRoutes } from './follow-ups';
import { healthRoutes } from './health';
import { limitSetRoutes } from './limit-sets';
import { limitTemplateRoutes } from './limit-templates';
import { meterRoutes } from './meters';
import { planRoutes } from './plans';
import { readingRoutes } from './readings';
import { reviewRoutes } from './review';
import { roundRoutes } from './rounds';
import { siteRoutes } from './sites';
import { spotRoutes } from './spots';

export const apiRoutes: Route[] = [
  ...healthRoutes,
  ...siteRoutes,
  ...limitTemplateRoutes,
  ...limitSetRoutes,
  ...areaRoutes,
  // before spotRoutes: /spots/by-code/:code must not be read as /spots/:id/...
  ...planRoutes,
  ...spotRoutes,
  ...meterRoutes,
  ...roundRoutes,
  ...readingRoutes,
  ...conflictRoutes,
  ...estimateRoutes,
  ...followUpRoutes,
  ...reviewRoutes,
  ...exchangeRoutes,
];
