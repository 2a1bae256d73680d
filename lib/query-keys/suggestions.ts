/** TanStack Query keys of learned suggestions, from this one factory (never bare strings). */
export const suggestionKeys = {
  all: ["suggestions"] as const,
  trainingJob: (jobId: string) => [...suggestionKeys.all, "training-job", jobId] as const,
};
