import { ApiReference } from '../../features/api-docs/components/api-reference.tsx';

/** `/api-reference`: Lagbook's HTTP API, read from the OpenAPI document the server publishes. */
export default function ApiReferenceRoute() {
  return <ApiReference origin={window.location.origin} />;
}
