import Link from 'next/link';
import type { ComponentProps } from 'react';

/**
 * Gatewell's in-app link: client-side navigation without prefetching. Every Gatewell page is rendered
 * per person and per request, so a prefetch is a real server render (two requests per visible link, the
 * navigation and each plate row alike, about 12 ms of server CPU and more each); following a link costs
 * one render instead. Pass `prefetch` to ask for it where a link is nearly always followed.
 */
export function AppLink(props: ComponentProps<typeof Link>) {
  return <Link prefetch={false} {...props} />;
}
