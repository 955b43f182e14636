import { siteCreateSchema, siteUpdateSchema, type SiteDto } from '../../../../shared/schemas/site';
import { Caution } from '../../../components/caution';
import { FormMessage, SelectField, TextAreaField, TextField, type Option, FormActions } from '../../../components/form-field';
import { toIdOrNull, toNumber, useForm } from '../../../lib/form';
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
  const form = useForm(initialValues(site));
  const create = useCreateSite();
  const update = useUpdateSite(site?.id ?? 0);
  const saving = create.isPending || update.isPending;
  const { values, errors, set } = form;

  function submit() {
    const input = {
      name: values.name,
      neighbourhoodId: toNumber(values.neighbourhoodId),
      latitude: toNumber(values.latitude),
      longitude: toNumber(values.longitude),
      groundElevationM: toNumber(values.groundElevationM),
      antennaHeightM: toNumber(values.antennaHeightM),
      accessNotes: values.accessNotes,
      ...(hostOptions ? { hostUserId: toIdOrNull(values.hostUserId) } : {}),
    };
    if (site) {
      const parsed = form.check(siteUpdateSchema, input);
      if (parsed) update.mutate(parsed, { onSuccess: onSaved, onError: form.showServerError });
    } else {
      const parsed = form.check(siteCreateSchema, input);
      if (parsed) create.mutate(parsed, { onSuccess: onSaved, onError: form.showServerError });
    }
  }

  return (
    <form
      noValidate
      aria-label={site ? `Edit ${site.name}` : 'New site'}
      className="space-y-4 rounded-lg border border-line bg-surface p-4"
      onSubmit={(event) => {
        event.preventDefault();
        submit();
      }}
    >
      <Caution>Roof access and mast work are dangerous. Follow local codes and licensed practice, and never work at height alone.</Caution>
      <FormMessage message={form.formError} />
      <div className="grid gap-4 sm:grid-cols-2">
        <TextField label="Name" value={values.name} onChange={(e) => set('name', e.target.value)} errors={errors.name} />
        <SelectField
          label="Neighbourhood"
          value={values.neighbourhoodId}
          onChange={(e) => set('neighbourhoodId', e.target.value)}
          options={neighbourhoodOptions}
          placeholder="Choose…"
          errors={errors.neighbourhoodId}
        />
        <TextField label="Latitude (°)" inputMode="decimal" value={values.latitude} onChange={(e) => set('latitude', e.target.value)} errors={errors.latitude} hint="WGS84, north positive, e.g. 52.0702" />
        <TextField label="Longitude (°)" inputMode="decimal" value={values.longitude} onChange={(e) => set('longitude', e.target.value)} errors={errors.longitude} hint="WGS84, east positive, e.g. 4.3007" />
        <TextField label="Ground elevation (m)" inputMode="decimal" value={values.groundElevationM} onChange={(e) => set('groundElevationM', e.target.value)} errors={errors.groundElevationM} hint="Above sea level; blank means 0" />
        <TextField label="Antenna height above ground (m)" inputMode="decimal" value={values.antennaHeightM} onChange={(e) => set('antennaHeightM', e.target.value)} errors={errors.antennaHeightM} hint="Blank means 0" />
        {hostOptions ? (
          <SelectField label="Host" value={values.hostUserId} onChange={(e) => set('hostUserId', e.target.value)} options={hostOptions} placeholder="No host" errors={errors.hostUserId} />
        ) : (
          site?.host && <TextField label="Host" value={site.host.name} readOnly hint="Only an admin can change the host." />
        )}
      </div>
      <TextAreaField label="Access notes" value={values.accessNotes} onChange={(e) => set('accessNotes', e.target.value)} errors={errors.accessNotes} hint="How to reach the roof or window: keys, ladders, who to call first." />
      <FormActions label={site ? 'Save changes' : 'Add site'} busy={saving} onCancel={onCancel} />
    </form>
  );
}
