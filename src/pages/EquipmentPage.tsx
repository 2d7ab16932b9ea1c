export default function EquipmentPage() {
  return null;
}
