import { useEffect } from "react";
import { Controller, useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { useQuery } from "@tanstack/react-query";
import type { z } from "zod";
import { jobAssignmentSchema, type JobAssignment, type JobDto } from "@shared/schemas/job";
import type { TeamMemberDto } from "@shared/schemas/auth";
import { ApiError, errorMessage } from "@/lib/api-client";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Field } from "@/components/ui/field";
import { Select } from "@/components/ui/select";
import { Spinner } from "@/components/ui/spinner";
import { toast } from "@/components/ui/toast";
import { userQueries } from "@/lib/queries/users";
import { useSetJobAssignment } from "@/features/jobs/api/mutations";

type FormValues = z.input<typeof jobAssignmentSchema>;

const valuesOf = (job: JobDto): FormValues => ({
  estimatorId: job.estimatorId,
  crewIds: job.crew.map((c) => c.id),
});

function Names({ people, empty }: { people: { id: number; name: string }[]; empty: string }) {
  if (people.length === 0) return <span className="text-steel-500">{empty}</span>;
  return <>{people.map((p) => p.name).join(", ")}</>;
}

/** Who is on the job, read-only: estimators can't read the team list, and crew only look. */
export function AssignmentReadOnly({ job, note }: { job: JobDto; note?: string }) {
  return (
    <section aria-labelledby="assignment-title" className="space-y-2">
      <h2 id="assignment-title" className="text-sm font-semibold text-steel-900">
        Assigned
      </h2>
      <dl className="grid grid-cols-[6rem_1fr] gap-y-1 text-sm">
        <dt className="text-steel-500">Estimator</dt>
        <dd className="text-steel-900">{job.estimator?.name ?? <span className="text-steel-500">Unassigned</span>}</dd>
        <dt className="text-steel-500">Crew</dt>
        <dd className="text-steel-900">
          <Names people={job.crew} empty="No crew yet" />
        </dd>
      </dl>
      {note && <p className="text-xs text-steel-500">{note}</p>}
    </section>
  );
}

/**
 * The owner's assignment form: the estimator (an active estimator or owner) and the crew (active crew),
 * PUT /api/jobs/:id/assignment. People already on the job who have since been deactivated stay listed.
 */
export function AssignmentForm({ job, disabled }: { job: JobDto; disabled: boolean }) {
  const team = useQuery(userQueries.list());
  const save = useSetJobAssignment(job.id);
  const {
    control,
    register,
    handleSubmit,
    reset,
    setError,
    formState: { errors, isDirty, isSubmitting },
  } = useForm<FormValues, unknown, JobAssignment>({
    resolver: zodResolver(jobAssignmentSchema),
    defaultValues: valuesOf(job),
  });

  // a newer job from the server: take it, unless the owner is mid-edit
  const jobVersion = `${job.updatedAt}|${job.estimatorId}|${job.crew.map((c) => c.id).join(",")}`;
  useEffect(() => {
    reset(valuesOf(job), { keepDirtyValues: true });
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [jobVersion]);

  if (team.isPending) {
    return (
      <div className="flex items-center gap-2 text-sm text-steel-500">
        <Spinner label="Loading the team" /> Loading the team…
      </div>
    );
  }
  if (team.isError) {
    return <AssignmentReadOnly job={job} note={`The team list could not be loaded: ${errorMessage(team.error)}`} />;
  }

  const members = team.data;
  const onJob = new Set([job.estimatorId, ...job.crew.map((c) => c.id)]);
  const visible = (m: TeamMemberDto) => m.active || onJob.has(m.id);
  const estimators = members.filter((m) => m.role !== "crew" && visible(m)).sort((a, b) => a.name.localeCompare(b.name));
  const crew = members.filter((m) => m.role === "crew" && visible(m)).sort((a, b) => a.name.localeCompare(b.name));
  // someone on the job who is no longer in the list (role changed): still shown
  for (const c of job.crew) if (!crew.some((m) => m.id === c.id)) crew.push({ ...c, role: "crew", active: false } as TeamMemberDto);

  const submit = handleSubmit(async (values) => {
    try {
      const saved = await save.mutateAsync(values);
      reset(valuesOf(saved));
      toast.success("Assignment saved.");
    } catch (err) {
      const fields = err instanceof ApiError ? (err.fields ?? {}) : {};
      if (fields.estimatorId) setError("estimatorId", { message: fields.estimatorId });
      const crewMsg = Object.entries(fields).find(([k]) => k.startsWith("crewIds"))?.[1];
      if (crewMsg) setError("crewIds", { message: crewMsg });
      if (!fields.estimatorId && !crewMsg) setError("root.server", { message: errorMessage(err) });
    }
  });

  return (
    <form onSubmit={submit} noValidate aria-labelledby="assignment-title">
      <fieldset disabled={disabled || isSubmitting} className="min-w-0 space-y-3">
        <h2 id="assignment-title" className="text-sm font-semibold text-steel-900">
          Assigned
        </h2>
        {errors.root?.server?.message && <Alert tone="error">{errors.root.server.message}</Alert>}
        <Field label="Estimator" error={errors.estimatorId?.message}>
          <Select
            {...register("estimatorId", { setValueAs: (v) => (v === "" || v === null ? null : Number(v)) })}
          >
            <option value="">Unassigned</option>
            {estimators.map((m) => (
              <option key={m.id} value={m.id}>
                {m.name}
                {m.role === "owner" ? " (owner)" : ""}
                {!m.active ? " (deactivated)" : ""}
              </option>
            ))}
          </Select>
        </Field>
        <Controller
          control={control}
          name="crewIds"
          render={({ field }) => {
            const ids = (field.value as number[] | undefined) ?? [];
            return (
              <fieldset className="min-w-0">
                <legend className="mb-1 text-xs font-medium text-steel-700">Crew</legend>
                {crew.length === 0 ? (
                  <p className="text-xs text-steel-500">No crew members on the team yet (add them under Team).</p>
                ) : (
                  <ul className="max-h-44 space-y-0.5 overflow-y-auto rounded-md border border-steel-200 bg-white p-1.5">
                    {crew.map((m) => (
                      <li key={m.id}>
                        <label className="flex items-center gap-2 rounded px-1 py-0.5 text-sm text-steel-800 hover:bg-steel-50">
                          <input
                            type="checkbox"
                            className="size-4 rounded border-steel-400 accent-accent-700 focus-visible:outline-none focus-visible:ring-2 focus-visible:ring-accent-500"
                            checked={ids.includes(m.id)}
                            onChange={(e) =>
                              field.onChange(e.target.checked ? [...ids, m.id] : ids.filter((id) => id !== m.id))
                            }
                            onBlur={field.onBlur}
                          />
                          {m.name}
                          {!m.active && <span className="text-xs text-steel-500">(deactivated)</span>}
                        </label>
                      </li>
                    ))}
                  </ul>
                )}
                {errors.crewIds?.message && (
                  <p role="alert" className="mt-1 text-xs text-danger-700">
                    {errors.crewIds.message}
                  </p>
                )}
              </fieldset>
            );
          }}
        />
        {!disabled && (
          <div className="flex justify-end">
            <Button type="submit" size="sm" variant="secondary" loading={isSubmitting} disabled={!isDirty}>
              Save assignment
            </Button>
          </div>
        )}
      </fieldset>
    </form>
  );
}
