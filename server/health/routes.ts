import { z } from 'zod';
import { database } from '../lib/database.js';
import { route, type RouteSpec } from '../lib/routing.js';

export const healthRoutes: RouteSpec[] = [
  route({
    method: 'get',
    path: '/health',
    summary: 'Whether the server and its database answer',
    tag: 'health',
    access: 'public',
    response: z.object({ status: z.enum(['ok', 'degraded']), database: z.enum(['up', 'down']) }),
    handler: async ({ res }) => {
      try {
        await database().query('SELECT 1');
        return { status: 'ok', database: 'up' };
      } catch {
        res.status(503);
        return { status: 'degraded', database: 'down' };
      }
    },
  }),
];
