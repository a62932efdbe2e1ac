import type { MoneyReport } from '@rinkwright/core';
import { formatCount, formatMoney, minorDigits } from '../../../lib/format';
import { DayBars } from './charts/day-bars';
import { Legend, STEEL, Swatch } from './charts/chart-frame';
import { Figures, type FigureSpec } from './figures';
import { formatDay, formatPeriod, formatShare } from './numbers';
import { Nothing, ReportSection, type TableSource } from './report-section';

type Totals = MoneyReport['totals'];
type ProductRow = MoneyReport['tables']['byProduct'][number];

const REFUND_FILL = 'var(--color-brick)';

/** An axis tick in whole currency units ("CA$150"): the cents of a gridline only crowd the axis. */
const formatWholeMoney = (minor: number, currency: string) =>
  new Intl.NumberFormat(undefined, { style: 'currency', currency, maximumFractionDigits: 0 }).format(minor / 10 ** minorDigits(currency));

const CHANNEL_WORD: Record<string, string> = { online: 'Online', counter: 'At the counter' };
const PRODUCT_RENDER = { channel: (row: ProductRow) => CHANNEL_WORD[row.channel] };

function figures(report: MoneyReport): FigureSpec[] {
  const t = report.totals;
  const then = report.compare?.totals;
  const money = (minor: number) => formatMoney(minor, t.currency);
  const p = <K extends keyof Totals>(key: K) => (then ? then[key] : undefined);
  const { memberships, outstanding } = report;
  return [
    { label: 'Sales', value: t.salesMinor, format: money, previous: p('salesMinor'), note: `${formatCount(t.sales)} ${t.sales === 1 ? 'sale' : 'sales'}` },
    { label: 'Refunds', value: t.refundsMinor, format: money, previous: p('refundsMinor') },
    { label: 'Platform fees', value: t.feesMinor, format: money, previous: p('feesMinor') },
    { label: 'Credits redeemed', value: t.redemptions, format: formatCount, previous: p('redemptions') },
    { label: 'Value of credits redeemed', value: t.redemptionValueMinor, format: money, previous: p('redemptionValueMinor') },
    { label: 'Breakage', value: t.breakageMinor, format: money, previous: p('breakageMinor'), note: `${formatCount(t.breakageCredits)} ${t.breakageCredits === 1 ? 'credit' : 'credits'} expired unused` },
    { label: 'Credits outstanding', value: outstanding.credits, format: formatCount, note: `At ${formatDay(report.period.to)}, not yet used or expired` },
    { label: 'Deferred revenue', value: outstanding.valueMinor, format: money, note: 'What the outstanding credits are worth' },
    { label: 'Active memberships', value: memberships.active, format: formatCount, note: `At ${formatDay(report.period.to)}` },
    { label: 'Monthly recurring revenue', value: memberships.monthlyRecurringMinor, format: money, note: 'From the active memberships' },
    {
      label: 'Membership churn',
      value: memberships.churnRate,
      format: formatShare,
      missing: 'No memberships at the start',
      note: `${formatCount(memberships.canceledInPeriod)} cancelled in the period`,
    },
  ];
}

function daySummary(report: MoneyReport): string {
  const money = (minor: number) => formatMoney(minor, report.totals.currency);
  const days = report.tables.byDay;
  const best = days.reduce<(typeof days)[number] | null>((b, d) => (b === null || d.salesMinor > b.salesMinor ? d : b), null);
  return `Sales of ${money(report.totals.salesMinor)} and refunds of ${money(report.totals.refundsMinor)} over ${formatPeriod(report.period)}${
    best && best.salesMinor > 0 ? `; the best day was ${formatDay(best.day)} with ${money(best.salesMinor)} of sales` : ''
  }.`;
}

export function MoneyView({ report, source }: { report: MoneyReport; source: TableSource }) {
  const { currency } = report.totals;
  const quiet = report.tables.byDay.every((d) => d.salesMinor === 0 && d.refundsMinor === 0);
  return (
    <div className="space-y-6">
      <Figures specs={figures(report)} compare={report.compare?.period} />
      <ReportSection
        source={source}
        report="money"
        table="byDay"
        rows={report.tables.byDay}
        empty="No days in this period."
        folded
        chart={
          quiet ? (
            <Nothing>No sales or refunds in this period.</Nothing>
          ) : (
            <>
              <DayBars
                days={report.tables.byDay.map((d) => ({ day: d.day, up: d.salesMinor, down: d.refundsMinor }))}
                up={{ label: 'Sales', fill: STEEL }}
                down={{ label: 'Refunds', fill: REFUND_FILL, hatched: true }}
                title="Sales and refunds by day"
                summary={daySummary(report)}
                yLabel={`Amount (${currency})`}
                formatValue={(minor) => formatWholeMoney(minor, currency)}
              />
              <Legend
                items={[
                  { key: 'sales', swatch: <Swatch fill={STEEL} />, label: 'Sales, above the line' },
                  {
                    key: 'refunds',
                    swatch: <Swatch fill={REFUND_FILL} pattern />,
                    label: report.totals.refundsMinor === 0 ? 'Refunds, below the line (none in this period)' : 'Refunds, below the line (hatched)',
                  },
                ]}
              />
            </>
          )
        }
      />
      <ReportSection source={source} report="money" table="byProduct" rows={report.tables.byProduct} empty="No sales in this period." render={PRODUCT_RENDER} />
    </div>
  );
}
