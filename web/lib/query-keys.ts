// One key factory per resource, so every query and every invalidation names data the same way:
// [resource, kind, id, …]. Invalidate a resource's `all` to refetch everything about it.
import type { PooledQuery } from '../../shared/schemas/report';

export const authKeys = {
  all: ['auth'] as const,
  me: () => [...authKeys.all, 'me'] as const,
};

export const invitationKeys = {
  all: ['invitations'] as const,
  detail: (token: string) => [...invitationKeys.all, 'detail', token] as const,
};

export const trialKeys = {
  all: ['trials'] as const,
  list: () => [...trialKeys.all, 'list'] as const,
  detail: (trialId: string) => [...trialKeys.all, 'detail', trialId] as const,
  people: (trialId: string) => [...trialKeys.all, 'people', trialId] as const,
};

export const siteKeys = {
  all: ['sites'] as const,
  mine: () => [...siteKeys.all, 'mine'] as const,
  detail: (siteId: string) => [...siteKeys.all, 'detail', siteId] as const,
  layout: (siteId: string) => [...siteKeys.all, 'layout', siteId] as const,
};

export const reportKeys = {
  all: ['reports'] as const,
  site: (siteId: string) => [...reportKeys.all, 'site', siteId] as const,
  pooledAll: (trialId: string) => [...reportKeys.all, 'pooled', trialId] as const,
  pooled: (trialId: string, query: PooledQuery) =>
    [...reportKeys.pooledAll(trialId), query] as const,
  public: (token: string, query: PooledQuery) =>
    [...reportKeys.all, 'public', token, query] as const,
};

export const peopleKeys = {
  all: ['people'] as const,
  network: (networkId: string) => [...peopleKeys.all, 'network', networkId] as const,
};

export const adminKeys = {
  all: ['admin'] as const,
  mail: () => [...adminKeys.all, 'mail'] as const,
};

export const seriesKeys = {
  all: ['series'] as const,
  list: () => [...seriesKeys.all, 'list'] as const,
  detail: (seriesId: string) => [...seriesKeys.all, 'detail', seriesId] as const,
  report: (seriesId: string) => [...seriesKeys.all, 'report', seriesId] as const,
};
