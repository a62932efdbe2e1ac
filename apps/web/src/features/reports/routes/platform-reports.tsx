import { Navigate, useLocation, useParams } from 'react-router';
import { platformReports } from '../api/keys';

/** A rink's reports in the platform console open on throughput, keeping any filters in the link. */
export function Component() {
  const { rinkId = '' } = useParams();
  const { search } = useLocation();
  return <Navigate to={`${platformReports(rinkId).pages}/throughput${search}`} replace />;
}
