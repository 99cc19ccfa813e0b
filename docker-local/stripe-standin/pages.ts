/**
 * The stand-in's own pages: checkout, billing portal, invoice. Plain HTML with
 * inline styles and no scripts, every one headed "Local Stripe stand-in" so
 * nobody takes them for Stripe. All text that comes from requests is escaped.
 */
import type Stripe from 'stripe';
import { formatAmount } from './money';
import type { CardOnFile } from './state';

export function escapeHtml(text: string): string {
	return text
		.replaceAll('&', '&amp;')
		.replaceAll('<', '&lt;')
		.replaceAll('>', '&gt;')
		.replaceAll('"', '&quot;')
		.replaceAll("'", '&#39;');
}

const dateFormat = new Intl.DateTimeFormat('en-GB', { dateStyle: 'long', timeZone: 'UTC' });

export function formatDate(unixSeconds: number): string {
	return dateFormat.format(new Date(unixSeconds * 1000));
}

const style = `
body { font: 16px/1.5 system-ui, sans-serif; margin: 0; background: #f4f4f0; color: #1d232a; }
.banner { background: #6b2c00; color: #fff; padding: .5rem 1rem; font-weight: 600; }
main { max-width: 40rem; margin: 2rem auto; background: #fff; padding: 1.5rem 2rem; border: 1px solid #d6d6cf; }
h1 { font-size: 1.4rem; margin-top: 0; }
h2 { font-size: 1.1rem; margin-top: 1.75rem; }
table { border-collapse: collapse; width: 100%; }
th, td { text-align: left; padding: .35rem .5rem; border-bottom: 1px solid #e4e4de; }
td.amount, th.amount { text-align: right; font-variant-numeric: tabular-nums; }
form { display: inline-block; margin: .25rem .5rem .25rem 0; }
button { font: inherit; padding: .45rem .9rem; border: 1px solid #1d232a; background: #fff; cursor: pointer; }
button.primary { background: #1d232a; color: #fff; }
.notice { padding: .6rem .8rem; border: 1px solid; margin: 1rem 0; }
.notice.error { border-color: #a11; color: #a11; background: #fff4f4; }
.notice.ok { border-color: #175; color: #175; background: #f2fbf6; }
.muted { color: #5b636b; font-size: .9rem; }
`;

function layout(title: string, body: string): string {
	return `<!doctype html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<meta name="robots" content="noindex">
<title>${escapeHtml(title)} · Local Stripe stand-in</title>
<style>${style}</style>
</head>
<body>
<div class="banner">Local Stripe stand-in: a test double for development. No card is charged and no money moves.</div>
<main>
${body}
</main>
</body>
</html>`;
}

function button(action: string, label: string, fields: Record<string, string> = {}, primary = false): string {
	const hidden = Object.entries(fields)
		.map(([name, value]) => `<input type="hidden" name="${escapeHtml(name)}" value="${escapeHtml(value)}">`)
		.join('');
	return `<form method="post" action="${escapeHtml(action)}">${hidden}<button type="submit"${primary ? ' class="primary"' : ''}>${escapeHtml(label)}</button></form>`;
}

function notice(kind: 'error' | 'ok', text: string): string {
	return `<p class="notice ${kind}" role="${kind === 'error' ? 'alert' : 'status'}">${escapeHtml(text)}</p>`;
}

export function messagePage(title: string, message: string): string {
	return layout(title, `<h1>${escapeHtml(title)}</h1><p>${escapeHtml(message)}</p>`);
}

export interface CheckoutView {
	session: Stripe.Checkout.Session;
	productName: string;
	price: Stripe.Price;
	quantity: number;
	declined: boolean;
}

export function checkoutPage(view: CheckoutView): string {
	const { session, price } = view;
	const unit = formatAmount(price.unit_amount ?? 0, price.currency);
	const every = price.recurring?.interval ?? 'period';
	const base = `/checkout/${encodeURIComponent(session.id)}`;
	const open = session.status === 'open';
	const body = `
<h1>Local Stripe stand-in checkout</h1>
<p class="muted">Session ${escapeHtml(session.id)}</p>
${view.declined ? notice('error', 'Your card was declined. Try another card, or go back.') : ''}
${open ? '' : notice('error', `This checkout is ${session.status ?? 'closed'} and can no longer be paid.`)}
<table>
<tr><th>Plan</th><td>${escapeHtml(view.productName)}${price.nickname ? ` (${escapeHtml(price.nickname)})` : ''}</td></tr>
<tr><th>Price</th><td>${escapeHtml(unit)} per seat per ${escapeHtml(every)}</td></tr>
<tr><th>Seats</th><td>${view.quantity}</td></tr>
<tr><th>Total due today</th><td><strong>${escapeHtml(formatAmount(session.amount_total ?? 0, session.currency ?? price.currency))}</strong></td></tr>
</table>
${
	open
		? `<p>
${button(`${base}/pay`, 'Pay with the test card', { card: 'working' }, true)}
${button(`${base}/pay`, 'Pay with a card that is declined', { card: 'declining' })}
${button(`${base}/cancel`, 'Cancel and go back')}
</p>`
		: ''
}`;
	return layout('Checkout', body);
}

export interface PortalSubscriptionView {
	subscription: Stripe.Subscription;
	item: Stripe.SubscriptionItem;
	productName: string;
}

export interface PortalView {
	session: Stripe.BillingPortal.Session;
	customer: Stripe.Customer;
	card: CardOnFile;
	subscriptions: PortalSubscriptionView[];
	invoices: Stripe.Invoice[];
	notice: string | null;
}

const cardWords: Record<CardOnFile, string> = {
	working: 'Test card ending 4242 (payments go through)',
	declining: 'Test card ending 0002 (payments are declined)',
	none: 'No card on file'
};

function renewalWords(subscription: Stripe.Subscription, item: Stripe.SubscriptionItem): string {
	if (subscription.status === 'canceled') {
		return `Ended on ${formatDate(subscription.ended_at ?? subscription.canceled_at ?? item.current_period_end)}`;
	}
	if (subscription.cancel_at_period_end) return `Ends on ${formatDate(item.current_period_end)}; it will not renew`;
	return `Renews on ${formatDate(item.current_period_end)}`;
}

function subscriptionSection(base: string, view: PortalSubscriptionView): string {
	const { subscription, item } = view;
	const price = item.price;
	const unit = formatAmount(price.unit_amount ?? 0, price.currency);
	const live = subscription.status !== 'canceled';
	const actions = !live
		? ''
		: subscription.cancel_at_period_end
			? button(`${base}/resume`, 'Resume the subscription', { subscription: subscription.id }, true)
			: button(`${base}/cancel`, 'Cancel at the end of the period', { subscription: subscription.id });
	return `
<h2>${escapeHtml(view.productName)}${price.nickname ? ` (${escapeHtml(price.nickname)})` : ''}</h2>
<table>
<tr><th>Status</th><td>${escapeHtml(String(subscription.status))}</td></tr>
<tr><th>Seats</th><td>${item.quantity ?? 1}</td></tr>
<tr><th>Price</th><td>${escapeHtml(unit)} per seat per ${escapeHtml(price.recurring?.interval ?? 'period')}</td></tr>
<tr><th>Current period</th><td>${escapeHtml(formatDate(item.current_period_start))} to ${escapeHtml(formatDate(item.current_period_end))}</td></tr>
<tr><th>Next renewal</th><td>${escapeHtml(renewalWords(subscription, item))}</td></tr>
</table>
<p>${actions}</p>`;
}

function invoiceRows(invoices: Stripe.Invoice[]): string {
	if (invoices.length === 0) return '<p class="muted">No invoices yet.</p>';
	const rows = invoices
		.map(
			(invoice) => `<tr>
<td>${invoice.hosted_invoice_url ? `<a href="${escapeHtml(invoice.hosted_invoice_url)}">${escapeHtml(invoice.number ?? invoice.id)}</a>` : escapeHtml(invoice.number ?? invoice.id)}</td>
<td>${escapeHtml(formatDate(invoice.created))}</td>
<td class="amount">${escapeHtml(formatAmount(invoice.total, invoice.currency))}</td>
<td>${escapeHtml(String(invoice.status))}</td>
</tr>`
		)
		.join('\n');
	return `<table><tr><th>Invoice</th><th>Date</th><th class="amount">Total</th><th>Status</th></tr>${rows}</table>`;
}

export function portalPage(view: PortalView): string {
	const base = `/portal/${encodeURIComponent(view.session.id)}`;
	const customer = view.customer;
	const who = [customer.name, customer.email].filter(Boolean).join(' · ');
	const cardButtons =
		button(`${base}/card`, 'Use the working test card', { card: 'working' }, view.card !== 'working') +
		button(`${base}/card`, 'Use a card that will be declined', { card: 'declining' });
	const body = `
<h1>Local Stripe stand-in billing portal</h1>
<p>${escapeHtml(who || customer.id)}</p>
${view.notice ? notice('ok', view.notice) : ''}
${view.subscriptions.length === 0 ? '<p>No subscription.</p>' : view.subscriptions.map((s) => subscriptionSection(base, s)).join('\n')}
<h2>Payment method</h2>
<p>${escapeHtml(cardWords[view.card])}</p>
<p>${cardButtons}</p>
<h2>Invoices</h2>
${invoiceRows(view.invoices)}
${view.session.return_url ? `<p><a href="${escapeHtml(view.session.return_url)}">Return to Tidewright</a></p>` : ''}`;
	return layout('Billing portal', body);
}

export function invoicePage(invoice: Stripe.Invoice): string {
	const lines = invoice.lines.data
		.map(
			(line) => `<tr><td>${escapeHtml(line.description ?? '')}<br><span class="muted">${escapeHtml(formatDate(line.period.start))} to ${escapeHtml(formatDate(line.period.end))}</span></td><td class="amount">${escapeHtml(formatAmount(line.amount, line.currency))}</td></tr>`
		)
		.join('\n');
	const body = `
<h1>Invoice ${escapeHtml(invoice.number ?? invoice.id)}</h1>
<p>Status: <strong>${escapeHtml(String(invoice.status))}</strong> · issued ${escapeHtml(formatDate(invoice.created))}${invoice.customer_email ? ` to ${escapeHtml(invoice.customer_email)}` : ''}</p>
<table>
<tr><th>Description</th><th class="amount">Amount</th></tr>
${lines}
<tr><th>Total</th><th class="amount">${escapeHtml(formatAmount(invoice.total, invoice.currency))}</th></tr>
<tr><th>Amount due</th><th class="amount">${escapeHtml(formatAmount(invoice.amount_due, invoice.currency))}</th></tr>
<tr><th>Amount paid</th><th class="amount">${escapeHtml(formatAmount(invoice.amount_paid, invoice.currency))}</th></tr>
</table>`;
	return layout(`Invoice ${invoice.number ?? invoice.id}`, body);
}

export function homePage(info: { now: number; webhookUrl: string | null; counts: Record<string, number> }): string {
	const counts = Object.entries(info.counts)
		.map(([name, count]) => `<tr><th>${escapeHtml(name)}</th><td>${count}</td></tr>`)
		.join('');
	const body = `
<h1>Local Stripe stand-in</h1>
<p>Serves the part of Stripe's API that Tidewright calls, in memory, on loopback.</p>
<table>
<tr><th>Stand-in clock</th><td>${escapeHtml(new Date(info.now * 1000).toISOString())}</td></tr>
<tr><th>Webhook endpoint</th><td>${escapeHtml(info.webhookUrl ?? 'none')}</td></tr>
${counts}
</table>
<p class="muted">Control routes: GET /_standin/clock, POST /_standin/clock/advance, GET /_standin/deliveries, POST /_standin/webhook, POST /_standin/reset.</p>`;
	return layout('Home', body);
}
