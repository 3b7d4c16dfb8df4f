// Loads the review page of `stereoline diff --format html` in headless
// Chromium (Debian's package chromium, /usr/bin/chromium) driven by
// playwright-core, as a reviewer would open it: counts the records and
// drawings it renders against the JSON Lines form of the same change,
// checks the class filters, the search field and the pages, that the
// page asks for nothing beyond itself, and takes a screenshot.
//
// Run: STEREOLINE_BIN=/path/to/stereoline node --test page.test.mjs
// SCREENSHOT_DIR=DIR keeps the screenshots there (default: a temporary
// folder, printed). The change is made in a temporary git repository; the
// chemistry of the edits is textbook (common practice): inverting one
// of two centres gives an epimer, inverting every centre the mirror
// image, swapping the marks of a double bond its E/Z isomer.
import { execFileSync, spawnSync } from "node:child_process";
import { mkdtempSync, mkdirSync, writeFileSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { pathToFileURL } from "node:url";
import { test, after } from "node:test";
import assert from "node:assert/strict";
import { chromium } from "playwright-core";

const bin = process.env.STEREOLINE_BIN;
if (!bin) throw new Error("STEREOLINE_BIN is not set");
const chromiumPath = process.env.CHROMIUM || "/usr/bin/chromium";
const work = mkdtempSync(join(tmpdir(), "stereoline-page-"));
const shots = process.env.SCREENSHOT_DIR || join(work, "shots");
mkdirSync(shots, { recursive: true });
after(() => {
  if (!process.env.SCREENSHOT_DIR) console.log(`screenshots in ${shots} (removed with the work folder)`);
  if (!process.env.KEEP_WORK) rmSync(work, { recursive: true, force: true });
});

// The change: 400 records of an invented building-block list
// (LRK-BB-...), of which most are edited.
function makeChange() {
  const repo = join(work, "repo");
  mkdirSync(repo);
  const git = (...args) =>
    execFileSync("git", ["-c", "user.name=Fenwick Row", "-c", "user.email=pool@example.invalid", ...args], { cwd: repo, stdio: "pipe" });
  const shapes = [
    (c, a, b) => `C[C${a}H](O)[C${b}H](Cl)${c}`, // two centres
    (c, a, b) => `N[C${b}H](${c})C(=O)O`, // one centre
    (c, a, b, bond) => `C/C=C${bond}${c}O`, // a double bond
  ];
  const oldLines = [];
  const newLines = [];
  for (let i = 0; i < 400; i++) {
    const chain = "C".repeat(1 + (i % 6));
    const shape = shapes[i % 3];
    const title = `LRK-BB-${String(i).padStart(3, "0")}`;
    oldLines.push(`${shape(chain, "@", "@@", "/")} ${title}`);
    let now = shape(chain, "@", "@@", "/");
    switch (i % 10) {
      case 0: now = shape(chain, "@", "@", "/"); break; // one centre inverted / a mark flipped
      case 1: now = shape(chain, "@@", "@", "\\"); break; // mirror / E-Z
      case 2: now = shape(chain, "@@", "@@", "\\"); break;
      case 3: now = now.replace("C(=O)O", "C(O)=O").replace("(O)", "(-O)"); break; // a re-writing
      case 4: now = now.replace("Cl", "Br"); break; // another compound (or the same)
      case 5: now = now.replace("[C@@H]", "C"); break; // a mark removed
      case 6: continue; // removed
      default: break; // unchanged
    }
    newLines.push(`${now} ${title}`);
  }
  newLines.push("C[C@H](O)CC LRK-BB-NEW1", "c1ccccc1 LRK-BB-NEW2");
  writeFileSync(join(repo, "blocks.smi"), oldLines.join("\n") + "\n");
  git("init", "-q");
  git("add", ".");
  git("commit", "-q", "-m", "blocks");
  writeFileSync(join(repo, "blocks.smi"), newLines.join("\n") + "\n");
  return repo;
}

function diff(repo, format) {
  const r = spawnSync(bin, ["diff", "--format", format, repo], { encoding: "utf8", maxBuffer: 1 << 28 });
  assert.equal(r.status, 0, r.stderr);
  return r.stdout;
}

const repo = makeChange();
const records = diff(repo, "json").trim().split("\n").map((l) => JSON.parse(l));
const byClass = {};
for (const r of records) byClass[r.class] = (byClass[r.class] || 0) + 1;
const pagePath = join(work, "review.html");
writeFileSync(pagePath, diff(repo, "html"));

const browser = await chromium.launch({
  executablePath: chromiumPath,
  args: ["--headless", "--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run",
    "--disable-background-networking", "--disable-component-update", "--disable-sync"],
});
after(() => browser.close());

async function open() {
  const page = await browser.newPage({ viewport: { width: 1280, height: 1000 } });
  const requests = [];
  page.on("request", (r) => requests.push(r.url()));
  await page.goto(pathToFileURL(pagePath).href, { waitUntil: "load" });
  const load = await page.evaluate(() => performance.getEntriesByType("navigation")[0].loadEventEnd);
  console.log(`page of ${records.length} records loaded in ${Math.round(load)} ms (a measurement, not a check)`);
  return { page, requests };
}

const visible = (page) => page.$$eval("details.rv-rec:not([hidden])", (els) => els.map((e) => ({
  cls: e.dataset.class, svgs: e.querySelectorAll("svg").length, text: e.querySelector("summary").textContent,
})));

test("the page holds every record and asks for nothing", async () => {
  const { page, requests } = await open();
  const title = await page.title();
  assert.match(title, new RegExp(`: ${records.length} records$`));
  const total = await page.$$eval("details.rv-rec, script.rv-lazy", (els) => els.length);
  assert.equal(total, records.length);
  assert.deepEqual(requests, [pathToFileURL(pagePath).href], "the page loaded something besides itself");
  // the summary table counts what the JSON Lines list
  const counts = await page.$$eval("table.rv-summary tbody tr", (rows) =>
    Object.fromEntries(rows.map((r) => [r.querySelector("input").value, Number(r.querySelector(".rv-num").textContent)])));
  for (const [cls, n] of Object.entries(counts)) assert.equal(n, byClass[cls] || 0, `count of ${cls}`);
  const caution = await page.textContent(".rv-caution");
  assert.match(caution, /analytical confirmation and qualified review/);
  await page.close();
});

test("the first page shows 100 records with their drawings", async () => {
  const { page } = await open();
  const shown = await visible(page);
  assert.equal(shown.length, 100);
  for (const r of shown) {
    const want = r.cls === "added" || r.cls === "removed" ? 1 : 2;
    assert.equal(r.svgs, want, `${r.text}: ${r.svgs} drawings`);
  }
  // an open record's drawings are laid out, with the changed atoms marked
  const box = await page.$eval("details.rv-rec[open] figure.rv-new svg", (s) => s.getBoundingClientRect().width);
  assert.ok(box > 100, `drawing width ${box}`);
  const marked = await page.$$eval("details.rv-rec[open] svg .cf", (els) => els.length);
  assert.ok(marked > 0, "no changed unit highlighted in the open drawings");
  await page.screenshot({ path: join(shots, "review-top.png") });
  await page.screenshot({ path: join(shots, "review-full.png"), fullPage: true });
  await page.close();
});

test("the class filters and the search field choose records", async () => {
  const { page } = await open();
  for (const box of await page.$$("input.rv-filter")) {
    if ((await box.getAttribute("value")) !== "epimer" && (await box.isEnabled())) await box.uncheck();
  }
  let shown = await visible(page);
  assert.equal(shown.length, Math.min(100, byClass.epimer));
  assert.ok(shown.every((r) => r.cls === "epimer"));
  assert.match(await page.textContent("#rv-shown"), new RegExp(`^${byClass.epimer} of ${records.length} `));
  await page.screenshot({ path: join(shots, "review-epimers.png") });
  for (const box of await page.$$("input.rv-filter")) if (await box.isEnabled()) await box.check();
  const one = records.find((r) => r.class === "enantiomer" && r.new && r.new.title);
  await page.fill("#rv-find", one.new.title.toLowerCase());
  shown = await visible(page);
  assert.equal(shown.length, 1);
  assert.equal(shown[0].cls, "enantiomer");
  await page.close();
});

test("the pages turn the records written as text into markup", async () => {
  const { page } = await open();
  const lazy = await page.$$eval("script.rv-lazy", (els) => els.length);
  assert.equal(lazy, records.length - 100);
  await page.click("#rv-next");
  const shown = await visible(page);
  assert.equal(shown.length, Math.min(100, records.length - 100));
  assert.match(await page.textContent("#rv-page"), /^page 2 of /);
  assert.equal(await page.$$eval("script.rv-lazy", (els) => els.length), lazy - shown.length);
  const first = await page.$("details.rv-rec:not([hidden])");
  await first.evaluate((d) => { d.open = true; });
  assert.equal(await first.$$eval("svg", (s) => s.length), shown[0].svgs);
  await page.click("#rv-prev");
  assert.equal((await visible(page)).length, 100);
  await page.close();
});
