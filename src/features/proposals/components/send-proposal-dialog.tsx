import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { z } from "zod";
import type { ProposalDto } from "@shared/schemas/proposal-api";
import type { QuoteSummary } from "@shared/schemas/quote";
import { ApiError, errorMessage } from "@/lib/api-client";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Dialog } from "@/components/ui/dialog";
import { Field } from "@/components/ui/field";
import { Input } from "@/components/ui/input";
import { Textarea } from "@/components/ui/textarea";
import { toast } from "@/components/ui/toast";
import { useSendProposal } from "@/features/proposals/api/mutations";

const sendFormSchema = z.object({
  to: z.string().trim().min(1, "Enter the homeowner's e-mail").max(320).email("Enter a valid e-mail address"),
  copyToMe: z.boolean(),
  message: z.string().trim().max(2000, "Keep the note under 2,000 characters"),
});
type SendFormValues = z.infer<typeof sendFormSchema>;

type Props = {
  open: boolean;
  onClose: () => void;
  jobId: number;
  quote: QuoteSummary;
  defaultTo: string;
  onSent?: (p: ProposalDto) => void;
};

/** "Send to homeowner": the address (the customer's by default), a copy to me, an optional note. */
export function SendProposalDialog({ open, onClose, jobId, quote, defaultTo, onSent }: Props) {
  const send = useSendProposal(jobId);
  const resend = quote.status === "sent";
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors, isSubmitting },
  } = useForm<SendFormValues>({
    resolver: zodResolver(sendFormSchema),
    defaultValues: { to: defaultTo, copyToMe: false, message: "" },
  });

  const submit = handleSubmit(async (v) => {
    try {
      const p = await send.mutateAsync({
        quoteId: quote.id,
        input: { to: v.to, copyToMe: v.copyToMe, ...(v.message ? { message: v.message } : {}) },
      });
      toast.success(`Proposal ${quote.number} sent to ${p.sentTo || v.to}.`);
      onSent?.(p);
      onClose();
    } catch (err) {
      const fields = err instanceof ApiError ? (err.fields ?? {}) : {};
      let placed = false;
      for (const name of ["to", "message"] as const) {
        if (fields[name]) {
          setError(name, { message: fields[name] }, { shouldFocus: !placed });
          placed = true;
        }
      }
      if (!placed) {
        setError("root.server", { message: errorMessage(err) });
      }
    }
  });

  return (
    <Dialog
      open={open}
      onClose={onClose}
      busy={isSubmitting}
      className="max-w-lg"
      title={resend ? `Send ${quote.number} again` : `Send ${quote.number} to the homeowner`}
      description="The homeowner gets an e-mail with the proposal PDF attached and a private link to view, accept and pay the deposit online."
      footer={
        <>
          <Button variant="secondary" onClick={onClose} disabled={isSubmitting}>
            Cancel
          </Button>
          <Button type="submit" form="send-proposal-form" loading={isSubmitting}>
            {isSubmitting ? "Sending…" : resend ? "Send new link" : "Send proposal"}
          </Button>
        </>
      }
    >
      <form id="send-proposal-form" onSubmit={submit} noValidate className="space-y-4" aria-label="Send the proposal">
        {errors.root?.server?.message && <Alert tone="error">{errors.root.server.message}</Alert>}
        {resend && (
          <Alert tone="caution" title="The earlier link stops working">
            Sending again issues a new link. The link in the e-mail the homeowner already has will no longer open the proposal.
          </Alert>
        )}
        <Field label="To" error={errors.to?.message} hint="The customer's e-mail, unless you change it here.">
          <Input type="email" autoComplete="off" spellCheck={false} data-autofocus {...register("to")} />
        </Field>
        <label className="flex items-center gap-2 text-sm text-steel-800">
          <input type="checkbox" className="size-4 accent-accent-700" {...register("copyToMe")} />
          Send a copy to me
        </label>
        <Field label="Message (optional)" error={errors.message?.message} hint="A short note shown above the proposal in the e-mail.">
          <Textarea rows={4} {...register("message")} />
        </Field>
      </form>
    </Dialog>
  );
}
