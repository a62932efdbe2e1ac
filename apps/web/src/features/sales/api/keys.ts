export const salesKeys = {
  products: (slug: string) => ['rink', slug, 'products'] as const,
  creditSummary: (slug: string) => ['rink', slug, 'credits', 'summary'] as const,
  /** Everything about one customer's credits: invalidated together after any write that moves them. */
  customerCredits: (slug: string, customerId: string) => ['rink', slug, 'credits', 'customer', customerId] as const,
  balance: (slug: string, customerId: string) => ['rink', slug, 'credits', 'customer', customerId, 'balance'] as const,
  ledger: (slug: string, customerId: string) => ['rink', slug, 'credits', 'customer', customerId, 'ledger'] as const,
  refundQuote: (slug: string, paymentId: string) => ['rink', slug, 'payments', paymentId, 'refund-quote'] as const,
  billing: (slug: string) => ['rink', slug, 'billing'] as const,
};

export const rinkApi = (slug: string, rest: string) => `/api/rinks/${encodeURIComponent(slug)}${rest}`;
