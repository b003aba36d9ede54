import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { z } from 'zod';
import { useNavigate, useSearchParams } from 'react-router-dom';
import { useQuery, useQueryClient } from '@tanstack/react-query';
import { PasswordSchema, type Me } from '@shared/schema/auth';
import { api, ApiError, setCsrfToken } from '../../lib/api-client';
import { meQuery, homeFor } from '../../lib/session';
import { applyServerIssues } from '../../lib/forms';
import { Field, Input } from '../../components/ui/field';
import { Button } from '../../components/ui/button';
import { Alert, Spinner } from '../../components/ui/card';
import { AuthFrame } from './components/auth-frame';

interface Preview { email: string; name: string; roles: string[]; shopName: string; hasAccount: boolean }
const AcceptForm = z.object({ name: z.string().trim().min(1, 'Enter your name'), password: PasswordSchema });

export function InvitationPage() {
  const [params] = useSearchParams();
  const token = params.get('token') ?? '';
  const navigate = useNavigate();
  const qc = useQueryClient();
  const [formError, setFormError] = useState('');
  const preview = useQuery({
    queryKey: ['invitation', token],
    queryFn: () => api.get<Preview>(`/api/auth/invitations/${encodeURIComponent(token)}`),
    enabled: token.length > 0,
  });
  const { register, handleSubmit, setError, formState: { errors, isSubmitting } } = useForm<z.infer<typeof AcceptForm>>({
    resolver: zodResolver(AcceptForm),
    values: { name: preview.data?.name ?? '', password: '' },
  });
  const onSubmit = handleSubmit(async (values) => {
    try {
      const me = await api.post<Me & { csrfToken: string }>('/api/auth/invitations/accept', { token, ...values });
      setCsrfToken(me.csrfToken);
      qc.clear();
      qc.setQueryData(meQuery.queryKey, me);
      navigate(homeFor(me.shops.find((s) => s.id === me.currentShopId)?.roles ?? []), { replace: true });
    } catch (err) {
      setFormError(applyServerIssues(err, setError, ['name', 'password']));
    }
  });
  if (!token) return <AuthFrame title="Invitation"><Alert>This link is incomplete. Open the link from the e-mail again.</Alert></AuthFrame>;
  if (preview.isLoading) return <AuthFrame title="Invitation"><Spinner /></AuthFrame>;
  if (preview.error) {
    const msg = preview.error instanceof ApiError ? preview.error.message : 'This invitation cannot be opened.';
    return <AuthFrame title="Invitation"><Alert title="This link does not work">{msg}</Alert></AuthFrame>;
  }
  const p = preview.data!;
  return (
    <AuthFrame title={`Join ${p.shopName}`}>
      <p className="mb-4 text-ink-soft">You are invited as <strong>{p.roles.join(', ')}</strong> with the e-mail <strong>{p.email}</strong>.</p>
      <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4">
        {formError && <Alert>{formError}</Alert>}
        <Field label="Your name" error={errors.name?.message}><Input autoComplete="name" {...register('name')} /></Field>
        <Field label={p.hasAccount ? 'Your existing password' : 'Choose a password'} hint={p.hasAccount ? 'You already have an account: enter its password to join this shop.' : 'At least 10 characters.'} error={errors.password?.message}>
          <Input type="password" autoComplete={p.hasAccount ? 'current-password' : 'new-password'} {...register('password')} />
        </Field>
        <Button type="submit" size="lg" busy={isSubmitting}>Join the shop</Button>
      </form>
    </AuthFrame>
  );
}
