import type { QueryInterface } from "sequelize";
import * as m1 from "./20261201000001-create-companies";
import * as m2 from "./20261201000002-create-users";
import * as m3 from "./20261201000003-create-sessions";
import * as m4 from "./20261201000004-create-audit-events";
import * as a1 from "./20261201100001-create-customers";
import * as a2 from "./20261201100002-create-jobs";
import * as a3 from "./20261201100003-create-job-crew";
import * as a4 from "./20261201100004-create-roofs";
import * as a5 from "./20261201100005-add-audit-events-job-id";
import * as b1 from "./20261201200001-create-catalog-items";
import * as b2 from "./20261201200002-create-catalog-item-prices";
import * as b3 from "./20261201200003-create-labor-rates";
import * as b4 from "./20261201200004-add-companies-profile";
import * as b5 from "./20261201200005-create-company-settings";
import * as m30001 from "./20261201300001-create-outbox-messages";
import * as m30002 from "./20261201300002-create-password-reset-tokens";
import * as q1 from "./20261201400001-create-quotes";
import * as q2 from "./20261201400002-create-quote-revisions";
import * as q3 from "./20261201400003-create-quote-options";
import * as q4 from "./20261201400004-create-quote-lines";
import * as q5 from "./20261201400005-create-approvals";
import * as u1 from "./20261201500001-create-attachments";
import * as ps1 from "./20261201600001-create-proposals";
import * as ps2 from "./20261201600002-create-payments";
import * as ps3 from "./20261201600003-create-payment-events";
import * as ps4 from "./20261201600004-create-revision-pdfs";
import * as g1 from "./20261201700001-create-rate-limit-hits";

interface Migration {
  name: string;
  up(qi: QueryInterface): Promise<void>;
  down(qi: QueryInterface): Promise<void>;
}

/** Every migration, in order. A new migration file is added here too (a test checks the folder). */
export const migrations: Migration[] = [
  { name: "20261201000001-create-companies", ...m1 },
  { name: "20261201000002-create-users", ...m2 },
  { name: "20261201000003-create-sessions", ...m3 },
  { name: "20261201000004-create-audit-events", ...m4 },
  { name: "20261201100001-create-customers", ...a1 },
  { name: "20261201100002-create-jobs", ...a2 },
  { name: "20261201100003-create-job-crew", ...a3 },
  { name: "20261201100004-create-roofs", ...a4 },
  { name: "20261201100005-add-audit-events-job-id", ...a5 },
  { name: "20261201200001-create-catalog-items", ...b1 },
  { name: "20261201200002-create-catalog-item-prices", ...b2 },
  { name: "20261201200003-create-labor-rates", ...b3 },
  { name: "20261201200004-add-companies-profile", ...b4 },
  { name: "20261201200005-create-company-settings", ...b5 },
  { name: "20261201300001-create-outbox-messages", ...m30001 },
  { name: "20261201300002-create-password-reset-tokens", ...m30002 },
  { name: "20261201400001-create-quotes", ...q1 },
  { name: "20261201400002-create-quote-revisions", ...q2 },
  { name: "20261201400003-create-quote-options", ...q3 },
  { name: "20261201400004-create-quote-lines", ...q4 },
  { name: "20261201400005-create-approvals", ...q5 },
  { name: "20261201500001-create-attachments", ...u1 },
  { name: "20261201600001-create-proposals", ...ps1 },
  { name: "20261201600002-create-payments", ...ps2 },
  { name: "20261201600003-create-payment-events", ...ps3 },
  { name: "20261201600004-create-revision-pdfs", ...ps4 },
  { name: "20261201700001-create-rate-limit-hits", ...g1 },
];
