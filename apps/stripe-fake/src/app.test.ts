import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { createApp } from './app';

describe('payment fake', () => {
  it('answers its health check', async () => {
    const response = await request(createApp()).get('/health');

    expect(response.status).toBe(200);
    expect(response.body).toEqual({ status: 'ok' });
  });
});
