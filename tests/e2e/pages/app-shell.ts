import type { Page } from "playwright-core";

/** The header every signed-in page has. */
export class AppShell {
  constructor(private readonly page: Page) {}

  async role(): Promise<string> {
    const badge = this.page.getByTestId("user-role");
    await badge.waitFor();
    return (await badge.textContent())?.trim() ?? "";
  }

  async userName(): Promise<string> {
    return (await this.page.getByTestId("signed-in-user").textContent())?.trim() ?? "";
  }

  async signOut(): Promise<void> {
    await Promise.all([
      this.page.waitForURL((url) => url.pathname === "/sign-in"),
      this.page.getByRole("button", { name: "Sign out" }).click(),
    ]);
  }

  cautionText(): Promise<string | null> {
    return this.page.getByTestId("caution").textContent();
  }
}
