import { ChannelsTogether } from '../../features/channels/components/channels-together.tsx';
import { MissingPermission } from '../../features/labs/components/lab-not-found.tsx';
import { useLabContext } from './lab-context.ts';

/** `/labs/:lab/channels/together?channels=…&from=…&to=…&zone=…`: up to six channels of the lab on one chart. */
export default function LabChannelsTogetherRoute() {
  const { detail } = useLabContext();
  if (!detail.permissions.includes('channels.read')) return <MissingPermission what="the channels" />;
  return <ChannelsTogether slug={detail.lab.slug} canExport={detail.permissions.includes('exports.create')} />;
}
