import { and, assign, setup } from 'xstate';
import { chargebackReasonsFor, initialClaimContext, type ClaimContext, type ClaimInput, type CoreRecord } from './claim-context';
import type { ClaimEvent } from './claim-events';
import { ruleRefusal } from './claim-rules';

function coreOutcome(context: ClaimContext, core: Partial<CoreRecord>): Pick<ClaimContext, 'core' | 'chargebackReasons'> {
  const next = { ...context.core, ...core };
  return { core: next, chargebackReasons: chargebackReasonsFor(next) };
}

/**
 * The warranty claim lifecycle. Pure: no I/O. Rehydrate with `claimMachine.resolveState({ value, context })`,
 * ask `snapshot.can(event)`, step with `transition(claimMachine, snapshot, event)`.
 */
export const claimMachine = setup({
  types: {
    context: {} as ClaimContext,
    events: {} as ClaimEvent,
    input: {} as ClaimInput,
  },
  guards: {
    /** Role, assignment, appeal rules and the step's data; the state is checked by the chart itself. */
    permitted: ({ context, event }) => ruleRefusal(context, event) === null,
    afterTestPasses: ({ event }) =>
      (event.type === 'MARK_FITTED' || event.type === 'SUBMIT_AFTER_TEST') && event.afterTestPasses,
    cameFromAppeal: ({ context }) => context.appealsUsed > 0,
  },
  actions: {
    recordWithdrawal: assign(({ event }) =>
      event.type === 'WITHDRAW'
        ? { lastStepAt: event.at, withdrawal: { at: event.at, by: event.actor.id, note: event.note ?? null } }
        : {},
    ),
    assignTaker: assign(({ event }) => ({ lastStepAt: event.at, assignedRepId: event.actor.id })),
    unassign: assign(({ event }) => ({ lastStepAt: event.at, assignedRepId: null })),
    recordFitting: assign(({ context, event }) => ({
      replacement: { ...context.replacement, fittedAt: event.at },
    })),
    recordAfterTest: assign(({ context, event }) => {
      if (event.type !== 'MARK_FITTED' && event.type !== 'SUBMIT_AFTER_TEST') return {};
      return {
        lastStepAt: event.at,
        afterTest: {
          ...context.afterTest,
          outcome: event.afterTestPasses ? ('passed' as const) : ('failed' as const),
          attempts: context.afterTest.attempts + 1,
          lastTestId: event.afterTestId,
          settledAt: event.afterTestPasses ? event.at : null,
        },
      };
    }),
    recordCoreReceipt: assign(({ context, event }) => {
      if (event.type !== 'CORE_RECEIVED') return {};
      return {
        lastStepAt: event.at,
        core: {
          ...context.core,
          receivedAt: event.at,
          receivedBy: event.actor.id,
          condition: event.condition,
          conditionNotes: event.notes ?? null,
        },
      };
    }),
  },
}).createMachine({
  id: 'claim',
  initial: 'draft',
  context: ({ input }) => initialClaimContext(input),
  states: {
    draft: {
      on: {
        SUBMIT: {
          guard: 'permitted',
          target: 'submitted',
          actions: assign(({ event }) => ({ lastStepAt: event.at, submittedAt: event.at, evidence: { ...event.evidence } })),
        },
        WITHDRAW: { guard: 'permitted', target: 'withdrawn', actions: 'recordWithdrawal' },
      },
    },
    submitted: {
      on: {
        TAKE: { guard: 'permitted', target: 'in_review', actions: 'assignTaker' },
        WITHDRAW: { guard: 'permitted', target: 'withdrawn', actions: 'recordWithdrawal' },
      },
    },
    in_review: {
      on: {
        RELEASE: [
          { guard: and(['permitted', 'cameFromAppeal']), target: 'appealed', actions: 'unassign' },
          { guard: 'permitted', target: 'submitted', actions: 'unassign' },
        ],
        REQUEST_INFO: {
          guard: 'permitted',
          target: 'waiting_on_dealer',
          actions: assign(({ context, event }) => ({
            lastStepAt: event.at,
            infoRequests: {
              count: context.infoRequests.count + 1,
              lastChecklist: [...event.checklist],
              lastMessage: event.message,
              lastAt: event.at,
              lastBy: event.actor.id,
            },
          })),
        },
        APPROVE: {
          guard: 'permitted',
          target: 'approved',
          actions: assign(({ context, event }) => ({
            lastStepAt: event.at,
            decision: { outcome: event.extent, reasonCode: null, message: null, at: event.at, by: event.actor.id },
            approvedLines: event.lines.map((l) => ({
              lineId: l.lineId,
              approved: l.approved,
              ...(l.changed === undefined ? {} : { changed: l.changed }),
              ...(l.note === undefined ? {} : { note: l.note }),
            })),
            rmaNumber: event.rmaNumber,
            replacement: { ...context.replacement, fromShopStock: event.nothingToShip === true },
            core: {
              ...context.core,
              labelRef: event.coreReturnLabelRef ?? null,
              dangerousGoods: event.coreDangerousGoods ?? null,
            },
          })),
        },
        DENY: {
          guard: 'permitted',
          target: 'denied',
          actions: assign(({ event }) => ({
            lastStepAt: event.at,
            decision: {
              outcome: 'denied' as const,
              reasonCode: event.reasonCode,
              message: event.message,
              at: event.at,
              by: event.actor.id,
            },
            deniedByRepId: event.actor.id,
            appealOpenUntil: event.appealOpenUntil,
            assignedRepId: null,
          })),
        },
        WITHDRAW: { guard: 'permitted', target: 'withdrawn', actions: 'recordWithdrawal' },
      },
    },
    waiting_on_dealer: {
      on: {
        RESUBMIT: {
          guard: 'permitted',
          target: 'in_review',
          actions: assign(({ event }) => ({ lastStepAt: event.at, evidence: { ...event.evidence } })),
        },
        WITHDRAW: { guard: 'permitted', target: 'withdrawn', actions: 'recordWithdrawal' },
      },
    },
    denied: {
      on: {
        APPEAL: {
          guard: 'permitted',
          target: 'appealed',
          actions: assign(({ context, event }) => ({
            lastStepAt: event.at,
            appealsUsed: context.appealsUsed + 1,
            appealMessage: event.message,
          })),
        },
      },
    },
    appealed: {
      on: {
        TAKE: { guard: 'permitted', target: 'in_review', actions: 'assignTaker' },
        WITHDRAW: { guard: 'permitted', target: 'withdrawn', actions: 'recordWithdrawal' },
      },
    },
    withdrawn: { type: 'final' },
    approved: {
      type: 'parallel',
      onDone: { target: 'credit_pending' },
      states: {
        replacement: {
          initial: 'to_ship',
          states: {
            to_ship: {
              // Nothing for the warehouse to send: the replacement is already on the dealer's bench.
              always: { guard: ({ context }) => context.replacement.fromShopStock === true, target: 'from_shop_stock' },
              on: {
                SHIP: {
                  guard: 'permitted',
                  target: 'shipped',
                  actions: assign(({ context, event }) => ({
                    lastStepAt: event.at,
                    replacement: {
                      ...context.replacement,
                      carrier: event.carrier,
                      trackingNumber: event.trackingNumber,
                      shippedAt: event.at,
                      shippedBy: event.actor.id,
                    },
                  })),
                },
              },
            },
            shipped: {
              on: {
                MARK_FITTED: [
                  { guard: and(['permitted', 'afterTestPasses']), target: 'verified', actions: ['recordFitting', 'recordAfterTest'] },
                  { guard: 'permitted', target: 'fitted', actions: ['recordFitting', 'recordAfterTest'] },
                ],
              },
            },
            from_shop_stock: {
              on: {
                MARK_FITTED: [
                  { guard: and(['permitted', 'afterTestPasses']), target: 'verified', actions: ['recordFitting', 'recordAfterTest'] },
                  { guard: 'permitted', target: 'fitted', actions: ['recordFitting', 'recordAfterTest'] },
                ],
              },
            },
            fitted: {
              on: {
                SUBMIT_AFTER_TEST: [
                  { guard: and(['permitted', 'afterTestPasses']), target: 'verified', actions: 'recordAfterTest' },
                  { guard: 'permitted', actions: 'recordAfterTest' },
                ],
                ACCEPT_BY_HAND: {
                  guard: 'permitted',
                  target: 'verified',
                  actions: assign(({ context, event }) => ({
                    lastStepAt: event.at,
                    afterTest: {
                      ...context.afterTest,
                      outcome: 'accepted_by_hand' as const,
                      acceptedReason: event.reason,
                      acceptedBy: event.actor.id,
                      settledAt: event.at,
                    },
                  })),
                },
              },
            },
            verified: { type: 'final' },
          },
        },
        core: {
          initial: 'requested',
          states: {
            requested: {
              on: {
                ISSUE_RETURN_LABEL: {
                  guard: 'permitted',
                  actions: assign(({ context, event }) => ({
                    lastStepAt: event.at,
                    core: { ...context.core, labelRef: event.labelRef, dangerousGoods: event.dangerousGoods },
                  })),
                },
                REMIND_CORE: {
                  guard: 'permitted',
                  actions: assign(({ context, event }) => ({
                    lastStepAt: event.at,
                    core: { ...context.core, remindersSent: context.core.remindersSent + 1, lastReminderAt: event.at },
                  })),
                },
                CORE_SHIPPED: {
                  guard: 'permitted',
                  target: 'in_transit',
                  actions: assign(({ context, event }) => ({
                    lastStepAt: event.at,
                    core: { ...context.core, carrier: event.carrier, trackingNumber: event.trackingNumber, shippedAt: event.at },
                  })),
                },
                // A core can reach the warehouse before the dealer marks it shipped.
                CORE_RECEIVED: { guard: 'permitted', target: 'received', actions: 'recordCoreReceipt' },
                WAIVE_CORE: {
                  guard: 'permitted',
                  target: 'waived',
                  actions: assign(({ context, event }) => ({
                    lastStepAt: event.at,
                    ...coreOutcome(context, {
                      outcome: 'waived',
                      waiver: { reason: event.reason, proofAttachmentId: event.proofAttachmentId, at: event.at, by: event.actor.id },
                    }),
                  })),
                },
                WRITE_OFF_CORE: {
                  guard: 'permitted',
                  target: 'written_off',
                  actions: assign(({ context, event }) => ({
                    lastStepAt: event.at,
                    ...coreOutcome(context, { outcome: 'written_off', writtenOffAt: event.at }),
                  })),
                },
              },
            },
            in_transit: {
              on: {
                CORE_RECEIVED: { guard: 'permitted', target: 'received', actions: 'recordCoreReceipt' },
              },
            },
            received: {
              on: {
                INSPECT: {
                  guard: 'permitted',
                  target: 'inspected',
                  actions: assign(({ context, event }) => ({
                    lastStepAt: event.at,
                    ...coreOutcome(context, {
                      outcome: 'inspected',
                      inspection: { result: event.result, notes: event.notes ?? null, at: event.at, by: event.actor.id },
                    }),
                  })),
                },
              },
            },
            inspected: { type: 'final' },
            waived: { type: 'final' },
            written_off: { type: 'final' },
          },
        },
      },
    },
    credit_pending: {
      on: {
        ISSUE_CREDIT: {
          guard: 'permitted',
          target: 'credited',
          actions: assign(({ event }) => ({ lastStepAt: event.at, creditMemoId: event.memoId, creditedAt: event.at })),
        },
      },
    },
    credited: {
      on: {
        RECONCILE: {
          guard: 'permitted',
          target: 'reconciled',
          actions: assign(({ event }) => ({
            lastStepAt: event.at,
            statementLineRef: event.statementLineRef,
            reconciledAt: event.at,
          })),
        },
      },
    },
    reconciled: { type: 'final' },
  },
});
