/** Every API route, in one list: app.ts mounts it, openapi.ts documents it. */
import type { Route } from '../http/route';
import { areaRoutes } from './areas';
import { conflictRoutes } from './conflicts';
import { estimateRoutes } from './estimate';
import { healthRoutes } from './health';
import { limitSetRoutes } from './limit-sets';
import { limitTemplateRoutes } from './limit-templates';
import { meterRoutes } from './meters';
import { readingRoutes } from './readings';
import { roundRoutes } from './rounds';
import { siteRoutes } from './sites';
import { spotRoutes } from './spots';

export const apiRoutes: Route[] = [
  ...healthRoutes,
  ...siteRoutes,
  ...limitTemplateRoutes,
  ...limitSetRoutes,
  ...areaRoutes,
  ...spotRoutes,
  ...meterRoutes,
  ...roundRoutes,
  ...readingRoutes,
  ...conflictRoutes,
  ...estimateRoutes,
];
