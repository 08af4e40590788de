// GET /api/account – the caller's profile and unit preferences; PATCH – change them
import { withUser, readJson } from "@/lib/auth/with-studio";
import { getAccount, updateAccount } from "@/lib/account";
import { accountInput } from "@/lib/schemas/studio";

export const GET = withUser(async ({ em, user }) => Response.json(await getAccount(em, user.id)));

export const PATCH = withUser(async ({ req, em, user }) => {
  const input = accountInput.parse(await readJson(req));
  return Response.json(await updateAccount(em, user.id, input));
});
