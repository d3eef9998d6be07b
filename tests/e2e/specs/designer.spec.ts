/**
 * Browser specs of the sequence designer (issue 4 §12): build on a template, save a revision, see it in
 * the history and the diff; a clinician's read-only view; the live preview lighting up steps.
 */
import { assert, eventually, test } from "../harness";
import { DesignerPage } from "../pages/designer-page";
import { SignInPage } from "../pages/sign-in-page";
import { ComparePage, DEMO_PROJECT, HistoryPage, NewSequencePage, projectIdByName } from "../pages/sequence-pages";

export const tests = [
  test("an engineer adds a hold step to assist-volume, saves revision 2, sees it in history and the diff; a clinician reads it", async ({ page, baseUrl, newContext }) => {
    await new SignInPage(page, baseUrl).signInAs("engineer");
    const projectId = await projectIdByName(page, DEMO_PROJECT);
    const sequenceId = await new NewSequencePage(page, baseUrl).create(projectId, `E2E hold ${Date.now()}`, "assist-volume");

    const designer = new DesignerPage(page, baseUrl);
    await designer.waitReady();
    assert.equal(await designer.baseRevision(), 1);
    assert.equal(await designer.isReadOnly(), false);
    assert.deepEqual((await designer.stepNames()).sort(), ["expire", "highPressure", "hold", "inhale", "standby"]);

    // A second pause step between inhale and expiration.
    const hold = await designer.addStep("hold");
    assert.equal(hold, "hold2");
    await designer.autoLayout();
    await designer.connect(hold, "expire");
    // The new transition is selected: make it a 0.3 s timer.
    await designer.setTimer("0.3");
    await eventually(async () => assert.match((await designer.edgeLabel(hold, "expire").textContent()) ?? "", /after 0\.3 s/));
    // Route inhale's "no pause" exit through the new step.
    await designer.selectTransition("inhale", "expire");
    await designer.setTarget(hold);
    await designer.edgeLabel("inhale", hold).waitFor();

    const saved = await designer.save("Second pause before expiration");
    assert.equal(saved, 2);
    assert.equal(await designer.baseRevision(), 2);

    const history = new HistoryPage(page, baseUrl);
    await history.goto(projectId, sequenceId);
    const revisions = await history.revisions();
    assert.deepEqual(revisions.map((r) => r.number), [2, 1]);
    assert.equal(revisions[0].message, "Second pause before expiration");

    await history.compareTicked();
    const compare = new ComparePage(page);
    const diffs = await compare.differences();
    assert.ok(diffs.some((d) => d.kind === "added" && d.text.includes(hold)), `no added ${hold} in ${JSON.stringify(diffs)}`);
    assert.ok(diffs.some((d) => d.kind === "added" && d.text.includes(`${hold} → expire (timer 0.3)`)));
    assert.ok(diffs.some((d) => d.text.includes(`inhale → ${hold}`)));
    assert.deepEqual(await compare.markedSteps("b"), { [hold]: "added" });

    // A clinician opens the same sequence: everything visible, nothing editable, the preview still runs.
    const clinicianContext = await newContext();
    const clinicianPage = await clinicianContext.newPage();
    await new SignInPage(clinicianPage, baseUrl).signInAs("clinician");
    const reader = new DesignerPage(clinicianPage, baseUrl);
    await reader.goto(projectId, sequenceId);
    assert.equal(await reader.isReadOnly(), true);
    assert.equal(await reader.baseRevision(), 2);
    assert.ok((await reader.stepNames()).includes(hold));
    assert.equal(await clinicianPage.getByTestId("read-only-badge").count(), 1);
    assert.equal(await reader.palette("hold").count(), 0);
    assert.equal(await clinicianPage.getByTestId("save-revision").count(), 0);
    await reader.selectStep(hold);
    assert.equal(await clinicianPage.getByTestId("step-name").isDisabled(), true);
    await reader.play(5);
    await eventually(async () => assert.notEqual(await reader.activeStep(), null), 10_000);
  }),

  test("the live preview lights up the steps as the sequence moves through them", async ({ page, baseUrl }) => {
    await new SignInPage(page, baseUrl).signInAs("engineer");
    const projectId = await projectIdByName(page, DEMO_PROJECT);
    const sequenceId = await new NewSequencePage(page, baseUrl).create(projectId, `E2E preview ${Date.now()}`, "assist-volume");
    const designer = new DesignerPage(page, baseUrl);
    await designer.goto(projectId, sequenceId);
    assert.equal(await designer.activeStep(), "inhale", "the entry step is lit before playing");

    await designer.recordLitSteps();
    await designer.play(2);
    // Two breaths: 2 × 60/RR = 8 s of sequence at 2× real time.
    const seen = await eventually(
      async () => {
        const lit = await designer.litSteps();
        assert.ok(lit.length >= 6, `lit so far: ${lit.join(" → ")}`);
        return lit;
      },
      20_000,
    );
    // The cycle as assist-volume defines it (no patient effort: mandatory breaths), in order.
    assert.equal(seen.slice(0, 6).join(" → "), "hold → expire → inhale → hold → expire → inhale");

    const stats = await eventually(async () => {
      const s = await designer.previewStats();
      assert.ok(s && s.fps > 0);
      return s;
    });
    // 2× real time on a 10 ms scan is 200 scans/s; allow for a slow CI machine.
    assert.ok(stats.scans > 100, `only ${stats.scans} scans/s`);
    console.log(`      preview: ${stats.fps} fps, ${stats.scans} scans/s, engine ${stats.engineMs} ms/frame`);

    await designer.pause();
    const pausedAt = await page.getByTestId("preview-time").textContent();
    await page.getByTestId("preview-step").click();
    const stepped = await page.getByTestId("preview-time").textContent();
    assert.ok(Math.abs(Number(stepped) - Number(pausedAt) - 0.01) < 0.0051, `${pausedAt} → ${stepped}`);
  }),

  test("a stale save explains itself and loses nothing; blocking problems come back from the server; drafts survive a reload", async ({ page, baseUrl, newContext }) => {
    await new SignInPage(page, baseUrl).signInAs("engineer");
    const projectId = await projectIdByName(page, DEMO_PROJECT);
    const sequenceId = await new NewSequencePage(page, baseUrl).create(projectId, `E2E conflict ${Date.now()}`, "assist-volume");
    const first = new DesignerPage(page, baseUrl);
    await first.waitReady();

    const otherContext = await newContext();
    const otherPage = await otherContext.newPage();
    await new SignInPage(otherPage, baseUrl).signInAs("engineer");
    const second = new DesignerPage(otherPage, baseUrl);
    await second.goto(projectId, sequenceId);

    // The second adds a step with no way out: the server refuses with 422 and lists why (checked only on a current base).
    const stuck = await second.addStep("hold");
    assert.equal(await second.saveExpectingRefusal("with a dead end"), "invalid");
    const serverProblems = otherPage.getByTestId("server-problems");
    await serverProblems.waitFor();
    assert.match((await serverProblems.textContent()) ?? "", new RegExp(stuck));
    await second.selectStep(stuck);
    await second.shortcut("Delete");
    assert.ok(!(await second.stepNames()).includes(stuck));

    // The first engineer saves revision 2 (PEEP typed with a unit: 0.1 psi = 7.03 cmH2O).
    await first.openSettings();
    await first.setSetting("PEEP", "0.1 psi");
    assert.equal(await first.settingValue("PEEP"), "7.0307");
    assert.equal(await first.save("PEEP 7"), 2);

    // Then a valid edit on the stale base: 409, explained, edits kept.
    await second.openSettings();
    await second.setSetting("Vt", "450");
    assert.equal(await second.saveExpectingRefusal("Vt 450"), "stale");
    assert.equal(await second.settingValue("Vt"), "450");
    await otherPage.getByTestId("load-latest").click();
    await eventually(async () => assert.equal(await second.baseRevision(), 2));
    assert.equal(await second.settingValue("Vt"), "400");
    assert.equal(await second.settingValue("PEEP"), "7.0307");
    // One undo brings the second engineer's own version back; saved on top of revision 2.
    await second.shortcut("Control+z");
    assert.equal(await second.settingValue("Vt"), "450");
    assert.equal(await second.save("Vt 450 on top of r2"), 3);

    // Unsaved edits survive a reload, offered back from the browser's storage.
    await second.setSetting("RR", "18");
    await otherPage.waitForTimeout(1200);
    // Leaving with unsaved edits asks first (beforeunload): say yes.
    otherPage.once("dialog", (d) => void d.accept());
    await second.goto(projectId, sequenceId);
    await otherPage.getByTestId("draft-offer").waitFor();
    await otherPage.getByTestId("restore-draft").click();
    await second.openSettings();
    assert.equal(await second.settingValue("RR"), "18");
  }),

  test("canvas keys: multi-select, copy/paste, delete, undo/redo, fit and layout; JSON export and import; old revisions read-only", async ({ page, baseUrl }) => {
    await new SignInPage(page, baseUrl).signInAs("engineer");
    const projectId = await projectIdByName(page, DEMO_PROJECT);
    const sequenceId = await new NewSequencePage(page, baseUrl).create(projectId, `E2E keys ${Date.now()}`, "assist-volume");
    const designer = new DesignerPage(page, baseUrl);
    await designer.waitReady();
    const original = (await designer.stepNames()).sort();

    await designer.selectSteps(["inhale", "hold"]);
    assert.deepEqual((await designer.selectedSteps()).sort(), ["hold", "inhale"]);
    await designer.shortcut("Control+c");
    await designer.shortcut("Control+v");
    await eventually(async () => assert.deepEqual((await designer.stepNames()).sort(), [...original, "hold2", "inhale2"].sort()));
    // The copies keep the transition between them.
    await designer.edgeLabel("inhale2", "hold2").first().waitFor();
    assert.deepEqual((await designer.selectedSteps()).sort(), ["hold2", "inhale2"]);

    await designer.shortcut("Delete");
    await eventually(async () => assert.deepEqual((await designer.stepNames()).sort(), original));
    await designer.shortcut("Control+z");
    await eventually(async () => assert.ok((await designer.stepNames()).includes("inhale2")));
    await designer.shortcut("Control+Shift+z");
    await eventually(async () => assert.deepEqual((await designer.stepNames()).sort(), original));

    await designer.shortcut("l");
    await designer.settle();
    await designer.shortcut("f");
    await designer.settle();
    const box = await page.getByTestId("sequence-canvas").boundingBox();
    for (const step of original) {
      const b = await designer.node(step).boundingBox();
      assert.ok(box && b && b.x >= box.x && b.x + b.width <= box.x + box.width + 1, `${step} is outside the canvas after fit`);
    }

    // Export, then a broken import changes nothing, then a good one (renamed step) loads and can be undone.
    const exported = await designer.exportFile();
    assert.match(exported.name, /\.tidewright\.json$/);
    const def = JSON.parse(exported.text) as { format: string; machine: { states: Record<string, unknown> } };
    assert.equal(def.format, "tidewright.sequence/1");
    assert.equal(await designer.importFile("broken.json", "{ not json"), "import-failed");
    assert.match((await page.getByTestId("import-errors").textContent()) ?? "", /not JSON/);
    const wrongKind = exported.text.replace('"kind": "hold"', '"kind": "pause"');
    assert.equal(await designer.importFile("wrong.json", wrongKind), "import-failed");
    assert.match((await page.getByTestId("import-errors").textContent()) ?? "", /meta\.kind/);
    assert.deepEqual((await designer.stepNames()).sort(), original);
    const renamed = exported.text.replaceAll('"standby"', '"parked"');
    assert.equal(await designer.importFile("renamed.json", renamed), "imported");
    await eventually(async () => assert.ok((await designer.stepNames()).includes("parked")));
    await designer.shortcut("Control+z");
    await eventually(async () => assert.ok((await designer.stepNames()).includes("standby")));

    // Revision 1 opened from the history link is read-only once revision 2 exists.
    await designer.selectStep("hold");
    await page.getByTestId("step-kind").selectOption("custom");
    assert.equal(await designer.save("hold becomes custom"), 2);
    await designer.goto(projectId, sequenceId, 1);
    assert.equal(await designer.isReadOnly(), true);
    assert.equal(await designer.baseRevision(), 1);
  }),
];
