import { AppLink } from '@/components/ui/app-link';

export default function NotFound() {
  return (
    <main className="flex min-h-screen items-center justify-center p-6">
      <div className="gw-card max-w-md p-8">
        <h1 className="text-2xl font-semibold">Not found</h1>
        <p className="mt-2 text-sm text-ink-700">There is nothing at this address, or you may not see it.</p>
        <AppLink href="/" className="gw-button mt-5">
          Back to my work
        </AppLink>
      </div>
    </main>
  );
}
