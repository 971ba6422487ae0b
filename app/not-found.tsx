import Link from 'next/link';

export default function NotFound() {
  return (
    <section className="problem" data-testid="not-found">
      <h1>Page not found</h1>
      <p>
        Nothing lives at this address. <Link href="/">Back to the fleet</Link>
      </p>
    </section>
  );
}
