import { useSearchParams } from 'react-router-dom';
import { readAuditFilters, writeAuditFilters, type AuditFilters } from './audit-search-params.ts';

/** The audit filters held in the URL, so a filtered view can be reloaded, shared and navigated back to. */
export function useAuditFilters(): [AuditFilters, (next: AuditFilters) => void] {
  const [params, setParams] = useSearchParams();
  return [readAuditFilters(params), (next) => setParams(writeAuditFilters(next))];
}
