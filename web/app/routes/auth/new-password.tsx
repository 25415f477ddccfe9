// /reset/:token: choose a new password from the link in the reset e-mail.
import { useParams } from 'react-router-dom';
import { AuthCard } from '../../../features/auth/components/auth-card';
import { NewPasswordForm } from '../../../features/auth/components/new-password-form';

export default function NewPasswordPage() {
  const { token = '' } = useParams();
  return (
    <AuthCard title="Choose a new password">
      <NewPasswordForm token={token} />
    </AuthCard>
  );
}
