/**
 * Brackenfold Rail Freight's vocabulary: the records its code passes around, with the role of
 * each field, so that generated functions add tonnes to tonnes and compare statuses with statuses.
 */
import type { Scalar } from './ir';

/** What a field means, which decides what a function may do with it. */
export type FieldRole = 'code' | 'label' | 'status' | 'quantity' | 'money' | 'rate' | 'count' | 'day' | 'minute' | 'flag';

export interface EntityField {
  name: string;
  type: Scalar;
  role: FieldRole;
  /** a sensible upper bound for checks on numbers */
  limit?: number;
  /** the words of the field in messages ("load tonnes") */
  words: string;
}

export interface Entity {
  name: string;
  /** variable name of one, and of a list */
  one: string;
  many: string;
  /** how it reads in messages */
  noun: string;
  fields: EntityField[];
  statuses: string[];
}

const field = (name: string, type: Scalar, role: FieldRole, limit?: number): EntityField => ({
  name,
  type,
  role,
  limit,
  words: name.replace(/([A-Z])/g, ' $1').toLowerCase(),
});

export const ENTITIES: Record<string, Entity> = {
  Wagon: {
    name: 'Wagon', one: 'wagon', many: 'wagons', noun: 'wagon',
    fields: [
      field('code', 'str', 'code'), field('wagonClass', 'str', 'label'), field('depotCode', 'str', 'code'),
      field('tareTonnes', 'num', 'quantity', 40), field('loadTonnes', 'num', 'quantity', 90), field('axles', 'int', 'count', 8),
      field('lastInspectionDay', 'int', 'day'), field('hazardous', 'bool', 'flag'), field('status', 'str', 'status'),
    ],
    statuses: ['in_service', 'awaiting_repair', 'stored', 'withdrawn'],
  },
  Consignment: {
    name: 'Consignment', one: 'consignment', many: 'consignments', noun: 'consignment',
    fields: [
      field('reference', 'str', 'code'), field('customerCode', 'str', 'code'), field('originDepot', 'str', 'code'),
      field('destinationDepot', 'str', 'code'), field('weightTonnes', 'num', 'quantity', 2400), field('distanceKm', 'num', 'quantity', 1800),
      field('declaredValue', 'num', 'money', 5000000), field('wagonCount', 'int', 'count', 40), field('hazardous', 'bool', 'flag'),
      field('bookedDay', 'int', 'day'), field('status', 'str', 'status'),
    ],
    statuses: ['booked', 'loaded', 'in_transit', 'delivered', 'held'],
  },
  Depot: {
    name: 'Depot', one: 'depot', many: 'depots', noun: 'depot',
    fields: [
      field('code', 'str', 'code'), field('name', 'str', 'label'), field('region', 'str', 'label'),
      field('sidings', 'int', 'count', 60), field('capacityWagons', 'int', 'count', 900), field('openFromMinute', 'int', 'minute'),
      field('openToMinute', 'int', 'minute'), field('staffed', 'bool', 'flag'),
    ],
    statuses: [],
  },
  TrainPath: {
    name: 'TrainPath', one: 'path', many: 'paths', noun: 'train path',
    fields: [
      field('trainNumber', 'str', 'code'), field('originDepot', 'str', 'code'), field('destinationDepot', 'str', 'code'),
      field('departureMinute', 'int', 'minute'), field('arrivalMinute', 'int', 'minute'), field('maxTonnes', 'num', 'quantity', 3200),
      field('maxWagons', 'int', 'count', 45), field('crewCount', 'int', 'count', 4), field('status', 'str', 'status'),
    ],
    statuses: ['planned', 'confirmed', 'running', 'cancelled'],
  },
  Manifest: {
    name: 'Manifest', one: 'manifest', many: 'manifests', noun: 'manifest',
    fields: [
      field('manifestNumber', 'str', 'code'), field('trainNumber', 'str', 'code'), field('wagonCount', 'int', 'count', 45),
      field('grossTonnes', 'num', 'quantity', 3200), field('hazardousCount', 'int', 'count', 20), field('issuedDay', 'int', 'day'),
      field('amended', 'bool', 'flag'), field('status', 'str', 'status'),
    ],
    statuses: ['draft', 'issued', 'amended', 'closed'],
  },
  Tariff: {
    name: 'Tariff', one: 'tariff', many: 'tariffs', noun: 'tariff',
    fields: [
      field('code', 'str', 'code'), field('ratePerTonneKm', 'num', 'rate'), field('minimumCharge', 'num', 'money', 20000),
      field('hazardSurcharge', 'num', 'rate'), field('fuelIndex', 'num', 'rate'), field('band', 'int', 'count', 6),
      field('currency', 'str', 'label'),
    ],
    statuses: [],
  },
  Inspection: {
    name: 'Inspection', one: 'inspection', many: 'inspections', noun: 'inspection',
    fields: [
      field('wagonCode', 'str', 'code'), field('depotCode', 'str', 'code'), field('inspector', 'str', 'label'),
      field('day', 'int', 'day'), field('defects', 'int', 'count', 30), field('severity', 'int', 'count', 5),
      field('brakeWearMm', 'num', 'quantity', 35), field('passed', 'bool', 'flag'), field('status', 'str', 'status'),
    ],
    statuses: ['scheduled', 'done', 'failed', 'waived'],
  },
  Invoice: {
    name: 'Invoice', one: 'invoice', many: 'invoices', noun: 'invoice',
    fields: [
      field('number', 'str', 'code'), field('customerCode', 'str', 'code'), field('netAmount', 'num', 'money', 900000),
      field('taxRate', 'num', 'rate'), field('paidAmount', 'num', 'money', 900000), field('dueDay', 'int', 'day'),
      field('lines', 'int', 'count', 400), field('disputed', 'bool', 'flag'), field('status', 'str', 'status'),
    ],
    statuses: ['draft', 'sent', 'part_paid', 'paid', 'written_off'],
  },
  WorkOrder: {
    name: 'WorkOrder', one: 'order', many: 'orders', noun: 'work order',
    fields: [
      field('orderNumber', 'str', 'code'), field('wagonCode', 'str', 'code'), field('depotCode', 'str', 'code'),
      field('labourHours', 'num', 'quantity', 200), field('partsCost', 'num', 'money', 80000), field('openedDay', 'int', 'day'),
      field('priority', 'int', 'count', 4), field('urgent', 'bool', 'flag'), field('status', 'str', 'status'),
    ],
    statuses: ['open', 'in_progress', 'waiting_parts', 'closed'],
  },
  Locomotive: {
    name: 'Locomotive', one: 'loco', many: 'locos', noun: 'locomotive',
    fields: [
      field('number', 'str', 'code'), field('locoClass', 'str', 'label'), field('homeDepot', 'str', 'code'),
      field('powerKw', 'num', 'quantity', 6000), field('maxTonnes', 'num', 'quantity', 3600), field('fuelLitres', 'num', 'quantity', 9000),
      field('hoursSinceService', 'int', 'count', 2000), field('electric', 'bool', 'flag'), field('status', 'str', 'status'),
    ],
    statuses: ['available', 'allocated', 'in_shops', 'stored'],
  },
  CrewShift: {
    name: 'CrewShift', one: 'shift', many: 'shifts', noun: 'crew shift',
    fields: [
      field('driverCode', 'str', 'code'), field('depotCode', 'str', 'code'), field('startMinute', 'int', 'minute'),
      field('endMinute', 'int', 'minute'), field('drivingMinutes', 'int', 'count', 600), field('breakMinutes', 'int', 'count', 90),
      field('nightShift', 'bool', 'flag'), field('status', 'str', 'status'),
    ],
    statuses: ['rostered', 'booked_on', 'booked_off', 'sick'],
  },
  Siding: {
    name: 'Siding', one: 'siding', many: 'sidings', noun: 'siding',
    fields: [
      field('code', 'str', 'code'), field('depotCode', 'str', 'code'), field('lengthMetres', 'num', 'quantity', 900),
      field('occupiedMetres', 'num', 'quantity', 900), field('wagonsStabled', 'int', 'count', 60), field('electrified', 'bool', 'flag'),
      field('status', 'str', 'status'),
    ],
    statuses: ['open', 'restricted', 'closed'],
  },
};

/** The fields of an entity with one of these roles. */
export function fieldsWith(entity: Entity, ...roles: FieldRole[]): EntityField[] {
  return entity.fields.filter((x) => roles.includes(x.role));
}
