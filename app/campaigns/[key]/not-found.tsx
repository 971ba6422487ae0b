import Link from 'next/link';

export default function CampaignNotFound() {
  return (
    <section className="problem" data-testid="not-found">
      <h1>No campaign by that key</h1>
      <p>
        The fleet register has no campaign with this key. <Link href="/campaigns">All campaigns</Link>
      </p>
    </section>
  );
}
