import { route } from "@/lib/api/handler";

export const dynamic = "force-dynamic";

export const GET = route({}, async ({ user }) => ({
  id: user.id,
  email: user.email,
  name: user.name,
  role: user.role,
}));
