"use client";
import { useRouter } from "next/navigation";
import { authClient } from "@/lib/auth-client";

export function SignOutButton() {
  const router = useRouter();
  return (
    <button
      type="button"
      className="mt-2 min-h-touch text-sm text-copper underline-offset-2 hover:underline md:mt-3"
      onClick={async () => {
        await authClient.signOut();
        router.replace("/sign-in?notice=signed-out");
        router.refresh();
      }}
    >
      Sign out
    </button>
  );
}
