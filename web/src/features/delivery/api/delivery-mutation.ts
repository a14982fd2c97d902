import { useMutation, useQueryClient } from '@tanstack/react-query';

import { deliveryKeys } from './delivery-keys';

/** A delivery write: after any change, every delivery list (job logs, the failures on the home page) is asked again. */
export function useDeliveryMutation<TVariables, TResult>(mutationFn: (variables: TVariables) => Promise<TResult>) {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn, onSettled: () => queryClient.invalidateQueries({ queryKey: deliveryKeys.all }) });
}
