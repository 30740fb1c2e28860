import { describe, expect, it } from 'vitest'

describe('boot/zodConfig', () => {
  it('switches zod to jitless without importing zod, and zod loaded afterwards reads the setting', async () => {
    await import('@/boot/zodConfig')
    const { z } = await import('zod')
    expect(z.config().jitless).toBe(true)
  })

  it('never lets an object schema probe new Function, so the CSP reports nothing', async () => {
    await import('@/boot/zodConfig')
    const { z } = await import('zod')
    const original = globalThis.Function
    let probed = 0
    globalThis.Function = new Proxy(original, {
      construct(target, args) {
        probed++
        return Reflect.construct(target, args)
      },
    })
    try {
      const schema = z.object({ a: z.string(), b: z.number().optional() })
      expect(schema.parse({ a: 'x' })).toEqual({ a: 'x' })
      expect(schema.safeParse({ a: 1 }).success).toBe(false)
    } finally {
      globalThis.Function = original
    }
    expect(probed).toBe(0)
  })
})
