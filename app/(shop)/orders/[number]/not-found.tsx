import Link from 'next/link';

export default function OrderNotFound() {
  return (
    <div className="mx-auto max-w-xl py-24 text-center">
      <h1 className="text-4xl font-medium">We could not find that order</h1>
      <p className="mt-3 text-ink-soft">
        Open it from the link in your order e-mail, or sign in with the address you ordered with: your orders are listed in your account.
      </p>
      <Link href="/account" className="mt-8 inline-block rounded-full bg-ink px-6 py-3 font-semibold text-paper">
        Your account
      </Link>
    </div>
  );
}
