import type { Express } from 'express';
import { randomUUID } from 'node:crypto';
import Papa from 'papaparse';
import request from 'supertest';
import { DEMO_PASSWORD, DEMO_PEOPLE, DEMO_SITES } from '../../../../server/demo/demo-scenario';

export const JR = DEMO_SITES[0];
export const IF = DEMO_SITES[1];
export const person = (role: string) => DEMO_PEOPLE.find((candidate) => candidate.role === role) as (typeof DEMO_PEOPLE)[number];

/** Signs a demo person in and answers their access token. */
export async function tokenFor(app: Express, role: string): Promise<string> {
  const response = await request(app).post('/api/auth/login').send({ email: `${role}@demo.heapsight.test`, password: DEMO_PASSWORD, deviceId: randomUUID() }).expect(200);
  return response.body.accessToken as string;
}

let codeCounter = 0;
/** A device number for codes, random per test file so codes never meet the demo's. */
const DEVICE = String(1000 + Math.floor(Math.random() * 8999));

/** What a made-up sample is: a pan estimate (g/t) when it has a pan test, its type and links. */
export interface SampleSpec {
  readonly panGpt?: number | null;
  readonly sampleType?: 'routine' | 'duplicate' | 'blank' | 'standard';
  readonly duplicateOfIndex?: number;
  readonly standardId?: string | null;
  readonly lonLat?: readonly [number, number];
}

/**
 * Makes one pile and its samples through sync as the geologist; a pan test of 10 kg with weighed
 * gold and pan efficiency 1 gives exactly the asked pan estimate (grade = mg / kg).
 */
export async function makeSamples(app: Express, token: string, specs: readonly SampleSpec[], site: { id: string; code: string } = JR) {
  const pileId = randomUUID();
  codeCounter += 1;
  const pileCode = `${site.code}-${DEVICE}-P${String(codeCounter).padStart(4, '0')}`;
  const deviceId = 'lab-tests';
  const mutations: Record<string, unknown>[] = [{
    mutationId: randomUUID(), entity: 'pile', id: pileId, op: 'upsert', baseRevision: null,
    data: { id: pileId, siteId: site.id, code: pileCode, material: 'sluice-tailings', footprint: null, heightM: 2, shapeModel: 'cone', angleOfReposeDeg: 35, bulkDensityTPerM3: null, moisturePct: 5, spotHeights: null, sackCount: null, sackMassKg: null, hazards: [], notes: 'lab test pile' },
  }];
  const ids: string[] = specs.map(() => randomUUID());
  const codes = specs.map(() => {
    codeCounter += 1;
    return `${site.code}-${DEVICE}-${String(codeCounter).padStart(4, '0')}`;
  });
  specs.forEach((spec, index) => {
    const sampleType = spec.sampleType ?? 'routine';
    mutations.push({
      mutationId: randomUUID(), entity: 'sample', id: ids[index], op: 'upsert', baseRevision: null,
      data: {
        id: ids[index], pileId, code: codes[index], sampleType, duplicateOfId: spec.duplicateOfIndex !== undefined ? ids[spec.duplicateOfIndex] : null,
        standardId: sampleType === 'standard' ? spec.standardId ?? 'JRM-STD-2.5' : spec.standardId ?? null,
        location: { type: 'Point', coordinates: spec.lonLat ?? [33.4518 + index * 1e-5, -4.0512] }, gpsAccuracyM: 4, wetMassKg: 2.5 + index / 10, moisturePct: null,
        increments: 8, position: 'toe', collectedAt: new Date(Date.UTC(2026, 5, 1, 8, index)).toISOString(), collectorId: person('geologist').id, deviceId,
      },
    });
    if (spec.panGpt !== undefined && spec.panGpt !== null) {
      const panId = randomUUID();
      mutations.push({
        mutationId: randomUUID(), entity: 'panTest', id: panId, op: 'upsert', baseRevision: null,
        data: { id: panId, sampleId: ids[index], massPannedKg: 10, colours: [], goldMassMg: spec.panGpt * 10, panEfficiency: 1, testedAt: new Date(Date.UTC(2026, 5, 2)).toISOString() },
      });
    }
  });
  const response = await request(app).post('/api/sync/push').set('Authorization', `Bearer ${token}`).send({ deviceId, mutations }).expect(200);
  const refused = (response.body.results as { status: string }[]).filter((result) => result.status !== 'applied');
  if (refused.length > 0) {
    throw new Error(`samples not made: ${JSON.stringify(response.body.results)}`);
  }
  return { pileId, pileCode, ids, codes };
}

/** A batch request with sensible defaults: fire assay with AAS finish, no QA/QC insertion unless asked. */
export function batchBody(sampleIds: readonly string[], overrides: Record<string, unknown> = {}) {
  return {
    siteId: JR.id, sampleIds, labName: 'Kestrel Analytical', labContactEmail: 'assays@kestrel.lab.test',
    method: 'Fire assay, AAS finish', chargeMassG: 30, detectionLimitGpt: 0.005, upperLimitGpt: 100,
    isBlind: true, blankEvery: 0, standardEvery: 0, duplicateEvery: 0, standardCodes: [], seed: 20260601, notes: '', ...overrides,
  };
}

/** Parses a CSV the server wrote into header and rows of text. */
export function readCsv(text: string): { header: string[]; rows: string[][] } {
  const parsed = Papa.parse<string[]>(text, { skipEmptyLines: true });
  const [header, ...rows] = parsed.data;
  return { header: header ?? [], rows };
}

/** Writes a results CSV in the Heapsight results format with papaparse (quoting per RFC 4180). */
export function resultsCsv(rows: readonly (readonly string[])[], header: readonly string[] = ['sample code', 'Au g/t']): string {
  return `${Papa.unparse({ fields: [...header], data: rows.map((row) => [...row]) }, { newline: '\r\n' })}\r\n`;
}
