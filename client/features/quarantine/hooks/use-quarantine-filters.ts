import { useSearchParams } from 'react-router-dom';
import { readQuarantineFilters, writeQuarantineFilters, type QuarantineFilters } from './quarantine-search-params.ts';

/** The quarantine filters held in the URL, so a filtered view can be linked to (e.g. from an upload summary) and reloaded. */
export function useQuarantineFilters(): [QuarantineFilters, (next: QuarantineFilters) => void] {
  const [params, setParams] = useSearchParams();
  return [readQuarantineFilters(params), (next) => setParams(writeQuarantineFilters(next))];
}
