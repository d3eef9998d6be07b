"use client";

import { useState } from "react";
import { Button } from "@/components/ui/button";
import { apiFetch } from "@/components/ui/api-client";

export function SignOutButton() {
  const [busy, setBusy] = useState(false);
  const signOut = async () => {
    setBusy(true);
    try {
      await apiFetch("/api/auth/sign-out", { method: "POST" });
    } finally {
      // A full navigation drops every cached query of the signed-out user.
      window.location.assign("/sign-in");
    }
  };
  return (
    <Button variant="ghost" size="sm" busy={busy} busyLabel="Signing out…" onClick={() => void signOut()}>
      Sign out
    </Button>
  );
}
