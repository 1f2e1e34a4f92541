// The left rail, in the order of a working day (LOOK.md).
import {
  outlinedAdminPanelSettings,
  outlinedCalculate,
  outlinedHistory,
  outlinedNotifications,
  outlinedUploadFile,
  outlinedWaterDrop,
} from '@quasar/extras/material-icons-outlined';
import type { RouteName } from './route-names';

export interface RailEntry {
  name: RouteName;
  label: string;
  icon: string;
}

export const RAIL: readonly RailEntry[] = [
  { name: 'fleet', label: 'Fleet', icon: outlinedWaterDrop },
  { name: 'alerts', label: 'Alerts', icon: outlinedNotifications },
  { name: 'history', label: 'History', icon: outlinedHistory },
  { name: 'planner', label: 'Planner', icon: outlinedCalculate },
  { name: 'uploads', label: 'Uploads', icon: outlinedUploadFile },
  { name: 'admin', label: 'Admin', icon: outlinedAdminPanelSettings },
];
