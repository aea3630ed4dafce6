import { Navigate, useNavigate, useSearchParams } from 'react-router';
import { AuthCard } from '../layout/auth-card';
import { SignInForm } from '@/features/auth/components/sign-in-form';
import { useMe } from '@/features/auth/api/get-me';
import { paths } from '../paths';

export function Component() {
  const [params] = useSearchParams();
  const navigate = useNavigate();
  const { data: me } = useMe();
  const next = params.get('next')?.startsWith('/') ? params.get('next')! : paths.planner;
  if (me) return <Navigate to={next} replace />;
  return (
    <AuthCard title="Sign in to your studio">
      <SignInForm onDone={() => navigate(next, { replace: true })} />
    </AuthCard>
  );
}
