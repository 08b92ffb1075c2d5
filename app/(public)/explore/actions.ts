"use server";

import { revalidatePath } from "next/cache";
import { actionWithRole } from "@/lib/auth/guard";
import { createSavedSearch, deleteSavedSearch, setSavedSearchAlerts } from "@/lib/db/queries/saved-searches";
import { savedSearchAlertsSchema, savedSearchIdSchema, saveSearchSchema } from "@/lib/validation/search";

// Saving an Explore view, turning its alerts on or off, deleting it. Any signed-in reader may; the
// owner is always the session's account, never a field of the form.

export const saveSearch = actionWithRole("reader", saveSearchSchema, async (input, user) => {
  const saved = await createSavedSearch({ userId: user.id, name: input.name, query: input.query, alerts: input.alerts });
  revalidatePath("/explore/saved");
  return input.alerts ? `Saved “${saved.name}”. You will get a daily e-mail when newly verified comparisons match it.` : `Saved “${saved.name}”.`;
});

export const removeSavedSearch = actionWithRole("reader", savedSearchIdSchema, async (input, user) => {
  await deleteSavedSearch({ userId: user.id, id: input.id });
  revalidatePath("/explore/saved");
  revalidatePath("/account");
  return "Deleted.";
});

export const changeSearchAlerts = actionWithRole("reader", savedSearchAlertsSchema, async (input, user) => {
  await setSavedSearchAlerts({ userId: user.id, id: input.id, alerts: input.alerts });
  revalidatePath("/explore/saved");
  revalidatePath("/account");
  return input.alerts ? "Alerts on." : "Alerts off.";
});
