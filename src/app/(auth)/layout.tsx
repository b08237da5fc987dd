import type { ReactNode } from "react";
import { Wordmark } from "@/components/wordmark";

export default function AuthLayout({ children }: { children: ReactNode }) {
  return (
    <main className="flex min-h-dvh flex-col items-center justify-center px-4 py-10">
      <Wordmark className="mb-6 text-xl" />
      <div className="card w-full max-w-md p-6 sm:p-8">{children}</div>
    </main>
  );
}
