import type { Metadata } from 'next';
import Link from 'next/link';
import { notFound } from 'next/navigation';
import { TrialForm } from '@/components/trial/trial-form';
import { getActor } from '@/lib/auth/actor';
import { parseId } from '@/lib/http/respond';
import { getTrialForEdit } from '@/lib/queries/trials';
import { updateTrialAction } from '../../actions';

export const dynamic = 'force-dynamic';

export const metadata: Metadata = { title: 'Edit a trial' };

export default async function EditTrialPage({ params }: { params: Promise<{ id: string }> }) {
  const id = parseId((await params).id);
  const trial = id ? await getTrialForEdit(id, await getActor()) : null;
  if (!trial) notFound();
  return (
    <div className="max-w-3xl space-y-6">
      <p>
        <Link href={`/trials/${trial.id}`}>← Back to trial {trial.id}</Link>
      </p>
      <h1 className="text-3xl">Edit trial {trial.id}</h1>
      <p className="text-ink-muted">Changing the dose, area or setting recomputes the evidence on the feedstock’s page.</p>
      <TrialForm
        mode="edit"
        action={updateTrialAction}
        trialId={trial.id}
        feedstocks={[]}
        pairable={trial.pairable}
        initial={trial.values}
        version={trial.version}
        fixedFeedstock={trial.feedstock}
      />
    </div>
  );
}
