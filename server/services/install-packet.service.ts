import type { Sequelize } from "sequelize";
import type { InstallPacketDocDto } from "../../shared/schemas/install-packet";
import type { RoofDocument } from "../../shared/schemas/roof";
import type { TakeoffResult } from "../../shared/engine/types";
import { Attachment, Company, Roof } from "../models/index";
import { conflict, notFound } from "../errors";
import type { Logger } from "../logger";
import { parseJsonColumn } from "../presenters/job.presenter";
import type { Storage } from "../storage/storage";
import { buildInstallPacketDoc } from "./install-packet-content";
import { JobsService } from "./jobs.service";
import { rulesForCompany } from "./price-book-rules";

type Actor = Express.User;

/** At most this many photos flagged for the crew go into the packet (their thumbnails into the PDF). */
export const PACKET_PHOTO_LIMIT = 8;

const NO_ROOF = "This job has no saved roof yet: the install packet is built from the saved roof and its takeoff. Draw and save the roof first.";

/**
 * The crew's install packet for a job: the job and its site, the stored roof document and takeoff, the
 * company's rules and the photos flagged for the crew. Who may read it is who may read the job (owner,
 * estimator, crew assigned to it); everyone else gets 404. No prices go in.
 */
export class InstallPacketService {
  private readonly jobs: JobsService;

  constructor(
    private readonly sequelize: Sequelize,
    private readonly storage: Storage,
    private readonly logger?: Logger,
  ) {
    this.jobs = new JobsService(sequelize);
  }

  /** The packet document, and the crew photos flagged for it (newest last), with their thumbnail keys. */
  async document(jobId: number, actor: Actor, now = new Date()): Promise<{ doc: InstallPacketDocDto; photos: Attachment[] }> {
    const job = await this.jobs.getDetail(jobId, actor);
    const roof = await Roof.findOne({ where: { jobId: job.id, companyId: actor.companyId } });
    const document = roof ? parseJsonColumn<RoofDocument>(roof.document) : null;
    const takeoff = roof?.takeoff ? parseJsonColumn<TakeoffResult>(roof.takeoff) : null;
    if (!document || !takeoff || document.planes.length === 0 || !Array.isArray(takeoff.planes)) {
      throw conflict("no_roof", NO_ROOF);
    }
    const [company, rules, photos] = await Promise.all([
      Company.findByPk(actor.companyId),
      rulesForCompany(actor.companyId),
      Attachment.findAll({
        where: { companyId: actor.companyId, jobId: job.id, kind: "photo", forCrew: true, status: "ready", archivedAt: null },
        order: [["createdAt", "ASC"], ["id", "ASC"]],
        limit: PACKET_PHOTO_LIMIT,
      }),
    ]);
    if (!company) throw notFound("Company");
    const doc = buildInstallPacketDoc({
      company: { name: company.name, phone: company.phone, licenceNumber: company.licenceNumber },
      job: {
        id: job.id,
        customerName: job.customer?.name ?? "",
        customerPhone: job.customer?.phone ?? null,
        siteAddressLine1: job.siteAddressLine1,
        siteAddressLine2: job.siteAddressLine2,
        siteCity: job.siteCity,
        siteRegion: job.siteRegion,
        sitePostalCode: job.sitePostalCode,
        site: parseJsonColumn(job.site),
        crew: (job.crew ?? []).map((u) => ({ name: u.name })),
      },
      roof: { planes: document.planes, stacks: document.stacks, defaultStackId: document.defaultStackId },
      takeoff,
      rules,
      reference: `Job ${job.id}`,
      date: now.toISOString(),
      photos: photos.map((p) => ({ caption: p.caption.trim() || p.originalName, attachmentId: p.id })),
    });
    return { doc, photos };
  }

  /** The thumbnails (JPEG) of the packet's photos by attachment id; a thumbnail that can't be read is left out. */
  async thumbnails(photos: Attachment[]): Promise<Record<number, Uint8Array>> {
    const out: Record<number, Uint8Array> = {};
    for (const p of photos) {
      if (!p.thumbKey) continue;
      try {
        out[p.id] = await this.readAll(p.thumbKey);
      } catch (err) {
        this.logger?.warn("packet photo thumbnail not read", { id: p.id, err: (err as Error)?.message });
      }
    }
    return out;
  }

  private async readAll(key: string): Promise<Buffer> {
    const got = await this.storage.get(key);
    if (Buffer.isBuffer(got)) return got;
    const chunks: Buffer[] = [];
    for await (const chunk of got as AsyncIterable<Buffer | string>) chunks.push(Buffer.isBuffer(chunk) ? chunk : Buffer.from(chunk));
    return Buffer.concat(chunks);
  }
}
