import { assert, test } from "../harness";
import { AppShell } from "../pages/app-shell";
import { ProjectsPage } from "../pages/projects-page";
import { demoEmail, SignInPage, type DemoRole } from "../pages/sign-in-page";

const ROLE_LABELS: Record<DemoRole, string> = {
  admin: "Admin",
  engineer: "Engineer",
  clinician: "Clinician",
  viewer: "Viewer",
};

const signInAsEachRole = (Object.keys(ROLE_LABELS) as DemoRole[]).map((role) =>
  test(`signing in as the demo ${role} shows that role, the caution and the demo project`, async ({ page, baseUrl }) => {
    await new SignInPage(page, baseUrl).signInAs(role);
    const shell = new AppShell(page);
    assert.equal(await shell.role(), ROLE_LABELS[role]);
    assert.match((await shell.cautionText()) ?? "", /not a medical device/);
    const projects = new ProjectsPage(page, baseUrl);
    await projects.goto();
    assert.ok((await projects.projectNames()).includes("Lowtide bag-compressor build"));
  }),
);

export const tests = [
  ...signInAsEachRole,

  test("the sign-in page shows the caution", async ({ page, baseUrl }) => {
    const signIn = new SignInPage(page, baseUrl);
    await signIn.goto();
    assert.match((await signIn.cautionText()) ?? "", /engineering design and simulation aid/);
  }),

  test("a wrong password shows an error and no session", async ({ page, baseUrl, context }) => {
    const signIn = new SignInPage(page, baseUrl);
    await signIn.goto();
    const error = await signIn.signInExpectingError(demoEmail("engineer"), "not-the-password");
    assert.equal(error, "Email or password is incorrect.");
    assert.equal(new URL(page.url()).pathname, "/sign-in");
    const cookies = await context.cookies();
    assert.equal(cookies.filter((c) => c.name === "tidewright_session").length, 0);
  }),

  test("a clinician sees no new-project control and the API refuses it with 403", async ({ page, baseUrl }) => {
    await new SignInPage(page, baseUrl).signInAs("clinician");
    const projects = new ProjectsPage(page, baseUrl);
    await projects.goto();
    assert.equal(await projects.newProjectControl().count(), 0);
    const res = await projects.createViaApi("Clinician's attempt");
    assert.equal(res.status, 403);
    assert.deepEqual(res.body, { error: "Your role does not allow this." });
  }),

  test("an engineer creates a project through the form", async ({ page, baseUrl }) => {
    await new SignInPage(page, baseUrl).signInAs("engineer");
    const projects = new ProjectsPage(page, baseUrl);
    await projects.goto();
    const name = `E2E rig ${Date.now()}`;
    await projects.createProject(name, "Made by the browser suite");
    assert.equal((await page.getByTestId("project-name").textContent())?.trim(), name);
    await projects.goto();
    assert.ok((await projects.projectNames()).includes(name));
  }),

  test("sign-out ends the session", async ({ page, baseUrl }) => {
    await new SignInPage(page, baseUrl).signInAs("viewer");
    await new AppShell(page).signOut();
    await page.goto(`${baseUrl}/projects`);
    assert.equal(new URL(page.url()).pathname, "/sign-in");
    const me = await page.evaluate(async () => (await fetch("/api/me")).status);
    assert.equal(me, 401);
  }),
];
