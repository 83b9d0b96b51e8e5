import { Router } from 'express';
import { handlesRequest, listRoutes } from './route-table';

function sampleRouter(): Router {
  const inner = Router();
  inner.get('/sites', (_request, response) => { response.end(); });
  inner.patch('/sites/:id', (_request, response) => { response.end(); });
  const nested = Router();
  nested.post('/push', (_request, response) => { response.end(); });
  const outer = Router();
  outer.use(inner);
  outer.use('/sync', nested);
  outer.use((_request, _response, next) => next());
  return outer;
}

describe('listRoutes', () => {
  it('lists every route with its method and full path, through nested and prefixed routers', () => {
    expect(listRoutes(sampleRouter(), '/api')).toEqual([
      { method: 'GET', path: '/api/sites' },
      { method: 'PATCH', path: '/api/sites/:id' },
      { method: 'POST', path: '/api/sync/push' },
    ]);
  });
});

describe('handlesRequest', () => {
  const router = sampleRouter();

  it('is true for a request some route handles, with parameters, prefixes and a trailing slash', () => {
    expect(handlesRequest(router, 'GET', '/sites')).toBe(true);
    expect(handlesRequest(router, 'HEAD', '/sites')).toBe(true);
    expect(handlesRequest(router, 'PATCH', '/sites/abc')).toBe(true);
    expect(handlesRequest(router, 'POST', '/sync/push/')).toBe(true);
  });

  it('is false for an unknown path or a method the path does not take', () => {
    expect(handlesRequest(router, 'GET', '/nothing')).toBe(false);
    expect(handlesRequest(router, 'DELETE', '/sites/abc')).toBe(false);
    expect(handlesRequest(router, 'GET', '/sync/push')).toBe(false);
  });
});
