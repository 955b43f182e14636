import {
  neighbourhoodCreateSchema,
  neighbourhoodUpdateSchema,
  type NeighbourhoodCreate,
  type NeighbourhoodDto,
} from '../../../../shared/schemas/neighbourhood';
import { FormMessage, TextAreaField, TextField, FormActions } from '../../../components/form-field';
import { optionalText, useSchemaForm } from '../../../lib/schema-form';
import { useCreateNeighbourhood, useUpdateNeighbourhood } from '../api/neighbourhoods';

interface NeighbourhoodFormProps {
  neighbourhood?: NeighbourhoodDto;
  onSaved: (neighbourhood: NeighbourhoodDto) => void;
  onCancel: () => void;
}

export function NeighbourhoodForm({ neighbourhood, onSaved, onCancel }: NeighbourhoodFormProps) {
  const create = useCreateNeighbourhood();
  const update = useUpdateNeighbourhood(neighbourhood?.id ?? 0);
  const form = useSchemaForm({
    defaultValues: { name: neighbourhood?.name ?? '', description: neighbourhood?.description ?? '' },
    schema: neighbourhood ? neighbourhoodUpdateSchema : neighbourhoodCreateSchema,
    // On edit a blank description clears it; on create it is simply left out.
    toInput: (values) => ({ name: values.name, description: neighbourhood ? values.description : optionalText(values.description) }),
  });
  const submit = form.handleSubmit((input) => {
    if (neighbourhood) update.mutate(input, { onSuccess: onSaved, onError: form.showServerError });
    else create.mutate(input as NeighbourhoodCreate, { onSuccess: onSaved, onError: form.showServerError });
  });

  return (
    <form
      noValidate
      aria-label={neighbourhood ? `Edit ${neighbourhood.name}` : 'New neighbourhood'}
      className="space-y-4 rounded-lg border border-line bg-surface p-4"
      onSubmit={submit}
    >
      <FormMessage message={form.formError} />
      <TextField label="Name" {...form.field('name')} />
      <TextAreaField label="Description" {...form.field('description')} hint="Streets it covers, where the uplink is." />
      <FormActions label={neighbourhood ? 'Save changes' : 'Add neighbourhood'} busy={create.isPending || update.isPending} onCancel={onCancel} />
    </form>
  );
}
