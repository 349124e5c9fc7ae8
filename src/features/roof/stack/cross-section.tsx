/**
 * The live cross-section of a layer stack: a 6 ft piece of the roof cut along the slope (eave on the
 * left, ridge to the right), layers from the deck up. Lengths are to scale; heights of the deck and the
 * air gap are to scale too but exaggerated by HEIGHT_FACTOR (stated on the drawing, with the real gap
 * labelled); the underlayment, foil and panel are drawn at a legible thickness, not to scale.
 * The channel and foil facts come from the engine (aboveDeckChannel, foilFacesGap), so the drawing and
 * the takeoff agree.
 */
import { useId } from "react";
import { LUMBER } from "@shared/engine/lumber";
import { aboveDeckChannel, MIN_CHANNEL_HEIGHT_IN, type ChannelResult } from "@shared/engine/ventilation/channel";
import { foilFacesGap } from "@shared/engine/thermal/index";
import { inchText, type Stack } from "./model";

export const HEIGHT_FACTOR = 8;
const SECTION_IN = 72;
const W = 720;
const X0 = 56;
const X1 = 500;
const LABEL_X = 532;
const PX_PER_IN = (X1 - X0) / SECTION_IN;
const VS = PX_PER_IN * HEIGHT_FACTOR;
const UNDERLAY_PX = 4;
const FOIL_PX = 2.5;
const PANEL_PX = 5;
const TOP = 40;
const BOTTOM = 22;

export interface CrossSectionFacts {
  channel: ChannelResult;
  foil: null | { facesGap: boolean; position: "on-deck" | "under-panels"; face: "up" | "down"; why: string | null };
  airflow: "open" | "blocked" | "closed" | "none";
}

export function crossSectionFacts(stack: Stack): CrossSectionFacts {
  const sp = stack.spacer;
  const channel = aboveDeckChannel(
    { kind: sp.kind, thicknessIn: sp.thicknessIn, openFraction: sp.openFraction, battens: sp.battens },
    { eaveOpen: stack.ventilation.eaveOpen, topOpen: stack.ventilation.topOpen },
  );
  const rb = stack.radiantBarrier;
  let foil: CrossSectionFacts["foil"] = null;
  if (rb.kind === "foil") {
    const facesGap = foilFacesGap(rb.position, rb.reflectiveFace, channel.gapIn);
    let why: string | null = null;
    if (!facesGap) {
      if (!(channel.gapIn > 0)) why = "There is no air gap: the foil faces nothing and gives no radiant benefit.";
      else if (rb.position === "on-deck") why = "The reflective face points down at the deck: it faces nothing and gives no radiant benefit.";
      else why = "The reflective face points up at the panels: it faces nothing and gives no radiant benefit.";
    }
    foil = { facesGap, position: rb.position, face: rb.reflectiveFace, why };
  }
  const airflow: CrossSectionFacts["airflow"] =
    sp.kind === "none"
      ? "none"
      : channel.blockedByBattens
        ? "blocked"
        : channel.continuous && stack.ventilation.eaveOpen && stack.ventilation.topOpen
          ? "open"
          : "closed";
  return { channel, foil, airflow };
}

interface Label {
  y: number;
  text: string;
  sub?: string;
  tone?: "warn" | "ok";
}

/** Spread label positions so none are closer than `gap` px, keeping their order. */
function spread(labels: Label[], gap: number, min: number): number[] {
  const ys = labels.map((l) => l.y);
  for (let i = 1; i < ys.length; i++) if (ys[i]! < ys[i - 1]! + gap) ys[i] = ys[i - 1]! + gap;
  if (ys.length && ys[0]! < min) {
    const d = min - ys[0]!;
    for (let i = 0; i < ys.length; i++) ys[i] = ys[i]! + d;
  }
  return ys;
}

function Arrow({ x1, x2, y, dim }: { x1: number; x2: number; y: number; dim?: boolean }) {
  return (
    <g className={dim ? "text-accent-400" : "text-accent-600"}>
      <line x1={x1} x2={x2 - 5} y1={y} y2={y} stroke="currentColor" strokeWidth={1.6} strokeDasharray={dim ? "3 3" : undefined} />
      <path d={`M${x2} ${y} l-7 -3.5 v7 z`} fill="currentColor" />
    </g>
  );
}

export function CrossSection({ stack, title }: { stack: Stack; title: string }) {
  const uid = useId().replace(/:/g, "");
  const facts = crossSectionFacts(stack);
  const { channel, foil, airflow } = facts;
  const sp = stack.spacer;
  const gapIn = channel.gapIn;
  const gapPx = gapIn * VS;
  const deckPx = Math.max(stack.deck.thicknessIn * VS, 8);
  const foilOnDeck = foil?.position === "on-deck";
  const foilUnderPanels = foil?.position === "under-panels";

  // y runs down: panel at the top.
  const panelTop = TOP;
  const panelBot = panelTop + PANEL_PX;
  const foilPanelBot = foilUnderPanels ? panelBot + FOIL_PX : panelBot;
  const gapTop = foilPanelBot;
  const gapBot = gapTop + gapPx;
  const foilDeckBot = foilOnDeck ? gapBot + FOIL_PX : gapBot;
  const underTop = foilDeckBot;
  const underBot = underTop + UNDERLAY_PX;
  const deckTop = underBot;
  const deckBot = deckTop + deckPx;
  
  const battens = sp.kind === "battens" ? sp.battens : null;
  const batten = battens ? LUMBER[battens.nominal] : null;
  const cb = battens?.counterBattens ? LUMBER[battens.counterBattenNominal ?? battens.nominal] : null;
  const cbPx = cb ? cb.thicknessIn * VS : 0;
  const battenTop = gapTop;
  const battenBot = cb ? gapBot - cbPx : gapBot;
  const battenXs: number[] = [];
  if (battens && batten) {
    const s = Math.max(battens.spacingIn, batten.widthIn + 1);
    for (let x = 8; x + batten.widthIn <= SECTION_IN; x += s) battenXs.push(x);
  }
  const X = (inch: number) => X0 + inch * PX_PER_IN;

  const channelTop = cb ? gapBot - cbPx : gapTop;
  const channelMid = (channelTop + gapBot) / 2;
  const thin = channel.channelHeightIn < MIN_CHANNEL_HEIGHT_IN - 1e-9;

  const spacerName =
    sp.kind === "none"
      ? null
      : sp.kind === "mesh"
        ? "3D mesh mat"
        : sp.kind === "dimpled"
          ? "Dimpled sheet"
          : cb
            ? `${battens!.nominal} battens on ${battens!.counterBattenNominal ?? battens!.nominal} counter-battens`
            : `${battens!.nominal} battens, ${inchText(battens!.spacingIn)} o.c.`;

  const labels: Label[] = [];
  labels.push({
    y: (panelTop + panelBot) / 2,
    text: stack.panel.system === "standing-seam" ? "Standing-seam panel" : "Exposed-fastener panel",
    sub: `${stack.panel.gauge} ga, ${inchText(stack.panel.coverageWidthIn)} coverage`,
  });
  if (foilUnderPanels) labels.push({ y: panelBot + FOIL_PX / 2, text: "Foil under the panels", sub: faceText(foil!), tone: foil!.facesGap ? "ok" : "warn" });
  if (spacerName) labels.push({ y: gapPx > 0 ? (gapTop + gapBot) / 2 : gapTop, text: spacerName, sub: `gap ${inchText(gapIn)}` });
  if (foilOnDeck) labels.push({ y: gapBot + FOIL_PX / 2, text: "Foil on the deck", sub: faceText(foil!), tone: foil!.facesGap ? "ok" : "warn" });
  labels.push({
    y: (underTop + underBot) / 2,
    text: underlaymentText(stack),
    sub: stack.underlayment.kind !== "felt" && stack.underlayment.highTemp ? "high-temperature" : undefined,
  });
  labels.push({
    y: (deckTop + deckBot) / 2,
    text: `${stack.deck.material === "osb" ? "OSB" : "Plywood"} deck, ${inchText(stack.deck.thicknessIn)}`,
    sub: stack.deck.action === "keep" ? "kept" : stack.deck.action === "replace" ? "replaced" : `repair ${stack.deck.repairSharePct} %`,
  });
  const labelYs = spread(labels, 30, 30);
  const H = Math.max(deckBot + BOTTOM, (labelYs[labelYs.length - 1] ?? 0) + 22);

  const summary = [
    `Cross-section of ${title}, from the deck up.`,
    spacerName ? `${spacerName}, gap ${inchText(gapIn)}.` : "No spacer: the panels lie on the underlayment.",
    airflow === "open" ? "Air flows from the eave to the ridge." : airflow === "blocked" ? "Horizontal battens close the air path." : "",
    foil ? (foil.facesGap ? "The foil's reflective face faces the air gap." : `Warning: ${foil.why}`) : "",
  ]
    .filter(Boolean)
    .join(" ");

  const matPath = () => {
    if (sp.kind === "dimpled" && gapPx > 0) {
      const step = 14;
      let d = `M${X0} ${gapBot}`;
      for (let x = X0; x < X1; x += step) d += ` q${step / 2} ${-gapPx * 1.9} ${step} 0`;
      return <path d={d} fill="none" stroke="currentColor" strokeWidth={1.2} className="text-steel-500" />;
    }
    return null;
  };

  return (
    <figure className="m-0">
      <svg
        viewBox={`0 0 ${W} ${H}`}
        className="h-auto w-full max-w-[760px] select-none"
        role="img"
        aria-label={summary}
        data-testid="cross-section"
        data-gap-in={gapIn}
        data-airflow={airflow}
      >
        <defs>
          <pattern id={`mesh-${uid}`} width="8" height="8" patternUnits="userSpaceOnUse" patternTransform="rotate(45)">
            <rect width="8" height="8" className="fill-steel-100" />
            <path d="M0 0H8M0 0V8" stroke="currentColor" strokeWidth="1.2" className="text-steel-400" />
          </pattern>
          <pattern id={`wood-${uid}`} width="24" height="6" patternUnits="userSpaceOnUse">
            <rect width="24" height="6" className="fill-accent-50" />
            <path d="M0 3 Q6 1.5 12 3 T24 3" fill="none" stroke="currentColor" strokeWidth="0.6" className="text-accent-200" />
          </pattern>
          <pattern id={`deck-${uid}`} width="10" height="10" patternUnits="userSpaceOnUse" patternTransform="rotate(-30)">
            <rect width="10" height="10" className="fill-steel-100" />
            <path d="M0 5H10" stroke="currentColor" strokeWidth="0.8" className="text-steel-300" />
          </pattern>
        </defs>

        {/* eave / ridge orientation */}
        <text x={X0} y={18} className="fill-steel-600 text-[11px] font-medium">
          Eave
        </text>
        <text x={X1} y={18} textAnchor="end" className="fill-steel-600 text-[11px] font-medium">
          toward the ridge →
        </text>
        <text x={(X0 + X1) / 2} y={18} textAnchor="middle" className="fill-steel-400 text-[10px]">
          section along the slope, {SECTION_IN / 12} ft shown
        </text>

        {/* deck */}
        <rect x={X0} y={deckTop} width={X1 - X0} height={deckBot - deckTop} fill={`url(#deck-${uid})`} stroke="currentColor" className="text-steel-500" strokeWidth={1} />
        {/* underlayment */}
        <rect x={X0} y={underTop} width={X1 - X0} height={UNDERLAY_PX} className="fill-steel-800" />
        {/* foil on deck */}
        {foilOnDeck && <rect x={X0} y={gapBot} width={X1 - X0} height={FOIL_PX} className={foil!.facesGap ? "fill-steel-300" : "fill-danger-600"} />}

        {/* spacer */}
        {sp.kind === "mesh" && gapPx > 0 && <rect x={X0} y={gapTop} width={X1 - X0} height={gapPx} fill={`url(#mesh-${uid})`} />}
        {matPath()}
        {cb && (
          <g>
            <rect x={X0} y={gapBot - cbPx} width={X1 - X0} height={cbPx} className="fill-accent-50/60" />
            <rect x={X0} y={gapBot - cbPx} width={X1 - X0} height={cbPx} fill="none" stroke="currentColor" strokeDasharray="5 3" className="text-accent-400" />
          </g>
        )}
        {battenXs.map((bx) => (
          <rect
            key={bx}
            data-testid="batten"
            x={X(bx)}
            y={battenTop}
            width={batten!.widthIn * PX_PER_IN}
            height={battenBot - battenTop}
            fill={`url(#wood-${uid})`}
            stroke="currentColor"
            className="text-accent-600"
            strokeWidth={1}
          />
        ))}

        {/* foil under panels */}
        {foilUnderPanels && <rect x={X0} y={panelBot} width={X1 - X0} height={FOIL_PX} className={foil!.facesGap ? "fill-steel-300" : "fill-danger-600"} />}
        {/* panel */}
        <rect x={X0} y={panelTop} width={X1 - X0} height={PANEL_PX} className="fill-steel-500" />
        <line x1={X0} x2={X1} y1={panelTop} y2={panelTop} stroke="currentColor" className="text-steel-800" strokeWidth={1} />

        {/* foil face arrows */}
        {foil && (
          <g data-testid="foil-face" className={foil.facesGap ? "text-steel-700" : "text-danger-600"}>
            {[0.2, 0.5, 0.8].map((f) => {
              const x = X0 + (X1 - X0) * f;
              const y = foil.position === "on-deck" ? gapBot + FOIL_PX / 2 : panelBot + FOIL_PX / 2;
              const dir = foil.face === "up" ? -1 : 1;
              return <path key={f} d={`M${x - 4} ${y + dir * 2} L${x} ${y + dir * 8} L${x + 4} ${y + dir * 2} Z`} fill="currentColor" />;
            })}
          </g>
        )}

        {/* airflow */}
        {airflow === "open" && gapPx > 0 && (
          <g data-testid="airflow">
            <Arrow x1={X0 + 4} x2={X0 + 64} y={channelMid} dim={thin} />
            <Arrow x1={X0 + 150} x2={X0 + 270} y={channelMid} dim={thin} />
            <Arrow x1={X1 - 80} x2={X1 + 14} y={channelMid} dim={thin} />
          </g>
        )}
        {airflow === "blocked" && battenXs.length > 0 && (
          <g data-testid="airflow-blocked" className="text-danger-600">
            <Arrow x1={X0 + 2} x2={X(battenXs[0]!) - 4} y={(gapTop + gapBot) / 2} />
            <path
              d={`M${X(battenXs[0]!) - 16} ${(gapTop + gapBot) / 2 - 6} l10 12 m0 -12 l-10 12`}
              stroke="currentColor"
              strokeWidth={1.8}
              transform="translate(-6 0)"
            />
          </g>
        )}
        {airflow === "closed" && gapPx > 0 && (
          <g className="text-steel-800">
            {!stack.ventilation.eaveOpen && <rect x={X0 - 4} y={gapTop} width={4} height={gapPx} fill="currentColor" />}
            {!stack.ventilation.topOpen && <rect x={X1} y={gapTop} width={4} height={gapPx} fill="currentColor" />}
          </g>
        )}

        {/* gap dimension */}
        {gapPx > 0 && (
          <g className="text-steel-700">
            <line x1={X0 - 14} x2={X0 - 14} y1={gapTop} y2={gapBot} stroke="currentColor" strokeWidth={1} />
            <line x1={X0 - 19} x2={X0 - 9} y1={gapTop} y2={gapTop} stroke="currentColor" />
            <line x1={X0 - 19} x2={X0 - 9} y1={gapBot} y2={gapBot} stroke="currentColor" />
            <text x={X0 - 22} y={(gapTop + gapBot) / 2 + 3.5} textAnchor="end" className="fill-steel-800 text-[10px] font-semibold">
              {inchText(gapIn)}
            </text>
          </g>
        )}

        {/* labels */}
        {labels.map((l, i) => (
          <g key={l.text + i}>
            <path d={`M${X1 + 4} ${l.y} L${LABEL_X - 6} ${labelYs[i]}`} fill="none" stroke="currentColor" className="text-steel-300" />
            <text x={LABEL_X} y={labelYs[i]! - 1} className={l.tone === "warn" ? "fill-danger-700 text-[11px] font-semibold" : "fill-steel-900 text-[11px] font-medium"}>
              {l.text}
            </text>
            {l.sub && (
              <text x={LABEL_X} y={labelYs[i]! + 11} className={l.tone === "warn" ? "fill-danger-700 text-[10px]" : "fill-steel-500 text-[10px]"}>
                {l.sub}
              </text>
            )}
          </g>
        ))}

        {foil && !foil.facesGap && (
          <text x={X0} y={deckBot + 14} className="fill-danger-700 text-[11px] font-semibold">
            Foil faces nothing
          </text>
        )}
      </svg>
      <figcaption className="mt-1 space-y-0.5 text-xs text-steel-700">
        {foil && (
          <p className={foil.facesGap ? "text-steel-700" : "font-semibold text-danger-700"} data-testid="foil-status">
            {foil.facesGap ? "Foil: reflective face → air gap." : `Warning: foil faces nothing. ${foil.why}`}
          </p>
        )}
        <p data-testid="airflow-status">{airflowText(facts, stack)}</p>
        <p className="text-steel-500">
          Lengths to scale; deck and gap heights drawn {HEIGHT_FACTOR}× taller than to scale (real sizes labelled); underlayment, foil and
          panel thicknesses not to scale.
        </p>
      </figcaption>
    </figure>
  );
}

function faceText(f: NonNullable<CrossSectionFacts["foil"]>) {
  if (f.facesGap) return `reflective face ${f.face} → air gap`;
  return `reflective face ${f.face} → faces nothing`;
}

function underlaymentText(s: Stack) {
  const u = s.underlayment;
  const kind = u.kind === "self-adhered" ? "Self-adhered membrane" : u.kind === "synthetic" ? "Synthetic underlayment" : `No. ${u.feltNumber} felt`;
  return u.layers > 1 ? `${kind} × ${u.layers}` : kind;
}

function airflowText({ airflow, channel }: CrossSectionFacts, stack: Stack) {
  const thin = channel.channelHeightIn < MIN_CHANNEL_HEIGHT_IN - 1e-9;
  switch (airflow) {
    case "open":
      return thin
        ? `Air path open from eave to ridge, but the channel is ${inchText(channel.channelHeightIn)} high (under 3/4 in): a thermal break and drainage plane, not a ventilation channel.`
        : `Airflow from eave to ridge through a ${inchText(channel.channelHeightIn)} channel, ${channel.channelNfaPerFtSqIn.toFixed(1)} in² net free area per foot of eave.`;
    case "blocked":
      return "Horizontal battens close the channel at every row: no airflow from eave to ridge. Counter-battens under them would open it.";
    case "closed":
      return `The channel is closed at the ${[!stack.ventilation.eaveOpen && "eave", !stack.ventilation.topOpen && "top"].filter(Boolean).join(" and ")}: no airflow.`;
    default:
      return "No spacer: the panels lie on the underlayment, so there is no air gap.";
  }
}
