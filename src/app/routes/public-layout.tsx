import { Outlet } from 'react-router-dom';
import { Wordmark } from '../../components/ui/wordmark';

/** Sign-in, set-up, invite and password pages: one card in the middle of a quiet page. */
export function PublicLayout() {
  return (
    <div className="flex min-h-screen flex-col items-center bg-background px-4 py-10 sm:py-16">
      <Wordmark className="mb-8 text-xl" />
      <main className="w-full max-w-md">
        <Outlet />
      </main>
      <p className="mt-auto pt-10 text-center text-xs text-muted-foreground">
        Crankwise locates accessory-drive noises by order analysis.
      </p>
    </div>
  );
}
