// The equipment log: every manikin's commissioning, services, faults, repairs and retirement, and the
// consumables work done after each class.
import { equipmentEventTypes, type EquipmentEventType } from "../../shared/domain";
import type { PatientType } from "../../shared/scoring/policy";
import type { ClassConsumables, ManikinQuantity } from "./consumables";
import type { Manikin } from "./fleet";
import type { PlannedClass } from "./schedule";

export interface EquipmentEvent {
  date: string;
  manikin: string;
  site: string;
  event: EquipmentEventType;
  quantity: number;
  patientType: PatientType | null;
  note: string;
}

export function equipmentLog(fleet: Manikin[], classes: { plannedClass: PlannedClass; consumables: ClassConsumables }[]): EquipmentEvent[] {
  const events: EquipmentEvent[] = [];
  const siteOf = new Map(fleet.map((m) => [m.assetId, m.site]));
  const add = (date: string, manikin: string, event: EquipmentEventType, quantity: number, note: string) =>
    events.push({ date, manikin, site: siteOf.get(manikin)!, event, quantity, patientType: null, note });

  for (const m of fleet) {
    events.push({
      date: m.commissioned.date,
      manikin: m.assetId,
      site: m.site,
      event: "commissioned",
      quantity: 1,
      patientType: m.patientType,
      note: m.commissioned.note,
    });
    for (const service of m.services) add(service.date, m.assetId, "serviced", 1, service.note);
    for (const fault of m.faults) {
      add(fault.date, m.assetId, "fault", 1, fault.note);
      if (fault.repaired) add(fault.repaired.date, m.assetId, "serviced", 1, `Repair: ${fault.repaired.note}`);
    }
    if (m.retired) add(m.retired.date, m.assetId, "retired", 1, m.retired.note);
  }

  for (const { plannedClass, consumables } of classes) {
    const note = `After class ${plannedClass.id}`;
    const addAll = (items: ManikinQuantity[], event: EquipmentEventType) => {
      for (const item of items) add(plannedClass.date, item.manikin, event, item.quantity, note);
    };
    addAll(consumables.lungs, "lung_replaced");
    addAll(consumables.mouthpieces, "mouthpiece_cleaned");
    addAll(consumables.batteries, "battery_replaced");
  }

  return mergeSameDay(events).sort(
    (a, b) => a.date.localeCompare(b.date) || a.manikin.localeCompare(b.manikin) || equipmentEventTypes.indexOf(a.event) - equipmentEventTypes.indexOf(b.event),
  );
}

/** One row per manikin, event and day: same-day rows are added together so the log has no duplicates. */
function mergeSameDay(events: EquipmentEvent[]): EquipmentEvent[] {
  const merged = new Map<string, EquipmentEvent>();
  for (const event of events) {
    const key = `${event.date}|${event.manikin}|${event.event}`;
    const earlier = merged.get(key);
    if (!earlier) {
      merged.set(key, { ...event });
    } else {
      earlier.quantity += event.quantity;
      earlier.note = `${earlier.note}; ${event.note}`;
    }
  }
  return [...merged.values()];
}
