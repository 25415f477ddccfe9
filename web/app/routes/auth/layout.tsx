// Frame for sign-in, reset and invitation pages: the wordmark over a centred card.
import { Link, Outlet } from 'react-router-dom';
import { Wordmark } from '../../../components/layout/wordmark';

export default function AuthLayout() {
  return (
    <div className="flex min-h-dvh flex-col bg-canvas">
      <div
        className="h-2 bg-[repeating-linear-gradient(90deg,#e4c06a_0_18px,#d6a743_18px_22px,#1d4f2e_22px_40px,#216337_40px_44px)]"
        aria-hidden="true"
      />
      <main className="flex flex-1 flex-col items-center px-4 py-10 sm:py-16">
        <Link to="/" className="mb-8 no-underline" aria-label="Sheaf home">
          <Wordmark tone="dark" />
        </Link>
        <Outlet />
      </main>
      <footer className="px-4 pb-6 text-center text-label text-ink-muted">
        <Link to="/cautions" className="text-accent underline">
          Cautions for field work
        </Link>
      </footer>
    </div>
  );
}
