/**
 * The garage's basket: parts picked from the catalogue before they become an order. Client state only (kept
 * in this browser's local storage so it survives a reload); prices are never stored here: the server prices
 * the lines when the order is previewed and placed.
 */
import { defineStore, skipHydrate } from 'pinia'
import { useLocalStorage } from '@vueuse/core'
import { MAX_LINE_QUANTITY, MAX_ORDER_LINES } from '#shared/schemas/orders'

export interface BasketItem {
  sku: string
  description: string
  quantity: number
}

export const useBasketStore = defineStore('basket', () => {
  // skipHydrate: the server's empty basket must not overwrite this browser's saved one when the page hydrates
  const items = skipHydrate(useLocalStorage<BasketItem[]>('boreline.basket', [], { initOnMounted: true }))
  const count = computed(() => items.value.reduce((s, i) => s + i.quantity, 0))
  const isEmpty = computed(() => items.value.length === 0)

  function add(sku: string, description: string, quantity = 1): void {
    const key = sku.trim().toUpperCase()
    const hit = items.value.find((i) => i.sku.toUpperCase() === key)
    if (hit) hit.quantity = Math.min(MAX_LINE_QUANTITY, hit.quantity + quantity)
    else if (items.value.length < MAX_ORDER_LINES) items.value.push({ sku: sku.trim(), description, quantity: Math.min(MAX_LINE_QUANTITY, Math.max(1, quantity)) })
  }

  function setQuantity(sku: string, quantity: number): void {
    const hit = items.value.find((i) => i.sku === sku)
    if (!hit) return
    if (!Number.isInteger(quantity) || quantity < 1) remove(sku)
    else hit.quantity = Math.min(MAX_LINE_QUANTITY, quantity)
  }

  function remove(sku: string): void {
    items.value = items.value.filter((i) => i.sku !== sku)
  }

  function clear(): void {
    items.value = []
  }

  /** The `lines` of POST /api/orders. */
  const lines = computed(() => items.value.map((i) => ({ sku: i.sku, quantity: i.quantity })))

  return { items, count, isEmpty, lines, add, setQuantity, remove, clear }
})
