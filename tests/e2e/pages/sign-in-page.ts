import type { Page } from "playwright-core";

export const DEMO_PASSWORD = "tidewright-demo";
export type DemoRole = "admin" | "engineer" | "clinician" | "viewer";
export const demoEmail = (role: DemoRole) => `${role}@demo.test`;

export class SignInPage {
  constructor(
    private readonly page: Page,
    private readonly baseUrl: string,
  ) {}

  async goto(): Promise<void> {
    await this.page.goto(`${this.baseUrl}/sign-in`);
    await this.page.getByRole("heading", { name: "Sign in" }).waitFor();
  }

  async fill(email: string, password: string): Promise<void> {
    await this.page.getByLabel("Email").fill(email);
    await this.page.getByLabel("Password").fill(password);
  }

  /** Submit and wait for the app shell. */
  async signIn(email: string, password: string): Promise<void> {
    await this.fill(email, password);
    await Promise.all([
      this.page.waitForURL((url) => !url.pathname.startsWith("/sign-in")),
      this.page.getByRole("button", { name: "Sign in" }).click(),
    ]);
  }

  async signInAs(role: DemoRole): Promise<void> {
    await this.goto();
    await this.signIn(demoEmail(role), DEMO_PASSWORD);
  }

  /** Submit expecting to stay here; returns the error shown. */
  async signInExpectingError(email: string, password: string): Promise<string> {
    await this.fill(email, password);
    await this.page.getByRole("button", { name: "Sign in" }).click();
    // Scoped to the form: Next's route announcer is also role="alert" (and empty).
    const alert = this.page.getByRole("form", { name: "Sign in" }).getByRole("alert").filter({ hasText: /\S/ }).first();
    await alert.waitFor();
    return (await alert.textContent())?.trim() ?? "";
  }

  cautionText(): Promise<string | null> {
    return this.page.getByTestId("caution").textContent();
  }
}
