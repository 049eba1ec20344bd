import { TokensPage } from '../../features/tokens/components/tokens-page.tsx';
import { MissingPermission } from '../../features/labs/components/lab-not-found.tsx';
import { useLabContext } from './lab-context.ts';

/** `/labs/:lab/tokens`: the member's own personal API tokens (scientists and above). */
export default function LabTokensRoute() {
  const { detail } = useLabContext();
  if (!detail.permissions.includes('tokens.manage-own')) return <MissingPermission what="personal API tokens" />;
  return <TokensPage slug={detail.lab.slug} origin={window.location.origin} />;
}
