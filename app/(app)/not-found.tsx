import { AppLink } from '@/components/ui/app-link';

// A record that does not exist, inside the signed-in shell (its navigation stays); addresses that match
// no route at all get app/not-found.tsx.
export default function SignedInNotFound() {
  return (
    <div className="gw-card mx-auto mt-10 max-w-md p-8">
      <h1 className="text-2xl font-semibold">Not found</h1>
      <p className="mt-2 text-sm text-ink-700">There is nothing at this address, or you may not see it.</p>
      <AppLink href="/" className="gw-button mt-5">
        Back to my work
      </AppLink>
    </div>
  );
}
