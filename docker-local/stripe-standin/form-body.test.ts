import { describe, expect, it } from 'vitest';
import { parseFormBody } from './form-body';

describe('parseFormBody', () => {
	it('reads the nested brackets the stripe SDK sends into objects and arrays', () => {
		const body =
			'mode=subscription&line_items[0][price]=price_1&line_items[0][quantity]=3' +
			'&subscription_data[metadata][workspace_id]=ws_9&success_url=http%3A%2F%2F127.0.0.1%3A3000%2Fdone%3Fs%3D%7BCHECKOUT_SESSION_ID%7D';
		expect(parseFormBody(body)).toEqual({
			mode: 'subscription',
			line_items: [{ price: 'price_1', quantity: '3' }],
			subscription_data: { metadata: { workspace_id: 'ws_9' } },
			success_url: 'http://127.0.0.1:3000/done?s={CHECKOUT_SESSION_ID}'
		});
	});

	it('orders indexed arrays by index and appends `key[]` values', () => {
		expect(parseFormBody('lookup_keys[1]=b&lookup_keys[0]=a')).toEqual({ lookup_keys: ['a', 'b'] });
		expect(parseFormBody('expand[]=data.product&expand[]=data.tiers')).toEqual({ expand: ['data.product', 'data.tiers'] });
	});

	it('accepts percent-encoded brackets and plus signs for spaces', () => {
		expect(parseFormBody('metadata%5Bnote%5D=two+words%21')).toEqual({ metadata: { note: 'two words!' } });
	});

	it('keeps an empty value (the SDK unsets a field that way)', () => {
		expect(parseFormBody('metadata=&email=')).toEqual({ metadata: '', email: '' });
	});

	it('refuses a name given both as a value and as a group, naming it', () => {
		expect(() => parseFormBody('metadata=x&metadata[a]=b')).toThrow(/metadata\[a\]/);
	});

	it('refuses names that would reach Object.prototype', () => {
		expect(() => parseFormBody('__proto__[polluted]=yes')).toThrow(/not allowed/);
		expect(() => parseFormBody('metadata[constructor][prototype]=x')).toThrow(/not allowed/);
		expect(({} as Record<string, unknown>).polluted).toBeUndefined();
	});

	it('refuses a malformed name and bad percent-encoding', () => {
		expect(() => parseFormBody('items[0]x=1')).toThrow(/Malformed parameter name: items\[0\]x/);
		expect(() => parseFormBody('name=%E0%A4%A')).toThrow(/Malformed percent-encoding/);
	});
});
