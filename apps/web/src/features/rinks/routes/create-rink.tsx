import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { useNavigate } from 'react-router';
import { createRinkInput, type CreateRinkInput } from '@rinkwright/core';
import { Button } from '../../../components/ui/button';
import { Alert } from '../../../components/ui/feedback';
import { TextField } from '../../../components/ui/field';
import { NarrowPage } from '../../../components/ui/layout';
import { applyServerErrors } from '../../../lib/forms';
import { useCreateRink } from '../api/create-rink';
import { guessTimeZone, RinkDetailFields } from '../components/rink-fields';

const slugOf = (name: string) =>
  name
    .toLowerCase()
    .normalize('NFKD')
    .replace(/[^a-z0-9]+/g, '-')
    .replace(/^-+|-+$/g, '')
    .slice(0, 48);

export function Component() {
  const navigate = useNavigate();
  const create = useCreateRink();
  const [problem, setProblem] = useState('');
  const [slugEdited, setSlugEdited] = useState(false);
  const { register, handleSubmit, formState, setValue, setError } = useForm<CreateRinkInput>({
    resolver: zodResolver(createRinkInput),
    defaultValues: { name: '', slug: '', timeZone: guessTimeZone(), currency: 'CAD', unitPreference: 'in' },
  });

  const onSubmit = handleSubmit(async (values) => {
    setProblem('');
    try {
      const { slug } = await create.mutateAsync(values);
      navigate(`/rinks/${slug}`);
    } catch (error) {
      setProblem(applyServerErrors(error, setError, ['name', 'slug', 'timeZone', 'currency', 'unitPreference']));
    }
  });

  const name = register('name', { onChange: (e: { target: { value: string } }) => !slugEdited && setValue('slug', slugOf(e.target.value)) });
  const slug = register('slug', { onChange: () => setSlugEdited(true) });

  return (
    <NarrowPage title="Set up your rink">
      <form onSubmit={onSubmit} noValidate className="space-y-4">
        <p className="text-ink-soft">You will be the rink's owner. You can invite your staff next.</p>
        <Alert>{problem}</Alert>
        <TextField label="Rink name" error={formState.errors.name?.message} {...name} />
        <TextField label="Web address" hint="Used in links such as /r/your-rink." error={formState.errors.slug?.message} {...slug} />
        <RinkDetailFields register={register} errors={formState.errors} />
        <Button type="submit" busy={formState.isSubmitting} className="w-full">
          {formState.isSubmitting ? 'Creating…' : 'Create the rink'}
        </Button>
      </form>
    </NarrowPage>
  );
}
