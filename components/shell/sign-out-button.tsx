'use client';

// next-auth's browser client is fetched when someone signs out, not with every page (it sits in the header).
export function SignOutButton() {
  return (
    <button
      type="button"
      className="text-sm underline"
      onClick={async () => {
        const { signOut } = await import('next-auth/react');
        await signOut({ callbackUrl: '/signin' });
      }}
    >
      Sign out
    </button>
  );
}
