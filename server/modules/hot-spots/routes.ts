import type { Response } from 'express';
import { HotSpotFindingsQuery, HotSpotsQuery } from '../../../shared/api/hot-spots';
import { CAN } from '../../../shared/domain/roles';
import { route, type RouteDef } from '../../http/routes';
import type { Deps } from '../../deps';
import { hotSpotsService } from './service';

const sendCsv = (res: Response, name: string, csv: string) => {
  res.status(200);
  res.setHeader('Content-Type', 'text/csv; charset=utf-8');
  res.setHeader('Content-Disposition', `attachment; filename="${name}"`);
  res.setHeader('Cache-Control', 'no-store');
  res.send(csv);
};

const fileName = (what: string, q: { unitType: string; from: string; to: string }) => `hot-spots-${what}-${q.unitType}-${q.from}-to-${q.to}.csv`;

export function hotSpotsRoutes(deps: Deps): RouteDef[] {
  const svc = hotSpotsService(deps.pool, deps.drawings);
  return [
    route({
      method: 'get',
      path: '/hot-spots',
      access: CAN.readFleet,
      summary: 'Fleet hot spots of one unit type: density grid (front-relative), table by part with rates, repeats and the stand-out test, monthly trend',
      query: HotSpotsQuery,
      handler: async ({ query }) => ({ body: await svc.screen(query) }),
    }),
    route({
      method: 'get',
      path: '/hot-spots/findings',
      access: CAN.readFleet,
      summary: 'The findings behind one hot spots row (label) or the whole selection, newest first',
      query: HotSpotFindingsQuery,
      handler: async ({ query }) => ({ body: await svc.findings(query) }),
    }),
    route({
      method: 'get',
      path: '/hot-spots/table.csv',
      access: CAN.readFleet,
      summary: 'The hot spots table as CSV',
      query: HotSpotsQuery,
      handler: async ({ query, res }) => sendCsv(res, fileName('table', query), await svc.tableCsv(query)),
    }),
    route({
      method: 'get',
      path: '/hot-spots/findings.csv',
      access: CAN.readFleet,
      summary: 'The findings behind the hot spots selection (or one row) as CSV',
      query: HotSpotFindingsQuery,
      handler: async ({ query, res }) => {
        const r = await svc.findingsCsv(query);
        if (r.truncated) res.setHeader('X-Hoodline-Truncated', `${r.total}`);
        sendCsv(res, fileName(query.label ? 'row-findings' : 'findings', query), r.csv);
      },
    }),
  ];
}
