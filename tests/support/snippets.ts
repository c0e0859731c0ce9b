/**
 * A copy of the fixture releases' pricing rule (tests/fixtures/releases/freight-platform, billing/tariff.js) with every
 * name changed, as an engineer who found a bug in it would paste it into find copies.
 */
export const PASTED_PRICING_RULE = `function costOfTrain(units, km, deal) {
  let acc = 0;
  for (const u of units) {
    const base = u.loadTonnes * deal.ratePerTonne + u.axles * 3;
    const hazard = u.hazardous ? base * 0.15 : 0;
    acc += (base + hazard) * Math.max(1, km / 100);
  }
  if (deal.discount > 0) {
    acc = acc - acc * deal.discount;
  }
  return Math.round(acc * 100) / 100;
}`;
