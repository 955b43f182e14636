import { neighbourhoodCreateSchema, neighbourhoodUpdateSchema, type NeighbourhoodDto } from '../../../../shared/schemas/neighbourhood';
import { FormMessage, TextAreaField, TextField, FormActions } from '../../../components/form-field';
import { optionalText, useForm } from '../../../lib/form';
import { useCreateNeighbourhood, useUpdateNeighbourhood } from '../api/neighbourhoods';

interface NeighbourhoodFormProps {
  neighbourhood?: NeighbourhoodDto;
  onSaved: (neighbourhood: NeighbourhoodDto) => void;
  onCancel: () => void;
}

export function NeighbourhoodForm({ neighbourhood, onSaved, onCancel }: NeighbourhoodFormProps) {
  const form = useForm({ name: neighbourhood?.name ?? '', description: neighbourhood?.description ?? '' });
  const create = useCreateNeighbourhood();
  const update = useUpdateNeighbourhood(neighbourhood?.id ?? 0);
  const saving = create.isPending || update.isPending;
  const { values, errors, set } = form;

  function submit() {
    // On edit a blank description clears it; on create it is simply left out.
    const input = { name: values.name, description: neighbourhood ? values.description : optionalText(values.description) };
    if (neighbourhood) {
      const parsed = form.check(neighbourhoodUpdateSchema, input);
      if (parsed) update.mutate(parsed, { onSuccess: onSaved, onError: form.showServerError });
    } else {
      const parsed = form.check(neighbourhoodCreateSchema, input);
      if (parsed) create.mutate(parsed, { onSuccess: onSaved, onError: form.showServerError });
    }
  }

  return (
    <form
      noValidate
      aria-label={neighbourhood ? `Edit ${neighbourhood.name}` : 'New neighbourhood'}
      className="space-y-4 rounded-lg border border-line bg-surface p-4"
      onSubmit={(event) => {
        event.preventDefault();
        submit();
      }}
    >
      <FormMessage message={form.formError} />
      <TextField label="Name" value={values.name} onChange={(e) => set('name', e.target.value)} errors={errors.name} />
      <TextAreaField label="Description" value={values.description} onChange={(e) => set('description', e.target.value)} errors={errors.description} hint="Streets it covers, where the uplink is." />
      <FormActions label={neighbourhood ? 'Save changes' : 'Add neighbourhood'} busy={saving} onCancel={onCancel} />
    </form>
  );
}
