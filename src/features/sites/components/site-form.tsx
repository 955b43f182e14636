import { siteCreateSchema, siteUpdateSchema, type SiteCreate, type SiteDto } from '../../../../shared/schemas/site';
import { Caution } from '../../../components/caution';
import { FormMessage, SelectField, TextAreaField, TextField, type Option, FormActions } from '../../../components/form-field';
import { toIdOrNull, toNumber, useSchemaForm } from '../../../lib/schema-form';
import { useCreateSite, useUpdateSite } from '../api/sites';

interface SiteFormProps {
  site?: SiteDto;
  neighbourhoodOptions: Option[];
  /** People who may host; null when the caller cannot list people, so the host stays as it is. */
  hostOptions: Option[] | null;
  onSaved: (site: SiteDto) => void;
  onCancel: () => void;
}

function initialValues(site?: SiteDto) {
  return {
    name: site?.name ?? '',
    neighbourhoodId: site ? String(site.neighbourhoodId) : '',
    latitude: site ? String(site.latitude) : '',
    longitude: site ? String(site.longitude) : '',
    groundElevationM: site ? String(site.groundElevationM) : '',
    antennaHeightM: site ? String(site.antennaHeightM) : '',
    accessNotes: site?.accessNotes ?? '',
    hostUserId: site?.hostUserId ? String(site.hostUserId) : '',
  };
}

export function SiteForm({ site, neighbourhoodOptions, hostOptions, onSaved, onCancel }: SiteFormProps) {
  const create = useCreateSite();
  const update = useUpdateSite(site?.id ?? 0);
  const form = useSchemaForm({
    defaultValues: initialValues(site),
    schema: site ? siteUpdateSchema : siteCreateSchema,
    toInput: (values) => ({
      name: values.name,
      neighbourhoodId: toNumber(values.neighbourhoodId),
      latitude: toNumber(values.latitude),
      longitude: toNumber(values.longitude),
      groundElevationM: toNumber(values.groundElevationM),
      antennaHeightM: toNumber(values.antennaHeightM),
      accessNotes: values.accessNotes,
      ...(hostOptions ? { hostUserId: toIdOrNull(values.hostUserId) } : {}),
    }),
  });
  const { field } = form;
  const submit = form.handleSubmit((input) => {
    if (site) update.mutate(input, { onSuccess: onSaved, onError: form.showServerError });
    else create.mutate(input as SiteCreate, { onSuccess: onSaved, onError: form.showServerError });
  });

  return (
    <form noValidate aria-label={site ? `Edit ${site.name}` : 'New site'} className="space-y-4 rounded-lg border border-line bg-surface p-4" onSubmit={submit}>
      <Caution>Roof access and mast work are dangerous. Follow local codes and licensed practice, and never work at height alone.</Caution>
      <FormMessage message={form.formError} />
      <div className="grid gap-4 sm:grid-cols-2">
        <TextField label="Name" {...field('name')} />
        <SelectField label="Neighbourhood" {...field('neighbourhoodId')} options={neighbourhoodOptions} placeholder="Choose…" />
        <TextField label="Latitude (°)" inputMode="decimal" {...field('latitude')} hint="WGS84, north positive, e.g. 52.0702" />
        <TextField label="Longitude (°)" inputMode="decimal" {...field('longitude')} hint="WGS84, east positive, e.g. 4.3007" />
        <TextField label="Ground elevation (m)" inputMode="decimal" {...field('groundElevationM')} hint="Above sea level; blank means 0" />
        <TextField label="Antenna height above ground (m)" inputMode="decimal" {...field('antennaHeightM')} hint="Blank means 0" />
        {hostOptions ? (
          <SelectField label="Host" {...field('hostUserId')} options={hostOptions} placeholder="No host" />
        ) : (
          site?.host && <TextField label="Host" value={site.host.name} readOnly hint="Only an admin can change the host." />
        )}
      </div>
      <TextAreaField label="Access notes" {...field('accessNotes')} hint="How to reach the roof or window: keys, ladders, who to call first." />
      <FormActions label={site ? 'Save changes' : 'Add site'} busy={create.isPending || update.isPending} onCancel={onCancel} />
    </form>
  );
}
