import { beforeEach, describe, expect, it, vi } from "vitest";
import { act, render, screen, waitFor, within } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { QueryClient, QueryClientProvider } from "@tanstack/react-query";
import { MemoryRouter } from "react-router-dom";
import type { AttachmentDto } from "@shared/schemas/attachment";
import { resetCsrfToken } from "@/lib/api-client";
import { roofDraftStore } from "@/features/roof/api/roof-draft";
import { JobFilesSection } from "@/app/routes/jobs/job-files";
import { json, stubApi } from "./fetch-stub";

const JOB_ID = 7;
const owner = { id: 1, email: "owner@example.com", name: "Olive Owner", role: "owner", companyId: 1 };
const crewUser = { id: 3, email: "crew@example.com", name: "Casey Crew", role: "crew", companyId: 1 };

function attachment(over: Partial<AttachmentDto> = {}): AttachmentDto {
  const id = over.id ?? 11;
  return {
    id,
    jobId: JOB_ID,
    kind: "photo",
    originalName: "ridge.jpg",
    mime: "image/jpeg",
    size: 120_000,
    width: 1600,
    height: 1200,
    caption: "",
    showInProposal: false,
    forCrew: false,
    status: "ready",
    error: null,
    uploadedBy: { id: 1, name: "Olive Owner" },
    fileUrl: `/api/attachments/${id}/file?v=1`,
    thumbUrl: `/api/attachments/${id}/thumb?v=1`,
    createdAt: "2026-12-01T10:00:00.000Z",
    updatedAt: "2026-12-01T10:00:00.000Z",
    ...over,
  };
}

/** XMLHttpRequest stand-in: the test drives progress and the answer. */
class FakeXhr {
  static all: FakeXhr[] = [];
  method = "";
  url = "";
  headers: Record<string, string> = {};
  body: FormData | null = null;
  status = 0;
  responseText = "";
  withCredentials = false;
  upload: { onprogress: ((e: { lengthComputable: boolean; loaded: number; total: number }) => void) | null } = { onprogress: null };
  onload: (() => void) | null = null;
  onerror: (() => void) | null = null;
  onabort: (() => void) | null = null;
  constructor() {
    FakeXhr.all.push(this);
  }
  open(method: string, url: string) {
    this.method = method;
    this.url = url;
  }
  setRequestHeader(k: string, v: string) {
    this.headers[k] = v;
  }
  send(body: FormData) {
    this.body = body;
  }
  abort() {
    this.onabort?.();
  }
  progress(loaded: number, total: number) {
    this.upload.onprogress?.({ lengthComputable: true, loaded, total });
  }
  respond(status: number, body: unknown) {
    this.status = status;
    this.responseText = JSON.stringify(body);
    this.onload?.();
  }
}

function renderSection() {
  const qc = new QueryClient({ defaultOptions: { queries: { retry: false } } });
  render(
    <QueryClientProvider client={qc}>
      <MemoryRouter>
        <JobFilesSection jobId={JOB_ID} />
      </MemoryRouter>
    </QueryClientProvider>,
  );
}

const emptyRoof = { planes: [], stacks: [], defaultStackId: "", version: 0 };

beforeEach(() => {
  resetCsrfToken();
  roofDraftStore.clearAll();
  localStorage.clear();
  FakeXhr.all = [];
  vi.stubGlobal("XMLHttpRequest", FakeXhr);
});

const jpegFile = (name = "north-slope.jpg") => new File([new Uint8Array(2048)], name, { type: "image/jpeg" });

describe("Files section", { timeout: 20_000 }, () => {
  it("uploads several files at once, each with its own progress, with the CSRF token, then shows the photos", async () => {
    const uploaded = [attachment({ id: 21, originalName: "north-slope.jpg" }), attachment({ id: 22, originalName: "south-slope.jpg" })];
    const api = stubApi({
      "GET /api/auth/me": () => json(200, { user: owner }),
      "GET /api/auth/csrf": () => json(200, { token: "tok-1" }),
      "GET /api/jobs/7/attachments": [() => json(200, { data: [] }), () => json(200, { data: uploaded.slice(0, 1) }), () => json(200, { data: uploaded })],
      "GET /api/jobs/7/roof": () => json(200, { data: emptyRoof }),
    });
    renderSection();
    expect(await screen.findByText("No files yet")).toBeInTheDocument();

    const user = userEvent.setup();
    await user.upload(screen.getByLabelText("Choose files"), [jpegFile(), jpegFile("south-slope.jpg")]);
    await waitFor(() => expect(FakeXhr.all).toHaveLength(2));
    const [first, second] = FakeXhr.all as [FakeXhr, FakeXhr];
    expect(first.method).toBe("POST");
    expect(first.url).toBe("/api/jobs/7/attachments");
    expect(first.headers["X-CSRF-Token"]).toBe("tok-1");
    expect((first.body!.get("file") as File).name).toBe("north-slope.jpg");
    expect(api.callsTo("GET /api/auth/csrf")).toHaveLength(1);

    act(() => {
      first.progress(512, 2048);
      second.progress(1536, 2048);
    });
    const bar1 = screen.getByRole("progressbar", { name: "Uploading north-slope.jpg" });
    const bar2 = screen.getByRole("progressbar", { name: "Uploading south-slope.jpg" });
    expect(bar1).toHaveAttribute("aria-valuenow", "25");
    expect(bar2).toHaveAttribute("aria-valuenow", "75");
    const queue = screen.getByRole("region", { name: "Uploads" });
    expect(within(queue).getByText("25%")).toBeInTheDocument();
    expect(within(queue).getByText("75%")).toBeInTheDocument();

    act(() => first.respond(201, { data: [uploaded[0]] }));
    expect(await within(queue).findByText("Uploaded")).toBeInTheDocument();
    expect(screen.getByRole("progressbar", { name: "Uploading south-slope.jpg" })).toHaveAttribute("aria-valuenow", "75");
    act(() => second.respond(201, { data: [uploaded[1]] }));
    await waitFor(() => expect(within(queue).getAllByText("Uploaded")).toHaveLength(2));

    const photos = await screen.findByRole("region", { name: /Photos/ });
    await waitFor(() => expect(within(photos).getAllByRole("img")).toHaveLength(2));
    expect(within(photos).getByRole("img", { name: "south-slope.jpg" })).toHaveAttribute("src", "/api/attachments/22/thumb?v=1");
  });

  it("shows the server's 415 message for a refused file", async () => {
    stubApi({
      "GET /api/auth/me": () => json(200, { user: owner }),
      "GET /api/auth/csrf": () => json(200, { token: "tok-1" }),
      "GET /api/jobs/7/attachments": () => json(200, { data: [] }),
      "GET /api/jobs/7/roof": () => json(200, { data: emptyRoof }),
    });
    renderSection();
    await screen.findByText("No files yet");
    const user = userEvent.setup();
    await user.upload(screen.getByLabelText("Choose files"), new File(["<html></html>"], "roof.png", { type: "image/png" }));
    await waitFor(() => expect(FakeXhr.all).toHaveLength(1));
    const message = '"roof.png" contains HTML or other markup, which can\'t be attached. Upload JPEG, PNG, WebP or HEIC photos, PDF files, or CSV/plain-text files.';
    act(() => FakeXhr.all[0]!.respond(415, { error: { code: "unsupported_type", message } }));
    const alert = await screen.findByText(message);
    expect(alert).toHaveAttribute("role", "alert");
    expect(screen.getByText("Not uploaded")).toBeInTheDocument();
  });

  it("refuses a file over 25 MB before sending it", async () => {
    stubApi({
      "GET /api/auth/me": () => json(200, { user: owner }),
      "GET /api/jobs/7/attachments": () => json(200, { data: [] }),
      "GET /api/jobs/7/roof": () => json(200, { data: emptyRoof }),
    });
    renderSection();
    await screen.findByText("No files yet");
    const big = new File(["x"], "drone.jpg", { type: "image/jpeg" });
    Object.defineProperty(big, "size", { value: 30 * 1024 * 1024 });
    await userEvent.setup().upload(screen.getByLabelText("Choose files"), big);
    expect(await screen.findByText("Each file may be at most 25 MB; this one is 30 MB")).toBeInTheDocument();
    expect(FakeXhr.all).toHaveLength(0);
  });

  it("saves a caption and the two flags, and deletes after confirming", async () => {
    const photo = attachment();
    const api = stubApi({
      "GET /api/auth/me": () => json(200, { user: owner }),
      "GET /api/auth/csrf": () => json(200, { token: "tok-1" }),
      "GET /api/jobs/7/attachments": () => json(200, { data: [photo] }),
      "GET /api/jobs/7/roof": () => json(200, { data: emptyRoof }),
      "PATCH /api/attachments/11": (c) => json(200, { data: { ...photo, ...(c.body as object) } }),
      "DELETE /api/attachments/11": () => new Response(null, { status: 204 }),
    });
    renderSection();
    const user = userEvent.setup();
    const caption = await screen.findByLabelText("Caption for ridge.jpg");
    await user.type(caption, "Cracked boot at the vent{Enter}");
    await waitFor(() => expect(api.callsTo("PATCH /api/attachments/11")[0]?.body).toEqual({ caption: "Cracked boot at the vent" }));
    await user.click(screen.getByRole("checkbox", { name: "Show in proposal" }));
    await waitFor(() => expect(api.callsTo("PATCH /api/attachments/11")[1]?.body).toEqual({ showInProposal: true }));
    await user.click(screen.getByRole("checkbox", { name: "For the crew" }));
    await waitFor(() => expect(api.callsTo("PATCH /api/attachments/11")[2]?.body).toEqual({ forCrew: true }));

    await user.click(screen.getByRole("button", { name: "Delete ridge.jpg" }));
    const dialog = await screen.findByRole("dialog", { name: "Delete this file?" });
    await user.click(within(dialog).getByRole("button", { name: "Delete file" }));
    await waitFor(() => expect(api.callsTo("DELETE /api/attachments/11")).toHaveLength(1));
    await waitFor(() => expect(screen.queryByLabelText("Caption for ridge.jpg")).not.toBeInTheDocument());
  });

  it("gives crew a camera button and photos only, without the flags or the plane import", async () => {
    stubApi({
      "GET /api/auth/me": () => json(200, { user: crewUser }),
      "GET /api/jobs/7/attachments": () => json(200, { data: [attachment({ forCrew: true })] }),
    });
    renderSection();
    await screen.findByLabelText("Caption for ridge.jpg");
    const camera = screen.getByLabelText("Take a photo", { selector: "input" });
    expect(camera).toHaveAttribute("accept", "image/*");
    expect(camera).toHaveAttribute("capture", "environment");
    expect(screen.getByLabelText("Choose photos")).toHaveAttribute("accept", "image/*");
    expect(screen.getByLabelText("Caption for ridge.jpg")).toBeDisabled(); // the office's photo
    expect(screen.queryByRole("checkbox")).not.toBeInTheDocument();
    expect(screen.queryByRole("button", { name: /Delete/ })).not.toBeInTheDocument();
    expect(screen.queryByText("Roof planes from a spreadsheet")).not.toBeInTheDocument();
  });

  it("previews a plane CSV with its row errors, then adds the good file with the roof version", async () => {
    const savedRoof = { ...emptyRoof, version: 1, planes: [{ id: "csv-1", name: "Front", pitch: 6, outline: [[0, 0], [40, 0], [40, 15], [0, 15]], eaveEdge: 0 }], stacks: [{ id: "main" }], defaultStackId: "main" };
    stubApi({
      "GET /api/auth/me": () => json(200, { user: owner }),
      "GET /api/auth/csrf": () => json(200, { token: "tok-1" }),
      "GET /api/jobs/7/attachments": () => json(200, { data: [] }),
      "GET /api/jobs/7/roof": () => json(200, { data: emptyRoof }),
      "GET /api/jobs/7/takeoff": () => json(200, { data: null }),
    });
    renderSection();
    const user = userEvent.setup();
    const input = await screen.findByLabelText("Choose a CSV of roof planes");
    await waitFor(() => expect(screen.getByRole("button", { name: "Choose a CSV…" })).toBeEnabled());

    const bad = "name,pitch,shape,width,depth\nFront,6/12,rectangle,40,15\nBack,steep,rectangle,40,15\n";
    await user.upload(input, new File([bad], "planes.csv", { type: "text/csv" }));
    expect(await screen.findByText("Row 3, pitch: \"steep\" is not a pitch: write the rise per 12, such as 6 or 6/12")).toBeInTheDocument();
    expect(screen.getByRole("button", { name: "Add these planes" })).toBeDisabled();

    const good = "\uFEFFname,pitch,shape,width,depth\r\nFront,6/12,rectangle,40,15\r\n";
    await user.upload(input, new File([good], "planes.csv", { type: "text/csv" }));
    const table = await screen.findByRole("table", { name: "Planes in the file" });
    const row = within(table).getAllByRole("row")[1]!;
    // 40 × 15 = 600 ft² plan; × √(6² + 12²)/12 = 1.1180 (slope factor) → 670.8 ft²
    expect(within(row).getAllByRole("cell").map((c) => c.textContent)).toEqual(["2", "Front", "6/12", "4", "600", "670.8", "default"]);

    await user.click(screen.getByRole("button", { name: "Add these planes" }));
    await waitFor(() => expect(FakeXhr.all).toHaveLength(1));
    const xhr = FakeXhr.all[0]!;
    expect(xhr.url).toBe("/api/jobs/7/roof/import?commit=1");
    expect(xhr.body!.get("version")).toBe("0");
    act(() => xhr.respond(200, { data: { planes: savedRoof.planes, rows: [2], errors: [], committed: true, roof: savedRoof } }));
    await waitFor(() => expect(screen.queryByRole("table", { name: "Planes in the file" })).not.toBeInTheDocument());
  });
});
