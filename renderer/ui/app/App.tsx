/**
 * The app: bridge and course store around the frame, and the start-up sequence — offer the
 * recovery copy if the last session left unsaved work, otherwise open the demo course.
 */
import { useEffect, useRef, useState } from 'react';
import { BridgeProvider, useBridge } from '../../bridge/BridgeContext';
import type { RecoveryInfo } from '../../bridge/contract';
import type { WindowBridge } from '../../bridge/extras';
import { CourseStoreProvider, useCourseStore } from '../../state/courseStore';
import { Frame } from './Frame';
import { RecoveryOffer } from './RecoveryOffer';
import './theme.css';

export function App({ bridge }: { bridge: WindowBridge }) {
  return (
    <BridgeProvider bridge={bridge}>
      <CourseStoreProvider>
        <Startup />
        <Frame />
      </CourseStoreProvider>
    </BridgeProvider>
  );
}

type StartState =
  | { step: 'checking' }
  | { step: 'offer'; recovery: RecoveryInfo }
  | { step: 'done' }
  | { step: 'failed'; message: string };

function Startup() {
  const bridge = useBridge();
  const store = useCourseStore();
  const [state, setState] = useState<StartState>({ step: 'checking' });
  const started = useRef(false);
  const { open } = store;

  const openDemo = async () => {
    const demo = await bridge.demoCourse();
    if (demo.ok) {
      open(demo.value, null);
      setState({ step: 'done' });
    } else {
      setState({ step: 'failed', message: demo.message });
    }
  };

  useEffect(() => {
    // Strict mode mounts effects twice in development; start once.
    if (started.current) return;
    started.current = true;
    void (async () => {
      const recovery = await bridge.readRecovery();
      if (recovery.ok && recovery.value !== null) {
        setState({ step: 'offer', recovery: recovery.value });
        return;
      }
      await openDemo();
    })();
    // Once per mount: openDemo only uses the bridge and `open`, both stable.
  }, []);

  if (state.step === 'offer') {
    return (
      <RecoveryOffer
        recovery={state.recovery}
        onRestore={() => {
          open(state.recovery.project, state.recovery.projectPath, { dirty: true });
          setState({ step: 'done' });
        }}
        onDiscard={() => {
          setState({ step: 'checking' });
          void bridge.discardRecovery().then(openDemo);
        }}
      />
    );
  }
  if (state.step === 'failed') {
    return <p role="alert" className="wb-start-failed">The demo course could not be opened: {state.message}</p>;
  }
  return null;
}
