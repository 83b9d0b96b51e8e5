import { randomUUID } from 'node:crypto';
import { DEMO_ORGANIZATION } from '../../../../server/demo/demo-scenario';
import { LabBatch, LabBatchSample } from '../../../../server/lab/lab.models';
import type { Role } from '../../../../shared/accounts/roles';
import type { MatrixContext } from '../../permissions/matrix-context';
import type { RouteRule } from '../../permissions/route-rules';
import { batchBody, makeSamples } from './lab-fixtures';

const GEOLOGIST: readonly Role[] = ['geologist'];
const LAB_RESULTS: readonly Role[] = ['geologist', 'lab'];

/** A batch written straight to the database: one blank, addressed to a lab, at a site. */
async function newBatchId(context: MatrixContext, { siteId = context.sites.JR, labName = context.labs.own } = {}): Promise<string> {
  const id = randomUUID();
  await context.database.transaction(async (transaction) => {
    await LabBatch.create({
      id, organizationId: DEMO_ORGANIZATION.id, siteId, code: `MX-${context.unique()}`.slice(0, 32), labName, labContactEmail: 'assays@matrix.lab.test',
      method: 'Fire assay, AAS finish', chargeMassG: 30, detectionLimitGpt: 0.005, upperLimitGpt: null, isBlind: true,
      qcPlan: { blankEvery: 1, standardEvery: 0, duplicateEvery: 0, standardCodes: [], seed: 1 }, status: 'draft', notes: '',
      dispatchedBy: null, dispatchedAt: null, carrier: null, sealNumbers: null, receivedBy: null, receivedAt: null, conditionOnReceipt: null, sentAt: null,
      createdById: context.people.geologist.id,
    }, { transaction });
    await LabBatchSample.create({ id: randomUUID(), batchId: id, position: 1, labCode: 'MX-001', itemType: 'blank', isInserted: true, sampleId: null, duplicateOfItemId: null, standardCode: null, material: null, massKg: null }, { transaction });
  });
  return id;
}

/** Aimed at a batch of a site the geologist is no member of, addressed to another lab. */
const foreignBatch = async (context: MatrixContext) => newBatchId(context, { siteId: context.sites.outside, labName: context.labs.other });

/** The role × route rules of the lab loop; spread into ROUTE_RULES. */
export const LAB_ROUTE_RULES: readonly RouteRule[] = [
  { route: 'GET /api/reference-standards', allowed: GEOLOGIST, request: () => ({ url: '/api/reference-standards' }) },
  {
    route: 'GET /api/lab-batches/candidates', allowed: GEOLOGIST,
    request: (context) => ({ url: `/api/lab-batches/candidates?siteId=${context.sites.JR}` }),
    outOfScope: (context) => ({ url: `/api/lab-batches/candidates?siteId=${context.sites.outside}` }),
    reachesOutOfScope: [],
  },
  { route: 'GET /api/lab-batches', allowed: LAB_RESULTS, request: () => ({ url: '/api/lab-batches' }) },
  {
    route: 'POST /api/lab-batches', allowed: GEOLOGIST,
    request: async (context) => {
      const { ids } = await makeSamples(context.app, context.tokens.geologist, [{ panGpt: 1 }]);
      return { url: '/api/lab-batches', body: batchBody(ids) };
    },
  },
  {
    route: 'GET /api/lab-batches/:id', allowed: LAB_RESULTS,
    request: async (context) => ({ url: `/api/lab-batches/${await newBatchId(context)}` }),
    outOfScope: async (context) => ({ url: `/api/lab-batches/${await foreignBatch(context)}` }),
    reachesOutOfScope: [],
  },
  {
    route: 'PATCH /api/lab-batches/:id/custody', allowed: LAB_RESULTS,
    request: async (context) => ({ url: `/api/lab-batches/${await newBatchId(context)}/custody`, body: { receivedBy: 'Matrix receiver' } }),
    outOfScope: async (context) => ({ url: `/api/lab-batches/${await foreignBatch(context)}/custody`, body: { receivedBy: 'Matrix receiver' } }),
    reachesOutOfScope: [],
  },
  {
    route: 'GET /api/lab-batches/:id/submission.csv', allowed: LAB_RESULTS,
    request: async (context) => ({ url: `/api/lab-batches/${await newBatchId(context)}/submission.csv` }),
    outOfScope: async (context) => ({ url: `/api/lab-batches/${await foreignBatch(context)}/submission.csv` }),
    reachesOutOfScope: [],
  },
  { route: 'POST /api/lab-batches/:id/send', allowed: GEOLOGIST, request: async (context) => ({ url: `/api/lab-batches/${await newBatchId(context)}/send` }) },
  {
    route: 'POST /api/lab-batches/:id/results', allowed: LAB_RESULTS,
    request: async (context) => ({ url: `/api/lab-batches/${await newBatchId(context)}/results?dryRun=true`, body: { fileName: 'results.csv', csvText: 'sample code,Au g/t\r\nMX-001,<0.005\r\n' } }),
    outOfScope: async (context) => ({ url: `/api/lab-batches/${await foreignBatch(context)}/results?dryRun=true`, body: { fileName: 'results.csv', csvText: 'sample code,Au g/t\r\nMX-001,<0.005\r\n' } }),
    reachesOutOfScope: [],
  },
  {
    route: 'GET /api/qaqc', allowed: GEOLOGIST,
    request: (context) => ({ url: `/api/qaqc?siteId=${context.sites.JR}` }),
    outOfScope: (context) => ({ url: `/api/qaqc?siteId=${context.sites.outside}` }),
    reachesOutOfScope: [],
  },
  {
    route: 'GET /api/calibration', allowed: GEOLOGIST,
    request: (context) => ({ url: `/api/calibration?siteId=${context.sites.JR}` }),
    outOfScope: (context) => ({ url: `/api/calibration?siteId=${context.sites.outside}` }),
    reachesOutOfScope: [],
  },
  {
    route: 'PUT /api/calibration/:siteId', allowed: GEOLOGIST,
    request: (context) => ({ url: `/api/calibration/${context.sites.IF}`, body: { isApplied: false } }),
    outOfScope: (context) => ({ url: `/api/calibration/${context.sites.outside}`, body: { isApplied: true } }),
    reachesOutOfScope: [],
  },
  {
    route: 'GET /api/exports/samples.csv', allowed: ['sampler', 'geologist', 'manager', 'admin'],
    request: () => ({ url: '/api/exports/samples.csv?site=JR' }),
    outOfScope: () => ({ url: '/api/exports/samples.csv?site=XS' }),
  },
];
