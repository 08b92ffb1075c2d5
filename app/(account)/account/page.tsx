import type { Metadata } from "next";
import { getCurrentUser } from "@/lib/auth/current-user";
import { ROLE_LABELS } from "@/lib/auth/roles";
import { readPerson } from "@/lib/db/queries/users";
import { SavedSearches } from "@/components/saved-searches";
import { PasswordForm } from "./password-form";
import { ProfileForm } from "./profile-form";

export const metadata: Metadata = { title: "Your account" };
export const dynamic = "force-dynamic";

export default async function AccountPage() {
  const user = await getCurrentUser();
  const person = user ? await readPerson({ userId: user.id }) : null;
  if (!user || !person) return null; // the layout has already sent anyone signed out to /signin
  return (
    <div className="space-y-8">
      <header className="space-y-1">
        <h1 className="text-xl font-semibold tracking-tight">Your account</h1>
        <dl className="grid grid-cols-[max-content_1fr] gap-x-4 gap-y-0.5 text-ink-soft">
          <dt>E-mail</dt>
          <dd className="text-ink">{person.email}</dd>
          <dt>Role</dt>
          <dd className="text-ink">{ROLE_LABELS[person.role]} — an admin can change it</dd>
          <dt>Member since</dt>
          <dd className="text-ink">{person.createdAt.toISOString().slice(0, 10)}</dd>
        </dl>
      </header>
      <section aria-labelledby="profile-heading" className="space-y-3">
        <h2 id="profile-heading" className="text-base font-semibold">
          Profile
        </h2>
        <ProfileForm name={person.name} affiliation={person.affiliation} />
      </section>
      <section aria-labelledby="password-heading" className="space-y-3">
        <h2 id="password-heading" className="text-base font-semibold">
          Password
        </h2>
        <PasswordForm />
      </section>
      <SavedSearches userId={user.id} />
    </div>
  );
}
