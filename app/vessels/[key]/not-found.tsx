import Link from 'next/link';

export default function VesselNotFound() {
  return (
    <section className="problem" data-testid="not-found">
      <h1>No vessel by that key</h1>
      <p>
        The fleet register has no vessel with this key. It may have been renamed in a register import. <Link href="/">Back to the fleet</Link>
      </p>
    </section>
  );
}
