import { Navigate, useLocation } from 'react-router';
import { NotFound } from '../../../components/ui/not-found';
import { useRink } from '../../../lib/rink-context';
import { reportsFor } from '../components/access';

/** The reports' landing opens the first report the caller may read, keeping any filters in the link. */
export function Component() {
  const rink = useRink();
  const { search } = useLocation();
  const first = reportsFor(rink)[0];
  if (!first) return <NotFound />;
  return <Navigate to={`${first}${search}`} replace />;
}
