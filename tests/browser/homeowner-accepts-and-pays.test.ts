/**
 * The homeowner journey against the real built client and server, the local mail catcher and the local
 * payment fake: the estimator sends an approved demo quote to the homeowner (with a copy to themselves),
 * reads the proposal e-mail in the test inbox and takes the private link from it; the homeowner, in a
 * browser without any session, opens the link, chooses an option, signs with their typed name and consent,
 * pays the deposit on the payment service's test page with the succeeding test card and comes back to
 * their page, which shows the deposit received once the signed webhook has marked it paid. The estimator
 * then sees the proposal accepted and the deposit paid on the job, and the signed copy in the inbox.
 * Every step leaves a screenshot under test-results/screenshots/homeowner-accepts-and-pays/.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser, Locator, Page } from "playwright-core";
import { baseUrl, launchBrowser, newPage, shot, signIn } from "./browser";

const JOURNEY = "homeowner-accepts-and-pays";
// A demo customer whose first estimating job carries an approved quote with three spacer options.
const CUSTOMER = "Nadia Pellworth";
const CUSTOMER_EMAIL = "nadia.pellworth@example.com";
const ESTIMATOR_EMAIL = "estimator@example.com";
const SIGNER = "Nadia Pellworth";
const CHOSEN = "Mesh + foil";
const SUCCEEDING_CARD = "4242 4242 4242 4242"; // the payment service's published test card that succeeds

let browser: Browser;
beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
});

const escapeRe = (s: string) => s.replace(/[.*+?^${}()|[\]\\]/g, "\\$&");

/** The dollar amounts in a piece of text, in order ("$1,234.56" → "$1,234.56"). */
const dollars = (text: string) => text.match(/\$\d{1,3}(,\d{3})*(\.\d{2})?/g) ?? [];

/** Opens the test inbox from the app's top bar and waits (the page refreshes every 5 s) for a message. */
async function openMail(page: Page, subject: string, timeout = 30_000): Promise<Locator> {
  const inboxLink = page.getByRole("link", { name: "Test inbox" });
  if (!/\/dev\/mail/.test(page.url())) {
    await inboxLink.click();
    await page.waitForURL(/\/dev\/mail/);
  }
  await page.getByRole("heading", { level: 1, name: "Test inbox" }).waitFor();
  const list = page.getByRole("navigation", { name: "Caught e-mails" });
  const item = list.getByRole("button").filter({ hasText: subject });
  await item.first().waitFor({ timeout });
  await expect.poll(() => item.count()).toBe(1); // delivered once, not twice
  await item.click();
  const message = page.getByRole("article", { name: `E-mail: ${subject}` });
  await message.waitFor();
  return message;
}

/** The value (dd) beside a label (dt) in the e-mail's header. */
const headerValue = (message: Locator, label: string) =>
  message.locator("dt", { hasText: new RegExp(`^${label}$`) }).locator("xpath=following-sibling::dd[1]");

describe("the homeowner accepts the proposal from the e-mail and pays the deposit", () => {
  it("goes from an approved quote to a signed proposal with the deposit paid", async () => {
    // ---- 1. the estimator finds a demo job with an approved quote --------------------------------------
    const office = await newPage(browser);
    await signIn(office, ESTIMATOR_EMAIL);
    const search = office.getByRole("searchbox", { name: "Search jobs" });
    await search.fill(CUSTOMER);
    await search.press("Enter");
    const board = office.getByRole("table", { name: "Jobs" });
    const customerLinks = board.getByRole("link", { name: CUSTOMER, exact: true });
    await customerLinks.first().waitFor();
    // the board narrows to this customer's jobs (every row below the header is theirs)
    await expect.poll(async () => (await board.getByRole("row").count()) - 1 - (await customerLinks.count())).toBe(0);
    expect(await customerLinks.count()).toBeGreaterThanOrEqual(1);
    const rows = board.getByRole("row").filter({ has: office.getByRole("link", { name: CUSTOMER, exact: true }) });
    // nothing has gone to this homeowner yet: no proposal progress on the board
    for (const row of await rows.all()) expect(await row.innerText()).not.toMatch(/Sent|Viewed|Accepted|Deposit paid/);
    await shot(office, JOURNEY, "01-board");
    const hrefs = await customerLinks.evaluateAll((links) => links.map((a) => a.getAttribute("href") ?? ""));

    // The customer has more than one job: the one whose Pricing section shows an approved quote.
    let jobId = 0;
    let quoteNumber = "";
    for (const href of hrefs) {
      const id = Number(/\/jobs\/(\d+)\//.exec(href)?.[1]);
      expect(id).toBeGreaterThan(0);
      await office.goto(`/jobs/${id}/pricing`);
      const quoteTabs = office.getByRole("navigation", { name: "Quotes of this job" });
      await quoteTabs.or(office.getByText("No quote yet")).first().waitFor();
      const approvedTab = quoteTabs.getByRole("button").filter({ has: office.getByText("Approved", { exact: true }) });
      if ((await approvedTab.count()) === 0) continue;
      await approvedTab.first().click();
      await office.getByText(/^Approved by .+ on /).waitFor();
      jobId = id;
      quoteNumber = (await approvedTab.first().innerText()).trim().split(/\s/)[0]!;
      break;
    }
    expect(jobId).toBeGreaterThan(0);
    expect(quoteNumber).toMatch(/\w+\d/);
    await office.getByRole("heading", { level: 1, name: new RegExp(`^${escapeRe(CUSTOMER)}`) }).waitFor();
    await shot(office, JOURNEY, "02-pricing-approved-quote");

    // ---- 2. the Proposal section: send it to the homeowner, with a copy to me -------------------------
    const sections = office.getByRole("navigation", { name: "Job sections" });
    await sections.getByRole("link", { name: "Proposal" }).click();
    await office.waitForURL(new RegExp(`/jobs/${jobId}/proposal`));
    const quoteRow = office
      .getByRole("region", { name: "Quote to send" })
      .getByRole("listitem")
      .filter({ hasText: quoteNumber })
      .filter({ has: office.getByText("Approved", { exact: true }) });
    await quoteRow.waitFor();
    // the approved quote's three options are listed with their totals
    const rowText = await quoteRow.innerText();
    expect(rowText).toMatch(/3 options/);
    for (const label of ["Battens + foil", "Mesh + foil", "No spacer"]) expect(rowText).toContain(label);
    const history = office.getByRole("region", { name: "Sent proposals" });
    await history.getByText("Nothing sent yet.", { exact: false }).waitFor();
    await shot(office, JOURNEY, "03-proposal-section");

    await quoteRow.getByRole("button", { name: "Send to homeowner…" }).click();
    const dialog = office.getByRole("dialog", { name: `Send ${quoteNumber} to the homeowner` });
    await dialog.waitFor();
    await expect.poll(() => dialog.getByLabel("To", { exact: true }).inputValue()).toBe(CUSTOMER_EMAIL);
    const copyToMe = dialog.getByRole("checkbox", { name: "Send a copy to me" });
    expect(await copyToMe.isChecked()).toBe(false);
    await copyToMe.check();
    await dialog.getByLabel("Message (optional)").fill("Here is the proposal we walked through on site. Any questions, just call.");
    await shot(office, JOURNEY, "04-send-dialog");
    await dialog.getByRole("button", { name: "Send proposal" }).click();
    await dialog.waitFor({ state: "detached" });
    await office.getByText(`Proposal ${quoteNumber} sent to ${CUSTOMER_EMAIL}.`).waitFor();

    const card = history.getByRole("listitem", { name: new RegExp(`^Proposal, revision \\d+, sent to ${escapeRe(CUSTOMER_EMAIL)}$`) });
    await card.waitFor();
    await card.getByText("Link active").waitFor();
    await card.getByRole("list", { name: "Progress" }).getByText("Not viewed yet").waitFor();
    // the quote is now "Sent" and the job "Proposed", with the progress in the header
    await office.getByRole("region", { name: "Quote to send" }).getByRole("listitem").filter({ hasText: quoteNumber }).getByText("Sent", { exact: true }).waitFor();
    const header = office.getByRole("group", { name: "Proposal progress" });
    await header.getByText(/^Sent /).waitFor();
    await header.getByText("Not viewed").waitFor();
    await shot(office, JOURNEY, "05-sent");

    // ---- 3. the e-mail in the test inbox: the link -------------------------------------------------------
    const proposalSubject = `Your metal roof proposal ${quoteNumber}`;
    const proposalMail = await openMail(office, proposalSubject);
    expect(await headerValue(proposalMail, "To").innerText()).toContain(CUSTOMER_EMAIL);
    expect(await headerValue(proposalMail, "Cc").innerText()).toContain(ESTIMATOR_EMAIL); // "send a copy to me"
    const attachments = proposalMail.getByRole("list", { name: "Attachments" });
    await attachments.getByRole("link", { name: /\.pdf\b/i }).waitFor();
    // the HTML view: the button to the proposal
    const htmlView = proposalMail.frameLocator('iframe[title="HTML view of the e-mail"]');
    const button = htmlView.getByRole("link", { name: "Open your proposal" });
    await button.waitFor();
    const htmlLink = await button.getAttribute("href");
    await shot(office, JOURNEY, "06-proposal-email-html");
    // the text view: the same link on its own line
    await proposalMail.getByRole("tab", { name: "Text" }).click();
    const text = await proposalMail.locator("pre").innerText();
    expect(text).toContain(`Hello ${CUSTOMER},`);
    expect(text).toContain("Here is the proposal we walked through on site.");
    const links = text.match(/https?:\/\/\S+\/p\/[A-Za-z0-9_-]+/g) ?? [];
    expect(links).toHaveLength(1);
    const link = links[0]!;
    expect(htmlLink).toBe(link);
    expect(link.startsWith(`${baseUrl()}/p/`)).toBe(true);
    const token = link.slice(link.lastIndexOf("/") + 1);
    expect(token.length).toBeGreaterThanOrEqual(22); // ≥ 128 bits in base64url
    const totals = text.split("\n").filter((l) => /^(Battens \+ foil|Mesh \+ foil|No spacer): \$/.test(l));
    expect(totals).toHaveLength(3);
    const chosenTotalInMail = dollars(totals.find((l) => l.startsWith(`${CHOSEN}:`))!)[0];
    expect(chosenTotalInMail).toBeDefined();
    await shot(office, JOURNEY, "07-proposal-email-text");

    // ---- 4. the homeowner opens the link: no account, no session ---------------------------------------
    const home = await newPage(browser, { width: 414, height: 860 }); // a new browser context, on a phone
    expect(await home.context().cookies()).toHaveLength(0);
    await home.goto(link);
    await home.getByRole("heading", { level: 1, name: "Metal roof proposal" }).waitFor();
    expect(await home.title()).toMatch(new RegExp(`^Proposal ${escapeRe(quoteNumber)} · `));
    await home.getByText(CUSTOMER, { exact: false }).first().waitFor();
    const respond = home.getByRole("region", { name: "Accept this proposal" });
    await respond.waitFor();
    await shot(home, JOURNEY, "08-homeowner-page");

    // ---- 5. choose an option, type the full name, agree, accept ----------------------------------------
    const options = respond.getByRole("radiogroup", { name: "Options" });
    const radios = options.getByRole("radio");
    await expect.poll(() => radios.count()).toBe(3);
    for (const r of await radios.all()) expect(await r.isChecked()).toBe(false); // nothing chosen for them
    const choice = options.getByRole("radio", { name: new RegExp(escapeRe(CHOSEN)) });
    const choiceText = await choice.locator("xpath=ancestor::label[1]").innerText();
    const [chosenTotal, chosenDeposit] = dollars(choiceText);
    expect(chosenTotal).toBe(chosenTotalInMail);
    expect(chosenDeposit).toBeDefined();
    await choice.check();
    expect(await choice.isChecked()).toBe(true);
    await respond.getByLabel("2. Type your full name").fill(SIGNER);
    const consent = respond.getByRole("checkbox", { name: /^I agree to this proposal from / });
    expect(await consent.getAttribute("aria-invalid")).toBeNull();
    // the consent names the option and its price the homeowner is agreeing to
    expect(await consent.locator("xpath=ancestor::label[1]").innerText()).toContain(`option “${CHOSEN}” at ${chosenTotal}`);
    await consent.check();
    await respond.scrollIntoViewIfNeeded();
    await shot(home, JOURNEY, "09-homeowner-signs");
    await respond.getByRole("button", { name: "Accept proposal" }).click();

    // ---- 6. the accepted state ---------------------------------------------------------------------------
    const accepted = home.getByRole("region", { name: "Accepted" });
    await accepted.getByText("Proposal accepted — thank you").waitFor();
    await expect.poll(() => accepted.locator("dt", { hasText: "Signed by" }).locator("xpath=following-sibling::dd[1]").innerText()).toBe(SIGNER);
    expect(await accepted.locator("dt", { hasText: "Option chosen" }).locator("xpath=following-sibling::dd[1]").innerText()).toBe(CHOSEN);
    await accepted.locator("dt", { hasText: /^Accepted$/ }).waitFor();
    // the form is gone: an accepted proposal cannot be answered again
    expect(await home.getByRole("button", { name: "Accept proposal" }).count()).toBe(0);
    expect(await home.getByRole("link", { name: "Review and accept" }).count()).toBe(0);
    await accepted.getByText("Next step: the deposit").waitFor();
    expect(await accepted.getByText(`${chosenDeposit}, paid securely by card`).count()).toBe(1);
    await shot(home, JOURNEY, "10-accepted");

    // ---- 7. pay the deposit on the payment service's test page ------------------------------------------
    await accepted.getByRole("button", { name: "Pay the deposit" }).click();
    await home.waitForURL(/\/pay\/[^/?#]+$/);
    expect(new URL(home.url()).origin).not.toBe(baseUrl()); // the payment service's own page, not the app
    await home.getByRole("heading", { level: 1, name: "Pay a deposit (test)" }).waitFor();
    expect((await home.getByTestId("amount").innerText()).trim()).toBe(chosenDeposit);
    await home.getByLabel("Card number (test card)").fill(SUCCEEDING_CARD);
    await shot(home, JOURNEY, "11-payment-page");
    await home.getByRole("button", { name: `Pay ${chosenDeposit}`, exact: true }).click();

    // ---- 8. back on the proposal page: processing, then received (marked paid only by the webhook) ----
    await home.waitForURL((url) => url.pathname === `/p/${token}` && url.searchParams.get("deposit") === "processing");
    const depositStatus = home.getByRole("status").filter({ hasText: /Processing your payment…|Deposit received — thank you/ });
    await depositStatus.first().waitFor();
    await shot(home, JOURNEY, "12-back-processing");
    await home.getByText("Deposit received — thank you").waitFor({ timeout: 30_000 });
    await expect.poll(() => home.getByRole("status").filter({ hasText: "Deposit received" }).innerText()).toMatch(new RegExp(`\\n${escapeRe(chosenDeposit!)} paid[. ]`));
    expect(await home.getByText("Processing your payment…").count()).toBe(0);
    expect(await home.getByRole("button", { name: "Pay the deposit" }).count()).toBe(0);
    await shot(home, JOURNEY, "13-deposit-received");
    // a fresh load of the plain link shows the same: the state is the server's, not the return URL's
    await home.goto(link);
    await home.getByText("Deposit received — thank you").waitFor();
    await home.getByRole("region", { name: "Accepted" }).getByText("Proposal accepted — thank you").waitFor();
    await home.context().close();

    // ---- 9. the estimator's view of the job: accepted, deposit paid, won -------------------------------
    await office.goto(`/jobs/${jobId}/proposal`);
    const done = office
      .getByRole("region", { name: "Sent proposals" })
      .getByRole("listitem", { name: new RegExp(`^Proposal, revision \\d+, sent to ${escapeRe(CUSTOMER_EMAIL)}$`) });
    await done.getByText("Accepted", { exact: true }).first().waitFor();
    const steps = done.getByRole("list", { name: "Progress" });
    await steps.getByText("Viewed", { exact: true }).waitFor();
    await steps.getByText("Accepted", { exact: true }).waitFor();
    await steps.getByText("Deposit: Paid", { exact: true }).waitFor();
    expect(await steps.innerText()).toContain(chosenDeposit!);
    expect((await done.getByText(/^Signed by /).innerText()).replace(/\s+/g, " ")).toBe(`Signed by ${SIGNER} for ${CHOSEN}.`);
    const progress = office.getByRole("group", { name: "Proposal progress" });
    await progress.getByText(/^Accepted /).waitFor();
    await progress.getByText("Deposit paid", { exact: true }).waitFor();
    await progress.getByText(/^Viewed /).waitFor();
    await office.getByRole("heading", { level: 1, name: new RegExp(`^${escapeRe(CUSTOMER)}`) }).locator("xpath=..").getByText("Won", { exact: true }).waitFor();
    // the quote is accepted: nothing more to send
    const quoteAfter = office.getByRole("region", { name: "Quote to send" }).getByRole("listitem").filter({ hasText: quoteNumber });
    await quoteAfter.getByText("Accepted", { exact: true }).waitFor();
    expect(await quoteAfter.getByRole("button", { name: /Send/ }).isDisabled()).toBe(true);
    await shot(office, JOURNEY, "14-job-accepted-and-paid");

    // the board shows it too
    await office.getByRole("navigation", { name: /main/i }).getByRole("link", { name: "Jobs" }).click();
    await office.getByRole("searchbox", { name: "Search jobs" }).fill(CUSTOMER);
    await office.getByRole("searchbox", { name: "Search jobs" }).press("Enter");
    const jobsTable = office.getByRole("table", { name: "Jobs" });
    await expect
      .poll(async () => (await jobsTable.getByRole("row").count()) - 1 - (await jobsTable.getByRole("link", { name: CUSTOMER, exact: true }).count()))
      .toBe(0);
    const jobRow = office
      .getByRole("table", { name: "Jobs" })
      .getByRole("row")
      .filter({ has: office.getByText(`#${jobId}`, { exact: true }) });
    await jobRow.getByText("Deposit paid").waitFor();
    await jobRow.getByText("Won", { exact: true }).waitFor();
    await shot(office, JOURNEY, "15-board");

    // ---- 10. the signed copy and the office notices in the test inbox ------------------------------------
    const signed = await openMail(office, `Your signed proposal ${quoteNumber}`);
    expect(await headerValue(signed, "To").innerText()).toContain(CUSTOMER_EMAIL);
    await signed.getByRole("list", { name: "Attachments" }).getByRole("link", { name: /\.pdf\b/i }).waitFor();
    await signed.getByRole("tab", { name: "Text" }).click();
    const signedText = await signed.locator("pre").innerText();
    expect(signedText).toContain(`${SIGNER} accepted proposal ${quoteNumber} (${CHOSEN}, ${chosenTotal})`);
    await shot(office, JOURNEY, "16-signed-copy-email");
    const notice = await openMail(office, `Accepted: ${quoteNumber} by ${CUSTOMER}`);
    expect(await headerValue(notice, "To").innerText()).toContain(ESTIMATOR_EMAIL);
    await notice.getByRole("list", { name: "Attachments" }).getByRole("link", { name: /signed\.pdf\b/i }).waitFor();
    const paidNotice = await openMail(office, `Deposit paid: ${quoteNumber} by ${CUSTOMER}`);
    expect(await headerValue(paidNotice, "To").innerText()).toContain(ESTIMATOR_EMAIL);
    await shot(office, JOURNEY, "17-deposit-paid-email");
    await office.context().close();
  });
});
