import { AuditEntry } from './modules/audit/audit-entry.entity.ts';
import { GainBinRow, GainBinSchemeVersion } from './modules/catalog/gain-bin-scheme.entity.ts';
import { PartType } from './modules/catalog/part-type.entity.ts';
import { Lot, LotDocument } from './modules/lots/lot.entity.ts';
import { OutgoingMail, OutgoingMailAttachment } from './modules/mail/outgoing-mail.entity.ts';
import { SiteSetting } from './modules/settings/site-setting.entity.ts';
import { Supplier, SupplierContact, SupplierPart } from './modules/suppliers/supplier.entity.ts';
import { User } from './modules/users/user.entity.ts';
import { Disposition } from './modules/disposition/disposition.entity.ts';
import { InstrumentMapping } from './modules/measurements/instrument-mapping.entity.ts';
import { Measurement } from './modules/measurements/measurement.entity.ts';
import { MeasurementSession } from './modules/measurements/measurement-session.entity.ts';
import { SwitchingStateRow } from './modules/sampling/switching-state.entity.ts';
import { Container } from './modules/bins/container.entity.ts';
import { ContainerPosition } from './modules/bins/container-position.entity.ts';
import { LabelPrint } from './modules/bins/label-print.entity.ts';
import { ScreeningSetupRow } from './modules/bins/screening-setup.entity.ts';
import { StockMovement } from './modules/bins/stock-movement.entity.ts';
import { DriftAlert, DriftCheck } from './modules/supplier-quality/drift-alert.entity.ts';
import { Ncr } from './modules/supplier-quality/ncr.entity.ts';
import { KitPart, KitRequest, KitSet } from './modules/pairing/kit.entity.ts';

/** Every entity class, registered with the DataSource explicitly (no globs). */
export const entities = [User, AuditEntry, PartType, GainBinSchemeVersion, GainBinRow, Supplier, SupplierContact, SupplierPart, Lot, LotDocument, SiteSetting, OutgoingMail, OutgoingMailAttachment, MeasurementSession, Measurement, InstrumentMapping, SwitchingStateRow, Disposition, Container, ContainerPosition, StockMovement, LabelPrint, ScreeningSetupRow, DriftCheck, DriftAlert, Ncr, KitRequest, KitSet, KitPart];
