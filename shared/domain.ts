// Vocabulary shared by the database, the API, the importers and the client.

export const userRoles = ["coordinator", "quality_lead", "instructor", "funder"] as const;
export type UserRole = (typeof userRoles)[number];

export const roleLabels: Record<UserRole, string> = {
  coordinator: "Regional coordinator",
  quality_lead: "Quality lead",
  instructor: "Instructor",
  funder: "Funder",
};

export const courseTypes = ["infant", "child", "adult", "all-ages"] as const;
export type CourseType = (typeof courseTypes)[number];

export const feedbackModes = ["live", "hidden"] as const;
export type FeedbackMode = (typeof feedbackModes)[number];

export const importKinds = ["classes", "attempts", "compressions", "equipment"] as const;
export type ImportKind = (typeof importKinds)[number];

export const equipmentEventTypes = ["commissioned", "lung_replaced", "mouthpiece_cleaned", "battery_replaced", "serviced", "fault", "retired"] as const;
export type EquipmentEventType = (typeof equipmentEventTypes)[number];

export const lengthUnits = ["mm", "cm", "in"] as const;

/** Where an improvement action stands. */
export const actionStatuses = ["planned", "under_way", "done", "stopped"] as const;
export type ActionStatus = (typeof actionStatuses)[number];
