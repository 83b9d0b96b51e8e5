import type { Role } from '../../shared/accounts/roles';

/**
 * The invented demo scenario: a fictional cooperative with two fictional sites and one person per
 * role. No name here belongs to a real person, company or place.
 */
export const DEMO_PASSWORD = 'heapsight-demo';

export const DEMO_ORGANIZATION = { id: '6f0e2a53-8c1d-4b7a-9a51-2d3c4e5f6a01', name: 'Jackal Ridge Miners\u2019 Cooperative' };

export const DEMO_SITES = [
  {
    id: '6f0e2a53-8c1d-4b7a-9a51-2d3c4e5f6b01',
    code: 'JR',
    name: 'Jackal Ridge camp',
    processingLat: -4.0512,
    processingLon: 33.4518,
  },
  {
    id: '6f0e2a53-8c1d-4b7a-9a51-2d3c4e5f6b02',
    code: 'IF',
    name: 'Ironstone Flats',
    processingLat: -4.0931,
    processingLon: 33.5102,
  },
] as const;

export interface DemoPerson {
  readonly id: string;
  readonly email: string;
  readonly name: string;
  readonly role: Role;
  readonly labName: string | null;
  readonly siteCodes: readonly string[];
}

export const DEMO_PEOPLE: readonly DemoPerson[] = [
  { id: '6f0e2a53-8c1d-4b7a-9a51-2d3c4e5f6c01', email: 'sampler@demo.heapsight.test', name: 'Neema Field', role: 'sampler', labName: null, siteCodes: ['JR'] },
  { id: '6f0e2a53-8c1d-4b7a-9a51-2d3c4e5f6c02', email: 'geologist@demo.heapsight.test', name: 'Tito Rockwell', role: 'geologist', labName: null, siteCodes: ['JR', 'IF'] },
  { id: '6f0e2a53-8c1d-4b7a-9a51-2d3c4e5f6c03', email: 'lab@demo.heapsight.test', name: 'Assay desk, Kestrel Analytical', role: 'lab', labName: 'Kestrel Analytical', siteCodes: [] },
  { id: '6f0e2a53-8c1d-4b7a-9a51-2d3c4e5f6c04', email: 'manager@demo.heapsight.test', name: 'Halima Ledger', role: 'manager', labName: null, siteCodes: ['JR', 'IF'] },
  { id: '6f0e2a53-8c1d-4b7a-9a51-2d3c4e5f6c05', email: 'admin@demo.heapsight.test', name: 'Omari Keys', role: 'admin', labName: null, siteCodes: ['JR', 'IF'] },
];
