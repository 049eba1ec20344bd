import { Outlet, useOutletContext, useParams } from 'react-router-dom';
import { ROLE_LABELS } from '@shared/policies/permissions.ts';
import type { Me } from '@shared/contract/me.ts';
import type { LabDetail } from '@shared/contract/labs.ts';
import { useLab } from '../../features/labs/api/get-lab.ts';
import { visibleSections } from '../../features/labs/components/lab-sections.ts';
import { LabNotFound } from '../../features/labs/components/lab-not-found.tsx';
import { LoadingNote, Notice } from '../../components/notice.tsx';
import { SectionTabs, type SectionTab } from '../../components/section-tabs.tsx';
import { ApiError } from '../../lib/api-client.ts';
import type { LabOutletContext } from './lab-context.ts';

/** The lab's sections as tabs, only those the role may open (the server refuses the rest anyway). */
function labTabs(detail: LabDetail): SectionTab[] {
  return visibleSections(detail.permissions).map((s, i) => ({ label: s.label, to: s.href(detail.lab.slug), ...(i === 0 ? { exact: true } : {}) }));
}

/** `/labs/:lab/*`: loads the lab, shows its name, your role and the sections your role may open. */
export default function LabLayout() {
  const me = useOutletContext<Me>();
  const { lab: slug = '' } = useParams();
  const lab = useLab(slug);

  if (lab.isPending) return <LoadingNote what="Opening the lab…" />;
  if (lab.isError) {
    if (lab.error instanceof ApiError && lab.error.status === 404) return <LabNotFound slug={slug} />;
    return <Notice tone="alert">{lab.error.message}</Notice>;
  }
  const detail = lab.data;
  return (
    <div>
      <header className="flex flex-wrap items-end justify-between gap-3">
        <div>
          <p className="text-sm font-medium uppercase tracking-wide text-ink-soft">Lab</p>
          <h1 className="text-3xl font-semibold">{detail.lab.name}</h1>
        </div>
        <p className="rounded-full border border-rule bg-card px-3 py-1 text-sm" data-testid="lab-role">
          Your role: <strong>{ROLE_LABELS[detail.role]}</strong>
        </p>
      </header>
      <SectionTabs label="Lab sections" tabs={labTabs(detail)} />
      <div className="mt-6">
        <Outlet context={{ me, detail } satisfies LabOutletContext} />
      </div>
    </div>
  );
}
