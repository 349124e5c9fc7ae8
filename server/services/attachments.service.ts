import sharp from "sharp";
import { Op, type Sequelize, type WhereOptions } from "sequelize";
import type { AttachmentKind, AttachmentUpdate } from "../../shared/schemas/attachment";
import { Attachment, User } from "../models/index";
import { HttpError, badRequest, conflict, forbidden, notFound } from "../errors";
import type { Logger } from "../logger";
import { newStorageKey, type Storage } from "../storage/storage";
import { recordAudit } from "./audit.service";
import { JobsService } from "./jobs.service";
import { sanitiseFileName, sniffUpload, unsupported, type Sniffed } from "./upload-sniff";

type Actor = Express.User;

/** An uploaded file as multer hands it over (memory storage). */
export interface IncomingFile {
  buffer: Buffer;
  originalname: string;
  size: number;
}

/** HEIC/HEIF → JPEG. */
export type HeicConverter = (heic: Buffer) => Promise<Buffer>;

export const THUMB_PX = 320;

const HEIC_FAILED =
  "This HEIC photo could not be converted. Set the camera to save JPEG (or share the photo as JPEG) and upload it again.";

/** heic-convert (pure JavaScript), loaded on first use. */
export const heicConvert: HeicConverter = async (heic) => {
  const { default: convert } = await import("heic-convert");
  const out = await convert({ buffer: heic, format: "JPEG", quality: 0.88 });
  return Buffer.from(out as ArrayBuffer);
};

interface ImageFacts {
  width: number;
  height: number;
  thumb: Buffer;
}

/** Width and height as displayed (EXIF orientation applied) and a JPEG thumbnail at most THUMB_PX on a side. */
async function imageFacts(buf: Buffer): Promise<ImageFacts> {
  const meta = await sharp(buf).metadata();
  const oriented = (meta as { autoOrient?: { width: number; height: number } }).autoOrient;
  const swap = (meta.orientation ?? 1) >= 5;
  const width = oriented?.width ?? (swap ? meta.height : meta.width) ?? 0;
  const height = oriented?.height ?? (swap ? meta.width : meta.height) ?? 0;
  const thumb = await sharp(buf)
    .rotate()
    .resize(THUMB_PX, THUMB_PX, { fit: "inside", withoutEnlargement: true })
    .flatten({ background: "#ffffff" })
    .jpeg({ quality: 78, mozjpeg: true })
    .toBuffer();
  return { width, height, thumb };
}

const withUploader = { model: User, as: "uploader", attributes: ["id", "name"] };

/**
 * Job attachments. Office roles see and manage every file of their company's jobs; crew work only on
 * jobs assigned to them, upload photos there, see the files flagged for the crew and their own photos,
 * and may caption or delete their own photos. Files are stored under generated keys.
 */
export class AttachmentsService {
  private readonly jobs: JobsService;
  private queue: Promise<void> = Promise.resolve();

  constructor(
    private readonly sequelize: Sequelize,
    private readonly storage: Storage,
    private readonly options: { convertHeic?: HeicConverter; logger?: Logger } = {},
  ) {
    this.jobs = new JobsService(sequelize);
  }

  async list(jobId: number, query: { kind?: AttachmentKind; forCrew?: boolean }, actor: Actor): Promise<Attachment[]> {
    await this.jobs.get(jobId, actor);
    const where: WhereOptions[] = [{ companyId: actor.companyId, jobId, archivedAt: null }];
    if (query.kind) where.push({ kind: query.kind });
    if (query.forCrew !== undefined) where.push({ forCrew: query.forCrew });
    if (actor.role === "crew") where.push({ [Op.or]: [{ forCrew: true }, { uploadedBy: actor.id }] });
    return Attachment.findAll({ where: { [Op.and]: where }, include: [withUploader], order: [["createdAt", "DESC"], ["id", "DESC"]] });
  }

  /** An attachment the actor may see, or 404 (another company's, or for crew a job not assigned or a file not shared with them). */
  async get(id: number, actor: Actor): Promise<Attachment> {
    const a = await Attachment.findOne({ where: { id, companyId: actor.companyId, archivedAt: null }, include: [withUploader] });
    if (!a) throw notFound("File");
    if (actor.role === "crew") {
      await this.jobs.get(a.jobId, actor).catch(() => {
        throw notFound("File");
      });
      if (!a.forCrew && a.uploadedBy !== actor.id) throw notFound("File");
    }
    return a;
  }

  /** Checks every file first (type by content, crew: photos only), then stores them all, then writes the rows. */
  async upload(
    jobId: number,
    files: IncomingFile[],
    fields: { caption?: string; kind?: "plan" },
    actor: Actor,
  ): Promise<Attachment[]> {
    const job = await this.jobs.get(jobId, actor);
    if (job.archivedAt) throw conflict("archived", "This job is archived; restore it to add files");
    if (files.length === 0) throw badRequest("Please check the highlighted fields", { file: "Choose at least one file" });
    if (actor.role === "crew" && fields.kind === "plan") throw forbidden("Crew can upload photos only");

    const checked: Array<{ file: IncomingFile; name: string; sniffed: Sniffed; facts: ImageFacts | null }> = [];
    for (const file of files) {
      const name = sanitiseFileName(file.originalname);
      const sniffed = await sniffUpload(file.buffer, name);
      if (actor.role === "crew" && sniffed.kind !== "photo") {
        throw forbidden(`Crew can upload photos only; "${name}" is not a photo`);
      }
      if (fields.kind === "plan" && sniffed.kind !== "photo" && sniffed.mime !== "application/pdf") {
        throw badRequest("Please check the highlighted fields", { kind: "A plan must be a PDF or an image" });
      }
      let facts: ImageFacts | null = null;
      if (sniffed.kind === "photo" && !sniffed.heic) {
        facts = await imageFacts(file.buffer).catch(() => {
          throw unsupported(`"${name}" looks like an image but could not be read; it may be damaged`);
        });
      }
      checked.push({ file, name, sniffed, facts });
    }

    const written: string[] = [];
    const prepared: Array<{ c: (typeof checked)[number]; storageKey: string; thumbKey: string | null }> = [];
    try {
      for (const c of checked) {
        const storageKey = newStorageKey(actor.companyId);
        await this.storage.put(storageKey, c.file.buffer, c.sniffed.mime);
        written.push(storageKey);
        let thumbKey: string | null = null;
        if (c.facts) {
          thumbKey = `${storageKey}-thumb`;
          await this.storage.put(thumbKey, c.facts.thumb, "image/jpeg");
          written.push(thumbKey);
        }
        prepared.push({ c, storageKey, thumbKey });
      }
      const rows = await this.sequelize.transaction(async (transaction) => {
        const out: Attachment[] = [];
        for (const { c, storageKey, thumbKey } of prepared) {
          const kind: AttachmentKind = fields.kind === "plan" ? "plan" : c.sniffed.kind;
          const a = await Attachment.create(
            {
              companyId: actor.companyId,
              jobId,
              kind,
              storageKey,
              thumbKey,
              originalName: c.name,
              mime: c.sniffed.mime,
              size: c.file.size,
              width: c.facts?.width ?? null,
              height: c.facts?.height ?? null,
              caption: fields.caption ?? "",
              // crew photos are the crew's working pictures: shared with the crew from the start
              forCrew: actor.role === "crew",
              status: c.sniffed.heic ? "processing" : "ready",
              errorMessage: null,
              uploadedBy: actor.id,
              archivedAt: null,
            },
            { transaction },
          );
          await recordAudit(
            {
              companyId: actor.companyId,
              actorId: actor.id,
              entityType: "attachment",
              entityId: a.id,
              jobId,
              action: "uploaded",
              changes: { name: c.name, kind, mime: c.sniffed.mime, size: c.file.size },
            },
            transaction,
          );
          out.push(a);
        }
        return out;
      });
      for (const a of rows) if (a.status === "processing") this.convertLater(a.id);
      return Attachment.findAll({ where: { id: rows.map((r) => r.id) }, include: [withUploader], order: [["id", "ASC"]] });
    } catch (err) {
      await Promise.all(written.map((k) => this.storage.delete(k).catch(() => undefined)));
      throw err;
    }
  }

  /** Converts HEIC photos one at a time after the response (status processing → ready, or failed with a message). */
  private convertLater(id: number): void {
    this.queue = this.queue.then(() => this.convert(id)).catch((err) => this.options.logger?.error("HEIC conversion crashed", { id, err }));
  }

  /** Resolves when every queued conversion has finished (tests, shutdown). */
  whenIdle(): Promise<void> {
    return this.queue;
  }

  private async convert(id: number): Promise<void> {
    const a = await Attachment.findByPk(id);
    if (!a || a.status !== "processing") return;
    try {
      const heic = await this.readAll(a.storageKey);
      const jpeg = await (this.options.convertHeic ?? heicConvert)(heic);
      const facts = await imageFacts(jpeg);
      const thumbKey = `${a.storageKey}-thumb`;
      await this.storage.put(a.storageKey, jpeg, "image/jpeg");
      await this.storage.put(thumbKey, facts.thumb, "image/jpeg");
      const name = a.originalName.replace(/\.(heic|heif)$/i, "") + ".jpg";
      const [updated] = await Attachment.update(
        { status: "ready", mime: "image/jpeg", size: jpeg.length, width: facts.width, height: facts.height, thumbKey, originalName: name, errorMessage: null },
        { where: { id, status: "processing" } },
      );
      if (updated === 0 && !(await Attachment.count({ where: { id } }))) {
        // deleted while converting: don't leave the converted files behind
        await Promise.all([this.storage.delete(a.storageKey), this.storage.delete(thumbKey)]);
      }
    } catch (err) {
      this.options.logger?.warn("HEIC conversion failed", { id, err: (err as Error)?.message });
      await Attachment.update({ status: "failed", errorMessage: HEIC_FAILED }, { where: { id, status: "processing" } });
    }
  }

  private async readAll(key: string): Promise<Buffer> {
    const got = await this.storage.get(key);
    if (Buffer.isBuffer(got)) return got;
    const chunks: Buffer[] = [];
    for await (const chunk of got as AsyncIterable<Buffer | string>) chunks.push(Buffer.isBuffer(chunk) ? chunk : Buffer.from(chunk));
    return Buffer.concat(chunks);
  }

  async update(id: number, input: AttachmentUpdate, actor: Actor): Promise<Attachment> {
    const a = await this.get(id, actor);
    if (actor.role === "crew") {
      const own = a.uploadedBy === actor.id && a.kind === "photo";
      const onlyCaption = Object.keys(input).every((k) => k === "caption");
      if (!own || !onlyCaption) throw forbidden("Crew can change the caption of their own photos only");
    }
    const kind = input.kind ?? a.kind;
    if (input.kind && input.kind !== a.kind) {
      const image = a.mime.startsWith("image/");
      const ok = image ? kind === "photo" || kind === "plan" : a.mime === "application/pdf" ? kind === "document" || kind === "plan" : false;
      if (!ok) throw badRequest("Please check the highlighted fields", { kind: image ? "An image is a photo or a plan" : "This file's kind can't change" });
    }
    if (input.showInProposal && !(kind === "photo" || kind === "plan") ) {
      throw badRequest("Please check the highlighted fields", { showInProposal: "Only photos and plans can be shown in a proposal" });
    }
    const changes: Record<string, { from: unknown; to: unknown }> = {};
    const next = {
      caption: input.caption ?? a.caption,
      showInProposal: input.showInProposal ?? a.showInProposal,
      forCrew: input.forCrew ?? a.forCrew,
      kind,
    };
    for (const key of ["caption", "showInProposal", "forCrew", "kind"] as const) {
      if (next[key] !== a[key]) changes[key] = { from: a[key], to: next[key] };
    }
    if (Object.keys(changes).length === 0) return a;
    await this.sequelize.transaction(async (transaction) => {
      await a.update(next, { transaction });
      await recordAudit(
        { companyId: actor.companyId, actorId: actor.id, entityType: "attachment", entityId: a.id, jobId: a.jobId, action: "updated", changes },
        transaction,
      );
    });
    return this.get(id, actor);
  }

  /** Deletes the row (with an audit row naming the file), then the stored file and thumbnail. */
  async remove(id: number, actor: Actor): Promise<void> {
    const a = await this.get(id, actor);
    if (actor.role === "crew" && !(a.uploadedBy === actor.id && a.kind === "photo")) {
      throw forbidden("Crew can delete their own photos only");
    }
    await this.sequelize.transaction(async (transaction) => {
      await a.destroy({ transaction });
      await recordAudit(
        {
          companyId: actor.companyId,
          actorId: actor.id,
          entityType: "attachment",
          entityId: a.id,
          jobId: a.jobId,
          action: "deleted",
          changes: { name: a.originalName, kind: a.kind, mime: a.mime, size: a.size },
        },
        transaction,
      );
    });
    for (const key of [a.storageKey, a.thumbKey]) {
      if (!key) continue;
      await this.storage.delete(key).catch((err) => this.options.logger?.warn("stored file not deleted", { key, err: (err as Error)?.message }));
    }
  }

  /** The stored bytes of the file or its thumbnail, with what the response needs. */
  async open(id: number, variant: "file" | "thumb", actor: Actor) {
    const a = await this.get(id, actor);
    const key = variant === "thumb" ? a.thumbKey : a.storageKey;
    if (!key) throw notFound("Thumbnail");
    if (variant === "file" && a.status === "processing") throw new HttpError(409, "processing", "This photo is still being converted; try again in a moment");
    const body = await this.storage.get(key).catch(() => {
      throw notFound("File");
    });
    return { attachment: a, body, mime: variant === "thumb" ? "image/jpeg" : a.mime };
  }
}
