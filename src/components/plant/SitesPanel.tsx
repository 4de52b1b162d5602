import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { z } from 'zod';
import { ELEVATION_MAX_m, ELEVATION_MIN_m } from '~/lib/plant/atmosphere';
import { SiteInput } from '~/lib/plant/inputs';
import { Notice } from './common';
import { FormInput, SubmitCell } from '~/components/ui/Field';
import { call, messageOf, type Message } from '~/components/api';
import { GridTable, num } from '~/components/ui/GridTable';

export interface SiteSummary {
  id: string;
  name: string;
  timeZone: string;
  units: number;
  complete: number;
}

const NewSite = z.object({
  name: SiteInput.shape.name,
  timeZone: SiteInput.shape.timeZone,
  elevation: z
    .string()
    .trim()
    .refine((v) => v === '' || SiteInput.shape.elevation_m.safeParse(Number(v)).success, `An elevation in metres, ${ELEVATION_MIN_m} to ${ELEVATION_MAX_m}.`),
});
type NewSite = z.infer<typeof NewSite>;

/** The sites, each with its clock and how many of its units can compute. */
function SitesTable({ sites }: { sites: SiteSummary[] }) {
  return (
    <GridTable columns={['Site', 'Time zone', num('Units'), num('Complete')]}>
      {sites.map((s) => (
        <tr key={s.id}>
          <td>
            <a href={`/plant/${s.id}`}>{s.name}</a>
          </td>
          <td>{s.timeZone}</td>
          <td className="num">{s.units}</td>
          <td className="num">{s.complete}</td>
        </tr>
      ))}
    </GridTable>
  );
}

/** The New site card (admins): by hand, or from a model file; either opens the new site's page. */
function NewSiteSection({ onMessage }: { onMessage: (m: Message) => void }) {
  const form = useForm<NewSite>({ resolver: zodResolver(NewSite), defaultValues: { name: '', timeZone: 'UTC', elevation: '' } });

  async function create(v: NewSite) {
    try {
      const { site } = await call<{ site: { id: string } }>('/api/sites', 'POST', {
        name: v.name,
        timeZone: v.timeZone,
        ...(v.elevation !== '' ? { elevation_m: Number(v.elevation) } : {}),
      });
      window.location.href = `/plant/${site.id}`;
    } catch (e) {
      onMessage(messageOf(e));
    }
  }

  async function fromFile(file: File | undefined) {
    if (!file) return;
    try {
      const out = await call<{ siteId: string }>('/api/sites/from-model', 'POST', await file.text());
      window.location.href = `/plant/${out.siteId}`;
    } catch (e) {
      onMessage(messageOf(e));
    }
  }

  return (
    <section className="card">
      <h2 className="mb-3">New site</h2>
      <form onSubmit={form.handleSubmit(create)} className="grid gap-3 sm:grid-cols-4" noValidate>
        <FormInput form={form} name="name" id="site-name" label="Name" />
        <FormInput form={form} name="timeZone" id="site-tz" label="Time zone" />
        <FormInput form={form} name="elevation" id="site-elevation" label="Elevation [m]" inputMode="decimal" />
        <SubmitCell busy={form.formState.isSubmitting}>Create site</SubmitCell>
      </form>
      <div className="mt-4 border-t border-paper-edge pt-3">
        <label className="label" htmlFor="site-from-file">
          Or create a site from a model file (<a href="/help/model-file">its format</a>)
        </label>
        <input id="site-from-file" type="file" accept="application/json,.json" onChange={(e) => fromFile(e.target.files?.[0])} />
      </div>
    </section>
  );
}

/** The list of sites; admins also create a site by hand or from a model file. */
export default function SitesPanel({ sites, canEdit }: { sites: SiteSummary[]; canEdit: boolean }) {
  const [message, setMessage] = useState<Message>(null);
  return (
    <div className="space-y-6">
      <section className="card">
        <h2 className="mb-3">Sites</h2>
        {sites.length === 0 ? <p className="text-sm text-ink-faint">No site yet.</p> : <SitesTable sites={sites} />}
      </section>
      {canEdit && (
        <>
          <Notice message={message} />
          <NewSiteSection onMessage={setMessage} />
        </>
      )}
    </div>
  );
}
