import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { Link, useNavigate, useSearchParams } from 'react-router-dom';
import { useQueryClient } from '@tanstack/react-query';
import { LoginInput } from '@shared/schema/auth';
import type { Me } from '@shared/schema/auth';
import { api, setCsrfToken } from '../../lib/api-client';
import { meQuery, homeFor } from '../../lib/session';
import { applyServerIssues } from '../../lib/forms';
import { Field, Input } from '../../components/ui/field';
import { Button } from '../../components/ui/button';
import { Alert } from '../../components/ui/card';
import { AuthFrame } from './components/auth-frame';

export function SignInPage() {
  const [params] = useSearchParams();
  const navigate = useNavigate();
  const qc = useQueryClient();
  const [formError, setFormError] = useState('');
  const { register, handleSubmit, setError, formState: { errors, isSubmitting } } = useForm<LoginInput>({
    resolver: zodResolver(LoginInput),
    defaultValues: { email: '', password: '' },
  });
  const onSubmit = handleSubmit(async (values) => {
    setFormError('');
    try {
      const me = await api.post<Me & { csrfToken: string }>('/api/auth/login', values);
      setCsrfToken(me.csrfToken);
      qc.clear();
      qc.setQueryData(meQuery.queryKey, me);
      const roles = me.shops.find((s) => s.id === me.currentShopId)?.roles ?? [];
      const next = params.get('next');
      navigate(next && next.startsWith('/') && !next.startsWith('//') ? next : homeFor(roles), { replace: true });
    } catch (err) {
      setFormError(applyServerIssues(err, setError, ['email', 'password']));
    }
  });
  return (
    <AuthFrame title="Sign in">
      <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4">
        {formError && <Alert title="Not signed in">{formError}</Alert>}
        <Field label="E-mail" error={errors.email?.message}>
          <Input type="email" autoComplete="username" inputMode="email" {...register('email')} />
        </Field>
        <Field label="Password" error={errors.password?.message}>
          <Input type="password" autoComplete="current-password" {...register('password')} />
        </Field>
        <Button type="submit" size="lg" busy={isSubmitting}>Sign in</Button>
        <Link to="/forgot-password" className="text-center font-semibold text-ink underline underline-offset-4">Forgot your password?</Link>
      </form>
    </AuthFrame>
  );
}
