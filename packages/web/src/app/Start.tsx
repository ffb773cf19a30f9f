import { useQueries } from '@tanstack/react-query';
import { Navigate } from 'react-router-dom';
import { historyQueryOptions } from '../features/extracts/api/extracts';
import { useMe } from '../lib/session';
import { landingPath } from '../lib/landing';
import { PageLoading } from './PageLoading';
import { useQuarterList } from '../lib/quarter-list';

/**
 * `/start`: where sign-in comes back to when no page was asked for. It sends the person on to
 * where they land (`landingPath`): a practice lead with results to read, to those results; everyone
 * else to the home page. The home page itself never sends anyone away, so Home stays reachable.
 */
export function Start() {
  const me = useMe();
  const lead = me.data?.role === 'practice_lead' ? me.data : null;
  const quarters = useQuarterList();
  const histories = useQueries({
    queries: (lead?.practices ?? []).map((p) => historyQueryOptions(p.id)),
  });
  if (me.isPending) return <PageLoading />;
  if (!me.data) return <Navigate to="/sign-in" replace />;
  if (!lead) return <Navigate to="/" replace />;
  // Anything that cannot be read sends the lead home, where it is explained.
  if (quarters.isError || histories.some((h) => h.isError)) return <Navigate to="/" replace />;
  if (quarters.isPending || histories.some((h) => h.isPending)) return <PageLoading />;
  const byId = new Map(lead.practices.map((p, i) => [p.id, histories[i]?.data]));
  return <Navigate to={landingPath(lead, quarters.data, byId)} replace />;
}
