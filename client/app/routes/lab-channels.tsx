import { useChannels } from '../../features/channels/api/get-channels.ts';
import { ChannelsOverview } from '../../features/channels/components/channels-overview.tsx';
import { MissingPermission } from '../../features/labs/components/lab-not-found.tsx';
import { LoadingNote, Notice } from '../../components/notice.tsx';
import { useLabContext } from './lab-context.ts';

/** `/labs/:lab/channels`: every channel of the lab with its status, last reading and last day. */
export default function LabChannelsRoute() {
  const { detail } = useLabContext();
  const slug = detail.lab.slug;
  const channels = useChannels(slug);
  if (!detail.permissions.includes('channels.read')) return <MissingPermission what="the channels" />;
  return (
    <section aria-labelledby="channels-heading" className="grid gap-4">
      <h2 id="channels-heading" className="text-xl font-semibold">
        Channels
      </h2>
      {channels.isPending ? (
        <LoadingNote what="Loading channels…" />
      ) : channels.isError ? (
        <Notice tone="alert">{channels.error.message}</Notice>
      ) : channels.data.channels.length === 0 ? (
        <Notice tone="status">No channels yet: register a logger with its channels first.</Notice>
      ) : (
        <ChannelsOverview slug={slug} rows={channels.data.channels} now={channels.data.now} />
      )}
    </section>
  );
}
